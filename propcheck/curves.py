"""Every compound's vapor-pressure curve, fitted once per run and shared by the rules.

Loads the points below tc (points beyond it are ``vp-beyond-critical-point``'s)
and the compounds' constants from DuckDB as numpy arrays,
fits them all at once (:func:`propcheck.physics.vp_fit.fit_vapor_pressure`),
compares each series with the Lee-Kesler corresponding-states estimate, and
caches the result on the :class:`~propcheck.database.Database`.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

import numpy as np

from propcheck.memory import release_freed_memory
from propcheck.physics.grouped_fit import group_blocks, group_median
from propcheck.physics.unit_slips import PRESSURE_SLIPS
from propcheck.physics.vapor_pressure import P_ATM, lee_kesler_psat
from propcheck.physics.vp_fit import FORM_TITLES, FORMS, VpFit, fit_in_blocks

__all__ = ["CurvePoints", "Curves", "curve_points", "curves"]

BLOCK_POINTS = 1 << 18  # points handled at once by the per-point arithmetic: small temporaries
CS_TR_RANGE = (0.5, 1.0)  # Lee-Kesler is reliable here within a few percent (Poling et al. ch. 7)


@dataclass
class Curves:
    """Points (sorted by compound, t), compounds and the fitted curves."""

    ids: np.ndarray  # (G,) compound_id per group
    group: np.ndarray  # (n,)
    t: np.ndarray
    p: np.ndarray
    u: np.ndarray  # stated uncertainty [Pa], NaN where none
    row: np.ndarray
    db: object  # the Database, to look up the source of flagged points
    c_row: np.ndarray  # (G,) compounds row
    c_source: np.ndarray
    tc: np.ndarray
    pc: np.ndarray
    omega: np.ndarray
    tb: np.ndarray
    tm: np.ndarray
    fit: VpFit
    cs_log_ratio: np.ndarray  # (G,) median ln(p / p_Lee-Kesler) over points with Tr in CS_TR_RANGE
    cs_points: np.ndarray  # (G,) number of points behind cs_log_ratio
    series_factor: np.ndarray  # (G,) unit factor the whole series is off by, NaN if none
    series_slip: np.ndarray  # (G,) text naming that slip, "" if none

    @cached_property
    def set_aside(self) -> np.ndarray:
        """(G,) points each compound's robust fit gave no weight."""
        return np.bincount(self.group, self.fit.weight == 0, minlength=len(self.ids)).astype(int)

    def describe(self, g) -> str:
        """'Antoine fit of 8 points (robust)' for compound index g, naming points the fit set aside."""
        form = FORMS[self.fit.form[g]]
        aside = int(self.set_aside[g]) if self.fit.form[g] > 0 else 0
        note = f"; {aside} point{'s' if aside > 1 else ''} set aside" if aside else ""
        return f"{FORM_TITLES.get(form, form)} fit of {int(self.fit.n_points[g])} points (robust{note})"

    def index(self) -> dict[str, int]:
        return {cid: i for i, cid in enumerate(self.ids)}

    def free_fit_near_critical(self, min_tr: float) -> tuple[np.ndarray, VpFit | None]:
        """Compounds whose points reach Tr >= min_tr, and their fits not anchored on tc, pc.

        Returns the compound indices and a :class:`VpFit` of the free forms
        (indexed by compound, like every other array here).
        """
        with np.errstate(invalid="ignore"):
            reach = self.fit.t_max / self.tc
        eligible = (np.isfinite(reach) & (reach >= min_tr) & (reach < 1.0) & np.isfinite(self.pc)
                    & ~np.isfinite(self.series_factor) & (self.fit.free_form > 0))
        gsel = np.nonzero(eligible)[0]
        return gsel, (self.fit.free() if len(gsel) else None)

    def point_sources(self, rows) -> np.ndarray:
        """The ``source`` of the vapor-pressure rows ``rows`` (looked up only for findings)."""
        rows = np.asarray(rows)
        if len(rows) == 0:
            return np.array([], dtype=object)
        found = dict(self.db.con.execute(
            "SELECT _row, source FROM vapor_pressure WHERE _row IN (SELECT unnest(?))", [rows.tolist()]
        ).fetchall())
        return np.array([found.get(int(r)) for r in rows], dtype=object)


