"""The same compound name under two compound ids.

What it checks
    Each name (compared without case and surrounding blanks) occurs in one
    row of ``compounds`` only.

Why it matters
    Two rows for one compound drift apart when one is corrected; lookups
    by name pick either.

Method
    Duplicate test on the normalised name; every row of a shared name is
    reported and names the other ids.

Parameters
    None.

Example finding
    Ethylbenzene's row (P16) named 'toluene', like P15:
    ``name 'toluene' is also used by P16`` (and the same on P16, naming P15)

References
    1. Data-management practice: one row per substance (common practice).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="name-shared-by-ids",
    title="Same name under two compound ids",
    severity="warning",
    stage="consistency",
    method="uniqueness of the normalised name across compound ids",
    reference="one row per substance (common practice)",
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    key = ctx.frame["name"].astype(object).fillna("").astype(str).str.strip().str.lower()
    dup = (key != "") & key.duplicated(keep=False)
    ids = ctx.frame["compound_id"].astype(str)
    out = []
    for r in np.flatnonzero(dup.to_numpy()):
        others = ", ".join(ids[(key == key.iloc[r]) & (ids != ids.iloc[r])])
        out.append(make_finding(RULE, ctx, r, "name", f"name {ctx.frame['name'].iloc[r]!r} is also used by {others}",
                                observed=ctx.frame["name"].iloc[r]))
    return pd.DataFrame(out)
