"""Batched least squares against numpy's own solver, and robustness to one blunder."""

from __future__ import annotations

import numpy as np
import pytest

from propcheck.physics.grouped_fit import grouped_lstsq, robust_grouped_fit


def test_matches_numpy_lstsq_per_group():
    rng = np.random.default_rng(7)
    n_groups, per = 50, 12
    group = np.repeat(np.arange(n_groups), per)
    t = rng.uniform(250, 450, group.size)
    x = np.column_stack([np.ones_like(t), -1.0 / t, np.log(t)])
    y = rng.normal(size=group.size)
    beta = grouped_lstsq(x, y, group, n_groups)
    for g in (0, 17, 49):
        rows = group == g
        expected, *_ = np.linalg.lstsq(x[rows], y[rows], rcond=None)
        assert beta[g] == pytest.approx(expected, rel=1e-8, abs=1e-8)


def test_one_blunder_does_not_bend_the_fit():
    # Clausius-Clapeyron line ln p = a - b/T; one point 1000x low (kPa entered as Pa)
    t = np.linspace(300, 400, 10)
    a, b = 23.0, 4000.0
    y = a - b / t
    y[4] += np.log(1e-3)
    x = np.column_stack([np.ones_like(t), -1.0 / t])
    fit = robust_grouped_fit(x, y, np.zeros(10, dtype=int), 1)
    assert fit.beta[0] == pytest.approx([a, b], rel=1e-6)
    assert fit.weight[4] == 0.0
    assert abs(fit.residual[4] - np.log(1e-3)) < 1e-6


def test_singular_group_gives_nan():
    x = np.column_stack([np.ones(3), np.ones(3)])
    beta = grouped_lstsq(x, np.arange(3.0), np.zeros(3, dtype=int), 1)
    assert np.isnan(beta).all()


def test_blocks_give_the_same_fit(monkeypatch):
    """Cross products formed in blocks and fits run in blocks of compounds equal the one-pass results."""
    import propcheck.physics.grouped_fit as gf
    from propcheck.physics.vp_fit import fit_in_blocks, fit_vapor_pressure

    rng = np.random.default_rng(3)
    n_groups, per = 40, 9
    group = np.repeat(np.arange(n_groups), per)
    t = np.tile(np.linspace(300.0, 420.0, per), n_groups)
    p = np.exp(23.0 - 4000.0 / t) * (1 + 0.003 * rng.standard_normal(t.size))  # Clausius-Clapeyron curves
    tc = np.full(n_groups, np.nan)
    whole = fit_vapor_pressure(group, t, p, n_groups, tc, tc)
    monkeypatch.setattr(gf, "BLOCK_ROWS", 17)
    blocked = fit_in_blocks(group, t, p, n_groups, tc, tc, block_points=50)
    # the Riedel coefficients are strongly correlated: compare the curves, not the coefficients
    g = np.arange(n_groups)
    assert np.allclose(blocked.ln_p(350.0, g), whole.ln_p(350.0, g), rtol=0, atol=1e-9)
    assert np.allclose(blocked.residual, whole.residual, rtol=0, atol=1e-9)
    assert (blocked.form == whole.form).all()


def test_threads_give_the_same_fit():
    """Blocks of compounds fitted on two threads equal the same blocks fitted one after another."""
    from propcheck.physics.vp_fit import fit_in_blocks

    rng = np.random.default_rng(11)
    n_groups = 60
    sizes = rng.integers(3, 40, n_groups)  # ragged: every fitted form and several size classes
    group = np.repeat(np.arange(n_groups), sizes)
    t = np.concatenate([np.sort(rng.uniform(280.0, 480.0, k)) for k in sizes])
    # Clausius-Clapeyron curves of a typical organic liquid (A, B: order of magnitude, common practice); only
    # the two ways of running the same fit are compared, not a published value
    p = np.exp(23.0 - 4000.0 / t) * (1 + 0.002 * rng.standard_normal(t.size))
    p[5] *= 1000.0  # one unit slip: kPa entered as Pa (common practice)
    tc, pc = np.full(n_groups, 560.0), np.full(n_groups, 4.0e6)
    one = fit_in_blocks(group, t, p, n_groups, tc, pc, block_points=200, workers=1)
    two = fit_in_blocks(group, t, p, n_groups, tc, pc, block_points=200, workers=2)
    assert (one.form == two.form).all()
    assert np.array_equal(one.residual, two.residual, equal_nan=True)
    assert np.array_equal(one.weight, two.weight)
    assert one.weight[5] == 0.0  # the slipped point is rejected either way


def test_rows_in_any_order_give_the_same_fit():
    """Groups whose rows are interleaved are fitted as if each group's rows sat together."""
    rng = np.random.default_rng(5)
    n_groups, per = 30, 15
    group = np.repeat(np.arange(n_groups), per)
    t = rng.uniform(250, 450, group.size)
    x = np.column_stack([np.ones_like(t), -1.0 / t])
    y = 20.0 - 3500.0 / t + 0.01 * rng.standard_normal(t.size)
    y[::37] += 2.0  # blunders
    order = rng.permutation(group.size)
    together = robust_grouped_fit(x, y, group, n_groups, min_scale=1e-3)
    mixed = robust_grouped_fit(x[order], y[order], group[order], n_groups, min_scale=1e-3)
    assert np.allclose(mixed.beta, together.beta, rtol=1e-10, atol=1e-10)
    assert np.allclose(mixed.residual, together.residual[order], rtol=0, atol=1e-10)
    assert np.array_equal(mixed.weight == 0, together.weight[order] == 0)


@pytest.mark.parametrize("sorted_rows", [True, False])
def test_group_median_matches_numpy(sorted_rows):
    from propcheck.physics.grouped_fit import group_median

    rng = np.random.default_rng(2)
    n_groups = 25
    group = np.repeat(np.arange(n_groups), rng.integers(0, 30, n_groups))  # some groups empty
    values = rng.normal(size=group.size)
    values[rng.random(group.size) < 0.2] = np.nan  # left out
    if not sorted_rows:
        order = rng.permutation(group.size)
        group, values = group[order], values[order]
    got = group_median(values, group, n_groups)
    for g in range(n_groups):
        mine = values[(group == g) & ~np.isnan(values)]
        if len(mine):
            assert got[g] == pytest.approx(np.median(mine), abs=1e-12)
        else:
            assert np.isnan(got[g])


def test_group_blocks_cover_all_rows_without_splitting_a_group():
    from propcheck.physics.grouped_fit import group_blocks

    rng = np.random.default_rng(9)
    for _ in range(300):
        group = np.sort(rng.integers(0, rng.integers(1, 30), rng.integers(1, 200)))
        limit = int(rng.integers(1, 50))
        spans = group_blocks(group, limit)
        assert spans[0][0] == 0 and spans[-1][1] == len(group)
        assert all(hi == lo for (_, hi), (lo, _) in zip(spans[:-1], spans[1:]))
        for lo, hi in spans:
            assert hi > lo
            assert lo == 0 or group[lo] != group[lo - 1]
            # a span holds more than the limit only when it is one group
            assert hi - lo <= limit or group[lo] == group[hi - 1]
