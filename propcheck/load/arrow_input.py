"""Hand Arrow data from a database driver to DuckDB, and the checks every such source shares.

A SQLite, PostgreSQL or Excel table arrives as Arrow record batches (a
``pyarrow.RecordBatchReader`` streams them, so a large table never becomes a
Python object per row). Registering the reader with the DuckDB connection
gives a relation that ``canonicalize`` reads exactly as it reads a CSV file.
"""

from __future__ import annotations

import itertools

import duckdb
import pyarrow as pa

from propcheck.canonical import TABLES
from propcheck.errors import UsageError
from propcheck.load.mapping import Mapping

__all__ = ["drop_first_row", "numeric_targets", "register_arrow", "wanted_tables", "wrong_type"]


def wanted_tables(mapping: Mapping) -> set[str]:
    """Lower-case names of the source tables the mapping reads."""
    return {mapping.table(name).source_table.lower() for name in TABLES}


def numeric_targets(mapping: Mapping, source_table: str) -> dict[str, str]:
    """Source column (lower case) -> canonical numeric column, for one source table."""
    out: dict[str, str] = {}
    for spec in TABLES.values():
        table_map = mapping.table(spec.name)
        if table_map.source_table.lower() != source_table.lower():
            continue
        for column in spec.columns:
            if column.numeric:
                out[table_map.source_column(column.name).strip().lower()] = column.name
    return out


def wrong_type(origin: str, table: str, column: str, canonical: str, found: str) -> UsageError:
    """The one-line error for a numeric canonical column stored as, e.g., a date."""
    return UsageError(
        f"column holds {found} values, but {canonical} needs numbers (or text holding numbers)",
        file=origin, table=table, column=column,
    )


def register_arrow(con: duckdb.DuckDBPyConnection, name: str, data: pa.RecordBatchReader | pa.Table) -> str:
    """Register ``data`` with ``con`` under a private view name; return the quoted name."""
    view = "arrow_src_" + "".join(ch if ch.isalnum() else "_" for ch in name.lower())
    con.register(view, data)
    return f'"{view}"'


def drop_first_row(reader: pa.RecordBatchReader) -> pa.RecordBatchReader:
    """The same stream without its first row (a typed placeholder row, see sqlite_source)."""

    def batches():
        first = True
        for batch in reader:
            if first and batch.num_rows:
                batch = batch.slice(1)
                first = False
            if batch.num_rows:
                yield batch

    return pa.RecordBatchReader.from_batches(reader.schema, itertools.chain(batches()))
