"""report.html: one self-contained page (inline CSS, JS and SVG; opens offline).

Rendering only: every number comes from :class:`ReportData`; the figures are
drawn by :mod:`propcheck.report.plots` from :mod:`propcheck.report.figures`.
"""

from __future__ import annotations

import html

from propcheck.findings import severity_rank
from propcheck.report.caution import CAUTION
from propcheck.report.data import ReportData
from propcheck.report.formatting import fmt
from propcheck.report.html_assets import CSS, JS
from propcheck.report.plots import compound_svgs, family_svg, history_svg

__all__ = ["render_html"]

_COLUMNS = (  # key, header, numeric
    ("severity", "severity", False), ("status", "status", False), ("rule", "rule", False),
    ("compound_id", "compound", False), ("table", "table", False), ("column", "column", False),
    ("t", "t [K]", True), ("observed", "observed", True), ("expected", "expected", True),
    ("suggestion", "suggestion", False), ("message", "message", False), ("source", "source", False),
    ("row", "row", True), ("finding_id", "finding id", False),
)


def _e(value) -> str:
    return html.escape(fmt(value))


def _short(value) -> str:
    if isinstance(value, float):
        return html.escape(format(value, ".6g"))
    return _e(value)


def _options(values) -> str:
    return "".join(f'<option value="{_e(v)}">{_e(v)}</option>' for v in values)


def _table(headers: list[tuple[str, bool]], rows: list[list[str]], empty: str = "None.") -> str:
    head = "".join(f'<th class="{"num" if n else ""}">{html.escape(h)}</th>' for h, n in headers)
    if not rows:
        return f"<table><thead><tr>{head}</tr></thead><tbody><tr><td colspan={len(headers)}>{empty}</td></tr></tbody></table>"
    body = "".join(
        "<tr>" + "".join(f'<td class="{"num" if n else ""}">{c}</td>' for c, (_, n) in zip(row, headers)) + "</tr>"
        for row in rows
    )
    return f"<table><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>"


def _bar(n: int, top: int) -> str:
    width = 0 if not top else max(2, round(120 * n / top))
    return f'<span class="bar" style="width:{width}px"></span> {n}'


def _section(anchor: str, number: int, title: str, body: str, cls: str = "") -> str:
    return (f'<section id="{anchor}" class="{cls}"><h2><span class="no">{number}</span>{html.escape(title)}</h2>'
            f"{body}</section>")


def _summary(data: ReportData) -> str:
    sev = data.by_severity
    kpis = [f'<div class="kpi {s}"><b>{n}</b><span>{s}</span></div>' for s, n in sev.items()]
    kpis.append(f'<div class="kpi"><b>{data.n_flagged_compounds}</b><span>compounds flagged</span></div>')
    if data.triage.active:
        for status, label in (("new", "new findings"), ("baselined", "in baseline"), ("waived", "waived")):
            kpis.append(f'<div class="kpi"><b>{data.triage.counts.get(status, 0)}</b><span>{label}</span></div>')
        kpis.append(f'<div class="kpi"><b>{len(data.triage.resolved)}</b><span>resolved since baseline</span></div>')
    reasons = "".join(f"<li>{html.escape(r)}</li>" for r in data.fail_reasons)
    verdict = (f'<p><span class="verdict {"fail" if data.exit_code else "pass"}">{"FAIL" if data.exit_code else "PASS"}</span> '
               f"&nbsp;fails on {_e(data.fail_on)} or worse" + ("; " + ("baseline and waivers applied" if data.triage.active else "") if data.triage.active else "")
               + "</p>" + (f"<ul>{reasons}</ul>" if reasons else ""))
    top = max((e + w + i for _, _, e, w, i in data.by_rule), default=0)
    rules = _table(
        [("rule", False), ("title", False), ("error", True), ("warning", True), ("info", True), ("total", False)],
        [[_e(r), _e(t), str(e), str(w), str(i), _bar(e + w + i, top)] for r, t, e, w, i in data.by_rule],
        "No findings.",
    )
    worst = _table(
        [("compound", False), ("name", False), ("error", True), ("warning", True), ("info", True)],
        [[f'<a href="#panel-{_e(c)}">{_e(c)}</a>' if any(p.compound_id == c for p in data.panels) else _e(c),
          _e(n), str(e), str(w), str(i)] for c, n, e, w, i in data.worst],
    )
    family = _table(
        [("family", False), ("error", True), ("warning", True), ("info", True)],
        [[_e(f), str(e), str(w), str(i)] for f, e, w, i in data.by_family],
    )
    sources = _table(
        [("source", False), ("records", True), ("error", True), ("warning", True), ("info", True),
         ("records flagged", True), ("share flagged", True)],
        [[_e(s.source), str(s.records), str(s.error), str(s.warning), str(s.info), str(s.records_flagged),
          f"{100 * s.share_flagged:.1f} %"] for s in data.scorecard],
    )
    return (f'<div class="kpis">{"".join(kpis)}</div>{verdict}'
            f'<h3>Findings by rule</h3>{rules}'
            f'<div class="grid2"><div><h3>Compounds with the most errors and warnings</h3>{worst}</div>'
            f'<div><h3>Findings by family</h3>{family}</div></div>'
            f'<h3>Findings by source</h3>{sources}<p class="note">Records are table rows; a source value counts '
            f'up to its first ";".</p>')


