package render

import (
	"math"
	"strconv"
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
	"github.com/sheaf-calc/sheaf/units"
)

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
	reg.Register(ast.KindParagraph, r.paragraph)
	reg.Register(ast.KindImage, r.image)
}

// paragraph draws prose paragraphs, and an assumption paragraph as a boxed
// assumption that lists what rests on it.
func (r *blockRenderer) paragraph(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	p := n.(*ast.Paragraph)
	if t := r.sheet.Doc.TableAt(p); t != nil {
		if entering {
			w.WriteString(`<p class="caption" id="T-` + esc(t.Name) + `">`)
		} else {
			w.WriteString("</p>\n")
		}
		return ast.WalkContinue, nil
	}
	a := r.sheet.Doc.AssumptionAt(p)
	if a == nil {
		if entering {
			w.WriteString("<p>")
		} else {
			w.WriteString("</p>\n")
		}
		return ast.WalkContinue, nil
	}
	if entering {
		w.WriteString(`<div class="assumption" id="A-` + esc(a.ID) + `"><p>`)
		return ast.WalkContinue, nil
	}
	w.WriteString("</p>")
	for _, ea := range r.sheet.Calc.Assumptions {
		if ea.Statement == nil && ea.ID == a.ID {
			if len(ea.Dependents) == 0 {
				w.WriteString(`<p class="links">No statement cites this assumption.</p>`)
			} else {
				w.WriteString(`<p class="links">`)
				writeLinks(w, "Resting on it:", ea.Dependents)
				w.WriteString("</p>")
			}
			break
		}
	}
	w.WriteString("</div>\n")
	return ast.WalkContinue, nil
}

func (r *blockRenderer) fenced(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	if !entering {
		return ast.WalkSkipChildren, nil
	}
	fc := n.(*ast.FencedCodeBlock)
	if !sheets.IsFormulaBlock(fc, source) {
		w.WriteString("<pre><code")
		if lang := string(fc.Language(source)); lang != "" {
			w.WriteString(` class="language-` + esc(lang) + `"`)
		}
		w.WriteString(">")
		for i := 0; i < fc.Lines().Len(); i++ {
			seg := fc.Lines().At(i)
			w.WriteString(esc(string(seg.Value(source))))
		}
		w.WriteString("</code></pre>\n")
		return ast.WalkSkipChildren, nil
	}
	if r.index < len(r.sheet.Doc.Blocks) {
		r.block(w, r.index)
	}
	r.index++
	return ast.WalkSkipChildren, nil
}

// block draws one formula block: its statements and its comment lines, in
// the order written.
func (r *blockRenderer) block(w sink, bi int) {
	b := r.sheet.Doc.Blocks[bi]
	byLine := map[int]*engine.Statement{}
	for _, st := range r.sheet.Calc.Statements {
		if st.Block == bi && st.Instance == "" {
			byLine[st.Pos.Line] = st
		}
	}
	w.WriteString("<div class=\"calc\">\n")
	if len(byLine) == 0 {
		for _, d := range r.sheet.Calc.Diags {
			if d.Pos == b.Fence {
				w.WriteString(`<div class="row error" id="L` + strconv.Itoa(d.Pos.Line) + `"><p class="msg"><span class="loc">` +
					esc(d.Pos.String()) + "</span> " + esc(messageText(d)) + "</p></div>\n")
			}
		}
	}
	for _, l := range b.Lines {
		if st, ok := byLine[l.Pos.Line]; ok {
			writeStatement(w, r.sheet.Calc, st, r.digits)
			continue
		}
		if t := strings.TrimSpace(l.Text); strings.HasPrefix(t, "#") {
			w.WriteString("<p class=\"comment\">" + esc(strings.TrimSpace(strings.TrimLeft(t, "#"))) + "</p>\n")
		}
	}
	w.WriteString("</div>\n")
}

// anchor is a statement's id on its page: L<line> for the sheet's own
// statements, I-<instance>-L<line> for those from a template, whose lines
// are the template's.
func anchor(st *engine.Statement) string {
	if st.Instance != "" {
		return "I-" + st.Instance + "-L" + strconv.Itoa(st.Pos.Line)
	}
	return "L" + strconv.Itoa(st.Pos.Line)
}

