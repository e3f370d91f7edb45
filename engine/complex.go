package engine

import (
	"math"
	"math/cmplx"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Phasors. A complex value (a phasor: 3 A + 4j A, or 230 V ∠ -30 deg) has
// one dimension and kind for both of its parts, checked as a real value's
// are. Like a list of two, it takes two places in a frame's values, real
// part then imaginary part, fixed when the sheet is checked, so a run
// allocates nothing; its statement's own slot holds its magnitude.
//
// A phasor has no order: <, <=, > and >= are refused, and so is ==,
// whose tolerance would mean nothing without saying which of magnitude,
// angle or parts it bounds; a check compares magnitudes or parts.

// IsComplex reports whether a node holds a complex value.
func (t *Type) IsComplex() bool { return t.Domain == Complex }

// places is the number of places a node's value takes in the frame past
// the statements' slots: a list's elements, a phasor's two parts.
func (t *Type) places() int {
	switch {
	case t.IsSeries(), t.IsList() && t.IsComplex():
		return 2 * t.Len // x beside y; or each phasor's two parts
	case t.IsList():
		return t.Len
	case t.IsComplex():
		return 2
	}
	return 0
}

// Phasor is a complex result in coherent SI.
type Phasor struct{ Re, Im float64 }

// Abs is the magnitude.
func (p Phasor) Abs() float64 { return math.Hypot(p.Re, p.Im) }

// Angle is the angle in radians, in (-π, π].
func (p Phasor) Angle() float64 { return math.Atan2(p.Im, p.Re) }

// phasorIn returns a complex statement's value in v, the values of a frame.
func (st *Statement) phasorIn(v []float64) Phasor {
	at := int(st.Expr.base().at)
	return Phasor{v[at], v[at+1]}
}

// complexProblem refuses what a phasor cannot be: a side of a
// comparison, a power's base or exponent, a part of a series.
func complexProblem(n *Binary) *diag.Diagnostic {
	x, y := n.X.Type(), n.Y.Type()
	if !x.IsComplex() && !y.IsComplex() {
		return nil
	}
	switch {
	case isComparison(n.Op):
		return errAt(n.Pos(), "a check compares magnitudes or parts: check abs(E) <= ..., or Re(E) >= ...",
			"phasors have no order, and == on a phasor is refused: compare abs(E - E_ref) <= a tolerance instead")
	case n.Op == "^":
		return errAt(n.Pos(), "multiply the phasor by itself, or raise its magnitude: abs(E)^2",
			"sheaf does not raise phasors to powers")
	case x.IsSeries() || y.IsSeries():
		return errAt(n.Pos(), "build the series from real values: series(abs(z), x) or series(Re(z), x)",
			"a series holds real values; it cannot be combined with a phasor")
	}
	return nil
}

// inferComplexBinary sets the domain of an arithmetic operation with a
// phasor on either side, whose dimension and kind inferBinary has checked,
// and folds it when both sides are fixed.
func inferComplexBinary(n *Binary) *diag.Diagnostic {
	if err := complexProblem(n); err != nil {
		return err
	}
	x, y, t := n.X.Type(), n.Y.Type(), n.Type()
	if !x.IsComplex() && !y.IsComplex() {
		return nil
	}
	t.Domain, t.Count, t.Const = Complex, false, x.Const && y.Const && !x.IsList() && !y.IsList()
	if t.Const {
		z := foldComplex(n.Op, cvalue(x), cvalue(y))
		t.Val, t.Im = real(z), imag(z)
		if !finite(t.Val) || !finite(t.Im) {
			t.Const = false // leave it to evaluation, which reports it at its place
		}
	}
	return nil
}

func cvalue(t *Type) complex128 { return complex(t.Val, t.Im) }

func foldComplex(op string, a, b complex128) complex128 {
	switch op {
	case "+":
		return a + b
	case "-":
		return a - b
	case "*":
		return a * b
	case "/":
		return a / b
	}
	return cmplx.NaN()
}

// inferPolar checks magnitude ∠ angle: a real single magnitude of any
// dimension, and an angle in radians (deg converts) or a pure number,
// never a count of cycles, as sin and cos ask.
func inferPolar(n *Binary) *diag.Diagnostic {
	x, y, t := n.X.Type(), n.Y.Type(), n.Type()
	for _, side := range []Expr{n.X, n.Y} {
		st := side.Type()
		if st.IsComplex() {
			return errAt(side.Pos(), polarHint(n, "write magnitude ∠ angle with two real values, such as 230 V ∠ -30 deg"),
				"both sides of ∠ are real values; this is a phasor already")
		}
		if st.IsSeries() {
			return errAt(side.Pos(), "write the magnitudes or the angles as a list", "a side of ∠ is a series; a series holds real values")
		}
	}
	if x.IsList() && y.IsList() && x.Len != y.Len {
		return errAt(n.Pos(), "give the magnitudes and the angles the same number of elements",
			"cannot pair %d magnitudes with %d angles", x.Len, y.Len)
	}
	if x.Kind.IsAbsTemp() {
		return errAt(n.X.Pos(), "write a temperature difference in K", "an absolute temperature cannot be a phasor's magnitude")
	}
	if !y.Dim.IsDimensionless() {
		return errAt(n.Y.Pos(), polarHint(n, "the angle after ∠ is in rad or deg, such as 230 V ∠ -30 deg"),
			"the angle of a phasor is %s, not an angle", units.Describe(y.Dim))
	}
	if y.Kind.Cyc != 0 {
		return errAt(n.Y.Pos(), "an angle is 2π times a number of cycles: write 2*pi*f*t rather than f*t",
			"the angle of a phasor counts cycles, not radians: a factor 2π is missing")
	}
	if y.Kind.Rad != 0 && y.Kind.Rad != 1 || y.Kind.IsAbsTemp() {
		return errAt(n.Y.Pos(), "check the powers of the angles after ∠", "the angle of a phasor is %s, not an angle", y.Kind)
	}
	*t = Type{Domain: Complex, Dim: x.Dim, Kind: x.Kind, Const: x.Const && y.Const}
	if x.IsList() || y.IsList() {
		// A list of magnitudes or of angles gives a list of phasors.
		t.Shape, t.Len, t.Const = List, max(x.Len, y.Len), false
	}
	if t.Const {
		z := cmplx.Rect(x.Val, y.Val)
		t.Val, t.Im = real(z), imag(z)
	}
	return nil
}

// polarHint adds, for an angle that is a product or a quotient, that ∠
// binds more loosely than * and /: I ∠ -phi * Z is I ∠ (-phi·Z).
func polarHint(n *Binary, hint string) string {
	if b, ok := n.Y.(*Binary); ok && (b.Op == "*" || b.Op == "/") {
		return "∠ takes the whole product after it as the angle: write (magnitude ∠ angle) " + b.Op + " ..., in parentheses"
	}
	return hint
}

// inferComplexCall checks abs, arg, Re, Im and conj: of a phasor, or of a
// real value for abs (its absolute value), with Re(x) = x and Im(x) = 0
// refused as a sign of a mistake.
func inferComplexCall(n *Call) *diag.Diagnostic {
	a := n.Args[0].Type()
	if !a.IsComplex() {
		if !n.Func.phasor {
			return nil
		}
		return errAt(n.Args[0].Pos(), "write a phasor as magnitude ∠ angle or as a sum such as 3 A + 4j A",
			"%s takes a phasor, but its argument is a real value", n.Name)
	}
	t := n.Type()
	switch n.Name {
	case "conj":
		*t = *a
		t.Im = -t.Im
	case "arg":
		*t = Type{Dim: units.Dimensionless, Kind: units.Angle}
	default: // abs, Re, Im
		*t = Type{Dim: a.Dim, Kind: a.Kind}
	}
	if a.IsList() {
		// Of a list of phasors, one value for each element.
		t.Shape, t.Len, t.Const = List, a.Len, false
		return nil
	}
	if a.Const && n.Name != "conj" {
		t.Const, t.Val = true, phasorPart(n.Name, complex(a.Val, a.Im))
	}
	return nil
}

// phasorPart is the real value abs, arg, Re or Im takes from z.
func phasorPart(name string, z complex128) float64 {
	switch name {
	case "abs":
		return cmplx.Abs(z)
	case "arg":
		return cmplx.Phase(z)
	case "Re":
		return real(z)
	}
	return imag(z)
}

// takesComplex reports whether a function accepts a phasor.
func takesComplex(f *Function) bool { return f.phasor || f.Name == "abs" }

// complexArgProblem refuses a phasor given to a function of real values.
func complexArgProblem(n *Call) *diag.Diagnostic {
	if takesComplex(n.Func) {
		return nil
	}
	if a := n.Args[0].Type(); len(n.Args) == 1 && a.IsComplex() && a.IsList() && n.Func.reduce != nil {
		switch n.Name {
		case "sum", "mean", "count":
			return nil
		case "min", "max":
			return errAt(n.Args[0].Pos(), "compare a real value of each: "+n.Name+"(abs(z)), "+n.Name+"(Re(z))",
				"%s needs an order, and phasors have none", n.Name)
		}
		return errAt(n.Args[0].Pos(), "take a real value of each element first: "+n.Name+"(abs(z))",
			"%s of a list of phasors is not supported; sum, mean and count are", n.Name)
	}
	for _, a := range n.Args {
		if a.Type().IsComplex() {
			return errAt(a.Pos(), "take a real value of the phasor first: abs(E), arg(E), Re(E) or Im(E)",
				"%s takes real values, but this is a phasor", n.Name)
		}
	}
	return nil
}

// The compiled code of phasors. A complex node's closure writes its two
// parts to its places in v and returns 0, as a list's does.

// cside is one operand of an operation with a phasor: a phasor at a place
// in v, or a real value.
type cside struct {
	cx bool
	at int
	fn evalFn
}

func csideOf(e Expr) cside {
	if e.Type().IsComplex() {
		return cside{cx: true, at: int(e.base().at), fn: fnOf(e)}
	}
	return cside{fn: fnOf(e)}
}

func (s cside) get(v []float64) complex128 {
	if s.cx {
		s.fn(v)
		return complex(v[s.at], v[s.at+1])
	}
	return complex(s.fn(v), 0)
}

// compileComplex builds the closure of a node that holds a phasor.
func compileComplex(e Expr) evalFn {
	if e.Type().IsList() {
		return compileComplexList(e)
	}
	at := int(e.base().at)
	put := func(v []float64, z complex128) float64 { v[at], v[at+1] = real(z), imag(z); return 0 }
	if fn, ok := compileComplexElement(e, put); ok {
		return fn
	}
	if t := e.Type(); t.Const && finite(t.Val) && finite(t.Im) {
		re, im := t.Val, t.Im
		return func(v []float64) float64 { v[at], v[at+1] = re, im; return 0 }
	}
	switch n := e.(type) {
	case *Ref:
		return noop // its statement ran before, at the same places
	case *Unary:
		x := csideOf(n.X)
		if n.Op == "+" {
			return func(v []float64) float64 { return put(v, x.get(v)) }
		}
		return func(v []float64) float64 { return put(v, -x.get(v)) }
	case *Binary:
		return compileComplexBinary(n, put)
	case *Call: // conj
		x := csideOf(n.Args[0])
		return func(v []float64) float64 { return put(v, cmplx.Conj(x.get(v))) }
	}
	return func(v []float64) float64 { return put(v, cmplx.NaN()) }
}

func compileComplexBinary(n *Binary, put func([]float64, complex128) float64) evalFn {
	x, y := csideOf(n.X), csideOf(n.Y)
	switch n.Op {
	case "+":
		return func(v []float64) float64 { return put(v, x.get(v)+y.get(v)) }
	case "-":
		return func(v []float64) float64 { return put(v, x.get(v)-y.get(v)) }
	case "*":
		return func(v []float64) float64 { return put(v, x.get(v)*y.get(v)) }
	case "/":
		return func(v []float64) float64 {
			d := y.get(v)
			if d == 0 {
				return put(v, cmplx.NaN()) // diagnose says division by zero
			}
			return put(v, x.get(v)/d)
		}
	}
	// ∠
	m, a := x.fn, y.fn
	return func(v []float64) float64 { return put(v, cmplx.Rect(m(v), a(v))) }
}

// compilePhasorPart builds abs, arg, Re or Im of a phasor.
func compilePhasorPart(n *Call) evalFn {
	x, part := csideOf(n.Args[0]), n.Func.cx
	if n.Name == "abs" {
		part = cmplx.Abs
	}
	return func(v []float64) float64 { return part(x.get(v)) }
}

// complexStep is a phasor statement's step: its value slot holds the
// magnitude (of a list of phasors, the length), and a part that is not a
// finite number makes it NaN, so that the statement fails with the reason.
func complexStep(root evalFn, e Expr) evalFn {
	at := int(e.base().at)
	if n := e.Type().Len; e.Type().IsList() {
		return func(v []float64) float64 {
			root(v)
			if !complexListFinite(v, at, n) {
				return math.NaN()
			}
			return float64(n)
		}
	}
	return func(v []float64) float64 {
		root(v)
		re, im := v[at], v[at+1]
		if !finite(re) || !finite(im) {
			return math.NaN()
		}
		return math.Hypot(re, im)
	}
}

// complexOK reports whether both parts of a phasor node are finite,
// evaluating it.
func complexOK(e Expr, v []float64) bool {
	fnOf(e)(v)
	at := int(e.base().at)
	return allFinite(v[at : at+e.Type().places()])
}

// diagnoseComplex says why an operation on phasors whose operands are
// sound gave a part that is not a finite number.
func diagnoseComplex(e Expr, v []float64) *diag.Diagnostic {
	if x, ok := e.(*Index); ok {
		return indexProblem(x, v)
	}
	if b, ok := e.(*Binary); ok && b.Op == "/" && csideOf(b.Y).get(v) == 0 {
		return errAt(b.Pos(), "check the value of the divisor", "division by a phasor of zero")
	}
	return errAt(e.Pos(), "check the inputs and their units; a part is beyond ±1.8e308 in SI", "the phasor overflows")
}
