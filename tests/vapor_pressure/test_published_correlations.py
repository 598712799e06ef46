"""Points from the published Antoine and Wagner sets carried by chemicals, corrupted one way at a time.

Check data: chemicals 1.5.2 tables ``Psat_data_AntoinePoling`` (Poling,
Prausnitz, O'Connell, The Properties of Gases and Liquids, 5th ed., App. A,
Antoine coefficients, Pa and K) and ``Psat_data_WagnerPoling`` (same book,
Wagner 2.5-5 coefficients with their own Tc, Pc). Points are generated
inside each correlation's Tmin..Tmax; each corruption must be found on the
corrupted point (or series, or constant) with the right suggestion.
"""

from __future__ import annotations

import numpy as np
import pytest

from propcheck.physics.vapor_pressure import antoine, wagner_25_5
from propcheck.pipeline import run_check
from tests.conftest import write_db
from tests.vapor_pressure import vp_findings

vp = pytest.importorskip("chemicals.vapor_pressure")

# n-hexane, toluene, acetone, ethanol, propane, benzene, n-octane, methanol (CAS)
CAS = ["110-54-3", "108-88-3", "67-64-1", "64-17-5", "74-98-6", "71-43-2", "111-65-9", "67-56-1"]


def _wagner_series(cas, n=10):
    row = vp.Psat_data_WagnerPoling.loc[cas]
    t = np.linspace(max(row.Tmin, 0.5 * row.Tc), 0.95 * row.Tc, n)
    p = wagner_25_5(t, row.Tc, row.Pc, row.A, row.B, row.C, row.D)
    compound = {"compound_id": cas, "name": row.Name, "tc": row.Tc, "pc": row.Pc}
    return compound, [{"compound_id": cas, "t": round(float(x), 3), "p": float(f"{y:.7g}")} for x, y in zip(t, p)]


def _antoine_series(cas, n=8):
    row = vp.Psat_data_AntoinePoling.loc[cas]
    t = np.linspace(row.Tmin, row.Tmax, n)
    p = antoine(t, row.A, row.B, row.C)
    compound = {"compound_id": cas, "name": row.Chemical}
    return compound, [{"compound_id": cas, "t": round(float(x), 3), "p": float(f"{y:.7g}")} for x, y in zip(t, p)]


SLIPS = [
    ("kPa", lambda p: p / 1e3, "kPa entered as Pa"),
    ("bar", lambda p: p / 1e5, "bar entered as Pa"),
    ("mmHg", lambda p: p / 133.322387415, "mmHg entered as Pa"),
    ("psi", lambda p: p / 6894.757293168, "psi entered as Pa"),
    ("atm", lambda p: p / 101325.0, "atm entered as Pa"),
    ("x1000", lambda p: p * 1e3, "converted twice"),
]


@pytest.mark.parametrize("cas", CAS)
@pytest.mark.parametrize("make", [_wagner_series, _antoine_series], ids=["wagner", "antoine"])
def test_clean_series_raise_nothing(tmp_path, cas, make):
    compound, points = make(cas)
    result = run_check(str(write_db(tmp_path / "db", [compound], points)))
    found = vp_findings(result)
    assert found.empty, found[["rule", "message"]].to_string()


@pytest.mark.parametrize("slip", SLIPS, ids=[s[0] for s in SLIPS])
@pytest.mark.parametrize("cas", CAS[:4])
@pytest.mark.parametrize("make", [_wagner_series, _antoine_series], ids=["wagner", "antoine"])
def test_point_slip_found_where_made(tmp_path, cas, slip, make):
    compound, points = make(cas)
    index = 3
    points[index]["p"] = slip[1](points[index]["p"])
    result = run_check(str(write_db(tmp_path / "db", [compound], points)))
    found = result.findings[result.findings["rule"] == "vp-point-off-curve"]
    assert found["t"].tolist() == [points[index]["t"]], result.findings[["rule", "message"]].to_string()
    assert slip[2] in found["suggestion"].iloc[0]


@pytest.mark.parametrize("cas", CAS[:4])
def test_temperature_in_degc_found(tmp_path, cas):
    compound, points = _wagner_series(cas)
    index = 6
    true_t = points[index]["t"]
    points[index]["t"] = round(true_t - 273.15, 3)
    result = run_check(str(write_db(tmp_path / "db", [compound], points)))
    found = result.findings[result.findings["rule"] == "vp-point-off-curve"]
    assert found["t"].tolist() == [points[index]["t"]]
    assert "degC entered as K" in found["suggestion"].iloc[0]
    assert f"{true_t:.6g}" in found["suggestion"].iloc[0]


@pytest.mark.parametrize("slip", SLIPS[:4], ids=[s[0] for s in SLIPS[:4]])
def test_whole_series_slip_is_one_finding(tmp_path, slip):
    # n-hexane: Tc 507.6 K, Pc 3.025 MPa (IUPAC 1995), omega 0.300 (Thol 2019 EOS), Tb 341.87 K (CRC)
    compound, points = _wagner_series("110-54-3")
    compound.update(tc=507.6, pc=3025000.0, omega=0.300, tb=341.87)
    for point in points:
        point["p"] = slip[1](point["p"])
    result = run_check(str(write_db(tmp_path / "db", [compound], points)))
    found = result.findings[result.findings["rule"] == "vp-series-scaled"]
    assert len(found) == 1 and found["severity"].iloc[0] == "error"
    assert slip[2] in found["suggestion"].iloc[0]
    assert not (result.findings["rule"] == "vp-point-off-curve").any()


def test_tb_in_degc_and_omega_decimal_slip(tmp_path):
    # n-hexane as above; tb stored in degC (68.72), omega with a decimal slip (0.0300)
    compound, points = _wagner_series("110-54-3")
    compound.update(tc=507.6, pc=3025000.0, omega=0.0300, tb=68.72)
    result = run_check(str(write_db(tmp_path / "db", [compound], points)))
    f = vp_findings(result).set_index("rule")
    assert "degC entered as K" in f.loc["tb-off-vp-curve", "suggestion"]
    assert float(f.loc["tb-off-vp-curve", "expected"]) == pytest.approx(341.87, abs=0.5)
    assert "decimal point slip" in f.loc["omega-off-vp-curve", "suggestion"]
    assert float(f.loc["omega-off-vp-curve", "expected"]) == pytest.approx(0.300, abs=0.01)


def test_transposed_tc_named_by_critical_endpoint(tmp_path):
    # benzene: Tc 562.05 K typed as 526.05 (IUPAC 1995 value; two adjacent digits swapped)
    compound, points = _wagner_series("71-43-2")
    compound.update(tc=526.05, pc=4895000.0)
    points = [p for p in points if p["t"] < 526.0]
    result = run_check(str(write_db(tmp_path / "db", [compound], points)))
    found = result.findings[result.findings["rule"] == "vp-curve-misses-critical-point"]
    assert found["column"].tolist() == ["tc"]
    assert "562.05" in found["suggestion"].iloc[0]
