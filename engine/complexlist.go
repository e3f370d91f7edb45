package engine

import (
	"math"
	"math/cmplx"

	"github.com/sheaf-calc/sheaf/diag"
)

// Lists of phasors. A list with a phasor among its elements holds
// phasors, checked once for the whole list as a real list is: one
// dimension and kind for every element. Its elements take two places
// each in a frame's values, real part then imaginary part, element after
// element, fixed when the sheet is checked. Arithmetic works element by
// element with phasors, real values and lists of either; abs, arg, Re,
// Im and conj apply to each element; sum and mean give a phasor and count
// a number; an index picks one phasor. min, max and the other reductions
// that need an order, or that mean nothing for phasors, are refused.

// zside is one operand of an operation on a list of phasors: a list of
// phasors or of real values, or a single phasor or real value computed
// once per run. It holds nothing of a run: a Program is shared by
// goroutines.
type zside struct {
	list, cx bool
	at       int
	fn       evalFn
}

func zsideOf(e Expr) zside {
	t := e.Type()
	return zside{list: t.IsList(), cx: t.IsComplex(), at: int(e.base().at), fn: fnOf(e)}
}

// ready runs the operand's closure, once per run of the operation, and
// returns its single value (0 for a list).
func (s zside) ready(v []float64) complex128 {
	r := s.fn(v)
	switch {
	case s.list:
		return 0
	case s.cx:
		return complex(v[s.at], v[s.at+1])
	}
	return complex(r, 0)
}

// elem returns element i of a list, or z, the single value.
func (s zside) elem(v []float64, i int, z complex128) complex128 {
	switch {
	case !s.list:
		return z
	case s.cx:
		return complex(v[s.at+2*i], v[s.at+2*i+1])
	}
	return complex(v[s.at+i], 0)
}

// compileComplexList builds the closure of a node that holds a list of
// phasors: it writes each element's parts to its places in v.
func compileComplexList(e Expr) evalFn {
	at, n := int(e.base().at), e.Type().Len
	put := func(v []float64, i int, z complex128) { v[at+2*i], v[at+2*i+1] = real(z), imag(z) }
	unary := func(x zside, f func(complex128) complex128) evalFn {
		return func(v []float64) float64 {
			zx := x.ready(v)
			for i := 0; i < n; i++ {
				put(v, i, f(x.elem(v, i, zx)))
			}
			return 0
		}
	}
	switch x := e.(type) {
	case *Ref:
		return noop // its statement ran before, at the same places
	case *ListLit:
		sides := make([]zside, len(x.Elems))
		for i, el := range x.Elems {
			sides[i] = zsideOf(el)
		}
		return func(v []float64) float64 {
			for i, s := range sides {
				put(v, i, s.ready(v))
			}
			return 0
		}
	case *Unary:
		if x.Op == "-" {
			return unary(zsideOf(x.X), func(z complex128) complex128 { return -z })
		}
		return unary(zsideOf(x.X), func(z complex128) complex128 { return z })
	case *Binary:
		a, b, op := zsideOf(x.X), zsideOf(x.Y), x.Op
		return func(v []float64) float64 {
			za, zb := a.ready(v), b.ready(v)
			for i := 0; i < n; i++ {
				p, q := a.elem(v, i, za), b.elem(v, i, zb)
				switch {
				case op == "∠": // two real values: magnitude and angle
					put(v, i, cmplx.Rect(real(p), real(q)))
				case op == "/" && q == 0:
					put(v, i, cmplx.NaN()) // diagnose says which element
				default:
					put(v, i, foldComplex(op, p, q))
				}
			}
			return 0
		}
	case *Call: // conj
		return unary(zsideOf(x.Args[0]), cmplx.Conj)
	}
	return func(v []float64) float64 {
		for i := 0; i < n; i++ {
			put(v, i, cmplx.NaN())
		}
		return 0
	}
}

// compileComplexListPart builds abs, arg, Re or Im of each element of a
// list of phasors: a list of real values.
func compileComplexListPart(n *Call) evalFn {
	x := n.Args[0]
	fx, xa := fnOf(x), int(x.base().at)
	at, l := listAt(n)
	part := n.Func.cx
	if n.Name == "abs" {
		part = cmplx.Abs
	}
	return func(v []float64) float64 {
		fx(v)
		for i := 0; i < l; i++ {
			v[at+i] = part(complex(v[xa+2*i], v[xa+2*i+1]))
		}
		return 0
	}
}

// compileComplexElement builds a single phasor taken from a list of
// phasors: an element by its index, or the sum or the mean.
func compileComplexElement(e Expr, put func([]float64, complex128) float64) (evalFn, bool) {
	switch n := e.(type) {
	case *Index:
		fx, fi := fnOf(n.X), fnOf(n.I)
		xa, l := listAt(n.X)
		return func(v []float64) float64 {
			fx(v)
			k := fi(v)
			if k != math.Trunc(k) || k < 1 || k > float64(l) {
				return put(v, cmplx.NaN()) // diagnose says the index is out of range
			}
			i := xa + 2*(int(k)-1)
			return put(v, complex(v[i], v[i+1]))
		}, true
	case *Call:
		if n.Func.reduce == nil || !n.Args[0].Type().IsList() {
			return nil, false
		}
		fx, mean := fnOf(n.Args[0]), n.Name == "mean"
		xa, l := listAt(n.Args[0])
		return func(v []float64) float64 {
			fx(v)
			var s complex128
			for i := 0; i < l; i++ {
				s += complex(v[xa+2*i], v[xa+2*i+1])
			}
			if mean {
				s /= complex(float64(l), 0)
			}
			return put(v, s)
		}, true
	}
	return nil, false
}

// complexListFinite reports whether every part of a list of phasors at
// at, of n elements, is a finite number.
func complexListFinite(v []float64, at, n int) bool { return allFinite(v[at : at+2*n]) }

// diagnoseComplexList says which element of an operation on a list of
// phasors, whose operands are sound, went bad, and why.
func diagnoseComplexList(e Expr, v []float64) *diag.Diagnostic {
	at, n := int(e.base().at), e.Type().Len
	k := 0
	for k < n && finite(v[at+2*k]) && finite(v[at+2*k+1]) {
		k++
	}
	if b, ok := e.(*Binary); ok && b.Op == "/" {
		y := zsideOf(b.Y)
		if k < n && y.elem(v, k, y.ready(v)) == 0 {
			return errAt(b.Pos(), "check the divisor's elements", "division by zero in element %d", k+1)
		}
	}
	return errAt(e.Pos(), "check the inputs and their units; a part is beyond ±1.8e308 in SI", "element %d of the list of phasors overflows", k+1)
}

// setPhasor reads a complex statement's value from v into r: a phasor,
// or a list of phasors with their magnitudes as the list, the largest of
// which picks the unit they are shown in.
func (r *Result) setPhasor(st *Statement, v []float64) {
	if !st.Type.IsList() {
		ph := st.phasorIn(v)
		r.Phasor = &ph
		return
	}
	at, n := int(st.Expr.base().at), st.Type.Len
	r.Phasors, r.List = make([]Phasor, n), make([]float64, n)
	for i := range r.Phasors {
		r.Phasors[i] = Phasor{v[at+2*i], v[at+2*i+1]}
		r.List[i] = r.Phasors[i].Abs()
	}
	r.Value = largest(r.List)
}
