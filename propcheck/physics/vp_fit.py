"""Robust vapor-pressure curve fits for all compounds at once.

The form is chosen per compound by its data:

* Wagner 2.5-5 in reduced form, with the compound's own tc and pc, for
  >= 6 points spanning >= 0.2 in Tr: linear in its four coefficients,
  ``ln(p/pc) = (tc/T)(a tau + b tau^1.5 + c tau^2.5 + d tau^5)``;
* otherwise a form free of tc and pc: Riedel, ``ln p = A + B/T + C ln T +
  D T^6``, for >= 6 points (linear in its coefficients; it follows a curve
  from the triple point to near tc); Antoine, ``ln p = A - B/(T + C)``, for
  >= 4 points, started from the linearisation ``T ln p = A T + (A C - B) -
  C ln p`` and refined by Gauss-Newton steps; Clausius-Clapeyron,
  ``ln p = A - B/T``, for >= 2 points.

Where Wagner is possible the free form is fitted too; when the anchored
Wagner fit is much worse (its residual scale over 3x the free form's), the tc
or pc it is anchored on does not suit the points: the free form is used and
the ratio is kept in ``anchor_misfit`` for the critical-point check.

Every fit is iteratively reweighted least squares with Tukey's biweight on
residuals in ln p, solved for all compounds together
(:mod:`propcheck.physics.grouped_fit`), so a single blunder does not bend a
curve and no Python loop runs per compound. The starting fit leaves out
points that break the rise of p with T by more than a factor of 1.5, so that
a far-off point with high leverage (a temperature in degC) cannot capture it.

References
----------
.. [1] W. Wagner, Cryogenics 13, 470 (1973); D. Ambrose, J. Chem. Thermodyn. 18, 45 (1986).
.. [2] L. Riedel, Chem.-Ing.-Tech. 26, 83 (1954).
.. [3] G. W. Thomson, Chem. Rev. 38, 1 (1946) (Antoine equation).
"""

from __future__ import annotations

import os
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass

import numpy as np

from propcheck.physics.grouped_fit import MAD_TO_SIGMA, group_blocks, group_median, grouped_lstsq, robust_grouped_fit

__all__ = ["FORMS", "VpFit", "fit_in_blocks", "fit_vapor_pressure"]

FORMS = ("none", "clausius-clapeyron", "antoine", "wagner", "riedel")
FORM_TITLES = {
    "clausius-clapeyron": "Clausius-Clapeyron",
    "antoine": "Antoine",
    "wagner": "Wagner 2.5-5 (reduced, own tc and pc)",
    "riedel": "Riedel",
}
CC, ANTOINE, WAGNER, RIEDEL = 1, 2, 3, 4
WAGNER_MIN_POINTS = 6
WAGNER_MIN_TR_SPAN = 0.2
RIEDEL_MIN_POINTS = 6
ANTOINE_MIN_POINTS = 4
# A Wagner fit anchored on (tc, pc) whose residual scale exceeds the free
# form's by this factor is not used: the anchor does not suit the points.
ANCHOR_MISFIT_LIMIT = 3.0
N_PARAMS = {"none": 0, "clausius-clapeyron": 2, "antoine": 3, "wagner": 4, "riedel": 4}
T_REF = 500.0  # K; scales the T^6 term of the Riedel form
MIN_POINTS_PER_THREAD = 100_000  # smaller data are fitted on one thread: not worth the hand-over
GROSS_FACTOR = 1.5  # a neighbour pair whose p falls by more than this is left out of the start


