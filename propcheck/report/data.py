"""Report data: counts, worst compounds, row accounting and the run's inputs."""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from importlib import metadata

import pandas as pd

from propcheck import __version__
from propcheck.findings import SEVERITIES, severity_rank
from propcheck.history import HistoryView
from propcheck.pipeline import RunResult
from propcheck.report.figures import CompoundPanel, FamilyPanel, build_compound_panels, build_family_panels
from propcheck.report.scorecard import SourceScore, source_scorecard
from propcheck.triage import Baseline, Triage, Waiver, apply_triage

__all__ = ["FAIL_ON", "ReportData", "build_report_data", "exit_status"]

FAIL_ON = ("error", "warning", "info", "none")
LIBRARIES = ("duckdb", "pandas", "pandera", "numpy", "scipy", "pint", "chemicals", "thermo", "matplotlib", "CoolProp")
PANEL_CAP = 50  # compound panels in report.html, worst first; keeps the file small on large databases


def exit_status(findings: pd.DataFrame, fail_on: str) -> int:
    """1 when a finding reaches ``fail_on`` (error, warning, info), else 0; ``none`` never fails."""
    if fail_on == "none" or findings.empty:
        return 0
    return int(bool((findings["severity"].map(severity_rank) >= severity_rank(fail_on)).any()))


@dataclass
class TableCount:
    table: str
    origin: str
    rows_read: int
    rows_checked: int
    rows_rejected: int
    cells_rejected: int


@dataclass
class ReportData:
    """What every report format shows, computed once."""

    findings: pd.DataFrame
    by_severity: dict[str, int]
    by_rule: list[tuple[str, str, int, int, int]]  # rule, title, error, warning, info
    worst: list[tuple[str, str, int, int, int]]  # compound_id, name, error, warning, info
    tables: list[TableCount]
    meta: dict
    notes: list[str] = field(default_factory=list)
    fail_on: str = "error"
    exit_code: int = 0
    # triage (baseline, waivers), breakdowns and plot data; see propcheck.triage and report.figures
    triage: Triage = field(default_factory=Triage)
    fail_reasons: list[str] = field(default_factory=list)
    by_family: list[tuple[str, int, int, int]] = field(default_factory=list)  # family, error, warning, info
    scorecard: list[SourceScore] = field(default_factory=list)
    panels: list[CompoundPanel] = field(default_factory=list)
    families: list[FamilyPanel] = field(default_factory=list)
    history: HistoryView | None = None
    n_flagged_compounds: int = 0  # compounds with at least one error or warning
    n_compounds_with_findings: int = 0  # info included


def _versions() -> dict[str, str]:
    out = {}
    for name in LIBRARIES:
        try:
            out[name] = metadata.version(name)
        except metadata.PackageNotFoundError:
            out[name] = "not installed"
    return out


def _counts(frame: pd.DataFrame, key: str) -> list[tuple]:
    """(key, error, warning, info) per value of ``key``; counted by groupby, not row by row."""
    if frame.empty:
        return []
    table = frame.groupby([key, "severity"]).size().unstack(fill_value=0)
    table = table.reindex(columns=list(SEVERITIES), fill_value=0)
    return list(zip(table.index, *(table[s].tolist() for s in ("error", "warning", "info"))))


def build_report_data(
    result: RunResult,
    fail_on: str = "error",
    worst_n: int = 10,
    *,
    baseline: Baseline | None = None,
    waivers: list[Waiver] | None = None,
    waiver_path: str | None = None,
    history: HistoryView | None = None,
    today=None,
    panel_cap: int = PANEL_CAP,
    plots: bool = True,
) -> ReportData:
    """Summarise a run for the report writers.

    Findings a ``baseline`` or a live waiver accepts do not count towards the
    exit status; an expired waiver makes the run fail.
    """
    from propcheck.rules.registry import all_rules

    findings, triage = apply_triage(result.findings, baseline, waivers, waiver_path, today)
    registry = all_rules()
    titles = {rid: r.info.title for rid, r in registry.items()}
    titles.update({cid: c.title for cid, c in result.pack.custom.items()})
    by_severity = {s: int((findings["severity"] == s).sum()) for s in reversed(SEVERITIES)}

    rules = _counts(findings, "rule")
    by_rule = sorted(
        ((rid, titles.get(rid, rid), int(e), int(w), int(i)) for rid, e, w, i in rules),
        key=lambda x: (-x[2], -x[3], -x[4], x[0]),
    )
    names = dict(result.db.con.execute("SELECT compound_id, any_value(name) FROM compounds GROUP BY 1").fetchall())
    with_id = findings[findings["compound_id"].notna()]
    compounds = _counts(with_id, "compound_id")
    ranked = sorted(
        ((str(cid), names.get(cid) or "", int(e), int(w), int(i)) for cid, e, w, i in compounds),
        key=lambda x: (-x[2], -x[3], -x[4], x[0]),
    )
    # a compound is flagged by an error or a warning; info alone asks nothing of the steward
    # (reference-missing is info for every compound no compilation lists)
    flagged = [r for r in ranked if r[2] or r[3]]
    worst = flagged[:worst_n]
    tables = [
        TableCount(t.name, t.origin, t.rows_read, t.rows_checked, t.rows_rejected, t.cells_rejected)
        for t in result.db.tables.values()
    ]
    meta = {
        "propcheck": __version__,
        "started": dt.datetime.fromtimestamp(result.started, dt.timezone.utc).strftime("%Y-%m-%dT%H:%M:%SZ"),
        "seconds": round(result.seconds, 3),
        "source": result.db.source,
        "source_kind": result.db.kind,
        "rule_packs": list(result.pack.files),
        "fail_on": fail_on,
        "fingerprint": result.fingerprint,
        "rules_run": sorted([r for r in registry if result.pack.enabled(r)]
                            + [c for c, rule in result.pack.custom.items() if rule.enabled]),
        "baseline": triage.baseline_path,
        "waivers": triage.waiver_path,
        "libraries": _versions(),
    }
    new = findings[findings["status"] == "new"] if not findings.empty else findings
    exit_code = exit_status(new, fail_on)
    reasons = []
    if exit_code:
        reasons.append(f"{len(new)} new finding(s), at least one at {fail_on} or worse")
    for waiver in triage.expired:
        reasons.append(f"waiver expired on {waiver.expires.isoformat()}: {waiver.describe()}")
    if triage.expired:
        exit_code = 1
    data = ReportData(
        findings=findings, by_severity=by_severity, by_rule=by_rule, worst=worst, tables=tables,
        meta=meta, notes=list(result.db.notes), fail_on=fail_on, exit_code=exit_code,
        triage=triage, fail_reasons=reasons, history=history, n_flagged_compounds=len(flagged), n_compounds_with_findings=len(ranked),
    )
    families = dict(result.db.con.execute("SELECT compound_id, any_value(family) FROM compounds GROUP BY 1").fetchall())
    fam = _counts(with_id.assign(_family=with_id["compound_id"].map(families).fillna("(no family)")), "_family")
    data.by_family = sorted(
        ((str(f), int(e), int(w), int(i)) for f, e, w, i in fam),
        key=lambda x: (-x[1], -x[2], -x[3], x[0]),
    )
    data.scorecard = source_scorecard(result.db, findings)
    if plots:
        chosen = [cid for cid, *_ in flagged if cid in names][:panel_cap]
        data.panels = build_compound_panels(result.db, findings, chosen)
        data.families = build_family_panels(result.db, findings)
    return data
