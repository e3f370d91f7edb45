package engine

import (
	"math"
)

// evalFn computes a node from the sheet's slot values, all in coherent SI.
// Compiled formulas are trees of these closures over plain float64s: the
// units were dealt with when the formula was checked.
type evalFn func(v []float64) float64

// compile builds the closure for every node of e and returns the root's.
func compile(e Expr) evalFn { return compileIn(e, false) }

// compileIn compiles e; inFlat says that an ancestor runs as one flat
// closure (flat.go), so that e need not try to be one: its own closure
// serves only to find where a value went bad.
func compileIn(e Expr, inFlat bool) evalFn {
	if c, ok := e.(*Call); ok && c.Func.table != "" {
		// Table columns are data, not values: only the x argument compiles.
		fn := compileCall(c)
		c.fn = fn
		return fn
	}
	var flat evalFn
	isFlat := false
	if !inFlat {
		flat, isFlat = compileFlat(e)
	}
	for _, c := range e.children() {
		compileIn(c, inFlat || isFlat)
	}
	fn := compileNode(e)
	if isFlat {
		fn = flat
	}
	e.base().fn = fn
	return fn
}

func fnOf(e Expr) evalFn { return e.base().fn }

func constant(c float64) evalFn { return func([]float64) float64 { return c } }

func compileNode(e Expr) evalFn {
	t := e.Type()
	if c, ok := e.(*Choice); ok {
		return compileChoice(c)
	}
	if a, ok := e.(*Apply); ok {
		return compileApply(a)
	}
	if t.IsComplex() {
		return compileComplex(e)
	}
	if t.IsList() {
		return compileList(e)
	}
	if t.Const && !math.IsNaN(t.Val) && !math.IsInf(t.Val, 0) {
		return constant(t.Val)
	}
	switch n := e.(type) {
	case *Number:
		return constant(n.Value)
	case *Quantity:
		return constant(n.SI)
	case *Ref:
		if n.Constant != nil {
			return constant(n.Constant.Value)
		}
		i := n.Target.slot
		return func(v []float64) float64 { return v[i] }
	case *Unary:
		x := fnOf(n.X)
		if n.Op == "+" {
			return x
		}
		return func(v []float64) float64 { return -x(v) }
	case *Binary:
		return compileBinary(n)
	case *Call:
		return compileCall(n)
	case *Index:
		return compileIndex(n)
	}
	return constant(math.NaN())
}

// operand is one side of a binary operation as the compiler sees it: a
// slot read directly, a constant, or a closure to call.
type operand struct {
	kind byte // 's' slot, 'c' constant, 'f' closure
	slot int
	c    float64
	fn   evalFn
}

func operandOf(e Expr) operand {
	if i, ok := slotOf(e); ok {
		return operand{kind: 's', slot: i}
	}
	if c, ok := constOf(e); ok {
		return operand{kind: 'c', c: c}
	}
	return operand{kind: 'f', fn: fnOf(e)}
}

func compileBinary(n *Binary) evalFn {
	if fn, ok := compilePairs(n.Op, n.X, n.Y); ok {
		return fn
	}
	x, y := operandOf(n.X), operandOf(n.Y)
	switch n.Op {
	case "+":
		return compileAdd(x, y)
	case "-":
		return compileSub(x, y)
	case "*":
		return compileMul(x, y)
	case "/":
		return compileDiv(x, y)
	case "^":
		return compilePow(fnOf(n.X), n.Y)
	}
	return constant(math.NaN())
}

// The arithmetic operators, specialised so that a side that is a slot or
// a constant costs no call: in a compiled sheet most sides are.

func compileAdd(x, y operand) evalFn {
	a, b, i, j, f, g := x.c, y.c, x.slot, y.slot, x.fn, y.fn
	switch string([]byte{x.kind, y.kind}) {
	case "ss":
		return func(v []float64) float64 { return v[i] + v[j] }
	case "sc":
		return func(v []float64) float64 { return v[i] + b }
	case "cs":
		return func(v []float64) float64 { return a + v[j] }
	case "sf":
		return func(v []float64) float64 { return v[i] + g(v) }
	case "fs":
		return func(v []float64) float64 { return f(v) + v[j] }
	case "fc":
		return func(v []float64) float64 { return f(v) + b }
	case "cf":
		return func(v []float64) float64 { return a + g(v) }
	}
	f, g = x.call(), y.call()
	return func(v []float64) float64 { return f(v) + g(v) }
}

func compileSub(x, y operand) evalFn {
	a, b, i, j, f, g := x.c, y.c, x.slot, y.slot, x.fn, y.fn
	switch string([]byte{x.kind, y.kind}) {
	case "ss":
		return func(v []float64) float64 { return v[i] - v[j] }
	case "sc":
		return func(v []float64) float64 { return v[i] - b }
	case "cs":
		return func(v []float64) float64 { return a - v[j] }
	case "sf":
		return func(v []float64) float64 { return v[i] - g(v) }
	case "fs":
		return func(v []float64) float64 { return f(v) - v[j] }
	case "fc":
		return func(v []float64) float64 { return f(v) - b }
	case "cf":
		return func(v []float64) float64 { return a - g(v) }
	}
	f, g = x.call(), y.call()
	return func(v []float64) float64 { return f(v) - g(v) }
}

