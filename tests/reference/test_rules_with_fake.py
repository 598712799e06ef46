"""The reference rules against the fake reference (tests/fixtures/reference_small.json).

The fixture is an unchanged snapshot of chemicals 1.5.2 compilations and
CoolProp 8.0.0 for nine compounds (see make_reference_fixture.py). Database
values below are published values (sources named beside CLEAN).
"""

from __future__ import annotations

import json

import pytest

from propcheck.pipeline import run_check
from tests.conftest import write_db
from tests.reference.conftest import FIXTURE

RULES = ("identity-mismatch", "reference-missing", "const-off-reference", "vp-off-reference")

# Published values: IUPAC critical series (Ambrose & Tsonopoulos 1995 for
# n-hexane, Tsonopoulos & Ambrose 1995 for benzene), IAPWS R2-83 for water, Span et al. 2000 EOS for
# nitrogen; Tb from the CRC Handbook 95th ed. (water: IAPWS-95, 373.124 K); omega from the reference EOS.
CLEAN = [
    {"compound_id": "C1", "name": "n-hexane", "cas": "110-54-3", "formula": "C6H14", "molar_mass": 86.178,
     "tc": 507.6, "pc": 3025000, "tb": 341.87, "omega": 0.300, "zc": 0.264},
    {"compound_id": "C2", "name": "benzene", "cas": "71-43-2", "formula": "C6H6", "molar_mass": 78.114,
     "tc": 562.05, "pc": 4895000, "tb": 353.23, "omega": 0.211, "zc": 0.268},
    {"compound_id": "C3", "name": "water", "cas": "7732-18-5", "formula": "H2O", "molar_mass": 18.015,
     "tc": 647.096, "pc": 22064000, "tb": 373.124, "omega": 0.344, "zc": 0.229},
    {"compound_id": "C4", "name": "nitrogen", "cas": "7727-37-9", "formula": "N2", "molar_mass": 28.014,
     "tc": 126.192, "pc": 3395800, "tb": 77.355, "omega": 0.037, "zc": 0.289},
]
# Tb is where p_sat = 101325 Pa by definition (normal boiling point, common practice):
# n-hexane 341.87 K (CRC), water 373.124 K (IAPWS-95).
POINTS = [{"compound_id": "C1", "t": 341.87, "p": 101325}, {"compound_id": "C3", "t": 373.124, "p": 101325}]


def _run(tmp_path, compounds, points=None, pack=None):
    folder = write_db(tmp_path / "db", compounds, points)
    rules = None
    if pack:
        rules = tmp_path / "pack.toml"
        rules.write_text(pack, encoding="utf-8")
    found = run_check(str(folder), rules_path=str(rules) if rules else None).findings
    return found[found["rule"].isin(RULES)]


def test_published_values_raise_nothing(tmp_path, use_reference):
    use_reference()
    found = _run(tmp_path, CLEAN, POINTS)
    assert found.empty, found[["rule", "compound_id", "column", "message"]].to_string()


@pytest.mark.parametrize(
    ("compound", "column", "value", "consensus", "slip"),
    [
        ("C1", "tc", 234.45, 507.6, "degC entered as K"),   # 507.6 K stored in degC
        ("C1", "pc", 30250000.0, 3.025e6, "bar/MPa mix-up"),  # 3.025 MPa read 10x (x1000 slips are range errors)
        ("C2", "tb", 373.23, 353.23, None),                   # mistyped digit, +20 K
        ("C4", "omega", 0.37, 0.037, None),                   # decimal point moved
    ],
)
def test_injected_slip_is_an_error_naming_consensus_and_sources(tmp_path, use_reference, compound, column, value,
                                                                consensus, slip):
    use_reference()
    rows = [dict(r) for r in CLEAN]
    next(r for r in rows if r["compound_id"] == compound)[column] = value
    found = _run(tmp_path, rows)
    hit = found[(found["compound_id"] == compound) & (found["column"] == column)]
    assert list(hit["severity"]) == ["error"], found[["rule", "compound_id", "column", "message"]].to_string()
    rec = hit.iloc[0]
    assert float(rec["expected"]) == pytest.approx(consensus, rel=0.03)  # median of compilations, not one of them
    named = {"tc": "IUPAC critical-data series", "pc": "IUPAC critical-data series",
             "tb": "CRC Handbook 95th ed., physical constants", "omega": "PSRK parameter table"}[column]
    assert named in rec["message"] and "CoolProp EOS" in rec["message"]
    if slip:
        assert slip in rec["suggestion"]
    others = found[(found["compound_id"] != compound) | (found["column"] != column)]
    assert others.empty, others[["rule", "compound_id", "column", "message"]].to_string()


def test_a_compilation_with_a_slip_stands_apart(tmp_path, use_reference):
    doc = json.loads(FIXTURE.read_text(encoding="utf-8"))
    for row in doc["constants"]:  # corrupt one compilation: PSRK's n-hexane Tc read 10x (a known slip kind)
        if row["cas"] == "110-54-3" and row["property"] == "tc" and row["source"].startswith("PSRK"):
            row["value"] *= 10
    path = tmp_path / "corrupt.json"
    path.write_text(json.dumps(doc), encoding="utf-8")
    use_reference(path)
    assert _run(tmp_path, CLEAN).empty  # the correct database value is not blamed
    rows = [dict(r) for r in CLEAN]
    rows[0]["tc"] = 534.45  # n-hexane Tc mistyped by 26.85 K
    found = _run(tmp_path, rows)
    rec = found[(found["compound_id"] == "C1") & (found["column"] == "tc")].iloc[0]
    assert rec["severity"] == "error"
    assert "PSRK parameter table rev. 4 (Horstmann et al. 2005) stands apart" in rec["message"]
    assert float(rec["expected"]) == pytest.approx(507.6, abs=0.3)


