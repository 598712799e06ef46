"""Smooth trends along a homologous series, judged leave-one-out.

Along a homologous series Tc and Tb rise with shrinking steps and Pc falls
(Ambrose and Tsonopoulos 1995 give smooth recommendations against carbon
number). Each member is compared with a quadratic in ``x = ln n`` (n the
carbon number, or the molar mass) fitted through its nearest neighbours in
the same family, never through itself, so a wrong member cannot hide in its
own fit. All members of all families are solved at once (batched 3x3 normal
equations).
"""

from __future__ import annotations

import numpy as np

__all__ = ["loo_quadratic", "order_breaks", "trend_outliers"]


def _windows(group, x, pool, half_width):
    """Index matrix (n, 2h+1) of pool members nearest to each row in its group; -1 pads, self excluded."""
    n = len(x)
    pidx = np.flatnonzero(pool)
    order = pidx[np.lexsort((pidx, x[pidx], group[pidx]))]
    key_sorted = group[order] * 1e3 + x[order]
    key = group * 1e3 + x
    g_sorted = group[order]
    # family range [start, end) of each row inside the sorted pool
    start = np.searchsorted(g_sorted, group, side="left")
    end = np.searchsorted(g_sorted, group, side="right")
    position = np.full(n, -1)
    position[order] = np.arange(len(order))
    insert = np.searchsorted(key_sorted, key, side="left")
    inside = position >= 0
    # at most h pool members on each side, never shifted past the row
    offsets = np.arange(-half_width, half_width + 1)
    anchor = np.where(inside, position, insert)
    shift = np.where(inside[:, None], 0, (offsets[None, :] > 0).astype(int))
    cols = anchor[:, None] + offsets[None, :] - shift
    take = (offsets[None, :] != 0) & (cols >= start[:, None]) & (cols < end[:, None])
    cols = np.where(take, cols, 0)
    idx = np.where(take, order[cols] if len(order) else -1, -1)
    return idx


def loo_quadratic(group, x, y, pool, half_width: int = 3, min_points: int = 4, interior_only: bool = True):
    """Leave-one-out quadratic prediction of ``y`` at each row's ``x`` within its group.

    Parameters
    ----------
    group : ndarray of int
        Family code of each row.
    x, y : ndarray of float
        Abscissa (``ln n``) and the property.
    pool : ndarray of bool
        Rows that may serve as neighbours (finite ``y``, not excluded).
    half_width : int
        Neighbours taken on each side (<= 3 in the published method).
    min_points : int
        Fewest neighbours, with at least three distinct ``x``, for a prediction.

    Returns
    -------
    expected : ndarray
        Predicted ``y``; NaN where too few neighbours or where the row has no
        neighbour on one side (the ends of a series are not extrapolated: a
        quadratic in ln n misses ethane's Tc by 9 K from C3-C8).
    neighbours : ndarray of int, shape (n, 2h+1)
        Row indices of the neighbours used, -1 padded.

    Examples
    --------
    n-alkanes C2-C8, Tc (IUPAC, Ambrose and Tsonopoulos 1995): n-hexane
    predicted from its neighbours within 0.5 K of 507.6 K.

    >>> n = np.array([2, 3, 4, 5, 6, 7, 8.0])
    >>> tc = np.array([305.32, 369.83, 425.12, 469.7, 507.6, 540.2, 568.7])
    >>> exp, _ = loo_quadratic(np.zeros(7, int), np.log(n), tc, np.ones(7, bool))
    >>> bool(abs(exp[4] - 507.6) < 0.5)
    True
    """
    group = np.asarray(group)
    x = np.asarray(x, dtype=float)
    y = np.asarray(y, dtype=float)
    pool = np.asarray(pool, dtype=bool) & np.isfinite(x) & np.isfinite(y)
    idx = _windows(group, x, pool, half_width)
    used = idx >= 0
    safe = np.where(used, idx, 0)
    dx = np.where(used, x[safe] - x[:, None], 0.0)
    yy = np.where(used, y[safe], 0.0)
    w = used.astype(float)
    basis = np.stack([np.ones_like(dx), dx, dx * dx], axis=-1) * w[..., None]
    normal = np.einsum("nki,nkj->nij", basis, basis)
    rhs = np.einsum("nki,nk->ni", basis, yy)
    sorted_dx = np.sort(np.where(used, dx, np.inf), axis=1)
    with np.errstate(invalid="ignore"):
        distinct = (np.diff(sorted_dx, axis=1) > 1e-9) & np.isfinite(sorted_dx[:, 1:])
    n_distinct = np.where(used.any(axis=1), 1 + distinct.sum(axis=1), 0)
    interior = (used & (dx < 0)).any(axis=1) & (used & (dx > 0)).any(axis=1)
    ok = (used.sum(axis=1) >= min_points) & (n_distinct >= 3) & np.isfinite(x) & (interior | (not interior_only))
    normal[~ok] = np.eye(3)
    rhs[~ok] = 0.0
    coef = np.linalg.solve(normal, rhs[..., None])[..., 0]
    expected = np.where(ok, coef[:, 0], np.nan)
    return expected, np.where(ok[:, None], idx, -1)


