"""Find the source's tables: a folder of CSV/Parquet files, a DuckDB, SQLite or Excel file, a PostgreSQL URL.

Each reader returns, per source table name (lower case), a DuckDB relation
expression to select from and a description of its origin. Sources are only
ever read: CSV and Parquet through DuckDB's readers, a DuckDB file through a
``READ_ONLY`` attachment; SQLite (``sqlite_source``), Excel (``excel_source``)
and PostgreSQL (``postgres_source``) arrive as Arrow data registered with the
connection.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Any

import duckdb

from propcheck.errors import UsageError
from propcheck.load.mapping import Mapping

__all__ = ["RawTable", "display_source", "open_source"]

SQLITE_SUFFIXES = (".sqlite", ".sqlite3", ".db")


@dataclass
class RawTable:
    """A source table: a relation expression and where it came from."""

    name: str
    relation: str
    origin: str
    csv_decimal: str = "."
    keep: Any = None  # driver connection / Arrow data that must live while the relation is read
    # the relation with the reader's own 0-based row number as column ``file_row_number`` (Parquet):
    # numbering rows without row_number() OVER () keeps the read parallel
    numbered: str | None = None


def display_source(source: str) -> str:
    """The source as it may be printed: a PostgreSQL URL without its password."""
    from propcheck.load.postgres_source import mask_url

    return mask_url(source)


def _sql_str(text: str) -> str:
    return "'" + text.replace("'", "''") + "'"


def open_source(
    con: duckdb.DuckDBPyConnection, source: str, mapping: Mapping, wanted: set[str] | None = None
) -> tuple[str, dict[str, RawTable]]:
    """Return the source kind and its tables, keyed by lower-case table name.

    For SQLite, Excel and PostgreSQL only the tables in ``wanted`` (default:
    those the mapping reads) are read; the others are listed.
    """
    if source.startswith(("postgresql://", "postgres://")):
        from propcheck.load.postgres_source import postgres_tables

        return "postgresql", postgres_tables(con, source, mapping, wanted)
    path = Path(source)
    if not path.exists():
        raise UsageError("no such file or folder", file=source)
    if path.is_dir():
        return "folder", _folder_tables(con, path, mapping)
    suffix = path.suffix.lower()
    if suffix == ".duckdb":
        return "duckdb", _duckdb_tables(con, path)
    if suffix in SQLITE_SUFFIXES:
        from propcheck.load.sqlite_source import sqlite_tables

        return "sqlite", sqlite_tables(con, path, mapping, wanted)
    if suffix in (".xlsx", ".xlsm"):
        from propcheck.load.excel_source import excel_tables

        return "excel", excel_tables(con, path, mapping, wanted)
    if suffix == ".xls":
        raise UsageError("the old binary .xls format is not read; save the workbook as .xlsx", file=source)
    raise UsageError(
        "unknown source format (give a folder of .csv/.parquet files, a .duckdb, .sqlite/.db or .xlsx file, "
        "or a postgresql:// URL)",
        file=source,
    )


def _folder_tables(con, folder: Path, mapping: Mapping) -> dict[str, RawTable]:
    tables: dict[str, RawTable] = {}
    for path in sorted(folder.iterdir()):
        suffix = path.suffix.lower()
        if not path.is_file() or suffix not in (".csv", ".parquet"):
            continue
        name = path.stem.lower()
        if name in tables:
            raise UsageError(
                f"two files hold table {name!r} ({Path(tables[name].origin).name} and {path.name}); keep one",
                file=str(folder),
            )
        if suffix == ".csv":
            tables[name] = _csv_table(con, path, name, mapping)
        else:
            tables[name] = RawTable(name, f"read_parquet({_sql_str(str(path))})", str(path),
                                    numbered=f"read_parquet({_sql_str(str(path))}, file_row_number=true)")
    return tables


def _csv_table(con, path: Path, name: str, mapping: Mapping) -> RawTable:
    """Read every cell as text; quirks (BOM, quotes, blank lines) are DuckDB's to handle."""
    if path.stat().st_size == 0:
        raise UsageError("file is empty (no header row)", file=str(path), table=name)
    delimiter = mapping.csv_delimiter
    if delimiter is None:
        try:
            sniffed = con.execute(f"SELECT Delimiter FROM sniff_csv({_sql_str(str(path))})").fetchone()
        except duckdb.Error as exc:
            raise UsageError(f"cannot read as CSV ({_first_line(exc)})", file=str(path), table=name) from None
        delimiter = sniffed[0] if sniffed and sniffed[0] else ","
    decimal = mapping.csv_decimal or ("," if delimiter == ";" else ".")
    relation = (
        f"read_csv({_sql_str(str(path))}, all_varchar=true, header=true, "
        f"delim={_sql_str(delimiter)}, quote='\"', escape='\"', null_padding=true)"
    )
    return RawTable(name, relation, str(path), csv_decimal=decimal)


def _duckdb_tables(con, path: Path) -> dict[str, RawTable]:
    try:
        con.execute(f"ATTACH {_sql_str(str(path))} AS src (READ_ONLY)")
    except duckdb.Error as exc:
        raise UsageError(f"cannot open as a DuckDB database ({_first_line(exc)})", file=str(path)) from None
    rows = con.execute(
        "SELECT schema_name, table_name FROM duckdb_tables() WHERE database_name = 'src' "
        "UNION ALL SELECT schema_name, view_name FROM duckdb_views() WHERE database_name = 'src' AND NOT internal"
    ).fetchall()
    tables = {}
    for schema, table in sorted(rows):
        key = table.lower()
        if key in tables and schema != "main":
            continue
        tables[key] = RawTable(key, f'src."{schema}"."{table}"', f"{path}:{table}")
    return tables


def _first_line(exc: Exception) -> str:
    text = str(exc).strip().splitlines()
    return text[0] if text else type(exc).__name__
