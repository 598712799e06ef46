"""``propcheck init`` on units variants of sample_db proposes the right names and units.

Variants are generated from sample_db with exact conversions (SI brochure,
BIPM 2019: t/degC = T/K - 273.15; 1 bar = 1e5 Pa; 1 kPa = 1e3 Pa;
1 mmHg = 101325/760 Pa, the conventional millimetre of mercury, ISO 80000-4).
"""

from __future__ import annotations

import tomllib

import duckdb
import pytest

from propcheck.load.propose import normalise_header
from propcheck.pipeline import run_check
from tests.conftest import SAMPLE_DB

MMHG = 101325.0 / 760.0  # Pa per mmHg, ISO 80000-4 (conventional)


def _variant(folder, tc, pc, p, names):
    """sample_db with tc/tb in K or degC, pc in Pa or bar, p in Pa, kPa or mmHg, renamed headers."""
    folder.mkdir()
    to_t = {"K": "", "degC": " - 273.15"}
    to_pc = {"Pa": "", "bar": " / 1e5"}
    to_p = {"Pa": "", "kPa": " / 1e3", "mmHg": f" / {MMHG!r}"}
    num = "TRY_CAST(trim({}) AS DOUBLE)"
    con = duckdb.connect()
    comp = SAMPLE_DB / "compounds.csv"
    vp = SAMPLE_DB / "vapor_pressure.csv"
    con.execute(
        f"""COPY (SELECT compound_id AS "{names['compound_id']}", name AS "{names['name']}", cas AS "{names['cas']}",
        molar_mass AS "{names['molar_mass']}", {num.format('tc')}{to_t[tc]} AS "{names['tc']}",
        {num.format('pc')}{to_pc[pc]} AS "{names['pc']}", {num.format('tb')}{to_t[tc]} AS "{names['tb']}"
        FROM read_csv('{comp}', all_varchar=true)) TO '{folder / 'master.csv'}'"""
    )
    con.execute(
        f"""COPY (SELECT compound_id AS "{names['compound_id']}", {num.format('t')}{to_t[tc]} AS "{names['t']}",
        {num.format('p')}{to_p[p]} AS "{names['p']}" FROM read_csv('{vp}', all_varchar=true))
        TO '{folder / 'vp_points.csv'}'"""
    )
    return folder


PLAIN = {"compound_id": "ID", "name": "Chemical", "cas": "CAS No.", "molar_mass": "MW", "tc": "Tcrit",
         "pc": "Pc", "tb": "NBP", "t": "Temp", "p": "Psat"}


@pytest.mark.parametrize(
    "tc, pc, p",
    [("K", "Pa", "Pa"), ("degC", "bar", "kPa"), ("degC", "bar", "mmHg"), ("K", "bar", "kPa"), ("degC", "Pa", "mmHg")],
)
def test_init_proposes_units_from_magnitudes(tmp_path, run_cli, tc, pc, p):
    folder = _variant(tmp_path / "db", tc, pc, p, PLAIN)
    out = tmp_path / "proposed.toml"
    result = run_cli("init", folder, "--out", out)
    assert result.code == 0, result.err
    doc = tomllib.loads(out.read_text())
    assert doc["compounds"]["table"] == "master" and doc["vapor_pressure"]["table"] == "vp_points"
    assert doc["compounds"]["columns"] == {"compound_id": "ID", "name": "Chemical", "cas": "CAS No.",
                                           "molar_mass": "MW", "tc": "Tcrit", "pc": "Pc", "tb": "NBP"}
    assert doc["vapor_pressure"]["columns"] == {"compound_id": "ID", "t": "Temp", "p": "Psat"}
    assert doc["compounds"]["units"] == {"molar_mass": "g/mol", "tc": tc, "pc": pc, "tb": tc}
    assert doc["vapor_pressure"]["units"] == {"t": tc, "p": p}


def test_init_reads_units_in_headers_and_mapping_gives_same_findings(tmp_path, run_cli):
    names = dict(PLAIN, tc="T_crit_C", pc="Pc (bar)", tb="Tb [C]", p="P_kPa", t="T (C)")
    folder = _variant(tmp_path / "db", "degC", "bar", "kPa", names)
    out = tmp_path / "proposed.toml"
    assert run_cli("init", folder, "--out", out).code == 0
    doc = tomllib.loads(out.read_text())
    assert doc["compounds"]["units"]["tc"] == "degC" and doc["compounds"]["units"]["pc"] == "bar"
    assert doc["vapor_pressure"]["units"] == {"t": "degC", "p": "kPa"}
    assert "unit written in the header" in out.read_text()
    converted = sorted(run_check(str(folder), str(out)).findings["finding_id"])
    # the same data in canonical units, only renamed: the findings must not change
    reference = _variant(tmp_path / "ref", "K", "Pa", "Pa", PLAIN)
    renames = tmp_path / "renames.toml"
    renames.write_text(
        '[compounds]\ntable = "master"\n[compounds.columns]\ncompound_id = "ID"\nname = "Chemical"\ncas = "CAS No."\n'
        'molar_mass = "MW"\ntc = "Tcrit"\npc = "Pc"\ntb = "NBP"\n'
        '[vapor_pressure]\ntable = "vp_points"\n[vapor_pressure.columns]\ncompound_id = "ID"\nt = "Temp"\np = "Psat"\n'
    )
    expected = sorted(run_check(str(reference), str(renames)).findings["finding_id"])
    assert expected and converted == expected


def test_check_never_guesses(tmp_path, run_cli):
    """Without a mapping, a renamed table is an error, not a silent guess."""
    folder = _variant(tmp_path / "db", "degC", "bar", "kPa", PLAIN)
    result = run_cli("check", folder, "--out", tmp_path / "o")
    assert result.code == 2 and "no 'compounds' table" in result.err


def test_init_refuses_to_overwrite(tmp_path, run_cli):
    out = tmp_path / "propcheck.toml"
    out.write_text("# mine\n")
    result = run_cli("init", SAMPLE_DB, "--out", out)
    assert result.code == 2 and "--force" in result.err
    assert out.read_text() == "# mine\n"


@pytest.mark.parametrize(
    "header, expected",
    [("Tc", ("tc", None)), ("Tcrit", ("tcrit", None)), ("T_crit_C", ("tcrit", "degC")), ("Pc (bar)", ("pc", "bar")),
     ("CAS No.", ("casno", None)), ("MW", ("mw", None)), ("Psat [mmHg]", ("psat", "mmHg"))],
)
def test_header_spellings(header, expected):
    assert normalise_header(header) == expected