@dataclass
class VpFit:
    """Fitted curves of every compound (group) and the residual of every point."""

    form: np.ndarray  # (G,) index into FORMS
    coef: np.ndarray  # (G, 4) coefficients of the chosen form
    tc: np.ndarray  # (G,)
    pc: np.ndarray  # (G,)
    n_points: np.ndarray  # (G,)
    t_min: np.ndarray  # (G,)
    t_max: np.ndarray  # (G,)
    scale: np.ndarray  # (G,) robust residual scale of ln p
    residual: np.ndarray  # (n,) ln p_obs - ln p_fit
    weight: np.ndarray  # (n,) final robust weight (0: rejected by the fit)
    anchor_misfit: np.ndarray  # (G,) Wagner scale / free-form scale where both were fitted, else NaN
    alt_residual: np.ndarray  # (n,) free-form residual where Wagner is the chosen form, else NaN
    alt_scale: np.ndarray  # (G,) free-form residual scale where Wagner is the chosen form, else NaN
    free_form: np.ndarray  # (G,) form fitted without tc and pc (Riedel, Antoine or Clausius-Clapeyron)
    free_coef: np.ndarray  # (G, 4) its coefficients

    def free(self) -> "VpFit":
        """The fits made without tc and pc, as a VpFit of their own (for extrapolation to tc)."""
        return VpFit(form=self.free_form, coef=self.free_coef, tc=self.tc, pc=self.pc, n_points=self.n_points,
                     t_min=self.t_min, t_max=self.t_max, scale=self.scale, residual=self.alt_residual,
                     weight=self.weight, anchor_misfit=self.anchor_misfit, alt_residual=self.alt_residual,
                     alt_scale=self.alt_scale, free_form=self.free_form, free_coef=self.free_coef)

    def form_name(self, g) -> np.ndarray:
        return np.asarray(FORMS, dtype=object)[self.form[g]]

    def dof(self) -> np.ndarray:
        """Points minus coefficients, per compound."""
        return self.n_points - np.array([N_PARAMS[f] for f in FORMS])[self.form]

    def ln_p(self, t, g) -> np.ndarray:
        """ln p [Pa] of the fitted curve of compounds ``g`` at temperatures ``t`` [K]."""
        t = np.asarray(t, dtype=float)
        g = np.asarray(g)
        form = self.form[g]
        c = self.coef[g]
        out = np.full(np.broadcast(t, g).shape, np.nan)
        with np.errstate(all="ignore"):
            cc = form == CC
            out = np.where(cc, c[..., 0] - c[..., 1] / t, out)
            an = form == ANTOINE
            out = np.where(an & (t + c[..., 2] > 0), c[..., 0] - c[..., 1] / (t + c[..., 2]), out)
            wa = form == WAGNER
            tc, pc = self.tc[g], self.pc[g]
            tau = 1.0 - t / tc
            wag = np.log(pc) + (c[..., 0] * tau + c[..., 1] * tau**1.5 + c[..., 2] * tau**2.5 + c[..., 3] * tau**5) * tc / t
            out = np.where(wa & (tau >= 0), wag, out)
            ri = form == RIEDEL
            rie = c[..., 0] + c[..., 1] / t + c[..., 2] * np.log(t) + c[..., 3] * (t / T_REF) ** 6
            out = np.where(ri, rie, out)
        return out

    def t_at(self, p, g, t_lo=None, t_hi=None) -> np.ndarray:
        """Temperature [K] where the fitted curve of ``g`` reaches ``p`` [Pa] (NaN if it cannot)."""
        g = np.asarray(g)
        p = np.broadcast_to(np.asarray(p, dtype=float), g.shape)
        form, c = self.form[g], self.coef[g]
        ln_p = np.log(p)
        out = np.full(g.shape, np.nan)
        with np.errstate(all="ignore"):
            out = np.where(form == CC, c[..., 1] / (c[..., 0] - ln_p), out)
            out = np.where(form == ANTOINE, c[..., 1] / (c[..., 0] - ln_p) - c[..., 2], out)
        out = np.where(np.isfinite(out) & (out > 0), out, np.nan)
        numeric = (form == WAGNER) | (form == RIEDEL)
        if numeric.any():
            # bisection on the fitted branch, where ln p rises with T
            lo = np.where(form == WAGNER, 0.2 * self.tc[g], 0.5 * self.t_min[g])
            hi = np.where(form == WAGNER, self.tc[g], 1.5 * self.t_max[g])
            if t_lo is not None:
                lo = np.maximum(lo, t_lo)
            if t_hi is not None:
                hi = np.minimum(hi, t_hi)
            for _ in range(80):
                mid = 0.5 * (lo + hi)
                above = self.ln_p(mid, g) > ln_p
                hi = np.where(numeric & above, mid, hi)
                lo = np.where(numeric & ~above, mid, lo)
            t_n = 0.5 * (lo + hi)
            ok = np.abs(self.ln_p(t_n, g) - ln_p) < 1e-6
            out = np.where(numeric, np.where(ok, t_n, np.nan), out)
        return out


