"""Narrow a large table to the rows its pandera schema could reject, in one SQL pass.

The point tables hold millions of rows of which almost all pass. Every
row-level check of their schemas (required values, the pack's ranges, the
compound id known to ``compounds``) has an exact SQL counterpart, so DuckDB
selects the rows that might fail and pandera validates only those (and the
column types, on whatever it is given). The predicate may select more rows
than fail (NaN in any float column, say), never fewer: pandera still decides
every finding. A schema with a check this module does not know is validated
whole.
"""

from __future__ import annotations

import pandera.pandas as pa

__all__ = ["suspect_rows_sql"]


def _quoted(name: str) -> str:
    return '"' + name.replace('"', '""') + '"'


def _number(value) -> str:
    value = float(value)
    return f"'{value}'::DOUBLE" if value != value or value in (float("inf"), float("-inf")) else repr(value)


def suspect_rows_sql(schema: pa.DataFrameSchema) -> str | None:
    """A SQL condition true for every row that ``schema`` could reject.

    ``None`` when the schema has a check without an SQL counterpart: the
    caller then validates every row.

    Examples
    --------
    >>> import pandera.pandas as pa
    >>> schema = pa.DataFrameSchema({"t": pa.Column(float, nullable=False)})
    >>> suspect_rows_sql(schema)
    '("t" IS NULL OR isnan("t"))'
    """
    terms = []
    for name, column in schema.columns.items():
        col = _quoted(name)
        if column.unique:
            return None  # a duplicate is a property of two rows, not of one
        numeric = column.dtype is not None and "float" in str(column.dtype).lower()
        if not column.nullable:
            terms.append(f"{col} IS NULL")
        if numeric:
            terms.append(f"isnan({col})")  # pandas reads NaN as missing: let pandera judge it
        for check in column.checks:
            check_name = str(check.name)
            if check_name.startswith("range:"):
                low, high = check.statistics["low"], check.statistics["high"]
                terms.append(f"NOT ({col} BETWEEN {_number(low)} AND {_number(high)})")
            elif check_name == "vp-unknown-compound":
                terms.append(f"{col} NOT IN (SELECT compound_id FROM compounds WHERE compound_id IS NOT NULL)")
            else:
                return None
    if not terms:
        return "FALSE"
    return "(" + " OR ".join(terms) + ")"
