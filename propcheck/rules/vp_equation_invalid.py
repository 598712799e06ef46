"""A stored vapor-pressure equation cannot be right as written.

What it checks
    Each row of the optional ``vp_equations`` table, on its own and against
    its compound's constants: it can be evaluated (known form, units and log
    base, tmin < tmax); over [tmin, tmax] it gives finite, positive pressures
    that rise with temperature (for Antoine, T + C > 0); its range lies within
    [tm, tc]; a Wagner equation's own tc and pc match the compound's.

Why it matters
    Simulators evaluate stored correlations wherever they are asked to; an
    equation that turns over, goes negative or is declared valid beyond the
    critical point gives silent nonsense there.

Method
    The equation is evaluated at ``grid_points`` temperatures evenly spread
    over its range (Clapeyron: dp/dT > 0 below tc). Wagner coefficients are
    valid only with the tc and pc they were fitted with; a difference beyond
    ``wagner_tc_tolerance`` K or ``wagner_pc_tolerance`` (relative) is flagged.
    The range may exceed [tm, tc] by ``range_margin`` K.

Parameters
    grid_points
        Temperatures at which the equation is evaluated over its range.
    range_margin
        K by which the range may extend below tm or above tc.
    wagner_tc_tolerance
        K; allowed difference between a Wagner equation's tc and the compound's.
    wagner_pc_tolerance
        Relative difference allowed between a Wagner equation's pc and the compound's.

Example finding
    ``Antoine equation: T + C <= 0 at 120 K (C = -125 K) inside its range 100-200 K``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 7 and App. A.
    2. W. Wagner, Cryogenics 13, 470 (1973); J. McGarry, Ind. Eng. Chem.
       Process Des. Dev. 22, 313 (1983).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.equations import equations, ln_p_of
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-equation-invalid",
    title="Stored vapor-pressure equation invalid as written",
    severity="error",
    stage="consistency",
    method="evaluation over the stated range: finite, positive, rising; range within [tm, tc]",
    reference="Poling et al. 2001, ch. 7; Wagner 1973",
    params={
        "grid_points": "temperatures at which the equation is evaluated over its range",
        "range_margin": "K by which the range may extend below tm or above tc",
        "wagner_tc_tolerance": "K allowed between a Wagner equation's tc and the compound's",
        "wagner_pc_tolerance": "relative difference allowed between a Wagner equation's pc and the compound's",
    },
)

_COLUMN_OF_PROBLEM = {"log_base": "log_base", "t_unit": "t_unit", "p_unit": "p_unit", "form": "form",
                      "this form": "eq_tc", "tmin": "tmax"}


def check(db, params):
    eq = equations(db)
    if eq is None:
        return None
    rows = []

    def add(i, column, severity, message, observed=None, expected=None):
        rec = eq.iloc[i]
        rows.append({"rule": RULE.id, "severity": severity, "table": "vp_equations", "compound_id": rec["compound_id"],
                     "column": column, "observed": observed, "expected": expected, "row": int(rec["e_row"]),
                     "source": rec["source"], "reference": f"{rec['form']} equation as stored",
                     "message": f"{rec['form']} equation (row {int(rec['e_row'])}): {message}"})

    for i in np.nonzero(eq["problem"].to_numpy() != "")[0]:
        problem = eq["problem"].iat[i]
        column = next((c for key, c in _COLUMN_OF_PROBLEM.items() if problem.startswith(key)), "form")
        add(i, column, "error", f"cannot be evaluated: {problem}", observed=str(eq[column].iat[i]))
    ok = np.nonzero(eq["problem"].to_numpy() == "")[0]
    if len(ok):
        grid = np.linspace(0.0, 1.0, int(params["grid_points"]))
        tmin, tmax = eq["tmin_k"].to_numpy()[ok], eq["tmax_k"].to_numpy()[ok]
        t = tmin[:, None] + (tmax - tmin)[:, None] * grid
        lnp = ln_p_of(eq, t, ok)
        for j, i in enumerate(ok):
            bad = ~np.isfinite(lnp[j])
            if bad.any():
                add(i, "c" if eq["form"].iat[i].startswith("antoine") else "a", "error",
                    f"undefined or not positive at {t[j][bad][0]:.5g} K inside its range "
                    f"{tmin[j]:.5g}-{tmax[j]:.5g} K" + (" (T + C <= 0)" if eq["form"].iat[i].startswith("antoine") else ""))
                continue
            falls = np.diff(lnp[j]) <= 0
            if falls.any():
                add(i, "b", "error", f"p does not rise with T near {t[j][1:][falls][0]:.5g} K (Clapeyron: dp/dT > 0 below tc)")
        tc, tm = eq["tc"].to_numpy(float)[ok], eq["tm"].to_numpy(float)[ok]
        margin = params["range_margin"]
        for j, i in enumerate(ok):
            if np.isfinite(tc[j]) and tmax[j] > tc[j] + margin:
                add(i, "tmax", "warning", f"range reaches {tmax[j]:.5g} K, above tc = {tc[j]:.5g} K", tmax[j], tc[j])
            if np.isfinite(tm[j]) and tmin[j] < tm[j] - margin:
                add(i, "tmin", "warning", f"range starts at {tmin[j]:.5g} K, below tm = {tm[j]:.5g} K "
                    "(sublimation or subcooled liquid?)", tmin[j], tm[j])
            if eq["form"].iat[i].startswith("wagner"):
                eq_tc, eq_pc = eq["eq_tc"].iat[i], eq["eq_pc"].iat[i] * eq["p_scale"].iat[i]
                pc = eq["pc"].iat[i]
                if np.isfinite(tc[j]) and abs(eq_tc - tc[j]) > params["wagner_tc_tolerance"]:
                    add(i, "eq_tc", "warning", f"fitted with tc = {eq_tc:.5g} K, the compound has {tc[j]:.5g} K", eq_tc, tc[j])
                if np.isfinite(pc) and abs(eq_pc / pc - 1) > params["wagner_pc_tolerance"]:
                    add(i, "eq_pc", "warning", f"fitted with pc = {eq_pc:.5g} Pa, the compound has {pc:.5g} Pa", eq_pc, pc)
    return pd.DataFrame(rows) if rows else None
