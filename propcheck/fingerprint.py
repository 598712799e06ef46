"""The data's fingerprint: a hash of the canonical tables' content, row order ignored.

Each row (canonical columns in a fixed order, the source row number left
out) is hashed with MD5 in DuckDB; the low 64 bits are summed per table, so
reordering rows does not change the fingerprint and any changed value does.
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
            f"SELECT count(*), coalesce(sum(md5_number_lower(CAST(ROW({row}, NULL) AS VARCHAR))::HUGEINT), 0) FROM \"{name}\""
        ).fetchone()
        parts.append(f"{name}:{','.join(cols)}:{n}:{total}")
    return hashlib.sha256("\n".join(parts).encode()).hexdigest()[:16]