TABLE_CAP = 2000  # findings rows in report.html (worst first); all of them are in findings.csv / .json


def _findings(data: ReportData) -> str:
    total = len(data.findings)
    frame = data.findings.head(TABLE_CAP)
    n = len(frame)
    rows = []
    for rec in frame.to_dict("records"):  # loop over findings
        cells = []
        for key, _, numeric in _COLUMNS:
            value = rec.get(key)
            if key == "severity":
                cells.append(f'<td data-v="{severity_rank(value)}"><span class="sev sev-{_e(value)}">{_e(value)}</span></td>')
            elif key == "status":
                title = f' title="{_e(rec.get("waiver"))}"' if rec.get("waiver") else ""
                cells.append(f'<td><span class="st st-{_e(value)}"{title}>{_e(value)}</span></td>')
            elif key == "finding_id":
                cells.append(f'<td class="mono">{_e(value)}</td>')
            elif key == "message":
                cells.append(f'<td class="msg">{_e(value)}</td>')
            else:
                cls = "num" if numeric else ("nw" if key in ("rule", "compound_id", "table", "column") else "")
                cells.append(f'<td class="{cls}" data-v="{_e(value)}">{_short(value)}</td>')
        rows.append(
            f'<tr data-severity="{_e(rec["severity"])}" data-status="{_e(rec.get("status"))}" data-rule="{_e(rec["rule"])}" '
            f'data-compound="{_e(rec["compound_id"])}" data-source="{_e(rec["source"])}">{"".join(cells)}</tr>'
        )
    rules = sorted(frame["rule"].unique()) if n else []
    head = "".join(f'<th class="{"num" if num else ""}">{html.escape(h)}</th>' for _, h, num in _COLUMNS)
    return (
        '<p class="lead">Every finding of the run. Filter by severity, status, rule, compound or source; click a '
        "column heading to sort. Values are in SI units (K, Pa, g/mol).</p>"
        '<div class="filters">'
        f'<label>severity <select id="f-severity"><option value="">all</option>{_options(["error", "warning", "info"])}</select></label>'
        f'<label>status <select id="f-status"><option value="">all</option>{_options(["new", "baselined", "waived"])}</select></label>'
        f'<label>rule <select id="f-rule"><option value="">all</option>{_options(rules)}</select></label>'
        '<label>compound <input id="f-compound" placeholder="compound id" size="14"></label>'
        '<label>source <input id="f-source" placeholder="source" size="14"></label>'
        f'<span class="count"><span id="shown">{n}</span> of {n} shown</span></div>'
        + (f'<p class="note">The table holds the first {n} of {total} findings, worst first; findings.csv and '
           "findings.json beside this file hold all of them.</p>" if total > n else "")
        + f'<div class="tablewrap"><table id="findings"><thead><tr>{head}</tr></thead><tbody>{"".join(rows)}</tbody></table></div>'
    )


