package engine

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"
	"sync"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Calc is a compiled sheet: its statements in the order written, the order
// in which they are evaluated, and every diagnostic.
type Calc struct {
	Path       string
	Statements []*Statement
	// Order lists the statements in evaluation order: every statement after
	// the ones it uses, otherwise in the order written.
	Order []*Statement
	Diags diag.List
	// Assumptions are the sheet's prose assumptions and assumption
	// statements, prose first, each with what rests on it.
	Assumptions []*Assumption
	// Tables are the sheet's named tables, and those of its instances
	// under the instance's name (coil_a.BH).
	Tables []*LookupTable

	byName  map[string]*Statement
	lists   arena // the places of the sheet's lists in a frame
	prog    *Program
	results []Result // by slot, from Evaluate
	// names are the sheet's names and the constants, sorted, once an
	// unknown name needs them; suggested counts the looks for a close one.
	names      []string
	suggested  int
	tolerances int // toleranced inputs checked so far
	// leftOut are the names of instances' statements left out for an
	// optional parameter not set, for the error at a use of one.
	leftOut map[string]*leftOutName
	// kept are the defaults kept that checks rest on, by use, worked out
	// once the sheet is evaluated.
	keptMu sync.Mutex
	kept   map[*Statement][]KeptDefault
	// traces are what each statement rests on, worked out once.
	traceOnce sync.Once
	traces    []trace
}

// Lookup finds the definition of a name.
func (s *Calc) Lookup(name string) *Statement { return s.byName[name] }

// Compile parses, resolves, orders and checks every statement of a sheet,
// and compiles the ones that are sound. A bad statement is reported and
// skipped; statements that do not depend on it are unaffected. Use
// statements are errors: CompileWith reads templates.
func Compile(src SheetSource) *Calc { return CompileWith(src, Options{}) }

// CompileWith compiles a sheet whose use statements find their templates
// through opt.Resolve.
func CompileWith(src SheetSource, opt Options) *Calc {
	s := &Calc{Path: src.Path, byName: map[string]*Statement{}}
	var parsed []*Statement
	for bi, b := range src.Blocks {
		texts := splitStatements(b)
		if len(texts) == 0 {
			s.Diags.Add(b.Fence, "write at least one statement, or remove the block", "formula block is empty")
			continue
		}
		over := len(parsed)+len(texts) > MaxStatements
		if over {
			// The statements past the limit are not compiled; those before
			// it keep their results.
			keep := MaxStatements - len(parsed)
			s.Diags.Add(texts[keep].pos(skipSpace(texts[keep].runes, 0)), "split the sheet into several sheets",
				"the sheet has more than %d statements, the limit for one sheet; this one and those after it are not evaluated", MaxStatements)
			texts = texts[:keep]
		}
		for _, t := range texts {
			st, err := parseStatement(t)
			st.Block = bi
			parsed = append(parsed, st)
			if err != nil {
				s.fail(st, err)
			}
		}
		if over {
			break
		}
	}
	x := &expander{sheet: s, resolve: opt.Resolve, stack: []string{src.Path}, statements: len(parsed)}
	s.Statements = x.expand(parsed, src.Path)
	s.applyFunctions()
	for _, ts := range append(src.Tables, x.tables...) {
		t := readTable(ts, ts.Name)
		if t.Err != nil {
			s.Diags = append(s.Diags, *t.Err)
		}
		s.Tables = append(s.Tables, t)
	}
	solves := 0
	for i, st := range s.Statements {
		st.Index, st.slot = i, i
		if st.Verdict == Errored || st.Expr == nil {
			continue
		}
		if err := solveOutside(st); err != nil {
			s.fail(st, err)
		} else if _, ok := isSolve(st); ok {
			if solves++; solves > MaxSolves {
				s.fail(st, errAt(st.Expr.Pos(), "split the sheet into several sheets",
					"the sheet has more than %d solve statements, the limit for one sheet; this one is not evaluated", MaxSolves))
			} else if err := prepareSolve(st); err != nil {
				s.fail(st, err)
			}
		}
	}
	s.lists.base = len(s.Statements)
	s.define()
	s.resolveTakes(opt.Take)
	s.resolve()
	s.linkSolves()
	s.order()
	for _, st := range s.Order {
		s.check(st)
	}
	s.checkSolveRelations()
	s.linkAssumptions(append(src.Assumptions, x.assumptions...))
	s.checkConditions() // after the assumptions: a sweep's check reads the traces
	s.checkDrawings()
	s.Diags.Sort()
	return s
}

