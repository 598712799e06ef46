"""The vapor-pressure curve, followed up to tc, does not end at pc.

What it checks
    For compounds whose points reach Tr >= ``min_tr``: a free fit of the
    points (Riedel, or Antoine with fewer than 6 points; not anchored on tc,
    pc), extrapolated to the stored tc, against the stored pc.

Why it matters
    The saturation curve ends at the critical point. When data near the
    critical point cannot be joined to (tc, pc), the critical constants or
    the points are wrong, and every corresponding-states estimate built on
    tc and pc inherits the error.

Method
    Riedel (ln p = A + B/T + C ln T + D T^6) or Antoine (ln p = A - B/(T + C)),
    fitted robustly, extrapolated from the data's upper end to tc. Riedel
    fits of reference equations of state for 24 fluids, with data from 0.5 tc
    to 0.8-0.95 tc, give p(tc)/pc of 0.98-1.13 (computed with CoolProp 8):
    outside [``warn_low``, ``warn_high``] a warning, outside [``error_low``,
    ``error_high``] an error. Antoine fitted to Tr ~0.75 and extrapolated to
    tc gives 0.65-1.16 for 90 % of a published set, so for Antoine and
    Clausius-Clapeyron fits (fewer than 6 points) the bands are raised to the
    power ``short_form_power``. The temperature where
    the free curve reaches pc is reported beside it. A factor matching a
    pressure unit names pc; a temperature-scale slip or two transposed
    adjacent digits that move tc onto the curve names tc.

Parameters
    min_tr
        Highest point's T/tc needed before the check applies.
    warn_low
        p(tc)/pc below this is a warning.
    warn_high
        p(tc)/pc above this is a warning.
    error_low
        p(tc)/pc below this is an error.
    error_high
        p(tc)/pc above this is an error.
    short_form_power
        The bands are raised to this power for Antoine and Clausius-Clapeyron fits.

Example finding
    ``the Riedel fit of 8 points (up to Tr = 0.98) gives 3.116e+06 Pa at
    tc = 526.05 K, 0.64x pc = 4.895e+06 Pa; it reaches pc at 560.245 K``
    with suggestion ``tc: transposed digits? 562.05 K``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 7 and App. A (Antoine set).
    2. G. W. Thomson, Chem. Rev. 38, 1 (1946).
    3. L. Riedel, Chem.-Ing.-Tech. 26, 83 (1954).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import curves
from propcheck.physics.unit_slips import pressure_slip, temperature_slip, transposed_digit_variants
from propcheck.physics.vp_fit import FORM_TITLES, FORMS, RIEDEL
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-curve-misses-critical-point",
    title="Vapor-pressure curve does not end at (tc, pc)",
    severity="warning",
    stage="consistency",
    method="free Riedel or Antoine fit extrapolated to tc against pc",
    reference="Poling et al. 2001, ch. 7; Thomson 1946",
    params={
        "min_tr": "highest point's T/tc needed before the check applies",
        "warn_low": "p(tc)/pc below this is a warning",
        "warn_high": "p(tc)/pc above this is a warning",
        "error_low": "p(tc)/pc below this is an error",
        "error_high": "p(tc)/pc above this is an error",
        "short_form_power": "bands raised to this power for Antoine and Clausius-Clapeyron fits",
    },
)


def _bands(free, gsel, params, which: str):
    """The (low, high) band of p(tc)/pc per compound; Antoine and Clausius-Clapeyron
    extrapolate less well than Riedel, so their bands are widened."""
    power = np.where(free.form[gsel] == RIEDEL, 1.0, params["short_form_power"])
    return params[f"{which}_low"] ** power, params[f"{which}_high"] ** power


def _at_tc(cv, params):
    """Compounds whose points reach min_tr, their free fits, p at tc from them, p(tc)/pc and the warned ones."""
    gsel, free = cv.free_fit_near_critical(params["min_tr"])
    if free is None:
        return gsel, None, None, None, None
    p_tc = np.exp(free.ln_p(cv.tc[gsel], gsel))
    ratio = p_tc / cv.pc[gsel]
    low, high = _bands(free, gsel, params, "warn")
    return gsel, free, p_tc, ratio, np.isfinite(ratio) & ((ratio < low) | (ratio > high))


def misses_critical_point(cv, params) -> np.ndarray:
    """Per compound: True where this rule finds the curve off (tc, pc) (its warning band)."""
    out = np.zeros(len(cv.ids), dtype=bool)
    gsel, free, _, _, bad = _at_tc(cv, params)
    if free is not None:
        out[gsel] = bad
    return out


def check(db, params):
    cv = curves(db)
    if cv is None:
        return None
    gsel, free, p_tc, ratio, bad = _at_tc(cv, params)
    if free is None:
        return None
    reach = cv.fit.t_max / cv.tc
    warn_low, warn_high = _bands(free, gsel, params, "warn")
    error_low, error_high = _bands(free, gsel, params, "error")
    if not bad.any():
        return None
    rows = []
    t_reach = free.t_at(cv.pc[gsel], gsel)
    p_text, p_fixed = pressure_slip(cv.pc[gsel], p_tc)
    t_text, t_fixed = temperature_slip(cv.tc[gsel], t_reach, abs_tol=2.0)
    for j in np.nonzero(bad)[0]:
        gi = gsel[j]
        column, suggestion, corrected = "pc", None, None
        if p_text[j]:
            corrected = float(p_fixed[j])
            suggestion = f"pc: {p_text[j]} corrected pc {p_fixed[j]:.6g} Pa"  # the stored pc over the unit factor
        elif t_text[j]:
            column, suggestion, corrected = "tc", f"tc: {t_text[j]} corrected tc {t_fixed[j]:.6g} K", float(t_fixed[j])
        elif np.isfinite(t_reach[j]):
            near = [v for v in transposed_digit_variants(cv.tc[gi]) if abs(v - t_reach[j]) < 0.01 * t_reach[j]]
            if near:
                column, suggestion, corrected = "tc", f"tc: transposed digits? {near[0]:.6g} K", float(near[0])
        severity = "error" if (ratio[j] < error_low[j] or ratio[j] > error_high[j]) else "warning"
        form = FORM_TITLES.get(FORMS[free.form[gi]], "free")
        reach_text = f"; it reaches pc at {t_reach[j]:.6g} K" if np.isfinite(t_reach[j]) else ""
        rows.append({
            "rule": RULE.id, "severity": severity, "table": "compounds", "compound_id": cv.ids[gi], "column": column,
            "observed": float(cv.pc[gi]) if column == "pc" else float(cv.tc[gi]),
            "expected": float(p_tc[j]) if column == "pc" else (float(t_reach[j]) if np.isfinite(t_reach[j]) else None),
            "tolerance": f"p(tc)/pc in [{warn_low[j]:.3g}, {warn_high[j]:.3g}]",
            "suggestion": suggestion or "tc or pc does not suit the points near the critical point; check both",
            "corrected": corrected,
            "reference": f"{form} fit of {int(free.n_points[gi])} points extrapolated to tc",
            "message": (f"the {form} fit of {int(free.n_points[gi])} points (up to Tr = {reach[gi]:.2f}) gives "
                        f"{p_tc[j]:.4g} Pa at tc = {cv.tc[gi]:.6g} K, {ratio[j]:.2f}x pc = {cv.pc[gi]:.4g} Pa{reach_text}"),
            "row": int(cv.c_row[gi]), "source": cv.c_source[gi],
        })
    return pd.DataFrame(rows)
