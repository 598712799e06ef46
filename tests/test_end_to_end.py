"""propcheck check on sample_db finds every seeded problem within its rules' reach."""

from __future__ import annotations

import csv
import json
import tomllib

import pytest

from tests.conftest import SAMPLE_DB

SEEDED = tomllib.loads((SAMPLE_DB / "seeded_problems.toml").read_text(encoding="utf-8"))["problem"]
IN_SCOPE = [p for p in SEEDED if p["detectable_by"] in ("schema", "physics", "constants", "vapor-pressure")]


@pytest.fixture(scope="module")
def sample_run(tmp_path_factory):
    from propcheck.cli import main

    out = tmp_path_factory.mktemp("report")
    code = main(["check", str(SAMPLE_DB), "--out", str(out), "--quiet"])
    findings = json.loads((out / "findings.json").read_text(encoding="utf-8"))
    return code, out, findings


def test_exit_status_and_files(sample_run):
    code, out, _ = sample_run
    assert code == 1
    for name in ("findings.csv", "findings.json", "summary.md", "report.html"):
        assert (out / name).stat().st_size > 0


@pytest.mark.parametrize("problem", IN_SCOPE, ids=[p["id"] for p in IN_SCOPE])
def test_seeded_problem_found(sample_run, problem):
    _, _, doc = sample_run
    want_id = problem["compound_id"] or None
    hits = [
        f for f in doc["findings"]
        if f["table"] == problem["table"] and f["compound_id"] == want_id and f["column"] == problem["column"]
        and ("t" not in problem or (f["t"] is not None and abs(f["t"] - problem["t"]) < 1e-6))
    ]
    assert hits, f"seeded problem {problem['id']} not found"
    least = {"info": 0, "warning": 1, "error": 2}
    assert any(least[f["severity"]] >= least[problem.get("severity", "error")] for f in hits)


def test_no_clean_compound_flagged_at_error(sample_run):
    _, _, doc = sample_run
    seeded_ids = {p["compound_id"] or None for p in SEEDED}
    for finding in doc["findings"]:
        if finding["severity"] != "error" or finding["compound_id"] in seeded_ids:
            continue
        # a clean row may be named only as the partner of a seeded problem (e.g. the other row of a shared CAS)
        assert any(cid and cid in finding["message"] for cid in seeded_ids), finding


def test_csv_and_json_hold_the_same_records(sample_run):
    _, out, doc = sample_run
    with (out / "findings.csv").open(encoding="utf-8") as handle:
        rows = list(csv.DictReader(handle))
    assert [r["finding_id"] for r in rows] == [f["finding_id"] for f in doc["findings"]]
    assert len({r["finding_id"] for r in rows}) == len(rows)


def test_summary_accounts_for_every_row(sample_run):
    _, out, doc = sample_run
    summary = (out / "summary.md").read_text(encoding="utf-8")
    for table in doc["tables"]:
        assert table["rows_read"] == table["rows_checked"] + table["rows_rejected"]
        line = f"| {table['table']} | {table['origin']} | {table['rows_read']} | {table['rows_checked']} | {table['rows_rejected']} |"
        assert line in summary
    # every rejected row has a finding on that row
    for table in doc["tables"]:
        rows_with_findings = {f["row"] for f in doc["findings"] if f["table"] == table["table"]}
        assert len(rows_with_findings) >= table["rows_rejected"]
    # sample_db: 42 compound rows and 323 vapor-pressure rows (sample_db/README.md)
    assert {t["table"]: t["rows_read"] for t in doc["tables"]} == {"compounds": 42, "vapor_pressure": 323}


def test_reports_carry_the_caution(sample_run):
    _, out, _ = sample_run
    for name in ("summary.md", "report.html"):
        text = (out / name).read_text(encoding="utf-8")
        assert "qualified engineer" in text and "local codes" in text


def test_html_is_self_contained(sample_run):
    _, out, _ = sample_run
    text = (out / "report.html").read_text(encoding="utf-8")
    assert "<script src" not in text and "<link" not in text and "http://" not in text.replace("http://www.w3", "")
