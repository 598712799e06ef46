"""The reference rules with the real libraries (chemicals 1.5.2 compilations, CoolProp 8.0.0).

Check values: references note section 3 (the shared scientific note), whose
sources are, per compound, the IUPAC critical-data series (Parts 2, 3, 4, 7:
Ambrose & Tsonopoulos 1995, Tsonopoulos & Ambrose 1995, Gude & Teja 1995,
Kudchadker et al. 2001) or the reference EOS named in the comment for Tc and
Pc; the CRC Handbook 95th ed. for Tb; the reference EOS (else PSRK,
Horstmann 2005) for omega; IUPAC 2021 conventional atomic weights for M.
"""

from __future__ import annotations

import numpy as np
import pandas as pd
import pytest

from propcheck.pipeline import run_check
from propcheck.reference import default_reference, set_reference
from tests.conftest import write_db

RULES = ("identity-mismatch", "reference-missing", "const-off-reference", "vp-off-reference")

# name, CAS, M [g/mol], Tc [K], Pc [MPa], Tb [K], omega, Zc  -- references note section 3
SECTION3 = [
    ("methane", "74-82-8", 16.043, 190.564, 4.599, 111.65, 0.0114, 0.286),         # I2 / Setzmann 1991 EOS
    ("ethane", "74-84-0", 30.070, 305.32, 4.872, 184.55, 0.099, 0.279),            # I2 / Buecker 2006 EOS
    ("propane", "74-98-6", 44.097, 369.83, 4.248, 231.04, 0.152, 0.277),           # I2 / Lemmon 2009 EOS
    ("n-butane", "106-97-8", 58.124, 425.12, 3.796, 272.65, 0.201, 0.274),         # I2 / Buecker 2006 EOS
    ("n-pentane", "109-66-0", 72.151, 469.7, 3.370, 309.21, 0.251, 0.268),         # I2 / Thol 2019 EOS
    ("n-hexane", "110-54-3", 86.178, 507.6, 3.025, 341.87, 0.300, 0.264),          # I2 / Thol 2019 EOS
    ("n-heptane", "142-82-5", 100.205, 540.2, 2.740, 371.53, 0.349, 0.261),        # I2 / Span 2003 EOS
    ("n-octane", "111-65-9", 114.232, 568.7, 2.490, 398.77, 0.398, 0.259),         # I2 / Beckmueller 2019 EOS
    ("n-decane", "124-18-5", 142.286, 617.7, 2.110, 447.25, 0.488, 0.256),         # Lemmon 2006 EOS, I2 Pc
    ("methanol", "67-56-1", 32.042, 512.5, 8.084, 337.65, 0.565, 0.223),           # I4 / de Reuck 1993 EOS
    ("ethanol", "64-17-5", 46.069, 514.0, 6.137, 351.39, 0.644, 0.241),            # I4 / Schroeder 2014 EOS
    ("1-propanol", "71-23-8", 60.096, 536.8, 5.169, 370.19, 0.624, 0.252),         # I4 / PSRK
    ("1-butanol", "71-36-3", 74.123, 563.0, 4.414, 390.75, 0.590, 0.258),          # I4 / PSRK
    ("benzene", "71-43-2", 78.114, 562.05, 4.895, 353.23, 0.211, 0.268),           # I3 / Thol 2012 EOS
    ("toluene", "108-88-3", 92.141, 591.75, 4.108, 383.75, 0.266, 0.264),          # I3 / Lemmon 2006 EOS
    ("ethylbenzene", "100-41-4", 106.168, 617.15, 3.609, 409.35, 0.304, 0.263),    # I3 / Zhou 2012 EOS
    ("p-xylene", "106-42-3", 106.168, 616.2, 3.511, 411.45, 0.324, 0.259),         # I3 / Zhou 2012 EOS
    ("acetone", "67-64-1", 58.080, 508.1, 4.700, 329.23, 0.307, 0.237),            # I7 / Lemmon 2006 EOS
    ("2-butanone", "78-93-3", 72.107, 536.7, 4.207, 352.75, 0.329, 0.252),         # I7 / PSRK
    ("water", "7732-18-5", 18.015, 647.096, 22.064, 373.124, 0.344, 0.229),        # IAPWS R2-83 / IAPWS-95
    ("ammonia", "7664-41-7", 17.031, 405.56, 11.363, 239.82, 0.256, 0.246),        # Gao 2020 EOS
    ("carbon dioxide", "124-38-9", 44.009, 304.128, 7.3773, None, 0.224, 0.275),   # Span 1996 EOS; sublimes
    ("nitrogen", "7727-37-9", 28.014, 126.192, 3.3958, 77.355, 0.037, 0.289),      # Span 2000 EOS
    ("hydrogen sulfide", "7783-06-4", 34.076, 373.1, 9.000, 212.85, 0.100, 0.285), # Lemmon 2006 EOS
]


def _rows():
    rows = []
    for i, (name, cas, m, tc, pc, tb, omega, zc) in enumerate(SECTION3, start=1):
        row = {"compound_id": f"S{i:02d}", "name": name, "cas": cas, "molar_mass": m, "tc": tc, "pc": pc * 1e6,
               "omega": omega, "zc": zc}
        if tb is not None:
            row["tb"] = tb
        rows.append(row)
    return rows


