// Package engine is sheaf's formula language: it reads statements, builds
// the dependency graph of a sheet, infers the dimension of every expression
// before anything runs, compiles expressions to plain float64 arithmetic in
// coherent SI, and evaluates them in dependency order.
//
// The engine knows nothing of Markdown: it takes lines of text with their
// positions and returns results and diagnostics tied to those positions.
package engine

import (
	"sync"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Expr is a node of a formula's syntax tree. Every node records where it
// starts and what the checker inferred for it.
type Expr interface {
	Pos() diag.Pos
	Type() *Type
	children() []Expr
	base() *node
}

// Shape says how many values a node holds: one (a scalar), or a list of
// values of one dimension, or a sampled series y(x) (series.go).
type Shape uint8

// The shapes.
const (
	Scalar Shape = iota
	List
	Series
)

// Domain says what numbers a node holds: real, or complex (a phasor,
// complex.go).
type Domain uint8

// The domains.
const (
	Real Domain = iota
	Complex
)

// Type is what the checker inferred for a node before evaluation: its
// shape and domain, its dimension and kind, and its value when fixed.
type Type struct {
	Shape  Shape
	Domain Domain
	// Len is the number of elements of a list, fixed when it is checked.
	Len  int
	Dim  units.Dim
	Kind units.Kind
	// Const is set when the node's value is fixed at compile time (literals,
	// built-in constants and arithmetic over them); Val holds it in SI.
	Const bool
	Val   float64
	// Im is the imaginary part of a fixed phasor, whose real part is Val.
	Im float64
	// Count is set for a whole-number count (turns, conductors, slots):
	// whole numbers, sums and products of counts, and round, floor and
	// ceil. A count whose value is whole shows without decimals.
	Count bool
	// XDim and XKind are the dimension and kind of a series' x.
	XDim  units.Dim
	XKind units.Kind
}

type node struct {
	// The position, held compactly: a sheet has hundreds of thousands of
	// nodes, and they share a handful of file names.
	file      *string
	line, col int32
	T         Type
	// at is where a list node's elements lie in a frame's values.
	at int32
	// fn evaluates the node over the sheet's slot values; set by compile.
	fn evalFn
}

// Pos returns where the node starts.
func (n *node) Pos() diag.Pos {
	if n.file == nil {
		return diag.Pos{Line: int(n.line), Col: int(n.col)}
	}
	return diag.Pos{File: *n.file, Line: int(n.line), Col: int(n.col)}
}

// setPos records where the node starts.
func (n *node) setPos(p diag.Pos) {
	n.file = intern(p.File)
	n.line, n.col = int32(p.Line), int32(p.Col)
}
func (n *node) Type() *Type { return &n.T }
func (n *node) base() *node { return n }

// Number is a plain number with no unit: 2, 0.5, 1e-3.
type Number struct {
	node
	Text  string // as written, with the j of an imaginary number: 4j
	Value float64
	Imag  bool // the number times j
}

// Quantity is a number with a unit, written as "0.92 T" or "180 mm".
type Quantity struct {
	node
	Text     string // the number as written
	UnitText string // the unit as written
	Value    float64
	Unit     units.Unit
	SI       float64
	Imag     bool // the quantity times j: 4j A
}

// Ref names a statement of the sheet, a built-in constant, or a column of
// a table (BH.B).
type Ref struct {
	node
	Name     string
	Target   *Statement      // set when the name is a statement of the sheet
	Constant *units.Constant // set when it is a built-in constant
	Column   *Column         // set when it is a table column
}

// Keyword is a word with a meaning of its own inside a call:
// interp(BH.B, BH.H, H_c, extrapolate).
type Keyword struct {
	node
	Word string
}

// Unary is -x or +x.
type Unary struct {
	node
	Op string
	X  Expr
}

// Binary is x op y for + - * / ^ and, at the top of a check, a comparison.
type Binary struct {
	node
	Op   string
	X, Y Expr
}

// Call applies a built-in function.
type Call struct {
	node
	Name string
	Func *Function
	Args []Expr
	// table is the fitted interpolator of interp and spline, or the
	// columns of pick, set when the call is checked.
	table *interpolator
	y, x  *Column
}

func (*Number) children() []Expr   { return nil }
func (*Quantity) children() []Expr { return nil }
func (*Ref) children() []Expr      { return nil }
func (*Keyword) children() []Expr  { return nil }
func (u *Unary) children() []Expr  { return []Expr{u.X} }
func (b *Binary) children() []Expr { return []Expr{b.X, b.Y} }
func (c *Call) children() []Expr   { return c.Args }

// Walk calls f for every node of the tree as written, parents before
// children: a call of a sheet's function is visited with its arguments,
// not the copy of the function's formula it runs.
func Walk(e Expr, f func(Expr)) {
	if e == nil {
		return
	}
	f(e)
	kids := e.children()
	if a, ok := e.(*Apply); ok {
		kids = a.Args
	}
	for _, c := range kids {
		Walk(c, f)
	}
}

// walkAll is Walk into the bodies of calls of the sheet's functions too:
// every node that is checked and compiled.
func walkAll(e Expr, f func(Expr)) {
	if e == nil {
		return
	}
	f(e)
	for _, c := range e.children() {
		walkAll(c, f)
	}
}

// Precedence gives the binding strength of a node's operator, for printing
// with the fewest parentheses.
func Precedence(e Expr) int {
	switch n := e.(type) {
	case *Binary:
		switch n.Op {
		case "+", "-":
			return 1
		case "*", "/":
			return 2
		case "∠":
			return 1 // between sums and products: written with parentheses around either side at 1 or below
		case "^":
			return 4
		default:
			return 0 // comparisons
		}
	case *Unary:
		return 3
	case *Choice, *Range:
		return 0 // written in parentheses inside any operation
	}
	return 5
}

var interned sync.Map // file name -> *string

// intern returns one shared copy of a file name.
func intern(s string) *string {
	if p, ok := interned.Load(s); ok {
		return p.(*string)
	}
	p, _ := interned.LoadOrStore(s, &s)
	return p.(*string)
}
