"""findings.json: the findings with the run's meta block and counts."""

from __future__ import annotations

import json
import math

from propcheck.findings import FIELDS
from propcheck.report.data import ReportData

__all__ = ["FORMAT_VERSION", "render_json"]

FORMAT_VERSION = 1


def _clean(value):
    if isinstance(value, float) and (math.isnan(value) or math.isinf(value)):
        return None
    if hasattr(value, "item"):  # numpy scalar
        return _clean(value.item())
    return value


def render_json(data: ReportData) -> str:
    extra = [c for c in ("status", "waiver") if c in data.findings.columns]
    records = [
        {name: _clean(value) for name, value in zip(list(FIELDS) + extra, row)}
        for row in data.findings[list(FIELDS) + extra].itertuples(index=False)
    ]
    doc = {
        "format_version": FORMAT_VERSION,
        "meta": data.meta,
        "exit_code": data.exit_code,
        "counts": data.by_severity,
        "tables": [t.__dict__ for t in data.tables],
        "triage": {
            "baseline": data.triage.baseline_path,
            "waivers": data.triage.waiver_path,
            "counts": data.triage.counts,
            "resolved": data.triage.resolved,
            "expired_waivers": [w.describe() for w in data.triage.expired],
        },
        "fail_reasons": data.fail_reasons,
        "findings": records,
    }
    return json.dumps(doc, indent=2, ensure_ascii=False) + "\n"
