"""Load stage: read a property database into canonical DuckDB tables."""

from __future__ import annotations

from pathlib import Path

import duckdb

from propcheck.canonical import TABLES
from propcheck.database import Database
from propcheck.errors import UsageError
from propcheck.load.canonicalize import canonicalize
from propcheck.load.mapping import read_mapping
from propcheck.load.sources import display_source, open_source
from propcheck.memory import release_freed_memory

__all__ = ["load_database"]

COMPRESS_ROWS = 2_000_000  # rows from which compressing the working tables pays for its time


def load_database(source: str, mapping_path: str | None = None) -> Database:
    """Read ``source`` (folder, DuckDB/SQLite/Excel file, PostgreSQL URL) into a new in-memory database."""
    data_dir = Path(source) if not source.startswith(("postgresql://", "postgres://")) and Path(source).is_dir() else None
    mapping = read_mapping(mapping_path, data_dir)
    con = duckdb.connect(":memory:")
    con.execute("SET enable_progress_bar = false")  # propcheck reports its own progress
    # the working tables live in a compressed in-memory catalog: after a checkpoint a
    # large point table takes a fraction of its plain in-memory size
    con.execute("ATTACH ':memory:' AS work (COMPRESS)")
    con.execute("USE work")
    con.execute("SET allocator_background_threads = true")  # hand freed memory back to the system
    con.execute("SET allocator_flush_threshold = '16MB'")
    kind, raw_tables = open_source(con, source, mapping)
    db = Database(con=con, source=display_source(source), kind=kind)
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
                    file=display_source(source),
                    table=spec.name,
                )
            continue
        canonicalize(db, spec, raw, mapping)
        _release(con, raw)
    if sum(info.rows_read for info in db.tables.values()) >= COMPRESS_ROWS:
        con.execute("CHECKPOINT work")  # compress what the batches left uncompressed
        release_freed_memory()  # the Arrow batches that carried the rows
    used = {mapping.table(name).source_table.lower() for name in db.tables}
    for name in sorted(set(raw_tables) - used):
        db.notes.append(f"table {name!r} ({raw_tables[name].origin}) is not a canonical table; not loaded")
    return db


def _release(con, raw) -> None:
    """Close a driver connection once its table has been read (SQLite, PostgreSQL)."""
    if raw.keep is None:
        return
    con.unregister(raw.relation.strip('"'))
    for part in raw.keep if isinstance(raw.keep, tuple) else (raw.keep,):
        close = getattr(part, "close", None)
        if close is not None:
            try:
                close()
            except Exception:  # closing a finished read-only session cannot lose data
                pass
    raw.keep = None
