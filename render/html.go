// Package render shows a compiled package: self-contained HTML pages with
// MathML formulas, a JSON document of every value, and terminal reports.
// It computes nothing; every number comes from the engine.
package render

import (
	"bytes"
	"fmt"
	"html"
	"path"
	"runtime"
	"strings"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
)

// Options control rendering.
type Options struct {
	// Digits is the number of significant figures for results when a sheet
	// does not set its own; 0 means project.DefaultDigits.
	Digits int
	// Version is the tool version printed in every footer.
	Version string
	// NoGraphs leaves the dependency graphs out; laying them out is the
	// slowest part of rendering.
	NoGraphs bool
	// GraphCache, when set, is a folder where graph layouts are kept by
	// the hash of their input, so that rebuilds lay out only what changed.
	GraphCache string
}

// File is one output file of a built package.
type File struct {
	Path string // inside the output folder, with forward slashes
	Data []byte
}

// Caution is printed on every page: the results of a calculation package
// support, and never replace, a qualified engineer's judgment.
const Caution = "Calculations support, and never replace, the judgment of a qualified engineer. " +
	"Insulation margins and high-voltage tests can hurt people: follow local codes, the applicable standards " +
	"and licensed practice, and leave high-voltage testing to trained people with the right equipment."

// HTML renders the package index and one page per sheet, in a fixed order.
func HTML(pkg *project.Package, opt Options) ([]File, error) {
	var files []File
	err := WriteHTML(pkg, opt, func(f File) error {
		files = append(files, f)
		return nil
	})
	return files, err
}

// WriteHTML renders the index and then each sheet's page, handing every
// page to emit as soon as it and all pages before it are ready. Pages are
// rendered in parallel but emitted in a fixed order, and only a few are
// held in memory at once.
func WriteHTML(pkg *project.Package, opt Options, emit func(File) error) error {
	if err := emit(File{Path: "index.html", Data: indexPage(pkg, opt)}); err != nil {
		return err
	}
	type result struct {
		file File
		err  error
	}
	workers := runtime.GOMAXPROCS(0)
	slots := make([]chan result, len(pkg.Sheets))
	for i := range slots {
		slots[i] = make(chan result, 1)
	}
	next := make(chan int)
	done := make(chan struct{})
	defer close(done)
	// A token bounds how far rendering runs ahead of emitting.
	tokens := make(chan struct{}, 2*workers)
	go func() {
		defer close(next)
		for i := range pkg.Sheets {
			select {
			case tokens <- struct{}{}:
			case <-done:
				return
			}
			select {
			case next <- i:
			case <-done:
				return
			}
		}
	}()
	for w := 0; w < workers; w++ {
		go func() {
			var g *grapher
			defer func() { g.close() }()
			for i := range next {
				s := pkg.Sheets[i]
				var data []byte
				var err error
				if g == nil && !opt.NoGraphs {
					g, err = newGrapher(opt.GraphCache)
				}
				if err == nil {
					data, err = sheetPage(s, opt, g)
				}
				if err != nil {
					err = fmt.Errorf("%s: %w", s.Path(), err)
				}
				slots[i] <- result{File{Path: s.Page, Data: data}, err}
			}
		}()
	}
	for i := range pkg.Sheets {
		r := <-slots[i]
		<-tokens
		if r.err != nil {
			return r.err
		}
		if err := emit(r.file); err != nil {
			return err
		}
	}
	return nil
}

func esc(s string) string { return html.EscapeString(s) }

// rel returns the path from a page to the package root: "../" for
// sheets/x.html, "../../" for sheets/sub/x.html.
func rel(page string) string {
	return strings.Repeat("../", strings.Count(page, "/"))
}

type page struct {
	bytes.Buffer
}

func (p *page) f(format string, args ...any) { fmt.Fprintf(&p.Buffer, format, args...) }