def _wagner_eligible(n, t_min, t_max, tc, pc):
    tc_ok = np.isfinite(tc) & np.isfinite(pc) & (tc > 0) & (pc > 0)
    span = np.where(tc_ok, (t_max - t_min) / np.where(tc_ok, tc, 1.0), 0.0)
    return (n >= WAGNER_MIN_POINTS) & tc_ok & (span >= WAGNER_MIN_TR_SPAN) & (t_max < tc)


def _free_form(n):
    return np.select([n >= RIEDEL_MIN_POINTS, n >= ANTOINE_MIN_POINTS, n >= 2], [RIEDEL, ANTOINE, CC], 0)


def _start_weights(group, ln_p):
    """0 for points on either side of a fall of p by more than GROSS_FACTOR (points sorted by T)."""
    w = np.ones(len(ln_p))
    same = group[1:] == group[:-1]
    drop = same & (ln_p[:-1] - ln_p[1:] > np.log(GROSS_FACTOR))
    if drop.any():
        # blame the member of the pair farther from the pair's other neighbour
        i = np.nonzero(drop)[0]
        before = np.where((i > 0) & (group[np.maximum(i - 1, 0)] == group[i]), ln_p[np.maximum(i - 1, 0)], np.nan)
        after = np.where((i + 2 < len(ln_p)) & (group[np.minimum(i + 2, len(ln_p) - 1)] == group[i]),
                         ln_p[np.minimum(i + 2, len(ln_p) - 1)], np.nan)
        first_high = np.where(np.isfinite(before), ln_p[i + 1] >= before, np.isfinite(after) & (ln_p[i] > after))
        w[np.where(first_high, i, i + 1)] = 0.0
    return w


def fit_vapor_pressure(group, t, p, n_groups, tc, pc, min_scale=1e-3) -> VpFit:
    """Fit every compound's points; ``group`` holds each point's compound index.

    Parameters
    ----------
    group : ndarray of int, shape (n,)
        Compound index of each point; points sorted by (group, t).
    t, p : ndarray, shape (n,)
        Temperature [K] and pressure [Pa] of the points (positive, finite).
    tc, pc : ndarray, shape (n_groups,)
        The compounds' critical constants (NaN where unknown).
    min_scale : float
        Floor of the robust residual scale in ln p (0.1 %, the precision of
        careful static measurements: common practice).
    """
    group = np.asarray(group)
    t = np.asarray(t, dtype=float)
    ln_p = np.log(np.asarray(p, dtype=float))
    tc, pc = np.asarray(tc, float), np.asarray(pc, float)
    n = np.bincount(group, minlength=n_groups)
    t_min = np.full(n_groups, np.nan)
    t_max = np.full(n_groups, np.nan)
    np.fmin.at(t_min, group, t)
    np.fmax.at(t_max, group, t)
    w0 = _start_weights(group, ln_p)
    free = _free_form(n)
    coef = np.full((n_groups, 4), np.nan)
    residual = np.full(len(t), np.nan)
    weight = np.zeros(len(t))
    scale = np.full(n_groups, np.nan)
    row_free = free[group]

    def subset(rows_mask):
        rows = np.nonzero(rows_mask)[0]
        groups, local = np.unique(group[rows], return_inverse=True)
        return rows, groups, local

    def store(rows, groups, beta, fit_resid, fit_w, fit_scale, k):
        coef[groups, :k] = beta
        residual[rows], weight[rows], scale[groups] = fit_resid, fit_w, fit_scale

    rows, groups, local = subset(row_free == CC)
    if len(rows):
        x = np.column_stack([np.ones(len(rows)), -1.0 / t[rows]])
        fit = robust_grouped_fit(x, ln_p[rows], local, len(groups), min_scale=min_scale, initial_weight=w0[rows])
        store(rows, groups, fit.beta, fit.residual, fit.weight, fit.scale, 2)

    rows, groups, local = subset(row_free == RIEDEL)
    if len(rows):
        tr = t[rows]
        x = np.column_stack([np.ones(len(rows)), 1.0 / tr, np.log(tr), (tr / T_REF) ** 6])
        fit = robust_grouped_fit(x, ln_p[rows], local, len(groups), min_scale=min_scale, initial_weight=w0[rows])
        store(rows, groups, fit.beta, fit.residual, fit.weight, fit.scale, 4)

    rows, groups, local = subset(row_free == ANTOINE)
    if len(rows):
        beta, res, w, sc = _fit_antoine(t[rows], ln_p[rows], local, len(groups), min_scale, w0[rows])
        store(rows, groups, beta, res, w, sc, 3)

    form = free.copy()
    free_coef = coef.copy()
    anchor_misfit = np.full(n_groups, np.nan)
    alt_residual = np.full(len(t), np.nan)
    alt_scale = np.full(n_groups, np.nan)
    eligible = _wagner_eligible(n, t_min, t_max, tc, pc)
    rows, groups, local = subset(eligible[group])
    if len(rows):
        tcr, pcr = tc[group[rows]], pc[group[rows]]
        tau = 1.0 - t[rows] / tcr
        x = np.column_stack([tau, tau**1.5, tau**2.5, tau**5]) * (tcr / t[rows])[:, None]
        fit = robust_grouped_fit(x, ln_p[rows] - np.log(pcr), local, len(groups), min_scale=min_scale,
                                 initial_weight=w0[rows])
        anchor_misfit[groups] = fit.scale / scale[groups]
        use = anchor_misfit[groups] <= ANCHOR_MISFIT_LIMIT
        take = use[local]
        alt_residual[rows[take]] = residual[rows[take]]  # the free form's opinion on each point
        alt_scale[groups[use]] = scale[groups[use]]
        form[groups[use]] = WAGNER
        coef[groups[use]] = fit.beta[use]
        residual[rows[take]], weight[rows[take]] = fit.residual[take], fit.weight[take]
        scale[groups[use]] = fit.scale[use]

    return VpFit(form=form, coef=coef, tc=tc, pc=pc, n_points=n, t_min=t_min, t_max=t_max, scale=scale,
                 residual=residual, weight=weight, anchor_misfit=anchor_misfit, alt_residual=alt_residual,
                 alt_scale=alt_scale, free_form=free, free_coef=free_coef)


