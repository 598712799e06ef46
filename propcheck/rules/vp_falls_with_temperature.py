"""Vapor pressure falls where temperature rises.

What it checks
    Per compound, the points sorted by temperature: each pressure exceeds
    the one before it by more than their combined stated uncertainty allows
    to fall. Two points at the same temperature must agree within a
    relative spread.

Why it matters
    Below the critical point the saturation pressure rises strictly with
    temperature. A point that breaks this is a blunder: a unit slip on one
    value (kPa stored as Pa), a swapped or mistyped digit, or points of
    another compound mixed in.

Method
    Clapeyron equation, dp/dT = dH_vap / (T dV_vap) > 0 below Tc. For each
    adjacent pair (T1 < T2) a drop p1 - p2 > k sqrt(u1^2 + u2^2) is a
    finding, where u is the stated standard uncertainty of p or, when none
    is stated, ``default_relative_uncertainty`` x p. Of the two points, the
    one farther from the straight line of ln p against 1/T
    (Clausius-Clapeyron) through the neighbours around the pair is blamed
    (or, at an end of the series, the two beyond the pair); that line gives
    the expected value. With too few neighbours, the earlier point is blamed
    when the later one still exceeds the point before the pair. A factor between observed
    and expected that matches a unit (1000, 1e5, 1e6, 101325, 133.322, 6894.76,
    100, and 10 or 0.1 for bar/MPa mix-ups) is named in ``suggestion``, the
    corrected value also in ``corrected``. Two points less than ``same_t_tolerance``
    apart that differ by more than ``same_t_relative_spread`` give a warning.

Parameters
    default_relative_uncertainty
        Relative standard uncertainty of p assumed where none is stated.
    coverage_factor
        k applied to the combined standard uncertainty of a pair.
    same_t_tolerance
        Temperatures closer than this [K] count as the same temperature.
    same_t_relative_spread
        Relative difference of p tolerated between points at the same temperature.

Example finding
    ``p = 98.4 Pa at 330 K is below 61200 Pa at 320 K; expected about 98400 Pa
    (value is 0.001x: kPa entered as Pa?)``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed., McGraw-Hill (2001), ch. 7 (Clapeyron equation).
    2. JCGM 100:2008 (GUM), section 5 (combined standard uncertainty).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import BLOCK_POINTS, curve_points
from propcheck.findings import Finding
from propcheck.physics.grouped_fit import group_blocks
from propcheck.physics.unit_slips import pressure_slip
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-falls-with-temperature",
    title="Vapor pressure falls as temperature rises",
    severity="error",
    stage="consistency",
    method="Clapeyron: dp/dT > 0 below Tc; drops beyond combined uncertainty",
    reference="Poling et al. 2001, ch. 7; GUM (JCGM 100:2008)",
    params={
        "default_relative_uncertainty": "relative standard uncertainty of p where none is stated",
        "coverage_factor": "k applied to the combined standard uncertainty of two points",
        "same_t_tolerance": "points closer than this [K] are at the same temperature",
        "same_t_relative_spread": "relative difference of p tolerated at the same temperature",
    },
)

# The neighbours of a pair are fetched only for compounds that may have a pair at fault
# (``$ids``): found by numpy on the sorted curve points, or by SQL for compounds with
# points outside them (beyond tc, non-positive, unknown compound).
_SQL = """
WITH base AS (
    SELECT compound_id, _row, t, p, source,
           coalesce(uncertainty, $rel_u * p) AS u
    FROM vapor_pressure
    WHERE compound_id IS NOT NULL AND t IS NOT NULL AND p IS NOT NULL
      AND compound_id IN (SELECT unnest($ids))
), seq AS (
    SELECT *,
        lag(_row) OVER w AS row_a, lag(t) OVER w AS t_a, lag(p) OVER w AS p_a, lag(u) OVER w AS u_a,
        lag(source) OVER w AS source_a,
        lag(t, 2) OVER w AS t_l, lag(p, 2) OVER w AS p_l,
        lag(t, 3) OVER w AS t_l2, lag(p, 3) OVER w AS p_l2,
        lead(t) OVER w AS t_r, lead(p) OVER w AS p_r,
        lead(t, 2) OVER w AS t_r2, lead(p, 2) OVER w AS p_r2
    FROM base
    WINDOW w AS (PARTITION BY compound_id ORDER BY t, _row)
)
SELECT compound_id, row_a, t_a, p_a, source_a, _row AS row_b, t AS t_b, p AS p_b, source AS source_b,
       t_l, p_l, t_l2, p_l2, t_r, p_r, t_r2, p_r2,
       $k * sqrt(u * u + u_a * u_a) AS allowed,
       t - t_a < $tol_t AS same_t
