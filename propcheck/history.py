"""Run history in a DuckDB file: each run's findings with a timestamp and the data's fingerprint.

Tables (created on first use)::

    runs(run_id INTEGER, started TIMESTAMP, source VARCHAR, fingerprint VARCHAR,
         propcheck VARCHAR, n_error INTEGER, n_warning INTEGER, n_info INTEGER, exit_code INTEGER)
    run_findings(run_id INTEGER, finding_id VARCHAR, rule VARCHAR, severity VARCHAR,
                 compound_id VARCHAR, column_name VARCHAR, status VARCHAR)
"""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from pathlib import Path

import duckdb
import pandas as pd

from propcheck.errors import UsageError

__all__ = ["HistoryView", "append_run", "read_history"]

_SCHEMA = """
CREATE TABLE IF NOT EXISTS runs(run_id INTEGER PRIMARY KEY, started TIMESTAMP, source VARCHAR,
    fingerprint VARCHAR, propcheck VARCHAR, n_error INTEGER, n_warning INTEGER, n_info INTEGER, exit_code INTEGER);
CREATE TABLE IF NOT EXISTS run_findings(run_id INTEGER, finding_id VARCHAR, rule VARCHAR, severity VARCHAR,
    compound_id VARCHAR, column_name VARCHAR, status VARCHAR);
"""


@dataclass
class HistoryView:
    """Counts per rule over the last runs, oldest run first."""

    path: str
    runs: list[dict] = field(default_factory=list)  # run_id, started, fingerprint, n_error, ...
    rules: list[str] = field(default_factory=list)
    counts: dict[tuple[str, int], int] = field(default_factory=dict)  # (rule, run_id) -> findings


def _connect(path: str, option: str = "--history") -> duckdb.DuckDBPyConnection:
    file = Path(path)
    if file.exists() and not file.is_file():
        raise UsageError("exists and is not a file", file=path, option=option)
    try:
        con = duckdb.connect(str(file))
        con.execute(_SCHEMA)
    except duckdb.Error as exc:
        raise UsageError(f"cannot open as a DuckDB history file ({str(exc).splitlines()[0]})", file=path,
                         option=option) from None
    return con


def append_run(path: str, findings: pd.DataFrame, meta: dict, fingerprint: str, exit_code: int,
               started: float) -> int:
    """Append one run to the history file; return its run_id."""
    con = _connect(path)
    try:
        run_id = con.execute("SELECT coalesce(max(run_id), 0) + 1 FROM runs").fetchone()[0]
        sev = findings["severity"].value_counts() if not findings.empty else pd.Series(dtype=int)
        con.execute(
            "INSERT INTO runs VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)",
            [run_id, dt.datetime.fromtimestamp(started, dt.timezone.utc).replace(tzinfo=None), meta.get("source"),
             fingerprint, meta.get("propcheck"), int(sev.get("error", 0)), int(sev.get("warning", 0)),
             int(sev.get("info", 0)), exit_code],
        )
        if not findings.empty:
            status = findings["status"] if "status" in findings else "new"
            rows = pd.DataFrame({
                "run_id": run_id, "finding_id": findings["finding_id"].astype(str), "rule": findings["rule"],
                "severity": findings["severity"], "compound_id": findings["compound_id"],
                "column_name": findings["column"], "status": status,
            })
            con.register("_new_findings", rows)
            con.execute("INSERT INTO run_findings SELECT * FROM _new_findings")
            con.unregister("_new_findings")
        return int(run_id)
    finally:
        con.close()


def read_history(path: str, last: int = 10) -> HistoryView:
    """Counts per rule over the ``last`` runs recorded in ``path``."""
    con = _connect(path)
    try:
        runs = con.execute(
            "SELECT run_id, strftime(started, '%Y-%m-%d %H:%M') AS started, fingerprint, n_error, n_warning, n_info, "
            "exit_code FROM (SELECT * FROM runs ORDER BY run_id DESC LIMIT ?) ORDER BY run_id", [last]
        ).df().to_dict("records")
        ids = [r["run_id"] for r in runs]
        counts = {}
        if ids:
            for rule, run_id, n in con.execute(
                "SELECT rule, run_id, count(*) FROM run_findings WHERE run_id >= ? GROUP BY ALL", [min(ids)]
            ).fetchall():
                counts[(rule, int(run_id))] = int(n)
        rules = sorted({rule for rule, _ in counts}, key=lambda r: (-counts.get((r, ids[-1]), 0), r)) if ids else []
        return HistoryView(path=path, runs=runs, rules=rules, counts=counts)
    finally:
        con.close()
