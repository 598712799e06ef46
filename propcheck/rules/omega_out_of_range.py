"""Acentric factor outside the range observed for real compounds.

What it checks
    omega against the observed range (finer than the gross bounds of
    ``value-out-of-range``).

Why it matters
    omega is about 0 for simple fluids and below 1.5 for nearly all process
    chemicals; a value outside is usually a shifted decimal point or a
    number from another column.

Method
    Pitzer's acentric factor, omega = -log10(p(0.7 tc)/pc) - 1 (Pitzer et
    al. 1955). Slightly negative values are real: hydrogen -0.22, helium
    -0.39 (CoolProp 8.0.0 reference EOS); above 1.5 is suspect (common
    practice). The repair comes
    from the shared slip diagnosis.

Parameters
    range
        [low, high] of omega accepted.

Example finding
    Benzene (omega 0.211, Thol et al. 2012 EOS) with omega typed 2.11:
    ``omega 2.11 is outside [-0.4, 1.5]`` with suggestion ``likely:
    decimal point shifted (10x too large)? corrected omega 0.211 ...``
    (a tenfold omega above 2.5 is withheld by ``value-out-of-range``)

References
    1. K. S. Pitzer et al., J. Am. Chem. Soc. 77, 3433 (1955).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import diagnose, get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="omega-out-of-range",
    title="Acentric factor outside the observed range",
    severity="warning",
    stage="consistency",
    method="observed range of Pitzer's acentric factor",
    reference="Pitzer et al. 1955",
    params={"range": "[low, high] of omega accepted"},
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    omega = ctx.values["omega"]
    low, high = params["range"]
    rows = np.flatnonzero(np.isfinite(omega) & ((omega < low) | (omega > high)))
    diags = diagnose(ctx, rows, ["omega"] * len(rows)) if len(rows) else []
    return pd.DataFrame([make_finding(RULE, ctx, r, "omega", f"omega {omega[r]:.4g} is outside [{low:g}, {high:g}]", d,
                         observed=float(omega[r]), tolerance=f"[{low:g}, {high:g}]",
                         reference="Pitzer acentric factor, observed range")
            for r, d in zip(rows, diags)])
