"""Inline CSS and JavaScript of report.html (no network, no external files)."""

CSS = """
:root{--ink:#1f2a36;--muted:#5d6b78;--rule:#d5dbe1;--paper:#fff;--desk:#eef1f4;--navy:#1d3a57;
--err:#b3261e;--warn:#8a5a00;--inf:#2f5f8a;--ok:#2e7d32}
*{box-sizing:border-box}
body{margin:0;background:var(--desk);color:var(--ink);font:13.5px/1.5 "Segoe UI",system-ui,-apple-system,"Helvetica Neue",Arial,sans-serif}
.sheet{max-width:1240px;margin:24px auto;background:var(--paper);border:1px solid var(--rule);box-shadow:0 1px 3px rgba(0,0,0,.06)}
.titleblock{display:grid;grid-template-columns:1fr 320px;border-bottom:3px solid var(--navy)}
.titleblock .t{padding:22px 28px}
.titleblock .kicker{text-transform:uppercase;letter-spacing:.12em;font-size:11px;color:var(--muted)}
.titleblock h1{margin:4px 0 6px;font:600 24px/1.25 Georgia,"Times New Roman",serif;color:var(--navy)}
.titleblock .sub{color:var(--muted)}
.titleblock dl{margin:0;border-left:1px solid var(--rule);display:grid;grid-template-columns:110px 1fr;font-size:12px}
.titleblock dt,.titleblock dd{margin:0;padding:6px 10px;border-bottom:1px solid var(--rule)}
.titleblock dt{color:var(--muted);background:#f7f9fa}
.titleblock dd{word-break:break-all}
.verdict{display:inline-block;padding:2px 10px;border-radius:2px;color:#fff;font-weight:700;letter-spacing:.08em}
.verdict.fail{background:var(--err)}.verdict.pass{background:var(--ok)}
nav.toc{display:flex;flex-wrap:wrap;gap:2px 18px;padding:10px 28px;border-bottom:1px solid var(--rule);background:#f7f9fa;font-size:12.5px}
nav.toc a{color:var(--navy);text-decoration:none}nav.toc a:hover{text-decoration:underline}
section{padding:18px 28px;border-bottom:1px solid var(--rule)}
h2{font:600 17px/1.3 Georgia,"Times New Roman",serif;color:var(--navy);margin:0 0 12px}
h2 .no{color:var(--muted);margin-right:8px}
h3{font-size:13.5px;margin:14px 0 6px;color:var(--ink)}
p.lead{margin:0 0 12px;color:var(--muted);max-width:900px}
.kpis{display:grid;grid-template-columns:repeat(auto-fit,minmax(150px,1fr));gap:10px;margin-bottom:14px}
.kpi{border:1px solid var(--rule);border-top:4px solid var(--muted);padding:8px 12px}
.kpi b{display:block;font-size:24px;font-variant-numeric:tabular-nums}.kpi span{color:var(--muted);font-size:12px}
.kpi.error{border-top-color:var(--err)}.kpi.warning{border-top-color:var(--warn)}.kpi.info{border-top-color:var(--inf)}
.grid2{display:grid;grid-template-columns:minmax(0,1fr) minmax(0,1fr);gap:18px}.grid2>div{min-width:0;overflow-x:auto}
table{border-collapse:collapse;width:100%;font-size:12.5px}
th,td{text-align:left;padding:4px 8px;border-bottom:1px solid #e6e9ed;vertical-align:top}
thead th{background:#f1f4f7;border-bottom:1px solid #c3ccd5;font-weight:600;white-space:nowrap}
td.num,th.num{text-align:right;font-variant-numeric:tabular-nums}
td.nw,.grid2 td:first-child{white-space:nowrap}
td.mono{font-family:ui-monospace,"SFMono-Regular",Consolas,monospace;font-size:11.5px}
.bar{display:inline-block;height:8px;background:var(--inf);vertical-align:middle}
.sev{display:inline-block;font-size:10.5px;font-weight:700;text-transform:uppercase;letter-spacing:.04em;padding:0 6px;border-radius:2px;color:#fff}
.sev-error{background:var(--err)}.sev-warning{background:var(--warn)}.sev-info{background:var(--inf)}
.st{font-size:11px;color:var(--muted)}.st-new{color:var(--err);font-weight:600}
.filters{display:flex;flex-wrap:wrap;gap:8px;align-items:center;margin-bottom:8px;padding:8px;background:#f7f9fa;border:1px solid var(--rule)}
.filters label{font-size:12px;color:var(--muted)}
.filters select,.filters input{font:inherit;font-size:12.5px;padding:3px 6px;border:1px solid #b8c2cc;border-radius:2px;background:#fff}
.filters .count{margin-left:auto;font-size:12px;color:var(--muted)}
.tablewrap{max-height:560px;overflow:auto;border:1px solid var(--rule)}
#findings thead th{position:sticky;top:0;cursor:pointer;user-select:none}
#findings thead th[aria-sort=ascending]::after{content:" \\25B2";font-size:9px}
#findings thead th[aria-sort=descending]::after{content:" \\25BC";font-size:9px}
#findings td.msg{min-width:280px}
.panels{display:grid;grid-template-columns:repeat(auto-fill,minmax(380px,1fr));gap:14px}
.panel{border:1px solid var(--rule);padding:10px 12px;break-inside:avoid}
.panel header{display:flex;justify-content:space-between;gap:8px;align-items:baseline;border-bottom:1px solid var(--rule);padding-bottom:4px;margin-bottom:6px}
.panel header b{color:var(--navy)}.panel header span{font-size:11.5px;color:var(--muted)}
.panel svg{width:100%;height:auto;display:block}
.panel ul{margin:6px 0 0;padding-left:18px;font-size:12px}
.panel .fit{font-size:11px;color:var(--muted);margin-top:4px}
.family svg{width:100%;height:auto}
.caution{background:#fff8e6;border-left:5px solid var(--warn)}
.caution h2{color:var(--warn)}
.note{color:var(--muted);font-size:12px}
footer{padding:12px 28px;color:var(--muted);font-size:11.5px}
@media print{body{background:#fff}.sheet{border:0;box-shadow:none;margin:0}.tablewrap{max-height:none}.filters,nav.toc{display:none}}
@media (max-width:900px){.titleblock,.grid2{grid-template-columns:1fr}}
"""

