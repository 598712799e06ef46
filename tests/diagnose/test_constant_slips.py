"""Published constants raise no error; every usual slip injected into them is found and diagnosed.

Check values: tests/published_constants.py (IUPAC critical series, CRC
Handbook 95th ed., reference equations of state).
Unit factors: SI brochure 2019 (exact); 1 atm = 101325 Pa, psi and mmHg as
in propcheck.physics.unit_slips (NIST SP 811).
"""

from __future__ import annotations

import csv

import pytest

from propcheck.pipeline import run_check
from tests.conftest import write_db
from tests.published_constants import compounds

MY_RULES = {
    "phase-order-violated", "tb-tc-ratio-out-of-band", "zc-inconsistent", "omega-out-of-range",
    "tb-off-corresponding-states", "off-family-trend", "molar-mass-off-formula", "formula-unparsable",
    "cas-names-other-compound", "name-shared-by-ids", "constants-copied",
}


def _run(tmp_path, rows):
    return run_check(str(write_db(tmp_path / "db", rows))).findings


def test_published_table_raises_no_error_or_warning(tmp_path):
    found = _run(tmp_path, compounds())
    mine = found[found["rule"].isin(MY_RULES)]
    assert not (mine["severity"].isin(["error", "warning"])).any(), mine[["rule", "compound_id", "column", "message"]].to_string()


def _transpose_tc(row):
    text = format(row["tc"], "g")
    for i in range(len(text) - 1):
        a, b = text[i], text[i + 1]
        if a.isdigit() and b.isdigit() and a != b and not (i == 0 and b == "0"):
            return float(text[:i] + b + a + text[i + 2:])
    raise AssertionError(text)


def _swap(a, b):
    def apply(row):
        row[a], row[b] = row[b], row[a]
    return apply


# kind -> (column the finding must name, corruption, text the suggestion must hold)
SLIPS = {
    "pc-kPa": ("pc", lambda r: r.update(pc=r["pc"] / 1e3), "kPa entered as Pa"),
    "pc-bar": ("pc", lambda r: r.update(pc=r["pc"] / 1e5), "bar entered as Pa"),
    "pc-MPa": ("pc", lambda r: r.update(pc=r["pc"] / 1e6), "MPa entered as Pa"),
    "pc-atm": ("pc", lambda r: r.update(pc=r["pc"] / 101325.0), "atm entered as Pa"),
    "pc-psi": ("pc", lambda r: r.update(pc=r["pc"] / 6894.757293168), "psi entered as Pa"),
    "pc-mmHg": ("pc", lambda r: r.update(pc=r["pc"] / 133.322387415), "mmHg entered as Pa"),
    "tc-degC": ("tc", lambda r: r.update(tc=r["tc"] - 273.15), "degC entered as K"),
    "tb-degF": ("tb", lambda r: r.update(tb=r["tb"] * 1.8 - 459.67), "degF entered as K"),
    "tc-degR": ("tc", lambda r: r.update(tc=r["tc"] * 1.8), "degR entered as K"),
    "M-kg-per-mol": ("molar_mass", lambda r: r.update(molar_mass=r["molar_mass"] / 1e3), "kg/mol entered as g/mol"),
    "vc-cm3-per-mol": ("vc", lambda r: r.update(vc=r["vc"] * 1e6), "cm3/mol entered as m3/mol"),
    "vc-L-per-mol": ("vc", lambda r: r.update(vc=r["vc"] * 1e3), "L/mol entered as m3/mol"),
    "tc-transposed": ("tc", lambda r: r.update(tc=_transpose_tc(r)), "transposed digits"),
    "omega-tenfold": ("omega", lambda r: r.update(omega=r["omega"] / 10), "decimal point shifted"),
    "tb-tc-swapped": ("tb", _swap("tb", "tc"), "swapped"),
    "tc-pc-swapped": ("tc", _swap("tc", "pc"), "swapped"),
}
VICTIMS = ["n-hexane", "toluene", "acetone", "ammonia"]


