"""Load stage: read a property database into canonical DuckDB tables."""

from __future__ import annotations

import tempfile
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
LARGE_SOURCE_BYTES = 100 * 2**20  # sources from this size get a working database file (see _attach_work_catalog)


def load_database(source: str, mapping_path: str | None = None) -> Database:
    """Read ``source`` (folder, DuckDB/SQLite/Excel file, PostgreSQL URL) into a new in-memory database."""
    data_dir = None  # where a propcheck.toml beside the data is looked for: the folder, or a file's folder
    if not source.startswith(("postgresql://", "postgres://")):
        path = Path(source)
        data_dir = path if path.is_dir() else (path.parent if path.is_file() else None)
    mapping = read_mapping(mapping_path, data_dir)
    con = duckdb.connect(":memory:")
    con.execute("SET enable_progress_bar = false")  # propcheck reports its own progress
    con.execute("SET allocator_background_threads = true")  # hand freed memory back to the system
    workdir = _attach_work_catalog(con, source)
    kind, raw_tables = open_source(con, source, mapping)
    db = Database(con=con, source=display_source(source), kind=kind)
    if workdir is not None:
        db.cache["_workdir"] = workdir  # removed with the Database
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
        # compress the working tables: in memory they are compressed only at a checkpoint; in a
        # working file the checkpoint also lets DuckDB drop the pages it kept while writing
        # (skipping it raised the peak of ten million CSV points from 1.1 to 1.5 GiB)
        con.execute("CHECKPOINT work")
        release_freed_memory()
    used = {mapping.table(name).source_table.lower() for name in db.tables}
    for name in sorted(set(raw_tables) - used):
        db.notes.append(f"table {name!r} ({raw_tables[name].origin}) is not a canonical table; not loaded")
    return db


def _source_bytes(source: str) -> int:
    """Size of the source's files (0 for a server)."""
    path = Path(source)
    try:
        if path.is_dir():
            return sum(p.stat().st_size for p in path.iterdir() if p.is_file())
        return path.stat().st_size if path.is_file() else 0
    except OSError:
        return 0


def _attach_work_catalog(con, source: str) -> tempfile.TemporaryDirectory | None:
    """Attach and use the catalog ``work`` that holds the canonical tables.

    Normally a compressed in-memory database. For a source of LARGE_SOURCE_BYTES
    or more, a database file in a temporary directory (removed with the run):
    DuckDB then writes large tables compressed as it creates them and keeps
    only what it works on in memory, so ten million points never sit in
    memory uncompressed. The user's source is never written either way.
    """
    if _source_bytes(source) < LARGE_SOURCE_BYTES:
        con.execute("ATTACH ':memory:' AS work (COMPRESS)")
        con.execute("USE work")
        return None
    workdir = tempfile.TemporaryDirectory(prefix="propcheck-work-")
    file = Path(workdir.name) / "work.duckdb"
    con.execute(f"ATTACH '{_sql_path(file)}' AS work")
    con.execute("USE work")
    con.execute(f"SET temp_directory = '{_sql_path(Path(workdir.name) / 'spill')}'")
    return workdir


def _sql_path(path: Path) -> str:
    return str(path).replace("'", "''")


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
