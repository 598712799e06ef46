"""Plot data behind report.html: the robust vapor-pressure fit, corrections, caps."""

from __future__ import annotations

import numpy as np
import pytest

from propcheck.report.figures import _fit, corrected_value, fit_ln_p


def test_robust_fit_ignores_a_unit_slip():
    iapws97 = pytest.importorskip("iapws.iapws97")
    # water saturation pressures from IAPWS-IF97 (the iapws package), 300-600 K
    t = np.linspace(300.0, 600.0, 9)
    p = np.array([iapws97._PSat_T(x) * 1e6 for x in t])
    slipped = p.copy()
    slipped[4] /= 1000.0  # kPa entered as Pa
    beta, form = _fit(t, slipped, np.zeros(len(t), dtype=int), 1)
    assert form[0].startswith("ln p = A + B/T + C ln T")
    predicted = np.exp(fit_ln_p(beta[0], t))
    assert predicted[4] == pytest.approx(p[4], rel=0.02)  # the fit follows the good points, not the slip
    good = np.arange(len(t)) != 4
    assert np.allclose(predicted[good], p[good], rtol=0.02)


def test_two_constant_fit_for_few_points():
    # three IAPWS-IF97 verification values (IAPWS-IF97, Table 35): 300 K, 500 K, 600 K
    t = np.array([300.0, 500.0, 600.0])
    p = np.array([3536.58941, 2638897.76, 12344314.6])
    beta, form = _fit(t, p, np.zeros(3, dtype=int), 1)
    assert "Clausius-Clapeyron" in form[0] and beta[0][2] == 0.0
    assert np.all(np.diff(fit_ln_p(beta[0], t)) > 0)


def test_corrected_value_parsing():
    assert corrected_value("value is 0.001x: kPa entered as Pa? corrected 1.0325e+05 Pa") == pytest.approx(103250.0)
    assert corrected_value("tb looks like degC corrected tb 447.25 K") == pytest.approx(447.25)
    assert corrected_value(None) is None


def test_panel_cap_and_svg(tmp_path):
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data
    from propcheck.report.plots import compound_svg
    from tests.conftest import SAMPLE_DB

    data = build_report_data(run_check(str(SAMPLE_DB)), panel_cap=3)
    assert len(data.panels) == 3 and data.n_flagged_compounds > 3
    order = [c for c, *_ in data.worst]
    assert [p.compound_id for p in data.panels] == [c for c in order if c in {p.compound_id for p in data.panels}][:3]
    svg = compound_svg(data.panels[0])
    assert svg.startswith("<svg") and "<path" in svg and "http://purl.org" not in svg
    assert data.families and any(f.n_flagged for f in data.families)
