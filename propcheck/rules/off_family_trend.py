"""A member sits off its family's trend (tc, tb, pc, omega against carbon number).

What it checks
    Within each ``family``, tc and tb rise and pc falls smoothly with carbon
    number (or molar mass); a member far from the curve through its
    neighbours is flagged, naming the family, the neighbours and the
    expected value. Members the trend cannot judge (the ends of a series,
    small families) are still checked for the monotonic order. A family
    too small to judge gets one info finding.

Why it matters
    Homologous series are the strongest check a constant has short of a
    reference: one mistyped or copied value stands out against its
    neighbours by several times their scatter.

Method
    Leave-one-out quadratic in ln n through <= 3 neighbours each side (>= 4
    points, at least one each side: the ends are not extrapolated), solved
    for all members at once; pass 2 drops the worst member from its
    neighbours' fits (common practice; smooth IUPAC recommendations against
    carbon number, Ambrose and Tsonopoulos 1995). Clean n-alkane residuals
    stay within 2.4 K (tc), 0.44 K (tb), 1.2 % (pc), all at propane next to
    the head; without ethane (C3-C8, C10) within 0.32 K, 0.06 K, 0.27 %
    (computed with this rule on C1-C8 and C10: tc, pc IUPAC, n-decane tc
    Lemmon & Span 2006, tb CRC Handbook 95th ed.). Irregular heads of series
    (the first two 1-alkanols) are neither judged nor used; omega is not
    judged for 1-alkanols (it peaks at ethanol). Members with an isomer in
    the family get the wider ``isomer_tolerance`` (o- and p-xylene differ
    by 14 K in tc). Families named in ``not_series`` are classes, not
    series, and are not judged. A break of the rising (falling) order is
    said in the message; the repair comes from the shared slip diagnosis.

Parameters
    tolerance
        Accepted |value - trend| per column: tc, tb [K], pc (relative), omega.
    isomer_tolerance
        The same for members that share their carbon number with another.
    neighbours_each_side
        Neighbours taken on each side.
    min_neighbours
        Fewest neighbours for a judgement.
    head_members
        First members of every series that are neither judged nor used
        (methane, acetone, benzene: the head of a series is irregular and a
        quadratic in ln n misfits ethane's tc by 7 K through methane).
    irregular_heads
        Family name -> number of first members not judged nor used,
        overriding ``head_members``.
    skip_omega
        Families whose omega is not judged.
    not_series
        Family labels that name a class of compounds rather than a series.
    max_off_share
        When more than this share of a family's judged members are off its
        trend, the label is not a homologous series: one info finding, no
        member findings.

Example finding
    n-Alkanes C1-C8 and C10 (tc IUPAC, n-decane Lemmon & Span 2006) with
    n-hexane's tc 507.6 K typed 570.6: ``n-hexane tc 570.6 K is off the
    n-alkane trend: expected 507.437 K from propane, n-butane, n-pentane,
    n-heptane, n-octane, n-decane (tc rises with carbon number)`` with
    suggestion ``likely: transposed digits (570.6 for 507.6)? corrected tc
    507.6 K ...``

References
    1. D. Ambrose, C. Tsonopoulos, J. Chem. Eng. Data 40, 531 (1995).
    2. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), ch. 2.
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import diagnose, get_context
from propcheck.diagnose.annotate import UNITS, make_finding
from propcheck.diagnose.context import TREND_COLUMNS
from propcheck.physics.family_trend import order_breaks
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="off-family-trend",
    title="Member off its family's trend",
    severity="warning",
    stage="consistency",
    method="leave-one-out quadratic in ln(carbon number) through <= 3 neighbours each side",
    reference="Ambrose & Tsonopoulos 1995 (smooth trends vs carbon number)",
    params={
        "tolerance": "accepted |value - trend|: tc, tb [K], pc (relative), omega",
        "isomer_tolerance": "the same for members with an isomer in the family",
        "neighbours_each_side": "neighbours taken on each side",
        "min_neighbours": "fewest neighbours for a judgement",
        "head_members": "first members of every series not judged nor used (irregular heads)",
        "irregular_heads": "family -> number of first members not judged nor used, overriding head_members",
        "skip_omega": "families whose omega is not judged",
        "not_series": "family labels that are classes, not series",
        "max_off_share": "above this share of members off the trend, the family is reported as no series",
    },
)


def _rows_of(rows, cols, column) -> set:
    """Rows already reported for ``column``."""
    return {r for r, c in zip(rows, cols) if c == column}


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db, params)
    names = ctx.frame["name"].astype(object).fillna("").to_numpy()
    family = ctx.frame["family"].astype(object).fillna("").to_numpy()
    out = []
    every = np.arange(len(ctx.frame))
    z = {c: ctx.family_z(c, ctx.values[c], every) for c in TREND_COLUMNS}
    off = np.zeros(len(every), dtype=bool)
    judged = np.zeros(len(every), dtype=bool)
    for column in TREND_COLUMNS:
        off |= np.isfinite(z[column]) & (z[column] > 1)
        judged |= np.isfinite(z[column])
    # a family most of whose members are off its own trend is no series: say so once
    share = pd.DataFrame({"family": family, "off": off, "judged": judged})[judged].groupby("family")["off"].agg(["mean", "size"])
    scattered = share[share["mean"] > params["max_off_share"]]
    for name, rec in scattered.iterrows():
        out.append({"rule": RULE.id, "severity": "info", "table": "compounds", "compound_id": None, "column": "family",
                    "observed": name, "message": f"family {name!r} does not follow a smooth trend ({rec['mean']:.0%} of "
                    f"{int(rec['size'])} judged members are off it): not judged as a homologous series"})
    skip = np.isin(family, scattered.index.to_numpy())
    rows, cols = [], []
    for column in TREND_COLUMNS:
        for r in np.flatnonzero(np.isfinite(z[column]) & (z[column] > 1) & ~skip):
            rows.append(r)
            cols.append(column)
    # monotonic order, for members the trend cannot judge (ends, small families)
    breaking = {}
    for column in ("tc", "tb", "pc"):
        series = (ctx.family_code >= 0) & ~skip & ~ctx.head  # pc falls from ethane on, not from methane
        member = series & ~ctx.judged[column]
        breaks, any_side, prev, nxt = order_breaks(ctx.family_code, ctx.x, ctx.values[column], series,
                                                   rising=column != "pc")
        pair = np.flatnonzero(any_side & series)
        if len(pair) == 0:
            continue
        # blame, within each broken pair, the member a slip repair explains; else one breaking on all sides
        repaired = {r: d for r, d in zip(pair, diagnose(ctx, pair, [column] * len(pair))) if d is not None and d.column == column}
        families_repaired = {ctx.family_code[r] for r in repaired}
        for r in pair:
            if r in repaired or (breaks[r] and member[r] and ctx.family_code[r] not in families_repaired):
                if not member[r] and r in _rows_of(rows, cols, column):
                    continue
                rows.append(r)
                cols.append(column)
                breaking[(r, column)] = (prev[r], nxt[r])
    diags = diagnose(ctx, rows, cols) if rows else []
    for r, column, diag in zip(rows, cols, diags):  # loop over findings
        if (r, column) in breaking:
            prev, nxt = breaking[(r, column)]
            unit = UNITS[column]
            sides = " and ".join(t for t in (f"{prev:.6g}{unit} for the previous carbon number" if np.isfinite(prev) else "",
                                             f"{nxt:.6g}{unit} for the next" if np.isfinite(nxt) else "") if t)
            trend = "falls" if column == "pc" else "rises"
            out.append(make_finding(
                RULE, ctx, r, column, f"{names[r]} {column} {ctx.values[column][r]:.6g}{unit} breaks the {family[r]} order "
                f"({column} {trend} with carbon number; {sides})", diag if diag and diag.column == column else None,
                observed=float(ctx.values[column][r]),
                reference="monotonic trend along a homologous series (Ambrose & Tsonopoulos 1995)"))
            continue
        value, expected = ctx.values[column][r], ctx.expected_value(column, r)
        nb = [names[i] for i in ctx.neighbours[column][r] if i >= 0]
        unit = UNITS[column]
        trend = "falls" if column == "pc" else "rises"
        message = (f"{names[r]} {column} {value:.6g}{unit} is off the {family[r]} trend: expected "
                   f"{expected:.6g}{unit} from {', '.join(nb)} ({column} {trend} with carbon number)")
        tol = ctx.tolerance[column][r]
        out.append(make_finding(RULE, ctx, r, column, message, diag if diag and diag.column == column else None,
                                observed=float(value), expected=float(expected),
                                tolerance=f"{tol:g}" + (" (relative)" if column == "pc" else unit),
                                reference="leave-one-out quadratic in ln n within the family (Ambrose & Tsonopoulos 1995)"))
    # families too small to judge at all
    code = ctx.family_code
    judged_any = np.zeros(len(code), dtype=bool)
    for column in TREND_COLUMNS:
        judged_any |= ctx.judged[column]
    frame = pd.DataFrame({"code": code, "family": family, "judged": judged_any})
    small = frame[frame["code"] >= 0].groupby("family")["judged"].agg(["any", "size"])
    for name, rec in small[~small["any"]].iterrows():
        out.append({"rule": RULE.id, "severity": "info", "table": "compounds", "compound_id": None, "column": "family",
                    "observed": name, "message": f"family {name!r} has {rec['size']} member(s): too few to judge its trend "
                    f"(after its irregular head, {params['min_neighbours']} neighbours with one on each side are needed)"})
    return pd.DataFrame(out)
