"""Least squares for many small problems at once: one fit per group (compound).

Every group shares the same linear-in-parameters model ``y = X @ beta``; the
normal equations of all groups are accumulated with ``np.bincount`` and
solved as one batched ``np.linalg.solve``, so the cost is a few passes over
the rows whatever the number of compounds. The robust variant iterates
reweighted least squares with Tukey's biweight on residuals scaled by each
group's median absolute deviation, so that one blunder does not bend a fit.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

__all__ = ["GroupFit", "group_median", "grouped_lstsq", "robust_grouped_fit"]

BLOCK_ROWS = 1 << 20  # rows whose cross products are formed at once
MAD_TO_SIGMA = 1.482602218505602  # 1/Phi^-1(3/4): MAD of a normal sample -> sigma (common practice)


def group_median(values: np.ndarray, group: np.ndarray, n_groups: int) -> np.ndarray:
    """Median of ``values`` within each group (NaN for an empty group).

    Rows of one group that sit together (as in points sorted by compound) are
    laid out in a padded (groups x longest group) array and reduced with one
    ``nanmedian``; otherwise one ``lexsort`` orders all values.

    Examples
    --------
    >>> group_median(np.array([3.0, 1.0, 2.0, 10.0]), np.array([0, 0, 0, 1]), 3).tolist()
    [2.0, 10.0, nan]
    """
    values = np.asarray(values, dtype=float)
    counts = np.bincount(group, minlength=n_groups)
    starts = np.concatenate(([0], np.cumsum(counts)[:-1]))
    out = np.full(n_groups, np.nan)
    has = counts > 0
    longest = int(counts.max(initial=0))
    if len(group) and np.all(group[1:] >= group[:-1]) and n_groups * longest <= 4 * len(group) + 1024:
        padded = np.full((n_groups, longest), np.nan)
        padded[group, np.arange(len(group)) - starts[group]] = values
        with np.errstate(all="ignore"):
            import warnings

            with warnings.catch_warnings():
                warnings.simplefilter("ignore", RuntimeWarning)  # all-NaN rows of empty groups
                out[has] = np.nanmedian(padded[has], axis=1)
        return out
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


@dataclass
class GroupFit:
    """Result of a robust grouped fit."""

    beta: np.ndarray  # (n_groups, k)
    residual: np.ndarray  # (n,) y - X beta
    scale: np.ndarray  # (n_groups,) robust residual scale (sigma estimate)
    weight: np.ndarray  # (n,) final biweight weights, 0 for rejected rows


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
) -> GroupFit:
    """Iteratively reweighted least squares with Tukey's biweight, per group.

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
    xt = np.ascontiguousarray(x.T)
    w = np.ones(len(y)) if initial_weight is None else initial_weight
    beta = _lstsq_t(xt, y, group, n_groups, w)
    if initial_weight is not None:  # a group left singular by the start weights starts from all rows
        beta = np.where(np.isnan(beta), _lstsq_t(xt, y, group, n_groups), beta)
    scale = np.full(n_groups, np.nan)
    for _ in range(iterations):
        resid = y - np.einsum("nk,nk->n", x, beta[group])
        scale = np.maximum(MAD_TO_SIGMA * group_median(np.abs(resid), group, n_groups), min_scale)
        u = resid / (tuning * scale[group])
        new_w = np.where(np.abs(u) < 1.0, (1.0 - u**2) ** 2, 0.0)
        new_w = np.where(np.isfinite(new_w), new_w, 0.0)
        new_beta = _lstsq_t(xt, y, group, n_groups, new_w)
        # keep the previous solution where the reweighted one became singular
        new_beta = np.where(np.isnan(new_beta), beta, new_beta)
        converged = np.allclose(new_w, w, atol=1e-6)
        w, beta = new_w, new_beta
        if converged:
            break
    resid = y - np.einsum("nk,nk->n", x, beta[group])
    return GroupFit(beta=beta, residual=resid, scale=scale, weight=w)
