"""Baseline files: the findings a team has already seen.

A baseline is JSON::

    {"format": "propcheck-baseline", "format_version": 1,
     "created": "2026-11-30T02:00:00Z", "source": "company.duckdb",
     "findings": [{"finding_id": "5c3e05c8b3a2432e", "rule": "cas-check-digit",
                   "severity": "error", "compound_id": "LPC-0003", "column": "cas",
                   "t": null, "message": "..."}]}

A ``findings.json`` written by ``propcheck check`` is accepted as a baseline
as it stands: only ``findings[*].finding_id`` is required.
"""

from __future__ import annotations

import datetime as dt
import json
import math
from dataclasses import dataclass, field
from pathlib import Path

import pandas as pd

from propcheck.errors import UsageError

__all__ = ["BASELINE_FORMAT", "Baseline", "read_baseline", "render_baseline"]

BASELINE_FORMAT = "propcheck-baseline"
KEPT = ("finding_id", "rule", "severity", "table", "compound_id", "column", "t", "message")


@dataclass
class Baseline:
    """Findings accepted as known, keyed by finding_id."""

    path: str
    entries: dict[str, dict] = field(default_factory=dict)


def read_baseline(path: str, option: str = "--baseline") -> Baseline:
    """Read a baseline (or a findings.json); UsageError naming the file and key when unusable."""
    file = Path(path)
    if not file.is_file():
        raise UsageError("baseline file not found", file=path, option=option)
    try:
        doc = json.loads(file.read_text(encoding="utf-8-sig"))
    except (OSError, UnicodeDecodeError) as exc:
        raise UsageError(f"cannot read baseline ({exc})", file=path, option=option) from None
    except json.JSONDecodeError as exc:
        raise UsageError(f"not valid JSON (line {exc.lineno}: {exc.msg})", file=path, option=option) from None
    if not isinstance(doc, dict) or not isinstance(doc.get("findings"), list):
        raise UsageError("must be a JSON object with a list of findings", file=path, key="findings")
    fmt = doc.get("format", BASELINE_FORMAT)
    if fmt != BASELINE_FORMAT:
        raise UsageError(f"unknown format {fmt!r} (expected {BASELINE_FORMAT!r})", file=path, key="format")
    entries: dict[str, dict] = {}
    for i, item in enumerate(doc["findings"]):
        fid = item.get("finding_id") if isinstance(item, dict) else None
        if not isinstance(fid, str) or not fid:
            raise UsageError("missing or not a string", file=path, key=f"findings[{i}].finding_id")
        entries[fid] = {k: item.get(k) for k in KEPT}
    return Baseline(path=path, entries=entries)


def _clean(value):
    if isinstance(value, float) and not math.isfinite(value):
        return None
    if hasattr(value, "item"):
        return _clean(value.item())
    return value


def render_baseline(findings: pd.DataFrame, source: str, created: float | None = None) -> str:
    """Return the text of a baseline holding every finding of ``findings``."""
    stamp = dt.datetime.fromtimestamp(created, dt.timezone.utc) if created else dt.datetime.now(dt.timezone.utc)
    records = [
        {k: _clean(v) for k, v in zip(KEPT, row)}
        for row in findings.reindex(columns=list(KEPT)).itertuples(index=False)
    ]
    records.sort(key=lambda r: r["finding_id"])
    doc = {
        "format": BASELINE_FORMAT,
        "format_version": 1,
        "created": stamp.strftime("%Y-%m-%dT%H:%M:%SZ"),
        "source": source,
        "findings": records,
    }
    return json.dumps(doc, indent=2, ensure_ascii=False) + "\n"
