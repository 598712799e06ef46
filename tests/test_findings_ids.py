"""finding_id is stable when unrelated rows are added, removed or reordered."""

from __future__ import annotations

from propcheck.pipeline import run_check
from tests.conftest import write_db

# Published values: n-hexane Tc 507.6 K (IUPAC 1995), Tb 341.87 K (CRC 95th ed.), CAS 110-54-3;
# benzene Tc 562.05 K (IUPAC 1995), Tb 353.23 K (CRC), CAS 71-43-2; toluene Tc 591.75 K (IUPAC 1995),
# Tb 383.75 K (CRC), CAS 108-88-3. Water saturation pressures: IAPWS-IF97 verification values.
ROWS = [
    {"compound_id": "C6", "name": "n-hexane", "cas": "110-45-3", "tc": 234.45, "tb": 341.87},  # two slips
    {"compound_id": "BZ", "name": "benzene", "cas": "71-43-2", "tc": 562.05, "tb": 353.23},
    {"compound_id": "TOL", "name": "toluene", "cas": "108-88-3", "tc": 591.75, "tb": 383.75},
    {"compound_id": "W", "name": "water", "tc": 647.096, "pc": 22064000.0},
]
POINTS = [
    {"compound_id": "W", "t": 300.0, "p": 3536.58941},
    {"compound_id": "W", "t": 373.124, "p": 101.325},  # kPa entered as Pa
    {"compound_id": "W", "t": 500.0, "p": 2638897.76},
    {"compound_id": "W", "t": 600.0, "p": 12344314.6},
]


def _ids(tmp_path, name, rows, points):
    result = run_check(str(write_db(tmp_path / name, rows, points)))
    return dict(zip(result.findings["finding_id"], result.findings["rule"]))


def test_ids_survive_reordering_and_unrelated_rows(tmp_path):
    base = _ids(tmp_path, "a", ROWS, POINTS)
    assert len(base) >= 3  # the three seeded slips, plus what later rules add
    reordered = _ids(tmp_path, "b", list(reversed(ROWS)), list(reversed(POINTS)))
    assert reordered == base
    fewer = _ids(tmp_path, "c", [r for r in ROWS if r["compound_id"] != "BZ"], POINTS)
    assert fewer == base
    extra = ROWS + [{"compound_id": "AC", "name": "acetone", "cas": "67-64-1", "tc": 508.1, "tb": 329.23}]  # IUPAC/CRC
    assert _ids(tmp_path, "d", extra, POINTS) == base


def test_ids_change_when_the_problem_moves(tmp_path):
    base = _ids(tmp_path, "a", ROWS, POINTS)
    moved = [dict(p) for p in POINTS]
    moved[1]["p"], moved[2]["p"] = 101325.0, 2638.89776  # the slip now sits at 500 K
    other = _ids(tmp_path, "b", ROWS, moved)
    assert set(other) != set(base)


def test_ids_survive_unrelated_points(tmp_path):
    base = _ids(tmp_path, "a", ROWS, POINTS)
    # an unrelated point for benzene at its normal boiling point, 101325 Pa at 353.23 K (CRC 95th ed.)
    other = _ids(tmp_path, "b", ROWS, POINTS + [{"compound_id": "BZ", "t": 353.23, "p": 101325.0}])
    assert base.items() <= other.items()


def test_baseline_of_reordered_data_sees_nothing_new(tmp_path):
    from propcheck.report import build_report_data
    from propcheck.triage import Baseline

    first = run_check(str(write_db(tmp_path / "a", ROWS, POINTS)))
    baseline = Baseline(path="memory", entries={fid: {"finding_id": fid} for fid in first.findings["finding_id"]})
    second = run_check(str(write_db(tmp_path / "b", list(reversed(ROWS)), list(reversed(POINTS)))))
    data = build_report_data(second, baseline=baseline, plots=False)
    assert data.triage.counts["new"] == 0 and not data.triage.resolved
    assert data.exit_code == 0
