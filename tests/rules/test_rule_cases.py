"""Run every case in ``tests/rules/cases/<rule-id>.toml``.

A case gives a few compound rows and vapor-pressure points (values from the
published source named in the case file), an optional rule-pack overlay, and
the findings the rule must produce: exactly those (compound_id, column, t)
triples, nothing else from that rule.
"""

from __future__ import annotations

import tomllib
from pathlib import Path

import pytest

from propcheck.pipeline import run_check
from tests.conftest import write_db, write_table

CASES = Path(__file__).parent / "cases"


def _cases():
    for path in sorted(CASES.glob("*.toml")):
        doc = tomllib.loads(path.read_text(encoding="utf-8"))
        for case in doc["case"]:
            yield pytest.param(path.stem, case, id=f"{path.stem}-{case['name']}")


def _key(compound_id, column, t):
    return (compound_id or "", column or "", None if t is None else round(float(t), 3))


@pytest.mark.parametrize(("rule_id", "case"), list(_cases()))
def test_rule_case(rule_id, case, tmp_path):
    folder = write_db(tmp_path / "db", case["compounds"], case.get("vapor_pressure"))
    for extra in ("boiling_points", "vp_equations"):
        if extra in case:
            write_table(folder, extra, case[extra])
    pack = None
    if "pack" in case:
        pack = tmp_path / "pack.toml"
        pack.write_text(case["pack"], encoding="utf-8")
    result = run_check(str(folder), rules_path=str(pack) if pack else None)
    found = result.findings[result.findings["rule"] == rule_id]
    got = {
        _key(cid, col, t): rec
        for cid, col, t, rec in zip(found["compound_id"], found["column"], found["t"], found.to_dict("records"))
    }
    expected = case.get("expect", [])
    want = {_key(e.get("compound_id"), e.get("column"), e.get("t")): e for e in expected}
    assert set(got) == set(want), found[["compound_id", "column", "t", "message"]].to_string()
    for key, exp in want.items():
        rec = got[key]
        if "severity" in exp:
            assert rec["severity"] == exp["severity"]
        if "suggestion_contains" in exp:
            assert exp["suggestion_contains"] in (rec["suggestion"] or ""), rec
        if "expected" in exp:
            assert float(rec["expected"]) == pytest.approx(exp["expected"], rel=exp.get("rtol", 1e-3)), rec
        if "corrected" in exp:  # the repair also goes to the finding's corrected field (corrections.csv)
            assert rec["corrected"] is not None and float(rec["corrected"]) == pytest.approx(exp["corrected"], rel=1e-6), rec
        if "message_contains" in exp:
            assert exp["message_contains"] in rec["message"], rec
