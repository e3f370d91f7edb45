package render

// pageCSS is the one stylesheet every page carries inline: no fonts or
// scripts from elsewhere, system fonts only.
//
// The look is sheaf's own: ink on warm paper, a drawing-office title block
// of ruled cells, and checks drawn as a stamp ("holds" / "not met") beside a
// reach bar that shows how far the value goes towards its limit. Blue-black
// ink marks what holds, vermilion what does not, ochre what is assumed.
//
// Two views share one page: the issue view (what a signed calc sheet shows)
// and the checker view, which adds every element of class "ck": positions,
// uses, used-by, rests-on, who set an input. The switch is a checkbox read by
// :has(), so no script is needed; print follows the switch, and the switch
// starts on the issue view.
//
// On paper the frame table repeats the title block at the head of every
// page and the stamp at its foot, the page's margin box counts "page x of
// y", a statement stays with its substitution and result, long equations
// wrap between their steps, and screen-only parts (the view switch, the
// navigation, the graph, hints) stay off.
const pageCSS = `
:root{--ink:#1b1d2a;--muted:#5e5a52;--rule:#cfc7b6;--paper:#fffdf8;--band:#f4efe3;--accent:#32408f;
--holds:#23306e;--holds-bg:#eceffa;--short:#b3261e;--short-bg:#fdecea;--warn:#7a5200;--warn-bg:#fbf3df}
*{box-sizing:border-box}
html{-webkit-text-size-adjust:100%;text-size-adjust:100%}
body{margin:0 auto;max-width:62rem;padding:1.25rem 1.25rem 3rem;color:var(--ink);background:var(--paper);
font:16px/1.5 Charter,"Bitstream Charter","Sitka Text",Cambria,"DejaVu Serif",Georgia,serif;overflow-wrap:break-word}
a{color:var(--accent)}
h1,h2,h3,table,.titleblock,nav.pkg,.note,.stampline,footer,.stamp,.caution,.status{font-family:system-ui,-apple-system,"Segoe UI",Roboto,"Noto Sans",sans-serif}
h1,h2,h3{line-height:1.25}
h2{border-bottom:2px solid var(--ink);padding-bottom:.15rem;margin-top:2rem;font-size:1.2rem}
code,pre,.src{font-family:ui-monospace,"Cascadia Mono","DejaVu Sans Mono",Menlo,monospace;font-size:.88em}
img,svg{max-width:100%}
table{border-collapse:collapse;width:100%;margin:.75rem 0;font-size:.88rem}
th,td{border:1px solid var(--rule);padding:.3rem .45rem;text-align:left;vertical-align:top}
th{background:var(--band);font-weight:600}
td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
td code{overflow-wrap:anywhere}
td.date{white-space:nowrap}
table.frame,table.frame>thead,table.frame>tbody,table.frame>tfoot,table.frame>*>tr,table.frame>*>tr>td{display:block;border:0;padding:0;margin:0;width:auto;font-size:inherit;font-family:inherit}
table.frame>tfoot{display:none}
.scroll{overflow-x:auto;margin:.75rem 0}
.scroll>table{margin:0}
.stampline{font-size:.72rem;color:var(--muted);margin:.3rem 0;overflow-wrap:anywhere}
.titleblock{border:2px solid var(--ink);margin-bottom:1rem;background:#fff}
.tb-head{padding:.55rem .8rem;border-bottom:1px solid var(--ink)}
.titleblock h1{margin:.1rem 0;font-size:1.4rem}
.titleblock .kicker{margin:0;color:var(--muted);font-size:.8rem;font-weight:600}
.titleblock .sheetno{float:right;margin:0 0 .2rem 1rem;font-weight:700;font-size:.85rem;border:1.5px solid var(--ink);padding:.05rem .5rem;background:var(--band)}
.titleblock .subject{margin:.15rem 0 0;font-size:.9rem}
.titleblock dl{display:grid;grid-template-columns:repeat(auto-fill,minmax(10.5rem,1fr));margin:0;font-size:.82rem}
.titleblock dl>div{padding:.25rem .6rem;border-right:1px solid var(--rule);border-bottom:1px solid var(--rule);min-width:0}
.titleblock dt{color:var(--muted);font-size:.7rem}
.titleblock dd{margin:0;font-weight:600}
.titleblock .date{white-space:nowrap}
nav.pkg{font-size:.88rem;margin:.5rem 0 1rem;display:flex;flex-wrap:wrap;gap:.3rem 1rem;align-items:center}
.viewswitch{display:inline-flex;align-items:center;gap:.35rem;margin-left:auto;padding:.1rem .5rem;border:1px solid var(--rule);border-radius:2px;background:var(--band);cursor:pointer}
body:not(:has(#checker-view:checked)) .ck{display:none!important}
body:has(#checker-view:checked) .iv{display:none!important}
.status{border:1px solid var(--rule);border-top:4px solid var(--holds);background:var(--band);padding:.5rem .9rem;margin:1rem 0}
.status.has-errors{border-top-color:var(--short)}
.status.has-fail{border-top-color:var(--short)}
.status p{margin:.2rem 0}
.status ul{margin:.3rem 0;padding-left:1.2rem}
.calc{border-left:3px double var(--rule);margin:1rem 0;padding:.1rem 0 .1rem .8rem}
.row{padding:.45rem 0;border-bottom:1px solid var(--band);break-inside:avoid}
.row:last-child{border-bottom:0}
.eq{display:flex;flex-wrap:wrap;align-items:baseline;column-gap:.35em;max-width:100%;overflow-x:auto;overflow-y:hidden}
.eq math{math-style:normal;display:inline-block;margin:.15rem 0;font-size:1.08em;max-width:100%}
.eq{padding-left:1.5em}
.eq math:first-child{margin-left:-1.5em}
.note{font-size:.8rem;color:var(--muted);display:flex;flex-wrap:wrap;gap:.15rem .9rem}
.note .desc{color:var(--ink)}
.loc{color:var(--muted);font-size:.76rem;text-decoration:none;font-family:ui-monospace,Menlo,monospace}
.input .eq math{color:var(--accent)}
.check{display:grid;grid-template-columns:5.6rem minmax(0,1fr);gap:.6rem;align-items:start}
.stamp{display:block;font-weight:700;font-size:.74rem;padding:.2rem .3rem;text-align:center;border:2px solid currentColor;border-radius:50% / 40%;transform:rotate(-4deg);margin-top:.15rem}
.pass .stamp{color:var(--holds);background:var(--holds-bg)}
.fail .stamp{color:var(--short);background:var(--short-bg)}
.fixed .stamp{color:var(--warn);background:var(--warn-bg);border-style:dashed}
.inval{font-size:.82rem;color:var(--muted);margin:.05rem 0}
.inval math{color:var(--ink);font-size:1.1em}
.reach{display:flex;align-items:center;gap:.6rem;font-size:.8rem;margin:.2rem 0;font-family:system-ui,sans-serif}
.reach .bar{position:relative;flex:0 0 9rem;height:.55rem;border:1px solid var(--ink);background:repeating-linear-gradient(90deg,#fff 0 10%,var(--band) 10% 20%)}
.reach .bar i{position:absolute;left:0;top:0;bottom:0;background:var(--holds)}
.reach .bar b{position:absolute;left:80%;top:-.25rem;bottom:-.25rem;border-left:2px solid var(--ink)}
.fail .reach .bar i{background:var(--short)}
.error,.blocked{background:var(--short-bg);padding:.45rem .6rem;margin:.3rem 0}
.blocked{background:var(--warn-bg)}
.error pre,.blocked pre{margin:0;white-space:pre-wrap;overflow-wrap:anywhere}
.error mark{background:var(--short);color:#fff}
.msg{margin:.2rem 0 0;font-size:.9rem}
.msg .hint{color:var(--muted)}
.note .links a{margin:0 .1rem}
.assumed{color:var(--warn)}
details.trace{font-size:.8rem;color:var(--muted);margin:.1rem 0 0}
details.trace summary{cursor:pointer}
details.trace p,details.trace ul{margin:.2rem 0 .2rem 1rem}
.assumption{border-left:4px solid var(--warn);background:var(--warn-bg);padding:.3rem .8rem;margin:1rem 0}
.assumption p{margin:.3rem 0}
table.checks td{vertical-align:middle}
table.checks .stamp{transform:none;border-radius:2px;border-width:1px;white-space:nowrap}
table.checks tr.pass .stamp{color:var(--holds);background:var(--holds-bg)}
table.checks tr.fail .stamp{color:var(--short);background:var(--short-bg)}
table.diff del{background:var(--short-bg);text-decoration:line-through;text-decoration-color:var(--short)}
table.diff ins{background:var(--holds-bg);text-decoration:none}
table.diff .kind{font-size:.78rem;font-weight:700;white-space:nowrap}
table.diff tr.check-flipped .kind,table.diff tr.status-changed .kind{color:var(--short)}
table.diff tr.input-changed .kind,table.diff tr.formula-changed .kind{color:var(--warn)}
.use .usehead{margin:.1rem 0}
.use .kw{font-weight:700;color:var(--accent)}
.instance{border-left:2px solid var(--rule);margin:.3rem 0 .2rem .3rem;padding-left:.7rem}
.tplnotes{font-size:.82rem;margin:.3rem 0 .3rem .3rem}
.tplnotes ul{margin:.1rem 0 .3rem;padding-left:1.2rem}
.tplnotes .leftout{border-left:3px dashed var(--muted);padding-left:.5rem;margin:.2rem 0}
.setby{color:var(--accent);font-weight:600}
.row.set .eq math{color:var(--accent)}
p.caption{font-weight:600;margin-bottom:.2rem}
.comment{color:var(--muted);font-style:italic;margin:.3rem 0}
.caution{border:2px solid var(--warn);background:var(--warn-bg);padding:.6rem .9rem;margin:1.5rem 0;font-size:.85rem;break-inside:avoid}
.graph figure{margin:.5rem 0;overflow-x:auto;border:1px solid var(--rule);padding:.5rem;background:#fff}
.graph svg{display:block;max-width:none;height:auto}
.graph a{text-decoration:none}
.fig{margin:.4rem 0 .2rem;max-width:27rem}
.fig svg.plot{display:block;width:100%;height:auto;border:1px solid var(--band)}
.fig figcaption{font-size:.76rem;color:var(--muted);font-family:system-ui,-apple-system,"Segoe UI",Roboto,"Noto Sans",sans-serif}
footer{margin-top:2rem;border-top:1px solid var(--rule);padding-top:.5rem;font-size:.76rem;color:var(--muted)}
@media (max-width:34rem){
 body{padding:.75rem .6rem 2rem;font-size:15px}
 .titleblock dl{grid-template-columns:repeat(auto-fill,minmax(8.5rem,1fr))}
 .check{grid-template-columns:minmax(0,1fr);gap:.2rem}
 .stamp{display:inline-block;transform:none}
 .reach .bar{flex-basis:6rem}
 .viewswitch{margin-left:0}
 table:not(.frame){display:block;overflow-x:auto;max-width:100%}
 .titleblock .sheetno{float:none;display:inline-block;margin:0 0 .2rem}
}
@page{margin:12mm 12mm 14mm;
 @bottom-right{content:"page " counter(page) " of " counter(pages);font:8pt system-ui,sans-serif;color:#333}}
@media print{
 html,body{background:#fff}
 body{max-width:none;padding:0;font-size:10pt}
 nav.pkg,.viewswitch,.graph,.hint-screen{display:none!important}
 a{color:inherit;text-decoration:none}
 .row,.titleblock,.status>p,tr,.caution,.assumption,.stamp,.reach{break-inside:avoid}
 .error,.blocked,.stamp,.reach .bar i,.titleblock,.status{-webkit-print-color-adjust:exact;print-color-adjust:exact}
 h2,h3,p.caption,.caution{break-after:avoid}
 footer{break-before:avoid;break-inside:avoid;margin-top:3mm}
 body:has(#print-graph:checked) section.graph{display:block!important;break-before:page}
 section.graph figure{border:0;padding:0;margin:0}
 .graph svg{max-width:100%;max-height:215mm;width:auto}
 .fig{break-inside:avoid;max-width:120mm}
 .fig svg.plot{-webkit-print-color-adjust:exact;print-color-adjust:exact}
 .row.use{break-inside:auto}
 .use .usehead{break-after:avoid}
 table.frame{display:table;width:100%;border-collapse:collapse;table-layout:fixed}
 table.frame>thead{display:table-header-group}
 table.frame>tfoot{display:table-footer-group}
 table.frame>tbody{display:table-row-group}
 table.frame>*>tr{display:table-row}
 table.frame>*>tr>td{display:table-cell}
 .titleblock{margin-bottom:2.5mm;border-width:1.5px;line-height:1.25}
 .tb-head{padding:1.2mm 2.5mm}
 .titleblock .kicker{font-size:7.5pt}
 .titleblock h1{font-size:12pt;margin:.3mm 0}
 .titleblock .subject{font-size:8pt;margin:0}
 .titleblock .sheetno{font-size:8.5pt}
 .titleblock dl{grid-template-columns:repeat(4,minmax(0,1fr));font-size:7.5pt}
 .titleblock dt{font-size:6.5pt}
 .titleblock dl>div{padding:.4mm 2mm}
 .scroll{overflow:visible}
 table{font-size:8pt}
 td.num{white-space:normal}
 th,td{padding:.6mm 1.2mm;overflow-wrap:anywhere}
 .eq{overflow:visible}
 .eq math{font-size:1em}
 .eq math.long{font-size:.82em}
 .eq math.longer{font-size:.68em}
 .calc{border-left-width:2px}
 .stampline{font-size:7pt}
}
`
