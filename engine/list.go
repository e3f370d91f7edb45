package engine

import (
	"fmt"
	"math"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Lists. A list holds values of one dimension and kind, checked once for
// the whole list, and its length is fixed when the sheet is checked: a
// list literal, a range with fixed ends, or a table column. So each list
// node gets a fixed place in the frame's values, past the statements'
// slots (the arena), and a run writes lists there without allocating.

// MaxListLength bounds the elements of one list, and MaxListValues the
// elements of all the lists of one sheet, intermediate ones included: a
// frame holds them all.
const (
	MaxListLength = 100_000
	MaxListValues = 2_000_000
)

// ListLit is a list literal: [1.2 mWb, 1.5 mWb, 1.9 mWb].
type ListLit struct {
	node
	Elems []Expr
}

// Range is the evenly spaced values from From to To by Step (1 when not
// written): 1 .. 12, 0 deg .. 90 deg by 15 deg. Its ends and step are
// fixed values, so its elements are known when the sheet is checked.
type Range struct {
	node
	From, To, Step Expr
	// Values are the elements in SI, worked out by the checker.
	Values []float64
}

// Index is one element of a list, counted from 1: phi[1] is the first.
type Index struct {
	node
	X, I Expr
}

func (l *ListLit) children() []Expr { return l.Elems }
func (r *Range) children() []Expr {
	if r.Step == nil {
		return []Expr{r.From, r.To}
	}
	return []Expr{r.From, r.To, r.Step}
}
func (x *Index) children() []Expr { return []Expr{x.X, x.I} }

// IsList reports whether a node holds a list; a series is a list of its
// y values, with its x values placed after them.
func (t *Type) IsList() bool { return t.Shape == List || t.Shape == Series }

// listAt is where a list node's elements lie in a frame's values.
func listAt(e Expr) (at, n int) { return int(e.base().at), e.Type().Len }

// listIn returns a statement's list in v, the values of a frame.
func (st *Statement) listIn(v []float64) []float64 {
	at, n := listAt(st.Expr)
	return v[at : at+n]
}

// arena hands out places for lists in a frame's values, after the
// statements' slots.
type arena struct {
	base, used int
}

// layout gives every list node of e its place. A name of a list shares
// the place of the statement it names.
func (a *arena) layout(e Expr) *diag.Diagnostic {
	var err *diag.Diagnostic
	walkAll(e, func(e Expr) {
		t := e.Type()
		if err != nil || t.places() == 0 {
			return
		}
		if r, ok := e.(*Ref); ok && r.Target != nil {
			r.at = r.Target.Expr.base().at
			return
		}
		if a.used+t.places() > MaxListValues {
			err = errAt(e.Pos(), "split the sheet, or use shorter lists", "the lists of this sheet hold more than %d values, the limit for one sheet", MaxListValues)
			return
		}
		e.base().at = int32(a.base + a.used)
		a.used += t.places()
	})
	return err
}

// inferList checks a list literal: single values of one dimension. A
// list with a phasor among its elements is a list of phasors, the real
// elements among them phasors on the real axis.
func inferList(n *ListLit) *diag.Diagnostic {
	if len(n.Elems) > MaxListLength {
		return errAt(n.Pos(), "split the list", "the list has %d elements; the limit is %d", len(n.Elems), MaxListLength)
	}
	first := n.Elems[0].Type()
	t := n.Type()
	*t = Type{Shape: List, Len: len(n.Elems), Dim: first.Dim, Kind: first.Kind, Count: true}
	for i, e := range n.Elems {
		et := e.Type()
		if et.IsComplex() {
			t.Domain, t.Count = Complex, false
		}
		if et.IsList() {
			return errAt(e.Pos(), "write the elements of the inner list into this one, or name it and use its elements",
				"element %d is a list; a list's elements are single values", i+1)
		}
		if et.Dim != first.Dim {
			return errAt(e.Pos(), "a list holds one kind of quantity: give every element the first element's dimension",
				"element %d is %s, but the list's first element is %s", i+1, units.Describe(et.Dim), units.Describe(first.Dim))
		}
		k, err := addKinds("<", t.Kind, et.Kind)
		if err != nil {
			err.Pos = e.Pos()
			return err
		}
		t.Kind = k
		t.Count = t.Count && et.Count
	}
	return nil
}

// inferRange checks a range and works out its elements: its ends and its
// step are fixed values of one dimension, and the step goes from one end
// towards the other.
func inferRange(n *Range) *diag.Diagnostic {
	from, to := n.From.Type(), n.To.Type()
	for _, e := range n.children() {
		et := e.Type()
		if et.IsComplex() {
			return errAt(e.Pos(), "give the ends and the step as real values", "a range of phasors is not supported")
		}
		if et.IsList() || !et.Const {
			return errAt(e.Pos(), "write a number or a quantity, as 1 .. 12 or 0 deg .. 90 deg by 15 deg: a list's length is fixed when the sheet is checked",
				"the ends and the step of a range must be fixed values, not results")
		}
		if et.Dim != from.Dim {
			return errAt(e.Pos(), "give both ends and the step one dimension",
				"the range starts at %s, but this is %s", units.Describe(from.Dim), units.Describe(et.Dim))
		}
	}
	k, err := rangeKind(n)
	if err != nil {
		return err
	}
	step := 1.0
	count := from.Count && to.Count
	if n.Step != nil {
		step, count = n.Step.Type().Val, count && n.Step.Type().Count
	} else if !from.Dim.IsDimensionless() {
		return errAt(n.Pos(), "write the step after by, as 0 mm .. 10 mm by 1 mm", "a range of quantities needs its step")
	}
	span := to.Val - from.Val
	if step == 0 || span != 0 && (span > 0) != (step > 0) {
		at := n.Pos()
		if n.Step != nil {
			at = n.Step.Pos()
		}
		return errAt(at, "give a step that goes from the first end towards the second", "the step of the range is zero, or leads away from its second end")
	}
	// The last element is the second end when it falls within rounding of
	// a whole number of steps.
	steps := math.Floor(span/step + 1e-9)
	if steps+1 > MaxListLength {
		return errAt(n.Pos(), "use a larger step, or a shorter range", "the range has %.0f elements; the limit is %d", steps+1, MaxListLength)
	}
	n.Values = make([]float64, int(steps)+1)
	for i := range n.Values {
		n.Values[i] = from.Val + float64(i)*step
	}
	*n.Type() = Type{Shape: List, Len: len(n.Values), Dim: from.Dim, Kind: k, Count: count}
	return nil
}

// rangeKind is the kind of a range's elements. A range of absolute
// temperatures, 20 degC .. 60 degC by 5 K, runs between two temperatures
// by a difference of temperature, and its elements are temperatures;
// otherwise the ends and the step are of one kind.
func rangeKind(n *Range) (units.Kind, *diag.Diagnostic) {
	from, to := n.From.Type(), n.To.Type()
	if !from.Kind.IsAbsTemp() && !to.Kind.IsAbsTemp() {
		if n.Step != nil && n.Step.Type().Kind.IsAbsTemp() {
			return from.Kind, errAt(n.Step.Pos(), "write the step of a range of temperatures in K", "the step of a range is a difference, not a temperature")
		}
		k, err := addKinds("-", from.Kind, to.Kind)
		if err != nil {
			err.Pos = n.Pos()
		}
		return k, err
	}
	if !from.Kind.IsAbsTemp() || !to.Kind.IsAbsTemp() || from.Kind != to.Kind {
		return from.Kind, errAt(n.Pos(), "write both ends as temperatures in one unit, as 20 degC .. 60 degC by 5 K", "a range of temperatures needs a temperature at each end")
	}
	if n.Step != nil && n.Step.Type().Kind.IsAbsTemp() {
		return from.Kind, errAt(n.Step.Pos(), "give the step as a difference of temperature in K: 20 degC .. 60 degC by 5 K", "the step of a range of temperatures must be a difference in K, not a temperature")
	}
	return from.Kind, nil
}

// inferIndex checks phi[k]: a list, and a pure number that counts from 1;
// a fixed index is checked against the list's length here.
func inferIndex(n *Index) *diag.Diagnostic {
	x, i := n.X.Type(), n.I.Type()
	if !x.IsList() {
		return errAt(n.X.Pos(), "index a list, such as phi[2] for phi = [...]", "only a list has elements; this is a single value")
	}
	if i.IsList() || i.IsComplex() || !i.Dim.IsDimensionless() {
		return errAt(n.I.Pos(), "write the element's number, as phi[2]", "an index is one pure number")
	}
	if i.Const && (i.Val != math.Trunc(i.Val) || i.Val < 1 || i.Val > float64(x.Len)) {
		return errAt(n.I.Pos(), fmt.Sprintf("elements are numbered from 1 to %d", x.Len), "index %g is out of range: the list has %d elements", i.Val, x.Len)
	}
	*n.Type() = Type{Domain: x.Domain, Dim: x.Dim, Kind: x.Kind, Count: x.Count}
	return nil
}

// inferListOperands sets the shape of an operation on lists: a list and a
// single value, or two lists of one length, give a list.
func inferListOperands(n *Binary) *diag.Diagnostic {
	x, y, t := n.X.Type(), n.Y.Type(), n.Type()
	if !x.IsList() && !y.IsList() {
		return nil
	}
	if isComparison(n.Op) {
		side, what := n.X, "left"
		if !x.IsList() {
			side, what = n.Y, "right"
		}
		return errAt(side.Pos(), "compare one value: max(...) <= limit, or min(...) >= limit",
			"a comparison takes single values; its %s side is a list of %d", what, side.Type().Len)
	}
	if n.Op == "^" && y.IsList() {
		return errAt(n.Y.Pos(), "raise to one fixed number", "the exponent is a list; an exponent is one number")
	}
	if x.IsList() && y.IsList() && x.Len != y.Len {
		verb := map[string]string{"+": "add", "-": "subtract", "*": "multiply", "/": "divide"}[n.Op]
		return errAt(n.Pos(), "give both lists the same number of elements",
			"cannot %s lists of different lengths: %d and %d elements", verb, x.Len, y.Len)
	}
	t.Shape, t.Len, t.Const = List, max(x.Len, y.Len), false
	return nil
}

// largest returns the element of largest magnitude.
func largest(a []float64) float64 {
	m := 0.0
	for _, x := range a {
		if math.Abs(x) > math.Abs(m) {
			m = x
		}
	}
	return m
}

// commonUnit returns the unit every element of a list literal is written
// in, when they share one: [1.2 mWb, 1.5 mWb] shows in mWb.
func commonUnit(l *ListLit) (units.Unit, bool) {
	var u units.Unit
	for i, e := range l.Elems {
		if n, ok := e.(*Unary); ok {
			e = n.X
		}
		var eu units.Unit
		switch q := e.(type) {
		case *Quantity:
			eu = q.Unit
		case *Number:
			eu = units.One
		default:
			return units.Unit{}, false
		}
		if i > 0 && eu.Symbol != u.Symbol {
			return units.Unit{}, false
		}
		u = eu
	}
	return u, true
}

// valueOK evaluates e and reports whether its value, or every element of
// its list, is a finite number.
func valueOK(e Expr, v []float64) bool {
	if e.Type().IsComplex() {
		return complexOK(e, v)
	}
	r := fnOf(e)(v)
	if !e.Type().IsList() {
		return finite(r)
	}
	at, n := listAt(e)
	for _, x := range v[at : at+n] {
		if !finite(x) {
			return false
		}
	}
	return true
}

// diagnoseList says which element of a list operation went bad, and
// why; its operands are sound.
func diagnoseList(e Expr, v []float64) *diag.Diagnostic {
	if e.Type().IsComplex() {
		return diagnoseComplexList(e, v)
	}
	at, n := listAt(e)
	k := 0
	for k < n && finite(v[at+k]) {
		k++
	}
	el := func(x Expr) float64 {
		if !x.Type().IsList() {
			return fnOf(x)(v)
		}
		xa, _ := listAt(x)
		return v[xa+k]
	}
	switch b := e.(type) {
	case *Binary:
		switch {
		case b.Op == "/" && el(b.Y) == 0:
			return errAt(b.Pos(), "check the divisor's elements", "division by zero in element %d", k+1)
		case b.Op == "^" && math.IsNaN(v[at+k]):
			return errAt(b.Pos(), "a negative number has no real fractional power", "negative number raised to a fractional power in element %d", k+1)
		}
	case *Call:
		if b.Func.table != "" {
			return tableProblem(b, el(b.Args[2]), fmt.Sprintf(" (element %d)", k+1))
		}
		if b.Func.domain != "" {
			return errAt(b.Pos(), "check the list's elements", "%s in element %d", b.Func.domain, k+1)
		}
	}
	if math.IsNaN(v[at+k]) {
		return errAt(e.Pos(), "check the inputs", "element %d of the list is not a number", k+1)
	}
	return errAt(e.Pos(), "check the inputs and their units; the result is beyond ±1.8e308 in SI", "element %d of the list overflows", k+1)
}

// indexProblem explains an index that does not pick an element.
func indexProblem(x *Index, v []float64) *diag.Diagnostic {
	k := fnOf(x.I)(v)
	n := x.X.Type().Len
	return errAt(x.I.Pos(), fmt.Sprintf("elements are numbered from 1 to %d", n),
		"index %g is out of range: the list has %d elements", k, n)
}

// listLiteralText writes a list of literals in one unit as its numbers
// and the unit: the value of an input that is a list.
func listLiteralText(l *ListLit) (value, unit string, ok bool) {
	nums := make([]string, len(l.Elems))
	for i, e := range l.Elems {
		if _, nested := e.(*ListLit); nested {
			return "", "", false
		}
		v, u, isLit := LiteralText(e)
		if !isLit || i > 0 && u != unit {
			return "", "", false
		}
		nums[i], unit = v, u
	}
	return "[" + strings.Join(nums, ", ") + "]", unit, true
}
