"""A stored vapor-pressure equation disagrees with the compound's own data.

What it checks
    Each evaluable row of ``vp_equations`` against the compound's
    vapor-pressure points inside its range (10 K margin), its normal boiling
    point (101.325 kPa at tb) when tb lies in the range, or, with neither,
    the Lee-Kesler estimate from tc, pc and omega.

Why it matters
    Coefficients are copied between systems with their units in a header
    that gets lost: an Antoine set fitted for mmHg and degC, or for log10,
    declared as Pa, K and ln, evaluates smoothly and is wrong everywhere.

Method
    The median |ln p_eq - ln p_ref| over the reference points is compared
    with ``tol`` (``tol_estimate`` against the Lee-Kesler estimate). Beyond
    it, every combination of pressure unit (Pa, kPa, MPa, bar, atm, mmHg,
    psi), temperature unit (K, degC) and logarithm base (10, e) is tried;
    the combination that fits is named in ``suggestion`` with the column
    that is declared wrong. Beyond ``error_misfit`` the finding is an error.

Parameters
    tol
        Median |ln p| misfit tolerated against points or tb.
    tol_estimate
        Median |ln p| misfit tolerated against the Lee-Kesler estimate.
    error_misfit
        Median |ln p| misfit from which a finding is an error.

Example finding
    ``antoine equation (row 3) gives 0.0075x the 8 points in its range
    (median; misfit 4.89 in ln p)`` with suggestion ``coefficients fit
    p_unit mmHg (declared Pa)`` (coefficients fitted for mmHg, declared as
    Pa: every pressure 133.322 times too small)

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed. (2001), App. A (unit conventions of Antoine coefficients).
    2. B. I. Lee, M. G. Kesler, AIChE J. 21, 510 (1975).
"""

from __future__ import annotations

import itertools

import numpy as np
import pandas as pd

from propcheck.equations import equations, ln_p_of
from propcheck.physics.vapor_pressure import lee_kesler_psat
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-equation-off-data",
    title="Stored vapor-pressure equation disagrees with the compound's data",
    severity="warning",
    stage="consistency",
    method="median ln-p misfit to points, tb or Lee-Kesler; unit, scale and log-base diagnosis",
    reference="Poling et al. 2001, App. A; Lee & Kesler 1975",
    params={
        "tol": "median |ln p| misfit tolerated against points or tb",
        "tol_estimate": "median |ln p| misfit tolerated against the Lee-Kesler estimate",
        "error_misfit": "median |ln p| misfit from which a finding is an error",
    },
)

P_UNITS = {"Pa": 1.0, "kPa": 1e3, "MPa": 1e6, "bar": 1e5, "atm": 101325.0, "mmHg": 133.322387415, "psi": 6894.757293168}
T_UNITS = {"K": 0.0, "degC": 273.15}
BASES = {"10": np.log(10.0), "e": 1.0}


def _reference(db, eq):
    """(equation index, T, p, kind) of the data each equation is judged against."""
    refs = []
    if db.has("vapor_pressure"):
        pts = db.df(
            "SELECT e._row AS e_row, v.t, v.p FROM vp_equations e JOIN vapor_pressure v USING (compound_id) "
            "WHERE v.t > 0 AND v.p > 0"
        )
        index = {r: i for i, r in enumerate(eq["e_row"])}
        pts["i"] = pts["e_row"].map(index)
        pts = pts[pts["i"].notna()]
        i = pts["i"].to_numpy(int)
        inside = (pts["t"] >= eq["tmin_k"].to_numpy()[i] - 10) & (pts["t"] <= eq["tmax_k"].to_numpy()[i] + 10)
        pts = pts[inside.to_numpy()]
        refs.append(pd.DataFrame({"i": pts["i"].astype(int), "t": pts["t"], "p": pts["p"], "kind": "points"}))
    have = set(refs[0]["i"]) if refs else set()
    tb, lo, hi = eq["tb"].to_numpy(float), eq["tmin_k"].to_numpy(), eq["tmax_k"].to_numpy()
    use_tb = [i for i in range(len(eq)) if i not in have and np.isfinite(tb[i]) and lo[i] - 10 <= tb[i] <= hi[i] + 10]
    refs.append(pd.DataFrame({"i": use_tb, "t": tb[use_tb], "p": 101325.0, "kind": "tb"}))
    have |= set(use_tb)
    rest = [i for i in range(len(eq)) if i not in have]
    if rest:
        r = np.array(rest)
        tc, pc, om = (eq[k].to_numpy(float)[r] for k in ("tc", "pc", "omega"))
        for frac in (0.2, 0.5, 0.8):
            t = lo[r] + frac * (hi[r] - lo[r])
            p = lee_kesler_psat(t, tc, pc, om)
            keep = np.isfinite(p) & (t < tc)
            refs.append(pd.DataFrame({"i": r[keep], "t": t[keep], "p": p[keep], "kind": "estimate"}))
    out = pd.concat(refs, ignore_index=True)
    out["i"] = out["i"].astype(int)
    return out


