"""Run the stages in order: pack, load, schema, consistency rules, custom rules."""

from __future__ import annotations

import time
from dataclasses import dataclass, field
from typing import Callable

import pandas as pd

from propcheck.database import Database
from propcheck.diagnose import annotate_findings
from propcheck.findings import assign_ids, sort_findings, to_frame
from propcheck.fingerprint import fingerprint
from propcheck.load import load_database
from propcheck.load.sources import display_source
from propcheck.rules.custom import run_custom_rule
from propcheck.rules.pack import Pack, load_pack
from propcheck.rules.registry import all_rules
from propcheck.schema import run_schema_stage

__all__ = ["RunResult", "run_check"]


@dataclass
class RunResult:
    """Everything a report needs about one run."""

    db: Database
    pack: Pack
    findings: pd.DataFrame
    started: float
    seconds: float
    stage_seconds: dict[str, float] = field(default_factory=dict)
    fingerprint: str = ""  # hash of the canonical tables as loaded (propcheck.fingerprint)


def _noop(message: str) -> None:
    pass


def run_check(
    source: str,
    mapping_path: str | None = None,
    rules_path: str | None = None,
    progress: Callable[[str], None] = _noop,
) -> RunResult:
    """Check ``source``; return the findings with stable ids, sorted."""
    started = time.time()
    clock = time.perf_counter()
    stages: dict[str, float] = {}

    def lap(name: str) -> None:
        nonlocal clock
        now = time.perf_counter()
        stages[name] = now - clock
        clock = now

    pack = load_pack(rules_path)
    progress("loading " + display_source(source))
    db = load_database(source, mapping_path)
    data_fingerprint = fingerprint(db)
    lap("load")
    frames = [to_frame(f for f in db.load_findings if pack.enabled(f.rule))]
    progress("schema checks")
    frames.append(to_frame(run_schema_stage(db, pack)))
    lap("schema")
    db.cache["pack"] = pack  # rules may consult a sibling rule's settings
    for rule in all_rules().values():
        if rule.check is None or not pack.enabled(rule.id):
            continue
        progress(f"rule {rule.id}")
        frames.append(to_frame(rule.check(db, pack.params(rule.id))))
    lap("rules")
    for custom in pack.custom.values():
        if custom.enabled:
            progress(f"custom rule {custom.id}")
            frames.append(to_frame(run_custom_rule(db, custom)))
    lap("custom")
    findings = pd.concat([f for f in frames if not f.empty] or [to_frame(None)], ignore_index=True)
    findings = annotate_findings(db, findings)
    findings = _apply_severity(findings, pack)
    findings = sort_findings(assign_ids(findings))
    return RunResult(db=db, pack=pack, findings=findings, started=started,
                     seconds=sum(stages.values()), stage_seconds=stages, fingerprint=data_fingerprint)


def _apply_severity(findings: pd.DataFrame, pack: Pack) -> pd.DataFrame:
    """A pack that changes a rule's severity changes all of its findings."""
    registry = all_rules()
    for rule_id, resolved in pack.rules.items():
        if resolved.severity != registry[rule_id].info.severity:
            findings.loc[findings["rule"] == rule_id, "severity"] = resolved.severity
    return findings
