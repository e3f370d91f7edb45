package engine

import (
	"math"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

var dimTemperature = units.DimOf(units.Temperature)

// infer works out the dimension and kind of every node of e, bottom up,
// before anything is evaluated. Names must already be resolved and the
// statements they name already inferred.
func infer(e Expr) *diag.Diagnostic { return inferNode(e, false) }

// inferNode infers one node; inChain is set for a product or quotient
// whose parent is a product or quotient too: the kind of a chain such as
// k_e*2*pi*n is worked out once, at its top, over all its factors.
func inferNode(e Expr, inChain bool) *diag.Diagnostic {
	if c, ok := e.(*Call); ok && c.Func.table != "" {
		return c.Func.check(c) // the columns are data, not values to infer
	}
	if a, ok := e.(*Apply); ok {
		return inferApply(a)
	}
	product := isProduct(e)
	for _, c := range e.children() {
		if err := inferNode(c, product); err != nil {
			return err
		}
	}
	t := e.Type()
	switch n := e.(type) {
	case *Number, *Quantity:
		return inferLiteral(e)
	case *Ref:
		switch {
		case n.Column != nil:
			// A column is a list of its rows.
			*t = Type{Shape: List, Len: len(n.Column.Values), Dim: n.Column.Unit.Dim, Kind: n.Column.Unit.Kind}
		case n.Constant != nil:
			*t = Type{Dim: n.Constant.Dim, Const: true, Val: n.Constant.Value}
		default:
			tt := n.Target.Type
			*t = Type{Shape: tt.Shape, Domain: tt.Domain, Len: tt.Len, Dim: tt.Dim, Kind: tt.Kind, Count: tt.Count, XDim: tt.XDim, XKind: tt.XKind}
		}
	case *ListLit:
		return inferList(n)
	case *Range:
		return inferRange(n)
	case *Index:
		return inferIndex(n)
	case *Choice:
		return inferChoice(n)
	case *Unary:
		*t = *n.X.Type()
		if n.Op == "-" {
			t.Val, t.Im = -t.Val, -t.Im
			if t.Kind.IsAbsTemp() {
				return errAt(n.Pos(), "negate a temperature difference in K instead", "cannot negate an absolute temperature")
			}
		}
	case *Binary:
		if n.Op == "∠" {
			return inferPolar(n)
		}
		if err := inferBinary(n); err != nil {
			return err
		}
		if err := inferComplexBinary(n); err != nil {
			return err
		}
		if err := inferListOperands(n); err != nil {
			return err
		}
		if err := inferSeriesOperands(n); err != nil {
			return err
		}
		if product && !inChain {
			return chainKind(n)
		}
	case *Call:
		if err := complexArgProblem(n); err != nil {
			return err
		}
		if n.Func.phasor || n.Func.Name == "abs" && n.Args[0].Type().IsComplex() {
			return inferComplexCall(n)
		}
		return n.Func.check(n)
	case *Keyword:
		return errAt(n.Pos(), "write it as the last argument of interp or spline", "%s has a meaning only inside interp( ) and spline( )", n.Word)
	}
	return nil
}

// inferLiteral types a number or a quantity, real or imaginary (4j A).
func inferLiteral(e Expr) *diag.Diagnostic {
	t := e.Type()
	switch n := e.(type) {
	case *Number:
		*t = Type{Const: true, Val: n.Value, Count: isWholeText(n.Text)}
		if n.Imag {
			*t = Type{Domain: Complex, Const: true, Im: n.Value}
		}
	case *Quantity:
		*t = Type{Dim: n.Unit.Dim, Kind: n.Unit.Kind, Const: true, Val: n.SI}
		if n.Imag {
			if n.Unit.IsAffine() {
				return errAt(n.Pos(), "write a temperature difference in K", "an absolute temperature cannot be imaginary")
			}
			t.Domain, t.Val, t.Im = Complex, 0, n.SI
		}
	}
	return nil
}

// isProduct reports whether e is a product or a quotient.
func isProduct(e Expr) bool {
	b, ok := e.(*Binary)
	return ok && (b.Op == "*" || b.Op == "/")
}

// isWholeText reports whether a number was written as a whole number: 120,
// 3_000, not 2.0 or 1e3.
func isWholeText(s string) bool {
	if s == "" {
		return false
	}
	for _, c := range s {
		if (c < '0' || c > '9') && c != '_' {
			return false
		}
	}
	return true
}

// inferTableCall checks interp, spline and pick: two columns of one
// table, and an x of the x column's dimension. The result has the y
// column's unit.
func inferTableCall(n *Call) *diag.Diagnostic {
	y, yok := n.Args[0].(*Ref)
	x, xok := n.Args[1].(*Ref)
	if !yok || !xok || y.Column == nil || x.Column == nil {
		at := n.Args[0].Pos()
		if yok && y.Column != nil {
			at = n.Args[1].Pos()
		}
		return errAt(at, "write "+n.Func.Usage+", for example "+n.Name+"(BH.B, BH.H, H_c)",
			"the first two arguments of %s are columns of a table", n.Name)
	}
	if y.Column.Table != x.Column.Table {
		return errAt(n.Args[1].Pos(), "read two columns of the same table", "%s and %s are columns of different tables", y.Name, x.Name)
	}
	if err := infer(n.Args[2]); err != nil {
		return err
	}
	if err := complexArgProblem(n); err != nil {
		return err
	}
	at := n.Args[2].Type()
	if at.Dim != x.Column.Unit.Dim {
		return errAt(n.Args[2].Pos(), "give a value of the x column's kind",
			"%s reads %s against %s, which is %s, but the value given is %s", n.Name, y.Name, x.Name,
			units.Describe(x.Column.Unit.Dim), units.Describe(at.Dim))
	}
	extrapolate := false
	if len(n.Args) == 4 {
		k, ok := n.Args[3].(*Keyword)
		if !ok || n.Func.table == "exact" {
			return errAt(n.Args[3].Pos(), "the fourth argument may only be the word extrapolate", "unexpected fourth argument of %s", n.Name)
		}
		extrapolate = k.Word == "extrapolate"
	}
	n.y, n.x = y.Column, x.Column
	if n.Func.table != "exact" {
		ip, err := newInterpolator(y.Column, x.Column, n.Func.table == "cubic", extrapolate)
		if err != nil {
			return errAt(n.Args[1].Pos(), "sort the table by that column, or read against another one", "%v", err)
		}
		n.table = ip
	}
	// At a list of x, the table is read at each element.
	*n.Type() = Type{Shape: at.Shape, Len: at.Len, Dim: y.Column.Unit.Dim, Kind: y.Column.Unit.Kind}
	return nil
}

func inferBinary(n *Binary) *diag.Diagnostic {
	x, y, t := n.X.Type(), n.Y.Type(), n.Type()
	t.Const = x.Const && y.Const
	switch n.Op {
	case "+", "-", "<", "<=", ">", ">=", "==":
		verb := map[string]string{"+": "add", "-": "subtract"}[n.Op]
		if verb == "" {
			verb = "compare"
		}
		if x.Dim != y.Dim {
			return errAt(n.Pos(), "both sides of "+n.Op+" must measure the same thing",
				"cannot %s %s and %s", verb, units.Describe(x.Dim), units.Describe(y.Dim))
		}
		k, err := addKinds(n.Op, x.Kind, y.Kind)
		if err != nil {
			err.Pos = n.Pos()
			return err
		}
		t.Dim, t.Kind = x.Dim, k
		t.Count = x.Count && y.Count && (n.Op == "+" || n.Op == "-")
		if t.Const {
			switch n.Op {
			case "+":
				t.Val = x.Val + y.Val
			case "-":
				t.Val = x.Val - y.Val
			}
		}
	case "*", "/":
		for _, side := range []*Type{x, y} {
			if side.Kind.IsAbsTemp() {
				return errAt(n.Pos(), "subtract a reference temperature to get a difference in K, or write the temperature in K",
					"cannot multiply or divide an absolute temperature (°C or °F): the result would depend on where the scale starts")
			}
		}
		sign := 1
		if n.Op == "/" {
			sign = -1
		}
		if !mulFits(x.Dim, y.Dim, sign) || !units.KindFits(x.Kind, y.Kind, sign) {
			return errAt(n.Pos(), "name a quantity with a smaller power of its unit, or check the formula",
				"the dimension of this result has an exponent beyond ±127, which sheaf cannot hold")
		}
		if n.Op == "*" {
			t.Dim = x.Dim.Mul(y.Dim)
			t.Val = x.Val * y.Val
		} else {
			t.Dim = x.Dim.Div(y.Dim)
			if t.Const && y.Val != 0 {
				t.Val = x.Val / y.Val
			} else {
				t.Const = false
			}
		}
		// The kind of the whole chain is worked out at its top (chainKind).
		if n.Op == "*" {
			t.Kind = x.Kind.Mul(y.Kind)
		} else {
			t.Kind = x.Kind.Div(y.Kind)
		}
		t.Count = x.Count && y.Count
	case "^":
		return inferPower(n)
	}
	return nil
}

// mulFits reports whether the dimension of a product (sign 1) or quotient
// (sign -1) keeps every exponent within int8, so that m⁹⁹·m⁹⁹ is refused
// instead of wrapping round to m⁻⁵⁸.
func mulFits(a, b units.Dim, sign int) bool {
	for i := range a {
		if v := int(a[i]) + sign*int(b[i]); v > 127 || v < -127 {
			return false
		}
	}
	return true
}

func inferPower(n *Binary) *diag.Diagnostic {
	x, y, t := n.X.Type(), n.Y.Type(), n.Type()
	if !y.Dim.IsDimensionless() {
		return errAt(n.Y.Pos(), "an exponent must be a pure number", "the exponent has a unit: it is %s", units.Describe(y.Dim))
	}
	if x.Kind.IsAbsTemp() {
		return errAt(n.Pos(), "write the temperature in K", "cannot raise an absolute temperature (°C or °F) to a power")
	}
	// ω² keeps its radians squared; a fractional power of an angle has
	// no kind sheaf can hold, and is plain.
	t.Kind = units.Plain
	if p := y.Val; y.Const && p == math.Trunc(p) && math.Abs(p) <= 99 && units.KindPowFits(x.Kind, int(p)) {
		t.Kind = x.Kind.Exponents().Pow(int(p))
	}
	t.Count = x.Count && y.Count && y.Const && y.Val >= 0
	t.Const = x.Const && y.Const
	if t.Const {
		t.Val = math.Pow(x.Val, y.Val)
	}
	if x.Dim.IsDimensionless() {
		return nil
	}
	if !y.Const {
		return errAt(n.Y.Pos(), "use a fixed number as the exponent of a quantity with a unit",
			"the exponent of %s must be a fixed number, not a result", units.Describe(x.Dim))
	}
	d, ok := x.Dim.PowFits(y.Val)
	if !ok {
		return errAt(n.Y.Pos(), "choose an exponent that gives whole powers of the base units",
			"%s to the power %g has no unit that sheaf can hold", units.Describe(x.Dim), y.Val)
	}
	t.Dim = d
	return nil
}

// inferCall is the type check of the functions of numbers: their
// arguments are scalars (one value each), real, and of the dimension and
// kind the entry's rules ask.
func inferCall(n *Call) *diag.Diagnostic {
	f, t := n.Func, n.Type()
	first := n.Args[0].Type()
	t.Const, t.Count = true, true
	kind := first.Kind
	for _, a := range n.Args {
		at := a.Type()
		t.Const = t.Const && at.Const
		t.Count = t.Count && at.Count
		if err := checkArg(n, a); err != nil {
			return err
		}
		if f.args == sameDim {
			k, err := addKinds("<", kind, at.Kind)
			if err != nil {
				err.Pos = a.Pos()
				return err
			}
			kind = k
		}
	}
	switch f.result {
	case likeArg:
		t.Dim, t.Kind = first.Dim, kind
		if first.Kind.IsAbsTemp() && f.Name == "hypot" {
			return errAt(n.Pos(), "", "hypot of absolute temperatures is not defined")
		}
	case halfArg:
		d, ok := first.Dim.Root(2)
		if !ok {
			return errAt(n.Args[0].Pos(), "the dimension under a square root must have even exponents",
				"the square root of %s has no unit that sheaf can hold", units.Describe(first.Dim))
		}
		k, _ := first.Kind.Exponents().Root(2) // sqrt(ω²) is ω; an odd power of an angle leaves none
		t.Dim, t.Kind, t.Count = d, k, false
	case plainOne:
		t.Dim, t.Kind = units.Dimensionless, units.Plain
		t.Count = f.whole
	case angle:
		t.Dim, t.Kind, t.Count = units.Dimensionless, units.Angle, false
	}
	if first.IsList() {
		// A function of one number applies to each element of a list.
		t.Shape, t.Len, t.Const = List, first.Len, false
	}
	if t.Const {
		t.Val = evalConstCall(n)
		if math.IsNaN(t.Val) || math.IsInf(t.Val, 0) {
			t.Const = false // leave it to evaluation, which reports it at its place
		}
	}
	return nil
}

// checkArg checks one argument of a call against what the function asks
// of its dimension and kind.
func checkArg(n *Call, a Expr) *diag.Diagnostic {
	f, at, first := n.Func, a.Type(), n.Args[0].Type()
	if at.IsList() && f.f1 != nil {
		// sqrt, sin, abs ... apply to each element; the rules below hold
		// for the element.
	} else if at.Shape != Scalar || at.Domain != Real {
		return errAt(a.Pos(), "apply it to one element, as "+n.Name+"(x[1], ...), or reduce the list first, as "+n.Name+"(max(x), ...)",
			"%s takes one real value for each argument; this is a list", n.Name)
	}
	switch f.args {
	case dimensionless, angleArg:
		if !at.Dim.IsDimensionless() {
			hint := "divide by a reference first, for example " + n.Name + "(x / (1 m))"
			if f.args == angleArg {
				hint = "the argument must be an angle (rad or deg) or a pure number"
			}
			return errAt(a.Pos(), hint, "%s needs a pure number, but its argument is %s", n.Name, units.Describe(at.Dim))
		}
		if at.Kind.IsAbsTemp() {
			return errAt(a.Pos(), "", "%s of an absolute temperature is not defined", n.Name)
		}
		if f.args == angleArg && at.Kind.Cyc != 0 {
			return errAt(a.Pos(), "an angle is 2π times a number of cycles: write "+n.Name+"(2*pi*f*t) rather than "+n.Name+"(f*t)",
				"the argument of %s counts cycles, not radians: a factor 2π is missing", n.Name)
		}
		if f.args == angleArg && at.Kind.Rad != 0 && at.Kind.Rad != 1 {
			return errAt(a.Pos(), "check the powers of the angles in the argument",
				"the argument of %s is %s, not an angle", n.Name, at.Kind)
		}
	case sameDim:
		if at.Dim != first.Dim {
			return errAt(a.Pos(), "all arguments of "+n.Name+" must measure the same thing",
				"%s mixes %s and %s", n.Name, units.Describe(first.Dim), units.Describe(at.Dim))
		}
	case anyDim:
		if at.Kind.IsAbsTemp() && f.result == halfArg {
			return errAt(a.Pos(), "write the temperature in K", "cannot take the square root of an absolute temperature")
		}
	}
	return nil
}

// inferMinMax checks min and max: of one list, its smallest or largest
// element; of several single values, the smallest or largest of them.
func inferMinMax(n *Call) *diag.Diagnostic {
	if len(n.Args) == 1 {
		if !n.Args[0].Type().IsList() {
			return errAt(n.Args[0].Pos(), "give a list, as "+n.Name+"(phi), or two or more values, as "+n.Name+"(a, b)",
				"%s of one single value is that value", n.Name)
		}
		return inferReduce(n)
	}
	return inferCall(n)
}

// inferReduce checks a reduction: its argument is a list, and its result
// one value of the element's dimension (product: to the power of the
// length; count: a pure number).
func inferReduce(n *Call) *diag.Diagnostic {
	a := n.Args[0].Type()
	if !a.IsList() {
		return errAt(n.Args[0].Pos(), "give it a list, as "+n.Name+"(phi) or "+n.Name+"([a, b, c]); single values add with +",
			"%s works on the elements of a list, but this is a single value", n.Name)
	}
	t := n.Type()
	*t = Type{Dim: a.Dim, Kind: a.Kind, Count: a.Count && n.Name != "mean" && n.Name != "rms"}
	if a.IsComplex() && n.Name != "count" {
		t.Domain = Complex // the sum or the mean of phasors (complexArgProblem refuses the others)
	}
	if a.Kind.IsAbsTemp() && (n.Name == "sum" || n.Name == "product" || n.Name == "rms") {
		return errAt(n.Args[0].Pos(), "work with temperature differences in K", "cannot take the %s of absolute temperatures (°C or °F)", n.Name)
	}
	switch n.Func.result {
	case plainOne:
		*t = Type{Dim: units.Dimensionless, Kind: units.Plain, Count: true}
	case powLen:
		d, ok := a.Dim.PowFits(float64(a.Len))
		if !ok {
			return errAt(n.Pos(), "multiply fewer quantities with units, or make them pure numbers first",
				"the product of %d values of %s has no unit that sheaf can hold", a.Len, units.Describe(a.Dim))
		}
		t.Dim, t.Kind = d, units.Plain
		if units.KindPowFits(a.Kind, a.Len) {
			t.Kind = a.Kind.Exponents().Pow(a.Len)
		}
	}
	return nil
}

// inferSolveCall is the type check of solve(...) where it is not a whole
// right side; sheet.prepareSolve and checkSolveBounds check the others.
func inferSolveCall(n *Call) *diag.Diagnostic {
	return errAt(n.Pos(), "write the unknown as its own statement: x = solve(left == right, lowest, highest)",
		"solve must be the whole right side of a definition")
}

func evalConstCall(n *Call) float64 {
	vals := make([]float64, len(n.Args))
	for i, a := range n.Args {
		vals[i] = a.Type().Val
	}
	return applyFunction(n.Func, vals)
}

// applyFunction evaluates a function on argument values.
func applyFunction(f *Function, v []float64) float64 {
	if f.f1 != nil {
		return f.f1(v[0])
	}
	acc := v[0]
	for _, x := range v[1:] {
		acc = f.f2(acc, x)
	}
	return acc
}
