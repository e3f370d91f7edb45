package engine

import (
	"strconv"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Choice is a conditional value, for piecewise rules: Value when Cond
// holds, else Other (k = 1 when B <= 1.5 T else 1.5 T / B).
// Both values measure the same thing, checked before anything runs; a run
// evaluates only the value it chooses, so the other may be undefined
// there (a division by zero on the side not taken is no error).
type Choice struct {
	node
	Value, Other Expr
	Cond         *Binary // a comparison of single values
}

func (c *Choice) children() []Expr { return []Expr{c.Cond, c.Value, c.Other} }

// inferChoice checks a conditional value: a comparison, and two values of
// one dimension and shape.
func inferChoice(n *Choice) *diag.Diagnostic {
	a, b := n.Value.Type(), n.Other.Type()
	for _, e := range []Expr{n.Value, n.Other} {
		if c, ok := e.(*Binary); ok && isComparison(c.Op) {
			return errAt(c.Pos(), "write the comparison after when: value when a <= b else other value", "a value cannot be a comparison")
		}
	}
	if a.Dim != b.Dim {
		return errAt(n.Other.Pos(), "give both values of the condition one dimension",
			"the value when the condition holds is %s, but the value after else is %s", units.Describe(a.Dim), units.Describe(b.Dim))
	}
	if a.IsComplex() || b.IsComplex() || n.Cond.Type().IsComplex() {
		at := n.Value
		if !a.IsComplex() {
			at = n.Other
		}
		return errAt(at.Pos(), "choose between real values, and build the phasor from the chosen one",
			"a conditional value of phasors is not supported")
	}
	if a.IsSeries() || b.IsSeries() {
		return errAt(n.Pos(), "choose between values of the series, such as peak(...) or valueat(...)",
			"a conditional value of series is not supported")
	}
	if a.IsList() != b.IsList() || a.Len != b.Len {
		return errAt(n.Other.Pos(), "give both values the same shape: two single values, or two lists of one length",
			"the value when the condition holds has %s, but the value after else has %s", shapeText(a), shapeText(b))
	}
	k, err := addKinds("<", a.Kind, b.Kind)
	if err != nil {
		err.Pos = n.Other.Pos()
		return err
	}
	*n.Type() = Type{Shape: a.Shape, Len: a.Len, Dim: a.Dim, Kind: k, Count: a.Count && b.Count}
	return nil
}

func shapeText(t *Type) string {
	if t.IsSeries() {
		return "a series of " + plural(t.Len, "sample")
	}
	if t.IsList() {
		return plural(t.Len, "element")
	}
	return "one value"
}

func plural(n int, what string) string {
	if n == 1 {
		return "1 " + what
	}
	return strconv.Itoa(n) + " " + what + "s"
}

// holdsAt evaluates a condition.
func holdsAt(c *Binary, v []float64) bool {
	return holds(c.Op, fnOf(c.X)(v), fnOf(c.Y)(v))
}

// compileChoice evaluates the condition and then only the value chosen.
// A list copies the chosen list to its own place.
func compileChoice(n *Choice) evalFn {
	c, a, b := n.Cond, fnOf(n.Value), fnOf(n.Other)
	if !n.T.IsList() {
		return func(v []float64) float64 {
			if holdsAt(c, v) {
				return a(v)
			}
			return b(v)
		}
	}
	at, l := listAt(n)
	aa, ba := int(n.Value.base().at), int(n.Other.base().at)
	return func(v []float64) float64 {
		from := ba
		if holdsAt(c, v) {
			a(v)
			from = aa
		} else {
			b(v)
		}
		copy(v[at:at+l], v[from:from+l])
		return 0
	}
}

// diagnoseChoice looks for the bad value in the condition's sides and in
// the value chosen, never in the value not taken.
func diagnoseChoice(n *Choice, v []float64) *diag.Diagnostic {
	for _, side := range []Expr{n.Cond.X, n.Cond.Y} {
		if !valueOK(side, v) {
			return diagnose(side, v)
		}
	}
	if holdsAt(n.Cond, v) {
		return diagnose(n.Value, v)
	}
	return diagnose(n.Other, v)
}
