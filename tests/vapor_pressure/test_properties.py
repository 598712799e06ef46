"""Property-based checks of the point-outlier rule on published curves (hypothesis).

Curves: the Antoine set of Poling, Prausnitz, O'Connell, The Properties of
Gases and Liquids, 5th ed., App. A, as carried by chemicals 1.5.2
(``Psat_data_AntoinePoling``), evaluated inside each compound's Tmin..Tmax.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from propcheck.physics.vapor_pressure import antoine
from propcheck.pipeline import run_check
from propcheck.rules.registry import all_rules
from tests.conftest import write_db

vp = pytest.importorskip("chemicals.vapor_pressure")
TABLE = vp.Psat_data_AntoinePoling
FACTORS = [1e-3, 1e-5, 1e-6, 1 / 101325.0, 1 / 133.322387415, 1 / 6894.757293168, 1e3]


def _only(rule_id: str, folder) -> str:
    """A rule pack that runs one rule (and the loading checks), to keep each example fast."""
    path = folder / "only.toml"
    lines = [f"[rules.{rid}]\nenabled = false\n" for rid, rule in all_rules().items()
             if rule.check is not None and rid != rule_id]
    path.write_text("\n".join(lines))
    return str(path)


def _points(index, n):
    row = TABLE.iloc[index]
    t = np.linspace(row.Tmin, row.Tmax, n)
    return row, t, antoine(t, row.A, row.B, row.C)


SETTINGS = settings(max_examples=40, deadline=None, derandomize=True, suppress_health_check=[HealthCheck.function_scoped_fixture])


@SETTINGS
@given(index=st.integers(0, len(TABLE) - 1), n=st.integers(6, 14), scatter=st.sampled_from([0.0, 0.001, 0.003]),
       seed=st.integers(0, 2**16))
def test_smooth_published_curve_raises_no_point_finding(tmp_path_factory, index, n, scatter, seed):
    row, t, p = _points(index, n)
    p = p * (1 + scatter * np.random.default_rng(seed).standard_normal(n))
    folder = tmp_path_factory.mktemp("db")
    points = [{"compound_id": "X", "t": float(a), "p": float(b)} for a, b in zip(t, p)]
    result = run_check(str(write_db(folder / "db", [{"compound_id": "X", "name": row.Chemical}], points)),
                       rules_path=_only("vp-point-off-curve", folder))
    assert (result.findings["rule"] != "vp-point-off-curve").all(), result.findings["message"].tolist()


@SETTINGS
@given(index=st.integers(0, len(TABLE) - 1), n=st.integers(7, 14), which=st.integers(0, 100),
       factor=st.sampled_from(FACTORS))
def test_single_point_times_unit_factor_is_found(tmp_path_factory, index, n, which, factor):
    row, t, p = _points(index, n)
    k = 1 + which % (n - 2)  # an interior point
    p = p.copy()
    p[k] *= factor
    folder = tmp_path_factory.mktemp("db")
    points = [{"compound_id": "X", "t": float(a), "p": float(b)} for a, b in zip(t, p)]
    result = run_check(str(write_db(folder / "db", [{"compound_id": "X", "name": row.Chemical}], points)),
                       rules_path=_only("vp-point-off-curve", folder))
    found = result.findings[result.findings["rule"] == "vp-point-off-curve"]
    assert found["t"].tolist() == pytest.approx([t[k]]), (row.Chemical, found["message"].tolist())
