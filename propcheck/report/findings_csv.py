"""findings.csv: one row per finding, the fields of README 'Usage' in order."""

from __future__ import annotations

import csv
import io

from propcheck.findings import FIELDS
from propcheck.report.data import ReportData
from propcheck.report.formatting import fmt

__all__ = ["render_csv"]


def render_csv(data: ReportData) -> str:
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(FIELDS)
    for record in data.findings[list(FIELDS)].itertuples(index=False):
        writer.writerow([fmt(v) for v in record])
    return buffer.getvalue()
