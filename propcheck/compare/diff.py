"""Differences between two loaded databases: added, removed and changed compounds and points.

Compounds are matched by ``compound_id``, vapor-pressure points by
``compound_id`` and ``t`` rounded to 1 mK. A numeric value counts as changed
when ``|a - b| > rtol * max(|a|, |b|)`` or when it appears or disappears; a
text value when it differs. Everything runs as SQL in one DuckDB connection.
"""

from __future__ import annotations

import pandas as pd

from propcheck.canonical import TABLES
from propcheck.database import Database

__all__ = ["diff_databases"]

T_DECIMALS = 3  # points are matched on t rounded to 1 mK (common practice for tabulated K values)


def _columns(db: Database, table: str) -> list[str]:
    present = {r[0] for r in db.con.execute(
        "SELECT column_name FROM information_schema.columns WHERE table_name = ?", [table]).fetchall()}
    return [c.name for c in TABLES[table].columns if c.name in present]


def _bring(current: Database, incoming: Database, table: str, alias: str) -> bool:
    if not incoming.has(table):
        return False
    current.con.register(alias, incoming.con.execute(f'SELECT * FROM "{table}"').df())
    return True


def diff_databases(current: Database, incoming: Database, rtol: float = 1e-6, full: bool = False) -> pd.DataFrame:
    """Return one row per difference: kind, table, compound_id, t, column, current, incoming, rel_change.

    ``kind`` is ``added`` / ``removed`` (a compound or point) or ``changed`` (one value). With
    ``full=False`` the incoming data are a delivery: no compound is removed, and a point is
    removed only when the delivery carries points for its compound but not that one. With
    ``full=True`` they are the whole new database: whatever they lack is removed.
    """
    frames = []
    con = current.con
    for table, key in (("compounds", ["compound_id"]), ("vapor_pressure", ["compound_id", "t"])):
        alias = f"_incoming_{table}"
        has_in = _bring(current, incoming, table, alias)
        has_cur = current.has(table)
        if not (has_in or has_cur):
            continue
        cur_sql = f'SELECT * FROM "{table}"' if has_cur else f"SELECT * FROM {alias} WHERE false"
        in_sql = f"SELECT * FROM {alias}" if has_in else f'SELECT * FROM "{table}" WHERE false'
        cols = [c for c in _columns(current if has_cur else incoming, table)]
        if has_in and has_cur:
            cols = [c for c in cols if c in _columns(incoming, table)]
        kexpr = "compound_id" + (f", round(t, {T_DECIMALS}) AS tk" if table == "vapor_pressure" else "")
        kcols = ["compound_id"] + (["tk"] if table == "vapor_pressure" else [])
        value_cols = [c for c in cols if c not in key]
        sel = ", ".join(f'any_value("{c}") AS "{c}"' for c in value_cols + (["t"] if "t" in key else []))
        con.execute(f"CREATE OR REPLACE TEMP VIEW _cur AS SELECT {kexpr}, {sel} FROM ({cur_sql}) "
                    f"WHERE compound_id IS NOT NULL {'AND t IS NOT NULL' if 't' in key else ''} GROUP BY ALL")
        con.execute(f"CREATE OR REPLACE TEMP VIEW _inc AS SELECT {kexpr}, {sel} FROM ({in_sql}) "
                    f"WHERE compound_id IS NOT NULL {'AND t IS NOT NULL' if 't' in key else ''} GROUP BY ALL")
        on = " AND ".join(f"a.{k} = b.{k}" for k in kcols)
        t_expr = "coalesce(b.t, a.t)" if table == "vapor_pressure" else "NULL::DOUBLE"
        frames.append(con.execute(
            f"SELECT 'added' AS kind, '{table}' AS \"table\", b.compound_id, {t_expr.replace('a.t', 'NULL')} AS t, "
            f"NULL AS \"column\", NULL AS current, NULL AS incoming, NULL::DOUBLE AS rel_change "
            f"FROM _inc b ANTI JOIN _cur a ON {on} "
            f"UNION ALL SELECT 'removed', '{table}', a.compound_id, {'a.t' if table == 'vapor_pressure' else 'NULL::DOUBLE'}, "
            f"NULL, NULL, NULL, NULL FROM _cur a ANTI JOIN _inc b ON {on} "
            + ("" if full else ("WHERE false" if table == "compounds" else
                                "WHERE a.compound_id IN (SELECT compound_id FROM _inc)"))
        ).df())
        numeric = {c.name for c in TABLES[table].columns if c.numeric}
        for col in value_cols:  # loop over columns; the rows are compared in SQL
            if col in numeric:
                cond = (f'(a."{col}" IS NULL) <> (b."{col}" IS NULL) OR abs(a."{col}" - b."{col}") > '
                        f'{float(rtol)} * greatest(abs(a."{col}"), abs(b."{col}"))')
                rel = f'CASE WHEN a."{col}" <> 0 THEN (b."{col}" - a."{col}") / abs(a."{col}") END'
            else:
                cond = f'a."{col}" IS DISTINCT FROM b."{col}"'
                rel = "NULL::DOUBLE"
            frames.append(con.execute(
                f"SELECT 'changed' AS kind, '{table}' AS \"table\", a.compound_id, "
                f"{'a.t' if table == 'vapor_pressure' else 'NULL::DOUBLE'} AS t, '{col}' AS \"column\", "
                f'CAST(a."{col}" AS VARCHAR) AS current, CAST(b."{col}" AS VARCHAR) AS incoming, {rel} AS rel_change '
                f"FROM _cur a JOIN _inc b ON {on} WHERE {cond}"
            ).df())
        if has_in:
            con.unregister(alias)
    con.execute("DROP VIEW IF EXISTS _cur")
    con.execute("DROP VIEW IF EXISTS _inc")
    frames = [f for f in frames if not f.empty]
    if not frames:
        return pd.DataFrame(columns=["kind", "table", "compound_id", "t", "column", "current", "incoming", "rel_change"])
    out = pd.concat(frames, ignore_index=True)
    out["_k"] = out["kind"].map({"added": 0, "removed": 1, "changed": 2})
    out = out.sort_values(["_k", "table", "compound_id", "t", "column"], na_position="first", kind="stable")
    return out.drop(columns="_k").reset_index(drop=True).astype(object).where(lambda f: f.notna(), None)
