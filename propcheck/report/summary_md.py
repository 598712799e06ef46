"""summary.md: counts by rule and severity, worst compounds, row accounting, inputs."""

from __future__ import annotations

from propcheck.report.caution import CAUTION
from propcheck.report.data import ReportData

__all__ = ["render_summary"]


def _table(header: list[str], rows: list[list]) -> list[str]:
    lines = ["| " + " | ".join(header) + " |", "|" + "|".join("---" for _ in header) + "|"]
    lines += ["| " + " | ".join(str(c) for c in row) + " |" for row in rows]
    return lines


def _triage_lines(data: ReportData) -> list[str]:
    t = data.triage
    if not t.active:
        return []
    c = t.counts
    lines = ["", "## Baseline and waivers", "",
             f"Baseline: {t.baseline_path or 'none'}; waivers: {t.waiver_path or 'none'}.",
             "", f"{c.get('new', 0)} new, {c.get('baselined', 0)} in the baseline, {c.get('waived', 0)} waived; "
             f"{len(t.resolved)} resolved since the baseline."]
    if t.resolved:
        lines += ["", "Resolved since the baseline:", ""]
        lines += _table(["finding_id", "rule", "compound_id", "column", "message"],
                        [[r.get("finding_id"), r.get("rule"), r.get("compound_id") or "", r.get("column") or "",
                          str(r.get("message") or "").replace("|", "/")] for r in t.resolved])
    for w in t.expired:
        lines.append(f"- EXPIRED waiver (fails the run): {w.describe()}")
    for w in t.unused:
        lines.append(f"- waiver matched nothing: {w.describe()}")
    return lines


def _history_lines(data: ReportData) -> list[str]:
    h = data.history
    if h is None or not h.runs:
        return []
    lines = ["", "## Run history", "", f"Findings per rule over the last {len(h.runs)} runs in {h.path}.", ""]
    header = ["rule"] + [f"#{r['run_id']} {r['started']}" for r in h.runs]
    rows = [[rule] + [h.counts.get((rule, r["run_id"]), 0) for r in h.runs] for rule in h.rules]
    rows.append(["fingerprint"] + [r["fingerprint"] for r in h.runs])
    return lines + _table(header, rows)


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
    lines += ["", "## Compounds with the most errors and warnings", ""]
    if data.worst:
        lines += _table(["compound_id", "name", "error", "warning", "info"], [list(r) for r in data.worst])
    else:
        lines.append("None.")
    lines += _triage_lines(data) + _history_lines(data)
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
