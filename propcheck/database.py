"""The loaded database: canonical tables in an in-memory DuckDB connection."""

from __future__ import annotations

from dataclasses import dataclass, field

import duckdb

from propcheck.findings import Finding

__all__ = ["Database", "TableInfo"]


@dataclass
class TableInfo:
    """Where a canonical table came from and how many of its rows survived."""

    name: str
    origin: str  # file path or source table name
    rows_read: int = 0
    rows_rejected: int = 0
    cells_rejected: int = 0
    extra_columns: list[str] = field(default_factory=list)

    @property
    def rows_checked(self) -> int:
        return self.rows_read - self.rows_rejected


@dataclass
class Database:
    """Canonical tables ``compounds`` and ``vapor_pressure`` (when present).

    Each table carries ``_row``, the 1-based data row of the source (header
    excluded), so that every finding can point back at the source row.
    """

    con: duckdb.DuckDBPyConnection
    source: str
    kind: str
    tables: dict[str, TableInfo] = field(default_factory=dict)
    load_findings: list[Finding] = field(default_factory=list)
    # (table, row, column) of cells the load stage already reported
    rejected_cells: set[tuple[str, int, str]] = field(default_factory=set)
    notes: list[str] = field(default_factory=list)
    # results shared by several rules within one run (e.g. fitted curves)
    cache: dict = field(default_factory=dict)

    def has(self, table: str) -> bool:
        return table in self.tables

    def df(self, sql: str, params: list | None = None):
        """Run ``sql`` and return a pandas DataFrame."""
        return self.con.execute(sql, params or []).df()