func (s *Calc) fail(st *Statement, d *diag.Diagnostic) {
	if st.Verdict == Errored {
		return
	}
	st.Verdict = Errored
	st.Problem = d
	s.Diags = append(s.Diags, *d)
}

// define records every name; a second definition of a name is an error.
func (s *Calc) define() {
	instances := map[string]*Statement{}
	for _, st := range s.Statements {
		if st.Kind == Use && st.Instance == "" {
			if first, dup := instances[st.Name]; dup {
				s.fail(st, errAt(st.NamePos, "give each instance its own name", "instance %s is already defined at %d:%d", st.Name, first.NamePos.Line, first.NamePos.Col))
			}
			instances[st.Name] = st
		}
	}
	for _, st := range s.Statements {
		if (st.Kind != Definition && st.Kind != Param && st.Kind != Take && st.Kind != FunctionDef) || st.Name == "" {
			continue
		}
		if inst, clash := instances[st.Name]; clash && st.Instance == "" {
			s.fail(st, errAt(st.NamePos, "rename one of them", "%s is already the name of the instance at %d:%d", st.Name, inst.NamePos.Line, inst.NamePos.Col))
			continue
		}
		if first, dup := s.byName[st.Name]; dup {
			s.fail(st, errAt(st.NamePos, "rename one of them, or delete the one that is not wanted",
				"%s is already defined at %d:%d", st.Name, first.NamePos.Line, first.NamePos.Col))
			continue
		}
		s.byName[st.Name] = st
	}
}

// resolve ties every name in a formula to its statement or constant.
func (s *Calc) resolve() {
	for _, st := range s.Statements {
		if st.Expr == nil {
			continue
		}
		seen := map[*Statement]bool{}
		// The names in a solve's relation are not ordinary dependencies:
		// linkSolves sorts them out once every statement is resolved.
		inRelation := map[Expr]bool{}
		if st.solve != nil {
			walkAll(st.solve.relation, func(e Expr) { inRelation[e] = true })
		}
		walkAll(st.Expr, func(e Expr) {
			r, ok := e.(*Ref)
			if !ok || st.Verdict == Errored || st.Kind == FunctionDef && slices.Contains(st.Params, r.Name) {
				return
			}
			if target, ok := s.byName[r.Name]; ok {
				if target.Kind == FunctionDef {
					s.fail(st, errAt(r.Pos(), "call it with its arguments: "+target.Name+"("+strings.Join(target.Params, ", ")+")", "%s is a function of the sheet, not a value", r.Name))
					return
				}
				r.Target = target
				if inRelation[e] {
					if !containsStmt(st.solve.refs, target) {
						st.solve.refs = append(st.solve.refs, target)
					}
					return
				}
				if !seen[target] {
					seen[target] = true
					st.Deps = append(st.Deps, target)
					target.Users = append(target.Users, st)
				}
				return
			}
			if c, ok := units.ConstantByName(r.Name); ok {
				r.Constant = &c
				return
			}
			if d := s.resolveColumn(r); d != nil || r.Column != nil {
				if d != nil {
					s.fail(st, d)
				}
				return
			}
			if r.Name == "extrapolate" {
				s.fail(st, errAt(r.Pos(), "write it as the last argument of interp or spline", "extrapolate has a meaning only inside interp( ) and spline( )"))
				return
			}
			s.fail(st, s.unknownName(r))
		})
	}
}

