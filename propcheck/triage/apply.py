"""Mark each finding new, baselined or waived; list resolved findings and expired waivers."""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field

import pandas as pd

from propcheck.triage.baseline import Baseline
from propcheck.triage.waivers import Waiver

__all__ = ["STATUSES", "Triage", "apply_triage"]

STATUSES = ("new", "baselined", "waived")


@dataclass
class Triage:
    """Outcome of matching a run's findings against a baseline and waivers."""

    baseline_path: str | None = None
    waiver_path: str | None = None
    resolved: list[dict] = field(default_factory=list)  # baseline entries no longer found
    expired: list[Waiver] = field(default_factory=list)
    unused: list[Waiver] = field(default_factory=list)  # valid waivers that matched nothing
    counts: dict[str, int] = field(default_factory=dict)  # status -> findings

    @property
    def active(self) -> bool:
        return self.baseline_path is not None or self.waiver_path is not None


def apply_triage(
    findings: pd.DataFrame,
    baseline: Baseline | None = None,
    waivers: list[Waiver] | None = None,
    waiver_path: str | None = None,
    today: dt.date | None = None,
) -> tuple[pd.DataFrame, Triage]:
    """Return ``findings`` with ``status`` and ``waiver`` columns, and the triage summary.

    A waiver beats a baseline (it says who accepted the finding and why); an
    expired waiver accepts nothing.
    """
    today = today or dt.date.today()
    waivers = waivers or []
    out = findings.copy()
    ids = out["finding_id"].astype(str)
    status = pd.Series("new", index=out.index, dtype=object)
    if baseline is not None:
        status[ids.isin(list(baseline.entries))] = "baselined"
    waiver_name = pd.Series(None, index=out.index, dtype=object)
    live = [w for w in waivers if not w.expired(today)]
    used = set()
    for fid, rule, cid, idx in zip(ids, out["rule"], out["compound_id"], out.index):  # loop over findings
        for w in live:
            if w.matches(fid, rule, cid):
                status[idx] = "waived"
                waiver_name[idx] = w.name
                used.add(w.name)
                break
    out["status"] = status
    out["waiver"] = waiver_name
    triage = Triage(
        baseline_path=baseline.path if baseline else None,
        waiver_path=waiver_path,
        expired=[w for w in waivers if w.expired(today)],
        unused=[w for w in live if w.name not in used],
        counts={s: int((status == s).sum()) for s in STATUSES},
    )
    if baseline is not None:
        present = set(ids)
        triage.resolved = [baseline.entries[k] for k in sorted(baseline.entries) if k not in present]
    return out, triage