# Compounds with points to fit get their group index once (thousands of rows), so the
# million-row points query is a plain join and sort, with no window over it.
_GROUPS_SQL = """
CREATE OR REPLACE TEMP TABLE _curve_groups AS
SELECT row_number() OVER (ORDER BY compound_id) - 1 AS g, compound_id, tc FROM compounds
WHERE compound_id IN (SELECT v.compound_id FROM vapor_pressure v JOIN compounds c USING (compound_id)
                      WHERE v.t > 0 AND v.p > 0 AND (c.tc IS NULL OR v.t < c.tc))
"""

# Up to a few million points, one sorted query. Beyond, the order of the points is found by
# sorting their keys alone; their values are then read once in table order, batch by batch,
# and each batch scattered into place: neither DuckDB nor Python ever holds a second full copy.
_POINTS_SQL = """
SELECT c.g::INTEGER AS g, v._row::INTEGER AS row, v.t AS t, v.p AS p,
       coalesce(v.uncertainty, 'NaN'::DOUBLE) AS u
FROM vapor_pressure v JOIN _curve_groups c USING (compound_id)
WHERE v.t > 0 AND v.p > 0 AND (c.tc IS NULL OR v.t < c.tc)
ORDER BY c.g, v.t, v._row
"""
SORT_IN_ONE_QUERY = 4_000_000  # points up to which one sorted query fetches them (faster, more memory)

_ORDER_SQL = """
SELECT c.g::INTEGER AS g, v._row::INTEGER AS row
FROM vapor_pressure v JOIN _curve_groups c USING (compound_id)
WHERE v.t > 0 AND v.p > 0 AND (c.tc IS NULL OR v.t < c.tc)
ORDER BY c.g, v.t, v._row
"""

_ORDER_COUNT_SQL = """
SELECT count(*) FROM vapor_pressure v JOIN _curve_groups c USING (compound_id)
WHERE v.t > 0 AND v.p > 0 AND (c.tc IS NULL OR v.t < c.tc)
"""
# 32-bit group and row numbers (2**31 rows is far beyond any table)
ORDER_DTYPES = {"g": np.int32, "row": np.int32}
VALUE_COLUMNS = {"t": "t", "p": "p", "u": "coalesce(uncertainty, 'NaN'::DOUBLE)"}
FETCH_ROWS = 1 << 20  # points per Arrow batch

_COMPOUNDS_SQL = """
SELECT c.compound_id, c._row AS row, coalesce(c.source, '') AS source,
       coalesce(c.tc, 'NaN'::DOUBLE) AS tc, coalesce(c.pc, 'NaN'::DOUBLE) AS pc,
       coalesce(c.omega, 'NaN'::DOUBLE) AS omega, coalesce(c.tb, 'NaN'::DOUBLE) AS tb,
       coalesce(c.tm, 'NaN'::DOUBLE) AS tm
FROM compounds c JOIN _curve_groups USING (compound_id)
ORDER BY _curve_groups.g
"""


@dataclass
class CurvePoints:
    """The points a curve is fitted to (0 < t < tc, p > 0), sorted by (compound, t, row), and their compounds."""

    ids: np.ndarray  # (G,) compound_id per group, sorted
    group: np.ndarray  # (n,)
    t: np.ndarray
    p: np.ndarray
    u: np.ndarray  # stated uncertainty [Pa], NaN where none
    row: np.ndarray
    compounds: dict  # column -> (G,) array: row, source, tc, pc, omega, tb, tm


def curve_points(db) -> CurvePoints | None:
    """The run's sorted curve points (fetched on first use), or None without any."""
    if "curve_points" not in db.cache:
        db.cache["curve_points"] = _fetch_points(db) if db.has("vapor_pressure") else None
    return db.cache["curve_points"]


