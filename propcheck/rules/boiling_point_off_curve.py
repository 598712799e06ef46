"""A boiling point at a stated pressure is off the compound's vapor-pressure curve.

What it checks
    Each row of the optional ``boiling_points`` table (compound_id, p, t,
    source), as supplier catalogues and handbooks list them ("bp 120 degC at
    15 mmHg"): the temperature where the compound's curve reaches p against
    the stated t.

Why it matters
    Reduced-pressure boiling points are copied from catalogues with their
    units in the text, and the units are often lost: a pressure in mmHg
    stored as Pa, or a temperature in degC stored as K. A wrong one misleads
    vacuum-distillation and drying design.

Method
    The boiling temperature at p is where p_sat(T) = p. With vapor-pressure
    points, the compound's fitted curve (see ``vp-point-off-curve``) is
    solved for p; the tolerance follows the form (``tol_curve``) and widens
    by ``extrapolation_widening`` K per K outside the data. Without points,
    the Lee-Kesler corresponding-states estimate from the compound's tc, pc
    and omega is solved instead, with ``tol_estimate`` (it agrees with real
    fluids within about 1-2 K near the normal boiling point). Beyond
    ``error_difference`` x the tolerance the finding is an error. A pressure
    that matches the curve after a unit factor (mmHg, kPa, bar, psi, atm
    stored as Pa) or a temperature off by a temperature-scale slip is named
    with the corrected value.

Parameters
    tol_curve
        K; tolerance against a fitted curve inside the data.
    tol_estimate
        K; tolerance against the Lee-Kesler estimate.
    extrapolation_widening
        K of tolerance per K of extrapolation beyond the data.
    error_difference
        Multiple of the tolerance from which a finding is an error.

Example finding
    ``bp 393.15 K at 15 Pa, but the Wagner 2.5-5 (reduced, own tc and pc)
    fit of 8 points boils at 223.4 K at that pressure (difference +170 K)``
    with suggestion ``p: value is 0.0075x: mmHg entered as Pa? corrected p
    1999.84 Pa`` (15 mmHg)

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 7.
    2. B. I. Lee, M. G. Kesler, AIChE J. 21, 510 (1975).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import curves
from propcheck.physics.corresponding_states import lee_kesler_t_at
from propcheck.physics.unit_slips import pressure_slip, temperature_slip
from propcheck.physics.vapor_pressure import lee_kesler_psat
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="boiling-point-off-curve",
    title="Boiling point at a stated pressure off the vapor-pressure curve",
    severity="warning",
    stage="consistency",
    method="fitted curve (or Lee-Kesler from tc, pc, omega) solved for the stated pressure",
    reference="Poling et al. 2001, ch. 7; Lee & Kesler 1975",
    params={
        "tol_curve": "K; tolerance against a fitted curve inside the data",
        "tol_estimate": "K; tolerance against the Lee-Kesler estimate",
        "extrapolation_widening": "K of tolerance per K of extrapolation beyond the data",
        "error_difference": "multiple of the tolerance from which a finding is an error",
    },
)

_SQL = """
SELECT b._row AS b_row, b.compound_id, b.p, b.t, b.source,
       coalesce(c.tc, 'NaN'::DOUBLE) AS tc, coalesce(c.pc, 'NaN'::DOUBLE) AS pc,
       coalesce(c.omega, 'NaN'::DOUBLE) AS omega
FROM boiling_points b JOIN compounds c USING (compound_id)
WHERE b.p > 0 AND b.t > 0
ORDER BY b.compound_id, b.p
"""


def check(db, params):
    if not db.has("boiling_points"):
        return None
    b = db.df(_SQL)
    if b.empty:
        return None
    cv = curves(db)
    index = cv.index() if cv is not None else {}
    g = np.array([index.get(cid, -1) for cid in b["compound_id"]])
    has_curve = g >= 0
    gg = np.where(has_curve, g, 0)
    p, t = b["p"].to_numpy(float), b["t"].to_numpy(float)
    t_ref = np.full(len(b), np.nan)
    p_at_t = np.full(len(b), np.nan)
    tol = np.full(len(b), params["tol_estimate"])
    method = np.full(len(b), "Lee-Kesler from tc, pc, omega", dtype=object)
    if cv is not None and has_curve.any():
        fit = cv.fit
        t_ref = np.where(has_curve, fit.t_at(p, gg), np.nan)
        with np.errstate(all="ignore"):
            p_at_t = np.where(has_curve, np.exp(fit.ln_p(t, gg)), np.nan)
        extrap = np.where(t_ref < fit.t_min[gg], fit.t_min[gg] - t_ref, np.where(t_ref > fit.t_max[gg], t_ref - fit.t_max[gg], 0.0))
        tol = np.where(has_curve, params["tol_curve"] + params["extrapolation_widening"] * np.nan_to_num(extrap), tol)
        method = np.where(has_curve, [cv.describe(x) for x in gg], method)
    no_curve = ~has_curve | ~np.isfinite(t_ref)
    tc, pc, omega = (b[k].to_numpy(float) for k in ("tc", "pc", "omega"))
    t_lk = lee_kesler_t_at(p, tc, pc, omega)
    t_ref = np.where(no_curve, t_lk, t_ref)
    with np.errstate(all="ignore"):
        p_at_t = np.where(no_curve, lee_kesler_psat(t, tc, pc, omega), p_at_t)
    method = np.where(no_curve & np.isfinite(t_lk), "Lee-Kesler from tc, pc, omega", method)
    tol = np.where(no_curve, params["tol_estimate"], tol)
    diff = t - t_ref
    off = np.isfinite(diff) & (np.abs(diff) > tol)
    if not off.any():
        return None
    idx = np.nonzero(off)[0]
    p_text, p_fixed = pressure_slip(p[idx], p_at_t[idx])
    t_text, t_fixed = temperature_slip(t[idx], t_ref[idx], abs_tol=max(params["tol_curve"], 2.0))
    rows = []
    for j, i in enumerate(idx):
        if p_text[j]:
            column, suggestion, corrected = "p", f"p: {p_text[j]} corrected p {p_fixed[j]:.6g} Pa", float(p_fixed[j])
        elif t_text[j]:
            column, suggestion, corrected = "t", f"t: {t_text[j]} corrected t {t_fixed[j]:.6g} K", float(t_fixed[j])
        else:
            column, suggestion, corrected = "t", None, None
        rows.append({
            "rule": RULE.id, "table": "boiling_points", "compound_id": b["compound_id"].iat[i], "column": column,
            "severity": "error" if abs(diff[i]) > params["error_difference"] * tol[i] else "warning",
            "t": float(t[i]), "observed": float(t[i]) if column == "t" else float(p[i]),
            "expected": float(t_ref[i]) if column == "t" else float(p_at_t[i]), "tolerance": float(tol[i]),
            "suggestion": suggestion, "corrected": corrected, "reference": method[i], "row": int(b["b_row"].iat[i]),
            "source": b["source"].iat[i],
            "message": (f"bp {t[i]:.6g} K at {p[i]:.6g} Pa, but the {method[i]} boils at {t_ref[i]:.6g} K "
                        f"at that pressure (difference {diff[i]:+.3g} K)"),
        })
    return pd.DataFrame(rows)
