"""Load stage: read a property database into canonical DuckDB tables."""

from __future__ import annotations

from pathlib import Path

import duckdb

from propcheck.canonical import TABLES
from propcheck.database import Database
from propcheck.errors import UsageError
from propcheck.load.canonicalize import canonicalize
from propcheck.load.mapping import read_mapping
from propcheck.load.sources import open_source

__all__ = ["load_database"]


def load_database(source: str, mapping_path: str | None = None) -> Database:
    """Read ``source`` (folder or DuckDB file) into a new in-memory database."""
    data_dir = Path(source) if Path(source).is_dir() else None
    mapping = read_mapping(mapping_path, data_dir)
    con = duckdb.connect(":memory:")
    kind, raw_tables = open_source(con, source, mapping)
    db = Database(con=con, source=source, kind=kind)
    if mapping.path:
        db.notes.append(f"mapping file: {mapping.path}")
    for spec in TABLES.values():
        wanted = mapping.table(spec.name).source_table.lower()
        raw = raw_tables.get(wanted)
        if raw is None:
            if spec.required:
                found = ", ".join(sorted(raw_tables)) or "none"
                raise UsageError(
                    f"no {wanted!r} table (expected {wanted}.csv, {wanted}.parquet or a table of that name; found: {found})",
                    file=source,
                    table=spec.name,
                )
            continue
        canonicalize(db, spec, raw, mapping)
    used = {mapping.table(name).source_table.lower() for name in db.tables}
    for name in sorted(set(raw_tables) - used):
        db.notes.append(f"table {name!r} ({raw_tables[name].origin}) is not a canonical table; not loaded")
    return db
