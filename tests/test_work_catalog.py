"""Where the working tables live changes nothing in the findings.

Small sources are loaded into a compressed in-memory catalog; sources of
``LARGE_SOURCE_BYTES`` or more into a database file in a temporary directory
(propcheck/load/__init__.py). Force the file for the demo database and
compare with the in-memory run: same findings, the temporary file is gone
afterwards and the source folder is unchanged.
"""

from __future__ import annotations

import gc
import hashlib
from pathlib import Path

import propcheck.load as load
from propcheck.pipeline import run_check

SAMPLE = Path(__file__).resolve().parents[1] / "sample_db"


def _digest(folder: Path) -> str:
    h = hashlib.sha256()
    for path in sorted(folder.rglob("*")):
        if path.is_file():
            h.update(path.name.encode())
            h.update(path.read_bytes())
    return h.hexdigest()


def _findings(result):
    return result.findings[["finding_id", "rule", "severity", "row", "column", "message"]].astype(str).values.tolist()


def test_file_backed_catalog_gives_the_same_findings(monkeypatch):
    before = _digest(SAMPLE)
    in_memory = run_check(str(SAMPLE))
    made = []
    real_attach = load._attach_work_catalog

    def spy(con, source):
        workdir = real_attach(con, source)
        made.append(workdir)
        return workdir

    monkeypatch.setattr(load, "LARGE_SOURCE_BYTES", 0)
    monkeypatch.setattr(load, "_attach_work_catalog", spy)
    on_file = run_check(str(SAMPLE))
    assert made and made[0] is not None, "the file-backed catalog was not used"
    workdir = Path(made[0].name)
    assert (workdir / "work.duckdb").exists()  # held while the run's database is alive
    assert on_file.db.con.execute("SELECT current_database()").fetchall()[0][0] == "work"
    assert _findings(on_file) == _findings(in_memory)
    assert len(in_memory.findings) > 0
    del on_file, made
    gc.collect()
    assert not workdir.exists(), "the working database file outlived the run"
    assert _digest(SAMPLE) == before, "the source was changed"
