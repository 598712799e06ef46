"""report.html: one self-contained page (inline CSS and JS, no network)."""

from __future__ import annotations

import html

from propcheck.findings import FIELDS
from propcheck.report.caution import CAUTION
from propcheck.report.data import ReportData
from propcheck.report.formatting import fmt

__all__ = ["render_html"]

_CSS = """
body{font:14px/1.45 system-ui,-apple-system,"Segoe UI",sans-serif;margin:0;color:#1d2733;background:#f6f7f9}
header{background:#17324d;color:#fff;padding:18px 32px}header h1{margin:0;font-size:20px}
header p{margin:4px 0 0;opacity:.85}main{padding:20px 32px;max-width:1400px}
section{background:#fff;border:1px solid #d9dee4;border-radius:4px;padding:14px 18px;margin-bottom:16px}
h2{font-size:16px;margin:0 0 10px;color:#17324d}
table{border-collapse:collapse;width:100%}th,td{text-align:left;padding:4px 8px;border-bottom:1px solid #e6e9ed;vertical-align:top}
th{background:#eef1f4;cursor:pointer;user-select:none}td.num{text-align:right;font-variant-numeric:tabular-nums}
.tiles{display:flex;gap:12px}.tile{flex:1;border-radius:4px;padding:10px 14px;color:#fff}
.tile b{display:block;font-size:24px}.error{background:#a4262c}.warning{background:#b7770c}.info{background:#3a6b96}
.sev{font-weight:600;text-transform:uppercase;font-size:11px}.sev-error{color:#a4262c}.sev-warning{color:#9a6400}.sev-info{color:#3a6b96}
.filters{display:flex;gap:8px;margin-bottom:8px;flex-wrap:wrap}.filters input,.filters select{padding:4px 6px}
.caution{border-left:4px solid #b7770c;background:#fff8ea}.meta td:first-child{width:180px;color:#555}
"""

_JS = """
(function(){
  var table=document.getElementById('findings');var rows=[].slice.call(table.tBodies[0].rows);
  var f={severity:document.getElementById('f-severity'),rule:document.getElementById('f-rule'),
         compound:document.getElementById('f-compound'),source:document.getElementById('f-source')};
  function apply(){var shown=0;rows.forEach(function(r){
    var ok=(!f.severity.value||r.dataset.severity===f.severity.value)&&(!f.rule.value||r.dataset.rule===f.rule.value)
      &&(!f.compound.value||(r.dataset.compound||'').toLowerCase().indexOf(f.compound.value.toLowerCase())>=0)
      &&(!f.source.value||(r.dataset.source||'').toLowerCase().indexOf(f.source.value.toLowerCase())>=0);
    r.style.display=ok?'':'none';if(ok)shown++;});document.getElementById('shown').textContent=shown;}
  Object.keys(f).forEach(function(k){f[k].addEventListener('input',apply);});
  [].slice.call(table.tHead.rows[0].cells).forEach(function(th,i){var asc=true;th.addEventListener('click',function(){
    rows.sort(function(a,b){var x=a.cells[i].textContent,y=b.cells[i].textContent;var nx=parseFloat(x),ny=parseFloat(y);
      var c=(!isNaN(nx)&&!isNaN(ny))?nx-ny:x.localeCompare(y);return asc?c:-c;});asc=!asc;
    rows.forEach(function(r){table.tBodies[0].appendChild(r);});});});
  apply();
})();
"""

_SHOWN = ("severity", "rule", "compound_id", "table", "column", "t", "observed", "expected", "suggestion", "message", "source", "finding_id")


def _e(value) -> str:
    return html.escape(fmt(value))


def _options(values) -> str:
    return "".join(f'<option value="{_e(v)}">{_e(v)}</option>' for v in values)


