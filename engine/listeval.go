package engine

import "math"

// The compiled code of lists. A list node's closure writes its elements
// to its place in v and returns 0; the closure of an operation on lists
// calls its operands' closures first (a name of a list costs nothing:
// its statement ran before) and then runs one plain loop.

func noop([]float64) float64 { return 0 }

// compileList builds the closure of a node that holds a list.
func compileList(e Expr) evalFn {
	at, n := listAt(e)
	switch e := e.(type) {
	case *Ref:
		if e.Column != nil {
			vals := e.Column.Values
			return func(v []float64) float64 { copy(v[at:at+n], vals); return 0 }
		}
		return noop
	case *Range:
		vals := e.Values
		return func(v []float64) float64 { copy(v[at:at+n], vals); return 0 }
	case *ListLit:
		return compileListLit(e, at, n)
	case *Unary:
		fx, xa := fnOf(e.X), int(e.X.base().at)
		if e.Op == "+" {
			return withAxis(e, func(v []float64) float64 { fx(v); copy(v[at:at+n], v[xa:xa+n]); return 0 })
		}
		return withAxis(e, func(v []float64) float64 {
			fx(v)
			a, o := v[xa:xa+n], v[at:at+n]
			for i := range o {
				o[i] = -a[i]
			}
			return 0
		})
	case *Binary:
		return withAxis(e, compileListBinary(e, at, n))
	case *Call:
		if e.Func.build != nil {
			return e.Func.build(e)
		}
		if e.Args[0].Type().IsComplex() { // abs, arg, Re or Im of each phasor
			return compileComplexListPart(e)
		}
		return mapList(fnOf(e.Args[0]), int(e.Args[0].base().at), at, n, e.Func.f1)
	}
	return func([]float64) float64 { return math.NaN() }
}

func compileListLit(e *ListLit, at, n int) evalFn {
	vals := make([]float64, n)
	fns := make([]evalFn, n)
	fixed := true
	for i, x := range e.Elems {
		fns[i] = fnOf(x)
		c, ok := constOf(x)
		vals[i], fixed = c, fixed && ok
	}
	if fixed {
		return func(v []float64) float64 { copy(v[at:at+n], vals); return 0 }
	}
	return func(v []float64) float64 {
		o := v[at : at+n]
		for i, f := range fns {
			o[i] = f(v)
		}
		return 0
	}
}

// listSide is one operand of an operation on lists: a list at a place in
// v, or a single value computed once per run.
type listSide struct {
	list bool
	at   int
	fn   evalFn
}

func listSideOf(e Expr) listSide {
	if e.Type().IsList() {
		return listSide{list: true, at: int(e.base().at), fn: fnOf(e)}
	}
	return listSide{fn: operandOf(e).call()}
}

// compileListBinary runs x op y element by element; a single value on
// either side is computed once.
func compileListBinary(b *Binary, at, n int) evalFn {
	x, y := listSideOf(b.X), listSideOf(b.Y)
	if b.Op == "^" {
		return compileListPow(x, y, at, n)
	}
	loop := listLoops[b.Op]
	fx, fy := x.fn, y.fn
	switch {
	case x.list && y.list:
		xa, ya, ll := x.at, y.at, loop.ll
		return func(v []float64) float64 {
			fx(v)
			fy(v)
			ll(v[at:at+n], v[xa:xa+n], v[ya:ya+n])
			return 0
		}
	case x.list:
		xa, ls := x.at, loop.ls
		return func(v []float64) float64 {
			fx(v)
			ls(v[at:at+n], v[xa:xa+n], fy(v))
			return 0
		}
	}
	ya, sl := y.at, loop.sl
	return func(v []float64) float64 {
		s := fx(v)
		fy(v)
		sl(v[at:at+n], s, v[ya:ya+n])
		return 0
	}
}

func compileListPow(x, y listSide, at, n int) evalFn {
	fx, fy, xa := x.fn, y.fn, x.at
	return func(v []float64) float64 {
		fx(v)
		p := fy(v)
		a, o := v[xa:xa+n], v[at:at+n]
		if p == 2 {
			for i := range o {
				o[i] = a[i] * a[i]
			}
			return 0
		}
		for i := range o {
			o[i] = math.Pow(a[i], p)
		}
		return 0
	}
}

// The element-wise loops, one per operator and shape: each a plain loop
// that the Go compiler keeps free of calls and bounds checks.
type listLoop struct {
	ll func(o, a, b []float64)
	ls func(o, a []float64, s float64)
	sl func(o []float64, s float64, b []float64)
}

