"""A vapor-pressure point lies off its compound's robustly fitted curve.

What it checks
    Each point's residual ln p_obs - ln p_fit against the compound's own
    curve, fitted robustly so that the blunder itself does not bend it.

Why it matters
    One wrong point (a unit slip, a mistyped digit, a temperature in degC)
    distorts every quantity derived from the data: normal boiling point,
    acentric factor, enthalpy of vaporization, and any correlation refitted
    to the set.

Method
    The curve's form follows the data: Wagner 2.5-5 in reduced form with the
    compound's own tc and pc (>= 6 points spanning >= 0.2 in Tr), else
    Riedel (>= 6 points), Antoine (>= 4 points) or Clausius-Clapeyron
    (>= 2 points), fitted by
    iteratively reweighted least squares with Tukey's biweight on ln p for
    all compounds at once. A point is flagged when its residual exceeds
    ``k`` x the compound's robust residual scale and also exceeds
    max(``coverage`` x its stated relative uncertainty, ``min_residual``)
    (``min_residual_low_p`` below ``low_p_limit``, where data are far less
    certain). Residuals beyond ``error_residual`` are errors, smaller ones
    warnings. A residual matching a unit factor (1000, 1e5, 1e6, 101325,
    133.322, 6894.76, 100, and 10 or 0.1 for bar/MPa mix-ups) is named in
    ``suggestion`` with the corrected pressure (also in ``corrected``); a
    temperature whose curve value is off by a temperature-scale slip (degC
    or degF stored as K) is named with the corrected temperature (in the
    suggestion only: the finding's column is p).
    Where the Wagner form is used, the point must also lie off the free
    (Riedel or Antoine) fit: a point that only the anchored curve misses
    points at tc or pc instead. Series found scaled by ``vp-series-scaled``
    are left to that rule. Compounds with fewer than ``min_dof`` points beyond the
    form's coefficients are not judged here.

Parameters
    k
        Multiple of the robust residual scale a residual must exceed.
    coverage
        Multiple of the stated relative uncertainty a residual must exceed.
    min_residual
        Smallest |ln p residual| flagged for p >= low_p_limit.
    min_residual_low_p
        Smallest |ln p residual| flagged below low_p_limit.
    low_p_limit
        Pa; below this pressure data are held to the looser threshold.
    error_residual
        |ln p residual| from which a finding is an error.
    min_dof
        Points beyond the number of fitted coefficients needed to judge a point.

Example finding
    ``p = 105.762 Pa at 419.22 K lies 99.9 % below the Wagner 2.5-5 fit of 8
    points (expected 105762 Pa)`` with suggestion ``kPa entered as Pa?``

References
    1. W. Wagner, Cryogenics 13, 470 (1973); D. Ambrose, J. Chem. Thermodyn.
       18, 45 (1986) (Wagner forms).
    2. G. W. Thomson, Chem. Rev. 38, 1 (1946) (Antoine equation); L. Riedel,
       Chem.-Ing.-Tech. 26, 83 (1954) (Riedel equation).
    3. A. E. Beaton, J. W. Tukey, Technometrics 16, 147 (1974) (biweight).
    4. E. Voutsas et al., Fluid Phase Equilib. 198, 81 (2002) (uncertainty of data below 1 kPa).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import BLOCK_POINTS, curves
from propcheck.physics.grouped_fit import group_blocks
from propcheck.physics.unit_slips import pressure_slip, temperature_slip
from propcheck.physics.vp_fit import N_PARAMS, FORMS
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-point-off-curve",
    title="Vapor-pressure point off the compound's fitted curve",
    severity="warning",
    stage="consistency",
    method="robust (biweight) fit of Wagner / Riedel / Antoine / Clausius-Clapeyron per compound; residuals in ln p",
    reference="Wagner 1973; Ambrose 1986; Thomson 1946; Beaton & Tukey 1974",
    params={
        "k": "multiple of the robust residual scale a residual must exceed",
        "coverage": "multiple of the stated relative uncertainty a residual must exceed",
        "min_residual": "smallest |ln p residual| flagged for p >= low_p_limit",
        "min_residual_low_p": "smallest |ln p residual| flagged below low_p_limit",
        "low_p_limit": "Pa; below this pressure the looser threshold applies",
        "error_residual": "|ln p residual| from which a finding is an error",
        "min_dof": "points beyond the fitted coefficients needed to judge a point",
    },
)


def check(db, params):
    cv = curves(db)
    if cv is None:
        return None
    fit = cv.fit
    n_coef = np.array([N_PARAMS[f] for f in FORMS])[fit.form]
    judged_group = (fit.n_points - n_coef >= params["min_dof"]) & ~np.isfinite(cv.series_factor)
    found, limits = [], []
    for lo, hi in group_blocks(cv.group, BLOCK_POINTS):  # small temporaries, whatever the number of points
        group, resid, p = cv.group[lo:hi], fit.residual[lo:hi], cv.p[lo:hi]
        with np.errstate(invalid="ignore"):
            u_rel = cv.u[lo:hi] / p
        floor = np.where(p >= params["low_p_limit"], params["min_residual"], params["min_residual_low_p"])
        threshold = np.maximum(np.fmax(params["coverage"] * u_rel, floor), params["k"] * fit.scale[group])
        hit = judged_group[group] & np.isfinite(resid) & (np.abs(resid) > threshold)
        # where Wagner (anchored on tc, pc) is used, a blunder must be off the free Antoine fit too;
        # otherwise the anchor, not the point, is at fault (vp-curve-misses-critical-point)
        alt = fit.alt_residual[lo:hi]
        alt_threshold = np.maximum(floor, params["k"] * fit.alt_scale[group])
        hit &= ~np.isfinite(alt) | (np.abs(alt) > alt_threshold)
        found.append(lo + np.nonzero(hit)[0])
        limits.append(threshold[hit])
    idx = np.concatenate(found) if found else np.array([], dtype=np.int64)
    if len(idx) == 0:
        return None
    threshold_at = np.concatenate(limits)
    resid = fit.residual
    g = cv.group[idx]
    expected = np.exp(fit.ln_p(cv.t[idx], g))
    p_text, p_fixed = pressure_slip(cv.p[idx], expected)
    t_curve = fit.t_at(cv.p[idx], g)
    t_text, t_fixed = temperature_slip(cv.t[idx], t_curve, abs_tol=2.0)
    suggestion = np.where(
        p_text != "",
        [f"{a} corrected p {b:.6g} Pa" if a else "" for a, b in zip(p_text, p_fixed)],
        [f"{a} corrected t {b:.6g} K" if a else "" for a, b in zip(t_text, t_fixed)],
    )
    rel = np.expm1(resid[idx])
    severity = np.where(np.abs(resid[idx]) > params["error_residual"], "error", "warning")
    messages = [
        f"p = {p:.6g} Pa at {t:.6g} K lies {abs(r):.1%} {'above' if r > 0 else 'below'} the {cv.describe(gi)} "
        f"(expected {e:.6g} Pa)"
        for p, t, r, gi, e in zip(cv.p[idx], cv.t[idx], rel, g, expected)
    ]
    return pd.DataFrame({
        "rule": RULE.id, "severity": severity, "table": "vapor_pressure", "compound_id": cv.ids[g],
        "column": "p", "t": cv.t[idx], "observed": cv.p[idx], "expected": expected,
        "tolerance": np.expm1(threshold_at), "suggestion": [s or None for s in suggestion],
        # a repair of p (the finding's column); a temperature slip is named in the suggestion only
        "corrected": np.where(p_text != "", p_fixed, np.nan),
        "reference": [cv.describe(gi) for gi in g], "message": messages, "row": cv.row[idx],
        "source": cv.point_sources(cv.row[idx]),
    })
