"""Run history (--history), the data fingerprint, junit.xml and the progress bar."""

from __future__ import annotations

import io
import json
import xml.etree.ElementTree as ET

import duckdb

from propcheck.progress import ProgressBar
from tests.conftest import write_db
from tests.test_findings_ids import POINTS, ROWS  # published values, three seeded slips


def test_history_appends_runs_with_fingerprint(tmp_path, run_cli):
    db = write_db(tmp_path / "a", ROWS, POINTS)
    same = write_db(tmp_path / "b", list(reversed(ROWS)), list(reversed(POINTS)))
    changed_rows = [dict(r) for r in ROWS]
    changed_rows[1]["tb"] = 353.24  # benzene tb moved by 10 mK (CRC 95th ed.: 353.23 K)
    changed = write_db(tmp_path / "c", changed_rows, POINTS)
    history = tmp_path / "history.duckdb"
    for i, source in enumerate((db, same, changed)):
        assert run_cli("check", source, "--out", tmp_path / f"r{i}", "--history", history, "--quiet").code == 1
    con = duckdb.connect(str(history), read_only=True)
    runs = con.execute("SELECT run_id, fingerprint, n_error FROM runs ORDER BY run_id").fetchall()
    assert [r[0] for r in runs] == [1, 2, 3]
    assert runs[0][1] == runs[1][1] != runs[2][1]  # row order does not matter, a value does
    per_run = dict(con.execute("SELECT run_id, count(*) FROM run_findings GROUP BY 1").fetchall())
    doc = json.loads((tmp_path / "r2" / "findings.json").read_text(encoding="utf-8"))
    assert per_run[3] == len(doc["findings"])
    con.close()
    summary = (tmp_path / "r2" / "summary.md").read_text(encoding="utf-8")
    assert "## Run history" in summary and "#3" in summary
    html = (tmp_path / "r2" / "report.html").read_text(encoding="utf-8")
    assert "Run history" in html and runs[2][1] in html


def test_history_file_that_is_not_duckdb(tmp_path, run_cli):
    bad = tmp_path / "history.duckdb"
    bad.write_text("not a database", encoding="utf-8")
    res = run_cli("check", write_db(tmp_path / "a", ROWS, POINTS), "--out", tmp_path / "r", "--history", bad)
    assert res.code == 2 and "history.duckdb" in res.err and "--history" in res.err


def test_junit_one_case_per_rule_and_compound(tmp_path, run_cli):
    assert run_cli("check", write_db(tmp_path / "a", ROWS, POINTS), "--out", tmp_path / "r", "--quiet").code == 1
    doc = json.loads((tmp_path / "r" / "findings.json").read_text(encoding="utf-8"))
    root = ET.parse(tmp_path / "r" / "junit.xml").getroot()
    cases = {(tc.get("classname"), tc.get("name")): tc for tc in root.iter("testcase")}
    pairs = {(f["rule"], f["compound_id"]) for f in doc["findings"]}
    assert pairs <= set(cases)
    failing = {pair for pair in pairs if any(
        f["severity"] == "error" for f in doc["findings"] if (f["rule"], f["compound_id"]) == pair)}
    assert {k for k, tc in cases.items() if tc.find("failure") is not None} == failing
    # every rule that ran and found nothing is one passing case
    quiet_rules = set(doc["meta"]["rules_run"]) - {f["rule"] for f in doc["findings"]}
    assert quiet_rules and all((r, "all compounds") in cases for r in quiet_rules)
    assert int(root.get("tests")) == len(cases) and int(root.get("failures")) == len(failing)


def test_progress_bar_draws_and_clears():
    stream = io.StringIO()
    bar = ProgressBar(4, stream=stream, width=8)
    for step in ("load", "schema", "rule a", "rule b", "rule c"):
        bar(step)
    assert "[########] 4/4 rule c" in stream.getvalue()  # never runs past the total
    assert "[##......] 1/4 load" in stream.getvalue()
    bar.close()
    assert stream.getvalue().endswith("\r")
