"""The stored acentric factor disagrees with the compound's own vapor-pressure curve.

What it checks
    Pitzer's acentric factor recomputed from the fitted curve at
    T = 0.7 tc against the stored ``omega``.

Why it matters
    omega carries the shape of the vapor-pressure curve into every
    corresponding-states method (Lee-Kesler, Peng-Robinson, Soave); a wrong
    omega shifts vapor pressures, densities and K-values of the whole
    compound.

Method
    omega = -log10(p_sat(0.7 tc) / pc) - 1 (Pitzer's definition), with
    p_sat from the fitted curve (see ``vp-point-off-curve``) and the stored
    tc and pc (skipped where ``vp-curve-misses-critical-point`` finds that
    tc or pc does not suit the points). Only when 0.7 tc lies within the data or at most
    ``max_extrapolation`` x tc beyond them. Sensitivity: an error of 1 K in
    tc near 500 K moves omega by ~0.01, 1 % in pc by ~0.004. Beyond
    ``tol`` a warning, beyond ``error_difference`` an error. A stored value
    about 10x or 0.1x the curve's names a decimal-point slip.

Parameters
    tol
        Absolute difference in omega above which a warning is given.
    error_difference
        Absolute difference in omega above which an error is given.
    max_extrapolation
        How far 0.7 tc may lie outside the data, as a fraction of tc.

Example finding
    ``omega = 0.0302 but the Wagner fit of 8 points gives 0.302 at 0.7 tc =
    355.6 K`` with suggestion ``decimal point slip? corrected omega 0.302``

References
    1. K. S. Pitzer et al., J. Am. Chem. Soc. 77, 3433 (1955).
    2. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 2.
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import curves
from propcheck.physics.vapor_pressure import omega_from_psat
from propcheck.rules.base import RuleInfo
from propcheck.rules.vp_curve_misses_critical_point import misses_critical_point

RULE = RuleInfo(
    id="omega-off-vp-curve",
    title="Acentric factor disagrees with the vapor-pressure curve",
    severity="warning",
    stage="consistency",
    method="Pitzer's definition at 0.7 tc from the fitted curve",
    reference="Pitzer et al. 1955",
    params={
        "tol": "absolute difference in omega above which a warning is given",
        "error_difference": "absolute difference in omega above which an error is given",
        "max_extrapolation": "how far 0.7 tc may lie outside the data, as a fraction of tc",
    },
)


def _critical_point_in_doubt(db, cv) -> np.ndarray:
    """Compounds whose curve does not reach (tc, pc): omega from them would blame the wrong column."""
    pack = db.cache.get("pack")
    if pack is None or not pack.enabled("vp-curve-misses-critical-point"):
        return np.zeros(len(cv.ids), dtype=bool)
    # exactly the compounds that rule reports (same bands, widened for the shorter forms)
    return misses_critical_point(cv, pack.params("vp-curve-misses-critical-point"))


def check(db, params):
    cv = curves(db)
    if cv is None:
        return None
    fit = cv.fit
    g = np.arange(len(cv.ids))
    t07 = 0.7 * cv.tc
    margin = params["max_extrapolation"] * cv.tc
    inside = (t07 >= fit.t_min - margin) & (t07 <= fit.t_max + margin)
    with np.errstate(all="ignore"):
        omega_curve = omega_from_psat(np.exp(fit.ln_p(t07, g)), cv.pc)
    diff = cv.omega - omega_curve
    bad = inside & np.isfinite(diff) & (np.abs(diff) > params["tol"]) & ~np.isfinite(cv.series_factor)
    bad &= ~_critical_point_in_doubt(db, cv)
    rows = []
    for gi in np.nonzero(bad)[0]:
        ratio = cv.omega[gi] / omega_curve[gi] if omega_curve[gi] else np.nan
        suggestion = corrected = None
        for factor in (10.0, 0.1):
            if np.isfinite(ratio) and abs(np.log(ratio / factor)) < np.log(1.15):
                corrected = float(cv.omega[gi] / factor)
                suggestion = f"decimal point slip? corrected omega {corrected:.4g}"
        rows.append({
            "rule": RULE.id, "severity": "error" if abs(diff[gi]) > params["error_difference"] else "warning",
            "table": "compounds", "compound_id": cv.ids[gi], "column": "omega", "observed": float(cv.omega[gi]),
            "expected": float(omega_curve[gi]), "tolerance": params["tol"], "suggestion": suggestion,
            "corrected": corrected,
            "reference": f"Pitzer's definition at 0.7 tc from the {cv.describe(gi)}",
            "message": (f"omega = {cv.omega[gi]:.4g} but the {cv.describe(gi)} gives {omega_curve[gi]:.4g} "
                        f"at 0.7 tc = {t07[gi]:.5g} K (with the stored tc and pc)"),
            "row": int(cv.c_row[gi]), "source": cv.c_source[gi],
        })
    return pd.DataFrame(rows) if rows else None
