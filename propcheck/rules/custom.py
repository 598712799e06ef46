"""Run a user's custom rule: a SQL query whose rows become findings.

The query runs over the canonical tables (``compounds``, ``vapor_pressure``)
after the schema stage. Result columns named like finding fields
(``compound_id``, ``column``, ``t``, ``observed``, ``expected``,
``tolerance``, ``suggestion``, ``reference``, ``message``, ``table``) fill
those fields; the pack's ``message``, ``table`` and ``column`` fill the rest.
The tables live in the catalog ``work`` (``propcheck.load``); names qualified
with DuckDB's default catalog (``memory.compounds``, ``memory.main.compounds``)
find them through views made before the first custom rule runs.
"""

from __future__ import annotations

import duckdb
import pandas as pd

from propcheck.errors import UsageError
from propcheck.findings import FIELDS
from propcheck.rules.pack import CustomRule

__all__ = ["run_custom_rule"]

_FROM_QUERY = [f for f in FIELDS if f not in ("finding_id", "rule", "severity", "row", "source")]


def _memory_views(db) -> None:
    """Views ``memory.main.<table>`` over the canonical tables of the working catalog, once per run.

    A view holds no data and cannot be written to; the views go with the
    connection, and the working catalog (and its temporary file) is untouched.
    """
    if db.cache.get("_memory_views"):
        return
    db.cache["_memory_views"] = True
    current = db.con.execute("SELECT current_database()").fetchone()[0]
    if current == "memory":
        return
    catalog = current.replace('"', '""')
    for name in db.tables:
        table = name.replace('"', '""')
        db.con.execute(f'CREATE VIEW IF NOT EXISTS memory.main."{table}" AS SELECT * FROM "{catalog}".main."{table}"')


def run_custom_rule(db, rule: CustomRule) -> pd.DataFrame:
    """Return the rule's findings as a frame of finding fields."""
    _memory_views(db)
    try:
        result = db.con.execute(rule.sql).df()
    except duckdb.Error as exc:
        first = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
        raise UsageError(f"custom rule SQL failed ({first})", file=rule.origin, rule=rule.id, key="sql") from None
    out = pd.DataFrame(index=result.index)
    for name in _FROM_QUERY:
        if name in result.columns:
            out[name] = result[name].astype(object)
    if "_row" in result.columns:
        out["row"] = result["_row"]
    if "source" in result.columns:
        out["source"] = result["source"]
    out["rule"] = rule.id
    out["severity"] = rule.severity
    if "table" not in out.columns:
        out["table"] = rule.table
    if "column" not in out.columns:
        out["column"] = rule.column
    if "message" not in out.columns:
        out["message"] = rule.message or rule.title
    if "reference" not in out.columns and rule.reference:
        out["reference"] = rule.reference
    return out
