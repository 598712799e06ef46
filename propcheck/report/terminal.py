"""The compact summary printed on the terminal after a run."""

from __future__ import annotations

from pathlib import Path

from propcheck.report.data import ReportData

__all__ = ["render_terminal"]


def render_terminal(data: ReportData, out_dir: str | None = None, top: int = 15) -> str:
    sev = data.by_severity
    rows = ", ".join(f"{t.table} {t.rows_read} ({t.rows_rejected} rejected)" for t in data.tables)
    lines = [f"propcheck: {data.meta['source']}: rows read: {rows}"]
    total = sum(sev.values())
    lines.append(f"{total} findings: {sev['error']} error, {sev['warning']} warning, {sev['info']} info")
    for rule, title, e, w, i in data.by_rule[:top]:
        counts = ", ".join(f"{n} {s}" for n, s in ((e, "error"), (w, "warning"), (i, "info")) if n)
        lines.append(f"  {rule:<28} {counts:<22} {title}")
    if len(data.by_rule) > top:
        lines.append(f"  ... and {len(data.by_rule) - top} more rules (see summary.md)")
    if out_dir:
        lines.append(f"report: {Path(out_dir) / 'report.html'} (findings.csv, findings.json, summary.md, junit.xml beside it)")
    if data.triage.active:
        c = data.triage.counts
        lines.append(f"triage: {c.get('new', 0)} new, {c.get('baselined', 0)} baselined, {c.get('waived', 0)} waived, "
                     f"{len(data.triage.resolved)} resolved since the baseline")
    for w in data.triage.expired:
        lines.append(f"EXPIRED waiver: {w.describe()}")
    verdict = "FAIL" if data.exit_code else "PASS"
    lines.append(f"{verdict}: fail-on {data.fail_on}")
    return "\n".join(lines)