def render_html(data: ReportData) -> str:
    meta, sev, frame = data.meta, data.by_severity, data.findings
    verdict = "FAIL" if data.exit_code else "PASS"
    tiles = "".join(f'<div class="tile {s}"><b>{n}</b>{s}</div>' for s, n in sev.items())
    rule_rows = "".join(
        f"<tr><td>{_e(r)}</td><td>{_e(t)}</td><td class=num>{e}</td><td class=num>{w}</td><td class=num>{i}</td></tr>"
        for r, t, e, w, i in data.by_rule
    ) or "<tr><td colspan=5>No findings.</td></tr>"
    worst_rows = "".join(
        f"<tr><td>{_e(c)}</td><td>{_e(n)}</td><td class=num>{e}</td><td class=num>{w}</td><td class=num>{i}</td></tr>"
        for c, n, e, w, i in data.worst
    ) or "<tr><td colspan=5>None.</td></tr>"
    table_rows = "".join(
        f"<tr><td>{_e(t.table)}</td><td>{_e(t.origin)}</td><td class=num>{t.rows_read}</td><td class=num>{t.rows_checked}</td>"
        f"<td class=num>{t.rows_rejected}</td><td class=num>{t.cells_rejected}</td></tr>"
        for t in data.tables
    )
    body_rows = []
    for rec in frame[list(FIELDS)].to_dict("records"):
        cells = "".join(
            f'<td class="{"num" if k in ("t", "observed", "expected") else ""}'
            f'{" sev sev-" + rec["severity"] if k == "severity" else ""}">{_e(rec[k])}</td>'
            for k in _SHOWN
        )
        body_rows.append(
            f'<tr data-severity="{_e(rec["severity"])}" data-rule="{_e(rec["rule"])}" '
            f'data-compound="{_e(rec["compound_id"])}" data-source="{_e(rec["source"])}">{cells}</tr>'
        )
    libs = ", ".join(f"{k} {v}" for k, v in meta["libraries"].items())
    notes = "".join(f"<tr><td>note</td><td>{_e(n)}</td></tr>" for n in data.notes)
    return f"""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>propcheck report: {_e(meta['source'])}</title>
<meta name="viewport" content="width=device-width, initial-scale=1"><style>{_CSS}</style></head>
<body><header><h1>Property data audit: {_e(meta['source'])}</h1>
<p>{verdict} (fail on {_e(data.fail_on)}) &middot; propcheck {_e(meta['propcheck'])} &middot; {_e(meta['started'])}</p></header>
<main>
<section class="caution"><h2>Caution</h2><p>{html.escape(CAUTION)}</p></section>
<section><h2>Overview</h2><div class="tiles">{tiles}</div></section>
<section><h2>Rows read and checked</h2><table><thead><tr><th>table</th><th>source</th><th>rows read</th><th>rows checked</th>
<th>rows rejected</th><th>cells rejected</th></tr></thead><tbody>{table_rows}</tbody></table></section>
<section><h2>Findings by rule</h2><table><thead><tr><th>rule</th><th>title</th><th>error</th><th>warning</th><th>info</th></tr></thead>
<tbody>{rule_rows}</tbody></table></section>
<section><h2>Compounds with the most findings</h2><table><thead><tr><th>compound</th><th>name</th><th>error</th><th>warning</th>
<th>info</th></tr></thead><tbody>{worst_rows}</tbody></table></section>
<section><h2>Findings (<span id="shown">{len(frame)}</span> shown of {len(frame)})</h2>
<div class="filters"><select id="f-severity"><option value="">all severities</option>{_options(["error", "warning", "info"])}</select>
<select id="f-rule"><option value="">all rules</option>{_options(sorted(frame["rule"].unique()) if len(frame) else [])}</select>
<input id="f-compound" placeholder="compound id"><input id="f-source" placeholder="source"></div>
<table id="findings"><thead><tr>{"".join(f"<th>{k}</th>" for k in _SHOWN)}</tr></thead><tbody>{"".join(body_rows)}</tbody></table></section>
<section><h2>Inputs</h2><table class="meta"><tbody>
<tr><td>source</td><td>{_e(meta['source'])} ({_e(meta['source_kind'])})</td></tr>
<tr><td>rule packs</td><td>{_e(", ".join(meta['rule_packs']))}</td></tr>
<tr><td>library versions</td><td>{_e(libs)}</td></tr>{notes}</tbody></table></section>
</main><script>{_JS}</script></body></html>
"""
