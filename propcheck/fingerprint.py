"""The data's fingerprint: a hash of the canonical tables' content, row order ignored.

Each row (canonical columns in a fixed order, the source row number left
out) is hashed with DuckDB's 64-bit ``hash`` of its values; the hashes are
summed per table, so reordering rows does not change the fingerprint and any
changed value does. ``hash`` is deterministic but belongs to the DuckDB
version: after a DuckDB upgrade the same data may get a new fingerprint
(MD5 of each row's text, used before, is stable but took a second per
million rows).
"""

from __future__ import annotations

import hashlib

from propcheck.canonical import TABLES
from propcheck.database import Database

__all__ = ["fingerprint"]


def fingerprint(db: Database) -> str:
    """Return a 16-hex-digit fingerprint of every canonical table in ``db``."""
    parts = []
    for name in sorted(db.tables):
        present = {r[0] for r in db.con.execute(
            "SELECT column_name FROM information_schema.columns WHERE table_name = ?", [name]).fetchall()}
        cols = [c.name for c in TABLES[name].columns if c.name in present] if name in TABLES else sorted(present - {"_row"})
        if not cols:
            continue
        row = ", ".join(f'"{c}"' for c in cols)
        n, total = db.con.execute(
            f"SELECT count(*), coalesce(sum(hash({row})::HUGEINT), 0) FROM \"{name}\""
        ).fetchone()
        parts.append(f"{name}:{','.join(cols)}:{n}:{total}")
    return hashlib.sha256("\n".join(parts).encode()).hexdigest()[:16]