def _median_misfit(eq, ref, **units):
    lnp = ln_p_of(eq, ref["t"].to_numpy(), ref["i"].to_numpy(), **units)
    miss = np.abs(lnp - np.log(ref["p"].to_numpy()))
    miss = np.where(np.isfinite(miss), miss, 50.0)
    return pd.Series(miss).groupby(ref["i"].to_numpy()).median(), pd.Series(lnp - np.log(ref["p"].to_numpy())).groupby(ref["i"].to_numpy()).median()


def check(db, params):
    eq = equations(db)
    if eq is None:
        return None
    ok = eq["problem"].to_numpy() == ""
    ref = _reference(db, eq)
    ref = ref[ok[ref["i"].to_numpy()]]
    if ref.empty:
        return None
    declared, signed = _median_misfit(eq, ref)
    kind = ref.groupby("i")["kind"].first()
    count = ref.groupby("i").size()
    tol = np.where(kind.reindex(declared.index) == "estimate", params["tol_estimate"], params["tol"])
    off = declared[declared.to_numpy() > tol]
    if off.empty:
        return None
    rows = []
    combos = list(itertools.product(P_UNITS.items(), T_UNITS.items(), BASES.items()))
    trials = {}
    for (pu, ps), (tu, ts), (bn, bv) in combos:
        sub = ref[ref["i"].isin(off.index)]
        trials[(pu, tu, bn)], _ = _median_misfit(eq, sub, t_shift=ts, ln_base=bv, p_scale=ps)
    for i, misfit in off.items():
        rec = eq.iloc[i]
        limit = params["tol_estimate"] if kind[i] == "estimate" else params["tol"]
        best = min(trials, key=lambda k: trials[k].get(i, np.inf))
        best_misfit = trials[best].get(i, np.inf)
        declared_units = (rec["p_unit"], rec["t_unit"], rec["base"])
        suggestion, column = None, "a"
        if best_misfit < limit and best != declared_units:
            parts = [f"{name} {new} (declared {old})" for name, new, old in
                     zip(("p_unit", "t_unit", "log_base"), best, declared_units) if str(new) != str(old)]
            if rec["form"].startswith("wagner"):
                parts = [p for p in parts if not p.startswith(("t_unit", "log_base"))]
            if parts:
                suggestion = "coefficients fit " + "; ".join(parts)
                column = parts[0].split()[0]
        what = {"points": f"the {int(count[i])} points in its range", "tb": "tb at 101.325 kPa",
                "estimate": "the Lee-Kesler estimate from tc, pc, omega"}[kind[i]]
        rows.append({
            "rule": RULE.id, "severity": "error" if misfit > params["error_misfit"] else "warning",
            "table": "vp_equations", "compound_id": rec["compound_id"], "column": column,
            "observed": float(np.exp(signed[i])), "expected": 1.0, "tolerance": float(limit),
            "suggestion": suggestion, "row": int(rec["e_row"]), "source": rec["source"],
            "reference": what,
            "message": (f"{rec['form']} equation (row {int(rec['e_row'])}) gives {np.exp(signed[i]):.4g}x {what} "
                        f"(median; misfit {misfit:.3g} in ln p)"),
        })
    return pd.DataFrame(rows)
