"""tb/tc outside the band observed for real compounds (Guldberg's rule).

What it checks
    The ratio of the normal boiling point to the critical temperature.

Why it matters
    For real liquids tb/tc stays near 2/3; a ratio far outside the observed
    band means one of the two temperatures is in the wrong scale, mistyped
    or taken from another compound, even when tb < tc still holds.

Method
    Guldberg's rule tb/tc ~ 2/3 (Guldberg 1890); IUPAC tc with CRC tb for
    653 organics: median 0.680, 1-99 % 0.605-0.815; long n-alkanes and
    siloxanes reach 0.83, simple gases 0.57 (computed from the IUPAC series
    and CRC Handbook 95th ed. as carried by chemicals 1.5.2). A warning
    outside the band, an error below ``error_below`` (K/degC mix-ups, 1000x
    slips). tb >= tc is left to ``phase-order-violated``. A compound without
    tb (it sublimes at 1 atm) is not judged. The column and the repair come
    from the shared slip diagnosis.

Parameters
    band
        [low, high] of tb/tc accepted.
    error_below
        A ratio below this is an error.

Example finding
    n-Decane (tc 617.7 K, Lemmon & Span 2006; tb 447.25 K, CRC Handbook)
    with tb entered in degC: ``tb/tc = 0.282 (tb 174.1 K, tc 617.7 K) is
    outside [0.55, 0.87]`` with suggestion ``likely: degC entered as K?
    corrected tb 447.25 K ...``

References
    1. C. M. Guldberg, Z. Phys. Chem. 5, 374 (1890).
    2. D. Ambrose, C. Tsonopoulos, J. Chem. Eng. Data 40, 531 (1995) (IUPAC tc).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import diagnose, get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="tb-tc-ratio-out-of-band",
    title="tb/tc outside Guldberg's band",
    severity="warning",
    stage="consistency",
    method="Guldberg's rule tb/tc ~ 2/3, observed band of real compounds",
    reference="Guldberg 1890; IUPAC critical series with CRC Handbook tb",
    params={"band": "[low, high] of tb/tc accepted", "error_below": "tb/tc below this is an error"},
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    tb, tc = ctx.values["tb"], ctx.values["tc"]
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = tb / tc
    low, high = params["band"]
    bad = np.flatnonzero(np.isfinite(ratio) & (ratio < 1) & ((ratio < low) | (ratio > high)))
    diags = diagnose(ctx, bad, [("tb", "tc")] * len(bad)) if len(bad) else []
    out = []
    for r, diag in zip(bad, diags):
        message = f"tb/tc = {ratio[r]:.3f} (tb {tb[r]:.6g} K, tc {tc[r]:.6g} K) is outside [{low:g}, {high:g}]"
        column = diag.column if diag else "tb"
        if diag is None:
            message += "; tb or tc is possibly wrong"
        out.append(make_finding(
            RULE, ctx, r, column, message, diag, severity="error" if ratio[r] < params["error_below"] else "warning",
            observed=float(ctx.values[column][r]), tolerance=f"[{low:g}, {high:g}]",
            reference="Guldberg's rule tb/tc ~ 2/3 (Guldberg 1890)"))
    return pd.DataFrame(out)
