"""The evidence a compound row is judged by, built once per run.

For every compound: its numeric constants, the molar mass of its formula
(IUPAC 2021 weights), its family's leave-one-out trend for tc, tb, pc and
omega (see off-family-trend), and its own vapor-pressure points: their span,
the run's fitted curve (``propcheck.curves``) solved for 101325 Pa and taken
at 0.7 tc (Pitzer's omega), else a Clausius-Clapeyron interpolation of the
two points bracketing 101325 Pa.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np
import pandas as pd

from propcheck.physics.atomic_weights import molar_mass, parse_formula

POLAR_ELEMENTS = {"O", "N", "F", "S"}  # hydrogen bonding / strong dipoles (common practice)
from propcheck.physics.family_trend import trend_outliers
from propcheck.physics.vapor_pressure import P_ATM, omega_from_psat

__all__ = ["NUMERIC", "TREND_COLUMNS", "Context", "FAMILY_DEFAULTS", "get_context"]

NUMERIC = ("molar_mass", "tc", "pc", "vc", "zc", "omega", "tb", "tm")
TREND_COLUMNS = ("tc", "tb", "pc", "omega")

# Defaults of the off-family-trend rule (rules/default.toml gives the basis
# of each number).
FAMILY_DEFAULTS = {
    "tolerance": {"tc": 3.0, "tb": 2.0, "pc": 0.03, "omega": 0.02},
    "isomer_tolerance": {"tc": 15.0, "tb": 12.0, "pc": 0.08, "omega": 0.05},
    "neighbours_each_side": 3,
    "min_neighbours": 4,
    "head_members": 1,
    "irregular_heads": {"1-alkanol": 2},
    "skip_omega": ["1-alkanol"],
    "not_series": ["inorganic", "other", "miscellaneous"],
    "max_off_share": 0.5,
}

BRACKET_TB_TOL = 2.0  # K, tb from the two points bracketing 101325 Pa (Clausius-Clapeyron; common practice)


@dataclass
class Context:
    frame: pd.DataFrame  # compounds: _row, compound_id, name, cas, formula, family, source
    values: dict[str, np.ndarray]
    formula_mass: np.ndarray
    carbon: np.ndarray
    family_code: np.ndarray  # -1: no family or not a series
    polar: np.ndarray | None = None  # formula holds O, N, F or S atoms (Lee-Kesler tolerance widened)
    withheld: dict[str, np.ndarray] = field(default_factory=dict)  # out-of-range values the schema stage nulled
    judged: dict[str, np.ndarray] = field(default_factory=dict)  # member may be judged for this column
    expected: dict[str, np.ndarray] = field(default_factory=dict)
    tolerance: dict[str, np.ndarray] = field(default_factory=dict)
    neighbours: dict[str, np.ndarray] = field(default_factory=dict)
    x: np.ndarray | None = None  # ln(carbon number), else ln(molar mass)
    head: np.ndarray | None = None  # irregular heads of series: neither judged nor used
    vp_tmax: np.ndarray | None = None
    vp_tb: np.ndarray | None = None  # tb of its own points: the fitted curve's, else the bracketing points'
    vp_tb_tol: np.ndarray | None = None  # K; tb-off-vp-curve's tolerance where from the curve
    vp_tb_from_curve: np.ndarray | None = None  # True where vp_tb is the fitted curve's, False: bracketing points'
    curve: object | None = None  # the run's VpFit (propcheck.curves), None without fitted curves
    curve_g: np.ndarray | None = None  # each row's compound in ``curve``; -1 none or the series is scaled
    curve_omega_tol: float = 0.0  # omega-off-vp-curve's tolerance, set with ``curve``
    curve_omega_extrapolation: float = 0.0  # and its largest extrapolation, as a fraction of tc
    # median of the independent reference sources per column (NaN where none), when reference checks run
    reference: dict[str, np.ndarray] = field(default_factory=dict)

    def family_z(self, column: str, values: np.ndarray, rows: np.ndarray) -> np.ndarray:
        """|value - family expectation| / tolerance for ``rows``; NaN where not judged."""
        exp = self.expected[column][rows]
        if column == "pc":
            with np.errstate(divide="ignore", invalid="ignore"):
                dev = np.log(values) - exp
        else:
            dev = values - exp
        return np.where(self.judged[column][rows], np.abs(dev) / self.tolerance[column][rows], np.nan)

    def curve_omega(self, rows: np.ndarray, tc: np.ndarray, pc: np.ndarray) -> np.ndarray:
        """Pitzer's omega of each row's own fitted curve, taken with ``tc`` and ``pc``; NaN where none.

        omega = -log10(p_sat(0.7 tc) / pc) - 1 (Pitzer et al. 1955), only
        where 0.7 tc lies within the points or at most
        ``curve_omega_extrapolation`` x tc beyond them (as omega-off-vp-curve).
        """
        out = np.full(len(rows), np.nan)
        if self.curve is None:
            return out
        g = self.curve_g[rows]
        has = g >= 0
        gs = np.where(has, g, 0)
        tc = np.asarray(tc, dtype=float)
        t07 = 0.7 * tc
        margin = self.curve_omega_extrapolation * tc
        with np.errstate(all="ignore"):
            inside = has & (t07 >= self.curve.t_min[gs] - margin) & (t07 <= self.curve.t_max[gs] + margin)
            omega = omega_from_psat(np.exp(self.curve.ln_p(t07, gs)), pc)
        return np.where(inside, omega, out)

    def positions(self, rows) -> np.ndarray:
        """Each compounds ``_row`` of ``rows`` as its position in the context frame (-1 where absent)."""
        index = pd.Index(self.frame["_row"].to_numpy())
        return index.get_indexer(np.asarray(rows))

    def expected_value(self, column: str, row: int) -> float:
        value = self.expected[column][row]
        return float(np.exp(value)) if column == "pc" else float(value)


def _family_x(frame: pd.DataFrame, carbon: np.ndarray, mass: np.ndarray, code: np.ndarray) -> np.ndarray:
    """ln(carbon number) where every member of the family has one, else ln(molar mass)."""
    has_c = pd.Series(carbon > 0).groupby(code).transform("all").to_numpy()
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(has_c, np.log(carbon), np.log(mass))


def _vp_summary(db, ids: pd.Series) -> tuple[np.ndarray, np.ndarray]:
    n = len(ids)
    if not db.has("vapor_pressure"):
        return np.full(n, -np.inf), np.full(n, np.nan)
    # tb from the two points bracketing 101325 Pa, linear in ln p against 1/T
    # (Clausius-Clapeyron over a short interval).
    summary = db.df(f"""
        WITH pts AS (SELECT compound_id, t, p FROM vapor_pressure WHERE t > 0 AND p > 0),
        lo AS (SELECT compound_id, arg_max(t, p) AS t1, max(p) AS p1 FROM pts WHERE p <= {P_ATM} GROUP BY 1),
        hi AS (SELECT compound_id, arg_min(t, p) AS t2, min(p) AS p2 FROM pts WHERE p > {P_ATM} GROUP BY 1),
        top AS (SELECT compound_id, max(t) AS tmax FROM pts GROUP BY 1)
        SELECT top.compound_id, tmax, t1, p1, t2, p2 FROM top
        LEFT JOIN lo USING (compound_id) LEFT JOIN hi USING (compound_id)""").set_index("compound_id")
    summary = summary.reindex(ids.to_numpy())
    t1, p1, t2, p2 = (summary[c].to_numpy(dtype=float) for c in ("t1", "p1", "t2", "p2"))
    with np.errstate(divide="ignore", invalid="ignore"):
        inv = 1 / t1 + (np.log(P_ATM) - np.log(p1)) * (1 / t2 - 1 / t1) / (np.log(p2) - np.log(p1))
        vp_tb = np.where(t2 > t1, 1 / inv, np.nan)
    tmax = summary["tmax"].to_numpy(dtype=float)
    return np.where(np.isfinite(tmax), tmax, -np.inf), vp_tb


def build_context(db, params: dict | None = None) -> Context:
    """Gather the evidence for every compound row of ``db``."""
    p = {**FAMILY_DEFAULTS, **(params or {})}
    frame = db.df("SELECT * FROM compounds ORDER BY _row").reset_index(drop=True)
    for column in ("name", "cas", "formula", "family", "source", "compound_id"):
        if column not in frame.columns:
            frame[column] = None
    values = {c: (frame[c].to_numpy(dtype=float) if c in frame.columns else np.full(len(frame), np.nan)) for c in NUMERIC}
    formulas = frame["formula"].astype(object).where(frame["formula"].notna(), "")
    mass = molar_mass(formulas.tolist())
    parsed = [parse_formula(f) or {} if f else {} for f in formulas.unique()]  # loop over distinct formulas
    carbon = np.array([float(e.get("C", 0)) for e in parsed])
    carbon = pd.Series(carbon, index=formulas.unique()).reindex(formulas).to_numpy()
    # polar for corresponding states: holds O, N, F or S atoms (element symbols, so Si, Sn, Ne, Na do not count)
    polar = np.array([bool(POLAR_ELEMENTS & set(e)) for e in parsed], dtype=bool)
    polar = pd.Series(polar, index=formulas.unique()).reindex(formulas).to_numpy(dtype=bool)
    family = frame["family"].astype(object).where(frame["family"].notna(), "").astype(str).str.strip().str.lower()
    not_series = {s.lower() for s in p["not_series"]}
    code_values, uniques = pd.factorize(family)
    code = np.where((family == "") | family.isin(not_series), -1, code_values)
    ctx = Context(frame=frame, values=values, formula_mass=mass, carbon=carbon, family_code=code, polar=polar)
    withheld = db.cache.get("withheld_cells", {})
    for ((row, column), value), at in zip(withheld.items(), ctx.positions([r for r, _ in withheld])):
        if at >= 0 and column in NUMERIC:
            ctx.withheld.setdefault(column, np.full(len(frame), np.nan))[at] = value
    x = _family_x(frame, carbon, np.where(np.isfinite(values["molar_mass"]), values["molar_mass"], mass), code)
    ctx.x = x
    # irregular heads: the first members of some series are neither judged nor used as neighbours
    heads = {name.lower(): count for name, count in p["irregular_heads"].items()}
    count = family.map(lambda f: heads.get(f, p["head_members"])).to_numpy()
    rank = pd.Series(x).groupby(code).rank(method="dense").to_numpy()
    head = (code >= 0) & (rank <= count)
    ctx.head = head
    has_isomer = pd.Series(x).groupby([code, np.round(x, 9)]).transform("size").to_numpy() > 1
    skip_omega = family.isin({s.lower() for s in p["skip_omega"]}).to_numpy()
    for column in TREND_COLUMNS:
        y = values[column]
        if column == "pc":
            with np.errstate(divide="ignore", invalid="ignore"):
                y = np.log(y)
        valid = (code >= 0) & np.isfinite(y) & np.isfinite(x) & ~head
        if column == "omega":
            valid &= ~skip_omega
        tol = np.where(has_isomer, p["isomer_tolerance"][column], p["tolerance"][column])
        expected, _, nb = trend_outliers(code, x, y, valid, tol, p["neighbours_each_side"], p["min_neighbours"])
        member = (code >= 0) & np.isfinite(x) & ~head & ~(skip_omega & (column == "omega"))
        ctx.judged[column] = member & np.isfinite(expected)
        ctx.expected[column] = expected
        ctx.tolerance[column] = tol
        ctx.neighbours[column] = nb
    ctx.vp_tmax, ctx.vp_tb = _vp_summary(db, frame["compound_id"])
    ctx.vp_tb_tol = np.full(len(frame), BRACKET_TB_TOL)
    ctx.vp_tb_from_curve = np.zeros(len(frame), dtype=bool)
    _own_curves(db, ctx)
    ctx.reference = _reference_medians(db, frame["_row"])
    return ctx


def _own_curves(db, ctx: Context) -> None:
    """Each row's fitted curve; its tb (with tb-off-vp-curve's tolerance) replaces the bracketing points'.

    Only when a rule that judges compounds by their curves runs (the fit is
    then made once for the run anyway). Series that ``vp-series-scaled``
    finds off by a unit factor are left out.
    """
    pack = db.cache.get("pack")
    if not db.has("vapor_pressure") or (
            pack is not None and not (pack.enabled("tb-off-vp-curve") or pack.enabled("omega-off-vp-curve"))):
        return
    from propcheck.curves import curves
    from propcheck.rules.pack import settings_in_effect  # here: the pack module imports the rules

    cv = curves(db)
    if cv is None:
        return
    first = pd.Series(np.arange(len(cv.ids)), index=cv.ids)
    first = first[~first.index.duplicated()]
    g = first.reindex(ctx.frame["compound_id"].to_numpy()).to_numpy(dtype=float)
    g = np.where(np.isfinite(g), g, -1).astype(np.int64)
    gs = np.where(g >= 0, g, 0)
    fit = cv.fit
    usable = (g >= 0) & (fit.form[gs] > 0) & ~np.isfinite(cv.series_factor[gs])
    ctx.curve, ctx.curve_g = fit, np.where(usable, g, -1)
    omega = settings_in_effect(pack, "omega-off-vp-curve")
    ctx.curve_omega_tol, ctx.curve_omega_extrapolation = float(omega["tol"]), float(omega["max_extrapolation"])
    # tb where the curve reaches 101325 Pa, with tb-off-vp-curve's tolerance (by form, widened when extrapolating)
    from propcheck.rules.tb_off_vp_curve import tb_tolerance

    tb_fit = np.where(usable, fit.t_at(P_ATM, gs), np.nan)
    tol, _ = tb_tolerance(fit, gs, tb_fit, settings_in_effect(pack, "tb-off-vp-curve"))
    from_curve = np.isfinite(tb_fit)
    ctx.vp_tb = np.where(from_curve, tb_fit, ctx.vp_tb)
    ctx.vp_tb_tol = np.where(from_curve, tol, ctx.vp_tb_tol)
    ctx.vp_tb_from_curve = from_curve


def _reference_medians(db, rows: pd.Series) -> dict[str, np.ndarray]:
    """Median of the reference sources per compounds row and column (only when a reference rule runs)."""
    pack = db.cache.get("pack")
    if pack is None or not (pack.enabled("const-off-reference") or pack.enabled("vp-off-reference")):
        return {}
    from propcheck.reference import session

    long = session.constants(db)
    if long.empty:
        return {}
    medians = long.groupby(["key", "property"])["value"].median().unstack("property")
    medians = medians.reindex(rows.to_numpy())
    return {c: medians[c].to_numpy(dtype=float) for c in medians.columns}


def get_context(db, params: dict | None = None) -> Context:
    """The run's context, built on first use (per family parameters)."""
    key = repr(sorted({**FAMILY_DEFAULTS, **(params or {})}.items()))
    cache = db.__dict__.setdefault("_diagnose_context", {})
    if key not in cache:
        cache[key] = build_context(db, params)
    return cache[key]
