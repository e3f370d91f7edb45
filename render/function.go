package render

import (
	"github.com/sheaf-calc/sheaf/engine"
)

// Functions of the sheet's own: the definition shows as name(params) =
// formula, with no value (each call shows its own); a call shows as the
// call written, and with values substituted for its arguments.

// writeFunction draws a function's definition.
func writeFunction(w sink, calc *engine.Calc, st *engine.Statement, digits int) {
	if st.Verdict == engine.Errored {
		writeProblem(w, st, calc.Result(st))
		return
	}
	w.WriteString(`<div class="row def function" id="` + anchor(st) + "\">\n<div class=\"eq\"><math class=\"f\"><mrow>")
	w.WriteString("<mrow>" + symbolMathML(st.Name) + "<mo>\u2061</mo><mrow><mo>(</mo>")
	for i, p := range st.Params {
		if i > 0 {
			w.WriteString("<mo>,</mo>")
		}
		w.WriteString(symbolMathML(p))
	}
	w.WriteString("<mo>)</mo></mrow></mrow><mo>=</mo>")
	writeFormula(w, calc, st.Expr, symbolic, digits)
	w.WriteString("</mrow></math></div>\n")
	writeNote(w, calc, st)
	w.WriteString("</div>\n")
}

// apply writes a call of a sheet's function as written.
func (w *mathWriter) apply(e engine.Expr) bool {
	n, ok := e.(*engine.Apply)
	if !ok {
		return false
	}
	w.applied(symbolMathML(n.Name), n.Args)
	return true
}
