"""propcheck rules / explain / check options."""

from __future__ import annotations

import json

from propcheck.rules.registry import all_rules
from tests.conftest import SAMPLE_DB, write_db


def test_rules_lists_every_rule(run_cli):
    result = run_cli("rules")
    assert result.code == 0
    listed = [line.split()[0] for line in result.out.splitlines()]
    assert listed == list(all_rules())


def test_rules_shows_pack_changes_and_custom_rules(run_cli, tmp_path):
    pack = tmp_path / "pack.toml"
    pack.write_text(
        '[rules.cas-malformed]\nenabled = false\n[custom.pc-below-one-bar]\ntitle = "pc below 1 bar"\n'
        'sql = "SELECT compound_id FROM compounds WHERE pc < 1e5"\n'
    )
    rows = {r["id"]: r for r in json.loads(run_cli("rules", "--rules", pack, "--json").out)}
    assert rows["cas-malformed"]["enabled"] is False
    assert rows["pc-below-one-bar"]["stage"] == "custom"


def test_explain_prints_method_and_parameters(run_cli):
    result = run_cli("explain", "vp-falls-with-temperature")
    assert result.code == 0
    assert "Clapeyron" in result.out and "default_relative_uncertainty = 0.005" in result.out


def test_explain_json_reflects_pack(run_cli, tmp_path):
    pack = tmp_path / "pack.toml"
    pack.write_text("[rules.vp-beyond-critical-point]\nt_margin = 2.0\n")
    doc = json.loads(run_cli("explain", "vp-beyond-critical-point", "--rules", pack, "--json").out)
    assert doc["params"]["t_margin"] == 2.0


def test_fail_on_levels(run_cli, tmp_path):
    # n-hexane with published constants (IUPAC Tc 507.6 K, Pc 3.025 MPa; CRC Tb 341.87 K, Tm 177.88 K;
    # CAS 110-54-3) and one custom rule that always fires, at the severity the pack gives it
    folder = write_db(tmp_path / "db", [{"compound_id": "C6", "name": "n-hexane", "cas": "110-54-3", "formula": "C6H14",
                                         "tc": 507.6, "pc": 3025000.0, "tb": 341.87, "tm": 177.88}])

    def pack(severity):
        path = tmp_path / f"{severity}.toml"
        path.write_text(f'[custom.always]\ntitle = "always"\nseverity = "{severity}"\n'
                        "sql = \"SELECT compound_id FROM compounds\"\n")
        return path

    assert run_cli("check", folder, "--out", tmp_path / "o1", "--rules", pack("error"), "--quiet").code == 1
    assert run_cli("check", folder, "--out", tmp_path / "o2", "--rules", pack("error"), "--fail-on", "none", "--quiet").code == 0
    assert run_cli("check", folder, "--out", tmp_path / "o3", "--rules", pack("warning"), "--quiet").code == 0
    assert run_cli("check", folder, "--out", tmp_path / "o4", "--rules", pack("warning"), "--fail-on", "warning", "--quiet").code == 1


def test_clean_database_exits_0(run_cli, tmp_path):
    # n-hexane: IUPAC Tc 507.6 K, Pc 3.025 MPa; CRC Tb 341.87 K, Tm 177.88 K; CAS 110-54-3
    folder = write_db(tmp_path / "db", [{"compound_id": "C6", "name": "n-hexane", "cas": "110-54-3",
                                         "tc": 507.6, "pc": 3025000.0, "tb": 341.87, "tm": 177.88}])
    result = run_cli("check", folder, "--out", tmp_path / "out")
    assert result.code == 0 and "PASS" in result.out


def test_report_files_readable_as_the_umask_allows(run_cli, tmp_path):
    """Report files get 0666 less the umask, like any new file, not a temporary file's 0600."""
    import os
    import stat

    folder = write_db(tmp_path / "db", [{"compound_id": "C6", "name": "n-hexane"}])
    old = os.umask(0o022)  # the usual umask (common practice)
    try:
        assert run_cli("check", folder, "--out", tmp_path / "out", "--quiet").code == 0
    finally:
        os.umask(old)
    files = sorted((tmp_path / "out").iterdir())
    assert {f.name for f in files} >= {"findings.csv", "findings.json", "summary.md", "report.html", "junit.xml"}
    for f in files:
        assert stat.S_IMODE(f.stat().st_mode) == 0o644, f.name


def test_terminal_summary_on_sample_db(run_cli, tmp_path):
    result = run_cli("check", SAMPLE_DB, "--out", tmp_path / "out")
    assert result.code == 1
    assert "FAIL" in result.out and "findings:" in result.out and "cell-not-numeric" in result.out
    assert result.err == ""


def test_quiet_prints_nothing(run_cli, tmp_path):
    result = run_cli("check", SAMPLE_DB, "--out", tmp_path / "out", "--quiet")
    assert result.code == 1 and result.out == "" and result.err == ""


def test_reader_closing_stdout_is_not_a_crash(tmp_path):
    """`propcheck check ... | head -1`: the run's exit status stands and no internal error is reported."""
    import subprocess
    import sys

    proc = subprocess.Popen([sys.executable, "-m", "propcheck", "check", str(SAMPLE_DB), "--out", str(tmp_path / "o")],
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    proc.stdout.close()  # the reader is gone before propcheck prints its summary
    err = proc.stderr.read().decode()
    assert proc.wait() == 1
    assert "internal error" not in err and "Traceback" not in err