FROM seq
WHERE row_a IS NOT NULL
  AND ((t - t_a >= $tol_t AND p_a - p > $k * sqrt(u * u + u_a * u_a))
    OR (t - t_a < $tol_t AND abs(p - p_a) > $spread * greatest(p, p_a)))
ORDER BY compound_id, t_b
"""

# Points per compound, to find compounds whose points are not all curve points.
_COUNTS_SQL = """
SELECT compound_id, count(*) AS n FROM vapor_pressure
WHERE compound_id IS NOT NULL AND t IS NOT NULL AND p IS NOT NULL
GROUP BY compound_id
"""


def _suspect_compounds(db, params) -> list[str]:
    """Compounds that may hold a falling or disagreeing pair; the SQL above decides."""
    pts = curve_points(db)
    counts = db.con.execute(_COUNTS_SQL).fetchnumpy()
    all_ids = np.asarray(counts["compound_id"], dtype=object)
    if pts is None:
        return all_ids.tolist()
    n_curve = np.bincount(pts.group, minlength=len(pts.ids))
    counted = pd.Series(np.asarray(counts["n"]), index=all_ids)
    partial = counted.index[counted.to_numpy() != pd.Series(n_curve, index=pts.ids).reindex(all_ids).to_numpy()]
    tol_t, k, spread = params["same_t_tolerance"], params["coverage_factor"], params["same_t_relative_spread"]
    hit = np.zeros(len(pts.ids), dtype=bool)
    for lo, hi in group_blocks(pts.group, BLOCK_POINTS):  # small temporaries, whatever the number of points
        g, t, p = pts.group[lo:hi], pts.t[lo:hi], pts.p[lo:hi]
        u = np.where(np.isnan(pts.u[lo:hi]), params["default_relative_uncertainty"] * p, pts.u[lo:hi])
        dt = t[1:] - t[:-1]
        with np.errstate(invalid="ignore"):
            falls = (dt >= tol_t) & (p[:-1] - p[1:] > k * np.sqrt(u[1:] ** 2 + u[:-1] ** 2))
            repeat = (dt < tol_t) & (np.abs(p[1:] - p[:-1]) > spread * np.maximum(p[1:], p[:-1]))
        hit[g[1:][(g[1:] == g[:-1]) & (falls | repeat)]] = True
    return sorted(set(partial.tolist()) | set(pts.ids[hit].tolist()))


def _loglin(t1, p1, t2, p2, t):
    """ln p linear in 1/T through (t1, p1) and (t2, p2), evaluated at t."""
    with np.errstate(all="ignore"):
        x1, x2, x = 1.0 / t1, 1.0 / t2, 1.0 / t
        return np.exp(np.log(p1) + (np.log(p2) - np.log(p1)) * (x - x1) / (x2 - x1))


def check(db, params) -> list[Finding]:
    if not db.has("vapor_pressure"):
        return []
    tol_t = params["same_t_tolerance"]
    suspects = _suspect_compounds(db, params)
    if not suspects:
        return []
    pairs = db.con.execute(_SQL, {
        "rel_u": params["default_relative_uncertainty"], "k": params["coverage_factor"], "tol_t": tol_t,
        "spread": params["same_t_relative_spread"], "ids": suspects,
    }).df()
    if pairs.empty:
        return []
    findings = _drops(pairs[~pairs["same_t"]]) + _same_t(pairs[pairs["same_t"]], params)
    return findings


def _predict(d: pd.DataFrame, t: np.ndarray, *pairs) -> np.ndarray:
    """ln-p/(1/T) line through the first pair of neighbours present, evaluated at t."""
    out = np.full(len(d), np.nan)
    for first, second in pairs:
        t1, p1 = d[f"t_{first}"].to_numpy(float), d[f"p_{first}"].to_numpy(float)
        t2, p2 = d[f"t_{second}"].to_numpy(float), d[f"p_{second}"].to_numpy(float)
        guess = _loglin(t1, p1, t2, p2, t)
        out = np.where(np.isnan(out) & np.isfinite(guess), guess, out)
    return out


def _drops(d: pd.DataFrame) -> list[Finding]:
    if d.empty:
        return []
    d = d.reset_index(drop=True)
    t_a, p_a = d["t_a"].to_numpy(float), d["p_a"].to_numpy(float)
    t_b, p_b = d["t_b"].to_numpy(float), d["p_b"].to_numpy(float)
    # Each member of the pair is judged against neighbours that exclude the other:
    # the points around the pair (l, r), else the two beyond it on one side.
    pred_a = _predict(d, t_a, ("l", "r"), ("r", "r2"), ("l2", "l"))
    pred_b = _predict(d, t_b, ("l", "r"), ("l2", "l"), ("r", "r2"))
    with np.errstate(all="ignore"):
        dev_a, dev_b = np.abs(np.log(p_a / pred_a)), np.abs(np.log(p_b / pred_b))
    judged = np.isfinite(dev_a) & np.isfinite(dev_b)
    # too few neighbours: blame a when b still lies above the point before a
    p_l, p_r = d["p_l"].to_numpy(float), d["p_r"].to_numpy(float)
    fallback = np.where(np.isfinite(p_l), p_b >= p_l, np.isfinite(p_r) & (p_a > p_r))
    blame_a = pd.Series(np.where(judged, dev_a > dev_b, fallback))
    t_obs = np.where(blame_a, t_a, t_b)
    p_obs = np.where(blame_a, p_a, p_b)
    expected = np.where(blame_a, pred_a, pred_b)
    text, corrected = pressure_slip(p_obs, expected)
    findings = []
    seen = set()
    for i, rec in enumerate(d.itertuples(index=False)):
        row = rec.row_a if blame_a.iloc[i] else rec.row_b
        if row in seen:
            continue
        seen.add(row)
        other = f"{rec.p_b:.6g} Pa at {rec.t_b:.6g} K" if blame_a.iloc[i] else f"{rec.p_a:.6g} Pa at {rec.t_a:.6g} K"
        relation = "above" if blame_a.iloc[i] else "below"
        exp = float(expected[i]) if np.isfinite(expected[i]) else None
        message = f"p = {p_obs[i]:.6g} Pa at {t_obs[i]:.6g} K is {relation} {other}: vapor pressure must rise with temperature"
        if exp is not None:
            message += f"; its neighbours give about {exp:.4g} Pa"
        findings.append(
            Finding(
                rule=RULE.id, severity=RULE.severity, table="vapor_pressure", compound_id=rec.compound_id,
                column="p", t=float(t_obs[i]), observed=float(p_obs[i]), expected=exp,
                tolerance=float(rec.allowed), row=int(row),
                source=rec.source_a if blame_a.iloc[i] else rec.source_b,
                suggestion=(f"{text[i]} corrected {corrected[i]:.6g} Pa" if text[i] else None),
                corrected=float(corrected[i]) if text[i] else None,
                reference="ln p linear in 1/T between neighbouring points (Clausius-Clapeyron)" if exp else None,
                message=message,
            )
        )
    return findings


def _same_t(d: pd.DataFrame, params) -> list[Finding]:
    findings = []
    for rec in d.itertuples(index=False):
        spread = abs(rec.p_b - rec.p_a) / max(rec.p_a, rec.p_b)
        findings.append(
            Finding(
                rule=RULE.id, severity="warning", table="vapor_pressure", compound_id=rec.compound_id,
                column="p", t=float(rec.t_b), observed=float(rec.p_b), expected=float(rec.p_a),
                tolerance=params["same_t_relative_spread"], row=int(rec.row_b), source=rec.source_b,
                reference="repeat point at the same temperature",
                message=(f"two points at {rec.t_b:.6g} K disagree by {spread:.1%}: {rec.p_a:.6g} Pa (row {rec.row_a}) "
                         f"and {rec.p_b:.6g} Pa (row {rec.row_b})"),
            )
        )
    return findings