def _fit_antoine(t, ln_p, group, n_groups, min_scale, w0, tuning=4.685, iterations=25):
    """Robust Antoine fit in ln p: linearised start, then damped Gauss-Newton with biweights."""
    # start: T ln p = A T + D - C ln p, D = A C - B
    x = np.column_stack([t, np.ones_like(t), -ln_p])
    start = robust_grouped_fit(x, t * ln_p, group, n_groups, min_scale=min_scale * 300.0, initial_weight=w0)
    a, d, c = start.beta.T
    b = a * c - d
    t_lo = np.full(n_groups, np.inf)
    np.fmin.at(t_lo, group, t)
    # keep T + C positive over the data; fall back to Clausius-Clapeyron-like C = 0
    bad = ~np.isfinite(c) | (t_lo + c <= 0.05 * t_lo) | ~np.isfinite(b)
    beta = np.column_stack([a, b, c])
    if bad.any():
        xc = np.column_stack([np.ones_like(t), -1.0 / t])
        cc = robust_grouped_fit(xc, ln_p, group, n_groups, min_scale=min_scale, initial_weight=w0).beta
        beta[bad] = np.column_stack([cc[bad, 0], cc[bad, 1], np.zeros(bad.sum())])
    w = np.ones(len(t))
    scale = np.full(n_groups, min_scale)

    def resid_of(bt):
        with np.errstate(all="ignore"):
            return ln_p - (bt[group, 0] - bt[group, 1] / (t + bt[group, 2]))

    resid = resid_of(beta)
    for _ in range(iterations):
        scale = np.maximum(MAD_TO_SIGMA * group_median(np.abs(resid), group, n_groups), min_scale)
        u = resid / (tuning * scale[group])
        w = np.where(np.abs(u) < 1.0, (1.0 - u**2) ** 2, 0.0)
        w = np.where(np.isfinite(w), w, 0.0)
        denom = t + beta[group, 2]
        jac = np.column_stack([np.ones_like(t), -1.0 / denom, beta[group, 1] / denom**2])
        step = grouped_lstsq(jac, resid, group, n_groups, w)
        step = np.where(np.isfinite(step), step, 0.0)
        old_cost = np.bincount(group, w * resid**2, minlength=n_groups)
        lam = np.ones(n_groups)
        for _ in range(8):  # halve the step where it raises the cost or crosses T + C = 0
            trial = beta + lam[:, None] * step
            ok_c = t_lo + trial[:, 2] > 0.05 * t_lo
            r_trial = resid_of(trial)
            cost = np.bincount(group, w * np.where(np.isfinite(r_trial), r_trial, 1e6) ** 2, minlength=n_groups)
            good = ok_c & (cost <= old_cost * (1 + 1e-12))
            if good.all():
                break
            lam = np.where(good, lam, lam / 2)
        accept = ok_c & (cost <= old_cost * (1 + 1e-12))
        beta = np.where(accept[:, None], trial, beta)
        new_resid = resid_of(beta)
        if np.nanmax(np.abs(new_resid - resid), initial=0.0) < 1e-10:
            resid = new_resid
            break
        resid = new_resid
    return beta, resid, w, scale


