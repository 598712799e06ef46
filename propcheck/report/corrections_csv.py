"""corrections.csv: the repairs diagnosed for the steward to review, one per cell.

Nothing is ever applied: each row proposes a value for one cell, with the
evidence (the finding's suggestion, rule and id), so that a person can
accept or reject it. Built from the findings that carry ``corrected``; one
row per (compound, column, proposed value), citing every rule that led to it.
"""

from __future__ import annotations

import csv
import io

from propcheck.report.data import ReportData
from propcheck.report.formatting import fmt

__all__ = ["COLUMNS", "render_corrections"]

COLUMNS = ("compound_id", "table", "row", "column", "current_value", "proposed_value", "confidence", "evidence", "rules", "finding_ids")


def render_corrections(data: ReportData) -> str:
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(COLUMNS)
    frame = data.findings
    if "corrected" in frame.columns and not frame.empty:
        frame = frame[frame["corrected"].notna()]
        groups: dict[tuple, list] = {}
        for rec in frame.to_dict("records"):  # one loop over findings
            key = (rec["compound_id"], rec["table"], rec["row"], rec["column"], fmt(float(rec["corrected"])))
            groups.setdefault(key, []).append(rec)
        for (cid, table, row, column, proposed), recs in sorted(groups.items(), key=lambda kv: tuple(map(str, kv[0]))):
            # the shared diagnosis states its confidence and evidence: prefer its text
            first = next((r for r in recs if (r.get("suggestion") or "").startswith(("likely", "possibly"))), recs[0])
            suggestion = first.get("suggestion") or ""
            confidence = "likely" if any((r.get("suggestion") or "").startswith("likely") for r in recs) else "possibly"
            writer.writerow([
                fmt(cid), fmt(table), fmt(row), fmt(column), fmt(first.get("observed")), proposed, confidence,
                suggestion, " ".join(sorted({r["rule"] for r in recs})), " ".join(r["finding_id"] for r in recs),
            ])
    return buffer.getvalue()