func (p *page) head(title, version string) {
	p.f("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
	p.f("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
	p.f("<meta name=\"generator\" content=\"sheaf %s\">\n<title>%s</title>\n<style>%s</style>\n</head>\n<body>\n",
		esc(version), esc(title), pageCSS)
}

func (p *page) foot(version, what string) {
	p.f("<aside class=\"caution\"><strong>Caution.</strong> %s</aside>\n", esc(Caution))
	p.f("<footer>%s Built by sheaf %s.</footer>\n</body>\n</html>\n", what, esc(version))
}

// titleBlock writes the sheet's title block from its front matter.
func (p *page) titleBlock(m sheets.Meta, title, sheetPath string) {
	p.f("<header class=\"titleblock\">\n<div>\n")
	if m.Project != "" {
		p.f("<p class=\"kicker\">%s</p>\n", esc(m.Project))
	}
	p.f("<h1>%s</h1>\n", esc(title))
	if m.Subject != "" {
		p.f("<p>%s</p>\n", esc(m.Subject))
	}
	p.f("</div>\n<dl>\n")
	for _, kv := range [][2]string{
		{"Client", m.Client}, {"Job", m.Job}, {"Sheet", sheetPath}, {"Revision", m.Revision}, {"Date", m.Date},
		{"Prepared", m.PreparedBy}, {"Checked", m.CheckedBy},
	} {
		if kv[1] != "" {
			p.f("<dt>%s</dt><dd>%s</dd>\n", kv[0], esc(kv[1]))
		}
	}
	p.f("</dl>\n</header>\n")
}

func sheetPage(s *project.Sheet, opt Options, g *grapher) ([]byte, error) {
	digits := s.Digits(opt.Digits)
	p := &page{}
	// Pages run to about ten times their source; growing once saves copies.
	p.Grow(16<<10 + 10*len(s.Doc.Source))
	title := s.Title()
	p.head(title, opt.Version)
	p.titleBlock(s.Doc.Meta, title, s.Path())
	p.f("<nav class=\"pkg\"><a href=\"%sindex.html\">Package index</a></nav>\n", rel(s.Page))
	statusSection(p, s, digits)

	blocks := &blockRenderer{sheet: s, digits: digits}
	md := goldmark.New(
		goldmark.WithExtensions(sheets.Extensions()...),
		goldmark.WithRendererOptions(renderer.WithNodeRenderers(util.Prioritized(blocks, 100))),
	)
	p.f("<article class=\"prose\">\n")
	if err := md.Renderer().Render(&p.Buffer, s.Doc.Source, s.Doc.Doc); err != nil {
		return nil, err
	}
	p.f("</article>\n")
	if g != nil && len(s.Calc.Statements) > 0 {
		svg, err := g.svg(graphDOT(s, digits))
		if err != nil {
			return nil, err
		}
		p.f("<section class=\"graph\">\n<h2>Dependency graph</h2>\n<p class=\"loc\">Each arrow runs from a statement to one that uses it; select a box to go to its statement.</p>\n<figure>\n")
		p.Write(svg)
		p.f("</figure>\n</section>\n")
	}
	inputsRegister(p, s)
	p.foot(opt.Version, "Page of "+esc(s.Path())+".")
	return p.Bytes(), nil
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
	p.f("<section class=\"%s\">\n<p><strong>%s</strong> (%s) · <strong>%s</strong>: %d pass, %d fail · <strong>%s</strong>",
		class, Count(c.Results, "result"), Count(c.Inputs, "input"), Count(c.Pass+c.Fail, "check"), c.Pass, c.Fail, Count(c.Errors, "error"))
	if c.Blocked > 0 {
		p.f(" · %d not evaluated", c.Blocked)
	}
	p.f("</p>\n")
	diags := append(append(diag.List{}, s.Doc.Diags...), s.Calc.Diags...)
	diags.Sort()
	if len(diags) > 0 {
		p.f("<ul>\n")
		for _, d := range diags {
			p.f("<li><a class=\"loc\" href=\"#L%d\">%s</a> %s</li>\n", d.Pos.Line, esc(d.Pos.String()), esc(messageText(d)))
		}
		p.f("</ul>\n")
	}
	p.f("</section>\n")
}

func messageText(d diag.Diagnostic) string {
	msg := d.Message
	if d.Severity == diag.Warning {
		msg = "warning: " + msg
	}
	if d.Hint != "" {
		msg += " — " + d.Hint
	}
	return msg
}

// inputsRegister lists the sheet's inputs: name, value as written, unit,
// description and source.
func inputsRegister(p *page, s *project.Sheet) {
	var rows []*engine.Statement
	for _, st := range s.Calc.Statements {
		if st.IsInput() && st.Status == engine.OK {
			rows = append(rows, st)
		}
	}
	p.f("<section class=\"register\">\n<h2>Inputs register</h2>\n")
	if len(rows) == 0 {
		p.f("<p>This sheet has no inputs of its own.</p>\n</section>\n")
		return
	}
	p.f("<table>\n<thead><tr><th>Name</th><th>Value</th><th>Unit</th><th>Description</th><th>Source</th><th>Line</th></tr></thead>\n<tbody>\n")
	for _, st := range rows {
		value, unit := InputText(st)
		p.f("<tr><td>%s</td><td class=\"num\">%s</td><td>%s</td><td>%s</td><td>%s</td><td><a class=\"loc\" href=\"#%s\">%d</a></td></tr>\n",
			symbolHTML(st.Name), esc(value), esc(unit), esc(st.Description), esc(st.Source), anchor(st), st.Pos.Line)
	}
	p.f("</tbody>\n</table>\n</section>\n")
}

// InputText returns an input's value and unit as the author wrote them.
func InputText(st *engine.Statement) (value, unit string) {
	e := st.Expr
	sign := ""
	if u, ok := e.(*engine.Unary); ok {
		e = u.X
		if u.Op == "-" {
			sign = "-"
		}
	}
	switch n := e.(type) {
	case *engine.Quantity:
		return sign + n.Text, n.Unit.Symbol
	case *engine.Number:
		return sign + n.Text, ""
	}
	return "", ""
}

func indexPage(pkg *project.Package, opt Options) []byte {
	p := &page{}
	title := packageTitle(pkg)
	p.head(title, opt.Version)
	var meta sheets.Meta
	for _, s := range pkg.Sheets {
		if s.Doc.Meta.Project != "" {
			meta = s.Doc.Meta
			break
		}
	}
	p.f("<header class=\"titleblock\">\n<div>\n<p class=\"kicker\">Calculation package</p>\n<h1>%s</h1>\n", esc(title))
	if meta.Client != "" {
		p.f("<p>%s</p>\n", esc(meta.Client))
	}
	p.f("</div>\n<dl>\n")
	if meta.Job != "" {
		p.f("<dt>Job</dt><dd>%s</dd>\n", esc(meta.Job))
	}
	p.f("<dt>Sheets</dt><dd>%d</dd>\n</dl>\n</header>\n", len(pkg.Sheets))

	c := pkg.Counts()
	class := "status"
	if c.Errors > 0 {
		class += " has-errors"
	} else if c.Fail > 0 {
		class += " has-fail"
	}
	p.f("<section class=\"%s\"><p><strong>%s</strong> · <strong>%s</strong>: %d pass, %d fail · <strong>%s</strong></p></section>\n",
		class, Count(c.Results, "result"), Count(c.Pass+c.Fail, "check"), c.Pass, c.Fail, Count(c.Errors, "error"))

	p.f("<h2>Sheets</h2>\n<table>\n<thead><tr><th>Sheet</th><th>Subject</th><th>Rev.</th><th>Results</th><th>Pass</th><th>Fail</th><th>Errors</th></tr></thead>\n<tbody>\n")
	for _, s := range pkg.Sheets {
		sc := s.Counts()
		p.f("<tr><td><a href=\"%s\">%s</a><br><span class=\"loc\">%s</span></td><td>%s</td><td>%s</td><td class=\"num\">%d</td><td class=\"num\">%d</td><td class=\"num\">%d</td><td class=\"num\">%d</td></tr>\n",
			esc(s.Page), esc(s.Title()), esc(s.Path()), esc(s.Doc.Meta.Subject), esc(s.Doc.Meta.Revision), sc.Results, sc.Pass, sc.Fail, sc.Errors)
	}
	p.f("</tbody>\n</table>\n")

	if len(pkg.Diags) > 0 {
		p.f("<h2>Errors</h2>\n<ul>\n")
		for _, d := range pkg.Diags {
			page := pageOf(pkg, d.Pos.File)
			p.f("<li><a class=\"loc\" href=\"%s#L%d\">%s</a> %s</li>\n", esc(page), d.Pos.Line, esc(d.Pos.String()), esc(messageText(d)))
		}
		p.f("</ul>\n")
	}
	p.foot(opt.Version, "Package index.")
	return p.Bytes()
}

func pageOf(pkg *project.Package, file string) string {
	for _, s := range pkg.Sheets {
		if s.Path() == file {
			return s.Page
		}
	}
	return ""
}

// packageTitle names the package: the project named in the sheets, else
// the folder's name.
func packageTitle(pkg *project.Package) string {
	for _, s := range pkg.Sheets {
		if s.Doc.Meta.Project != "" {
			return s.Doc.Meta.Project
		}
	}
	return path.Base(strings.TrimRight(strings.ReplaceAll(pkg.Root, "\\", "/"), "/"))
}
