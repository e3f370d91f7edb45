package render

import (
	"strconv"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	extast "github.com/yuin/goldmark/extension/ast"
	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
)

// sheetPage renders one sheet: its title block and revision history, the
// tally of its results, checks and errors, the prose with every formula
// block drawn in place, the dependency graph and the inputs register.
// prose renders the Markdown of one sheet after another. Building a
// goldmark instance costs more than rendering a page, so each rendering
// goroutine keeps one and points its block renderer at the current sheet.
type prose struct {
	md     goldmark.Markdown
	blocks *blockRenderer
}

func newProse() *prose {
	blocks := &blockRenderer{}
	md := goldmark.New(
		goldmark.WithExtensions(sheets.Extensions()...),
		goldmark.WithRendererOptions(renderer.WithNodeRenderers(util.Prioritized(blocks, 100))),
	)
	return &prose{md: md, blocks: blocks}
}

func (pr *prose) render(p *page, s *project.Sheet, digits int) error {
	*pr.blocks = blockRenderer{sheet: s, digits: digits}
	freshCells(s.Doc.Doc)
	return pr.md.Renderer().Render(&p.Buffer, s.Doc.Source, s.Doc.Doc)
}

// freshCells clears what goldmark's table renderer wrote onto the cells of
// the tree the last time it rendered them (it appends the alignment to a
// cell's style attribute), so that a sheet rendered again, as the preview
// does after an edit elsewhere, gives the same bytes. Cells carry no
// attributes of their own: sheets are read without attribute syntax.
func freshCells(doc ast.Node) {
	_ = ast.Walk(doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if c, ok := n.(*extast.TableCell); ok && entering {
			c.RemoveAttributes()
		}
		return ast.WalkContinue, nil
	})
}

func sheetPage(pkg *project.Package, s *project.Sheet, opt Options, pr *prose) ([]byte, error) {
	digits := s.Digits(opt.Digits)
	p := &page{}
	// A page holds its prose and tables at about twice their source and
	// about a kilobyte per statement. Reserving that grows the buffer about
	// once; reserving 24 times the source, as once done, held half a
	// gigabyte for a large table (issue 8).
	p.Grow(16<<10 + 2*len(s.Doc.Source) + 1<<10*len(s.Calc.Statements))
	fr := sheetFrame(pkg, s, opt)
	fr.title = s.Title()
	fr.root = rel(s.Page)
	m := s.Doc.Meta
	fr.block = titleBlock{kicker: m.Project, heading: s.Title(), subject: m.Subject, fields: sheetFields(m, s.Path()),
		number: sheetNumber(pkg, s, m.Revision)}
	p.open(fr, opt.Version)
	history(p, m)
	statusSection(p, s, digits)

	p.f("<article class=\"prose\">\n")
	if err := pr.render(p, s, digits); err != nil {
		return nil, err
	}
	p.f("</article>\n")
	if !opt.NoGraphs && len(s.Calc.Statements) > 0 {
		svg, err := graphSVG(s, digits)
		if err != nil {
			return nil, err
		}
		p.f("<section class=\"graph\">\n<h2>Dependency graph</h2>\n<p class=\"loc hint-screen\">Each arrow runs from a statement to one that uses it; select a box to go to its statement. " +
			"<label><input type=\"checkbox\" id=\"print-graph\"> print the graph on a page of its own</label></p>\n<figure>\n")
		p.Write(svg)
		p.f("</figure>\n</section>\n")
	}
	inputsRegister(p, s)
	p.close(opt.Version, "Page of "+esc(s.Path())+".")
	return p.Bytes(), nil
}

// sheetNumber is a sheet's place in the package and its revision, "Sheet 2
// of 5 · Rev. B", as the corner of a title block numbers the sheets of a set.
func sheetNumber(pkg *project.Package, s *project.Sheet, rev string) string {
	if s.Number < 1 {
		return ""
	}
	n := "Sheet " + strconv.Itoa(s.Number) + " of " + strconv.Itoa(len(pkg.Sheets))
	if rev != "" {
		n += " · Rev. " + rev
	}
	return n
}

// history writes the revision history, when the front matter has one.
func history(p *page, m sheets.Meta) {
	if len(m.History) == 0 {
		return
	}
	p.f("<section class=\"history\">\n<table>\n<thead><tr><th>Rev.</th><th>Date</th><th>By</th><th>Revision</th></tr></thead>\n<tbody>\n")
	for _, r := range m.History {
		p.f("<tr><td>%s</td><td class=\"date\">%s</td><td>%s</td><td>%s</td></tr>\n", esc(r.Rev), esc(r.Date), esc(r.By), esc(r.Note))
	}
	p.f("</tbody>\n</table>\n</section>\n")
}