def _panels(data: ReportData) -> str:
    if not data.panels:
        return '<p class="lead">No compound was flagged.</p>'
    cards = []
    frame = data.findings
    shown = frame[frame["compound_id"].isin([p.compound_id for p in data.panels])] if len(frame) else frame
    by_compound = {cid: mine for cid, mine in shown.groupby("compound_id")} if len(shown) else {}  # panels' compounds only
    for panel, svg in zip(data.panels, compound_svgs(data.panels)):  # bounded by PANEL_CAP
        mine = by_compound.get(panel.compound_id)
        items = "" if mine is None else "".join(
            f'<li><span class="sev sev-{_e(s)}">{_e(s)}</span> {_e(m)}</li>'
            for s, m in list(zip(mine["severity"], mine["message"]))[:4]
        )
        if mine is not None and len(mine) > 4:
            items += f'<li class="note">and {len(mine) - 4} more in the findings table</li>'
        if panel.curve_label:
            fit = f'<div class="fit">Curve: {html.escape(panel.curve_label)}, the one the rules judged these points by.</div>'
        else:
            fit = '<div class="fit">No fitted curve for this compound: points only.</div>' if len(panel.t) else ""
        cards.append(
            f'<div class="panel" id="panel-{_e(panel.compound_id)}"><header><b>{_e(panel.compound_id)}</b>'
            f'<span>{_e(panel.name)} &middot; {panel.n_findings} finding(s) &middot; '
            f'<a href="#findings-section" data-filter-compound="{_e(panel.compound_id)}">show in table</a></span></header>'
            f"{svg}{fit}<ul>{items}</ul></div>"
        )
    more = data.n_flagged_compounds - len(data.panels)
    note = f'<p class="note">{more} further flagged compound(s) without a panel (see the findings table).</p>' if more > 0 else ""
    return (
        '<p class="lead">ln p against 1/T for each flagged compound, worst first: the data points, the fitted curve the rules judged them by, flagged '
        "points (red crosses), the normal boiling point at 101.325 kPa (square), the critical point (diamond) and, where "
        "a rule diagnosed a slip, the corrected value (green ring).</p>"
        f'<div class="panels">{"".join(cards)}</div>{note}'
    )


def _families(data: ReportData) -> str:
    if not data.families:
        return '<p class="lead">No family with two or more members.</p>'
    blocks = "".join(
        f'<div class="family"><h3>{_e(f.family)} &middot; {len(f.compound_id)} members, {f.n_flagged} flagged</h3>{family_svg(f)}</div>'
        for f in data.families
    )
    return ('<p class="lead">Critical temperature, normal boiling point and critical pressure against molar mass within '
            "each family; members a finding names for that property are marked with a red cross.</p>" + blocks)


def _triage(data: ReportData) -> str:
    t = data.triage
    parts = [f'<p class="lead">Baseline: {_e(t.baseline_path) or "none"}; waivers: {_e(t.waiver_path) or "none"}.</p>']
    parts.append("<h3>Resolved since the baseline</h3>" + _table(
        [("finding id", False), ("rule", False), ("compound", False), ("column", False), ("message", False)],
        [[f'<span class="mono">{_e(r.get("finding_id"))}</span>', _e(r.get("rule")), _e(r.get("compound_id")),
          _e(r.get("column")), _e(r.get("message"))] for r in t.resolved],
        "Nothing resolved." if t.baseline_path else "No baseline given.",
    ))
    waived = data.findings[data.findings["status"] == "waived"] if len(data.findings) else data.findings
    parts.append("<h3>Waived findings</h3>" + _table(
        [("waiver", False), ("rule", False), ("compound", False), ("message", False)],
        [[_e(w), _e(r), _e(c), _e(m)] for w, r, c, m in zip(waived["waiver"], waived["rule"], waived["compound_id"], waived["message"])]
        if len(waived) else [],
    ))
    if t.expired:
        parts.append("<h3>Expired waivers (the run fails)</h3><ul>" + "".join(
            f"<li>{html.escape(w.describe())}</li>" for w in t.expired) + "</ul>")
    if t.unused:
        parts.append("<h3>Waivers that matched nothing</h3><ul>" + "".join(
            f"<li>{html.escape(w.describe())}</li>" for w in t.unused) + "</ul>")
    return "".join(parts)