// writeStatement draws one statement as the checker reads it: the formula
// with symbols, the same with values, and the result.
func writeStatement(w sink, calc *engine.Sheet, st *engine.Statement, digits int) {
	if st.Kind == engine.Use && st.Status == engine.OK {
		writeUse(w, calc, st, digits)
		return
	}
	switch st.Status {
	case engine.Failed, engine.Blocked, engine.Pending:
		writeProblem(w, st)
		return
	case engine.Pass, engine.Fail:
		writeCheck(w, calc, st, digits)
		return
	}
	class := "row def"
	if st.IsInput() {
		class = "row input"
	}
	if st.Overridden {
		class += " set"
	}
	w.WriteString(`<div class="` + class + `" id="` + anchor(st) + "\">\n<div class=\"eq\"><math class=\"f\"><mrow>")
	w.WriteString(symbolMathML(st.Name))
	w.WriteString("<mo>=</mo>")
	writeFormula(w, st.Expr, symbolic, digits)
	if !st.IsInput() {
		if substitutes(st.Expr) {
			w.WriteString("<mo>=</mo>")
			writeFormula(w, st.Expr, substituted, digits)
		}
		// A name that only repeats an input already shows its value.
		if r, ok := st.Expr.(*engine.Ref); !ok || r.Target == nil || !r.Target.IsInput() {
			w.WriteString("<mo>=</mo>")
			w.WriteString(valueMathML(st.Value, st.Shown, digits))
		}
	}
	w.WriteString("</mrow></math></div>\n")
	writeNote(w, calc, st)
	w.WriteString("</div>\n")
}

// writeUse draws a use statement and, under it, the statements of its
// instance, each with its value.
func writeUse(w sink, calc *engine.Sheet, use *engine.Statement, digits int) {
	w.WriteString(`<div class="row use" id="` + anchor(use) + `">` + "\n" + `<p class="usehead"><span class="kw">use</span> `)
	w.WriteString(`<strong>` + esc(use.Name) + `</strong> = template <code>` + esc(use.Template) + `</code>`)
	if len(use.Overrides) > 0 {
		w.WriteString(" with ")
		for i, o := range use.Overrides {
			if i > 0 {
				w.WriteString(", ")
			}
			w.WriteString(symbolHTML(o.Name) + " = <code>" + esc(o.Formula) + "</code>")
		}
	}
	if use.TemplateTitle != "" {
		w.WriteString(` <span class="tmpltitle">(` + esc(use.TemplateTitle) + `)</span>`)
	}
	w.WriteString("</p>\n")
	writeNote(w, calc, use)
	if use.TemplateCaution != "" {
		w.WriteString(`<aside class="caution"><strong>Caution from the template.</strong> ` + esc(use.TemplateCaution) + "</aside>\n")
	}
	w.WriteString("<div class=\"instance\">\n")
	for _, st := range calc.Statements {
		if st.Use == use {
			writeStatement(w, calc, st, digits)
		}
	}
	w.WriteString("</div>\n</div>\n")
}

// exprText writes a literal as the author wrote it: "2.5 mWb", "-3".
func exprText(e engine.Expr) string {
	if s, ok := engine.LiteralString(e); ok {
		return s
	}
	return "a formula"
}

// writeNote writes what a checker wants beside a result: its description,
// its source, its assumption, its place in the sheet, what it uses and what
// uses it, and what it ultimately rests on.
func writeNote(w sink, calc *engine.Sheet, st *engine.Statement) {
	w.WriteString("<div class=\"note\">")
	if st.Description != "" {
		w.WriteString("<span class=\"desc\">" + esc(st.Description) + "</span>")
	}
	if st.Source != "" {
		w.WriteString("<span class=\"srcref\">Source: " + esc(st.Source) + "</span>")
	}
	if st.Assumption != "" {
		w.WriteString("<span class=\"assumed\">Assumption: " + esc(st.Assumption) + "</span>")
	}
	if len(st.Assumes) > 0 {
		w.WriteString("<span class=\"links\">assumes ")
		for i, id := range st.Assumes {
			if i > 0 {
				w.WriteString(", ")
			}
			w.WriteString(`<a href="#A-` + esc(id) + `">` + esc(id) + "</a>")
		}
		w.WriteString("</span>")
	}
	if st.Overridden {
		w.WriteString("<span class=\"setby\">set by ")
		if st.Use != nil {
			w.WriteString(`<a href="#` + anchor(st.Use) + `">use ` + esc(st.Use.Name) + "</a>")
		}
		if st.Default != nil {
			w.WriteString("; the template's own value is <code>" + esc(exprText(st.Default)) + "</code>")
		} else {
			w.WriteString("; the template requires it")
		}
		w.WriteString("</span>")
	} else if st.Instance != "" && st.IsInput() {
		w.WriteString("<span class=\"setby\">template default</span>")
	}
	w.WriteString(`<a class="loc" href="#` + anchor(st) + `">` + esc(st.Pos.String()) + "</a>")
	writeLinks(w, "uses", st.Deps)
	writeLinks(w, "used by", st.Users)
	w.WriteString("</div>\n")
	if !st.IsInput() && len(st.Deps) > 0 {
		inputs, assumptions := calc.RestsOn(st)
		w.WriteString("<details class=\"trace\"><summary>rests on ")
		w.WriteString(Count(len(inputs), "input"))
		if len(assumptions) > 0 {
			w.WriteString(" and " + Count(len(assumptions), "assumption"))
		}
		w.WriteString("</summary><p>")
		for i, in := range inputs {
			if i > 0 {
				w.WriteString(", ")
			}
			v, u := InputText(in)
			w.WriteString(`<a href="#` + anchor(in) + `">` + symbolHTML(in.Name) + "</a> = " + esc(v))
			if u != "" {
				w.WriteString(" " + esc(u))
			}
		}
		w.WriteString("</p>")
		if len(assumptions) > 0 {
			w.WriteString("<ul class=\"assumptions\">")
			for _, a := range assumptions {
				w.WriteString(`<li><a href="#` + assumptionAnchor(a) + `">` + esc(a.ID) + "</a>: " + esc(a.Text) + "</li>")
			}
			w.WriteString("</ul>")
		}
		w.WriteString("</details>\n")
	}
}