JS = """
(function(){
  'use strict';
  var table=document.getElementById('findings');if(!table)return;
  var body=table.tBodies[0];var rows=Array.prototype.slice.call(body.rows);
  var ids=['f-severity','f-status','f-rule','f-compound','f-source'];var f={};
  ids.forEach(function(id){f[id]=document.getElementById(id);});
  var shown=document.getElementById('shown');
  function has(v,needle){return !needle||(v||'').toLowerCase().indexOf(needle.toLowerCase())>=0;}
  function apply(){
    var n=0;
    rows.forEach(function(r){
      var d=r.dataset;
      var ok=(!f['f-severity'].value||d.severity===f['f-severity'].value)
        &&(!f['f-status'].value||d.status===f['f-status'].value)
        &&(!f['f-rule'].value||d.rule===f['f-rule'].value)
        &&has(d.compound,f['f-compound'].value)&&has(d.source,f['f-source'].value);
      r.hidden=!ok;if(ok)n++;
    });
    shown.textContent=String(n);
  }
  ids.forEach(function(id){f[id].addEventListener('input',apply);f[id].addEventListener('change',apply);});
  var heads=Array.prototype.slice.call(table.tHead.rows[0].cells);
  heads.forEach(function(th,i){
    th.addEventListener('click',function(){
      var asc=th.getAttribute('aria-sort')!=='ascending';
      heads.forEach(function(h){h.removeAttribute('aria-sort');});
      th.setAttribute('aria-sort',asc?'ascending':'descending');
      var numeric=th.classList.contains('num');
      rows.sort(function(a,b){
        var x=a.cells[i].getAttribute('data-v')||a.cells[i].textContent,y=b.cells[i].getAttribute('data-v')||b.cells[i].textContent;
        var c;
        if(numeric){var nx=parseFloat(x),ny=parseFloat(y);nx=isNaN(nx)?-Infinity:nx;ny=isNaN(ny)?-Infinity:ny;c=nx-ny;}
        else{c=x.localeCompare(y);}
        return asc?c:-c;
      });
      rows.forEach(function(r){body.appendChild(r);});
    });
  });
  Array.prototype.slice.call(document.querySelectorAll('[data-filter-compound]')).forEach(function(a){
    a.addEventListener('click',function(){f['f-compound'].value=a.getAttribute('data-filter-compound');apply();});
  });
  apply();
})();
"""
