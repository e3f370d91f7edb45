package engine

import (
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine/syntax"
)

// parseFormula reads the formula in t.runes[from:to] with sheaf's grammar
// and turns its tree into the engine's nodes, which the checker annotates.
func parseFormula(t *text, from, to int) (Expr, *diag.Diagnostic) {
	n, err := syntax.Parse(t.runes, from, to)
	if err != nil {
		d := errAt(t.pos(err.Start), err.Hint, "%s", err.Msg)
		d.End = t.pos(err.End)
		return nil, d
	}
	c := converter{t: t}
	e := c.convert(n)
	if c.err != nil {
		return nil, c.err
	}
	return e, nil
}

// converter turns a syntax tree into the engine's nodes.
type converter struct {
	t   *text
	err *diag.Diagnostic
}

func (c *converter) fail(n syntax.Node, hint, format string, args ...any) Expr {
	if c.err == nil {
		c.err = errAt(c.t.pos(n.At()), hint, format, args...)
		c.err.End = c.t.pos(n.Span().End)
	}
	return nil
}

func (c *converter) convert(n syntax.Node) Expr {
	if c.err != nil {
		return nil
	}
	pos := c.t.pos(n.At())
	switch n := n.(type) {
	case *syntax.Number:
		e := &Number{Text: n.Text, Value: n.Value, Imag: n.Imag}
		e.setPos(pos)
		return e
	case *syntax.Quantity:
		e := &Quantity{Text: n.Text, UnitText: n.UnitText, Value: n.Value, Unit: n.Unit, SI: n.SI, Imag: n.Imag}
		e.setPos(pos)
		return e
	case *syntax.Name:
		return c.name(n, pos)
	case *syntax.Unary:
		x := c.convert(n.X)
		if q, ok := x.(*Quantity); ok && n.Op == "-" && q.Unit.IsAffine() && !q.Imag {
			// -25 °C is a temperature below the scale's zero, not the
			// negation of one: fold the sign into the literal.
			q.Text, q.Value, q.SI = "-"+q.Text, -q.Value, q.Unit.ToSI(-q.Value)
			q.setPos(pos)
			return q
		}
		e := &Unary{Op: n.Op, X: x}
		e.setPos(pos)
		return e
	case *syntax.Binary:
		x, y := c.convert(n.X), c.convert(n.Y)
		if isComparison(n.Op) {
			for _, side := range []Expr{x, y} {
				if b, ok := side.(*Binary); ok && isComparison(b.Op) {
					return c.fail(n, "write each comparison as its own check", "a check holds one comparison")
				}
			}
		}
		e := &Binary{Op: n.Op, X: x, Y: y}
		e.setPos(pos)
		return e
	case *syntax.Call:
		return c.call(n, pos)
	case *syntax.List:
		e := &ListLit{}
		e.setPos(pos)
		for _, x := range n.Elems {
			e.Elems = append(e.Elems, c.convert(x))
		}
		return e
	case *syntax.Range:
		e := &Range{From: c.convert(n.From), To: c.convert(n.To)}
		if n.Step != nil {
			e.Step = c.convert(n.Step)
		}
		e.setPos(pos)
		return e
	case *syntax.Choice:
		e := &Choice{Value: c.convert(n.Value), Other: c.convert(n.Other)}
		cond, ok := c.convert(n.Cond).(*Binary)
		if c.err != nil {
			return nil
		}
		if !ok || !isComparison(cond.Op) {
			return c.fail(n.Cond, "write a comparison after when, such as B <= 1.5 T", "the condition of a conditional value must be a comparison")
		}
		e.Cond = cond
		e.setPos(pos)
		return e
	case *syntax.Index:
		e := &Index{X: c.convert(n.X), I: c.convert(n.I)}
		e.setPos(c.t.pos(n.Span().Start))
		return e
	}
	return c.fail(n, "formulas use names, numbers with units, + - * / ^ ( ) and functions", "this is not a formula sheaf understands")
}

// name converts a name: a reference, or the keyword of interp and spline.
func (c *converter) name(n *syntax.Name, pos diag.Pos) Expr {
	if n.Name == "extrapolate" {
		k := &Keyword{Word: n.Name}
		k.setPos(pos)
		return k
	}
	if reserved[n.Name] {
		return c.fail(n, "choose another name", "%s is a reserved word", n.Name)
	}
	e := &Ref{Name: n.Name}
	e.setPos(pos)
	return e
}

func (c *converter) call(n *syntax.Call, pos diag.Pos) Expr {
	f, ok := functions[n.Name]
	if !ok {
		// A function of the sheet's own, or none: applyFunctions says.
		a := &Apply{Name: n.Name}
		a.setPos(pos)
		for _, x := range n.Args {
			a.Args = append(a.Args, c.convert(x))
		}
		return a
	}
	e := &Call{Name: n.Name, Func: f}
	e.setPos(pos)
	for _, a := range n.Args {
		e.Args = append(e.Args, c.convert(a))
	}
	if len(e.Args) < f.MinArgs || (f.MaxArgs >= 0 && len(e.Args) > f.MaxArgs) {
		return c.fail(n, "write "+f.Usage, "%s takes %s", n.Name, f.arity())
	}
	return e
}