// statusSection writes the counts, the checks and the errors of a sheet.
func statusSection(p *page, s *project.Sheet, digits int) {
	c := s.Counts()
	class := "status"
	switch {
	case c.Errors > 0:
		class += " has-errors"
	case c.Fail > 0:
		class += " has-fail"
	}
	p.f("<section class=\"%s\">\n<p><strong>%s</strong> (%s) · <strong>%s</strong>: %s · <strong>%s</strong>",
		class, Count(c.Results, "result"), Count(c.Inputs, "input"), Count(c.Checks(), "check"), checkCounts(c), Count(c.Errors, "error"))
	if c.Blocked > 0 {
		p.f(" · %d not evaluated", c.Blocked)
	}
	p.f("</p>\n")
	if checks := sheetChecks(s, "", "", digits); len(checks) > 0 {
		checksTable(p, checks, false)
	}
	fixedSection(p, fixedChecks(s, "", "", digits), false)
	diags := append(append(diag.List{}, s.Doc.Diags...), s.Calc.Diags...)
	diags.Sort()
	if len(diags) > 0 {
		p.f("<ul>\n")
		for _, d := range diags {
			p.f("<li><a class=\"loc\" href=\"#%s\">%s</a> %s</li>\n", anchorOn(s, d.Pos), esc(d.Pos.String()), esc(messageText(d)))
		}
		p.f("</ul>\n")
	}
	p.f("</section>\n")
}

// checkRow is one check for a table of checks: the statement, its result,
// and the page and sheet it is on (empty on the sheet's own page).
type checkRow struct {
	st          *engine.Statement
	r           engine.Result
	page, sheet string
	digits      int    // the sheet's significant figures
	band        string // where the quantity sits in its band, if the check is one side of one
	fixed       bool   // the check cannot fail: shown apart, not counted
}

// sheetChecks lists a sheet's checks that came to a verdict, with the
// place in its band of a check that is one side of a tolerance band;
// fixed checks are listed apart (fixedChecks).
func sheetChecks(s *project.Sheet, page, sheet string, digits int) []checkRow {
	var out []checkRow
	for _, st := range s.Calc.Statements {
		if r := s.Calc.Result(st); r.Status == engine.Pass || r.Status == engine.Fail {
			if fixed, _ := s.Fixed(st); !fixed {
				out = append(out, checkRow{st, r, page, sheet, digits, BandText(s, st, digits), false})
			}
		}
	}
	return out
}

// checksTable lists checks with their verdict, both sides in the check's
// unit, and the utilisation, with a column naming the sheet when asked
// (for the package index, whose links go to each check's page).
func checksTable(p *page, checks []checkRow, sheetCol bool) {
	checksHead(p, sheetCol)
	for _, c := range checks {
		checkLine(p, c, sheetCol)
	}
	p.f("</tbody>\n</table>\n")
}

// checksHead opens a table of checks.
func checksHead(p *page, sheetCol bool) {
	p.f("<table class=\"checks\">\n<thead><tr><th></th>")
	if sheetCol {
		p.f("<th>Sheet</th>")
	}
	p.f("<th>Check</th><th>Left</th><th></th><th>Right</th><th>Demand / capacity</th><th>Description</th></tr></thead>\n<tbody>\n")
}

// checkLine is one row of a table of checks.
func checkLine(p *page, c checkRow, sheetCol bool) {
	st, r, digits := c.st, c.r, c.digits
	verdict, cls := Verdict(r.Status), "pass"
	switch {
	case c.fixed:
		verdict, cls = "fixed", "fixed"
	case r.Status == engine.Fail:
		cls = "fail"
	}
	p.f("<tr class=\"%s\"><td><span class=\"stamp\">%s</span></td>", cls, verdict)
	if sheetCol {
		p.f("<td>%s</td>", esc(c.sheet))
	}
	p.f("<td><a href=\"%s#%s\"><code>%s</code></a></td><td class=\"num\">%s</td><td>%s</td><td class=\"num\">%s</td><td class=\"num\">%s</td><td>%s</td></tr>\n",
		pageHref(c.page), anchor(st), esc(instancePrefix(st)+st.Formula), esc(ValueText(r.Left, r.Shown, digits)), esc(relations[st.Compare().Op]),
		esc(ValueText(r.Right, r.Shown, digits)), esc(utilisationCell(c)), esc(describe(st)))
}

// inputsRegister lists the sheet's inputs: name, value as written, unit,
// description and source.
func inputsRegister(p *page, s *project.Sheet) {
	var rows []*engine.Statement
	for _, st := range s.Calc.Statements {
		if st.IsInput() && s.Calc.Result(st).Status == engine.OK {
			rows = append(rows, st)
		}
	}
	p.f("<section class=\"register\">\n<h2>Inputs register</h2>\n")
	if len(rows) == 0 {
		p.f("<p>This sheet has no inputs of its own.</p>\n</section>\n")
		return
	}
	p.f("<table>\n<thead><tr><th>Name</th><th>Value</th><th>Unit</th><th>Description</th><th>Source</th><th class=\"ck\">Set by</th><th class=\"ck\">Line</th></tr></thead>\n<tbody>\n")
	for _, st := range rows {
		value, unit := InputText(st)
		p.f("<tr><td>%s</td><td class=\"num\">%s</td><td>%s</td><td>%s</td><td>%s</td><td class=\"ck\">%s</td><td class=\"ck\"><a class=\"loc\" href=\"#%s\">%d</a></td></tr>\n",
			symbolHTML(st.Name), esc(value), esc(unit), esc(st.Description), esc(st.Source), esc(SetBy(st)), anchor(st), st.Pos.Line)
	}
	p.f("</tbody>\n</table>\n</section>\n")
}

// SetBy says who gave an input its value: the sheet, the sheet through a
// use statement, or the template's default.
func SetBy(st *engine.Statement) string {
	switch {
	case st.Instance == "":
		return "this sheet"
	case st.Overridden && st.Use != nil:
		return "this sheet, in use " + st.Use.Name
	}
	return "template default (" + st.Instance + ")"
}
