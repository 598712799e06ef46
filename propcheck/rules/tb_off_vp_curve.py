"""The stored normal boiling point is not where the compound's curve reaches 101.325 kPa.

What it checks
    The temperature where the compound's fitted vapor-pressure curve reaches
    101.325 kPa against the stored ``tb``; and that a compound whose curve
    lies above 1 atm already at its melting point (it sublimes) has no tb.

Why it matters
    tb anchors boiling-point estimation methods, distillation design and
    flash-point screening; a tb off the compound's own data means one of the
    two is wrong (a unit slip, a value at another pressure, a sublimation
    point filed as a boiling point).

Method
    The normal boiling point is the temperature at which p_sat = 101325 Pa
    (1 standard atmosphere). The fitted curve (see ``vp-point-off-curve``)
    is solved for that pressure. The tolerance depends on the form (Wagner
    ``tol_wagner``, Antoine ``tol_antoine``, Clausius-Clapeyron ``tol_cc``)
    and widens by ``extrapolation_widening`` x the distance in K by which
    101.325 kPa lies outside the data; the finding says how far it
    extrapolated. Beyond ``error_difference`` the finding is an error. A tb
    off by a temperature-scale slip (degC, degF stored as K) is named. A
    compound whose curve exceeds 101.325 kPa at its melting point sublimes
    at 1 atm: a stored tb is then reported, and an empty tb is right.
    Series diagnosed by ``vp-series-scaled`` are left to that rule.

Parameters
    tol_wagner
        K; warning beyond this for a Wagner fit.
    tol_antoine
        K; warning beyond this for an Antoine fit.
    tol_cc
        K; warning beyond this for a Clausius-Clapeyron fit.
    extrapolation_widening
        K of tolerance added per K of extrapolation beyond the data.
    error_difference
        K; an error beyond this (after widening).

Example finding
    ``tb = 174.1 K but the Wagner fit of 8 points reaches 101.325 kPa at
    447.21 K (inside the data)`` with suggestion ``degC entered as K?``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 7.
    2. IAPWS-95 / IF97: water boils at 373.124 K at 101.325 kPa (ITS-90).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import curves
from propcheck.physics.unit_slips import temperature_slip
from propcheck.physics.vp_fit import FORMS
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="tb-off-vp-curve",
    title="Normal boiling point off the compound's vapor-pressure curve",
    severity="warning",
    stage="consistency",
    method="fitted curve solved for 101.325 kPa; tolerance by form, widened when extrapolating",
    reference="Poling et al. 2001, ch. 7",
    params={
        "tol_wagner": "K; warning beyond this for a Wagner fit",
        "tol_antoine": "K; warning beyond this for an Antoine fit",
        "tol_cc": "K; warning beyond this for a Clausius-Clapeyron fit",
        "extrapolation_widening": "K of tolerance added per K of extrapolation beyond the data",
        "error_difference": "K; an error beyond this (after widening)",
    },
)

P_ATM = 101325.0


def tb_tolerance(fit, g, tb_fit, params) -> tuple[np.ndarray, np.ndarray]:
    """Tolerance [K] on the curve's tb of compounds ``g``, and how far [K] that tb lies outside their points.

    By the fitted form (``tol_wagner``, ``tol_antoine``, ``tol_cc``), widened
    by ``extrapolation_widening`` per K of extrapolation.
    """
    t_min, t_max = fit.t_min[g], fit.t_max[g]
    extrap = np.where(tb_fit < t_min, t_min - tb_fit, np.where(tb_fit > t_max, tb_fit - t_max, 0.0))
    form = np.asarray(FORMS, dtype=object)[fit.form[g]]
    base = np.select([form == "wagner", form == "antoine"], [params["tol_wagner"], params["tol_antoine"]], params["tol_cc"])
    return base + params["extrapolation_widening"] * extrap, extrap


def check(db, params):
    cv = curves(db)
    if cv is None:
        return None
    fit = cv.fit
    g = np.arange(len(cv.ids))
    tb_fit = fit.t_at(P_ATM, g)
    tol, extrap = tb_tolerance(fit, g, tb_fit, params)
    err_tol = params["error_difference"] + params["extrapolation_widening"] * extrap
    with np.errstate(all="ignore"):
        p_at_tm = np.exp(fit.ln_p(cv.tm, g))
    sublimes = np.isfinite(p_at_tm) & (p_at_tm > P_ATM) & np.isfinite(cv.tb)
    scaled = np.isfinite(cv.series_factor)
    diff = cv.tb - tb_fit
    off = np.isfinite(diff) & (np.abs(diff) > tol) & ~sublimes & ~scaled & (fit.form > 0)
    rows = []
    for gi in np.nonzero(sublimes & ~scaled)[0]:
        rows.append(_row(cv, gi, "error", cv.tb[gi], None, None, None,
                         f"the {cv.describe(gi)} gives {p_at_tm[gi]:.4g} Pa at tm = {cv.tm[gi]:.6g} K, above 1 atm: "
                         f"the compound sublimes at 1 atm and has no normal boiling point, yet tb = {cv.tb[gi]:.6g} K",
                         "a sublimation point filed as a boiling point? leave tb empty"))
    if off.any():
        idx = np.nonzero(off)[0]
        text, fixed = temperature_slip(cv.tb[idx], tb_fit[idx], abs_tol=2.0)
        for j, gi in enumerate(idx):
            where = (f"extrapolated {extrap[gi]:.3g} K beyond the data ({fit.t_min[gi]:.6g}-{fit.t_max[gi]:.6g} K)"
                     if extrap[gi] > 0 else "inside the data")
            severity = "error" if abs(diff[gi]) > err_tol[gi] else "warning"
            rows.append(_row(cv, gi, severity, cv.tb[gi], tb_fit[gi], tol[gi], text[j] and f"{text[j]} corrected tb {fixed[j]:.6g} K",
                             f"tb = {cv.tb[gi]:.6g} K but the {cv.describe(gi)} reaches 101.325 kPa at "
                             f"{tb_fit[gi]:.6g} K ({where}; difference {diff[gi]:+.3g} K)", None,
                             corrected=float(fixed[j]) if text[j] else None))
    return pd.DataFrame(rows) if rows else None


def _row(cv, gi, severity, observed, expected, tolerance, suggestion, message, fallback, corrected=None):
    return {
        "corrected": corrected,
        "rule": RULE.id, "severity": severity, "table": "compounds", "compound_id": cv.ids[gi], "column": "tb",
        "observed": float(observed), "expected": None if expected is None else float(expected),
        "tolerance": None if tolerance is None else float(tolerance), "suggestion": suggestion or fallback,
        "reference": cv.describe(gi), "message": message, "row": int(cv.c_row[gi]), "source": cv.c_source[gi],
    }
