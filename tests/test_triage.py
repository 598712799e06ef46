"""Baselines and waivers: known findings do not fail the run, new ones and expired waivers do."""

from __future__ import annotations

import json

import pytest

from tests.conftest import assert_usage_error, write_db
from tests.test_findings_ids import POINTS, ROWS

# ROWS/POINTS carry published values (IUPAC critical data, CRC boiling points, IAPWS-IF97 water)
# with three seeded slips: n-hexane tc entered in degC-like error, its CAS with swapped digits,
# and one water point in kPa entered as Pa.


@pytest.fixture
def dbs(tmp_path):
    base = write_db(tmp_path / "base", ROWS, POINTS)
    # one more problem on a new compound: toluene's CAS with a wrong check digit (108-88-3 is right, CAS)
    worse_rows = ROWS + [{"compound_id": "TOL2", "name": "toluene copy", "cas": "108-88-4", "tc": 591.75, "tb": 383.75}]
    worse = write_db(tmp_path / "worse", worse_rows, POINTS)
    # the water point fixed: IAPWS-IF97 saturation pressure at 373.124 K is 101325 Pa (normal boiling point)
    fixed_points = [dict(p) for p in POINTS]
    fixed_points[1]["p"] = 101325.0
    fixed = write_db(tmp_path / "fixed", ROWS, fixed_points)
    return base, worse, fixed


def _findings(out):
    return json.loads((out / "findings.json").read_text(encoding="utf-8"))


def test_baseline_accepts_known_and_fails_on_new(tmp_path, dbs, run_cli):
    base, worse, fixed = dbs
    baseline = tmp_path / "baseline.json"
    assert run_cli("baseline", base, "--out", baseline).code == 0
    known = json.loads(baseline.read_text(encoding="utf-8"))
    assert known["format"] == "propcheck-baseline" and len(known["findings"]) >= 3

    # the same data: everything is baselined, the run passes
    res = run_cli("check", base, "--out", tmp_path / "r1", "--baseline", baseline, "--quiet")
    assert res.code == 0
    doc = _findings(tmp_path / "r1")
    assert {f["status"] for f in doc["findings"]} == {"baselined"}

    # a new problem fails the run and is the only new finding
    res = run_cli("check", worse, "--out", tmp_path / "r2", "--baseline", baseline, "--quiet")
    assert res.code == 1
    new = [f for f in _findings(tmp_path / "r2")["findings"] if f["status"] == "new"]
    assert new and {f["compound_id"] for f in new} == {"TOL2"}
    junit = (tmp_path / "r2" / "junit.xml").read_text(encoding="utf-8")
    assert 'name="TOL2"' in junit and "<failure" in junit

    # a fixed problem is listed as resolved
    res = run_cli("check", fixed, "--out", tmp_path / "r3", "--baseline", baseline, "--quiet")
    assert res.code == 0
    doc = _findings(tmp_path / "r3")
    resolved = doc["triage"]["resolved"]
    assert resolved and {(r["compound_id"], r["column"], r["t"]) for r in resolved} == {("W", "p", 373.124)}
    assert "Resolved since the baseline" in (tmp_path / "r3" / "summary.md").read_text(encoding="utf-8")
    assert resolved[0]["finding_id"] in (tmp_path / "r3" / "report.html").read_text(encoding="utf-8")


def test_baseline_from_findings_json(tmp_path, dbs, run_cli):
    base, _, _ = dbs
    assert run_cli("check", base, "--out", tmp_path / "r", "--quiet").code == 1
    baseline = tmp_path / "b.json"
    assert run_cli("baseline", tmp_path / "r" / "findings.json", "--out", baseline, "--quiet").code == 0
    ids = {f["finding_id"] for f in json.loads(baseline.read_text(encoding="utf-8"))["findings"]}
    assert ids == {f["finding_id"] for f in _findings(tmp_path / "r")["findings"]}
    # a findings.json also serves directly as a baseline
    assert run_cli("check", base, "--out", tmp_path / "r2", "--baseline", tmp_path / "r" / "findings.json",
                   "--quiet").code == 0


def _waivers(tmp_path, text):
    path = tmp_path / "waivers.toml"
    path.write_text(text, encoding="utf-8")
    return path


