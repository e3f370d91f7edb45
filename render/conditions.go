package render

import (
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// The conditions a sheet's design must survive, on its page: case, sweep
// and sample statements as rows of their own, and beside the statements
// they move, a table of cases, the governing condition of a check and
// what the inputs' tolerances do to it.

// writeCondition draws a case, sweep or sample statement that checked.
func writeCondition(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	switch st.Kind {
	case engine.Case:
		writeCase(w, s, st, digits)
	case engine.Sweep:
		writeSweep(w, s, st, digits)
	case engine.Sampling:
		writeSampling(w, s, st)
	}
}

// writeCase draws a load case: its name, and each input it sets with the
// value as written, and the checks it governs.
func writeCase(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	calc := s.Calc
	w.WriteString(`<div class="row cond case" id="` + anchor(st) + "\">\n<p class=\"condhead\"><span class=\"kw\">case</span> <strong>" + esc(st.Name) + "</strong> sets</p>\n")
	w.WriteString("<div class=\"eq sets\">")
	for i, o := range st.Overrides {
		ml := symbolMathML(o.Name) + "<mo>=</mo>" + formulaML(calc, o.Expr, symbolic, digits)
		if i < len(st.Overrides)-1 {
			ml += "<mo separator=\"true\">,</mo>"
		}
		w.WriteString(`<math class="f"><mrow>` + ml + "</mrow></math>")
	}
	w.WriteString("</div>\n")
	if gov := governedBy(s, st); len(gov) > 0 {
		w.WriteString("<p class=\"condnote\">governs ")
		for i, chk := range gov {
			if i > 0 {
				w.WriteString(", ")
			}
			w.WriteString(`<a href="#` + anchor(chk) + `">` + esc(checkAt(chk)) + "</a>")
		}
		w.WriteString("</p>\n")
	}
	writeNote(w, calc, st)
	w.WriteString("</div>\n")
}

// governedBy lists the checks whose governing condition is a case.
func governedBy(s *project.Sheet, c *engine.Statement) []*engine.Statement {
	var out []*engine.Statement
	for _, st := range s.Calc.Statements {
		if g, ok := s.Conditions.Governing(st); ok && g.Case == c {
			out = append(out, st)
		}
	}
	return out
}

// checkAt names a check in a sentence: "check at line 12", or for a
// template's "check of c1 at coil.md:9".
func checkAt(st *engine.Statement) string {
	if st.Instance != "" {
		return "check of " + st.Instance + " at " + st.Pos.File + ":" + strconv.Itoa(st.Pos.Line)
	}
	return "check at line " + strconv.Itoa(st.Pos.Line)
}

// writeSampling draws a sample statement: the Monte Carlo count and seed.
func writeSampling(w sink, s *project.Sheet, st *engine.Statement) {
	w.WriteString(`<div class="row cond sample" id="` + anchor(st) + "\">\n<p class=\"condhead\"><span class=\"kw\">Monte Carlo</span>: " +
		samplingText(st.Cond.Samples, st.Cond.Seed, "\u202f") + "</p>\n")
	writeNote(w, s.Calc, st)
	w.WriteString("</div>\n")
}

// samplingText is "20 000 samples, seed 4", the digits grouped in threes
// by sep as the SI Brochure (9th ed., 5.4.4) groups them.
func samplingText(n int, seed uint64, sep string) string {
	return groupDigits(strconv.Itoa(n), sep) + " sample" + plural(n) + ", seed " + strconv.FormatUint(seed, 10)
}

// groupDigits groups the digits of a whole number of five digits or more
// in threes: 20000 is "20 000"; 4096 stays as it is.
func groupDigits(d, sep string) string {
	if len(d) < 5 {
		return d
	}
	var b strings.Builder
	for i, r := range d {
		if i > 0 && (len(d)-i)%3 == 0 {
			b.WriteString(sep)
		}
		b.WriteRune(r)
	}
	return b.String()
}

// defaultSampling reports whether the sheet's tolerances were sampled
// with the defaults, there being no sample statement, and the spread.
func defaultSampling(s *project.Sheet) (*conditions.Spread, bool) {
	sp := s.Conditions.SpreadOf()
	if sp == nil || len(sp.Checks)+len(sp.Results) == 0 {
		return nil, false
	}
	return sp, sp.Default
}

// asWritten is a check's result in the sheet as written: the page's
// result is the governing one where a case or a sweep governs.
func asWritten(s *project.Sheet, st *engine.Statement) engine.Result {
	if g, ok := s.Conditions.Governing(st); ok {
		return g.AsWritten
	}
	return s.Calc.Result(st)
}

// diffText writes a difference of two values (a margin, a spread) in a
// unit: an affine unit's offset does not apply, and a difference of
// temperatures is in K.
func diffText(si float64, u units.Unit, digits int) string {
	if u.IsAffine() {
		u, _ = units.Lookup("K")
	}
	return ValueText(si, u, digits)
}

// percentText writes a share as a percentage to two figures, "0.42 %".
func percentText(share float64) string {
	return units.FormatNumber(share*100, 2) + " %"
}

// conditionLine is a case, sweep or sample statement as a line of text,
// for the terminal and the dependency graph; ok is false for any other
// statement.
func conditionLine(st *engine.Statement, r engine.Result) (line string, ok bool) {
	if !st.IsCondition() || r.Status != engine.OK || st.Cond == nil {
		return "", false
	}
	formula := strings.Join(strings.Fields(st.Formula), " ")
	switch st.Kind {
	case engine.Case:
		return "case " + st.Name + ": " + formula, true
	case engine.Sweep:
		return st.Cond.Word() + " " + st.Name + ": " + formula + " (" + strconv.Itoa(len(st.Cond.Points)) + " points)", true
	}
	return "Monte Carlo: " + samplingText(st.Cond.Samples, st.Cond.Seed, " "), true
}

// conditionsNote is what a statement's terminal line adds: an input's
// tolerance as written, "  ± 5 %"; for a check that a case or a sweep
// governs, " — governs: case high".
func conditionsNote(s *project.Sheet, st *engine.Statement) string {
	if st.Tol != nil && st.IsInput() && s.Calc.Result(st).Status == engine.OK {
		return "  " + strings.Join(strings.Fields(st.Tol.Text), " ")
	}
	g, ok := s.Conditions.Governing(st)
	if !ok || g.Case == nil && g.Sweep == nil {
		return ""
	}
	return " — governs: " + g.Where
}
