"""Saturation curves from CoolProp's reference equations of state raise no vapor-pressure finding.

Check data: CoolProp 8 (PropsSI) saturation pressures of 13 fluids across
families, each from its reference equation of state (Setzmann-Wagner methane
family papers as cited by CoolProp: IAPWS-95 water, Span-Wagner CO2, Span
2000 nitrogen, Gao 2020 ammonia, Thol 2019 n-hexane, ...), sampled from
max(triple point, 0.45 tc) to 0.97 tc with 0.2 % Gaussian scatter (realistic
for good static measurements: common practice). Critical constants are the
equations' reducing values; omega and tb as CoolProp computes them.
"""

from __future__ import annotations

import numpy as np
import pytest

from propcheck.pipeline import run_check
from tests.conftest import write_db
from tests.vapor_pressure import vp_findings

CP = pytest.importorskip("CoolProp.CoolProp")

FLUIDS = {
    "n-alkane": ["Propane", "n-Butane", "n-Hexane", "n-Decane"],
    "1-alkanol": ["Methanol", "Ethanol"],
    "aromatic": ["Benzene", "Toluene"],
    "ketone": ["Acetone"],
    "inorganic": ["Water", "Ammonia", "CarbonDioxide", "Nitrogen"],
    "refrigerant": ["R134a"],
}


def _database(points_per_fluid=25, scatter=0.002, seed=11):
    rng = np.random.default_rng(seed)
    compounds, points = [], []
    for family, names in FLUIDS.items():
        for name in names:
            tc, pc = CP.PropsSI("T_reducing", name), CP.PropsSI("p_reducing", name)
            tt = CP.PropsSI("Ttriple", name)
            p_triple = CP.PropsSI("P", "T", tt + 1e-3, "Q", 0, name)
            row = {"compound_id": name, "name": name, "family": family, "tc": tc, "pc": pc,
                   "omega": CP.PropsSI("acentric", name), "tm": tt}
            if p_triple < 101325.0:  # CO2 sublimes at 1 atm: no tb
                row["tb"] = CP.PropsSI("T", "P", 101325.0, "Q", 0, name)
            compounds.append(row)
            for t in np.linspace(max(tt + 0.1, 0.45 * tc), 0.97 * tc, points_per_fluid):
                p = CP.PropsSI("P", "T", t, "Q", 0, name) * (1 + scatter * rng.standard_normal())
                points.append({"compound_id": name, "t": round(t, 3), "p": float(f"{p:.6g}"), "uncertainty": 0.002 * p})
    return compounds, points


def test_reference_curves_raise_no_warning_or_error(tmp_path):
    compounds, points = _database()
    result = run_check(str(write_db(tmp_path / "db", compounds, points)))
    found = vp_findings(result, ("warning", "error"))
    assert found.empty, found[["rule", "compound_id", "message"]].to_string()


def test_reference_curves_with_one_blunder_each(tmp_path):
    compounds, points = _database()
    by_fluid = {}
    for i, point in enumerate(points):
        by_fluid.setdefault(point["compound_id"], []).append(i)
    corrupted = {}
    for k, (fluid, idx) in enumerate(sorted(by_fluid.items())):
        i = idx[5 + (k % 10)]
        points[i]["p"] = points[i]["p"] / 1000.0  # kPa entered as Pa
        corrupted[fluid] = points[i]["t"]
    result = run_check(str(write_db(tmp_path / "db", compounds, points)))
    found = result.findings[result.findings["rule"] == "vp-point-off-curve"]
    got = {(cid, round(t, 3)) for cid, t in zip(found["compound_id"], found["t"])}
    assert got == {(fluid, t) for fluid, t in corrupted.items()}
    assert found["suggestion"].str.contains("kPa entered as Pa").all()
