"""Add a slip diagnosis to findings that name a numeric compound column.

Runs after every rule (built-in, other engineers', custom): a finding on
``compounds`` whose column is a numeric constant and that carries no
suggestion gets the repair that makes its row consistent, if one does, in
``suggestion`` and ``corrected``. Values the schema stage withheld (out of
range) take part in the trial (``Context.withheld``).
"""

from __future__ import annotations

import pandas as pd

from propcheck.diagnose.context import NUMERIC, get_context
from propcheck.diagnose.repair import diagnose

__all__ = ["UNITS", "annotate_findings", "make_finding"]

UNITS = {"tc": " K", "tb": " K", "tm": " K", "pc": " Pa", "vc": " m3/mol", "molar_mass": " g/mol", "omega": "", "zc": ""}


def make_finding(rule, ctx, row: int, column: str, message: str, diag=None, **fields) -> dict:
    """A finding record (dict of contract fields) for context row ``row``."""
    rec = ctx.frame.iloc[row]
    out = {"rule": rule.id, "severity": fields.pop("severity", rule.severity), "table": "compounds",
           "compound_id": rec["compound_id"], "column": column, "row": int(rec["_row"]),
           "source": rec["source"], "message": message, **fields}
    if diag is not None:
        out["column"] = diag.column
        out["suggestion"] = diag.suggestion(UNITS.get(diag.column, ""))
        out["corrected"] = diag.corrected
        if out.get("expected") is None:
            out["expected"] = diag.corrected
    return out


def annotate_findings(db, findings: pd.DataFrame) -> pd.DataFrame:
    """Fill ``suggestion`` and ``corrected`` where a slip explains a compounds-column finding."""
    if findings.empty or not db.has("compounds"):
        return findings
    mask = (findings["table"] == "compounds") & findings["column"].isin(NUMERIC) & findings["suggestion"].isna()
    mask &= findings["compound_id"].notna()
    if not mask.any():
        return findings
    ctx = get_context(db)
    at = ctx.positions(findings.loc[mask, "row"])
    chosen = [(i, p, c) for i, p, c in zip(findings.index[mask], at, findings.loc[mask, "column"]) if p >= 0]
    if not chosen:
        return findings
    # the values the schema stage withheld (out of range) are tried from the context (Context.withheld)
    diags = diagnose(ctx, [p for _, p, _ in chosen], [c for _, _, c in chosen])
    out = findings.copy()
    for (i, _, column), diag in zip(chosen, diags):
        if diag is not None and diag.column == column:
            out.at[i, "suggestion"] = diag.suggestion(UNITS.get(column, ""))
            out.at[i, "corrected"] = diag.corrected
    return out
