"""Critical compressibility outside the observed band or unequal to pc*vc/(R*tc).

What it checks
    Zc = pc vc / (R tc) from the stored critical constants: inside the band
    observed for real compounds, and equal to the stored zc when there is
    one.

Why it matters
    tc, pc and vc are measured together; a Zc far from 0.27 betrays a
    volume in cm3/mol or L/mol, a pressure in bar or kPa, or a constant of
    another compound. A stored zc that disagrees with the three it is made
    of means one of the four was edited alone. Those unit slips put vc or
    pc outside the bounds of ``value-out-of-range``, which withholds the
    value (with the same diagnosis) before this rule sees it; here remain
    slips such as transposed digits.

Method
    Zc = pc vc / (R tc), R = 8.314462618 J/(mol K) (SI 2019). IUPAC set of
    421 compounds: median 0.264, 1-99 % 0.199-0.302, range 0.163-0.329
    (computed from the IUPAC series as carried by chemicals 1.5.2). Warning
    outside ``band``, error outside ``error_band``;
    stored zc: warning beyond ``match_tolerance``, error beyond
    ``match_error``. The column and repair come from the shared slip
    diagnosis (vc, pc, tc, zc tried).

Parameters
    band
        [low, high] of Zc accepted.
    error_band
        Outside this [low, high] the finding is an error.
    match_tolerance
        Accepted |zc - pc vc/(R tc)|.
    match_error
        Above this |zc - pc vc/(R tc)| the finding is an error.

Example finding
    Benzene (IUPAC: tc 562.05 K, pc 4.895 MPa, vc 256 cm3/mol, Zc 0.268)
    with zc typed 0.286: ``stored zc 0.286 differs from pc*vc/(R*tc) =
    0.2682`` with suggestion ``likely: transposed digits (0.286 for
    0.268)? corrected zc 0.268 ...``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 2.
    2. IUPAC critical-data series, J. Chem. Eng. Data (1995-2015).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import diagnose, get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.diagnose.repair import R
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="zc-inconsistent",
    title="Zc outside the observed band or unequal to pc*vc/(R*tc)",
    severity="warning",
    stage="consistency",
    method="Zc = pc vc/(R tc); IUPAC-observed band; stored zc equality",
    reference="IUPAC critical series; Poling et al. 2001 ch. 2",
    params={
        "band": "[low, high] of Zc accepted",
        "error_band": "outside this [low, high] an error",
        "match_tolerance": "accepted |zc - pc vc/(R tc)|",
        "match_error": "above this |zc - pc vc/(R tc)| an error",
    },
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    v = ctx.values
    with np.errstate(divide="ignore", invalid="ignore"):
        zc = v["pc"] * v["vc"] / (R * v["tc"])
    low, high = params["band"]
    elow, ehigh = params["error_band"]
    out_band = np.isfinite(zc) & ((zc < low) | (zc > high))
    mismatch = np.abs(v["zc"] - zc)
    off = ~out_band & np.isfinite(mismatch) & (mismatch > params["match_tolerance"])
    rows = np.flatnonzero(out_band | off)
    if len(rows) == 0:
        return pd.DataFrame()
    tries = [("vc", "pc", "tc") if out_band[r] else ("zc", "vc", "pc", "tc") for r in rows]
    diags = diagnose(ctx, rows, tries)
    out = []
    for r, diag in zip(rows, diags):
        if out_band[r]:
            message = f"Zc = pc*vc/(R*tc) = {zc[r]:.4g} is outside [{low:g}, {high:g}]"
            error = zc[r] < elow or zc[r] > ehigh
            column, tol = "vc", f"[{low:g}, {high:g}]"
        else:
            message = f"stored zc {v['zc'][r]:.4g} differs from pc*vc/(R*tc) = {zc[r]:.4g}"
            error = mismatch[r] > params["match_error"]
            column, tol = "zc", params["match_tolerance"]
        if diag is None:
            message += f"; {column} is possibly wrong"
        col = diag.column if diag else column
        out.append(make_finding(
            RULE, ctx, r, col, message, diag, severity="error" if error else "warning",
            observed=float(v[col][r]), expected=None if diag else (float(zc[r]) if col == "zc" else None),
            tolerance=tol, reference="Zc = pc vc/(R tc); IUPAC-observed band"))
    return pd.DataFrame(out)
