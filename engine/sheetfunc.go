package engine

import (
	"fmt"
	"slices"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
)

// Functions of the sheet's own. `k_p(nu) = sin(nu * y / tau * pi / 2)` is
// written once and called as k_p(1), k_p(5), k_p(7). Each call is its
// own copy of the body with the arguments in place of the parameters, so
// the dimensions are checked at every call with that call's arguments,
// a list argument applies the function to each element, and the compiled
// code is that of the formula written out by hand.

// MaxFunctionParams bounds the parameters of a function, and
// MaxAppliedNodes the nodes that a statement's calls of the sheet's
// functions expand to, so that functions calling each other several times
// cannot multiply a formula without bound.
const (
	MaxFunctionParams = 8
	MaxAppliedNodes   = 20_000
	// MaxSheetAppliedNodes bounds them over all the statements of a sheet.
	MaxSheetAppliedNodes = 400_000
)

// Apply is a call of a function of the sheet's own; Body is its copy of
// the function's formula with the arguments in place of the parameters.
type Apply struct {
	node
	Name string
	Args []Expr
	Body Expr
	Def  *Statement // the function's definition
}

func (a *Apply) children() []Expr {
	if a.Body == nil {
		return a.Args
	}
	return append(append([]Expr{}, a.Args...), a.Body)
}

// parseFunctionDef reads `name(p, q) = formula` from r[open:end], where
// r[open] is the ( after the name.
func parseFunctionDef(st *Statement, t *text, open, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = FunctionDef
	i := skipSpace(r, open+1)
	for {
		name, j := identifier(r, i)
		if name == "" {
			return errAt(t.pos(i), "write the parameters' names between the parentheses, as "+st.Name+"(nu) = ...", "a function needs named parameters")
		}
		at := t.pos(i)
		if err := validName(name, at); err != nil {
			return err
		}
		for _, p := range st.Params {
			if p == name {
				return errAt(at, "give each parameter its own name", "parameter %s is named twice", name)
			}
		}
		if len(st.Params) == MaxFunctionParams {
			return errAt(at, "pass fewer values, or name some as statements of the sheet", "a function takes at most %d parameters", MaxFunctionParams)
		}
		st.Params = append(st.Params, name)
		i = skipSpace(r, j)
		if i < end && r[i] == ',' {
			i = skipSpace(r, i+1)
			continue
		}
		if i < end && r[i] == ')' {
			break
		}
		return errAt(t.pos(min(i, end)), "separate the parameters with commas and close them with )", "unexpected text in the parameters of %s", st.Name)
	}
	i = skipSpace(r, i+1)
	if i >= end || r[i] != '=' {
		return errAt(t.pos(min(i, end)), "write "+st.Name+"("+strings.Join(st.Params, ", ")+") = formula", "expected = after the parameters of %s", st.Name)
	}
	i++
	if skipSpace(r[:end], i) == end {
		return errAt(t.pos(i), "write the function's formula after =", "%s has nothing on the right", st.Name)
	}
	st.Formula = strings.TrimSpace(string(r[i:end]))
	e, err := parseFormula(t, i, end)
	if err != nil {
		return err
	}
	st.Expr = e
	return nil
}

// applyFunctions gives every call of a sheet's function its body, and
// reports calls of functions that do not exist, calls with the wrong
// number of arguments, and functions that call themselves.
func (s *Calc) applyFunctions() {
	defs := map[string]*Statement{}
	for _, st := range s.Statements {
		if st.Kind == FunctionDef {
			defs[st.Name] = st
		}
	}
	// The functions first, so that a call of one with an error says so.
	total := 0
	for _, fns := range []bool{true, false} {
		for _, st := range s.Statements {
			if (st.Kind == FunctionDef) != fns || st.Expr == nil || st.Verdict == Errored {
				continue
			}
			ap := applier{defs: defs, total: &total}
			root := st.Expr
			if fns {
				// A definition keeps its formula as written, so that each
				// call's copy expands the calls inside it with their own
				// arguments (a name in g's formula stays the sheet's when f
				// calls g); expanding a copy here finds cycles and unknown
				// functions at the definition.
				ap.stack = []*Statement{st}
				root = ap.clone(st.Expr, nil)
			}
			var err *diag.Diagnostic
			walkAll(root, func(e Expr) {
				if a, ok := e.(*Apply); ok && err == nil && a.Body == nil {
					err = ap.apply(a)
				}
			})
			if err != nil {
				s.fail(st, err)
			}
		}
	}
}

