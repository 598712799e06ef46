"""Triage: which findings are new, which a baseline or a waiver already accepts.

A nightly CI job fails only on what changed: findings already in a baseline
(``--baseline``) and findings a steward accepted in a waiver file
(``--waivers``) do not fail the run; new ones do, and so does an expired
waiver.
"""

from propcheck.triage.apply import Triage, apply_triage
from propcheck.triage.baseline import Baseline, read_baseline, render_baseline
from propcheck.triage.waivers import Waiver, read_waivers

__all__ = ["Baseline", "Triage", "Waiver", "apply_triage", "read_baseline", "read_waivers", "render_baseline"]
