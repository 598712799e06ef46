"""propcheck compare on a pair of databases made from sample_db: current = the curated rows,
incoming = the vendor delivery plus one curated compound re-delivered with a changed value."""

from __future__ import annotations

import csv
import json

import pytest

from tests.conftest import SAMPLE_DB, assert_usage_error


def _read(path):
    with path.open(encoding="utf-8", newline="") as handle:
        return list(csv.DictReader(handle))


def _write(path, header, rows):
    path.parent.mkdir(parents=True, exist_ok=True)
    with path.open("w", encoding="utf-8", newline="") as handle:
        writer = csv.DictWriter(handle, fieldnames=header)
        writer.writeheader()
        writer.writerows(rows)


@pytest.fixture(scope="module")
def pair(tmp_path_factory):
    root = tmp_path_factory.mktemp("pair")
    compounds = _read(SAMPLE_DB / "compounds.csv")
    points = _read(SAMPLE_DB / "vapor_pressure.csv")
    c_head, p_head = list(compounds[0]), list(points[0])
    vendor = lambda r: r["source"].startswith("BDS")  # noqa: E731  (sample_db/README.md: vendor rows)
    _write(root / "current" / "compounds.csv", c_head, [r for r in compounds if not vendor(r)])
    _write(root / "current" / "vapor_pressure.csv", p_head, [r for r in points if not vendor(r)])
    methane = dict(next(r for r in compounds if r["compound_id"] == "LPC-0001"))
    methane["tc"] = "191.5"  # re-delivered with tc 0.5 % high (IUPAC: 190.564 K, the current value)
    methane["source"] = "BDS-2026-11"
    incoming_c = [r for r in compounds if vendor(r)] + [methane]
    _write(root / "incoming" / "compounds.csv", c_head, incoming_c)
    _write(root / "incoming" / "vapor_pressure.csv", p_head, [r for r in points if vendor(r)])
    return root, compounds, incoming_c


@pytest.fixture(scope="module")
def compared(pair):
    from propcheck.cli import main

    root, _, _ = pair
    code = main(["compare", str(root / "current"), str(root / "incoming"), "--out", str(root / "out"), "--quiet"])
    return code, json.loads((root / "out" / "compare.json").read_text(encoding="utf-8")), root / "out"


def test_changes(pair, compared):
    _, compounds, incoming_c = pair
    code, doc, out = compared
    assert code == 1  # the delivery carries seeded errors
    current_ids = {r["compound_id"] for r in compounds if not r["source"].startswith("BDS")}
    added = {c["compound_id"] for c in doc["changes"] if c["kind"] == "added" and c["table"] == "compounds"}
    assert added == {r["compound_id"] for r in incoming_c if r["compound_id"]} - current_ids
    assert not [c for c in doc["changes"] if c["kind"] == "removed" and c["table"] == "compounds"]  # a delivery removes none
    tc = [c for c in doc["changes"] if c["kind"] == "changed" and c["compound_id"] == "LPC-0001" and c["column"] == "tc"]
    assert len(tc) == 1 and float(tc[0]["incoming"]) == 191.5
    assert tc[0]["rel_change"] == pytest.approx((191.5 - 190.564) / 190.564)
    for name in ("compare.md", "changes.csv", "findings.csv", "scorecard.csv"):
        assert (out / name).stat().st_size > 0
    assert "qualified engineer" in (out / "compare.md").read_text(encoding="utf-8")


def test_findings_touch_incoming_rows_only(pair, compared):
    _, compounds, incoming_c = pair
    _, doc, _ = compared
    incoming_ids = {r["compound_id"] for r in incoming_c}
    assert doc["findings"]
    for f in doc["findings"]:
        assert f["origin"] == "incoming" or f["compound_id"] in incoming_ids, f
    # the seeded shared CAS (sample_db/seeded_problems.toml) pairs a vendor row with a curated one:
    # it is found only because the delivery is checked together with the current database
    shared = [f for f in doc["findings"] if f["rule"] == "cas-shared-by-ids"]
    assert shared
    # rows point back at the incoming file's rows
    rows = {f["row"] for f in doc["findings"] if f["origin"] == "incoming" and f["table"] == "compounds"}
    assert rows and max(rows) <= len(incoming_c)


def test_scorecard(compared):
    _, doc, _ = compared
    by_source = {s["source"]: s for s in doc["scorecard"]}
    vendor = by_source["BDS-2026-11"]
    assert vendor["records"] > 0 and vendor["error"] > 0
    assert 0 < vendor["share_flagged"] <= 1
    assert vendor["share_flagged"] == pytest.approx(vendor["records_flagged"] / vendor["records"], abs=1e-6)
    curated = by_source["Larkspur curated 2026-10"]
    assert curated["share_flagged"] < vendor["share_flagged"]


def test_identical_databases_change_nothing(tmp_path, run_cli):
    res = run_cli("compare", SAMPLE_DB, SAMPLE_DB, "--out", tmp_path / "same", "--full", "--fail-on", "none")
    assert res.code == 0
    doc = json.loads((tmp_path / "same" / "compare.json").read_text(encoding="utf-8"))
    assert doc["changes"] == [] and doc["fingerprints"]["current"] == doc["fingerprints"]["incoming"]


def test_compare_missing_source(tmp_path, run_cli):
    assert_usage_error(run_cli("compare", SAMPLE_DB, tmp_path / "nope"), "nope")
