"""Molar mass disagrees with the formula (IUPAC standard atomic weights).

What it checks
    The stored molar mass against the sum of the formula's atomic weights.

Why it matters
    The molar mass converts every mass-based quantity; a lost hydrogen, a
    value in kg/mol or the molar mass of another compound spreads to every
    mass and energy balance.

Method
    M = sum n_i Ar_i with IUPAC 2021 abridged standard atomic weights
    (Prohaska et al. 2022). Older tables (chemicals: H 1.00794, C 12.0107)
    differ by <= 0.005 g/mol on common compounds, hence the tolerance
    0.02 g/mol + 2e-4 M (common practice). A warning beyond it, an error
    beyond ``error_g_per_mol`` (one hydrogen is 1.008). Isomers share M: a
    formula of the wrong isomer passes. The repair (kg/mol, transposed
    digits) comes from the shared slip diagnosis.

Parameters
    abs_tolerance
        Accepted |M - M(formula)| at M = 0 [g/mol].
    rel_tolerance
        Added tolerance per g/mol of M.
    error_g_per_mol
        Beyond this difference the finding is an error [g/mol].

Example finding
    n-Hexane (86.178 g/mol, IUPAC 2021 weights) typed 68.178:
    ``molar_mass 68.178 g/mol vs 86.178 g/mol from C6H14`` with suggestion
    ``likely: transposed digits (68.178 for 86.178)? corrected molar_mass
    86.178 g/mol ...`` (a kg/mol slip below 1 g/mol is withheld by
    ``value-out-of-range``)

References
    1. T. Prohaska et al., "Standard atomic weights of the elements 2021",
       Pure Appl. Chem. 94, 573 (2022), doi:10.1515/pac-2019-0603.
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import diagnose, get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="molar-mass-off-formula",
    title="Molar mass disagrees with the formula",
    severity="error",
    stage="consistency",
    method="sum of IUPAC 2021 standard atomic weights over the formula",
    reference="Prohaska et al. 2022 (IUPAC standard atomic weights 2021)",
    params={
        "abs_tolerance": "accepted |M - M(formula)| at M = 0 [g/mol]",
        "rel_tolerance": "added tolerance per g/mol of M",
        "error_g_per_mol": "beyond this difference an error [g/mol]",
    },
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    m, mf = ctx.values["molar_mass"], ctx.formula_mass
    tol = params["abs_tolerance"] + params["rel_tolerance"] * mf
    diff = np.abs(m - mf)
    rows = np.flatnonzero(np.isfinite(diff) & (diff > tol))
    diags = diagnose(ctx, rows, ["molar_mass"] * len(rows)) if len(rows) else []
    formula = ctx.frame["formula"].to_numpy()
    out = [make_finding(RULE, ctx, r, "molar_mass", f"molar_mass {m[r]:.6g} g/mol vs {mf[r]:.6g} g/mol from {formula[r]}", d,
                        severity="error" if diff[r] > params["error_g_per_mol"] else "warning",
                        observed=float(m[r]), expected=float(mf[r]), tolerance=float(tol[r]),
                        reference="IUPAC 2021 standard atomic weights (Prohaska et al. 2022)")
           for r, d in zip(rows, diags)]
    for rec in out:
        rec["expected"] = rec.get("corrected") or rec["expected"]
    return pd.DataFrame(out)
