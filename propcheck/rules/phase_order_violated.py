"""Melting point, normal boiling point and critical temperature out of order.

What it checks
    tm < tb < tc for every compound (each pair where both values are
    present; tm < tc when tb is empty, as for a compound that sublimes at
    1 atm).

Why it matters
    A liquid exists at 1 atm only between its melting and boiling points, and
    it boils below its critical temperature. Out-of-order values almost
    always mean a temperature stored in degC or degF, or two columns swapped.

Method
    Phase order of a pure compound, Tt <= Tm < Tb < Tc (Poling et al.,
    ch. 2). To point at the wrong column, the shared slip diagnosis
    (``propcheck.diagnose``, as every rule on constants uses it) tries
    tm, tb and tc with the usual slips and swaps and scores each repair
    against the row's other evidence (Guldberg's band, Lee-Kesler, Zc, the
    compound's own points, family trend, reference data); its best repair
    that restores the order is reported with "likely" or "possibly". Where
    it finds none, the rule's own trial is offered as "possibly": each of
    tm, tb and tc with the temperature-scale slips (degC, degF, degR stored
    as K), then tb and tc swapped, kept when it restores the order, puts
    tb/tc inside the Guldberg band and keeps tc above the compound's own
    vapor-pressure points.
    Without a repair the finding names tb when tb >= tc and tm otherwise.
    When tb lies below tm and the stored tm agrees with the reference data
    (the median of the independent sources), tm is not blamed: the stored
    tb is then a sublimation temperature (carbon dioxide: 194.67 K at 1 atm,
    below its triple point, 216.59 K), and a compound that sublimes at 1 atm
    has no normal boiling point; unless a slip of tb restores the order, or
    Lee-Kesler from tc, pc, omega puts the liquid's vapor pressure at tm
    below 1 atm (then the compound cannot sublime at 1 atm).

Parameters
    guldberg_band
        [low, high] of tb/tc accepted for a repair (Guldberg's rule, tb/tc near 2/3).
    guldberg_typical
        Typical tb/tc; when several slips repair the order, the one whose
        tb/tc lies nearest to it is proposed.

Example finding
    n-Hexane (tc 507.6 K IUPAC, tb 341.87 K CRC) with tc entered in degC:
    ``tb = 341.87 K is not below tc = 234.45 K; tc is likely wrong`` with
    suggestion ``likely: degC entered as K? corrected tc 507.6 K ...``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed., McGraw-Hill (2001), ch. 2.
    2. C. M. Guldberg, Z. Phys. Chem. 5, 374 (1890) (tb/tc near 2/3).
"""

from __future__ import annotations

import numpy as np

from propcheck.diagnose import diagnose, get_context
from propcheck.findings import Finding
from propcheck.physics.unit_slips import TEMPERATURE_SLIPS
from propcheck.physics.vapor_pressure import P_ATM, lee_kesler_psat
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="phase-order-violated",
    title="tm < tb < tc violated",
    severity="error",
    stage="consistency",
    method="phase order Tm < Tb < Tc; repair by temperature-scale slips and Guldberg's rule",
    reference="Poling et al. 2001, ch. 2; Guldberg 1890",
    params={
        "guldberg_band": "[low, high] of tb/tc accepted when proposing a repair",
        "guldberg_typical": "typical tb/tc; among several repairs the one nearest to it wins",
    },
)


def _ordered(tm, tb, tc):
    ok_mb = ~(np.isfinite(tm) & np.isfinite(tb)) | (tm < tb)
    ok_bc = ~(np.isfinite(tb) & np.isfinite(tc)) | (tb < tc)
    ok_mc = ~(np.isfinite(tm) & np.isfinite(tc)) | (tm < tc)
    return ok_mb & ok_bc & ok_mc


def _in_band(tb, tc, band):
    ratio = tb / tc
    return ~(np.isfinite(tb) & np.isfinite(tc)) | ((ratio >= band[0]) & (ratio <= band[1]))


def _reference_tm(db, rows: np.ndarray) -> np.ndarray:
    """The reference median of tm for compounds rows ``rows`` (NaN where none or no reference rule runs)."""
    ctx = get_context(db)
    ref = ctx.reference.get("tm")
    at = ctx.positions(rows)
    if ref is None:
        return np.full(len(rows), np.nan)
    return np.where(at >= 0, ref[at], np.nan)


def _shared_diagnoses(db, rows: np.ndarray, ask: np.ndarray, t: dict) -> list:
    """The shared slip diagnosis (tm, tb or tc) of each asked row, where its repair restores the order; else None."""
    out = [None] * len(rows)
    ctx = get_context(db)
    at = ctx.positions(rows)
    picked = np.nonzero(ask & (at >= 0))[0]
    if len(picked) == 0:
        return out
    for i, diag in zip(picked, diagnose(ctx, at[picked], [("tm", "tb", "tc")] * len(picked))):
        if diag is None:
            continue
        trial = {k: np.array([v[i]]) for k, v in t.items()}
        trial[diag.column] = np.array([diag.corrected])
        for other, value in diag.others.items():
            if other in trial:
                trial[other] = np.array([value])
        if _ordered(**trial)[0]:
            out[i] = diag
    return out


