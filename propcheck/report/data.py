"""Report data: counts, worst compounds, row accounting and the run's inputs."""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from importlib import metadata

import pandas as pd

from propcheck import __version__
from propcheck.findings import SEVERITIES, severity_rank
from propcheck.pipeline import RunResult

__all__ = ["FAIL_ON", "ReportData", "build_report_data", "exit_status"]

FAIL_ON = ("error", "warning", "info", "none")
LIBRARIES = ("duckdb", "pandas", "pandera", "numpy", "scipy", "pint", "chemicals", "thermo")


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


def _versions() -> dict[str, str]:
    out = {}
    for name in LIBRARIES:
        try:
            out[name] = metadata.version(name)
        except metadata.PackageNotFoundError:
            out[name] = "not installed"
    return out


def _counts(frame: pd.DataFrame, key: str) -> pd.DataFrame:
    table = pd.crosstab(frame[key], frame["severity"]) if not frame.empty else pd.DataFrame()
    for severity in SEVERITIES:
        if severity not in table.columns:
            table[severity] = 0
    return table


def build_report_data(result: RunResult, fail_on: str = "error", worst_n: int = 10) -> ReportData:
    """Summarise a run for the report writers."""
    from propcheck.rules.registry import all_rules

    findings = result.findings
    registry = all_rules()
    titles = {rid: r.info.title for rid, r in registry.items()}
    titles.update({cid: c.title for cid, c in result.pack.custom.items()})
    by_severity = {s: int((findings["severity"] == s).sum()) for s in reversed(SEVERITIES)}

    rules = _counts(findings, "rule")
    by_rule = sorted(
        ((rid, titles.get(rid, rid), int(r["error"]), int(r["warning"]), int(r["info"])) for rid, r in rules.iterrows()),
        key=lambda x: (-x[2], -x[3], -x[4], x[0]),
    )
    names = dict(result.db.con.execute("SELECT compound_id, any_value(name) FROM compounds GROUP BY 1").fetchall())
    with_id = findings[findings["compound_id"].notna()]
    compounds = _counts(with_id, "compound_id")
    worst = sorted(
        ((str(cid), names.get(cid) or "", int(r["error"]), int(r["warning"]), int(r["info"])) for cid, r in compounds.iterrows()),
        key=lambda x: (-x[2], -x[3], -x[4], x[0]),
    )[:worst_n]
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
        "libraries": _versions(),
    }
    return ReportData(
        findings=findings, by_severity=by_severity, by_rule=by_rule, worst=worst, tables=tables,
        meta=meta, notes=list(result.db.notes), fail_on=fail_on, exit_code=exit_status(findings, fail_on),
    )
