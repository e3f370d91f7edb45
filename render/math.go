package render

import (
	"html"
	"io"
	"math"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/units"
)

// mathMode tells whether names print as symbols or as their values.
type mathMode uint8

const (
	symbolic    mathMode = iota // Φ = N·I/R
	substituted                 // Φ = 180·12.00 A / 62.17 kA/Wb
)

// sink is where HTML is written: the page buffer, or goldmark's writer.
type sink interface {
	io.Writer
	io.StringWriter
	io.ByteWriter
}

// mathWriter writes formulas as MathML.
type mathWriter struct {
	b      sink
	calc   *engine.Calc // whose results a substituted name shows
	mode   mathMode
	digits int
}

// writeFormula writes an expression as MathML (without the <math> element).
func writeFormula(w sink, calc *engine.Calc, e engine.Expr, mode mathMode, digits int) {
	mw := &mathWriter{b: w, calc: calc, mode: mode, digits: digits}
	mw.expr(e, 0)
}

// substitutes reports whether the substituted form of e differs from its
// symbolic form: whether it names any statement.
func substitutes(e engine.Expr) bool {
	found := false
	engine.Walk(e, func(n engine.Expr) {
		if r, ok := n.(*engine.Ref); ok && r.Target != nil {
			found = true
		}
	})
	return found
}

func (w *mathWriter) op(s string) { w.b.WriteString("<mo>" + html.EscapeString(s) + "</mo>") }

// prec is the binding strength of what a node prints as. In substituted
// form a name prints as "value unit", which binds like a product.
func (w *mathWriter) prec(e engine.Expr) int {
	if w.mode == substituted {
		if r, ok := e.(*engine.Ref); ok && r.Target != nil {
			if r.Target.IsInput() {
				v, u := InputText(r.Target)
				return textPrec(v, u)
			}
			res := w.calc.Result(r.Target)
			if res.Phasor != nil {
				return engine.Precedence(&engine.Binary{Op: "∠"}) // magnitude ∠ angle
			}
			return valuePrec(res.Value, res.Shown)
		}
	}
	if q, ok := e.(*engine.Quantity); ok {
		if q.Value < 0 {
			return 3
		}
		return 2
	}
	if n, ok := e.(*engine.Number); ok && n.Value < 0 {
		return 3
	}
	return engine.Precedence(e)
}

func valuePrec(si float64, u units.Unit) int {
	return textPrec(units.FormatNumber(u.FromSI(si), 4), u.Symbol)
}

// textPrec is the binding strength of a number and unit written out: a
// negative number binds like a unary minus, a number with a unit like a
// product, a bare positive number like a name.
func textPrec(number, unit string) int {
	switch {
	case strings.HasPrefix(number, "-"):
		return 3
	case unit != "1" && unit != "":
		return 2
	}
	return 5
}

func (w *mathWriter) paren(e engine.Expr, need bool) {
	if need {
		w.b.WriteString("<mrow>")
		w.op("(")
	}
	w.expr(e, 0)
	if need {
		w.op(")")
		w.b.WriteString("</mrow>")
	}
}

func (w *mathWriter) expr(e engine.Expr, _ int) {
	switch n := e.(type) {
	case *engine.Number:
		w.b.WriteString(numberMathML(n.Text))
	case *engine.Quantity:
		w.b.WriteString(numberMathML(n.Text) + unitMathML(n.Unit.Symbol))
	case *engine.Ref:
		switch {
		case n.Constant != nil:
			w.b.WriteString(mi(n.Constant.Symbol))
		case w.mode == substituted && n.Target != nil && n.Target.IsInput() && !n.Target.Type.IsList() && !n.Target.Type.IsComplex():
			// An input reads as the author wrote it, so the checker can match it.
			v, u := InputText(n.Target)
			w.b.WriteString(numberMathML(v) + unitMathML(u))
		case w.mode == substituted && n.Target != nil:
			w.b.WriteString(valueOrPhasorMathML(w.calc.Result(n.Target), w.digits))
		default:
			w.b.WriteString(symbolMathML(n.Name))
		}
	case *engine.Unary:
		w.b.WriteString("<mrow>")
		if n.Op == "-" {
			w.op("−")
		} else {
			w.op("+")
		}
		w.paren(n.X, w.prec(n.X) < 3)
		w.b.WriteString("</mrow>")
	case *engine.Binary:
		w.binary(n)
	case *engine.Call:
		w.call(n)
	default:
		_ = w.list(e) || w.choice(e) || w.apply(e)
	}
}

var relations = map[string]string{"<": "<", "<=": "≤", ">": ">", ">=": "≥", "==": "="}

