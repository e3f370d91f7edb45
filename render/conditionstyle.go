package render

// conditionsCSS styles the conditions on a page: case, sweep and sample
// rows, the table of cases beside a statement, a check's governing line
// and its block under the tolerances, a sweep's table and plot. The
// tables stay as wide as their figures and scroll inside their box on a
// narrow screen; on paper they set smaller and wrap.
const conditionsCSS = `
.cond .condhead{margin:.1rem 0;font-family:system-ui,-apple-system,"Segoe UI",Roboto,"Noto Sans",sans-serif;font-size:.92rem}
.cond .kw,.governs .kw{font-weight:700;color:var(--accent)}
.cond .eq.sets math{color:var(--accent)}
.condnote,.governs,.tollimits,.spreadline{font-size:.8rem;color:var(--muted);margin:.1rem 0;font-family:system-ui,sans-serif}
.governs{color:var(--ink)}
.short{color:var(--short)}
strong.holds{color:var(--holds)}
.casetable,.sweeptable{margin:.3rem 0}
table.cases,table.sweep{width:auto;margin:0;font-size:.8rem}
table.cases th,table.cases td,table.sweep th,table.sweep td{padding:.15rem .4rem}
table.cases tbody th{font-weight:400;white-space:nowrap}
table.cases th.gov,table.cases td.gov{background:var(--holds-bg)}
table.cases td.short,table.sweep td.short{color:var(--short)}
.govmark{font-size:.68rem;font-weight:700;text-transform:uppercase;letter-spacing:.03em;color:var(--accent)}
table.sweep tr.worst td{background:var(--warn-bg)}
.spread{border-left:3px solid var(--rule);padding:.1rem 0 .1rem .6rem;margin:.3rem 0;font-size:.82rem;font-family:system-ui,sans-serif}
.spread .spreadhead{margin:0;font-weight:600}
.spread ul{margin:.1rem 0;padding-left:1.1rem}
.spread math{font-size:1.05em}
figure.sweepplot{margin:.4rem 0;max-width:30rem}
figure.sweepplot svg{display:block;width:100%;height:auto}
figure.sweepplot figcaption{font-size:.76rem;color:var(--muted);font-family:system-ui,sans-serif}
@media print{
 table.cases,table.sweep{font-size:7pt}
 .spread,figure.sweepplot{break-inside:avoid}
 table.sweep tr.worst td,table.cases .gov{-webkit-print-color-adjust:exact;print-color-adjust:exact}
}
`
