"""summary.md: counts by rule and severity, worst compounds, row accounting, inputs."""

from __future__ import annotations

from propcheck.report.caution import CAUTION
from propcheck.report.data import ReportData

__all__ = ["render_summary"]


def _table(header: list[str], rows: list[list]) -> list[str]:
    lines = ["| " + " | ".join(header) + " |", "|" + "|".join("---" for _ in header) + "|"]
    lines += ["| " + " | ".join(str(c) for c in row) + " |" for row in rows]
    return lines


def render_summary(data: ReportData) -> str:
    sev = data.by_severity
    verdict = "FAIL" if data.exit_code else "PASS"
    lines = [
        "# propcheck summary",
        "",
        f"**{verdict}** (fail on: {data.fail_on}): {sev['error']} errors, {sev['warning']} warnings, {sev['info']} info.",
        "",
        "## Rows read and checked",
        "",
        "Rows read = rows checked + rows rejected. Every rejected row and every rejected cell has a finding.",
        "",
    ]
    lines += _table(
        ["table", "source", "rows read", "rows checked", "rows rejected", "cells rejected"],
        [[t.table, t.origin, t.rows_read, t.rows_checked, t.rows_rejected, t.cells_rejected] for t in data.tables],
    )
    lines += ["", "## Findings by rule", ""]
    if data.by_rule:
        lines += _table(["rule", "title", "error", "warning", "info"], [list(r) for r in data.by_rule])
    else:
        lines.append("No findings.")
    lines += ["", "## Compounds with the most findings", ""]
    if data.worst:
        lines += _table(["compound_id", "name", "error", "warning", "info"], [list(r) for r in data.worst])
    else:
        lines.append("None.")
    meta = data.meta
    lines += [
        "",
        "## Inputs",
        "",
        f"- source: `{meta['source']}` ({meta['source_kind']})",
        f"- rule packs: {', '.join(meta['rule_packs'])}",
        f"- propcheck {meta['propcheck']}; " + ", ".join(f"{k} {v}" for k, v in meta["libraries"].items()),
        f"- started {meta['started']}, {meta['seconds']} s",
    ]
    lines += [f"- note: {note}" for note in data.notes]
    lines += ["", "## Caution", "", CAUTION, ""]
    return "\n".join(lines)