func compileMul(x, y operand) evalFn {
	a, b, i, j, f, g := x.c, y.c, x.slot, y.slot, x.fn, y.fn
	switch string([]byte{x.kind, y.kind}) {
	case "ss":
		return func(v []float64) float64 { return v[i] * v[j] }
	case "sc":
		return func(v []float64) float64 { return v[i] * b }
	case "cs":
		return func(v []float64) float64 { return a * v[j] }
	case "sf":
		return func(v []float64) float64 { return v[i] * g(v) }
	case "fs":
		return func(v []float64) float64 { return f(v) * v[j] }
	case "fc":
		return func(v []float64) float64 { return f(v) * b }
	case "cf":
		return func(v []float64) float64 { return a * g(v) }
	}
	f, g = x.call(), y.call()
	return func(v []float64) float64 { return f(v) * g(v) }
}

func compileDiv(x, y operand) evalFn {
	a, b, i, j, f, g := x.c, y.c, x.slot, y.slot, x.fn, y.fn
	switch string([]byte{x.kind, y.kind}) {
	case "ss":
		return func(v []float64) float64 { return v[i] / v[j] }
	case "sc":
		return func(v []float64) float64 { return v[i] / b }
	case "cs":
		return func(v []float64) float64 { return a / v[j] }
	case "sf":
		return func(v []float64) float64 { return v[i] / g(v) }
	case "fs":
		return func(v []float64) float64 { return f(v) / v[j] }
	case "fc":
		return func(v []float64) float64 { return f(v) / b }
	case "cf":
		return func(v []float64) float64 { return a / g(v) }
	}
	f, g = x.call(), y.call()
	return func(v []float64) float64 { return f(v) / g(v) }
}

// call returns the operand as a closure, whatever its kind.
func (o operand) call() evalFn {
	switch o.kind {
	case 's':
		i := o.slot
		return func(v []float64) float64 { return v[i] }
	case 'c':
		return constant(o.c)
	}
	return o.fn
}

func compilePow(x evalFn, exp Expr) evalFn {
	if c, ok := constOf(exp); ok {
		switch c {
		case 2:
			return func(v []float64) float64 { a := x(v); return a * a }
		case 3:
			return func(v []float64) float64 { a := x(v); return a * a * a }
		case 0.5:
			return func(v []float64) float64 { return math.Sqrt(x(v)) }
		case -1:
			return func(v []float64) float64 { return 1 / x(v) }
		}
	}
	y := fnOf(exp)
	return func(v []float64) float64 { return math.Pow(x(v), y(v)) }
}

func slotOf(e Expr) (int, bool) {
	if r, ok := e.(*Ref); ok && r.Target != nil && !r.T.Const && !r.T.IsList() && !r.T.IsComplex() {
		return r.Target.slot, true
	}
	return 0, false
}

func constOf(e Expr) (float64, bool) {
	t := e.Type()
	if t.Const && !t.IsComplex() && !math.IsNaN(t.Val) && !math.IsInf(t.Val, 0) {
		return t.Val, true
	}
	return 0, false
}

// tableReader reads a table call's y column at one x: between rows for
// interp and spline, in the matching row for pick (NaN when none is).
func tableReader(n *Call) func(float64) float64 {
	if n.table != nil {
		return n.table.at
	}
	ix, ys := newExactIndex(n.x), n.y
	return func(x float64) float64 {
		if i := ix.find(x); i >= 0 {
			return ys.Values[i]
		}
		return math.NaN()
	}
}

func compileCall(n *Call) evalFn {
	if n.Func.table != "" {
		x, read := compile(n.Args[2]), tableReader(n)
		if n.Args[2].Type().IsList() {
			return compileTableList(n, x, read)
		}
		return func(v []float64) float64 { return read(x(v)) }
	}
	f := n.Func
	if f.build != nil {
		return f.build(n)
	}
	if f.cx != nil || f.Name == "abs" && n.Args[0].Type().IsComplex() {
		return compilePhasorPart(n)
	}
	if f.reduce != nil && n.Args[0].Type().IsList() {
		return compileReduce(n)
	}
	args := make([]evalFn, len(n.Args))
	for i, a := range n.Args {
		args[i] = fnOf(a)
	}
	switch {
	case f.f1 != nil:
		g, a := f.f1, args[0]
		return func(v []float64) float64 { return g(a(v)) }
	case len(args) == 2:
		g, a, b := f.f2, args[0], args[1]
		return func(v []float64) float64 { return g(a(v), b(v)) }
	}
	g := f.f2
	return func(v []float64) float64 {
		acc := args[0](v)
		for _, a := range args[1:] {
			acc = g(acc, a(v))
		}
		return acc
	}
}
