package engine

import (
	"math"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// StmtKind tells definitions from checks.
type StmtKind uint8

// The kinds of statement.
const (
	// Definition is `name = expression`, optionally with a display unit:
	// `name [unit] = expression`.
	Definition StmtKind = iota
	// Check is `check left OP right`: a comparison that must hold.
	Check
	// Param is `param name [unit]`: an input a template requires, with a
	// unit and no value; a sheet that uses the template sets it.
	Param
	// Use is `use name = template with a = ..., b = ...`: an instance of a
	// template under a name of the sheet's own.
	Use
	// Take is `take name from sheet` or `take name = other from sheet`: a
	// result of another sheet of the package, live, under a name of this
	// sheet's own.
	Take
	// FunctionDef is `name(p, q) = formula`: a function of the sheet's
	// own, checked at each call with the call's arguments.
	FunctionDef
	// Case is `case name: a = v, b = w`: a named load case, the inputs it
	// sets and their values; every result and check is worked out in it.
	Case
	// Sweep is `sweep name: x over points [in case] [show a, b]`: one
	// input varied over a range or a list, with the results it gathers.
	Sweep
	// Sampling is `sample N times, seed S`: the Monte Carlo count and seed
	// of the sheet's tolerances.
	Sampling
)

// Status is how a statement came out.
type Status uint8

// The statuses.
const (
	// Pending statements have not been evaluated.
	Pending Status = iota
	// OK definitions have a value.
	OK
	// Pass and Fail are the outcomes of checks.
	Pass
	Fail
	// Errored statements have an error of their own.
	Errored
	// Blocked statements were not evaluated because something they use failed.
	Blocked
)

func (s Status) String() string {
	return [...]string{"pending", "ok", "pass", "fail", "error", "blocked"}[s]
}

// Note is an annotation after a statement: `; key: value`, or for an
// acceptance `; accept code: reason`, where Arg is the code.
type Note struct {
	Key   string
	Arg   string
	Value string
	Pos   diag.Pos
}

// Statement is one definition or check of a sheet, with everything the
// engine learnt about it.
type Statement struct {
	Kind  StmtKind
	Index int      // order in the sheet
	Block int      // index of the formula block it was written in
	Pos   diag.Pos // where the statement starts
	Text  string   // the statement as written
	// Formula is the formula part as written: the right side of a
	// definition, or the comparison of a check.
	Formula string

	Name    string // definitions only
	NamePos diag.Pos
	// Params are a function's parameters, in order.
	Params []string

	// Display is the unit the author asked for, if any.
	Display     *units.Unit
	DisplayText string
	DisplayPos  diag.Pos

	// Expr is the right side of a definition, or the comparison of a check
	// (a *Binary whose Op is <, <=, >, >= or ==).
	Expr Expr

	Description string
	Source      string
	// Assumption is the text of `; assume: ...`: the statement itself is an
	// assumption. Assumes lists the ids of the sheet's assumptions that it
	// rests on (`; assumes: id, id`).
	Assumption string
	Assumes    []string
	Notes      []Note

	// Template reuse. On a Use statement: Template is the template as
	// named, and Overrides the inputs it sets. On a statement that comes
	// from a template: Instance is the instance name ("coil_a"; nested
	// instances "coil_a.gap"), Use the statement that made it, and, when
	// the user set its value, Overridden and Default (the template's own
	// value). Declared is the unit a template input must measure: a
	// parameter's unit, or the unit of its default.
	Template  string
	Overrides []Override
	// TemplateTitle and TemplateCaution are the template's, on a use.
	TemplateTitle, TemplateCaution string
	Instance                       string
	Use                            *Statement
	Overridden                     bool
	Default                        Expr
	Declared                       *units.Unit
	// Optional marks a param the using sheet may leave unset; what rests
	// on it is then left out of the instance.
	// Parts is, on a use, the rest of what the page shows of the template: its
	// limits of validity, its sources and the parts left out.
	Optional bool
	Parts    *InstanceParts

	// A result taken from another sheet: From is the sheet as written and
	// Remote the name there, each with where it is written.
	From, Remote       string
	FromPos, RemotePos diag.Pos

	// Cond is what a case, sweep or sample statement declares; Tol is an
	// input's tolerance.
	Cond *Condition
	Tol  *Tolerance

	// Info is what the checker learnt; the results of a run are in the
	// run's Frame, read through Calc.Result.
	Info

	solve    *solveInfo // set for x = solve(...)
	slot     int        // index into the sheet's value slots
	compiled bool
	fn       evalFn // a definition's value, or a check's left side
	right    evalFn // a check's right side
}

// Info is what the checker learnt about a statement, apart from its
// syntax: the type, what it uses and what uses it, where a taken result
// comes from, and the verdict that holds before any run.
type Info struct {
	// Type is what the checker inferred for a definition's value, or for
	// the two sides of a check.
	Type Type
	// Deps are the statements this one uses directly, in order of first
	// use; Users are those that use it.
	Deps  []*Statement
	Users []*Statement
	// Taken is the other sheet's statement a take reads, and TakenPath
	// that sheet's path in the package.
	Taken     *Statement
	TakenPath string
	// Verdict is Errored or Blocked, with Problem the reason, for a
	// statement the checker stopped; OK for a use, whose instance carries
	// the results; Pending for a statement that runs.
	Verdict Status
	Problem *diag.Diagnostic

	taken *Result // the taken statement's result, fixed for this sheet's runs; nil but on a take
}

// Override is one `name = formula` after `with` in a use statement.
type Override struct {
	Name    string
	NamePos diag.Pos
	Formula string
	Expr    Expr
}

// IsInput reports whether a definition's right side is a single literal,
// such as `l_g = 2.5 mm` or `N = 120`: an input of the calculation.
func (s *Statement) IsInput() bool {
	if s.Kind != Definition || s.Expr == nil {
		return false
	}
	_, _, ok := LiteralText(s.Expr)
	return ok
}

// Compare returns the comparison of a check.
func (s *Statement) Compare() *Binary {
	b, _ := s.Expr.(*Binary)
	return b
}

// LiteralText returns a literal as its author wrote it: the number (with
// its sign) and the unit symbol, "" for a pure number. A list of literals
// in one unit is a literal too: "[2.41, 2.38, 2.30]" and "mWb". ok is
// false when e is not a literal.
func LiteralText(e Expr) (value, unit string, ok bool) {
	if l, isList := e.(*ListLit); isList {
		return listLiteralText(l)
	}
	sign := ""
	if u, isUnary := e.(*Unary); isUnary {
		e = u.X
		if u.Op == "-" {
			sign = "-"
		}
	}
	switch n := e.(type) {
	case *Quantity:
		return sign + n.Text, n.Unit.Symbol, true
	case *Number:
		return sign + n.Text, "", true
	}
	return "", "", false
}

// LiteralString joins LiteralText's number and unit: "2.5 mWb", "-3".
func LiteralString(e Expr) (string, bool) {
	v, u, ok := LiteralText(e)
	if u != "" {
		v += " " + u
	}
	return v, ok
}

// Result is what one run gave a statement, as a page shows it: the status,
// a definition's SI value or a check's two sides, the unit they are shown
// in, and for a check its utilisation there.
type Result struct {
	Status Status
	Value  float64 // SI value of a definition
	// Left and Right are the SI values of a check's two sides, and
	// Utilisation is demand over capacity (below 1 passes for <, <=, >, >=).
	Left, Right float64
	Utilisation float64
	// Shown is the unit the value is shown in: the display unit, the unit of
	// an input as written, or one sheaf picked.
	Shown units.Unit
	// Err is the statement's own error, or for a blocked statement the
	// reason it was not evaluated.
	Err *diag.Diagnostic
	// List holds the SI values of a list's elements, nil for a single
	// value; Value is then the element of largest magnitude, which picks
	// the unit they are shown in.
	List []float64
	// Phasor holds a complex result's parts in SI, nil for a real one;
	// Value is then its magnitude.
	Phasor *Phasor
	// Phasors holds the elements of a list of phasors, in SI, nil for any
	// other value; List then holds their magnitudes.
	Phasors []Phasor
	// Over holds a series' x values in SI, nil for any other value; List
	// then holds its y values.
	Over []float64
	// OverShown is the unit a series' x is shown in.
	OverShown units.Unit

	count bool // a definition whose value is a whole-number count
}

// Digits returns the significant figures to show the value with, given
// the sheet's: a whole-number count (turns, conductors, slots, a result of
// round, floor or ceil) shows every digit and no decimals, 288 rather than
// 288.0.
func (r Result) Digits(sheet int) int {
	v := math.Abs(r.Value)
	if !r.count || r.Shown.Symbol != "1" || v != math.Trunc(v) || v >= 1e4 {
		return sheet
	}
	n := 1
	for ; v >= 10; v /= 10 {
		n++
	}
	return n
}