func (w *mathWriter) binary(n *engine.Binary) {
	p := engine.Precedence(n)
	switch n.Op {
	case "/":
		w.b.WriteString("<mfrac><mrow>")
		w.expr(n.X, 0)
		w.b.WriteString("</mrow><mrow>")
		w.expr(n.Y, 0)
		w.b.WriteString("</mrow></mfrac>")
		return
	case "∠":
		// Neither side of ∠ binds as loosely as it: (a + b) ∠ φ.
		w.b.WriteString("<mrow>")
		w.paren(n.X, w.prec(n.X) <= p)
		w.op("∠")
		w.paren(n.Y, w.prec(n.Y) <= p)
		w.b.WriteString("</mrow>")
		return
	case "^":
		w.b.WriteString("<msup><mrow>")
		w.paren(n.X, w.prec(n.X) <= p)
		w.b.WriteString("</mrow><mrow>")
		w.expr(n.Y, 0)
		w.b.WriteString("</mrow></msup>")
		return
	}
	w.b.WriteString("<mrow>")
	w.paren(n.X, w.prec(n.X) < p)
	switch n.Op {
	case "*":
		w.op("⋅")
	case "-":
		w.op("−")
	case "+":
		w.op("+")
	default:
		w.op(relations[n.Op])
	}
	// The right operand of - needs parentheses at equal strength: a − (b + c).
	w.paren(n.Y, w.prec(n.Y) < p || (w.prec(n.Y) == p && n.Op == "-"))
	w.b.WriteString("</mrow>")
}

func (w *mathWriter) call(n *engine.Call) {
	switch n.Name {
	case "sqrt":
		w.b.WriteString("<msqrt>")
		w.expr(n.Args[0], 0)
		w.b.WriteString("</msqrt>")
		return
	case "conj":
		// z*, as ISO 80000-2 writes the conjugate.
		w.b.WriteString("<msup><mrow>")
		w.paren(n.Args[0], w.prec(n.Args[0]) < 5)
		w.b.WriteString("</mrow><mo>*</mo></msup>")
		return
	case "abs":
		w.b.WriteString(`<mrow><mo fence="true">|</mo>`)
		w.expr(n.Args[0], 0)
		w.b.WriteString(`<mo fence="true">|</mo></mrow>`)
		return
	}
	w.applied(mi(n.Name), n.Args)
}

// applied writes a function, given as MathML, applied to its arguments.
func (w *mathWriter) applied(fn string, args []engine.Expr) {
	w.b.WriteString("<mrow>" + fn + "<mo>\u2061</mo><mrow>")
	w.op("(")
	for i, a := range args {
		if i > 0 {
			w.op(",")
		}
		w.expr(a, 0)
	}
	w.op(")")
	w.b.WriteString("</mrow></mrow>")
}

// numberMathML writes a number as text gives it, with a true minus sign and
// an exponent as a power of ten.
func numberMathML(s string) string {
	if j, ok := strings.CutSuffix(s, "j"); ok {
		// 4j: the number, then the imaginary unit as a symbol.
		return "<mrow>" + numberMathML(j) + "<mi>j</mi></mrow>"
	}
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	mant, exp := splitE(s)
	out := "<mn>" + html.EscapeString(mant) + "</mn>"
	if exp != "" {
		out = "<mrow>" + out + "<mo>×</mo><msup><mn>10</mn><mn>" + html.EscapeString(strings.Replace(strings.TrimPrefix(exp, "+"), "-", "−", 1)) + "</mn></msup></mrow>"
	}
	if neg {
		out = "<mrow><mo>−</mo>" + out + "</mrow>"
	}
	return out
}

// splitE splits "1.5e-3" into "1.5" and "-3", dropping leading zeros of
// the exponent.
func splitE(s string) (string, string) {
	i := strings.IndexAny(s, "eE")
	if i < 0 {
		return s, ""
	}
	exp := s[i+1:]
	sign := ""
	if exp != "" && (exp[0] == '+' || exp[0] == '-') {
		sign, exp = exp[:1], exp[1:]
	}
	exp = strings.TrimLeft(exp, "0")
	if exp == "" {
		exp = "0"
	}
	if sign == "+" {
		sign = ""
	}
	return s[:i], sign + exp
}

func unitMathML(sym string) string {
	if sym == "" || sym == "1" {
		return ""
	}
	if !units.SpaceBefore(sym) {
		return "<mtext>" + html.EscapeString(sym) + "</mtext>"
	}
	return `<mspace width="0.2em"></mspace><mtext>` + html.EscapeString(sym) + "</mtext>"
}

// valueMathML writes an SI value in a unit to the given significant figures.
func valueMathML(si float64, u units.Unit, digits int) string {
	return numberMathML(units.FormatNumber(u.FromSI(si), digits)) + unitMathML(u.Symbol)
}

// valueOrPhasorMathML writes a result: a phasor as its magnitude ∠ its
// angle, any other as resultMathML does.
func valueOrPhasorMathML(res engine.Result, digits int) string {
	if res.Phasor == nil {
		return resultMathML(res, digits)
	}
	d := res.Digits(digits)
	return "<mrow>" + valueMathML(res.Value, res.Shown, d) + "<mo>∠</mo>" +
		numberMathML(units.FormatNumber(phasorDegrees(*res.Phasor), d)) + "<mo>°</mo></mrow>"
}

// PhasorText writes a phasor as its magnitude in the result's unit ∠ its
// angle in degrees: "10.83 kV ∠ 28.20°".
func PhasorText(res engine.Result, digits int) string {
	d := res.Digits(digits)
	return ValueText(res.Value, res.Shown, d) + " ∠ " + units.FormatNumber(phasorDegrees(*res.Phasor), d) + "°"
}

// phasorDegrees is a phasor's angle in degrees, in (-180°, 180°]; an
// angle within rounding of zero (a part that is zero but for the last
// bit) shows as 0.
func phasorDegrees(p engine.Phasor) float64 {
	a := p.Angle() * 180 / math.Pi
	if math.Abs(a) < 1e-9 {
		return 0
	}
	return a
}
