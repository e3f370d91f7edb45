package engine

import (
	"fmt"
	"math"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

var dimTemperature = units.DimOf(units.Temperature)

// infer works out the dimension and kind of every node of e, bottom up,
// before anything is evaluated. Names must already be resolved and the
// statements they name already inferred.
func infer(e Expr) *diag.Diagnostic {
	if c, ok := e.(*Call); ok && c.Func.table != "" {
		return inferTableCall(c)
	}
	for _, c := range e.children() {
		if err := infer(c); err != nil {
			return err
		}
	}
	t := e.Type()
	switch n := e.(type) {
	case *Number:
		*t = Type{Const: true, Val: n.Value}
	case *Quantity:
		*t = Type{Dim: n.Unit.Dim, Kind: n.Unit.Kind, Const: true, Val: n.SI}
	case *Ref:
		if n.Column != nil {
			return errAt(n.Pos(), "read it with interp("+n.Name+", ...), spline(...) or pick(...)",
				"%s is a column of table %s, not a single value", n.Name, n.Column.Table.Name)
		}
		if n.Constant != nil {
			*t = Type{Dim: n.Constant.Dim, Const: true, Val: n.Constant.Value}
		} else {
			*t = Type{Dim: n.Target.Type.Dim, Kind: n.Target.Type.Kind}
		}
	case *Unary:
		*t = *n.X.Type()
		if n.Op == "-" {
			t.Val = -t.Val
			if t.Kind == units.AbsTemp {
				return errAt(n.Pos(), "negate a temperature difference in K instead", "cannot negate an absolute temperature")
			}
		}
	case *Binary:
		return inferBinary(n)
	case *Call:
		return inferCall(n)
	case *Keyword:
		return errAt(n.Pos(), "write it as the last argument of interp or spline", "%s has a meaning only inside interp( ) and spline( )", n.Word)
	}
	return nil
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
	*n.Type() = Type{Dim: y.Column.Unit.Dim, Kind: y.Column.Unit.Kind}
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
			if side.Kind == units.AbsTemp {
				return errAt(n.Pos(), "subtract a reference temperature to get a difference in K, or write the temperature in K",
					"cannot multiply or divide an absolute temperature (°C or °F): the result would depend on where the scale starts")
			}
		}
		sign := 1
		if n.Op == "/" {
			sign = -1
		}
		if !mulFits(x.Dim, y.Dim, sign) {
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
		t.Kind = productKind(n)
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

// addKinds decides the kind of a sum, difference or comparison, and
// refuses mixtures that would hide a 2π or a temperature offset.
func addKinds(op string, a, b units.Kind) (units.Kind, *diag.Diagnostic) {
	if a == b {
		if a == units.AbsTemp {
			switch op {
			case "-":
				return units.Plain, nil // the difference of two temperatures is a difference
			case "+":
				return 0, errAt(diag.Pos{}, "add a temperature difference in K to a temperature in °C",
					"cannot add two absolute temperatures")
			}
		}
		return a, nil
	}
	if a == units.AbsTemp || b == units.AbsTemp {
		switch op {
		case "+":
			return units.AbsTemp, nil
		case "-":
			if a == units.AbsTemp {
				return units.AbsTemp, nil
			}
			return 0, errAt(diag.Pos{}, "subtract the temperatures the other way round, or write both in °C",
				"cannot subtract an absolute temperature from a temperature difference")
		}
		return 0, errAt(diag.Pos{}, "compare absolute temperatures with absolute temperatures, and differences (K) with differences",
			"cannot compare an absolute temperature (°C or °F) with a temperature difference (K)")
	}
	if a == units.Plain {
		return b, nil
	}
	if b == units.Plain {
		return a, nil
	}
	return 0, errAt(diag.Pos{}, "an angular velocity (rad/s) is 2π times a rotational frequency (rpm, Hz): multiply the frequency by 2*pi first",
		"cannot %s an angle-based quantity (rad) and a cycle-based one (Hz, rpm)", map[bool]string{true: "compare", false: "add"}[isComparison(op)])
}

// productKind decides the kind of a product or quotient. A rotational
// frequency (rpm, Hz) times pure numbers stays one (f = p*n); times 2π it
// becomes an angular velocity (omega = 2*pi*n), and an angular velocity
// divided by 2π a frequency again. Anything else is plain.
func productKind(n *Binary) units.Kind {
	c := 1.0
	var rot []*Type
	var others int
	var walk func(e Expr, inverse bool)
	walk = func(e Expr, inverse bool) {
		if b, ok := e.(*Binary); ok && (b.Op == "*" || b.Op == "/") {
			walk(b.X, inverse)
			walk(b.Y, inverse != (b.Op == "/"))
			return
		}
		t := e.Type()
		switch {
		case t.Const && t.Dim.IsDimensionless() && t.Kind == units.Plain:
			if inverse {
				c /= t.Val
			} else {
				c *= t.Val
			}
		case (t.Kind == units.Angle || t.Kind == units.Cycle) && !inverse:
			rot = append(rot, t)
		case t.Dim.IsDimensionless() && t.Kind == units.Plain:
			// pure numbers such as pole pairs keep the kind
		default:
			others++
		}
	}
	walk(n, false)
	if len(rot) != 1 || others > 0 {
		return units.Plain
	}
	k := rot[0].Kind
	switch {
	case near(math.Abs(c), 2*math.Pi) && k == units.Cycle:
		return units.Angle
	case near(math.Abs(c), 1/(2*math.Pi)) && k == units.Angle:
		return units.Cycle
	}
	return k
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-12*math.Abs(b) }

func inferPower(n *Binary) *diag.Diagnostic {
	x, y, t := n.X.Type(), n.Y.Type(), n.Type()
	if !y.Dim.IsDimensionless() {
		return errAt(n.Y.Pos(), "an exponent must be a pure number", "the exponent has a unit: it is %s", units.Describe(y.Dim))
	}
	if x.Kind == units.AbsTemp {
		return errAt(n.Pos(), "write the temperature in K", "cannot raise an absolute temperature (°C or °F) to a power")
	}
	t.Kind = units.Plain
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

func inferCall(n *Call) *diag.Diagnostic {
	f, t := n.Func, n.Type()
	first := n.Args[0].Type()
	t.Const = true
	for _, a := range n.Args {
		at := a.Type()
		t.Const = t.Const && at.Const
		switch f.args {
		case dimensionless:
			if !at.Dim.IsDimensionless() {
				hint := "divide by a reference first, for example " + n.Name + "(x / (1 m))"
				if n.Name == "sin" || n.Name == "cos" || n.Name == "tan" {
					hint = "the argument must be an angle (rad or deg) or a pure number"
				}
				return errAt(a.Pos(), hint, "%s needs a pure number, but its argument is %s", n.Name, units.Describe(at.Dim))
			}
			if at.Kind == units.AbsTemp {
				return errAt(a.Pos(), "", "%s of an absolute temperature is not defined", n.Name)
			}
		case sameDim:
			if at.Dim != first.Dim {
				return errAt(a.Pos(), "all arguments of "+n.Name+" must measure the same thing",
					"%s mixes %s and %s", n.Name, units.Describe(first.Dim), units.Describe(at.Dim))
			}
			if _, err := addKinds("<", first.Kind, at.Kind); err != nil {
				err.Pos = a.Pos()
				return err
			}
		case anyDim:
			if at.Kind == units.AbsTemp && f.result == halfArg {
				return errAt(a.Pos(), "write the temperature in K", "cannot take the square root of an absolute temperature")
			}
		}
	}
	switch f.result {
	case likeArg:
		t.Dim, t.Kind = first.Dim, first.Kind
		if n.Name != "abs" && first.Kind == units.AbsTemp && f.Name == "hypot" {
			return errAt(n.Pos(), "", "hypot of absolute temperatures is not defined")
		}
	case halfArg:
		d, ok := first.Dim.Root(2)
		if !ok {
			return errAt(n.Args[0].Pos(), "the dimension under a square root must have even exponents",
				"the square root of %s has no unit that sheaf can hold", units.Describe(first.Dim))
		}
		t.Dim, t.Kind = d, units.Plain
	case plainOne:
		t.Dim, t.Kind = units.Dimensionless, units.Plain
	case angle:
		t.Dim, t.Kind = units.Dimensionless, units.Angle
	}
	if t.Const {
		t.Val = evalConstCall(n)
		if math.IsNaN(t.Val) || math.IsInf(t.Val, 0) {
			t.Const = false // leave it to evaluation, which reports it at its place
		}
	}
	return nil
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

// displayProblem says why a value of type t cannot be shown in unit u, or
// returns "" if it can. formula is a definition's right side as written,
// for the hint; "" for a check.
func displayProblem(name, formula string, t Type, u units.Unit) (msg, hint string) {
	if t.Dim != u.Dim {
		return fmt.Sprintf("display unit %s measures %s, but %s is %s", u.Symbol, units.Describe(u.Dim), name, units.Describe(t.Dim)),
			"choose a unit of the same kind, or check the formula"
	}
	// The hint shows the corrected right side, not the defined name: the
	// 2π belongs in the formula.
	group := formula
	if _, end := identifier([]rune(formula), 0); end != len([]rune(formula)) {
		group = "(" + formula + ")"
	}
	switch {
	case t.Kind == units.Cycle && u.Kind == units.Angle:
		hint = "for an angular velocity multiply the frequency by 2*pi"
		if formula != "" {
			hint = "for an angular velocity write " + name + " [" + u.Symbol + "] = 2*pi*" + group
		}
		return fmt.Sprintf("%s is a rotational frequency (cycles), and showing it in %s would drop a factor 2π", name, u.Symbol),
			hint + "; or show it in Hz or rpm"
	case t.Kind == units.Angle && u.Kind == units.Cycle:
		hint = "for a frequency divide the angular velocity by 2*pi"
		if formula != "" {
			hint = "for a frequency write " + name + " [" + u.Symbol + "] = " + group + "/(2*pi)"
		}
		return fmt.Sprintf("%s is an angular velocity (radians), and showing it in %s would add a factor 2π", name, u.Symbol),
			hint + "; or show it in rad/s"
	case u.Kind == units.AbsTemp && t.Kind != units.AbsTemp && t.Dim == dimTemperature:
		return fmt.Sprintf("%s is a temperature difference and cannot be shown in %s", name, u.Symbol),
			"show differences in K"
	}
	return "", ""
}
