"""Shared helpers: write a small database to a folder, run the CLI in-process."""

from __future__ import annotations

import csv
from dataclasses import dataclass
from pathlib import Path

import pytest

from propcheck.canonical import TABLES
from propcheck.cli import main

REPO = Path(__file__).resolve().parents[1]
SAMPLE_DB = REPO / "sample_db"


@dataclass
class CliResult:
    code: int
    out: str
    err: str


def write_table(folder: Path, table: str, rows: list[dict], columns: list[str] | None = None) -> Path:
    """Write ``rows`` as ``folder/table.csv`` with canonical columns (or ``columns``)."""
    folder.mkdir(parents=True, exist_ok=True)
    if columns is None:
        present = {k for row in rows for k in row}
        columns = [c.name for c in TABLES[table].columns if c.name in present or c.required]
        columns += sorted(present - set(columns))
    path = folder / f"{table}.csv"
    with path.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.DictWriter(handle, fieldnames=columns)
        writer.writeheader()
        for row in rows:
            writer.writerow({k: ("" if v is None else v) for k, v in row.items()})
    return path


def write_db(folder: Path, compounds: list[dict], vapor_pressure: list[dict] | None = None) -> Path:
    write_table(folder, "compounds", compounds)
    if vapor_pressure is not None:
        write_table(folder, "vapor_pressure", vapor_pressure)
    return folder


@pytest.fixture
def run_cli(capsys):
    """Run ``propcheck ARGS`` in-process; return exit code, stdout, stderr."""

    def run(*args: str) -> CliResult:
        code = main([str(a) for a in args])
        captured = capsys.readouterr()
        return CliResult(code, captured.out, captured.err)

    return run


def assert_usage_error(result: CliResult, *must_name: str) -> None:
    """Exit 2 with one line on stderr naming every place in ``must_name``, no traceback."""
    assert result.code == 2, (result.code, result.err)
    lines = [line for line in result.err.splitlines() if line.strip()]
    assert len(lines) == 1, result.err
    assert "Traceback" not in result.err
    assert lines[0].startswith("propcheck: error:")
    for text in must_name:
        assert text in lines[0], (text, lines[0])
