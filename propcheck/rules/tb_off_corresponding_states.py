"""tb, tc, pc and omega disagree: the boiling point is off the corresponding-states curve.

What it checks
    The stored normal boiling point against the temperature where the
    Lee-Kesler vapor-pressure curve built from the stored tc, pc and omega
    reaches 101325 Pa; when they disagree, which of the four constants is
    most likely wrong.

Why it matters
    tc, pc, omega and tb describe one vapor-pressure curve. A 10x slip in
    omega, transposed digits in tc or a tb in degC leaves each value
    plausible on its own, but the four no longer agree, and every
    simulation that uses them inherits the wrong curve.

Method
    Lee-Kesler ln(p/pc) = f0(Tr) + omega f1(Tr), solved for T at 101325 Pa
    (Lee and Kesler 1975). On the IUPAC/CRC/reference-EOS constants of 23
    compounds the difference is within 1 K except water (2.7 K, computed).
    Attribution: each of tb, tc, pc and omega is tried with the usual slips
    (unit, transposed digits, decimal point, a swap within the row), and tb
    and omega also at the values the compound's own fitted curve gives
    (101.325 kPa; Pitzer's definition at 0.7 tc): a tb its own points
    confirm is not blamed for an omega they contradict, nor the reverse.
    The repair that makes the whole row consistent (family trend, Guldberg
    band, Zc, own vapor-pressure points) names the column; "likely" when it
    is the only one, else "possibly". Without a repair, the column furthest
    off its family's trend is named, else tb.

Parameters
    warn_k
        |tb - tb(Lee-Kesler)| above which a warning is raised [K].
    error_k
        Above this the finding is an error [K].
    polar_factor
        Both tolerances are multiplied by this for formulas holding O, N, F
        or S (hydrogen bonding and polar compounds fit Lee-Kesler worse).

Example finding
    Acetone (tc 508.1 K, pc 4.7 MPa IUPAC; tb 329.23 K CRC; omega 0.307
    Lemmon & Span 2006) with omega typed 0.0307: ``tb 329.23 K vs 300.13 K
    from Lee-Kesler (tc 508.1 K, pc 4.7e+06 Pa, omega 0.0307); omega is
    likely wrong`` with suggestion ``likely: decimal point shifted (10x too
    small)? corrected omega 0.307 ...``

References
    1. B. I. Lee, M. G. Kesler, AIChE J. 21, 510 (1975).
    2. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 7.
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import diagnose, get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.physics.corresponding_states import lee_kesler_tb
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="tb-off-corresponding-states",
    title="tb disagrees with tc, pc and omega (Lee-Kesler)",
    severity="error",
    stage="consistency",
    method="Lee-Kesler vapor pressure at 101325 Pa from tc, pc, omega; attribution by slip repair",
    reference="Lee & Kesler 1975",
    params={
        "warn_k": "warning above this |tb - tb(Lee-Kesler)| [K]",
        "error_k": "error above this |tb - tb(Lee-Kesler)| [K]",
        "polar_factor": "tolerance multiplier for formulas with O, N, F or S",
    },
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    v = ctx.values
    tb_lk = lee_kesler_tb(v["tc"], v["pc"], v["omega"])
    scale = np.where(ctx.polar, params["polar_factor"], 1.0)
    diff = np.abs(v["tb"] - tb_lk)
    bad = np.flatnonzero(np.isfinite(diff) & (diff > params["warn_k"] * scale))
    if len(bad) == 0:
        return pd.DataFrame()
    diags = diagnose(ctx, bad, [("tb", "tc", "pc", "omega")] * len(bad))
    out = []
    for r, diag in zip(bad, diags):  # loop over findings
        error = diff[r] > params["error_k"] * scale[r]
        column = "tb"
        if diag is not None:
            column, sure = diag.column, diag.confidence
        else:
            zs = {c: ctx.family_z(c, v[c][[r]], np.array([r]))[0] for c in ("tb", "tc", "pc", "omega")}
            zs = {c: z for c, z in zs.items() if np.isfinite(z) and z > 1}
            column, sure = (max(zs, key=zs.get), "possibly") if zs else ("tb", "possibly")
        message = (f"tb {v['tb'][r]:.6g} K vs {tb_lk[r]:.6g} K from Lee-Kesler (tc {v['tc'][r]:.6g} K, "
                   f"pc {v['pc'][r]:.6g} Pa, omega {v['omega'][r]:.4g}); {column} is {sure} wrong")
        out.append(make_finding(
            RULE, ctx, r, column, message, diag, severity="error" if error else "warning",
            observed=float(v[column][r]), expected=None if diag is not None else (float(tb_lk[r]) if column == "tb" else None),
            tolerance=float((params["error_k"] if error else params["warn_k"]) * scale[r]),
            reference="Lee-Kesler vapor pressure from tc, pc, omega (Lee & Kesler 1975)"))
    return pd.DataFrame(out)
