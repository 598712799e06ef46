"""Plot data behind report.html: the run's fitted vapor-pressure curve, corrections, caps."""

from __future__ import annotations

import numpy as np
import pytest

from propcheck.report.figures import corrected_value


def _curve_line(fig, label):
    """The line of ``fig`` drawn with legend label ``label`` (legend labels are wrapped), else None."""
    lines = [line for line in fig.axes[0].get_lines() if line.get_label().replace("\n", " ") == label]
    assert len(lines) <= 1
    return lines[0] if lines else None


def test_drawn_curve_is_the_curve_the_rules_used():
    import matplotlib.pyplot as plt

    from propcheck.curves import curves
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data
    from propcheck.report.html import render_html
    from propcheck.report.plots import compound_figure
    from tests.conftest import SAMPLE_DB

    result = run_check(str(SAMPLE_DB))
    judged = result.db.cache["curves"]  # the object the vapor-pressure rules fitted and judged by
    data = build_report_data(result)
    assert curves(result.db) is judged  # the report did not refit
    where = judged.index()
    page = render_html(data)
    drawn = without = 0
    for panel in data.panels:
        g = where.get(panel.compound_id)
        fig = compound_figure(panel)
        try:
            lines = fig.axes[0].get_lines()
            if g is None or judged.fit.form_name(g) == "none":  # the run fitted no curve: points only
                assert panel.curve_label == "" and len(panel.curve_t) == 0
                assert len(panel.t) and lines and all(line.get_linestyle() == "None" for line in lines)
                without += 1
                continue
            label = judged.describe(g)
            line = _curve_line(fig, label)
            assert line is not None, (panel.compound_id, label)
            t = 1000.0 / np.asarray(line.get_xdata(), dtype=float)
            y = np.asarray(line.get_ydata(), dtype=float)
            assert len(t) >= 100
            np.testing.assert_allclose(y, judged.fit.ln_p(t, g), rtol=1e-9, atol=1e-9)
            # it spans the fitted points (those below tc) and, with tc known, runs on to tc
            fitted = panel.t[(panel.t > 0) & (panel.p > 0) & (panel.t < (panel.tc or np.inf))]
            assert t.min() == pytest.approx(fitted.min()) and t.max() >= fitted.max() - 1e-9
            if panel.tc:
                assert t.max() == pytest.approx(panel.tc)
            assert f"Curve: {label}," in page
            drawn += 1
        finally:
            plt.close(fig)
    assert drawn >= 5 and without >= 1  # the sample has both kinds of flagged compound


def test_drawn_curve_follows_iapws_water_despite_a_unit_slip(tmp_path):
    iapws97 = pytest.importorskip("iapws.iapws97")
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data
    from tests.conftest import write_db

    # water saturation pressures from IAPWS-IF97 (the iapws package), 300-600 K
    t = np.linspace(300.0, 600.0, 9)
    p = np.array([iapws97._PSat_T(x) * 1e6 for x in t])
    slipped = p.copy()
    slipped[4] /= 1000.0  # kPa entered as Pa
    # critical point of water: IAPWS R6-95 (2018), tc = 647.096 K, pc = 22.064 MPa
    compound = {"compound_id": "water", "name": "water", "tc": 647.096, "pc": 22.064e6}
    points = [{"compound_id": "water", "t": float(x), "p": float(y)} for x, y in zip(t, slipped)]
    data = build_report_data(run_check(str(write_db(tmp_path / "db", [compound], points))))
    (panel,) = [x for x in data.panels if x.compound_id == "water"]
    assert panel.flagged.tolist() == [i == 4 for i in range(len(t))]
    assert panel.curve_label.endswith("fit of 9 points (robust; 1 point set aside)")  # the slipped point
    # the drawn curve follows the published values, not the slip, from 300 K up to the critical point
    reference = np.array([iapws97._PSat_T(x) * 1e6 for x in np.minimum(panel.curve_t, 647.096)])
    np.testing.assert_allclose(np.exp(panel.curve_ln_p), reference, rtol=0.02)


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


