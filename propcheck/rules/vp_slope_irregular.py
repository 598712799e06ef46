"""The local slope of ln p against 1/T changes irregularly along a series.

What it checks
    Along each compound's points (sorted by T, the fit's rejected points
    left out), the local slope psi = -d ln p / d(1/T) between neighbours:
    its variation with T must have the single shape of a real curve:
    falling, then (near the critical point) rising through one minimum,
    never a local maximum or a second minimum. (That psi is positive, p
    rising with T, is vp-falls-with-temperature's check.)

Why it matters
    A series whose local slopes zigzag or jump mixes sources with different
    systematic errors, or carries a block of points on another temperature
    scale. Each point may look plausible, yet enthalpies of vaporization
    (psi = dH_vap / (R dZ_vap)) taken from the data would jump.

Method
    Clausius-Clapeyron slope psi between adjacent points; Waring showed psi
    has a single minimum below tc (ln p against 1/T has one inflection), and
    psi falls with T for Tr < ~0.7. A change of psi between adjacent
    segments counts when it exceeds ``min_relative_change`` x psi and
    ``noise_factor`` x the change that the series' own scatter (the larger
    of its robust residual scale and the points' stated uncertainty) can
    produce over those segments. A series whose counted
    changes include a rise followed by a fall (a local maximum), or two
    separate minima, is flagged at the temperature where the shape breaks.
    Points of two interleaved sources can hide inside the fit's scatter;
    they show in a Wald-Wolfowitz runs test on the signs of the residuals
    (far more sign changes than chance, z > ``runs_z``), counted only when
    the scatter exceeds ``min_scatter``. Series with fewer than
    ``min_points`` points are not judged.

Parameters
    min_relative_change
        Relative change of psi between adjacent segments below which it is ignored.
    noise_factor
        Multiple of the scatter-induced change of psi a change must exceed.
    min_points
        Points (kept by the fit) needed to judge a series.
    runs_z
        z of the runs test on residual signs above which alternation is flagged.
    min_scatter
        Robust residual scale (ln p) below which alternation is not worth a finding.

Example finding
    ``the slope -d ln p/d(1/T) of the 12 points changes direction
    irregularly from 400 K (slopes 4120, 4380, 4090 K): a real curve has
    one minimum`` with suggestion ``mixed sources or a block of points on
    another temperature scale?``

References
    1. W. Waring, Ind. Eng. Chem. 46, 762 (1954).
    2. S. Velasco et al., "Waring and Riedel functions for the liquid-vapor
       coexistence curve", Ind. Eng. Chem. Res. (2014).
    3. A. Wald, J. Wolfowitz, Ann. Math. Stat. 11, 147 (1940) (runs test).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.curves import BLOCK_POINTS, curves
from propcheck.physics.grouped_fit import group_blocks
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-slope-irregular",
    title="Slope of ln p against 1/T changes irregularly",
    severity="warning",
    stage="consistency",
    method="local Clausius-Clapeyron slopes; Waring's single minimum",
    reference="Waring 1954; Velasco et al. 2014",
    params={
        "min_relative_change": "relative change of psi between segments below which it is ignored",
        "noise_factor": "multiple of the scatter-induced change of psi a change must exceed",
        "min_points": "points (kept by the fit) needed to judge a series",
        "runs_z": "z of the runs test on residual signs above which alternation is flagged",
        "min_scatter": "robust residual scale (ln p) below which alternation is not worth a finding",
    },
)


def _too_many_runs(g, resid, n_groups, params):
    """Wald-Wolfowitz runs test on the signs of each series' residuals (points sorted by T).

    Far more sign changes than chance (z > runs_z) means neighbouring points
    alternate between two levels: two interleaved sources.
    """
    pos = resid > 0
    n1 = np.bincount(g, pos.astype(float), minlength=n_groups)
    n = np.bincount(g, minlength=n_groups).astype(float)
    n2 = n - n1
    changes = np.bincount(g[1:], ((pos[1:] != pos[:-1]) & (g[1:] == g[:-1])).astype(float), minlength=n_groups)
    runs = changes + 1
    with np.errstate(all="ignore"):
        mu = 2 * n1 * n2 / n + 1
        var = (mu - 1) * (mu - 2) / (n - 1)
        z = (runs - mu) / np.sqrt(var)
    return np.isfinite(z) & (z > params["runs_z"]), z


def _scan(g, t, lnp, u_rel, resid, scale, n_groups, params):
    """Judge the kept points of compounds 0..n_groups-1 (sorted by compound, t).

    Returns per compound: flagged, alternating, runs z, points kept; and for
    each flagged compound the temperature of its first break and its slopes.
    """
    # scatter of ln p at each point: the larger of the fit's robust scale and the stated uncertainty
    sigma_pt = np.fmax(np.maximum(scale[g], 1e-3), u_rel)
    n_kept = np.bincount(g, minlength=n_groups)
    # segments between neighbours of the same compound
    same = g[1:] == g[:-1]
    dx = 1.0 / t[1:] - 1.0 / t[:-1]
    dy = lnp[1:] - lnp[:-1]
    with np.errstate(all="ignore"):
        psi = np.where(same, -dy / dx, np.nan)
        rel_noise = np.hypot(sigma_pt[1:], sigma_pt[:-1]) / np.abs(dy)  # relative scatter of each psi
    # changes between adjacent segments of the same compound
    seg_same = same[1:] & same[:-1]
    dpsi = psi[1:] - psi[:-1]
    noise = params["noise_factor"] * np.hypot(rel_noise[1:] * psi[1:], rel_noise[:-1] * psi[:-1])
    floor = params["min_relative_change"] * np.abs(psi[:-1])
    sign = np.where(seg_same & (np.abs(dpsi) > np.maximum(noise, floor)), np.sign(dpsi), 0.0)
    comp = g[1:-1]  # compound of each change
    at_t = t[1:-1]  # temperature of the middle point of each change
    nonzero = np.nonzero(sign)[0]
    s, c, tt = sign[nonzero], comp[nonzero], at_t[nonzero]
    cont = c[1:] == c[:-1]
    rise_then_fall = cont & (s[:-1] > 0) & (s[1:] < 0)
    fall_then_rise = cont & (s[:-1] < 0) & (s[1:] > 0)
    minima = np.bincount(c[1:][fall_then_rise], minlength=n_groups)
    flagged = np.zeros(n_groups, dtype=bool)
    flagged[c[1:][rise_then_fall]] = True
    flagged |= minima >= 2
    alternating, runs_z = _too_many_runs(g, resid, n_groups, params)
    alternating &= scale > params["min_scatter"]
    flagged = (flagged | alternating) & (n_kept >= params["min_points"])
    details = {}
    for gi in np.nonzero(flagged)[0]:
        breaks = tt[1:][(c[1:] == gi) & (rise_then_fall | fall_then_rise)]
        where = float(breaks[0]) if len(breaks) else float(t[g == gi][1])
        details[int(gi)] = (where, psi[(g[1:] == gi) & same])
    return flagged, alternating, runs_z, n_kept, details


def check(db, params):
    cv = curves(db)
    if cv is None:
        return None
    rows = []
    # compound by compound in blocks of points, so the temporaries stay small
    for lo, hi in group_blocks(cv.group, BLOCK_POINTS):
        g_lo, g_hi = int(cv.group[lo]), int(cv.group[hi - 1]) + 1
        keep = cv.fit.weight[lo:hi] > 0
        g = cv.group[lo:hi][keep] - g_lo
        t, p = cv.t[lo:hi][keep], cv.p[lo:hi][keep]
        with np.errstate(invalid="ignore"):
            u_rel = np.fmax(cv.u[lo:hi][keep] / p, 0.0)
        flagged, alternating, runs_z, n_kept, details = _scan(
            g, t, np.log(p), u_rel, cv.fit.residual[lo:hi][keep], cv.fit.scale[g_lo:g_hi], g_hi - g_lo, params)
        for gi, (where, series) in details.items():
            rows.append({
                "rule": RULE.id, "severity": RULE.severity, "table": "vapor_pressure",
                "compound_id": cv.ids[g_lo + gi], "column": "p", "t": where, "observed": None, "expected": None,
                "tolerance": params["min_relative_change"],
                "suggestion": "mixed sources or a block of points on another temperature scale?",
                "reference": "Waring 1954: one minimum of -d ln p/d(1/T) below tc",
                "message": (f"the slope -d ln p/d(1/T) of the {int(n_kept[gi])} points changes direction irregularly "
                            f"from {where:.5g} K (slopes {', '.join(f'{v:.4g}' for v in series[:8])} K): "
                            f"a real curve has one minimum"
                            + (f"; residuals alternate in sign (runs test z = {runs_z[gi]:.1f})" if alternating[gi] else "")),
                "source": cv.c_source[g_lo + gi],
            })
    return pd.DataFrame(rows) if rows else None