// resolveColumn ties T.col to a column of table T. It returns an error
// when the name starts with a table's name but is not one of its columns;
// nil with r.Column unset when the name is not a table's.
func (s *Calc) resolveColumn(r *Ref) *diag.Diagnostic {
	for _, t := range s.Tables {
		if r.Name == t.Name {
			return errAt(r.Pos(), "read a table with interp(T.y, T.x, x), spline(...) or pick(...)", "%s is a table, not a value", t.Name)
		}
		col, ok := strings.CutPrefix(r.Name, t.Name+".")
		if !ok || strings.Contains(col, ".") {
			continue
		}
		if t.Err != nil {
			return errAt(r.Pos(), "fix the table first", "table %s has an error", t.Name)
		}
		c := t.Column(col)
		if c == nil {
			return errAt(r.Pos(), "its columns are "+t.columnNames(), "table %s has no column %s", t.Name, col)
		}
		r.Column = c
		return nil
	}
	return nil
}

// maxSuggestions bounds the unknown names of a sheet for which a close
// name is looked for: each look compares with every name of the sheet,
// so a sheet of thousands of unknown names would take minutes.
const maxSuggestions = 50

func (s *Calc) unknownName(r *Ref) *diag.Diagnostic {
	if d := s.leftOutError(r); d != nil {
		return d
	}
	if s.names == nil {
		s.names = make([]string, 0, len(s.byName)+len(units.Constants))
		for n := range s.byName {
			s.names = append(s.names, n)
		}
		for _, c := range units.Constants {
			s.names = append(s.names, c.Name)
		}
		sort.Strings(s.names)
	}
	hint := "define it in this sheet"
	if s.suggested++; s.suggested <= maxSuggestions {
		if c := closest(r.Name, s.names); c != "" {
			hint = "did you mean " + c + "?"
		}
	}
	if _, isUnit := units.Lookup(r.Name); isUnit {
		hint += " (" + r.Name + " is a unit: a unit must follow a number, as in 1 " + r.Name + ")"
	}
	if r.Name == "e" {
		hint = "for Euler's number write exp(1); e is left free for an EMF"
	}
	return errAt(r.Pos(), hint, "unknown name %s", r.Name)
}

// order sorts the statements so that each comes after what it uses, and
// reports cycles by naming their members.
func (s *Calc) order() {
	const (
		unvisited = iota
		active
		done
	)
	state := make([]int, len(s.Statements))
	var stack []*Statement
	var visit func(st *Statement)
	visit = func(st *Statement) {
		switch state[st.Index] {
		case done:
			return
		case active:
			// st is on the stack: everything from it to the top is a cycle.
			i := len(stack) - 1
			for stack[i] != st {
				i--
			}
			s.cycle(stack[i:])
			return
		}
		state[st.Index] = active
		stack = append(stack, st)
		for _, d := range st.Deps {
			visit(d)
		}
		stack = stack[:len(stack)-1]
		state[st.Index] = done
		s.Order = append(s.Order, st)
	}
	for _, st := range s.Statements {
		visit(st)
	}
}

// maxCycleNames bounds the names a cycle's message lists: every member
// of the cycle gets the message, so listing all of a long cycle would
// take memory in the square of its length.
const maxCycleNames = 8

func (s *Calc) cycle(members []*Statement) {
	if !slices.ContainsFunc(members, func(m *Statement) bool { return m.Verdict != Errored }) {
		return // reported already, through another statement that uses it
	}
	names := make([]string, 0, maxCycleNames+2)
	for _, m := range members[:min(len(members), maxCycleNames)] {
		names = append(names, m.Name)
	}
	if len(members) > maxCycleNames {
		names = append(names, fmt.Sprintf("… (%d statements in all)", len(members)))
	}
	names = append(names, members[0].Name)
	path := strings.Join(names, " → ")
	for _, m := range members {
		s.fail(m, errAt(m.NamePos, "one of these must be given a value that does not depend on the others",
			"%s is defined in terms of itself: %s", m.Name, path))
	}
}