def test_info_alone_flags_no_compound(tmp_path):
    """A compound whose only finding is info (no reference data) gets no panel and no place among the worst."""
    iapws97 = pytest.importorskip("iapws.iapws97")
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data
    from propcheck.report.html import render_html
    from tests.conftest import write_db

    # water saturation pressures from IAPWS-IF97 (the iapws package), 300-600 K
    t = np.linspace(300.0, 600.0, 9)
    p = np.array([iapws97._PSat_T(x) * 1e6 for x in t])
    slipped = p.copy()
    slipped[4] /= 1000.0  # kPa entered as Pa: a point finding
    # critical point of water: IAPWS R6-95 (2018), tc = 647.096 K, pc = 22.064 MPa
    compounds = [{"compound_id": "water", "name": "water", "tc": 647.096, "pc": 22.064e6},
                 # the same published curve under a name no compilation lists: reference-missing (info) only
                 {"compound_id": "inhouse-1", "name": "in-house coolant 1", "tc": 647.096, "pc": 22.064e6}]
    points = ([{"compound_id": "water", "t": float(x), "p": float(y)} for x, y in zip(t, slipped)]
              + [{"compound_id": "inhouse-1", "t": float(x), "p": float(y)} for x, y in zip(t, p)])
    data = build_report_data(run_check(str(write_db(tmp_path / "db", compounds, points))))
    mine = data.findings[data.findings["compound_id"] == "inhouse-1"]
    assert len(mine) and set(mine["severity"]) == {"info"}  # the premise: info findings only
    assert [p.compound_id for p in data.panels] == ["water"]
    assert [c for c, *_ in data.worst] == ["water"]
    assert data.n_flagged_compounds == 1 and data.n_compounds_with_findings == 2
    page = render_html(data)
    assert 'id="panel-water"' in page and 'id="panel-inhouse-1"' not in page


def test_free_fit_run_off_beyond_the_points_does_not_stretch_the_axis(tmp_path):
    import matplotlib.pyplot as plt

    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data
    from propcheck.report.figures import CURVE_MARGIN
    from propcheck.report.plots import compound_figure
    from tests.conftest import write_db

    # n-hexane saturation pressures from CoolProp 8.0.0 (reference EOS of Thol et al. 2019), 260-440 K;
    # Pc 3.025 MPa (IUPAC, Ambrose & Tsonopoulos 1995), Tb 341.87 K (CRC Handbook 95th ed.); Tc 507.6 K
    # (IUPAC) stored in degR: 507.6 * 1.8 = 913.68 (exact by definition), so the free fit runs on to 913.68 K
    vp = [(260.0, 2862.8), (280.0, 8623.1), (300.0, 21837.4), (320.0, 48231.8), (340.0, 95521.8),
          (360.0, 173271.8), (380.0, 292661.7), (400.0, 466276.6), (420.0, 708042.3), (440.0, 1033449.5)]
    compound = {"compound_id": "C1", "name": "n-hexane", "formula": "C6H14", "tc": 913.68, "pc": 3.025e6,
                "tb": 341.87, "omega": 0.300}
    points = [{"compound_id": "C1", "t": t, "p": p} for t, p in vp]
    result = run_check(str(write_db(tmp_path / "db", [compound], points)))
    (panel,) = [x for x in build_report_data(result).panels if x.compound_id == "C1"]
    assert panel.curve_label.startswith("Riedel")  # the premise: a free form, not anchored on (tc, pc)
    g = result.db.cache["curves"].index()["C1"]
    assert result.db.cache["curves"].fit.ln_p(np.array([913.68]), np.array([g]))[0] > 25  # it runs off by tc
    span = (np.log(vp[0][1]), np.log(3.025e6))  # lowest point, critical point
    reach = CURVE_MARGIN * (span[1] - span[0])
    # the curve is still drawn beyond the last point, but only while it stays near the data and anchors
    assert panel.curve_t.max() > 440.0 and panel.curve_ln_p.max() <= span[1] + reach + 1e-9
    fig = compound_figure(panel)
    try:
        low, high = fig.axes[0].get_ylim()
    finally:
        plt.close(fig)
    assert high - low <= 1.1 * (1 + CURVE_MARGIN) * (span[1] - span[0])  # matplotlib's 5 % margins each side