@pytest.fixture(autouse=True)
def real_reference():
    set_reference(None)
    yield default_reference()


def _run(tmp_path, rows, points=None, pack=None):
    folder = write_db(tmp_path / "db", rows, points)
    rules = None
    if pack:
        rules = tmp_path / "pack.toml"
        rules.write_text(pack, encoding="utf-8")
    found = run_check(str(folder), rules_path=str(rules) if rules else None).findings
    return found[found["rule"].isin(RULES)]


def test_section3_values_raise_nothing(tmp_path):
    found = _run(tmp_path, _rows())
    assert found.empty, found[["rule", "compound_id", "column", "message"]].to_string()


@pytest.mark.parametrize(
    ("index", "column", "factor", "offset", "consensus"),
    [
        (5, "tc", 1.0, -273.15, 507.6),   # n-hexane Tc stored in degC
        (13, "pc", 10.0, 0.0, 4.895e6),   # benzene Pc x10 (bar/MPa mix-up)
        (19, "tb", 1.0, 0.026, 373.124),  # water: no error for 373.15 (IPTS-68 / rounding) ...
        (9, "tb", 1.0, 20.0, 337.65),     # methanol Tb mistyped +20 K
        (16, "omega", 1.0, 0.2, 0.324),   # p-xylene omega mistyped 0.524 (z 7 with u 0.02 each)
        (6, "molar_mass", 1.0, 1.008, 100.205),  # n-heptane with one H too many
    ],
)
def test_section3_with_a_slip(tmp_path, index, column, factor, offset, consensus):
    rows = _rows()
    rows[index][column] = rows[index][column] * factor + offset
    found = _run(tmp_path, rows)
    hit = found[(found["compound_id"] == rows[index]["compound_id"]) & (found["column"] == column)]
    if offset == 0.026:  # 373.15 K is within a boiling point's uncertainty of 373.124 K (references note C8)
        assert hit.empty
        return
    assert list(hit["severity"]) == ["error"], found[["compound_id", "column", "message"]].to_string()
    rec = hit.iloc[0]
    assert float(rec["expected"]) == pytest.approx(consensus, rel=0.01)
    assert "sources disagree" in rec["message"] and "Sources:" in rec["message"]
    assert rec["reference"].startswith("consensus of: ")
    assert len(rec["reference"].split(", ")) >= 2


def test_water_saturation_pressure_if97_points(tmp_path):
    # IAPWS-IF97 verification values (references note section 3): p_s(300 K) 3.53658941 kPa,
    # p_s(500 K) 2.63889776 MPa, p_s(600 K) 12.3443146 MPa
    rows = [r for r in _rows() if r["name"] == "water"]
    points = [{"compound_id": rows[0]["compound_id"], "t": t, "p": p}
              for t, p in ((300.0, 3536.58941), (500.0, 2.63889776e6), (600.0, 12.3443146e6))]
    assert _run(tmp_path, rows, points).empty
    points[1]["p"] = 2638.89776  # the 500 K point stored in kPa
    found = _run(tmp_path, rows, points)
    rec = found[found["rule"] == "vp-off-reference"]
    assert list(rec["t"].astype(float)) == [500.0] and list(rec["severity"]) == ["error"]
    assert "CoolProp EOS (Wagner-JPCRD-2002)" in rec.iloc[0]["message"]


def test_database_built_from_one_compilation(real_reference):
    """The IUPAC critical-data series, values unchanged, cross-checked against the others.

    Errors must be rare and each one backed by at least two other sources
    disagreeing beyond their uncertainties (the compilations' own spread,
    references note C18: 24 of 688 compounds differ > 3 K in Tc between IUPAC and CRC).
    """
    import chemicals.critical as critical
    from propcheck.database import Database
    from propcheck.rules import const_off_reference
    from propcheck.rules.pack import load_pack
    import duckdb

    iupac = critical.critical_data_IUPAC.reset_index()
    frame = pd.DataFrame({
        "_row": np.arange(1, len(iupac) + 1), "compound_id": [f"I{i:04d}" for i in range(len(iupac))],
        "name": iupac["Chemical"], "cas": iupac["CAS"], "formula": None, "source": "IUPAC",
        "molar_mass": iupac["MW"], "tc": iupac["Tc"], "pc": iupac["Pc"], "vc": iupac["Vc"], "zc": iupac["Zc"],
    })
    con = duckdb.connect()
    con.register("frame", frame)
    con.execute("CREATE TABLE compounds AS SELECT * FROM frame")
    db = Database(con=con, source="IUPAC", kind="test")
    params = dict(load_pack().params("const-off-reference"), exclude_sources=["IUPAC critical-data series"])
    found = pd.DataFrame([f.__dict__ for f in const_off_reference.check(db, params)])
    errors = found[found["severity"] == "error"]
    assert 0 < errors["compound_id"].nunique() < 0.05 * len(frame)  # real disagreements exist, but few
    assert all(int(m.split(" of ")[0].rsplit("; ", 1)[-1]) >= 2 for m in errors["message"])