def test_waivers_by_id_and_by_rule_pattern(tmp_path, dbs, run_cli):
    base, _, _ = dbs
    assert run_cli("check", base, "--out", tmp_path / "r0", "--quiet").code == 1
    found = _findings(tmp_path / "r0")["findings"]
    water = [f for f in found if f["compound_id"] == "W"]
    others = sorted({(f["rule"], f["compound_id"][0]) for f in found if f["compound_id"] != "W"})
    assert water and others
    text = "".join(f'[[waiver]]\nfinding_id = "{f["finding_id"]}"\nreason = "logged with the vendor"\nowner = "steward"\n'
                   for f in water)
    for rule, first in others:  # glob on the compound id, e.g. "C*" for n-hexane's C6
        text += f'[[waiver]]\nrule = "{rule}"\ncompound = "{first}*"\nreason = "known"\nowner = "data-team"\nexpires = 2999-12-31\n'
    text += '[[waiver]]\nrule = "cas-check-digit"\ncompound = "ZZ*"\nreason = "matches nothing"\nowner = "o"\n'
    res = run_cli("check", base, "--out", tmp_path / "r1", "--waivers", _waivers(tmp_path, text), "--quiet")
    assert res.code == 0
    doc = _findings(tmp_path / "r1")
    assert {f["status"] for f in doc["findings"]} == {"waived"}
    assert "matched nothing" in (tmp_path / "r1" / "summary.md").read_text(encoding="utf-8")
    assert next(f for f in doc["findings"] if f["finding_id"] == water[0]["finding_id"])["waiver"] == "waiver[0]"


def test_expired_waiver_fails_the_run_and_says_so(tmp_path, dbs, run_cli):
    base, _, _ = dbs
    text = ('[[waiver]]\nrule = "cas-check-digit"\ncompound = "*"\nreason = "until the vendor fixes it"\n'
            'owner = "steward"\nexpires = 2001-01-31\n')
    baseline = tmp_path / "b.json"
    assert run_cli("baseline", base, "--out", baseline, "--quiet").code == 0
    res = run_cli("check", base, "--out", tmp_path / "r", "--baseline", baseline, "--waivers",
                  _waivers(tmp_path, text))
    assert res.code == 1
    assert "expired" in res.out and "2001-01-31" in res.out and "waiver[0]" in res.out
    doc = _findings(tmp_path / "r")
    assert doc["triage"]["expired_waivers"] and not any(f["status"] == "waived" for f in doc["findings"])
    assert "EXPIRED waiver" in (tmp_path / "r" / "summary.md").read_text(encoding="utf-8")


@pytest.mark.parametrize("text, key", [
    ('[[waiver]]\nrule = "cas-check-digit"\nowner = "x"\n', "waiver[0].reason"),
    ('[[waiver]]\nrule = "cas-check-digit"\nreason = "r"\n', "waiver[0].owner"),
    ('[[waiver]]\nrule = "cas-check-digit"\nreason = "r"\nowner = "o"\nexpires = "next week"\n', "waiver[0].expires"),
    ('[[waiver]]\nreason = "r"\nowner = "o"\n', "waiver[0].rule"),
    ('[[waiver]]\nrule = "no-such-rule"\nreason = "r"\nowner = "o"\n', "waiver[0].rule"),
    ('[[waiver]]\nrule = "cas-check-digit"\nreason = "r"\nowner = "o"\ncolour = "red"\n', "waiver[0].colour"),
    ('[waivers]\n', "waivers"),
])
def test_bad_waiver_file_is_a_usage_error(tmp_path, dbs, run_cli, text, key):
    base, _, _ = dbs
    path = _waivers(tmp_path, text)
    res = run_cli("check", base, "--out", tmp_path / "r", "--waivers", path)
    assert_usage_error(res, str(path), key)


@pytest.mark.parametrize("text, key", [
    ("{not json", "--baseline"),
    ('{"findings": "all"}', "findings"),
    ('{"findings": [{"rule": "x"}]}', "findings[0].finding_id"),
    ('{"format": "other", "findings": []}', "format"),
])
def test_bad_baseline_file_is_a_usage_error(tmp_path, dbs, run_cli, text, key):
    base, _, _ = dbs
    path = tmp_path / "baseline.json"
    path.write_text(text, encoding="utf-8")
    res = run_cli("check", base, "--out", tmp_path / "r", "--baseline", path)
    assert_usage_error(res, str(path), key)


def test_missing_baseline_file(tmp_path, dbs, run_cli):
    base, _, _ = dbs
    assert_usage_error(run_cli("check", base, "--baseline", tmp_path / "nope.json"), "nope.json", "--baseline")
