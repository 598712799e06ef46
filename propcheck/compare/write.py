"""Write a vendor audit: compare.md, compare.json, changes.csv, findings.csv, scorecard.csv."""

from __future__ import annotations

import csv
import io
import json
from pathlib import Path

from propcheck.compare.run import CompareResult
from propcheck.errors import UsageError
from propcheck.findings import FIELDS
from propcheck.report.caution import CAUTION
from propcheck.report.formatting import fmt
from propcheck.report.write import atomic_write

__all__ = ["render_compare_md", "render_compare_terminal", "write_compare"]

CHANGE_FIELDS = ("kind", "table", "compound_id", "t", "column", "current", "incoming", "rel_change")


def _csv(header, rows) -> str:
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(header)
    for row in rows:
        writer.writerow([fmt(v) for v in row])
    return buffer.getvalue()


def _change_counts(result: CompareResult) -> dict[str, int]:
    c = result.changes
    out = {}
    for kind in ("added", "removed"):
        for table in ("compounds", "vapor_pressure"):
            out[f"{table} {kind}"] = int(((c["kind"] == kind) & (c["table"] == table)).sum())
    changed = c[c["kind"] == "changed"]
    out["compounds changed"] = int(changed[changed["table"] == "compounds"]["compound_id"].nunique())
    out["values changed"] = len(changed)
    return out


def render_compare_md(result: CompareResult) -> str:
    counts = _change_counts(result)
    lines = ["# propcheck vendor audit", "",
             f"**{'FAIL' if result.exit_code else 'PASS'}** (fail on: {result.fail_on}): findings on incoming rows: "
             f"{result.counts['error']} errors, {result.counts['warning']} warnings, {result.counts['info']} info.", "",
             f"- current: `{result.current}`", f"- incoming: `{result.incoming}`",
             f"- values compared with relative tolerance {result.rtol:g}",
             f"- incoming read as {'the whole new database (--full)' if result.full else 'a delivery: it adds or replaces the compounds it carries'}",
             "", "## What the delivery changes", "",
             "| change | count |", "|---|---|"]
    lines += [f"| {k} | {v} |" for k, v in counts.items()]
    changed = result.changes[result.changes["kind"] == "changed"]
    if len(changed):
        lines += ["", "### Changed values", "", "| compound_id | table | t | column | current | incoming | relative change |",
                  "|---|---|---|---|---|---|---|"]
        for r in changed.head(200).itertuples(index=False):
            rel = "" if r.rel_change is None else f"{100 * float(r.rel_change):+.3g} %"
            lines.append(f"| {r.compound_id} | {r.table} | {fmt(r.t)} | {r.column} | {fmt(r.current)} | {fmt(r.incoming)} | {rel} |")
        if len(changed) > 200:
            lines.append(f"\n... {len(changed) - 200} more in changes.csv")
    added = result.changes[(result.changes["kind"] != "changed") & (result.changes["table"] == "compounds")]
    if len(added):
        lines += ["", "### Compounds added or removed", ""]
        lines += [f"- {r.kind}: {r.compound_id}" for r in added.head(200).itertuples(index=False)]
        if len(added) > 200:
            lines.append(f"- ... {len(added) - 200} more in changes.csv")
    lines += ["", "## Findings on incoming rows (checked with the current database)", ""]
    if result.findings.empty:
        lines.append("None.")
    else:
        lines += ["| severity | rule | compound_id | column | t | message |", "|---|---|---|---|---|---|"]
        for r in result.findings.itertuples(index=False):
            lines.append(f"| {r.severity} | {r.rule} | {fmt(r.compound_id)} | {fmt(r.column)} | {fmt(r.t)} | {fmt(r.message).replace('|', '/')} |")
    lines += ["", "## Scorecard per source", "", "| source | records | error | warning | info | records flagged | share flagged |",
              "|---|---|---|---|---|---|---|"]
    lines += [f"| {s.source} | {s.records} | {s.error} | {s.warning} | {s.info} | {s.records_flagged} | {100 * s.share_flagged:.1f} % |"
              for s in result.scorecard]
    lines += ["", "## Caution", "", CAUTION, ""]
    return "\n".join(lines)


def render_compare_terminal(result: CompareResult, out_dir: str | None = None) -> str:
    counts = _change_counts(result)
    changes = ", ".join(f"{v} {k}" for k, v in counts.items() if v) or "no changes"
    lines = [f"propcheck compare: {result.incoming} against {result.current}", f"changes: {changes}",
             f"findings on incoming rows: {result.counts['error']} error, {result.counts['warning']} warning, "
             f"{result.counts['info']} info"]
    for s in result.scorecard[:5]:
        lines.append(f"  {s.source:<32} {s.records:>6} records  {100 * s.share_flagged:5.1f} % flagged")
    if out_dir:
        lines.append(f"report: {Path(out_dir) / 'compare.md'} (compare.json, changes.csv, findings.csv, scorecard.csv)")
    lines.append(f"{'FAIL' if result.exit_code else 'PASS'}: fail-on {result.fail_on}")
    return "\n".join(lines)


def _records(frame, names):
    def clean(v):
        if hasattr(v, "item"):
            v = v.item()
        if isinstance(v, float) and v != v:
            return None
        return v
    return [{k: clean(v) for k, v in zip(names, row)} for row in frame.reindex(columns=list(names)).itertuples(index=False)]


def write_compare(result: CompareResult, out_dir: str) -> None:
    folder = Path(out_dir)
    if folder.exists() and not folder.is_dir():
        raise UsageError("exists and is not a folder", file=out_dir, option="--out")
    folder.mkdir(parents=True, exist_ok=True)
    finding_fields = list(FIELDS) + ["origin"]
    doc = {
        "format_version": 1, "current": result.current, "incoming": result.incoming, "full": result.full,
        "rtol": result.rtol,
        "fingerprints": result.fingerprints, "exit_code": result.exit_code, "counts": result.counts,
        "changes_summary": _change_counts(result),
        "changes": _records(result.changes, CHANGE_FIELDS),
        "findings": _records(result.findings, finding_fields),
        "scorecard": [dict(s.__dict__, share_flagged=round(s.share_flagged, 6)) for s in result.scorecard],
    }
    atomic_write(folder / "compare.json", json.dumps(doc, indent=2, ensure_ascii=False) + "\n")
    atomic_write(folder / "compare.md", render_compare_md(result))
    atomic_write(folder / "changes.csv", _csv(CHANGE_FIELDS, result.changes.reindex(columns=list(CHANGE_FIELDS)).itertuples(index=False)))
    atomic_write(folder / "findings.csv", _csv(finding_fields, result.findings.reindex(columns=finding_fields).itertuples(index=False)))
    atomic_write(folder / "scorecard.csv", _csv(
        ["source", "records", "error", "warning", "info", "records_flagged", "share_flagged"],
        [[s.source, s.records, s.error, s.warning, s.info, s.records_flagged, round(s.share_flagged, 6)] for s in result.scorecard]))
