"""The vapor-pressure rules on water's saturation line from the iapws package (IAPWS-IF97).

Check values: IAPWS-IF97 region-4 saturation equation as implemented by the
`iapws` package (IAPWS R7-97(2012)); Tc 647.096 K, pc 22.064 MPa (IAPWS R2-83);
Tb 373.124 K at 101.325 kPa (IAPWS-95). The pipeline must raise nothing on
clean points and flag corrupted ones exactly where they were corrupted.
"""

from __future__ import annotations

import numpy as np
import pytest

from propcheck.pipeline import run_check
from tests.conftest import write_db
from tests.vapor_pressure import vp_findings

iapws97 = pytest.importorskip("iapws.iapws97")

WATER = {"compound_id": "H2O", "name": "water", "cas": "7732-18-5", "formula": "H2O",
         "tc": 647.096, "pc": 22064000.0, "tb": 373.124, "tm": 273.15}  # tm: ice point, common practice
T = np.linspace(275.0, 645.0, 38)


def _points():
    return [{"compound_id": "H2O", "t": float(t), "p": float(iapws97._PSat_T(t) * 1e6)} for t in T]


def test_if97_reference_value():
    # IAPWS R7-97(2012) verification table: p_s(300 K) = 3.53658941e-3 MPa
    assert iapws97._PSat_T(300.0) == pytest.approx(3.53658941e-3, rel=1e-8)


def test_clean_saturation_line_raises_nothing(tmp_path):
    result = run_check(str(write_db(tmp_path / "db", [WATER], _points())))
    found = vp_findings(result)
    assert found.empty, found[["rule", "message"]].to_string()


@pytest.mark.parametrize(
    ("index", "factor", "slip"),
    [(5, 1e-3, "kPa entered as Pa"), (17, 1e-5, "bar entered as Pa"), (30, 1 / 133.322387415, "mmHg entered as Pa"),
     (3, 1e3, "converted twice")],
)
def test_corrupted_point_found_where_corrupted(tmp_path, index, factor, slip):
    points = _points()
    true_p = points[index]["p"]
    points[index]["p"] = true_p * factor
    result = run_check(str(write_db(tmp_path / "db", [WATER], points)))
    found = vp_findings(result)
    # the point breaks the rise of p with T and lies off the fitted curve: both rules name it
    assert sorted(found["rule"]) == ["vp-falls-with-temperature", "vp-point-off-curve"], found[["rule", "message"]].to_string()
    assert found["t"].tolist() == pytest.approx([T[index]] * 2)
    for _, hit in found.iterrows():
        assert slip in hit["suggestion"]
        assert float(hit["expected"]) == pytest.approx(true_p, rel=0.05)


def test_point_beyond_critical_point(tmp_path):
    points = _points() + [{"compound_id": "H2O", "t": 660.0, "p": 2.3e7}]
    result = run_check(str(write_db(tmp_path / "db", [WATER], points)))
    found = vp_findings(result)
    assert found[["rule", "column", "t"]].values.tolist() == [["vp-beyond-critical-point", "t", 660.0]]
