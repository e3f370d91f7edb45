// Package syntax is sheaf's formula grammar: a lexer whose tokens include
// the quantity (a number and its unit, "0.92 T"), a Pratt parser, and a
// tree whose nodes know where they start and end. It knows nothing of
// dimensions, names or evaluation; the engine checks what it builds.
//
// The grammar, as EBNF (README, "Formula grammar"):
//
//	formula    = choice .
//	choice     = comparison [ "when" comparison "else" choice ] .
//	comparison = span [ relation span ] .
//	relation   = "<" | "<=" | ">" | ">=" | "==" | "≤" | "≥" .
//	span       = sum [ ".." sum [ "by" sum ] ] .
//	sum        = phasor { ( "+" | "-" ) phasor } .
//	product    = unary { ( "*" | "/" ) unary } .
//	unary      = [ "-" | "+" ] power .
//	power      = postfix [ ( "^" | "**" ) unary ] .
//	postfix    = primary { "[" choice "]" } .
//	phasor     = product [ ( "∠" | "/_" ) product ] .
//	primary    = quantity | number | name | call | list | "(" choice ")" .
//	list       = "[" choice { "," choice } "]" .
//	call       = name "(" [ choice { "," choice } ] ")" .
//	quantity   = number [ "j" ] unit .
//	number     = digits [ "." digits ] [ exponent ] [ "j" ] .
//	name       = letter { letter | digit | "_" } { "." letter { letter | digit | "_" } } .
//
// "·", "×" and "⋅" are written for "*", "−" for "-". A number directly
// followed by π multiplies it (2π). An index's "[" follows its list with
// no space between. A "j" directly after a number's digits makes
// it imaginary (4j A, IEC 60027-1's imaginary unit); "∠", or "/_" in
// ASCII, writes a phasor as its magnitude and its angle (230 V ∠ -30 deg).
// "±" is refused inside a formula: the engine reads an input's tolerance
// after its formula, before this parser sees it.
package syntax

import "github.com/sheaf-calc/sheaf/units"

// Span is where a node lies in the statement: rune offsets, End exclusive.
type Span struct{ Start, End int }

// Node is a node of a formula's tree.
type Node interface {
	// Span is the text the node covers.
	Span() Span
	// At is where messages about the node point: the operator of a unary
	// or binary node, else its start.
	At() int
}

// ImagUnit follows the digits of an imaginary number: 4j.
const ImagUnit = 'j'

// PolarOp is the operator of a phasor in polar form, as the parser
// normalises it (ASCII "/_" too).
const PolarOp = "∠"

// Number is a plain number: 2, 0.5, 1e-3, or imaginary, 4j.
type Number struct {
	Pos   Span
	Text  string // as written, with its j
	Value float64
	Imag  bool // the number times j
}

// Quantity is a number with a unit: 0.92 T, 180 mm.
type Quantity struct {
	Pos      Span
	Text     string // the number as written
	UnitText string // the unit as written
	Value    float64
	UnitAt   int // where the unit starts
	Unit     units.Unit
	SI       float64 // the value in coherent SI
	Imag     bool    // the quantity times j: 4j A
}

// Name is a name, possibly qualified with dots: B_g, coil_a.lambda, BH.B.
type Name struct {
	Pos  Span
	Name string
}

// Unary is -x or +x.
type Unary struct {
	Pos Span
	Op  string
	X   Node
}

// Binary is x op y for + - * / ^, ∠ and the relations.
type Binary struct {
	Pos  Span
	OpAt int
	Op   string
	X, Y Node
}

// Call is a function applied to arguments: sqrt(x), interp(T.y, T.x, x).
type Call struct {
	Pos  Span
	Name string
	Args []Node
}

// List is a list literal: [1.2 mWb, 1.5 mWb, 1.9 mWb].
type List struct {
	Pos   Span
	Elems []Node
}

// Range is the evenly spaced values from From to To: 1 .. 12, or with a
// step, 0 deg .. 90 deg by 15 deg.
type Range struct {
	Pos      Span
	OpAt     int // where .. stands
	From, To Node
	Step     Node // nil when no step is written
}

// Index is one element of a list: phi[3].
type Index struct {
	Pos Span
	X   Node
	I   Node
}

// Choice is a conditional value: Value when Cond holds, else Other.
type Choice struct {
	Pos          Span
	WhenAt       int
	Value, Other Node
	Cond         Node
}

// The words of ranges and conditional values.
const (
	StepWord = "by"
	WhenWord = "when"
	ElseWord = "else"
)

// Span implementations.
func (n *Number) Span() Span   { return n.Pos }
func (n *Quantity) Span() Span { return n.Pos }
func (n *Name) Span() Span     { return n.Pos }
func (n *Unary) Span() Span    { return n.Pos }
func (n *Binary) Span() Span   { return n.Pos }
func (n *Call) Span() Span     { return n.Pos }
func (n *List) Span() Span     { return n.Pos }
func (n *Range) Span() Span    { return n.Pos }
func (n *Index) Span() Span    { return n.Pos }
func (n *Choice) Span() Span   { return n.Pos }

// At implementations.
func (n *Number) At() int   { return n.Pos.Start }
func (n *Quantity) At() int { return n.Pos.Start }
func (n *Name) At() int     { return n.Pos.Start }
func (n *Unary) At() int    { return n.Pos.Start }
func (n *Binary) At() int   { return n.OpAt }
func (n *Call) At() int     { return n.Pos.Start }
func (n *List) At() int     { return n.Pos.Start }
func (n *Range) At() int    { return n.OpAt }
func (n *Index) At() int    { return n.I.Span().Start }
func (n *Choice) At() int   { return n.WhenAt }

// IsRelation reports whether op compares two sides.
func IsRelation(op string) bool {
	switch op {
	case "<", "<=", ">", ">=", "==":
		return true
	}
	return false
}

// Error is a problem in a formula's text, with the range it covers.
type Error struct {
	Span
	Msg  string
	Hint string
}

func (e *Error) Error() string {
	if e.Hint != "" {
		return e.Msg + "; " + e.Hint
	}
	return e.Msg
}
