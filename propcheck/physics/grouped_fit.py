"""Least squares for many small problems at once: one fit per group (compound).

Every group shares the same linear-in-parameters model ``y = X @ beta``; the
normal equations of all groups are formed together and solved as one
batched ``np.linalg.solve``, so the cost is a few passes over the rows
whatever the number of compounds. The robust variant lays each group's rows
out as one line of a dense block (groups of similar size share a block),
and iterates reweighted least squares with Tukey's biweight on residuals
scaled by each group's median absolute deviation, so that one blunder does
not bend a fit; a group leaves the iteration once its fit has settled.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

__all__ = ["GroupFit", "GroupLayout", "group_blocks", "group_median", "grouped_lstsq", "robust_grouped_fit"]

BLOCK_ROWS = 1 << 20  # rows whose cross products are formed at once
MAD_TO_SIGMA = 1.482602218505602  # 1/Phi^-1(3/4): MAD of a normal sample -> sigma (common practice)


def group_blocks(group: np.ndarray, max_rows: int = BLOCK_ROWS) -> list[tuple[int, int]]:
    """Row spans ``[lo, hi)`` of about ``max_rows`` rows that never split a group.

    ``group`` must be sorted. Work done span by span keeps every temporary
    array small, however many rows there are.

    Examples
    --------
    >>> group_blocks(np.array([0, 0, 1, 1, 1, 2]), 3)
    [(0, 2), (2, 5), (5, 6)]
    """
    n = len(group)
    if n <= max_rows:
        return [(0, n)] if n else []
    starts = np.flatnonzero(np.concatenate(([True], group[1:] != group[:-1])))
    cuts = [0]
    while cuts[-1] < n:
        target = cuts[-1] + max_rows
        if target >= n:
            cuts.append(n)
            break
        # the last group start at or before the target, unless that is the current cut
        i = np.searchsorted(starts, target, side="right") - 1
        cut = int(starts[i]) if starts[i] > cuts[-1] else int(starts[min(i + 1, len(starts) - 1)])
        cuts.append(cut if cut > cuts[-1] else n)
    return list(zip(cuts[:-1], cuts[1:]))


def group_median(values: np.ndarray, group: np.ndarray, n_groups: int) -> np.ndarray:
    """Median of the non-NaN ``values`` within each group (NaN for a group with none).

    Rows of one group that sit together (as in points sorted by compound) are
    laid out in dense lines (:class:`GroupLayout`) and sorted along them;
    otherwise one ``lexsort`` orders all values.

    Examples
    --------
    >>> group_median(np.array([3.0, 1.0, 2.0, 10.0, np.nan]), np.array([0, 0, 0, 1, 1]), 3).tolist()
    [2.0, 10.0, nan]
    """
    values = np.asarray(values, dtype=float)
    group = np.asarray(group)
    valid = ~np.isnan(values)
    out = np.full(n_groups, np.nan)
    if len(group) and np.all(group[1:] >= group[:-1]):
        layout = GroupLayout(group, n_groups)
        for gids, rows, mask, _ in layout.blocks:
            line_mask = mask & valid[rows]
            counts = line_mask.sum(axis=1)
            has = counts > 0
            if has.any():
                out[gids[has]] = _median_of_lines(values[rows[has]], line_mask[has], counts[has])
        return out
    group, values = group[valid], values[valid]
    counts = np.bincount(group, minlength=n_groups)
    starts = np.concatenate(([0], np.cumsum(counts)[:-1]))
    has = counts > 0
    order = np.lexsort((values, group))
    lo = starts[has] + (counts[has] - 1) // 2
    hi = starts[has] + counts[has] // 2
    sorted_values = values[order]
    out[has] = 0.5 * (sorted_values[lo] + sorted_values[hi])
    return out


def _group_sums(rows: np.ndarray, group: np.ndarray, n_groups: int) -> np.ndarray:
    """Sums of the columns of ``rows`` (shape (m, n)) per group, as (n_groups, m).

    ``np.add.reduceat`` when each group's rows sit together, else bincount.
    """
    out = np.zeros((n_groups, rows.shape[0]))
    if len(group) == 0:
        return out
    if np.all(group[1:] >= group[:-1]):
        starts = np.flatnonzero(np.concatenate(([True], group[1:] != group[:-1])))
        out[group[starts]] = np.add.reduceat(rows, starts, axis=1).T
        return out
    for c in range(rows.shape[0]):
        out[:, c] = np.bincount(group, rows[c], minlength=n_groups)
    return out


def grouped_lstsq(x: np.ndarray, y: np.ndarray, group: np.ndarray, n_groups: int, w: np.ndarray | None = None):
    """Weighted least squares per group.

    Parameters
    ----------
    x : ndarray, shape (n, k)
        Design matrix rows.
    y : ndarray, shape (n,)
        Observations.
    group : ndarray of int, shape (n,)
        Group index of each row, 0 <= group < n_groups.
    w : ndarray, shape (n,), optional
        Row weights.

    Returns
    -------
    beta : ndarray, shape (n_groups, k)
        Coefficients; NaN for groups whose normal matrix is singular.
    """
    return _lstsq_t(np.ascontiguousarray(x.T), y, group, n_groups, w)


def _lstsq_t(xt: np.ndarray, y: np.ndarray, group: np.ndarray, n_groups: int, w: np.ndarray | None = None):
    """:func:`grouped_lstsq` with the design matrix given transposed, shape (k, n)."""
    k, n = xt.shape
    w = np.ones(n) if w is None else w
    xtx = np.zeros((n_groups, k, k))
    xty = np.zeros((n_groups, k))
    pairs = [(i, j) for i in range(k) for j in range(i, k)]
    sums = np.zeros((n_groups, len(pairs) + k))
    # all cross products of a block of rows in one (m, block) array, summed per group;
    # blocks bound the memory to a few arrays of BLOCK_ROWS whatever the number of rows
    for lo in range(0, n, BLOCK_ROWS):
        hi = min(n, lo + BLOCK_ROWS)
        wx = xt[:, lo:hi] * w[lo:hi]
        products = np.empty((len(pairs) + k, hi - lo))
        for c, (i, j) in enumerate(pairs):
            np.multiply(wx[i], xt[j, lo:hi], out=products[c])
        np.multiply(wx, y[lo:hi], out=products[len(pairs):])
        sums += _group_sums(products, group[lo:hi], n_groups)
    for c, (i, j) in enumerate(pairs):
        xtx[:, i, j] = xtx[:, j, i] = sums[:, c]
    xty[:] = sums[:, len(pairs):]
    return _solve_normal(xtx, xty)


@dataclass
class GroupFit:
    """Result of a robust grouped fit."""

    beta: np.ndarray  # (n_groups, k)
    residual: np.ndarray  # (n,) y - X beta
    scale: np.ndarray  # (n_groups,) robust residual scale (sigma estimate)
    weight: np.ndarray  # (n,) final biweight weights, 0 for rejected rows


class GroupLayout:
    """Each group's rows side by side in dense blocks, one block per size class.

    A group of n rows takes one line of the block whose width is n rounded up
    to a quarter of its power of two, so the padding adds at most a quarter to
    the storage whatever the mix of group sizes. Sums, products and sorts then run along a line
    (batched ``matmul``, ``sort(axis=1)``) instead of through scattered rows.
    """

    def __init__(self, group: np.ndarray, n_groups: int):
        group = np.asarray(group)
        self.n_rows = len(group)
        counts = np.bincount(group, minlength=n_groups)
        starts = np.concatenate(([0], np.cumsum(counts)[:-1]))
        in_order = len(group) == 0 or bool(np.all(group[1:] >= group[:-1]))
        order = None if in_order else np.argsort(group, kind="stable")
        width = np.zeros(n_groups, dtype=np.int64)
        has = counts > 0
        # four size classes per octave: n rounded up to a multiple of 2**(floor(log2 n) - 2)
        step = 1 << np.maximum(np.floor(np.log2(np.maximum(counts, 1))).astype(np.int64) - 2, 0)
        width[has] = (-(-counts[has] // step[has])) * step[has]
        self.blocks = []  # (group ids, row index (B, W), mask (B, W), counts (B,))
        for w in np.unique(width[has]):
            gids = np.nonzero(width == w)[0]
            slot = np.arange(w)
            mask = slot < counts[gids][:, None]
            pos = np.where(mask, starts[gids][:, None] + slot, starts[gids][:, None])
            self.blocks.append((gids, pos if order is None else order[pos], mask, counts[gids]))

    def scatter(self, dense_per_block: list[np.ndarray], fill: float = np.nan) -> np.ndarray:
        """Flat (n,) array from one (B, W) array per block."""
        out = np.full(self.n_rows, fill)
        for (_, rows, mask, _), dense in zip(self.blocks, dense_per_block):
            out[rows[mask]] = dense[mask]
        return out


def _median_of_lines(values: np.ndarray, mask: np.ndarray, counts: np.ndarray) -> np.ndarray:
    """Median of each line of ``values`` over its masked-in entries (``counts`` of them, >= 1)."""
    ordered = np.sort(np.where(mask, values, np.inf), axis=1)
    lines = np.arange(len(counts))
    return 0.5 * (ordered[lines, (counts - 1) // 2] + ordered[lines, counts // 2])


def _solve_lines(xt: np.ndarray, y: np.ndarray, w: np.ndarray) -> np.ndarray:
    """Weighted least squares of every line: xt (B, k, W), y and w (B, W) -> beta (B, k)."""
    wx = xt * w[:, None, :]
    return _solve_normal(wx @ xt.transpose(0, 2, 1), (wx @ y[:, :, None])[:, :, 0])


def _solve_normal(xtx: np.ndarray, xty: np.ndarray) -> np.ndarray:
    """Batched solve of normal equations; NaN rows where the matrix is (near-)singular."""
    n_groups, k = xty.shape
    # scale columns to keep the batched solve well conditioned
    diag = np.sqrt(np.abs(np.einsum("gii->gi", xtx)))
    diag[diag == 0] = 1.0
    scaled = xtx / diag[:, :, None] / diag[:, None, :]
    beta = np.full((n_groups, k), np.nan)
    # unit-diagonal Gram matrices: a determinant near 0 means (near-)singular
    with np.errstate(all="ignore"):
        det = np.linalg.det(scaled)
    good = np.isfinite(det) & (np.abs(det) > 1e-13)
    if good.any():
        sol = np.linalg.solve(scaled[good], (xty[good] / diag[good])[..., None])[..., 0]
        beta[good] = sol / diag[good]
    return beta


def _fitted(xt, beta):
    return (beta[:, None, :] @ xt)[:, 0, :]


def _robust_lines(xt, y, mask, counts, w0, min_scale, tuning, iterations, settle):
    """Biweight IRLS of every line of one block; a line stops iterating once its fit settles.

    A line has settled when its weights no longer change or when no fitted
    value moved by more than ``settle`` times its residual scale in the last
    step. Returns beta (B, k), residual (B, W), scale (B,), weight (B, W).
    """
    n_lines = len(counts)
    w = mask * (1.0 if w0 is None else w0)
    beta = _solve_lines(xt, y, w)
    if w0 is not None:  # a line left singular by the start weights starts from all its rows
        redo = np.isnan(beta).any(axis=1)
        if redo.any():
            beta[redo] = _solve_lines(xt[redo], y[redo], mask[redo].astype(float))
    scale = np.full(n_lines, np.nan)
    weight = w.copy()
    resid = y - _fitted(xt, beta)
    active = np.arange(n_lines)  # lines still iterating, and their working copies
    a_xt, a_y, a_mask, a_counts, a_w, a_beta, a_resid = xt, y, mask, counts, w, beta, resid
    a_floor = min_scale
    for _ in range(iterations):
        if len(active) == 0:
            break
        a_scale = np.maximum(MAD_TO_SIGMA * _median_of_lines(np.abs(a_resid), a_mask, a_counts), a_floor)
        u = a_resid / (tuning * a_scale[:, None])
        with np.errstate(invalid="ignore"):
            new_w = np.where(a_mask & (np.abs(u) < 1.0), (1.0 - u**2) ** 2, 0.0)
        new_w = np.where(np.isfinite(new_w), new_w, 0.0)
        new_beta = _solve_lines(a_xt, a_y, new_w)
        # keep the previous solution where the reweighted one became singular
        new_beta = np.where(np.isnan(new_beta), a_beta, new_beta)
        new_resid = a_y - _fitted(a_xt, new_beta)
        with np.errstate(invalid="ignore"):
            moved = np.max(np.where(a_mask, np.abs(new_resid - a_resid), 0.0), axis=1)
        settled = (np.all(np.abs(new_w - a_w) <= 1e-6 + 1e-5 * np.abs(a_w), axis=1)
                   | (moved <= settle * a_scale))
        scale[active], weight[active], beta[active], resid[active] = a_scale, new_w, new_beta, new_resid
        keep = ~settled
        if keep.all():
            a_w, a_beta, a_resid = new_w, new_beta, new_resid
            continue
        active = active[keep]
        a_xt, a_y, a_mask, a_counts = a_xt[keep], a_y[keep], a_mask[keep], a_counts[keep]
        a_w, a_beta, a_resid = new_w[keep], new_beta[keep], new_resid[keep]
        a_floor = a_floor[keep]
    return beta, resid, scale, weight


def robust_grouped_fit(
    x: np.ndarray,
    y: np.ndarray,
    group: np.ndarray,
    n_groups: int,
    *,
    min_scale: float | np.ndarray = 1e-4,
    tuning: float = 4.685,
    iterations: int = 8,
    initial_weight: np.ndarray | None = None,
    settle: float = 1e-3,
) -> GroupFit:
    """Iteratively reweighted least squares with Tukey's biweight, per group.

    Rows are laid out per group in dense blocks (:class:`GroupLayout`); each
    iteration takes the residual scale from the group's median absolute
    deviation, reweights, and solves all groups' normal equations as one
    batched solve. A group stops once its weights no longer change or its
    fitted values move by less than ``settle`` times its residual scale.

    Parameters
    ----------
    min_scale : float or ndarray (n_groups,)
        Floor of the residual scale, so that near-perfect data do not turn
        rounding noise into outliers.
    tuning : float
        Biweight constant c; 4.685 gives 95 % efficiency for normal errors.
    initial_weight : ndarray (n,), optional
        Weights of the starting fit (0 for rows known to be gross blunders).

    References
    ----------
    .. [1] A. E. Beaton, J. W. Tukey, Technometrics 16, 147 (1974) (biweight).
    .. [2] P. J. Huber, E. M. Ronchetti, Robust Statistics, 2nd ed., Wiley (2009), ch. 7.
    """
    x = np.asarray(x, dtype=float)
    y = np.asarray(y, dtype=float)
    k = x.shape[1]
    layout = GroupLayout(group, n_groups)
    floor = np.broadcast_to(np.asarray(min_scale, dtype=float), (n_groups,))
    beta = np.full((n_groups, k), np.nan)
    scale = np.full(n_groups, np.nan)
    residuals, weights = [], []
    for gids, rows, mask, counts in layout.blocks:
        xt = np.where(mask[:, None, :], x[rows].transpose(0, 2, 1), 0.0)
        yd = np.where(mask, y[rows], 0.0)
        w0 = None if initial_weight is None else np.where(mask, initial_weight[rows], 0.0)
        b, r, sc, w = _robust_lines(xt, yd, mask, counts, w0, floor[gids], tuning, iterations, settle)
        beta[gids], scale[gids] = b, sc
        residuals.append(r)
        weights.append(w)
    return GroupFit(beta=beta, residual=layout.scatter(residuals), scale=scale,
                    weight=layout.scatter(weights, fill=0.0))
