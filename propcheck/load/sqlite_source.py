"""Read the tables of a SQLite file (``*.sqlite``, ``*.db``) as streamed Arrow batches.

The file is opened read-only (``mode=ro`` URI) with the ADBC SQLite driver,
which returns Arrow record batches: a million-row table never becomes a
Python object per row. SQLite stores any value in any column, so each column
is first classified in one aggregate query over ``typeof()``:

- only integers: passed as integers; integers and reals: as REAL;
- anything else: as text, reals written with 17 significant digits so that
  the text parses back to the same double (IEEE 754 round trip);
- a BLOB in a column mapped to a numeric canonical column is an error.

The ADBC driver infers each column's Arrow type from the first batch, which
fails when a column starts with many NULLs; a typed placeholder row is
therefore put first (``UNION ALL``) and dropped again from the stream.
"""

from __future__ import annotations

import sqlite3
from pathlib import Path

import duckdb

from propcheck.errors import UsageError
from propcheck.load.arrow_input import drop_first_row, numeric_targets, register_arrow, wanted_tables, wrong_type
from propcheck.load.mapping import Mapping
from propcheck.load.sources import RawTable

__all__ = ["sqlite_tables"]


def _q(name: str) -> str:
    return '"' + name.replace('"', '""') + '"'


def _uri(path: Path) -> str:
    return path.resolve().as_uri() + "?mode=ro"


def _list(path: Path) -> dict[str, tuple[str, list[str]]]:
    """lower-case table name -> (table name, column names), via the standard sqlite3 module."""
    try:
        con = sqlite3.connect(_uri(path), uri=True)
        try:
            names = [r[0] for r in con.execute(
                "SELECT name FROM sqlite_master WHERE type IN ('table', 'view') AND name NOT LIKE 'sqlite_%' ORDER BY name"
            )]
            return {n.lower(): (n, [r[1] for r in con.execute(f"PRAGMA table_info({_q(n)})")]) for n in names}
        finally:
            con.close()
    except sqlite3.Error as exc:
        raise UsageError(f"cannot open as a SQLite database ({exc})", file=str(path)) from None


def _classify(con, table: str, columns: list[str]) -> dict[str, str]:
    """column -> 'integer' | 'real' | 'text' | 'blob' from the stored values."""
    parts = []
    for c in columns:
        t = f"typeof({_q(c)})"
        parts += [f"sum({t} = 'integer')", f"sum({t} = 'real')", f"sum({t} = 'text')", f"sum({t} = 'blob')"]
    cur = con.cursor()
    cur.execute(f"SELECT {', '.join(parts)} FROM {_q(table)}")
    counts = [int(v or 0) for v in cur.fetchone()]
    cur.close()
    kinds = {}
    for i, c in enumerate(columns):
        n_int, n_real, n_text, n_blob = counts[4 * i: 4 * i + 4]
        if n_blob:
            kinds[c] = "blob"
        elif n_text or not (n_int or n_real):
            kinds[c] = "text"
        else:
            kinds[c] = "real" if n_real else "integer"
    return kinds


def _select(table: str, columns: list[str], kinds: dict[str, str]) -> str:
    head, body = [], []
    for c in columns:
        kind, col = kinds[c], _q(c)
        if kind == "integer":
            head.append(f"0 AS {col}")
            body.append(col)
        elif kind == "real":
            head.append(f"0.0 AS {col}")
            body.append(f"CAST({col} AS REAL)")
        else:
            head.append(f"'' AS {col}")
            body.append(f"CASE WHEN typeof({col}) = 'real' THEN printf('%!.17g', {col}) ELSE CAST({col} AS TEXT) END")
    return f"SELECT {', '.join(head)} UNION ALL SELECT {', '.join(body)} FROM {_q(table)}"


def sqlite_tables(
    con: duckdb.DuckDBPyConnection, path: Path, mapping: Mapping, wanted: set[str] | None = None
) -> dict[str, RawTable]:
    """Return the file's tables; stream those in ``wanted`` (default: the mapped ones)."""
    import adbc_driver_sqlite.dbapi as adbc_sqlite

    listed = _list(path)
    if not listed:
        raise UsageError("not a SQLite database, or one without tables", file=str(path))
    wanted = wanted_tables(mapping) if wanted is None else wanted
    tables: dict[str, RawTable] = {}
    for key, (name, columns) in sorted(listed.items()):
        origin = f"{path}:{name}"
        if key not in wanted:
            tables[key] = RawTable(key, "(SELECT 1)", origin)
            continue
        if not columns:
            raise UsageError("table has no columns", file=str(path), table=name)
        try:
            src = adbc_sqlite.connect(_uri(path))
            kinds = _classify(src, name, columns)
            targets = numeric_targets(mapping, key)
            for c in columns:
                if kinds[c] == "blob":
                    if c.strip().lower() in targets:
                        raise wrong_type(str(path), name, c, targets[c.strip().lower()], "BLOB (binary)")
                    kinds[c] = "text"
            cur = src.cursor()
            cur.execute(_select(name, columns, kinds))
            reader = drop_first_row(cur.fetch_record_batch())
        except UsageError:
            raise
        except Exception as exc:  # the driver's own errors: a locked or corrupt file
            first = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
            raise UsageError(f"cannot read ({first})", file=str(path), table=name) from None
        tables[key] = RawTable(key, register_arrow(con, f"sqlite_{key}", reader), origin, keep=(reader, cur, src))
    return tables
