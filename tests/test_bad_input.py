"""Unusable input or options: exit 2 and one line naming the place; bad cells: findings."""

from __future__ import annotations

import json

from tests.conftest import assert_usage_error, write_db, write_table

# n-hexane Tc 507.6 K, Pc 3.025 MPa (IUPAC, Ambrose & Tsonopoulos 1995), Tb 341.87 K (CRC 95th ed.)
HEXANE = {"compound_id": "C6", "name": "n-hexane", "tc": 507.6, "pc": 3025000.0, "tb": 341.87}


def test_missing_path(run_cli, tmp_path):
    result = run_cli("check", tmp_path / "nowhere", "--out", tmp_path / "out")
    assert_usage_error(result, "nowhere", "no such file or folder")


def test_unknown_format(run_cli, tmp_path):
    path = tmp_path / "data.txt"
    path.write_text("hello")
    assert_usage_error(run_cli("check", path, "--out", tmp_path / "out"), "data.txt", "unknown source format")


def test_empty_sqlite_file(run_cli, tmp_path):
    path = tmp_path / "props.sqlite"
    path.write_bytes(b"")
    assert_usage_error(run_cli("check", path, "--out", tmp_path / "out"), "props.sqlite", "SQLite")


def test_folder_without_compounds(run_cli, tmp_path):
    write_table(tmp_path / "db", "vapor_pressure", [{"compound_id": "C6", "t": 300.0, "p": 1000.0}])
    assert_usage_error(run_cli("check", tmp_path / "db", "--out", tmp_path / "out"), "table compounds", "no 'compounds' table")


def test_missing_required_column(run_cli, tmp_path):
    write_table(tmp_path / "db", "compounds", [{"compound_id": "C6", "tc": 507.6}], columns=["compound_id", "tc"])
    result = run_cli("check", tmp_path / "db", "--out", tmp_path / "out")
    assert_usage_error(result, "compounds.csv", "table compounds", "column name", "required column missing")


def test_empty_table(run_cli, tmp_path):
    folder = tmp_path / "db"
    write_table(folder, "compounds", [], columns=["compound_id", "name"])
    assert_usage_error(run_cli("check", folder, "--out", tmp_path / "out"), "compounds.csv", "no rows")


def test_empty_file(run_cli, tmp_path):
    folder = tmp_path / "db"
    folder.mkdir()
    (folder / "compounds.csv").write_text("")
    assert_usage_error(run_cli("check", folder, "--out", tmp_path / "out"), "compounds.csv", "empty")


def test_non_numeric_cell_is_a_finding(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [dict(HEXANE, tc="five hundred")])
    result = run_cli("check", folder, "--out", tmp_path / "out")
    assert result.code == 1 and "Traceback" not in result.err
    doc = json.loads((tmp_path / "out" / "findings.json").read_text())
    (finding,) = [f for f in doc["findings"] if f["rule"] == "cell-not-numeric"]
    assert (finding["table"], finding["compound_id"], finding["column"], finding["row"]) == ("compounds", "C6", "tc", 1)
    assert "compounds.csv row 1, column tc" in finding["message"]


def test_duplicate_ids_are_findings_and_rows_accounted(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE, dict(HEXANE, name="n-hexane again")])
    result = run_cli("check", folder, "--out", tmp_path / "out")
    assert result.code == 1
    doc = json.loads((tmp_path / "out" / "findings.json").read_text())
    assert [f["rule"] for f in doc["findings"] if f["severity"] == "error"] == ["duplicate-compound-id"]
    (table,) = doc["tables"]
    assert (table["rows_read"], table["rows_checked"], table["rows_rejected"]) == (2, 1, 1)