// check infers the dimensions of a statement whose dependencies are sound,
// checks its display unit and compiles it.
func (s *Calc) check(st *Statement) {
	if st.Verdict == Errored {
		return
	}
	switch st.Kind {
	case Use:
		st.Verdict = OK // the instance's own statements carry its results
		return
	case FunctionDef:
		// A definition has no value of its own and stays pending: each
		// call is checked and evaluated with its arguments.
		return
	case Param:
		s.fail(st, errAt(st.NamePos, "this sheet is a template: use it from another sheet with use ... with "+st.Name+" = ...",
			"%s is a template parameter and has no value here", st.Name))
		return
	case Take:
		s.checkTake(st)
		return
	case Case, Sweep, Sampling:
		return // checkConditions, once every input is checked
	}
	for _, d := range st.Deps {
		if !d.compiled {
			st.Verdict = Blocked
			st.Problem = &diag.Diagnostic{Pos: st.Pos, Message: fmt.Sprintf("not evaluated: it uses %s, which has an error", d.Name)}
			return
		}
	}
	if st.solve != nil {
		if err := s.checkSolveBounds(st); err != nil {
			s.fail(st, err)
			return
		}
		if st.Display != nil {
			if msg, hint := displayProblem(st.Name, st.Formula, st.Type, *st.Display); msg != "" {
				s.fail(st, errAt(st.DisplayPos, hint, "%s", msg))
				return
			}
		}
		st.compiled = true
		return
	}
	if err := infer(st.Expr); err != nil {
		s.fail(st, err)
		return
	}
	st.Type = *st.Expr.Type()
	name, formula := st.Name, st.Formula
	if st.Kind == Check {
		formula = ""
		cmp := st.Compare()
		st.Type = *cmp.X.Type()
		if st.Type.Kind.IsPlain() {
			st.Type.Kind = cmp.Y.Type().Kind
		}
		name = "the checked quantity"
	}
	if err := overrideProblem(st); err != nil {
		s.fail(st, err)
		return
	}
	if st.Tol != nil {
		if s.tolerances++; s.tolerances > MaxTolerances {
			s.fail(st, errAt(st.Tol.Pos, "give tolerances to the inputs that matter most, or split the sheet", "the sheet has more than %d toleranced inputs, the limit for one sheet", MaxTolerances))
			return
		}
		if err := checkTolerance(st); err != nil {
			s.fail(st, err)
			return
		}
	}
	if st.Display != nil {
		if msg, hint := displayProblem(name, formula, st.Type, *st.Display); msg != "" {
			s.fail(st, errAt(st.DisplayPos, hint, "%s", msg))
			return
		}
		st.Type.Kind = shownKind(st.Type.Kind, st.Display.Kind)
	}
	if err := s.lists.layout(st.Expr); err != nil {
		s.fail(st, err)
		return
	}
	if st.Kind == Check {
		cmp := st.Compare()
		st.fn, st.right = compile(cmp.X), compile(cmp.Y)
	} else {
		st.fn = compile(st.Expr)
		if st.Type.IsComplex() { // a phasor, or a list of phasors
			st.fn = complexStep(st.fn, st.Expr)
		} else if st.Type.IsList() {
			at, n := listAt(st.Expr)
			st.fn = listStep(st.fn, at, n)
		}
	}
	st.compiled = true
}

// checkTake readies a result taken from another sheet: its value is that
// sheet's, fixed for this sheet's runs.
func (s *Calc) checkTake(st *Statement) {
	if st.Type.IsComplex() {
		s.fail(st, errAt(st.Pos, "take a real value, such as abs(...) or Re(...) of the phasor, named in the other sheet",
			"%s in %s is a phasor; take reads real values", st.Remote, st.TakenPath))
		return
	}
	if st.Type.IsList() {
		s.fail(st, errAt(st.Pos, "take a single value, such as sum(...) or max(...) of the list, named in the other sheet",
			"%s in %s is a list; take reads single values", st.Remote, st.TakenPath))
		return
	}
	if st.taken == nil || st.taken.Status != OK {
		st.Verdict = Blocked
		st.Problem = &diag.Diagnostic{Pos: st.Pos, Message: fmt.Sprintf("not evaluated: %s in %s has no value", st.Remote, st.TakenPath)}
		return
	}
	if st.Display != nil {
		if msg, hint := displayProblem(st.Name, st.Remote, st.Type, *st.Display); msg != "" {
			s.fail(st, errAt(st.DisplayPos, hint, "%s", msg))
			return
		}
		st.Type.Kind = shownKind(st.Type.Kind, st.Display.Kind)
	}
	st.fn = constant(st.taken.Value)
	st.compiled = true
}