def _workers() -> int:
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except AttributeError:  # not on Linux
        return max(1, os.cpu_count() or 1)


def fit_in_blocks(group, t, p, n_groups, tc, pc, block_points: int = 1 << 18, workers: int | None = None,
                  **kwargs) -> VpFit:
    """:func:`fit_vapor_pressure` over blocks of whole compounds, to bound memory and use every core.

    ``group`` must be sorted (points of a compound together). Each block
    holds at most about ``block_points`` points, and there are at least as
    many blocks as ``workers`` (default: the cores this process may use)
    when the data are large enough to be worth it; blocks are fitted on
    that many threads (numpy releases the GIL in its array work). Each
    block writes its results into one set of arrays, so the outcome equals
    one call over all points.
    """
    group = np.asarray(group)
    workers = _workers() if workers is None else max(1, workers)
    if len(group) >= MIN_POINTS_PER_THREAD * 2 and workers > 1:
        block_points = min(block_points, -(-len(group) // workers))
    if len(group) <= block_points:
        return fit_vapor_pressure(group, t, p, n_groups, tc, pc, **kwargs)

    spans = group_blocks(group, block_points)
    per_group = ("form", "coef", "n_points", "t_min", "t_max", "scale", "anchor_misfit", "alt_scale", "free_form",
                 "free_coef")
    per_point = ("residual", "weight", "alt_residual")
    merged: dict[str, np.ndarray] = {}

    def fit_block(lo_hi):
        """Fit one span and write its results into the merged arrays (disjoint slices: no lock needed)."""
        lo, hi = lo_hi
        g_lo, g_hi = int(group[lo]), int(group[hi - 1]) + 1
        fit = fit_vapor_pressure(group[lo:hi] - g_lo, t[lo:hi], p[lo:hi], g_hi - g_lo, tc[g_lo:g_hi], pc[g_lo:g_hi],
                                 **kwargs)
        for name in per_group:
            merged[name][g_lo:g_hi] = getattr(fit, name)
        for name in per_point:
            merged[name][lo:hi] = getattr(fit, name)

    # the merged arrays are laid out from the first span's result types
    lo, hi = spans[0]
    g_hi = int(group[hi - 1]) + 1
    first = fit_vapor_pressure(group[lo:hi], t[lo:hi], p[lo:hi], g_hi, tc[:g_hi], pc[:g_hi], **kwargs)
    for name in per_group:
        value = getattr(first, name)
        merged[name] = np.full((n_groups,) + value.shape[1:], np.nan if value.dtype.kind == "f" else 0, value.dtype)
        merged[name][:g_hi] = value
    for name in per_point:
        value = getattr(first, name)
        merged[name] = np.empty(len(group), dtype=value.dtype)
        merged[name][lo:hi] = value
    del first
    rest = spans[1:]
    if workers > 1 and len(rest) > 1:
        with ThreadPoolExecutor(max_workers=min(workers, len(rest))) as pool:
            list(pool.map(fit_block, rest))
    else:
        for span in rest:
            fit_block(span)
    return VpFit(tc=np.asarray(tc, float), pc=np.asarray(pc, float), **merged)
