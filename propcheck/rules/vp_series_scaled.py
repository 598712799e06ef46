"""A compound's whole vapor-pressure series is off by a unit factor.

What it checks
    The median ratio of the compound's points to the Lee-Kesler
    corresponding-states estimate from its own tc, pc and omega, and the
    ratio of its fitted curve at the stored tb to 101.325 kPa.

Why it matters
    A series delivered in kPa, bar or mmHg but declared as Pa is smooth and
    rises with temperature, so point checks pass; yet every use of it is
    wrong by the same factor. One finding covers the series, not one per point.

Method
    Lee-Kesler: ln(p/pc) = f0(Tr) + omega f1(Tr), for points with
    0.5 <= Tr < 1, where it agrees with real fluids within a few percent
    (hydrocarbons ~2 %, water ~10 %). The median of ln(p_obs / p_LK) over the
    series is compared with the logarithms of the usual unit factors (1e-3
    kPa, 1e-5 bar, 1e-6 MPa, 1/101325 atm, 1/133.322 mmHg, 1/6894.76 psi, ...).
    A matching factor is an error when the series' own curve at tb also
    misses 101.325 kPa by the same factor, a warning when it misses it by
    another amount or tb is unknown (then a wrong tc, pc or omega would look
    the same). A series whose curve reaches 101.325 kPa at the stored tb
    agrees with tb: it is not judged scaled (a wrong tc, pc or omega is the
    likelier cause, left to the rules on those), and the other curve rules
    judge it as usual.

Parameters
    factor_tolerance
        Relative misfit of the observed ratio to a unit factor still counted as that factor.
    min_points
        Points with 0.5 <= Tr < 1 needed to judge a series.

Example finding
    ``the 8 points of LPC-0007 lie at 0.001x the Lee-Kesler estimate from tc,
    pc, omega (median) and their curve gives 101 Pa at tb: kPa entered as Pa?``

References
    1. B. I. Lee, M. G. Kesler, AIChE J. 21, 510 (1975).
    2. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 7 (accuracy of corresponding-states vapor pressures).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import curves
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-series-scaled",
    title="Whole vapor-pressure series off by a unit factor",
    severity="error",
    stage="consistency",
    method="median ratio to Lee-Kesler from tc, pc, omega; curve at tb against 101.325 kPa",
    reference="Lee & Kesler 1975",
    params={
        "factor_tolerance": "relative misfit to a unit factor still counted as that factor",
        "min_points": "points with 0.5 <= Tr < 1 needed to judge a series",
    },
)


def check(db, params):
    cv = curves(db)
    if cv is None:
        return None
    g = np.nonzero(np.isfinite(cv.series_factor) & (cv.cs_points >= params["min_points"]))[0]
    if len(g) == 0:
        return None
    factor = cv.series_factor[g]
    with np.errstate(all="ignore"):
        at_tb = np.exp(cv.fit.ln_p(cv.tb[g], g))
        tb_log = np.log(at_tb / 101325.0)
    tb_agrees = np.abs(tb_log - np.log(factor)) < np.log1p(params["factor_tolerance"])
    tb_known = np.isfinite(tb_log)
    severity = np.where(tb_agrees & tb_known, "error", "warning")
    rows = []
    for i, gi in enumerate(g):
        tb_text = (f"; its curve gives {at_tb[i]:.4g} Pa at tb = {cv.tb[gi]:.6g} K instead of 101325 Pa"
                   if tb_known[i] else "; tb is unknown, so a wrong tc, pc or omega would look the same")
        rows.append({
            "rule": RULE.id, "severity": severity[i], "table": "vapor_pressure", "compound_id": cv.ids[gi],
            "column": "p", "observed": float(np.exp(cv.cs_log_ratio[gi])), "expected": 1.0,
            "tolerance": params["factor_tolerance"],
            "suggestion": f"{cv.series_slip[gi]}? multiply every p by {1 / factor[i]:.6g}",
            "reference": "Lee-Kesler from tc, pc, omega (median ratio of the series)",
            "message": (f"the {int(cv.fit.n_points[gi])} points lie at {np.exp(cv.cs_log_ratio[gi]):.4g}x the "
                        f"Lee-Kesler estimate from tc, pc, omega (median of {int(cv.cs_points[gi])} points){tb_text}"),
            "source": cv.c_source[gi],
        })
    return pd.DataFrame(rows)
