"""Run a vendor audit: diff, the incoming rows checked in the context of the current database, scorecard.

The context check runs every rule on the database as it would be after the
import: current rows whose ``compound_id`` the delivery does not carry, plus
every incoming row (vapor-pressure points likewise, per compound). Family
trends and duplicates across both therefore show up; only findings on
incoming rows, or on compounds the delivery carries, are reported as the
delivery's.
"""

from __future__ import annotations

import re
import tempfile
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np
import pandas as pd

from propcheck.canonical import TABLES
from propcheck.database import Database
from propcheck.findings import severity_rank, to_frame
from propcheck.load import load_database
from propcheck.compare.diff import diff_databases
from propcheck.report.scorecard import SourceScore, source_scorecard

__all__ = ["CompareResult", "run_compare"]


@dataclass
class CompareResult:
    current: str
    incoming: str
    full: bool
    changes: pd.DataFrame
    findings: pd.DataFrame  # findings on incoming rows, with origin_row = the row in the incoming file
    scorecard: list[SourceScore]
    counts: dict[str, int] = field(default_factory=dict)
    fail_on: str = "error"
    exit_code: int = 0
    rtol: float = 1e-6
    fingerprints: dict[str, str] = field(default_factory=dict)


def _canonical(db: Database, table: str) -> pd.DataFrame:
    cols = [c.name for c in TABLES[table].columns]
    present = {r[0] for r in db.con.execute(
        "SELECT column_name FROM information_schema.columns WHERE table_name = ?", [table]).fetchall()}
    sel = ", ".join(f'"{c}"' if c in present else f'NULL AS "{c}"' for c in cols)
    return db.df(f'SELECT _row, {sel} FROM "{table}" ORDER BY _row')


def _merge(current: Database, incoming: Database, folder: Path, full: bool = False) -> dict[str, pd.DataFrame]:
    """Write the would-be database to ``folder``; return per table the origin of each written row.

    A delivery (``full=False``) overlays the current rows by compound_id; a full replacement
    (``full=True``) is the incoming data alone.
    """
    origins = {}
    in_ids = set()
    for table in ("compounds", "vapor_pressure"):
        cur = _canonical(current, table) if current.has(table) and not full else None
        inc = _canonical(incoming, table) if incoming.has(table) else None
        if cur is None and inc is None:
            continue
        ids = set(inc["compound_id"].dropna()) if inc is not None else set()
        if table == "compounds":
            in_ids = ids
        if cur is not None:
            cur = cur[~cur["compound_id"].isin(ids)]
        parts = [(f, origin) for f, origin in ((cur, "current"), (inc, "incoming")) if f is not None]
        merged = pd.concat([f.drop(columns="_row") for f, _ in parts], ignore_index=True)
        origin = pd.concat([pd.DataFrame({"origin": o, "origin_row": f["_row"].to_numpy()}) for f, o in parts],
                           ignore_index=True)
        merged.to_parquet(folder / f"{table}.parquet", index=False)
        origin.index = np.arange(1, len(origin) + 1)  # the merged file's 1-based data rows
        origins[table] = origin
    origins["_incoming_ids"] = pd.DataFrame({"compound_id": sorted(in_ids)})
    return origins


def run_compare(current_path: str, incoming_path: str, *, current_config: str | None = None,
                incoming_config: str | None = None, rules_path: str | None = None, rtol: float = 1e-6,
                fail_on: str = "error", full: bool = False) -> CompareResult:
    """Compare ``incoming_path`` with ``current_path``; see the module docstring."""
    from propcheck.fingerprint import fingerprint
    from propcheck.pipeline import run_check

    current = load_database(current_path, current_config)
    incoming = load_database(incoming_path, incoming_config)
    changes = diff_databases(current, incoming, rtol, full)
    with tempfile.TemporaryDirectory(prefix="propcheck-compare-") as tmp:
        origins = _merge(current, incoming, Path(tmp), full)
        result = run_check(tmp, None, rules_path)
        merged_db = result.db
        findings = result.findings.copy()
        origin = pd.Series([None] * len(findings), index=findings.index, dtype=object)
        origin_row = pd.Series([None] * len(findings), index=findings.index, dtype=object)
        for i, (table, row) in enumerate(zip(findings["table"], findings["row"])):  # loop over findings
            o = origins.get(table)
            if o is not None and row is not None and not pd.isna(row) and int(row) in o.index:
                origin.iloc[i] = o.at[int(row), "origin"]
                origin_row.iloc[i] = int(o.at[int(row), "origin_row"])
        in_ids = set(origins["_incoming_ids"]["compound_id"])
        if "vapor_pressure" in origins and incoming.has("vapor_pressure"):
            in_ids |= set(incoming.df("SELECT DISTINCT compound_id FROM vapor_pressure WHERE compound_id IS NOT NULL")["compound_id"])
        touches = (origin == "incoming") | findings["compound_id"].isin(in_ids)
        findings["origin"] = origin
        findings["row"] = origin_row
        files = {"current": current.tables, "incoming": incoming.tables}
        messages = []
        for msg, table, o, r, merged_row in zip(findings["message"], findings["table"], origin, origin_row,
                                                result.findings["row"]):
            if o in files and table in files[o] and merged_row is not None and not pd.isna(merged_row):
                name = Path(files[o][table].origin).name
                msg = re.sub(rf"\b{re.escape(table)}\.parquet row {int(merged_row)}\b", f"{name} row {r}", str(msg))
            messages.append(msg)
        findings["message"] = messages
        scorecard = source_scorecard(merged_db, result.findings)
        delivered = findings[touches].reset_index(drop=True)
    load_only = to_frame([f for f in incoming.load_findings if result.pack.enabled(f.rule)])
    if not load_only.empty:
        from propcheck.findings import assign_ids

        load_only = assign_ids(load_only)
        load_only["origin"] = "incoming"
        have = set(delivered["finding_id"])
        delivered = pd.concat([delivered, load_only[~load_only["finding_id"].isin(have)]], ignore_index=True)
    counts = {s: int((delivered["severity"] == s).sum()) for s in ("error", "warning", "info")}
    failing = fail_on != "none" and not delivered.empty and bool(
        (delivered["severity"].map(severity_rank) >= severity_rank(fail_on)).any())
    return CompareResult(
        current=current_path, incoming=incoming_path, full=full, changes=changes, findings=delivered, scorecard=scorecard,
        counts=counts, fail_on=fail_on, exit_code=int(failing), rtol=rtol,
        fingerprints={"current": fingerprint(current), "incoming": fingerprint(incoming)},
    )
