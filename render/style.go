package render

// pageCSS is the one stylesheet every page carries inline: no fonts or
// scripts from elsewhere, system fonts only, and a print layout that keeps
// each statement on one page.
const pageCSS = `
:root{--ink:#1d2327;--muted:#5d6870;--rule:#c9d1d6;--paper:#fff;--band:#f3f5f6;
--ok:#1f6f43;--ok-bg:#e6f2ea;--bad:#9b1c1c;--bad-bg:#fbe9e7;--warn:#8a5a00;--warn-bg:#fdf3dc;--accent:#24505f}
*{box-sizing:border-box}
body{margin:0 auto;max-width:60rem;padding:1.5rem 1.25rem 3rem;color:var(--ink);background:var(--paper);
font:15px/1.5 system-ui,-apple-system,"Segoe UI",Roboto,"Noto Sans",sans-serif}
a{color:var(--accent)}
h1,h2,h3{line-height:1.25}
h2{border-bottom:1px solid var(--rule);padding-bottom:.2rem;margin-top:2rem}
code,pre,.src{font-family:ui-monospace,"Cascadia Mono","DejaVu Sans Mono",Menlo,monospace;font-size:.9em}
table{border-collapse:collapse;width:100%;margin:.75rem 0}
th,td{border:1px solid var(--rule);padding:.3rem .5rem;text-align:left;vertical-align:top}
th{background:var(--band);font-weight:600}
td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
table.frame,table.frame>thead,table.frame>tbody,table.frame>tfoot,table.frame>*>tr,table.frame>*>tr>td{display:block;border:0;padding:0;margin:0;width:auto}
table.frame>tfoot{display:none}
.stampline{font-size:.75rem;color:var(--muted);margin:.3rem 0;word-break:break-all}
.history table{font-size:.82rem}
table.checks td{vertical-align:middle}
table.checks tr.pass .verdict{color:var(--ok);background:var(--ok-bg);border:1px solid var(--ok)}
table.checks tr.fail .verdict{color:var(--bad);background:var(--bad-bg);border:1px solid var(--bad)}
table.checks tr.fixed .verdict{color:var(--warn);background:var(--warn-bg);border:1px dashed var(--warn)}
.titleblock{display:grid;grid-template-columns:1fr auto;gap:1rem;border:2px solid var(--ink);padding:.75rem 1rem;margin-bottom:1rem}
.titleblock h1{margin:.1rem 0;font-size:1.5rem}
.titleblock .kicker{margin:0;color:var(--muted);text-transform:uppercase;letter-spacing:.06em;font-size:.75rem}
.titleblock dl{display:grid;grid-template-columns:auto auto;gap:.1rem .75rem;margin:0;font-size:.85rem}
.titleblock dt{color:var(--muted)}
.titleblock dd{margin:0;font-weight:600}
nav.pkg{font-size:.9rem;margin:.5rem 0 1rem}
.status{border-left:4px solid var(--accent);background:var(--band);padding:.5rem .9rem;margin:1rem 0}
.status.has-errors{border-color:var(--bad)}
.status.has-fail{border-color:var(--warn)}
.status p{margin:.2rem 0}
.status ul{margin:.3rem 0;padding-left:1.2rem}
.calc{border:1px solid var(--rule);border-radius:4px;margin:1rem 0;padding:.25rem .75rem}
.row{padding:.45rem 0;border-bottom:1px dotted var(--rule);break-inside:avoid}
.row:last-child{border-bottom:0}
.row math{font-size:1.1em}
.eq{overflow-x:auto;overflow-y:hidden}
.eq math{math-style:normal;display:inline-block;margin:.15rem 0}
.note{font-size:.82rem;color:var(--muted);display:flex;flex-wrap:wrap;gap:.2rem .9rem}
.note .desc{color:var(--ink)}
.loc{color:var(--muted);font-size:.78rem;text-decoration:none;font-family:ui-monospace,Menlo,monospace}
.input .eq math{color:var(--accent)}
.check{display:grid;grid-template-columns:4.2rem 1fr;gap:.5rem;align-items:start}
.verdict{display:inline-block;font-weight:700;font-size:.78rem;letter-spacing:.05em;padding:.1rem .4rem;border-radius:3px;text-align:center}
.pass .verdict{color:var(--ok);background:var(--ok-bg);border:1px solid var(--ok)}
.fail .verdict{color:var(--bad);background:var(--bad-bg);border:1px solid var(--bad)}
.fixed .verdict{color:var(--warn);background:var(--warn-bg);border:1px dashed var(--warn)}
.error,.blocked{background:var(--bad-bg);padding:.45rem .6rem;margin:.3rem -.6rem}
.blocked{background:var(--warn-bg)}
.error pre,.blocked pre{margin:0;white-space:pre-wrap;word-break:break-all}
.error mark{background:var(--bad);color:#fff}
.msg{margin:.2rem 0 0;font-size:.9rem}
.msg .hint{color:var(--muted)}
.note .links a{margin:0 .1rem}
.assumed{color:var(--warn)}
details.trace{font-size:.8rem;color:var(--muted);margin:.1rem 0 0}
details.trace summary{cursor:pointer}
details.trace p,details.trace ul{margin:.2rem 0 .2rem 1rem}
.assumption{border-left:4px solid var(--warn);background:var(--warn-bg);padding:.3rem .8rem;margin:1rem 0}
.assumption p{margin:.3rem 0}
table.diff del{background:var(--bad-bg);text-decoration:line-through;text-decoration-color:var(--bad)}
table.diff ins{background:var(--ok-bg);text-decoration:none}
table.diff .kind{font-size:.78rem;font-weight:700;white-space:nowrap}
table.diff tr.check-flipped .kind,table.diff tr.status-changed .kind{color:var(--bad)}
table.diff tr.input-changed .kind,table.diff tr.formula-changed .kind{color:var(--warn)}
.use .usehead{margin:.1rem 0}
.use .kw{font-weight:700;color:var(--accent)}
.instance{border-left:3px solid var(--rule);margin:.3rem 0 .2rem .4rem;padding-left:.8rem}
.setby{color:var(--accent);font-weight:600}
.row.set .eq math{color:var(--accent)}
p.caption{font-weight:600;margin-bottom:.2rem}
.comment{color:var(--muted);font-style:italic;margin:.3rem 0}
.util{font-variant-numeric:tabular-nums}
.caution{border:1px solid var(--warn);background:var(--warn-bg);padding:.6rem .9rem;margin:1.5rem 0;font-size:.85rem}
.graph figure{margin:.5rem 0;overflow-x:auto;border:1px solid var(--rule);border-radius:4px;padding:.5rem}
.graph svg{display:block;max-width:none;height:auto}
.graph a{text-decoration:none}
footer{margin-top:2rem;border-top:1px solid var(--rule);padding-top:.5rem;font-size:.78rem;color:var(--muted)}
@media print{
 body{max-width:none;padding:0;font-size:10.5pt}
 nav.pkg{display:none}
 a{color:inherit;text-decoration:none}
 .calc,.titleblock,.status,table,tr{break-inside:avoid}
 .error,.blocked,.pass .verdict,.fail .verdict{-webkit-print-color-adjust:exact;print-color-adjust:exact}
 h2{break-after:avoid}
 table.frame{display:table;width:100%;border-collapse:collapse}
 table.frame>thead{display:table-header-group}
 table.frame>tfoot{display:table-footer-group}
 table.frame>tbody{display:table-row-group}
 table.frame>*>tr{display:table-row}
 table.frame>*>tr>td{display:table-cell}
 .titleblock{margin-bottom:4mm}
 details.trace{display:none}
 .graph figure{overflow:visible}
 .graph svg{max-width:100%}
 @page{size:A4;margin:14mm 14mm}
}
`
