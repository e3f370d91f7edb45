package render

import (
	"math"
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// writeStatement draws one statement as the checker reads it: the formula
// with symbols, the same with values, and the result.
func writeStatement(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	calc := s.Calc
	res := calc.Result(st)
	if st.Kind == engine.Use && res.Status == engine.OK {
		writeUse(w, s, st, digits)
		return
	}
	if st.Kind == engine.FunctionDef {
		writeFunction(w, calc, st, digits)
		return
	}
	if st.IsCondition() && res.Status == engine.OK {
		writeCondition(w, s, st, digits)
		return
	}
	switch res.Status {
	case engine.Errored, engine.Blocked, engine.Pending:
		writeProblem(w, st, res)
		return
	case engine.Pass, engine.Fail:
		writeCheck(w, s, st, digits)
		return
	}
	if st.Kind == engine.Take {
		writeTake(w, calc, st, digits)
		return
	}
	class := "row def"
	if st.IsInput() {
		class = "row input"
	}
	if st.Overridden {
		class += " set"
	}
	w.WriteString(`<div class="` + class + `" id="` + anchor(st) + "\">\n")
	steps := []string{symbolMathML(st.Name) + "<mo>=</mo>" + formulaML(calc, st.Expr, symbolic, digits)}
	if st.Tol != nil {
		steps[0] += toleranceMathML(st.Tol)
	}
	if shownConverted(st) {
		// B [T] = 12 kG: the value as written, then in the unit asked for.
		steps = append(steps, "<mo>=</mo>"+valueOrPhasorMathML(res, digits))
	}
	if !st.IsInput() {
		if substitutes(st.Expr) {
			steps = append(steps, "<mo>=</mo>"+formulaML(calc, st.Expr, substituted, digits))
		}
		// A name that only repeats an input already shows its value.
		if r, ok := st.Expr.(*engine.Ref); !ok || r.Target == nil || !r.Target.IsInput() {
			steps = append(steps, "<mo>=</mo>"+valueOrPhasorMathML(res, digits))
		}
	}
	writeSteps(w, steps)
	writeListTable(w, st, res, digits)
	writeFigures(w, s, st, res, digits)
	writeSpreadNote(w, s, st, digits)
	writeCaseTable(w, s, st, digits)
	writeNote(w, calc, st)
	w.WriteString("</div>\n")
}

// writeSteps writes the steps of an equation (name = formula, = values,
// = result), each as a math element of its own: a browser does not break a
// line inside MathML, so a long equation wraps between its steps, at the
// equals sign. A step too long for a line of the printed page is set
// smaller on paper rather than clipped.
func writeSteps(w sink, steps []string) {
	w.WriteString("<div class=\"eq\">")
	for i, step := range steps {
		class := "f"
		if i > 0 {
			class += " step"
		}
		switch n := visibleLen(step); {
		case n > 120:
			class += " longer"
		case n > 80:
			class += " long"
		}
		w.WriteString(`<math class="` + class + `"><mrow>` + step + "</mrow></math>")
	}
	w.WriteString("</div>\n")
}

// formulaML is a formula's MathML as a string.
func formulaML(calc *engine.Calc, e engine.Expr, mode mathMode, digits int) string {
	var b strings.Builder
	writeFormula(&b, calc, e, mode, digits)
	return b.String()
}

// visibleLen counts the characters of MathML that a reader sees: the text
// outside the tags, an entity counted as one.
func visibleLen(ml string) int {
	n, inTag, inEntity := 0, false, false
	for _, r := range ml {
		switch {
		case r == '<':
			inTag = true
		case r == '>':
			inTag = false
		case inTag:
		case r == '&':
			inEntity = true
			n++
		case inEntity:
			inEntity = r != ';'
		default:
			n++
		}
	}
	return n
}

// writeTake draws a result taken from another sheet: its value, and a
// link to the statement it comes from.
func writeTake(w sink, calc *engine.Calc, st *engine.Statement, digits int) {
	res := calc.Result(st)
	w.WriteString(`<div class="row take" id="` + anchor(st) + `">` + "\n" + `<div class="eq"><math class="f"><mrow>`)
	w.WriteString(symbolMathML(st.Name) + "<mo>=</mo>" + valueMathML(res.Value, res.Shown, res.Digits(digits)))
	w.WriteString("</mrow></math></div>\n<p class=\"from\">taken from " + takenLink(calc.Path, st) + "</p>\n")
	writeNote(w, calc, st)
	w.WriteString("</div>\n")
}

// takenLink links to the statement a take statement reads, on its page.
func takenLink(from string, st *engine.Statement) string {
	href := rel(project.PagePath(from)) + project.PagePath(st.TakenPath) + "#" + anchor(st.Taken)
	return `<a href="` + esc(href) + `">` + esc(st.TakenPath) + ": " + symbolHTML(st.Remote) + "</a>"
}

// writeUse draws a use statement and, under it, the statements of its
// instance, each with its value.
func writeUse(w sink, s *project.Sheet, use *engine.Statement, digits int) {
	calc := s.Calc
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
	writeTemplateNotes(w, calc, use)
	w.WriteString("<div class=\"instance\">\n")
	for _, st := range calc.Statements {
		if st.Use == use {
			writeStatement(w, s, st, digits)
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
func writeNote(w sink, calc *engine.Calc, st *engine.Statement) {
	w.WriteString("<div class=\"note\">")
	if d := describe(st); d != "" {
		w.WriteString("<span class=\"desc\">" + esc(d) + "</span>")
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
	// What follows is for the checker: who set an input, where the
	// statement is, what it uses and what uses it, what it rests on.
	if st.Overridden {
		w.WriteString("<span class=\"setby ck\">set by ")
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
		w.WriteString("<span class=\"setby ck\">template default</span>")
	}
	w.WriteString(`<a class="loc ck" href="#` + anchor(st) + `">` + esc(st.Pos.String()) + "</a>")
	writeLinks(w, "uses", st.Deps)
	writeLinks(w, "used by", st.Users)
	w.WriteString("</div>\n")
	if !st.IsInput() && len(st.Deps) > 0 {
		inputs, assumptions := calc.RestsOn(st)
		w.WriteString("<details class=\"trace ck\"><summary>rests on ")
		w.WriteString(Count(len(inputs), "input"))
		if len(assumptions) > 0 {
			w.WriteString(" and " + Count(len(assumptions), "assumption"))
		}
		w.WriteString("</summary><p>")
		for i, in := range inputs {
			if i > 0 {
				w.WriteString(", ")
			}
			if in.Kind == engine.Take {
				w.WriteString(`<a href="#` + anchor(in) + `">` + symbolHTML(in.Name) + "</a> from " + takenLink(calc.Path, in))
				continue
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
	w.WriteString("<span class=\"links ck\">" + label + " ")
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

// writeCheck draws a check as a stamp that says whether it holds, beside
// the relation as written, the same relation in numbers with both sides in
// the check's unit, and a reach bar: how much of its capacity the demand
// takes, with the limit marked.
func writeCheck(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	calc := s.Calc
	res := calc.Result(st)
	verdict, cls := verdictOf(s, st, res)
	cmp := st.Compare()
	w.WriteString(`<div class="row check ` + cls + `" id="` + anchor(st) + "\">\n<span class=\"stamp\">" + verdict + "</span>\n<div>\n")
	writeSteps(w, []string{formulaML(calc, cmp, symbolic, digits)})
	writeGoverning(w, s, st)
	w.WriteString("<p class=\"inval\">in numbers <math><mrow>")
	w.WriteString(valueMathML(res.Left, res.Shown, digits))
	w.WriteString("<mo>" + esc(relations[cmp.Op]) + "</mo>")
	w.WriteString(valueMathML(res.Right, res.Shown, digits))
	w.WriteString("</mrow></math></p>\n")
	if note := fixedNote(s, st); note != "" {
		w.WriteString("<div class=\"note\"><span class=\"fixednote\">" + esc(note) + "</span></div>\n")
	} else if !inBand(s, st) {
		writeReach(w, res.Utilisation)
	}
	writeCheckExtras(w, s, st, digits)
	writeCheckSpread(w, s, st, digits)
	writeCaseTable(w, s, st, digits)
	writeNote(w, calc, st)
	w.WriteString("</div>\n</div>\n")
}

// Verdict is the word a check's stamp shows.
func Verdict(s engine.Status) string {
	if s == engine.Fail {
		return "not met"
	}
	return "holds"
}

// reachScale is the share of a reach bar's length at which the limit
// stands: demands up to a quarter over capacity still show their excess.
const reachScale = 1.25

// writeReach draws how much of its capacity a check's demand takes: a bar
// filled to the demand, a mark at the limit, and the figure in words.
func writeReach(w sink, u float64) {
	text := UtilisationText(u)
	if text == "" {
		return
	}
	fill := math.Min(u/reachScale, 1) * 100
	w.WriteString(`<div class="reach"><span class="bar" aria-hidden="true"><i style="width:` +
		strconv.FormatFloat(fill, 'f', 1, 64) + `%"></i><b></b></span><span class="util">demand ` + text + " of capacity</span></div>\n")
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
func writeProblem(w sink, st *engine.Statement, res engine.Result) {
	cls := "error"
	if res.Status == engine.Blocked {
		cls = "blocked"
	}
	w.WriteString(`<div class="row ` + cls + `" id="` + anchor(st) + "\">\n<pre class=\"src\">" + markColumn(st, res) + "</pre>\n")
	if res.Err != nil {
		w.WriteString(`<p class="msg"><span class="loc">` + esc(res.Err.Pos.String()) + "</span> " + esc(res.Err.Message))
		if res.Err.Hint != "" {
			w.WriteString("<br><span class=\"hint\">" + esc(res.Err.Hint) + "</span>")
		}
		w.WriteString("</p>\n")
	}
	w.WriteString("</div>\n")
}

// markColumn escapes a statement's text and marks the character its error
// points at.
func markColumn(st *engine.Statement, res engine.Result) string {
	text := st.Text
	const limit = 400
	if res.Err == nil || res.Status != engine.Errored || res.Err.Pos.Line != st.Pos.Line {
		return esc(clip(text, limit))
	}
	r := []rune(text)
	i := res.Err.Pos.Col - st.Pos.Col
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