// shownKind is the kind a result takes from its display unit: the unit
// says what the quantity is (X [Ω] = 2*pi*f*L is a reactance, T [N*m] =
// F*r a torque, P [kW] = S*cos(phi) an active power), except that an
// absolute temperature shown in K stays one.
func shownKind(have, unit units.Kind) units.Kind {
	if have.IsAbsTemp() && unit.IsPlain() {
		return have
	}
	return unit
}

// Evaluate computes every compiled statement in dependency order, as one
// run of the sheet's Program, and keeps that run's results for the
// renderers (Result). A statement whose result is not a finite number
// fails with the reason at the operation that produced it; statements
// that use it are blocked.
func (s *Calc) Evaluate() {
	p := s.Program()
	f := p.NewFrame()
	p.Run(f, nil)
	s.results = p.Results(f)
	for _, st := range s.Statements {
		if r := s.results[st.slot]; r.Status == Errored && st.Verdict != Errored {
			s.Diags = append(s.Diags, *r.Err)
		}
	}
	s.Diags.Sort()
}

// Program returns the sheet's compiled program, built on first use.
func (s *Calc) Program() *Program {
	if s.prog == nil {
		s.prog = s.buildProgram()
	}
	return s.prog
}

// Result returns what the sheet's evaluation gave st, a statement of this
// sheet; before Evaluate, every statement that runs is pending.
func (s *Calc) Result(st *Statement) Result {
	if st == nil {
		return Result{}
	}
	if st.slot < len(s.results) && s.Statements[st.slot] == st {
		return s.results[st.slot]
	}
	return Result{Status: st.Verdict, Err: st.Problem}
}

// Govern replaces the result a check of this sheet shows with the one it
// has under its governing condition (a load case or a sweep point where
// it comes out worst), so that the pages, the counts and the audit read
// the check where it governs.
func (s *Calc) Govern(st *Statement, r Result) {
	if st.Kind == Check && st.slot < len(s.results) && s.Statements[st.slot] == st {
		s.results[st.slot] = r
	}
}

// Results reads a frame as the pages show it: for each statement, by slot,
// its status, its value or both sides, the unit they are shown in and
// its error. A value that cannot be shown in its unit (1e306 m in nm)
// fails here, and what uses it is blocked.
func (p *Program) Results(f *Frame) []Result {
	out := make([]Result, len(p.stmts))
	for i, st := range p.stmts {
		out[i] = Result{Status: st.Verdict, Err: st.Problem}
	}
	for _, k := range p.steps {
		st, slot := k.st, k.slot
		r := Result{Status: f.Status[slot], Err: f.Errs[slot], count: st.Type.Count && st.Kind == Definition}
		if d := failedDep(st, out); settled(r.Status) && d != nil {
			r.Status = Blocked
			r.Err = &diag.Diagnostic{Pos: st.Pos, Message: fmt.Sprintf("not evaluated: it uses %s, which has an error", d.Name)}
		}
		switch r.Status {
		case OK:
			r.Value = f.Values[slot]
			if st.Type.IsList() {
				r.List = slices.Clone(st.listIn(f.Values))
				r.Value = largest(r.List)
				if st.Type.IsSeries() {
					r.Over = slices.Clone(st.axisIn(f.Values))
					r.OverShown = axisUnit(st.Type, r.Over)
				}
			}
			if st.Type.IsComplex() {
				r.setPhasor(st, f.Values) // a phasor, or a list of phasors
			}
			r.Shown = shownUnit(st, r.Value, out)
			if sv := st.solve; sv != nil {
				r.Shown = solveUnit(st, fnOf(sv.lo)(f.Values), fnOf(sv.hi)(f.Values))
			}
			if !finite(r.Shown.FromSI(r.Value)) {
				r = Result{Status: Errored, Err: unshowable(st, r.Value, r.Shown)}
			}
		case Pass, Fail:
			r = checkResult(st, r, f.Left[slot], f.Right[slot], out)
		}
		out[slot] = r
	}
	return out
}