// writeLinks writes a labelled list of links to statements.
func writeLinks(w sink, label string, sts []*engine.Statement) {
	if len(sts) == 0 {
		return
	}
	w.WriteString("<span class=\"links\">" + label + " ")
	for i, d := range sts {
		if i > 0 {
			w.WriteString(", ")
		}
		name := symbolHTML(d.Name)
		if d.Kind == engine.Check {
			name = "check at line " + strconv.Itoa(d.Pos.Line)
			if d.Instance != "" {
				name = "check of " + esc(d.Instance) + " at " + esc(d.Pos.File) + ":" + strconv.Itoa(d.Pos.Line)
			}
		}
		w.WriteString(`<a href="#` + anchor(d) + `">` + name + "</a>")
	}
	w.WriteString("</span>")
}

// assumptionAnchor is the id of an assumption on its sheet's page: the
// prose paragraph, or the statement that is the assumption.
func assumptionAnchor(a *engine.Assumption) string {
	if a.Statement != nil {
		return anchor(a.Statement)
	}
	return "A-" + a.ID
}

func writeCheck(w sink, calc *engine.Sheet, st *engine.Statement, digits int) {
	cls, verdict := "pass", "PASS"
	if st.Status == engine.Fail {
		cls, verdict = "fail", "FAIL"
	}
	cmp := st.Compare()
	w.WriteString(`<div class="row check ` + cls + `" id="` + anchor(st) + "\">\n<span class=\"verdict\">" + verdict + "</span>\n<div>\n")
	w.WriteString("<div class=\"eq\"><math class=\"f\"><mrow>")
	writeFormula(w, cmp, symbolic, digits)
	w.WriteString("<mspace width=\"1em\"></mspace><mo>⇒</mo><mspace width=\"1em\"></mspace><mrow>")
	w.WriteString(valueMathML(st.Left, st.Shown, digits))
	w.WriteString("<mo>" + esc(relations[cmp.Op]) + "</mo>")
	w.WriteString(valueMathML(st.Right, st.Shown, digits))
	w.WriteString("</mrow></mrow></math></div>\n")
	if u := UtilisationText(st.Utilisation); u != "" {
		w.WriteString("<div class=\"note\"><span class=\"util\">utilisation " + u + "</span></div>\n")
	}
	writeNote(w, calc, st)
	w.WriteString("</div>\n</div>\n")
}

// UtilisationText writes a utilisation as a percentage, or "" when it has
// no meaning.
func UtilisationText(u float64) string {
	if math.IsNaN(u) || math.IsInf(u, 0) {
		return ""
	}
	return units.FormatNumber(u*100, 3) + " %"
}

// writeProblem draws a statement that has an error or was not evaluated:
// its source with the error column marked, and the message.
func writeProblem(w sink, st *engine.Statement) {
	cls := "error"
	if st.Status == engine.Blocked {
		cls = "blocked"
	}
	w.WriteString(`<div class="row ` + cls + `" id="` + anchor(st) + "\">\n<pre class=\"src\">" + markColumn(st) + "</pre>\n")
	if st.Err != nil {
		w.WriteString(`<p class="msg"><span class="loc">` + esc(st.Err.Pos.String()) + "</span> " + esc(st.Err.Message))
		if st.Err.Hint != "" {
			w.WriteString("<br><span class=\"hint\">" + esc(st.Err.Hint) + "</span>")
		}
		w.WriteString("</p>\n")
	}
	w.WriteString("</div>\n")
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
