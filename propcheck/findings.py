"""The finding record (README, 'Usage': the findings.csv fields) and its stable id.

Rules return findings either as :class:`Finding` objects or, when they are
vectorised, as a DataFrame with the columns of :data:`FIELDS`;
:func:`to_frame` brings both to one frame and :func:`assign_ids` gives each
row its stable ``finding_id``.
"""

from __future__ import annotations

import hashlib
import math
from dataclasses import asdict, dataclass, fields
from typing import Any, Iterable

import pandas as pd

__all__ = [
    "FIELDS",
    "SEVERITIES",
    "Finding",
    "assign_ids",
    "severity_rank",
    "sort_findings",
    "to_frame",
]

SEVERITIES = ("info", "warning", "error")


def severity_rank(severity: str) -> int:
    """Return 0 for info, 1 for warning, 2 for error."""
    return SEVERITIES.index(severity)


@dataclass
class Finding:
    """One discrepancy, in canonical units (README, 'Usage': the findings.csv fields)."""

    rule: str
    severity: str
    table: str
    compound_id: str | None
    column: str | None
    message: str
    t: float | None = None
    observed: Any = None
    expected: Any = None
    tolerance: Any = None
    suggestion: str | None = None
    reference: str | None = None
    row: int | None = None
    source: str | None = None
    finding_id: str | None = None
    corrected: float | None = None  # the diagnosed repair of the cell, for corrections.csv


FIELDS = (
    "finding_id",
    "rule",
    "severity",
    "table",
    "compound_id",
    "column",
    "t",
    "observed",
    "expected",
    "tolerance",
    "suggestion",
    "reference",
    "message",
    "row",
    "source",
    "corrected",
)
assert set(FIELDS) == {f.name for f in fields(Finding)}


def to_frame(items: Iterable[Finding] | pd.DataFrame | None) -> pd.DataFrame:
    """Return findings as a DataFrame with exactly the columns of FIELDS."""
    if items is None:
        frame = pd.DataFrame(columns=list(FIELDS))
    elif isinstance(items, pd.DataFrame):
        frame = items.copy()
    else:
        rows = [asdict(item) for item in items]
        frame = pd.DataFrame(rows, columns=list(FIELDS))
    for name in FIELDS:
        if name not in frame.columns:
            frame[name] = None
    frame = frame[list(FIELDS)].astype(object)
    return frame.where(frame.notna(), None)


def _key_part(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, float):
        if math.isnan(value):
            return ""
        return format(value, ".6g")
    return str(value)


def assign_ids(frame: pd.DataFrame) -> pd.DataFrame:
    """Give every finding a stable ``finding_id``.

    The id hashes what the finding is about, never where the row sits in the
    file: rule, table, compound_id, column and the point's temperature (to 6
    significant digits), plus the observed value for findings about a cell
    or row that has no other identity (non-numeric cells, duplicate ids).
    Findings that still share a key are numbered in a fixed order.
    """
    if frame.empty:
        return frame
    out = frame.copy()
    keys = []
    for rule, table, cid, col, t, observed in zip(
        out["rule"], out["table"], out["compound_id"], out["column"], out["t"], out["observed"]
    ):
        parts = [rule, table, cid, col, t]
        if cid is None or rule in _ID_WITH_OBSERVED:
            parts.append(observed)
        keys.append("|".join(_key_part(p) for p in parts))
    out["_key"] = keys
    out["_order"] = out.groupby("_key").cumcount()
    out["finding_id"] = [
        hashlib.sha1(f"{key}#{order}".encode()).hexdigest()[:16]
        for key, order in zip(out["_key"], out["_order"])
    ]
    return out.drop(columns=["_key", "_order"])


# Rules whose findings are told apart by the offending value itself.
_ID_WITH_OBSERVED = frozenset({"cell-not-numeric", "duplicate-compound-id"})


def sort_findings(frame: pd.DataFrame) -> pd.DataFrame:
    """Sort by severity (worst first), compound, rule, column, t; stable."""
    if frame.empty:
        return frame
    order = frame.assign(
        _sev=-frame["severity"].map(severity_rank),
        _cid=frame["compound_id"].fillna(""),
        _col=frame["column"].fillna(""),
        _t=pd.to_numeric(frame["t"], errors="coerce").fillna(-1.0),
    ).sort_values(["_sev", "_cid", "rule", "_col", "_t", "finding_id"], kind="stable")
    return order.drop(columns=["_sev", "_cid", "_col", "_t"]).reset_index(drop=True)