// failedDep returns the first statement st uses that has no value.
func failedDep(st *Statement, res []Result) *Statement {
	for _, d := range st.Deps {
		if res[d.slot].Status != OK {
			return d
		}
	}
	return nil
}

// checkResult gives a check's sides in the unit they are shown in, and
// its utilisation there (a check on °C values uses the °C values).
func checkResult(st *Statement, r Result, l, rt float64, res []Result) Result {
	r.Left, r.Right = l, rt
	r.Shown = checkUnit(st, l, rt, res)
	for _, side := range []float64{l, rt} {
		if !finite(r.Shown.FromSI(side)) {
			return Result{Status: Errored, Err: unshowable(st, side, r.Shown)}
		}
	}
	r.Utilisation = utilisation(st.Compare().Op, r.Shown.FromSI(l), r.Shown.FromSI(rt))
	return r
}

// Release drops the compiled program and closures once every statement
// has its value. A package keeps its sheets for rendering, where the
// closures would only hold memory; after Release the sheet cannot be
// evaluated again.
func (s *Calc) Release() {
	s.prog = nil
	for _, st := range s.Statements {
		st.fn, st.right = nil, nil
		if st.Expr != nil {
			walkAll(st.Expr, func(e Expr) { e.base().fn = nil })
		}
		if st.solve != nil {
			for _, e := range []Expr{st.solve.lo, st.solve.hi, st.solve.relation} {
				walkAll(e, func(e Expr) { e.base().fn = nil })
			}
			st.solve.inner = nil
		}
	}
}