def trend_outliers(group, x, y, valid, tol, half_width: int = 3, min_points: int = 4):
    """Members off their family's leave-one-out trend, blaming the worst first.

    Pass 1 predicts every member from its neighbours; members beyond ``tol``
    whose misfit is the largest in their window are suspects. Pass 2 predicts
    again with the suspects removed from every neighbour pool, so that one
    wrong member does not make its neighbours look wrong.

    Parameters
    ----------
    tol : float or ndarray
        Accepted |y - expected| per row.

    Returns
    -------
    expected, z, neighbours
        Prediction, |y - expected| / tol, and neighbour indices (pass 2).
    """
    y = np.asarray(y, dtype=float)
    valid = np.asarray(valid, dtype=bool) & np.isfinite(y)
    tol = np.broadcast_to(np.asarray(tol, dtype=float), y.shape)
    expected, nb = loo_quadratic(group, x, y, valid, half_width, min_points)
    z = np.abs(y - expected) / tol
    z1 = np.where(valid & np.isfinite(z), z, 0.0)
    neighbour_z = np.where(nb >= 0, z1[np.where(nb >= 0, nb, 0)], 0.0).max(axis=1)
    suspect = (z1 > 1.0) & (z1 >= neighbour_z)
    # ends of a series: extrapolated, so only a gross misfit makes them suspect
    outer, _ = loo_quadratic(group, x, y, valid & ~suspect, half_width, 3, interior_only=False)
    z_end = np.abs(y - outer) / tol
    suspect |= valid & ~np.isfinite(expected) & np.isfinite(z_end) & (z_end > 10.0)
    expected, nb = loo_quadratic(group, x, y, valid & ~suspect, half_width, min_points)
    z = np.where(valid, np.abs(y - expected) / tol, np.nan)
    return expected, z, nb


def order_breaks(group, x, y, valid, rising: bool = True):
    """Members that break a family's monotonic order on every side they have a neighbour.

    Isomers (equal ``x``) are collapsed to their median; a member breaks on
    the left when it does not exceed the previous carbon number's median
    (rising) and on the right when it does not stay below the next one's.
    One wrong member breaks on both sides, its neighbours on one side only.

    Returns
    -------
    breaks : ndarray of bool
    any_side : ndarray of bool
        Out of order with at least one neighbour (one of a broken pair).
    previous, following : ndarray of float
        Medians of the neighbouring carbon numbers (NaN at the ends).

    Examples
    --------
    n-alkanes C6-C10 normal boiling points (CRC Handbook 95th ed.) with
    n-decane's 447.25 K stored in degC (174.1):

    >>> tb = np.array([341.87, 371.53, 398.77, 423.95, 174.1])
    >>> b, _, _, _ = order_breaks(np.zeros(5, int), np.log([6, 7, 8, 9, 10.0]), tb, np.ones(5, bool))
    >>> b.tolist()
    [False, False, False, False, True]
    """
    import pandas as pd

    y = np.asarray(y, dtype=float)
    sign = 1.0 if rising else -1.0
    valid = np.asarray(valid, dtype=bool) & np.isfinite(y) & np.isfinite(x)
    frame = pd.DataFrame({"g": np.asarray(group), "x": np.round(np.asarray(x, dtype=float), 9), "y": sign * y})[valid]
    levels = frame.groupby(["g", "x"])["y"].median().reset_index().sort_values(["g", "x"])
    levels["prev"] = levels.groupby("g")["y"].shift(1)
    levels["next"] = levels.groupby("g")["y"].shift(-1)
    merged = frame.reset_index().merge(levels[["g", "x", "prev", "next"]], on=["g", "x"]).set_index("index")
    left = merged["prev"].notna()
    right = merged["next"].notna()
    bad_left = left & (merged["y"] <= merged["prev"])
    bad_right = right & (merged["y"] >= merged["next"])
    breaks_frame = (left | right) & (bad_left | ~left) & (bad_right | ~right)
    breaks = np.zeros(len(y), dtype=bool)
    any_side = np.zeros(len(y), dtype=bool)
    previous = np.full(len(y), np.nan)
    following = np.full(len(y), np.nan)
    idx = merged.index.to_numpy()
    breaks[idx] = breaks_frame.to_numpy()
    any_side[idx] = (bad_left | bad_right).to_numpy()
    previous[idx] = sign * merged["prev"].to_numpy(dtype=float)
    following[idx] = sign * merged["next"].to_numpy(dtype=float)
    return breaks, any_side, previous, following