def test_name_and_cas_of_different_isomers(tmp_path, use_reference):
    use_reference()
    rows = [{"compound_id": "X1", "name": "m-xylene", "cas": "106-42-3", "formula": "C8H10"}]  # 106-42-3 is p-xylene (CAS)
    found = run_check(str(write_db(tmp_path / "db", rows))).findings
    # one finding for the conflict: cas-names-other-compound's (identity-mismatch leaves it to that rule)
    assert found[found["rule"] == "identity-mismatch"].empty
    rec = found[found["rule"] == "cas-names-other-compound"]
    assert list(rec["severity"]) == ["warning"] and list(rec["column"]) == ["cas"]
    assert "p-xylene" in rec.iloc[0]["message"]  # 106-42-3 is p-xylene (CAS registry)


def test_identity_by_name_when_cas_missing_is_said(tmp_path, use_reference):
    use_reference()
    rows = [{"compound_id": "C1", "name": "n-hexane", "tc": 234.45}]  # no CAS; Tc in degC (507.6 K, IUPAC)
    found = _run(tmp_path, rows)
    info = found[found["rule"] == "identity-mismatch"].iloc[0]
    assert info["severity"] == "info" and "identified by name 'n-hexane' as CAS 110-54-3" in info["message"]
    err = found[found["rule"] == "const-off-reference"].iloc[0]
    assert "identified by name" in err["message"]


def test_formula_conflict_and_ambiguous_formula(tmp_path, use_reference):
    use_reference()
    rows = [
        {"compound_id": "C2", "name": "benzene", "cas": "71-43-2", "formula": "C6H12"},  # benzene is C6H6
        {"compound_id": "Y1", "name": "xylene isomer", "formula": "C8H10"},  # four C8H10 isomers in the fixture
    ]
    found = _run(tmp_path, rows)
    ident = found[found["rule"] == "identity-mismatch"].set_index("compound_id")
    assert ident.loc["C2", "column"] == "formula" and ident.loc["C2", "severity"] == "warning"
    assert "share it" in ident.loc["Y1", "message"] and ident.loc["Y1", "severity"] == "warning"


def test_missing_reference_is_info_only(tmp_path, use_reference):
    use_reference()
    rows = [
        {"compound_id": "T1", "name": "toluene", "cas": "108-88-3", "tc": 591.75},  # not in the fixture
        {"compound_id": "T2", "name": "Therminol 66", "tc": 600.0},  # a commercial mixture: no identity
    ]
    found = _run(tmp_path, rows)
    assert set(found["severity"]) == {"info"}
    assert set(found[found["rule"] == "reference-missing"]["compound_id"]) == {"T1", "T2"}


def test_vapor_pressure_slip_is_an_error(tmp_path, use_reference):
    use_reference()
    points = [{"compound_id": "C1", "t": 341.87, "p": 101.325}]  # 1 atm at the CRC Tb, stored in kPa
    found = _run(tmp_path, CLEAN, points)
    rec = found[found["rule"] == "vp-off-reference"].iloc[0]
    assert rec["severity"] == "error" and rec["column"] == "p" and float(rec["t"]) == pytest.approx(341.87)
    assert "kPa entered as Pa" in rec["suggestion"]
    assert float(rec["expected"]) == pytest.approx(101325, rel=0.01)
    assert "Poling et al. 2001 Antoine" in rec["message"] and "Wagner" in rec["message"]


def test_excluded_source_is_left_out(tmp_path, use_reference):
    use_reference()
    rows = [dict(CLEAN[0], tc=234.45)]
    pack = '[rules.const-off-reference]\nexclude_sources = ["IUPAC", "CoolProp"]\n'
    rec = _run(tmp_path, rows, pack=pack)
    rec = rec[rec["rule"] == "const-off-reference"].iloc[0]
    assert "IUPAC" not in rec["message"] and "CoolProp" not in rec["message"]


def test_only_points_the_reference_can_answer_are_fetched(tmp_path, use_reference):
    """Points of a compound without reference vapor pressures are not carried through the cross-check."""
    from propcheck.load import load_database
    from propcheck.reference import session
    from propcheck.reference.fake import FakeReference
    from propcheck.rules.pack import load_pack
    from propcheck.schema import run_schema_stage

    reference = FakeReference(FIXTURE)
    use_reference(reference)
    answerable = reference.vapor_pressure_cas()
    assert "110-54-3" in answerable  # n-hexane has vapor pressures in the fixture
    # formaldehyde, which the fixture does not hold; its constants only make a plausible row (from memory)
    unknown = {"compound_id": "X1", "name": "formaldehyde", "cas": "50-00-0", "formula": "CH2O", "molar_mass": 30.026,
               "tc": 408.0, "pc": 6590000, "tb": 254.0, "omega": 0.28}
    assert unknown["cas"] not in answerable
    points = POINTS + [{"compound_id": "X1", "t": 254.0, "p": 101325}]
    db = load_database(str(write_db(tmp_path / "db", CLEAN + [unknown], points)))
    pack = load_pack()
    run_schema_stage(db, pack)
    db.cache["pack"] = pack
    fetched, ref = session.vapor_pressure(db)
    assert "X1" not in set(fetched["compound_id"])  # nothing to compare it with
    assert {"C1", "C3"} <= set(fetched["compound_id"])  # n-hexane and water are compared
    assert not ref.empty