// unshowable reports a finite SI value that overflows in the unit it is to
// be shown in, such as 1e306 m in nm.
func unshowable(st *Statement, v float64, shown units.Unit) *diag.Diagnostic {
	at := st.Pos
	if st.Display != nil {
		at = st.DisplayPos
	}
	return errAt(at, "choose a larger unit", "%s %s is beyond the range of a number when shown in %s",
		units.FormatNumber(v, 4), st.Type.Dim.SIUnits(), shown.Symbol)
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// EqualTolerance is the relative difference within which a check with ==
// passes: equal to about nine significant figures.
const EqualTolerance = 1e-9

// utilisation is demand over capacity in the check's own unit: left/right
// for < and <=, right/left for > and >=. It is NaN where it has no meaning
// (an equality, or a capacity of zero or below).
func utilisation(op string, l, r float64) float64 {
	var demand, capacity float64
	switch op {
	case "<", "<=":
		demand, capacity = l, r
	case ">", ">=":
		demand, capacity = r, l
	default:
		return math.NaN()
	}
	if capacity <= 0 || demand < 0 {
		return math.NaN()
	}
	return demand / capacity
}

// shownUnit picks the unit a definition's value is shown in.
func shownUnit(st *Statement, v float64, res []Result) units.Unit {
	if st.Display != nil {
		return *st.Display
	}
	e := st.Expr
	if u, ok := e.(*Unary); ok {
		e = u.X
	}
	switch q := e.(type) {
	case *Quantity:
		return q.Unit
	case *ListLit:
		if u, ok := commonUnit(q); ok {
			return u
		}
	case *Number:
		return units.One
	case *Ref:
		// An alias shows the way its target does.
		if q.Target != nil && res[q.Target.slot].Status == OK {
			return res[q.Target.slot].Shown
		}
	}
	if st.Taken != nil {
		return st.taken.Shown // as the sheet it comes from shows it
	}
	return units.AutoUnit(v, st.Type.Dim, st.Type.Kind)
}

// checkUnit picks one unit for both sides of a check: the one asked for,
// else the unit of a named side, else the unit of a literal side.
func checkUnit(st *Statement, l, r float64, res []Result) units.Unit {
	if st.Display != nil {
		return *st.Display
	}
	cmp := st.Compare()
	for _, side := range []Expr{cmp.X, cmp.Y} {
		if ref, ok := side.(*Ref); ok && ref.Target != nil && res[ref.Target.slot].Status == OK {
			return res[ref.Target.slot].Shown
		}
	}
	for _, side := range []Expr{cmp.Y, cmp.X} {
		if q, ok := side.(*Quantity); ok {
			return q.Unit
		}
	}
	return units.AutoUnit(math.Max(math.Abs(l), math.Abs(r)), st.Type.Dim, st.Type.Kind)
}

// tableProblem explains a table read that has no value at x; where says
// which element of a list x is, or is empty.
func tableProblem(c *Call, x float64, where string) *diag.Diagnostic {
	shown := units.FormatNumber(c.x.Unit.FromSI(x), 4)
	if c.x.Unit.Symbol != "1" {
		shown += " " + c.x.Unit.Symbol
	}
	if c.Func.table == "exact" {
		return errAt(c.Args[2].Pos(), "add the row, or read between rows with interp",
			"no row of table %s has %s = %s%s", c.x.Table.Name, c.x.Name, shown, where)
	}
	return errAt(c.Args[2].Pos(), "extend the table, or write "+c.Name+"(..., extrapolate) to extend its end segments",
		"%s = %s%s lies outside table %s (%s from %s)", c.x.Name, shown, where, c.x.Table.Name, c.x.Name, rangeText(c.x))
}

// diagnose finds the operation that first produced a non-finite value and
// says what went wrong there.
func diagnose(e Expr, v []float64) *diag.Diagnostic {
	if c, ok := e.(*Choice); ok {
		return diagnoseChoice(c, v)
	}
	if a, ok := e.(*Apply); ok {
		for _, x := range a.Args {
			if !valueOK(x, v) {
				return diagnose(x, v)
			}
		}
		return a.relocate(diagnose(a.Body, v))
	}
	children := e.children()
	if c, ok := e.(*Call); ok && c.Func.table != "" {
		children = c.Args[2:3] // the columns are data
	}
	for _, c := range children {
		if !valueOK(c, v) {
			return diagnose(c, v)
		}
	}
	if c, ok := e.(*Call); ok && c.Func.explain != nil {
		if d := c.Func.explain(c, v); d != nil {
			return d
		}
	}
	if e.Type().IsList() {
		return diagnoseList(e, v)
	}
	if e.Type().IsComplex() {
		return diagnoseComplex(e, v)
	}
	if x, ok := e.(*Index); ok {
		return indexProblem(x, v)
	}
	result := fnOf(e)(v)
	if c, ok := e.(*Call); ok && c.Func.table != "" && math.IsNaN(result) {
		return tableProblem(c, fnOf(c.Args[2])(v), "")
	}
	switch n := e.(type) {
	case *Binary:
		switch {
		case n.Op == "/" && fnOf(n.Y)(v) == 0:
			return errAt(n.Pos(), "check the value of the divisor", "division by zero")
		case n.Op == "^" && math.IsNaN(result):
			return errAt(n.Pos(), "a negative number has no real fractional power", "negative number raised to a fractional power")
		}
	case *Call:
		if n.Func.domain != "" && math.IsNaN(result) || (n.Name == "ln" || n.Name == "log10") {
			if n.Func.domain != "" {
				return errAt(n.Pos(), "check the argument", "%s", n.Func.domain)
			}
		}
	}
	if math.IsNaN(result) {
		return errAt(e.Pos(), "check the inputs", "the result is not a number")
	}
	return errAt(e.Pos(), "check the inputs and their units; the result is beyond ±1.8e308 in SI", "the result overflows")
}