def test_unknown_unit_in_mapping(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    (folder / "propcheck.toml").write_text('[compounds.units]\ntc = "degrees kelvin please"\n')
    result = run_cli("check", folder, "--out", tmp_path / "out")
    assert_usage_error(result, "propcheck.toml", "table compounds", "column tc", "unknown unit")


def test_unit_of_wrong_dimension(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    (folder / "propcheck.toml").write_text('[compounds.units]\ntc = "kPa"\n')
    assert_usage_error(run_cli("check", folder, "--out", tmp_path / "out"), "column tc", "temperature")


def test_mapping_names_unknown_column(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    (folder / "propcheck.toml").write_text('[compounds.columns]\ncritical_temp = "Tc"\n')
    assert_usage_error(run_cli("check", folder, "--out", tmp_path / "out"), "compounds.columns.critical_temp")


def test_mapped_column_absent(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    (folder / "propcheck.toml").write_text('[compounds.columns]\ntc = "Tcrit"\n')
    assert_usage_error(run_cli("check", folder, "--out", tmp_path / "out"), "column tc", "'Tcrit'")


def test_bad_toml_mapping(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    (folder / "propcheck.toml").write_text("[compounds\n")
    assert_usage_error(run_cli("check", folder, "--out", tmp_path / "out"), "propcheck.toml", "not valid TOML")


def test_pack_unknown_rule(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    pack = tmp_path / "pack.toml"
    pack.write_text("[rules.no-such-rule]\nenabled = false\n")
    assert_usage_error(run_cli("check", folder, "--rules", pack, "--out", tmp_path / "out"), "pack.toml", "rule no-such-rule")


def test_pack_unknown_key(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    pack = tmp_path / "pack.toml"
    pack.write_text("[rules.vp-falls-with-temperature]\ntolerance = 3\n")
    result = run_cli("check", folder, "--rules", pack, "--out", tmp_path / "out")
    assert_usage_error(result, "pack.toml", "rule vp-falls-with-temperature", "key tolerance")


def test_pack_bad_value_type(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    pack = tmp_path / "pack.toml"
    pack.write_text('[rules.vp-beyond-critical-point]\nt_margin = "half a kelvin"\n')
    assert_usage_error(run_cli("check", folder, "--rules", pack, "--out", tmp_path / "out"), "key t_margin")


def test_pack_bad_severity(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    pack = tmp_path / "pack.toml"
    pack.write_text('[rules.cas-malformed]\nseverity = "fatal"\n')
    assert_usage_error(run_cli("check", folder, "--rules", pack, "--out", tmp_path / "out"), "key severity")


def test_custom_rule_with_broken_sql(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    pack = tmp_path / "pack.toml"
    pack.write_text('[custom.my-check]\ntitle = "x"\nsql = "SELECT nonsense FROM nowhere"\n')
    assert_usage_error(run_cli("check", folder, "--rules", pack, "--out", tmp_path / "out"), "rule my-check", "key sql")


def test_rules_file_missing(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    assert_usage_error(run_cli("check", folder, "--rules", tmp_path / "nope.toml", "--out", tmp_path / "o"), "--rules")


def test_unknown_option(run_cli, tmp_path):
    assert_usage_error(run_cli("check", tmp_path, "--fail-on", "sometimes"), "--fail-on")


def test_out_is_a_file(run_cli, tmp_path):
    folder = write_db(tmp_path / "db", [HEXANE])
    target = tmp_path / "out.txt"
    target.write_text("x")
    assert_usage_error(run_cli("check", folder, "--out", target), "out.txt", "--out")


def test_explain_unknown_rule(run_cli):
    assert_usage_error(run_cli("explain", "no-such-rule"), "rule no-such-rule")


def test_internal_error_exits_3(run_cli, tmp_path, monkeypatch):
    import propcheck.pipeline

    def boom(*args, **kwargs):
        raise ZeroDivisionError("simulated bug")

    monkeypatch.setattr(propcheck.pipeline, "run_check", boom)
    folder = write_db(tmp_path / "db", [HEXANE])
    result = run_cli("check", folder, "--out", tmp_path / "out")
    assert result.code == 3
    assert "internal error" in result.err and "Traceback" not in result.err
