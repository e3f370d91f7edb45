// Package render shows a compiled package: self-contained HTML pages with
// MathML formulas, a JSON document of every value, and terminal reports.
// It computes nothing; every number comes from the engine.
package render

import (
	"bytes"
	"fmt"
	"html"
	"math"
	"path"
	"strconv"
	"strings"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
	"github.com/sheaf-calc/sheaf/units"
)

// Options control rendering.
type Options struct {
	// Digits is the number of significant figures for results when a sheet
	// does not set its own; 0 means project.DefaultDigits.
	Digits int
	// Version is the tool version printed in every footer.
	Version string
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
	files := []File{{Path: "index.html", Data: indexPage(pkg, opt)}}
	for _, s := range pkg.Sheets {
		data, err := sheetPage(s, opt)
		if err != nil {
			return nil, fmt.Errorf("%s: %w", s.Path(), err)
		}
		files = append(files, File{Path: s.Page, Data: data})
	}
	return files, nil
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

func sheetPage(s *project.Sheet, opt Options) ([]byte, error) {
	digits := s.Digits(opt.Digits)
	p := &page{}
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
	p.f("<section class=\"%s\">\n<p><strong>%d results</strong> (%d inputs) · <strong>%d checks</strong>: %d pass, %d fail · <strong>%d errors</strong>",
		class, c.Results, c.Inputs, c.Pass+c.Fail, c.Pass, c.Fail, c.Errors)
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

// blockRenderer draws formula blocks in place of the code the Markdown
// shows, and plain code blocks as code.
type blockRenderer struct {
	sheet  *project.Sheet
	digits int
	index  int // formula blocks seen so far
}

// RegisterFuncs implements renderer.NodeRenderer.
func (r *blockRenderer) RegisterFuncs(reg renderer.NodeRendererFuncRegisterer) {
	reg.Register(ast.KindFencedCodeBlock, r.fenced)
}

func (r *blockRenderer) fenced(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	if !entering {
		return ast.WalkSkipChildren, nil
	}
	fc := n.(*ast.FencedCodeBlock)
	if !sheets.IsFormulaBlock(fc, source) {
		lang := string(fc.Language(source))
		_, _ = w.WriteString("<pre><code")
		if lang != "" {
			_, _ = w.WriteString(` class="language-` + esc(lang) + `"`)
		}
		_, _ = w.WriteString(">")
		for i := 0; i < fc.Lines().Len(); i++ {
			seg := fc.Lines().At(i)
			_, _ = w.WriteString(esc(string(seg.Value(source))))
		}
		_, _ = w.WriteString("</code></pre>\n")
		return ast.WalkSkipChildren, nil
	}
	if r.index < len(r.sheet.Doc.Blocks) {
		_, _ = w.WriteString(r.block(r.index))
	}
	r.index++
	return ast.WalkSkipChildren, nil
}

// block draws one formula block: its statements and its comment lines, in
// the order written.
func (r *blockRenderer) block(bi int) string {
	b := r.sheet.Doc.Blocks[bi]
	byLine := map[int]*engine.Statement{}
	for _, st := range r.sheet.Calc.Statements {
		if st.Block == bi {
			byLine[st.Pos.Line] = st
		}
	}
	var out strings.Builder
	out.WriteString("<div class=\"calc\">\n")
	if len(byLine) == 0 {
		for _, d := range r.sheet.Calc.Diags {
			if d.Pos == b.Fence {
				out.WriteString(fmt.Sprintf("<div class=\"row error\" id=\"L%d\"><p class=\"msg\"><span class=\"loc\">%s</span> %s</p></div>\n",
					d.Pos.Line, esc(d.Pos.String()), esc(messageText(d))))
			}
		}
	}
	for _, l := range b.Lines {
		if st, ok := byLine[l.Pos.Line]; ok {
			out.WriteString(statementHTML(st, r.digits))
			continue
		}
		if t := strings.TrimSpace(l.Text); strings.HasPrefix(t, "#") {
			out.WriteString("<p class=\"comment\">" + esc(strings.TrimSpace(strings.TrimLeft(t, "#"))) + "</p>\n")
		}
	}
	out.WriteString("</div>\n")
	return out.String()
}

func anchor(st *engine.Statement) string { return "L" + strconv.Itoa(st.Pos.Line) }

// statementHTML draws one statement as the checker reads it.
func statementHTML(st *engine.Statement, digits int) string {
	var b strings.Builder
	switch st.Status {
	case engine.Failed, engine.Blocked, engine.Pending:
		return problemHTML(st)
	case engine.Pass, engine.Fail:
		return checkHTML(st, digits)
	}
	class := "row def"
	if st.IsInput() {
		class = "row input"
	}
	fmt.Fprintf(&b, "<div class=\"%s\" id=\"%s\">\n<div class=\"eq\"><math display=\"block\"><mrow>", class, anchor(st))
	b.WriteString(symbolMathML(st.Name))
	b.WriteString("<mo>=</mo>")
	if st.IsInput() {
		b.WriteString(formulaMathML(st.Expr, symbolic, digits))
	} else {
		sym := formulaMathML(st.Expr, symbolic, digits)
		sub := formulaMathML(st.Expr, substituted, digits)
		b.WriteString(sym)
		if sub != sym {
			b.WriteString("<mo>=</mo>" + sub)
		}
		b.WriteString("<mo>=</mo>" + valueMathML(st.Value, st.Shown, digits))
	}
	b.WriteString("</mrow></math></div>\n")
	b.WriteString(noteHTML(st))
	b.WriteString("</div>\n")
	return b.String()
}

func noteHTML(st *engine.Statement) string {
	var b strings.Builder
	b.WriteString("<div class=\"note\">")
	if st.Description != "" {
		b.WriteString("<span class=\"desc\">" + esc(st.Description) + "</span>")
	}
	if st.Source != "" {
		b.WriteString("<span class=\"srcref\">Source: " + esc(st.Source) + "</span>")
	}
	fmt.Fprintf(&b, "<a class=\"loc\" href=\"#%s\">%s</a>", anchor(st), esc(st.Pos.String()))
	b.WriteString("</div>\n")
	return b.String()
}

func checkHTML(st *engine.Statement, digits int) string {
	var b strings.Builder
	cls, verdict := "pass", "PASS"
	if st.Status == engine.Fail {
		cls, verdict = "fail", "FAIL"
	}
	cmp := st.Compare()
	fmt.Fprintf(&b, "<div class=\"row check %s\" id=\"%s\">\n<span class=\"verdict\">%s</span>\n<div>\n", cls, anchor(st), verdict)
	b.WriteString("<div class=\"eq\"><math display=\"block\"><mrow>")
	b.WriteString(formulaMathML(cmp, symbolic, digits))
	b.WriteString("<mspace width=\"1em\"></mspace><mo>⇒</mo><mspace width=\"1em\"></mspace><mrow>")
	b.WriteString(valueMathML(st.Left, st.Shown, digits))
	b.WriteString("<mo>" + esc(relations[cmp.Op]) + "</mo>")
	b.WriteString(valueMathML(st.Right, st.Shown, digits))
	b.WriteString("</mrow></mrow></math></div>\n")
	if u := UtilisationText(st.Utilisation); u != "" {
		b.WriteString("<div class=\"note\"><span class=\"util\">utilisation " + u + "</span></div>\n")
	}
	b.WriteString(noteHTML(st))
	b.WriteString("</div>\n</div>\n")
	return b.String()
}

// UtilisationText writes a utilisation as a percentage, or "" when it has
// no meaning.
func UtilisationText(u float64) string {
	if math.IsNaN(u) || math.IsInf(u, 0) {
		return ""
	}
	return units.FormatNumber(u*100, 3) + " %"
}

// problemHTML draws a statement that has an error or was not evaluated: its
// source with the error column marked, and the message.
func problemHTML(st *engine.Statement) string {
	var b strings.Builder
	cls := "error"
	if st.Status == engine.Blocked {
		cls = "blocked"
	}
	fmt.Fprintf(&b, "<div class=\"row %s\" id=\"%s\">\n<pre class=\"src\">%s</pre>\n", cls, anchor(st), markColumn(st))
	if st.Err != nil {
		fmt.Fprintf(&b, "<p class=\"msg\"><span class=\"loc\">%s</span> %s", esc(st.Err.Pos.String()), esc(st.Err.Message))
		if st.Err.Hint != "" {
			b.WriteString("<br><span class=\"hint\">" + esc(st.Err.Hint) + "</span>")
		}
		b.WriteString("</p>\n")
	}
	b.WriteString("</div>\n")
	return b.String()
}

// markColumn escapes a statement's text and marks the character its error
// points at.
func markColumn(st *engine.Statement) string {
	text := st.Text
	const limit = 400
	if st.Err == nil || st.Status != engine.Failed || st.Err.Pos.Line != st.Pos.Line {
		return esc(clip(text, limit))
	}
	r := []rune(text)
	i := st.Err.Pos.Col - st.Pos.Col
	if i < 0 || i >= len(r) {
		return esc(clip(text, limit))
	}
	start := max(0, i-limit/2)
	end := min(len(r), i+limit/2)
	out := esc(string(r[start:i])) + "<mark>" + esc(string(r[i])) + "</mark>" + esc(string(r[i+1:end]))
	if start > 0 {
		out = "…" + out
	}
	if end < len(r) {
		out += "…"
	}
	return out
}

func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n]) + "…"
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
	p.f("<section class=\"%s\"><p><strong>%d results</strong> · <strong>%d checks</strong>: %d pass, %d fail · <strong>%d errors</strong></p></section>\n",
		class, c.Results, c.Pass+c.Fail, c.Pass, c.Fail, c.Errors)

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