def _stream_into_arrays(con, sql: str, dtypes: dict[str, type], n: int) -> dict[str, np.ndarray]:
    """The ``n`` rows of ``sql`` as numpy arrays, filled batch by batch.

    Arrow batches are copied straight into preallocated arrays, so at no
    moment does a second full copy of the result exist in Python.
    """
    out = {name: np.empty(n, dtype=dtype) for name, dtype in dtypes.items()}
    at = 0
    for batch in con.sql(sql).to_arrow_reader(FETCH_ROWS):
        rows = batch.num_rows
        for name in dtypes:
            out[name][at:at + rows] = batch.column(name).to_numpy(zero_copy_only=False)
        at += rows
    if at != n:
        raise RuntimeError(f"expected {n} rows, read {at}")
    return out


def _fetch_points(db) -> CurvePoints | None:
    con = db.con
    con.execute(_GROUPS_SQL)
    try:
        n = con.execute(_ORDER_COUNT_SQL).fetchall()[0][0]
        if n <= SORT_IN_ONE_QUERY:
            pts = _stream_into_arrays(con, _POINTS_SQL, {**ORDER_DTYPES, **dict.fromkeys(VALUE_COLUMNS, np.float64)}, n)
        else:
            pts = _points_by_key_sort(con, n)
        comp = con.execute(_COMPOUNDS_SQL).fetchnumpy()
    finally:
        con.execute("DROP TABLE _curve_groups")
    release_freed_memory()  # the Arrow batches of the fetch
    if len(pts["g"]) == 0:
        return None
    return CurvePoints(
        ids=np.asarray(comp["compound_id"], dtype=object), group=pts["g"],
        t=np.asarray(pts["t"], float), p=np.asarray(pts["p"], float), u=np.asarray(pts["u"], float),
        row=pts["row"],
        compounds={"row": np.asarray(comp["row"]), "source": np.asarray(comp["source"], dtype=object),
                   **{c: np.asarray(comp[c], float) for c in ("tc", "pc", "omega", "tb", "tm")}},
    )


def _points_by_key_sort(con, n: int) -> dict[str, np.ndarray]:
    """The ``n`` curve points, sorted by their keys in DuckDB and scattered into place in one scan.

    Only the keys (group, row) are sorted; the values are then read once in
    table order, batch by batch, and each batch's curve points are written
    to their sorted positions, found through their unique ``_row``.
    """
    order = _stream_into_arrays(con, _ORDER_SQL, ORDER_DTYPES, n)
    # sorted position of each table row by its _row (-1: not a curve point)
    slot = np.full(int(order["row"].max(initial=0)) + 1, -1, dtype=np.int32 if n < 2**31 else np.int64)
    slot[order["row"]] = np.arange(n, dtype=slot.dtype)
    for name in VALUE_COLUMNS:
        order[name] = np.empty(n, dtype=np.float64)
    values = ", ".join(f"{expr} AS {name}" for name, expr in VALUE_COLUMNS.items())
    filled = 0
    for batch in con.sql(f"SELECT _row::INTEGER AS row, {values} FROM vapor_pressure").to_arrow_reader(FETCH_ROWS):
        rows = batch.column("row").to_numpy(zero_copy_only=False)
        inside = rows < len(slot)
        at = np.full(len(rows), -1, dtype=slot.dtype)
        at[inside] = slot[rows[inside]]
        keep = at >= 0
        at = at[keep]
        filled += len(at)
        for name in VALUE_COLUMNS:
            order[name][at] = batch.column(name).to_numpy(zero_copy_only=False)[keep]
    if filled != n:
        raise RuntimeError(f"expected {n} curve points, placed {filled}")
    return order


def curves(db) -> Curves | None:
    """The run's fitted curves (computed on first use), or None without vapor-pressure data."""
    if "curves" not in db.cache:
        db.cache["curves"] = _compute(db) if db.has("vapor_pressure") else None
    return db.cache["curves"]


