package render

import (
	"math"
	"sort"
	"strings"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// packagePages renders the pages of the package as a whole: the index,
// the inputs, assumptions and standards registers and, when an audit was
// run, the audit, handing each to emit before the next is rendered.
func packagePages(pkg *project.Package, opt Options, emit func(File) error) error {
	ds := digestsOf(pkg, opt)
	pages := []pageMaker{
		{"index.html", func() []byte { return indexPage(pkg, opt, ds) }},
		{"inputs.html", func() []byte { return inputsPage(pkg, opt, ds) }},
		{"assumptions.html", func() []byte { return assumptionsPage(pkg, opt, ds) }},
		{"standards.html", func() []byte { return standardsPage(pkg, opt, ds) }},
	}
	if opt.Audit != nil {
		pages = append(pages, pageMaker{"audit.html", func() []byte { return auditPage(pkg, opt, ds, *opt.Audit) }})
	}
	for _, pg := range pages {
		if err := emit(File{Path: pg.path, Data: pg.render()}); err != nil {
			return err
		}
	}
	// The data files the tables read, as read, for their links.
	for _, d := range pkg.DataFiles() {
		if err := emit(File{Path: SourcesDir + d.Path, Data: d.Data}); err != nil {
			return err
		}
	}
	return nil
}

// pageMaker renders one package page.
type pageMaker struct {
	path   string
	render func() []byte
}

// packageBlock is the title block of the package pages.
func packageBlock(pkg *project.Package, heading string) titleBlock {
	b := titleBlock{kicker: packageTitle(pkg), heading: heading}
	var client, job string
	revs := map[string]bool{}
	var revList []string
	for _, s := range pkg.Sheets {
		m := s.Doc.Meta
		if client == "" {
			client = m.Client
		}
		if job == "" {
			job = m.Job
		}
		if m.Revision != "" && !revs[m.Revision] {
			revs[m.Revision] = true
			revList = append(revList, m.Revision)
		}
	}
	sort.Strings(revList)
	b.fields = [][2]string{{"Client", client}, {"Job", job}, {"Sheets", Count(len(pkg.Sheets), "sheet")}, {"Revisions", strings.Join(revList, ", ")}}
	return b
}

func packagePage(pkg *project.Package, opt Options, heading string) *page {
	p := &page{}
	fr := packageFrame(pkg, opt)
	fr.title = heading + " — " + packageTitle(pkg)
	fr.block = packageBlock(pkg, heading)
	p.open(fr, opt.Version)
	return p
}

func indexPage(pkg *project.Package, opt Options, ds []*Digest) []byte {
	p := packagePage(pkg, opt, "Calculation package")
	ix := indexSheets(pkg, ds)
	c := pkg.Counts()
	class := "status"
	if c.Errors > 0 {
		class += " has-errors"
	} else if c.Fail > 0 {
		class += " has-fail"
	}
	p.f("<section class=\"%s\"><p><strong>%s</strong> · <strong>%s</strong>: %s · <strong>%s</strong>",
		class, Count(c.Results, "result"), Count(c.Checks(), "check"), checkCounts(c), Count(c.Errors, "error"))
	if opt.Audit != nil {
		p.f(" · <a href=\"audit.html\"><strong>%s</strong></a> open", Count(opt.Audit.Open(), "audit finding"))
	}
	p.f("</p></section>\n")

	p.f("<h2>Sheets</h2>\n<table>\n<thead><tr><th>Sheet</th><th>Subject</th><th>Rev.</th><th>Results</th><th>Pass</th><th>Fail</th><th>Fixed</th><th>Errors</th></tr></thead>\n<tbody>\n")
	for _, s := range pkg.Sheets {
		sc := s.Counts()
		p.f("<tr><td><a href=\"%s\">%s</a><br><span class=\"loc\">%s</span></td><td>%s</td><td>%s</td><td class=\"num\">%d</td><td class=\"num\">%d</td><td class=\"num\">%d</td><td class=\"num\">%d</td><td class=\"num\">%d</td></tr>\n",
			pageHref(s.Page), esc(s.Title()), esc(s.Path()), esc(s.Doc.Meta.Subject), esc(s.Doc.Meta.Revision), sc.Results, sc.Pass, sc.Fail, sc.Fixed, sc.Errors)
	}
	p.f("</tbody>\n</table>\n")
	revisionHistory(p, pkg)

	// Every check of the package, the closest to its limit first.
	var all []indexedCheck
	anyFixed := false
	for _, d := range ds {
		all = append(all, d.checks...)
		anyFixed = anyFixed || !d.fixed.empty()
	}
	n := 0
	for _, c := range all {
		n += c.row.len()
	}
	for _, d := range ds {
		n += d.fixed.len()
	}
	p.Grow(n + 4096*(len(pkg.Sheets)+1)) // and a row of the table of sheets each
	if len(all) > 0 {
		sort.SliceStable(all, func(i, j int) bool { return worse(all[i], all[j]) })
		p.f("<h2>Checks, closest to their limits first</h2>\n")
		checksHead(p, true)
		for _, c := range all {
			p.Write(opt.Digests.read(c.row))
		}
		p.f("</tbody>\n</table>\n")
	}
	if anyFixed {
		fixedHead(p)
		checksHead(p, true)
		for _, d := range ds {
			p.Write(opt.Digests.read(d.fixed))
		}
		p.f("</tbody>\n</table>\n")
	}

	if len(pkg.Diags) > 0 {
		p.f("<h2>Errors</h2>\n<ul>\n")
		for _, d := range pkg.Diags {
			p.f("<li><a class=\"loc\" href=\"%s\">%s</a> %s</li>\n", ix.href("", "", d.Pos), esc(d.Pos.String()), esc(messageText(d)))
		}
		p.f("</ul>\n")
	}
	p.close(opt.Version, "Package index.")
	return p.Bytes()
}

// revisionHistory lists the revisions of every sheet, for the cover of
// an issued package.
func revisionHistory(p *page, pkg *project.Package) {
	n := 0
	for _, s := range pkg.Sheets {
		for _, r := range s.Doc.Meta.History {
			if n == 0 {
				p.f("<h2>Revision history</h2>\n<table class=\"history\">\n<thead><tr><th>Sheet</th><th>Rev.</th><th>Date</th><th>By</th><th>Revision</th></tr></thead>\n<tbody>\n")
			}
			n++
			p.f("<tr><td><a href=\"%s\">%s</a></td><td>%s</td><td class=\"date\">%s</td><td>%s</td><td>%s</td></tr>\n",
				pageHref(s.Page), esc(s.Path()), esc(r.Rev), esc(r.Date), esc(r.By), esc(r.Note))
		}
	}
	if n > 0 {
		p.f("</tbody>\n</table>\n")
	}
}

// worse orders checks for the package index: failures first, then by
// utilisation from highest, then checks without one.
func worse(a, b indexedCheck) bool {
	if (a.status == engine.Fail) != (b.status == engine.Fail) {
		return a.status == engine.Fail
	}
	ua, ub := a.util, b.util
	switch {
	case math.IsNaN(ua) && math.IsNaN(ub):
		return false
	case math.IsNaN(ua):
		return false
	case math.IsNaN(ub):
		return true
	}
	return ua > ub
}

// inputsPage is the package-wide inputs register.
func inputsPage(pkg *project.Package, opt Options, ds []*Digest) []byte {
	p := packagePage(pkg, opt, "Inputs register")
	p.f("<p>Every input of the package: a definition whose value is written directly, with the unit, description and source the author gave.</p>\n")
	p.f("<table>\n<thead><tr><th>Sheet</th><th class=\"ck\">Line</th><th>Name</th><th>Value</th><th>Unit</th><th>Description</th><th>Source</th><th class=\"ck\">Set by</th></tr></thead>\n<tbody>\n")
	// Sized once: the register of a large package runs to tens of MB.
	n := 0
	for _, d := range ds {
		n += d.inputs.len()
	}
	p.Grow(n + 4096)
	for _, d := range ds {
		p.Write(opt.Digests.read(d.inputs))
	}
	p.f("</tbody>\n</table>\n")
	p.close(opt.Version, "Inputs register.")
	return p.Bytes()
}

// inputRows are a sheet's rows of the package's inputs register.
func inputRows(s *project.Sheet) []byte {
	p := &page{}
	for _, st := range s.Calc.Statements {
		if !st.IsInput() || s.Calc.Result(st).Status != engine.OK {
			continue
		}
		value, unit := InputText(st)
		p.f("<tr><td><a href=\"%s\">%s</a></td><td class=\"ck\"><a class=\"loc\" href=\"%s#%s\">%d</a></td><td>%s</td><td class=\"num\">%s</td><td>%s</td><td>%s</td><td>%s</td><td class=\"ck\">%s</td></tr>\n",
			pageHref(s.Page), esc(s.Path()), pageHref(s.Page), anchor(st), st.Pos.Line, symbolHTML(st.Name), esc(value), esc(unit), esc(st.Description), esc(st.Source), esc(SetBy(st)))
	}
	return p.Bytes()
}

// assumptionsPage lists every assumption with every result that rests on
// it.
func assumptionsPage(pkg *project.Package, opt Options, ds []*Digest) []byte {
	p := packagePage(pkg, opt, "Assumptions register")
	p.f("<p>Assumptions are paragraphs that start <code>Assumption &lt;id&gt;:</code>, cited by statements with <code>; assumes: &lt;id&gt;</code>, and statements marked <code>; assume: &lt;why&gt;</code>. Each is listed with every result that rests on it, directly or through other results.</p>\n")
	n := 0
	for _, d := range ds {
		if d.assumptions.empty() {
			continue
		}
		if n == 0 {
			p.f("<table>\n<thead><tr><th>Sheet</th><th>Assumption</th><th>Text</th><th>Results resting on it</th></tr></thead>\n<tbody>\n")
		}
		n++
		p.Write(opt.Digests.read(d.assumptions))
	}
	if n == 0 {
		p.f("<p>The package states no assumptions.</p>\n")
	} else {
		p.f("</tbody>\n</table>\n")
	}
	p.close(opt.Version, "Assumptions register.")
	return p.Bytes()
}

// assumptionRows are a sheet's rows of the package's assumptions register.
func assumptionRows(s *project.Sheet) []byte {
	p := &page{}
	for _, a := range s.Calc.Assumptions {
		p.f("<tr><td><a href=\"%s\">%s</a></td><td><a href=\"%s#%s\">%s</a></td><td>%s</td><td>", pageHref(s.Page), esc(s.Path()),
			pageHref(s.Page), assumptionAnchor(a), esc(a.ID), esc(a.Text))
		for i, d := range a.Dependents {
			if i > 0 {
				p.f(", ")
			}
			name := symbolHTML(d.Name)
			if d.Kind == engine.Check {
				name = "check " + esc(d.Formula)
			}
			p.f("<a href=\"%s#%s\">%s</a>", pageHref(s.Page), anchor(d), name)
		}
		p.f("</td></tr>\n")
	}
	return p.Bytes()
}

// AuditHTML renders the audit page on its own; opt.Audit must be set.
func AuditHTML(pkg *project.Package, opt Options) []byte {
	return auditPage(pkg, opt, digestsOf(pkg, opt), *opt.Audit)
}

// auditPage lists the audit's findings, open ones first.
func auditPage(pkg *project.Package, opt Options, ds []*Digest, r audit.Report) []byte {
	p := packagePage(pkg, opt, "Audit")
	ix := indexSheets(pkg, ds)
	p.f("<section class=\"status%s\"><p><strong>%s</strong> open, %d accepted.</p></section>\n",
		map[bool]string{true: " has-fail", false: ""}[r.Open() > 0], Count(r.Open(), "finding"), len(r.Findings)-r.Open())
	for _, accepted := range []bool{false, true} {
		var rows []audit.Finding
		for _, f := range r.Findings {
			if f.Accepted == accepted {
				rows = append(rows, f)
			}
		}
		if len(rows) == 0 {
			continue
		}
		if accepted {
			p.f("<h2>Accepted findings</h2>\n")
		} else {
			p.f("<h2>Open findings</h2>\n")
		}
		p.f("<table>\n<thead><tr><th>Code</th><th>Where</th><th>Finding</th>")
		if accepted {
			p.f("<th>Accepted because</th>")
		}
		p.f("</tr></thead>\n<tbody>\n")
		for _, f := range rows {
			p.f("<tr><td><code>%s</code></td><td><a class=\"loc\" href=\"%s\">%s</a></td><td>%s</td>",
				esc(f.Code), ix.href(f.Sheet, f.Instance, f.Pos), esc(f.Pos.String()), esc(f.Message))
			if accepted {
				p.f("<td>%s</td>", esc(f.Reason))
			}
			p.f("</tr>\n")
		}
		p.f("</tbody>\n</table>\n")
	}
	p.f("<h2>What the audit looks for</h2>\n<table>\n<thead><tr><th>Code</th><th>Finding</th><th>Why it matters</th></tr></thead>\n<tbody>\n")
	for _, rule := range audit.Rules {
		p.f("<tr><td><code>%s</code></td><td>%s</td><td>%s</td></tr>\n", esc(rule.Code), esc(rule.Title), esc(rule.Why))
	}
	p.f("</tbody>\n</table>\n<p>To accept a finding at a statement, add <code>; accept &lt;code&gt;: &lt;reason&gt;</code> to it; for the sheet as a whole, list <code>&lt;code&gt;: &lt;reason&gt;</code> under <code>accept:</code> in the front matter.</p>\n")
	p.close(opt.Version, "Audit.")
	return p.Bytes()
}