def check(db, params) -> list[Finding]:
    c = db.df("SELECT _row AS c_row, compound_id, source, tm, tb, tc, pc, omega FROM compounds")
    t = {k: c[k].to_numpy(dtype=float) for k in ("tm", "tb", "tc")}
    bad = ~_ordered(t["tm"], t["tb"], t["tc"])
    if not bad.any():
        return []
    c, t = c[bad].reset_index(drop=True), {k: v[bad] for k, v in t.items()}
    # a repaired tc must lie above the compound's own vapor-pressure points
    t_max = np.full(len(c), -np.inf)
    if db.has("vapor_pressure"):
        highest = dict(db.con.execute("SELECT compound_id, max(t) FROM vapor_pressure GROUP BY 1").fetchall())
        t_max = np.array([highest.get(cid, -np.inf) for cid in c["compound_id"]], dtype=float)
    band = params["guldberg_band"]
    n = len(c)
    column = np.where(np.isfinite(t["tb"]) & np.isfinite(t["tc"]) & (t["tb"] >= t["tc"]), "tb", "tm").astype(object)
    fixed = np.full(n, np.nan)
    why = np.full(n, "", dtype=object)
    best = np.full(n, np.inf)  # distance of the repaired tb/tc from the typical ratio
    for name in ("tc", "tb", "tm"):
        for what, convert in TEMPERATURE_SLIPS:
            trial = dict(t)
            trial[name] = convert(t[name])
            ok = np.isfinite(t[name]) & _ordered(**trial) & _in_band(trial["tb"], trial["tc"], band)
            ok &= ~np.isfinite(trial["tc"]) | (trial["tc"] >= t_max)
            with np.errstate(invalid="ignore", divide="ignore"):
                score = np.abs(np.log(trial["tb"] / trial["tc"] / params["guldberg_typical"]))
            ok &= np.isfinite(score) & (score < best)  # no tb/tc to judge a repair by: propose none
            column[ok], fixed[ok], why[ok], best[ok] = name, trial[name][ok], what, score[ok]
    found = np.isfinite(best)
    swap = ~found & _ordered(t["tm"], t["tc"], t["tb"]) & _in_band(t["tc"], t["tb"], band) & (t["tb"] >= t_max)
    column[swap], fixed[swap], why[swap] = "tb", t["tc"][swap], "tb and tc swapped"
    # tb below a tm the reference data confirm: a sublimation point filed as tb, not a wrong tm
    only_mb = (np.isfinite(t["tm"]) & np.isfinite(t["tb"]) & (t["tm"] >= t["tb"])
               & _ordered(np.full(n, np.nan), t["tb"], t["tc"]) & _ordered(t["tm"], np.full(n, np.nan), t["tc"]))
    ref_tm = _reference_tm(db, c["c_row"].to_numpy()) if only_mb.any() else np.full(n, np.nan)
    sublimes = only_mb & (np.abs(t["tm"] - ref_tm) <= np.maximum(1.0, 0.005 * t["tm"]))
    sublimes &= ~(found & (column == "tb"))  # a slip of tb that restores the order explains it better
    # and the liquid must boil above 1 atm at tm (triple point above 1 atm), where tc, pc, omega tell
    with np.errstate(all="ignore"):
        p_tm = lee_kesler_psat(t["tm"], t["tc"], c["pc"].to_numpy(float), c["omega"].to_numpy(float))
    sublimes &= ~np.isfinite(p_tm) | (p_tm > P_ATM)
    column[sublimes], fixed[sublimes], why[sublimes] = "tb", np.nan, "sublimes"
    shared = _shared_diagnoses(db, c["c_row"].to_numpy(), ~sublimes, t)
    findings = []
    for i, rec in enumerate(c.itertuples(index=False)):
        tm, tb, tc = t["tm"][i], t["tb"][i], t["tc"][i]
        parts = []
        if np.isfinite(tm) and np.isfinite(tb) and tm >= tb:
            parts.append(f"tm = {tm:.6g} K is not below tb = {tb:.6g} K")
        if np.isfinite(tb) and np.isfinite(tc) and tb >= tc:
            parts.append(f"tb = {tb:.6g} K is not below tc = {tc:.6g} K")
        if np.isfinite(tm) and np.isfinite(tc) and tm >= tc:
            parts.append(f"tm = {tm:.6g} K is not below tc = {tc:.6g} K")
        col = column[i]
        message = "; ".join(parts) + f"; {col} is possibly wrong"
        suggestion = None
        diag = shared[i]
        if diag is not None:  # the repair the shared slip diagnosis scores best, as every rule reports it
            col, fixed[i], why[i] = diag.column, diag.corrected, "diagnosed"
            message = "; ".join(parts) + f"; {col} is {diag.confidence} wrong"
            suggestion = diag.suggestion(" K")
        elif why[i] == "sublimes":
            message = "; ".join(parts) + f"; tm agrees with the reference data ({ref_tm[i]:.6g} K)"
            suggestion = ("a sublimation point filed as tb? a compound whose triple point lies above 1 atm sublimes "
                          "and has no normal boiling point: leave tb empty")
        elif why[i]:
            suggestion = ("possibly: " + (f"{why[i]}? corrected {col} {fixed[i]:.6g} K" if why[i] != "tb and tc swapped"
                                          else "tb and tc swapped?"))
        findings.append(
            Finding(
                rule=RULE.id, severity=RULE.severity, table="compounds", compound_id=rec.compound_id, column=col,
                observed=float(t[col][i]), expected=(float(fixed[i]) if np.isfinite(fixed[i]) else None),
                row=int(rec.c_row), source=rec.source, suggestion=suggestion,
                corrected=(float(fixed[i]) if np.isfinite(fixed[i]) else None),
                reference=("phase order tm < tb < tc; reference data (tm)" if why[i] == "sublimes"
                           else "phase order tm < tb < tc; repair scored by the slip diagnosis" if why[i] == "diagnosed"
                           else "phase order tm < tb < tc; Guldberg tb/tc band" if why[i] else "phase order tm < tb < tc"),
                message=message,
            )
        )
    return findings