def _history(data: ReportData) -> str:
    h = data.history
    runs = h.runs
    series = {rule: [h.counts.get((rule, r["run_id"]), 0) for r in runs] for rule in h.rules}
    headers = [("rule", False)] + [(f"#{r['run_id']} {r['started']}", True) for r in runs]
    rows = [[_e(rule)] + [str(n) for n in counts] for rule, counts in series.items()]
    fps = ", ".join(f"#{r['run_id']} {r['fingerprint']}" for r in runs)
    svg = history_svg(runs, dict(list(series.items())[:8])) if runs and series else ""
    return (f'<p class="lead">Findings per rule over the last {len(runs)} run(s) recorded in {_e(h.path)}.</p>'
            f"{svg}{_table(headers, rows, 'No findings in these runs.')}<p class=\"note\">Data fingerprints: {html.escape(fps)}</p>")


def _inputs(data: ReportData) -> str:
    meta = data.meta
    tables = _table(
        [("table", False), ("read from", False), ("rows read", True), ("rows checked", True), ("rows rejected", True),
         ("cells rejected", True)],
        [[_e(t.table), _e(t.origin), str(t.rows_read), str(t.rows_checked), str(t.rows_rejected), str(t.cells_rejected)]
         for t in data.tables],
    )
    libs = ", ".join(f"{k} {v}" for k, v in meta["libraries"].items())
    rows = [
        ["source", f"{_e(meta['source'])} ({_e(meta['source_kind'])})"],
        ["data fingerprint", f'<span class="mono">{_e(meta.get("fingerprint"))}</span>'],
        ["rule packs", _e(", ".join(meta["rule_packs"]))],
        ["baseline", _e(meta.get("baseline")) or "none"],
        ["waivers", _e(meta.get("waivers")) or "none"],
        ["propcheck", _e(meta["propcheck"])],
        ["reference libraries", _e(libs)],
        ["run", f"started {_e(meta['started'])}, {_e(meta['seconds'])} s"],
    ] + [["note", _e(n)] for n in data.notes]
    return ("<p class=\"lead\">Rows read = rows checked + rows rejected; every rejected row and cell has a finding.</p>"
            f"{tables}<h3>Run inputs and versions</h3>{_table([('item', False), ('value', False)], rows)}")


def render_html(data: ReportData) -> str:
    """Return the whole report page."""
    meta = data.meta
    verdict = "FAIL" if data.exit_code else "PASS"
    sections = [("summary", "Summary", _summary(data), ""), ("caution", "Caution", f"<p>{html.escape(CAUTION)}</p>", "caution"),
                ("findings-section", "Findings", _findings(data), ""),
                ("compounds", "Flagged compounds: vapor-pressure curves", _panels(data), ""),
                ("families", "Family trends", _families(data), "")]
    if data.triage.active:
        sections.append(("triage", "Baseline and waivers", _triage(data), ""))
    if data.history is not None:
        sections.append(("history", "Run history", _history(data), ""))
    sections.append(("inputs", "Inputs, rows and versions", _inputs(data), ""))
    toc = "".join(f'<a href="#{a}">{i}&nbsp;{html.escape(t)}</a>' for i, (a, t, _, _) in enumerate(sections, 1))
    body = "".join(_section(a, i, t, b, c) for i, (a, t, b, c) in enumerate(sections, 1))
    sev = data.by_severity
    return f"""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>Property data audit: {_e(meta['source'])}</title>
<meta name="viewport" content="width=device-width, initial-scale=1"><style>{CSS}</style></head>
<body><div class="sheet">
<div class="titleblock"><div class="t"><div class="kicker">Property data audit report</div>
<h1>{_e(meta['source'])}</h1>
<div class="sub">{sev['error']} errors, {sev['warning']} warnings, {sev['info']} info across {data.n_compounds_with_findings} compounds</div></div>
<dl><dt>Verdict</dt><dd><span class="verdict {verdict.lower()}">{verdict}</span></dd>
<dt>Fail on</dt><dd>{_e(data.fail_on)}</dd><dt>Date (UTC)</dt><dd>{_e(meta['started'])}</dd>
<dt>Fingerprint</dt><dd>{_e(meta.get('fingerprint'))}</dd><dt>Tool</dt><dd>propcheck {_e(meta['propcheck'])}</dd></dl></div>
<nav class="toc">{toc}</nav>
{body}
<footer>Generated by propcheck {_e(meta['propcheck'])}. Self-contained file: no network access is needed to view it.</footer>
</div><script>{JS}</script></body></html>
"""
