"""The SQL prefilter of the point tables changes nothing pandera would find.

Large point tables are narrowed in SQL to the rows their schema could reject
before pandera sees them (propcheck/schema/prefilter.py). Run the schema stage
both ways on the demo database, whose vendor delivery carries schema problems
in the point tables, and on a copy with every kind of bad point added: the
findings and the rows withheld must be identical.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pandas as pd
import pandera.pandas as pa
import pytest

import propcheck.schema.stage as stage
from propcheck.load import load_database
from propcheck.rules.pack import load_pack
from propcheck.schema.prefilter import suspect_rows_sql

SAMPLE = Path(__file__).resolve().parents[1] / "sample_db"


def _run(folder, monkeypatch, prefilter: bool):
    if not prefilter:
        monkeypatch.setattr(stage, "suspect_rows_sql", lambda schema: None)
    db = load_database(str(folder))
    findings = stage.run_schema_stage(db, load_pack())
    kept = db.con.execute("SELECT _row, t, p, uncertainty FROM vapor_pressure ORDER BY _row").fetchall()
    monkeypatch.undo()
    return sorted((f.rule, f.table, f.row or -1, f.column or "", f.message) for f in findings), kept


def _with_bad_points(tmp_path: Path) -> Path:
    folder = tmp_path / "db"
    shutil.copytree(SAMPLE, folder, ignore=shutil.ignore_patterns("*.py", "*.md", "*.toml"))
    vp = pd.read_csv(folder / "vapor_pressure.csv", dtype=str)
    first = vp.iloc[0].to_dict()
    bad = [
        {**first, "t": ""},  # required value missing
        {**first, "p": "-5"},  # out of range
        {**first, "t": "nan"},  # not a finite number
        {**first, "uncertainty": "1e30"},  # optional column out of range
        {**first, "compound_id": "NO-SUCH-ID"},  # unknown compound
        {**first, "compound_id": ""},  # no compound
    ]
    pd.concat([vp, pd.DataFrame(bad)], ignore_index=True).to_csv(folder / "vapor_pressure.csv", index=False)
    return folder


@pytest.mark.parametrize("make", ["sample", "with_bad_points"])
def test_prefilter_finds_what_full_validation_finds(tmp_path, monkeypatch, make):
    folder = SAMPLE if make == "sample" else _with_bad_points(tmp_path)
    fast, fast_kept = _run(folder, monkeypatch, prefilter=True)
    full, full_kept = _run(folder, monkeypatch, prefilter=False)
    assert fast == full
    assert fast_kept == full_kept
    point_findings = [f for f in full if f[1] == "vapor_pressure"]
    assert point_findings, "the database must carry point-table problems for this test to mean anything"
    if make == "with_bad_points":
        assert {f[0] for f in point_findings} >= {"required-value-missing", "value-out-of-range", "vp-unknown-compound"}


def test_unknown_check_means_full_validation():
    schema = pa.DataFrameSchema({"t": pa.Column(float, pa.Check(lambda s: s > 0, name="custom"))})
    assert suspect_rows_sql(schema) is None


def test_unique_column_means_full_validation():
    assert suspect_rows_sql(pa.DataFrameSchema({"k": pa.Column(str, unique=True)})) is None