// applier expands the calls of one statement.
type applier struct {
	defs  map[string]*Statement
	stack []*Statement // the functions being expanded, for cycles
	nodes int
	total *int // nodes over the whole sheet
}

func (ap *applier) apply(a *Apply) *diag.Diagnostic {
	def, ok := ap.defs[a.Name]
	if !ok {
		return ap.unknown(a)
	}
	if def.Verdict == Errored {
		return errAt(a.Pos(), "fix the function first", "function %s has an error (at %d:%d)", def.Name, def.Problem.Pos.Line, def.Problem.Pos.Col)
	}
	if len(a.Args) != len(def.Params) {
		return errAt(a.Pos(), fmt.Sprintf("write %s(%s)", def.Name, strings.Join(def.Params, ", ")),
			"%s takes %s", def.Name, plural(len(def.Params), "argument"))
	}
	if err := ap.cycle(a, def); err != nil {
		return err
	}
	for _, x := range a.Args {
		var err *diag.Diagnostic
		walkAll(x, func(e Expr) {
			if in, ok := e.(*Apply); ok && err == nil && in.Body == nil {
				err = ap.apply(in)
			}
		})
		if err != nil {
			return err
		}
	}
	args := map[string]Expr{}
	for i, p := range def.Params {
		args[p] = a.Args[i]
	}
	before := ap.nodes
	body := ap.clone(def.Expr, args)
	*ap.total += ap.nodes - before
	if ap.nodes > MaxAppliedNodes {
		return errAt(a.Pos(), "name the repeated parts as statements of the sheet",
			"the calls of this statement expand to more than %d operations", MaxAppliedNodes)
	}
	if *ap.total > MaxSheetAppliedNodes {
		return errAt(a.Pos(), "name the repeated parts as statements of the sheet, or split the sheet",
			"the calls of the sheet's functions expand to more than %d operations, the limit for one sheet", MaxSheetAppliedNodes)
	}
	ap.stack = append(ap.stack, def)
	defer func() { ap.stack = ap.stack[:len(ap.stack)-1] }()
	var err *diag.Diagnostic
	walkAll(body, func(e Expr) {
		if in, ok := e.(*Apply); ok && err == nil && in.Body == nil {
			err = ap.apply(in)
		}
	})
	if err != nil {
		return expansionError(a, def, err)
	}
	a.Body, a.Def = body, def
	return nil
}

// unknown reports a call of a function that is neither built in nor the
// sheet's, with the nearest name.
func (ap *applier) unknown(a *Apply) *diag.Diagnostic {
	names := functionNames()
	for n := range ap.defs {
		names = append(names, n)
	}
	slices.Sort(names) // the nearest name must not depend on map order
	hint := "the functions are " + functionList()
	if len(ap.defs) > 0 {
		hint += ", and the sheet's own"
	}
	if c := closest(a.Name, names); c != "" {
		hint = "did you mean " + c + "? " + hint
	}
	return errAt(a.Pos(), hint, "unknown function %s", a.Name)
}

// cycle reports a call of a function that is being expanded already.
func (ap *applier) cycle(a *Apply, def *Statement) *diag.Diagnostic {
	for i, f := range ap.stack {
		if f == def {
			chain := []string{}
			for _, g := range ap.stack[i:] {
				chain = append(chain, g.Name)
			}
			return errAt(a.Pos(), "write the rule without calling the function inside itself",
				"function %s calls itself: %s → %s", def.Name, strings.Join(chain, " → "), def.Name)
		}
	}
	return nil
}

