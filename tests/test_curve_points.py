"""The two ways of fetching the sorted curve points give the same arrays.

Up to ``SORT_IN_ONE_QUERY`` points one sorted query fetches them; beyond,
the keys are sorted alone and the values scattered into place batch by batch
(propcheck/curves.py). Force the second way on the demo database, with its
rows in the source order and shuffled, and compare.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import numpy as np
import pandas as pd
import pytest

import propcheck.curves as curves_module
from propcheck.curves import curve_points
from propcheck.load import load_database
from propcheck.rules.pack import load_pack
from propcheck.schema import run_schema_stage

SAMPLE = Path(__file__).resolve().parents[1] / "sample_db"


def _points(folder, monkeypatch, one_query: bool):
    if not one_query:
        monkeypatch.setattr(curves_module, "SORT_IN_ONE_QUERY", 0)
        monkeypatch.setattr(curves_module, "FETCH_ROWS", 37)  # many batches, as with millions of points
    db = load_database(str(folder))
    run_schema_stage(db, load_pack())
    pts = curve_points(db)
    monkeypatch.undo()
    return pts


@pytest.mark.parametrize("shuffled", [False, True])
def test_key_sort_equals_one_sorted_query(tmp_path, monkeypatch, shuffled):
    folder = SAMPLE
    if shuffled:
        folder = tmp_path / "db"
        shutil.copytree(SAMPLE, folder, ignore=shutil.ignore_patterns("*.py", "*.md", "*.toml"))
        vp = pd.read_csv(folder / "vapor_pressure.csv", dtype=str)
        vp.sample(frac=1.0, random_state=3).to_csv(folder / "vapor_pressure.csv", index=False)
    one = _points(folder, monkeypatch, one_query=True)
    keyed = _points(folder, monkeypatch, one_query=False)
    assert len(one.group) > 100
    for name in ("group", "row", "t", "p", "u"):
        assert np.array_equal(getattr(one, name), getattr(keyed, name), equal_nan=True), name
    assert list(one.ids) == list(keyed.ids)
    # sorted by compound, then temperature
    same = one.group[1:] == one.group[:-1]
    assert np.all(one.group[1:] >= one.group[:-1]) and np.all(one.t[1:][same] >= one.t[:-1][same])