def _compute(db) -> Curves | None:
    pts = curve_points(db)
    if pts is None:
        return None
    comp = pts.compounds
    group, t, p, tc, pc = pts.group, pts.t, pts.p, comp["tc"], comp["pc"]
    n_groups = len(pts.ids)
    fit = fit_in_blocks(group, t, p, n_groups, tc, pc)
    release_freed_memory()  # the fitting threads' arenas would otherwise stay resident
    omega = comp["omega"]
    log_ratio, n_cs = _cs_log_ratio(group, t, p, n_groups, tc, pc, omega)
    from propcheck.rules.pack import settings_in_effect  # here: the pack module imports the rules

    rel_tol = float(settings_in_effect(db.cache.get("pack"), "vp-series-scaled")["factor_tolerance"])
    factor, slip = _series_slip(log_ratio, rel_tol)
    # a series whose own curve reaches 101.325 kPa at the stored tb agrees with tb: what disagrees
    # with Lee-Kesler is then tc, pc or omega (a pc in bar read as MPa, say), not the points
    with np.errstate(all="ignore"):
        at_tb = fit.ln_p(comp["tb"], np.arange(n_groups)) - np.log(P_ATM)
    own_tb = np.abs(at_tb) < np.log1p(rel_tol)
    factor = np.where(own_tb, np.nan, factor)
    slip = np.where(own_tb, "", slip)
    return Curves(
        ids=pts.ids, group=group, t=t, p=p, u=pts.u, row=pts.row, db=db, c_row=comp["row"],
        c_source=comp["source"], tc=tc, pc=pc, omega=omega, tb=comp["tb"], tm=comp["tm"], fit=fit,
        cs_log_ratio=log_ratio, cs_points=n_cs, series_factor=factor, series_slip=slip,
    )


def _cs_log_ratio(group, t, p, n_groups, tc, pc, omega):
    """Median ln(p / p_Lee-Kesler) per compound, over points with Tr in CS_TR_RANGE, block by block."""
    med = np.full(n_groups, np.nan)
    n_cs = np.zeros(n_groups, dtype=np.int64)
    for lo, hi in group_blocks(group, BLOCK_POINTS):
        g = group[lo:hi]
        g_lo, g_hi = int(g[0]), int(g[-1]) + 1
        gl = g - g_lo
        tcg, pcg, omg = tc[g_lo:g_hi][gl], pc[g_lo:g_hi][gl], omega[g_lo:g_hi][gl]
        with np.errstate(all="ignore"):
            tr = t[lo:hi] / tcg
            use = (tr >= CS_TR_RANGE[0]) & (tr < CS_TR_RANGE[1]) & np.isfinite(omg) & np.isfinite(pcg)
            ratio = np.where(use, np.log(p[lo:hi] / lee_kesler_psat(t[lo:hi], tcg, pcg, omg)), np.nan)
        n_cs[g_lo:g_hi] = np.bincount(gl, use, minlength=g_hi - g_lo).astype(np.int64)
        med[g_lo:g_hi] = group_median(ratio, gl, g_hi - g_lo)  # NaN (unusable) points are left out
    return np.where(n_cs > 0, med, np.nan), n_cs


def _series_slip(log_ratio, rel_tol):
    """The unit factor a whole series is off by (as observed/expected), if any.

    ``rel_tol``: relative misfit of the ratio to a unit factor still counted as that factor.
    """
    factor = np.full(len(log_ratio), np.nan)
    text = np.full(len(log_ratio), "", dtype=object)
    best = np.full(len(log_ratio), np.inf)
    for f, what in PRESSURE_SLIPS:
        misfit = np.abs(log_ratio - np.log(f))
        hit = (misfit < np.log1p(rel_tol)) & (misfit < best)
        best = np.where(hit, misfit, best)
        factor = np.where(hit, f, factor)
        text[hit] = what
    return factor, text
