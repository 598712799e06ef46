"""Find the source's tables: a folder of CSV/Parquet files or a DuckDB file.

Each reader returns, per source table name (lower case), a DuckDB relation
expression to select from and a description of its origin. Sources are only
ever read: CSV and Parquet through DuckDB's readers, a DuckDB file through a
``READ_ONLY`` attachment.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

import duckdb

from propcheck.errors import UsageError
from propcheck.load.mapping import Mapping

__all__ = ["RawTable", "open_source"]

NOT_YET = {
    ".sqlite": "SQLite",
    ".db": "SQLite",
    ".xlsx": "Excel",
    ".xls": "Excel",
}


@dataclass
class RawTable:
    """A source table: a relation expression and where it came from."""

    name: str
    relation: str
    origin: str
    csv_decimal: str = "."


def _sql_str(text: str) -> str:
    return "'" + text.replace("'", "''") + "'"


def open_source(con: duckdb.DuckDBPyConnection, source: str, mapping: Mapping) -> tuple[str, dict[str, RawTable]]:
    """Return the source kind and its tables, keyed by lower-case table name."""
    if source.startswith(("postgresql://", "postgres://")):
        raise UsageError("PostgreSQL sources are not supported in this version", file=source)
    path = Path(source)
    if not path.exists():
        raise UsageError("no such file or folder", file=source)
    if path.is_dir():
        return "folder", _folder_tables(con, path, mapping)
    suffix = path.suffix.lower()
    if suffix == ".duckdb":
        return "duckdb", _duckdb_tables(con, path)
    if suffix in NOT_YET:
        raise UsageError(f"{NOT_YET[suffix]} sources are not supported in this version", file=source)
    raise UsageError(
        "unknown source format (give a folder of .csv/.parquet files or a .duckdb file)", file=source
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
            tables[name] = RawTable(name, f"read_parquet({_sql_str(str(path))})", str(path))
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
