"""Per-source scorecard: records, findings by severity and the share of records flagged.

A record is one row of a canonical table. Rows are grouped by their
``source`` value up to the first ``;`` (so ``BDS-2026-11; Wagner set`` and
``BDS-2026-11`` count as one delivery); rows without a source count under
``(none)``.
"""

from __future__ import annotations

from dataclasses import dataclass

import pandas as pd

from propcheck.database import Database

__all__ = ["SourceScore", "source_key", "source_scorecard"]

NONE = "(none)"


@dataclass
class SourceScore:
    source: str
    records: int
    error: int
    warning: int
    info: int
    records_flagged: int

    @property
    def share_flagged(self) -> float:
        return self.records_flagged / self.records if self.records else 0.0


def source_key(values: pd.Series) -> pd.Series:
    """Delivery tag of each source value: text before the first ';', stripped."""
    key = values.astype("string").str.split(";", n=1).str[0].str.strip()
    return key.fillna(NONE).replace("", NONE).astype(object)


def source_scorecard(db: Database, findings: pd.DataFrame) -> list[SourceScore]:
    """One score per source, most flagged share first."""
    parts = []
    for table in db.tables:
        cols = {r[0] for r in db.con.execute(
            "SELECT column_name FROM information_schema.columns WHERE table_name = ?", [table]).fetchall()}
        if "source" in cols:
            parts.append(db.df(f'SELECT split_part(coalesce(source, \'\'), \';\', 1) AS s, count(*) AS n FROM "{table}" GROUP BY 1'))
    records = pd.concat(parts) if parts else pd.DataFrame({"s": [], "n": []})
    records["s"] = source_key(records["s"])
    records = records.groupby("s")["n"].sum()
    frame = findings.assign(_s=source_key(findings["source"])) if not findings.empty else None
    out = []
    keys = sorted(set(records.index) | (set(frame["_s"]) if frame is not None else set()))
    for key in keys:  # loop over sources
        mine = frame[frame["_s"] == key] if frame is not None else pd.DataFrame(columns=["severity", "table", "row"])
        sev = mine["severity"].value_counts()
        flagged = mine[mine["row"].notna()][["table", "row"]].drop_duplicates()
        out.append(SourceScore(
            source=key, records=int(records.get(key, 0)), error=int(sev.get("error", 0)),
            warning=int(sev.get("warning", 0)), info=int(sev.get("info", 0)), records_flagged=len(flagged),
        ))
    out.sort(key=lambda s: (-s.share_flagged, -s.error, s.source))
    return out
