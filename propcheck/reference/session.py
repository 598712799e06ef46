"""Per-run reference lookups, shared by every rule of one run.

The reference tables load once per process (:func:`propcheck.reference.get_reference`);
the identity and value tables of one database are computed once per run and
kept on the :class:`~propcheck.database.Database` object.
"""

from __future__ import annotations

import pandas as pd

from propcheck.reference import get_reference
from propcheck.reference.identity import resolve_identity

__all__ = ["constants", "identity", "vapor_pressure"]


def _cache(db) -> dict:
    reference = get_reference()
    cache = db.__dict__.get("_reference_cache")
    if cache is None or cache["reference"] is not reference:
        cache = {"reference": reference}
        db.__dict__["_reference_cache"] = cache
    return cache


def identity(db) -> pd.DataFrame:
    """Identity per compounds row (see :func:`resolve_identity`)."""
    cache = _cache(db)
    if "identity" not in cache:
        cols = [r[0] for r in db.con.execute("DESCRIBE compounds").fetchall()]
        pick = ", ".join(c for c in ("name", "cas", "formula") if c in cols)
        frame = db.df(f"SELECT _row AS row, compound_id, source, {pick} FROM compounds ORDER BY _row")
        cache["identity"] = resolve_identity(frame, cache["reference"])
    return cache["identity"]


def constants(db) -> pd.DataFrame:
    """Long table of reference constants, ``key`` = compounds ``_row``."""
    cache = _cache(db)
    if "constants" not in cache:
        ident = identity(db)
        ids = pd.DataFrame({"key": ident["row"], "cas": ident["ref_cas"]}).dropna()
        cache["constants"] = cache["reference"].constants(ids)
    return cache["constants"]


def vapor_pressure(db) -> tuple[pd.DataFrame, pd.DataFrame]:
    """(points with their reference CAS, long table of reference p at each point; ``key`` = point ``_row``)."""
    cache = _cache(db)
    if "vp" not in cache:
        ident = identity(db)
        unique = ident[~ident["compound_id"].duplicated(keep=False)]
        answerable = cache["reference"].vapor_pressure_cas()
        known = unique.loc[unique["ref_cas"].isin(answerable), ["compound_id"]]
        # only the points of compounds the reference has vapor pressures for: the others cannot
        # be compared, and millions of them as a pandas frame would cost gigabytes for nothing
        db.con.register("_reference_known", known)
        try:
            points = db.df("SELECT v._row, v.compound_id, v.t, v.p, v.source, "
                           + ("v.uncertainty" if _has(db, "vapor_pressure", "uncertainty") else "NULL AS uncertainty")
                           + " FROM vapor_pressure v JOIN _reference_known USING (compound_id)"
                           " WHERE v.t IS NOT NULL AND v.p IS NOT NULL ORDER BY v._row")
        finally:
            db.con.unregister("_reference_known")
        points = points.merge(unique[["compound_id", "ref_cas", "note", "name_conflict"]], on="compound_id", how="left")
        ask = pd.DataFrame({"key": points["_row"], "cas": points["ref_cas"], "t": points["t"]}).dropna()
        cache["vp"] = (points, cache["reference"].vapor_pressure(ask))
    return cache["vp"]


def _has(db, table: str, column: str) -> bool:
    return column in [r[0] for r in db.con.execute(f"DESCRIBE {table}").fetchall()]