// clone copies a function's formula with the arguments in place of the
// parameters. The copy keeps the formula's positions.
func (ap *applier) clone(e Expr, args map[string]Expr) Expr {
	if ap.nodes++; ap.nodes > MaxAppliedNodes || *ap.total+ap.nodes > 2*MaxSheetAppliedNodes {
		return e
	}
	cl := func(x Expr) Expr {
		if x == nil {
			return nil
		}
		return ap.clone(x, args)
	}
	var out Expr
	switch n := e.(type) {
	case *Number:
		c := *n
		out = &c
	case *Quantity:
		c := *n
		out = &c
	case *Keyword:
		c := *n
		out = &c
	case *Ref:
		if a, ok := args[n.Name]; ok {
			return ap.clone(a, nil)
		}
		out = &Ref{node: n.node, Name: n.Name}
	case *Unary:
		out = &Unary{node: n.node, Op: n.Op, X: cl(n.X)}
	case *Binary:
		out = &Binary{node: n.node, Op: n.Op, X: cl(n.X), Y: cl(n.Y)}
	case *Call:
		c := &Call{node: n.node, Name: n.Name, Func: n.Func}
		for _, x := range n.Args {
			c.Args = append(c.Args, cl(x))
		}
		out = c
	case *ListLit:
		c := &ListLit{node: n.node}
		for _, x := range n.Elems {
			c.Elems = append(c.Elems, cl(x))
		}
		out = c
	case *Range:
		out = &Range{node: n.node, From: cl(n.From), To: cl(n.To), Step: cl(n.Step)}
	case *Index:
		out = &Index{node: n.node, X: cl(n.X), I: cl(n.I)}
	case *Choice:
		out = &Choice{node: n.node, Value: cl(n.Value), Other: cl(n.Other), Cond: cl(n.Cond).(*Binary)}
	case *Apply:
		c := &Apply{node: n.node, Name: n.Name, Def: n.Def}
		for _, x := range n.Args {
			c.Args = append(c.Args, cl(x))
		}
		if n.Body != nil {
			c.Body = cl(n.Body)
		}
		out = c
	default:
		return e
	}
	*out.Type() = Type{}
	out.base().fn, out.base().at = nil, 0
	return out
}

// inferApply checks a call's arguments, then its body with them; an
// error in the body is reported at the call, naming the function.
func inferApply(a *Apply) *diag.Diagnostic {
	for _, x := range a.Args {
		if err := infer(x); err != nil {
			return err
		}
	}
	if err := infer(a.Body); err != nil {
		return a.relocate(err)
	}
	for _, x := range append(slices.Clone(a.Args), a.Body) {
		if x.Type().IsComplex() {
			at := x.Pos()
			if x == a.Body {
				at = a.Pos() // the body lies in the definition; say it at the call
			}
			return errAt(at, "call the function with real values, such as abs(E) or Re(E)",
				"functions of the sheet's own take and give real values; phasors are not supported in them")
		}
	}
	t := *a.Body.Type()
	t.Const = false // the call is shown as a call, never folded away
	*a.Type() = t
	return nil
}

// relocate points an error in a call's body at the call, and says where
// in the function it arose. An error at one of the call's own arguments
// (which lie in the calling statement) stays there.
func (a *Apply) relocate(err *diag.Diagnostic) *diag.Diagnostic {
	d := *err
	if err.Pos.File != a.Def.Pos.File || err.Pos.Line != a.Def.Pos.Line {
		d.Message = fmt.Sprintf("in %s (defined at %d:%d): %s", a.Name, a.Def.Pos.Line, a.Def.Pos.Col, err.Message)
		return &d
	}
	d.Message = fmt.Sprintf("in %s (defined at %d:%d), at column %d: %s", a.Name, a.Def.Pos.Line, a.Def.Pos.Col, err.Pos.Col, err.Message)
	d.Pos, d.End = a.Pos(), diag.Pos{}
	return &d
}

// expansionError points an error found in a function's body, while
// expanding a call, at the call: a cycle as it is, any other naming the
// function it arose in.
func expansionError(a *Apply, def *Statement, err *diag.Diagnostic) *diag.Diagnostic {
	d := *err
	d.Pos, d.End = a.Pos(), diag.Pos{}
	if !strings.Contains(err.Message, " calls itself: ") {
		d.Message = fmt.Sprintf("in %s (defined at %d:%d): %s", def.Name, def.Pos.Line, def.Pos.Col, err.Message)
	}
	return &d
}

// compileApply runs the call's body; a list is copied to the call's own
// place.
func compileApply(a *Apply) evalFn {
	body := fnOf(a.Body)
	if !a.T.IsList() {
		return body
	}
	at, n := int(a.base().at), a.T.places() // a series brings its x along
	ba := int(a.Body.base().at)
	return func(v []float64) float64 {
		body(v)
		copy(v[at:at+n], v[ba:ba+n])
		return 0
	}
}
