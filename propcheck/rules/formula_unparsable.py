"""A molecular formula that does not parse.

What it checks
    Every non-empty ``formula`` is made of element symbols with counts (and
    parentheses).

Why it matters
    An unreadable formula cannot be checked against the molar mass or the
    CAS record, and usually hides a typing slip (``C6H1 4``, ``Cl`` typed
    as ``CL``).

Method
    Element symbols of the IUPAC periodic table with integer counts, nested
    parentheses allowed; unknown symbols and stray characters are refused.

Parameters
    None.

Example finding
    n-Hexane's formula C6H14 mistyped: ``formula 'C6H1x' does not parse as a molecular formula``

References
    1. IUPAC, Nomenclature of Inorganic Chemistry (Red Book, 2005), IR-3, IR-4.
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="formula-unparsable",
    title="Formula does not parse",
    severity="warning",
    stage="consistency",
    method="element symbols with counts, parentheses allowed",
    reference="IUPAC Red Book 2005",
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    formula = ctx.frame["formula"].astype(object)
    present = formula.notna() & (formula.astype(str).str.strip() != "")
    rows = np.flatnonzero(present.to_numpy() & ~np.isfinite(ctx.formula_mass))
    return pd.DataFrame([make_finding(RULE, ctx, r, "formula", f"formula {formula.iloc[r]!r} does not parse as a molecular formula",
                                      observed=formula.iloc[r], reference="element symbols with counts") for r in rows])