@pytest.mark.parametrize("victim", VICTIMS)
@pytest.mark.parametrize("kind", list(SLIPS))
def test_slip_found_on_its_column_with_its_diagnosis(tmp_path, victim, kind):
    column, corrupt, text = SLIPS[kind]
    rows = compounds()
    row = next(r for r in rows if r["name"] == victim)
    true_value = row[column]
    corrupt(row)
    found = _run(tmp_path, rows)
    hits = found[(found["compound_id"] == row["compound_id"]) & (found["column"] == column)]
    assert not hits.empty, found[["rule", "compound_id", "column", "message"]].to_string()
    diagnosed = hits[hits["suggestion"].fillna("").str.contains(text, regex=False)]
    assert not diagnosed.empty, hits[["rule", "message", "suggestion"]].to_string()
    corrected = diagnosed["corrected"].dropna().astype(float)
    assert not corrected.empty and corrected.iloc[0] == pytest.approx(true_value, rel=2e-3)
    # no other compound is blamed
    others = found[found["rule"].isin(MY_RULES) & (found["compound_id"] != row["compound_id"])
                   & found["compound_id"].notna() & found["severity"].eq("error")]
    assert others.empty, others[["rule", "compound_id", "column", "message"]].to_string()


def test_copied_constants_found_on_both_rows(tmp_path):
    rows = compounds()
    benzene = next(r for r in rows if r["name"] == "benzene")
    toluene = next(r for r in rows if r["name"] == "toluene")
    for key in ("tc", "pc", "omega"):
        toluene[key] = benzene[key]
    found = _run(tmp_path, rows)
    copied = found[found["rule"] == "constants-copied"]
    assert set(copied["compound_id"]) == {benzene["compound_id"], toluene["compound_id"]}
    # the copy breaks toluene's own consistency (tb against Lee-Kesler): toluene is blamed there, not benzene
    lk = found[found["rule"] == "tb-off-corresponding-states"]
    assert set(lk["compound_id"]) == {toluene["compound_id"]}


def test_corrections_csv_lists_each_repair_once(tmp_path, run_cli):
    rows = compounds()
    row = next(r for r in rows if r["name"] == "n-hexane")
    row["tc"] = 507.6 - 273.15  # degC entered as K
    folder = write_db(tmp_path / "db", rows)
    out = tmp_path / "out"
    result = run_cli("check", folder, "--out", out, "--quiet")
    assert result.code == 1
    with (out / "corrections.csv").open(encoding="utf-8") as handle:
        fixes = list(csv.DictReader(handle))
    assert [(f["compound_id"], f["column"]) for f in fixes] == [(row["compound_id"], "tc")]
    assert float(fixes[0]["proposed_value"]) == pytest.approx(507.6)
    assert float(fixes[0]["current_value"]) == pytest.approx(234.45)


def test_evidence_names_only_checks_that_could_judge(tmp_path):
    """Without vapor-pressure points or vc, the evidence claims no agreement with points or the Zc band."""
    # n-hexane: IUPAC tc 507.6 K stored in degC (234.45), pc 3.025 MPa; CRC tb 341.87 K; omega 0.300 (Thol 2019)
    rows = [{"compound_id": "C6", "name": "n-hexane", "cas": "110-54-3", "formula": "C6H14",
             "tc": 234.45, "pc": 3025000.0, "omega": 0.300, "tb": 341.87}]
    found = _run(tmp_path, rows)
    diagnosed = found[found["suggestion"].fillna("").str.contains("restores")]
    assert len(diagnosed), found[["rule", "suggestion"]].to_string()
    for text in diagnosed["suggestion"]:
        assert "corrected tc 507.6 K" in text
        assert "vapor-pressure points" not in text and "Zc band" not in text, text


def test_polar_means_o_n_f_or_s_atoms_not_letters(tmp_path):
    """The widened Lee-Kesler tolerance is for formulas with O, N, F or S atoms (common practice), by element."""
    from propcheck.diagnose import get_context
    from propcheck.load import load_database

    formulas = {"SiCl4": False, "SnCl4": False, "Ne": False, "NaCl": False, "CH4": False,
                "C2H6O": True, "NH3": True, "CHF3": True, "CS2": True, "SO2": True}
    rows = [{"compound_id": f"X{i}", "name": f"compound {i}", "formula": f} for i, f in enumerate(formulas)]
    ctx = get_context(load_database(str(write_db(tmp_path / "db", rows))))
    got = dict(zip(ctx.frame["formula"], ctx.polar.tolist()))
    assert got == formulas