var listLoops = map[string]listLoop{
	"+": {
		ll: func(o, a, b []float64) {
			a, b = a[:len(o)], b[:len(o)]
			for i := range o {
				o[i] = a[i] + b[i]
			}
		},
		ls: func(o, a []float64, s float64) {
			a = a[:len(o)]
			for i := range o {
				o[i] = a[i] + s
			}
		},
		sl: func(o []float64, s float64, b []float64) {
			b = b[:len(o)]
			for i := range o {
				o[i] = s + b[i]
			}
		},
	},
	"-": {
		ll: func(o, a, b []float64) {
			a, b = a[:len(o)], b[:len(o)]
			for i := range o {
				o[i] = a[i] - b[i]
			}
		},
		ls: func(o, a []float64, s float64) {
			a = a[:len(o)]
			for i := range o {
				o[i] = a[i] - s
			}
		},
		sl: func(o []float64, s float64, b []float64) {
			b = b[:len(o)]
			for i := range o {
				o[i] = s - b[i]
			}
		},
	},
	"*": {
		ll: func(o, a, b []float64) {
			a, b = a[:len(o)], b[:len(o)]
			for i := range o {
				o[i] = a[i] * b[i]
			}
		},
		ls: func(o, a []float64, s float64) {
			a = a[:len(o)]
			for i := range o {
				o[i] = a[i] * s
			}
		},
		sl: func(o []float64, s float64, b []float64) {
			b = b[:len(o)]
			for i := range o {
				o[i] = s * b[i]
			}
		},
	},
	"/": {
		ll: func(o, a, b []float64) {
			a, b = a[:len(o)], b[:len(o)]
			for i := range o {
				o[i] = a[i] / b[i]
			}
		},
		ls: func(o, a []float64, s float64) {
			a = a[:len(o)]
			for i := range o {
				o[i] = a[i] / s
			}
		},
		sl: func(o []float64, s float64, b []float64) {
			b = b[:len(o)]
			for i := range o {
				o[i] = s / b[i]
			}
		},
	},
}

// compileTableList reads a table at each element of a list.
func compileTableList(n *Call, x evalFn, read func(float64) float64) evalFn {
	at, l := listAt(n)
	return mapList(x, int(n.Args[2].base().at), at, l, read)
}

// mapList evaluates the list x (its n elements at xa) and writes g of
// each element to the n places at at.
func mapList(x evalFn, xa, at, n int, g func(float64) float64) evalFn {
	return func(v []float64) float64 {
		x(v)
		a, o := v[xa:xa+n], v[at:at+n]
		for i := range o {
			o[i] = g(a[i])
		}
		return 0
	}
}

// compileIndex reads element k of a list, counted from 1. An index that
// is not a whole number within the list gives NaN, which diagnose turns
// into a message at the index.
func compileIndex(e *Index) evalFn {
	fx, fi := fnOf(e.X), fnOf(e.I)
	xa, n := listAt(e.X)
	if k, ok := constOf(e.I); ok {
		i := xa + int(k) - 1
		return func(v []float64) float64 { fx(v); return v[i] }
	}
	return func(v []float64) float64 {
		fx(v)
		k := fi(v)
		if k != math.Trunc(k) || k < 1 || k > float64(n) {
			return math.NaN()
		}
		return v[xa+int(k)-1]
	}
}

// compileReduce builds a reduction of a list to one value.
func compileReduce(c *Call) evalFn {
	fx, red := fnOf(c.Args[0]), c.Func.reduce
	at, n := listAt(c.Args[0])
	if over := spanReduction[c.Name]; over != nil && c.Args[0].Type().IsSeries() {
		return func(v []float64) float64 {
			fx(v)
			return over(v[at:at+n], v[at+n:at+2*n])
		}
	}
	return func(v []float64) float64 {
		fx(v)
		return red(v[at : at+n])
	}
}

// listStep is a list statement's step: its value slot holds the list's
// length, and a list with an element that is not a finite number is NaN,
// so that the statement fails with the reason.
func listStep(root evalFn, at, n int) evalFn {
	return func(v []float64) float64 {
		root(v)
		if !allFinite(v[at : at+n]) {
			return math.NaN()
		}
		return float64(n)
	}
}

// allFinite reports whether every element is a finite number, without a
// branch per element: x·0 is 0 for a finite x and NaN for an infinite or
// NaN one, and four sums keep the additions from waiting on each other.
func allFinite(a []float64) bool {
	var s0, s1, s2, s3 float64
	i := 0
	for ; i+4 <= len(a); i += 4 {
		b := a[i : i+4 : i+4]
		s0 += b[0] * 0
		s1 += b[1] * 0
		s2 += b[2] * 0
		s3 += b[3] * 0
	}
	for ; i < len(a); i++ {
		s0 += a[i] * 0
	}
	return s0+s1+s2+s3 == 0
}

// The reductions.

func sumOf(a []float64) float64 {
	s := 0.0
	for _, x := range a {
		s += x
	}
	return s
}

func productOf(a []float64) float64 {
	p := 1.0
	for _, x := range a {
		p *= x
	}
	return p
}

func meanOf(a []float64) float64 { return sumOf(a) / float64(len(a)) }

func minOf(a []float64) float64 {
	m := a[0]
	for _, x := range a[1:] {
		m = math.Min(m, x)
	}
	return m
}

func maxOf(a []float64) float64 {
	m := a[0]
	for _, x := range a[1:] {
		m = math.Max(m, x)
	}
	return m
}

// rmsOf is the root mean square, scaled by the largest magnitude so that
// the squares of large values do not overflow.
func rmsOf(a []float64) float64 {
	scale := 0.0
	for _, x := range a {
		scale = math.Max(scale, math.Abs(x))
	}
	if scale == 0 || math.IsInf(scale, 0) || math.IsNaN(scale) {
		return scale
	}
	s := 0.0
	for _, x := range a {
		r := x / scale
		s += r * r
	}
	return scale * math.Sqrt(s/float64(len(a)))
}

func countOf(a []float64) float64 { return float64(len(a)) }
