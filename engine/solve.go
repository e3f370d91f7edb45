package engine

import (
	"errors"
	"fmt"
	"math"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// A definition `x = solve(lhs == rhs, lo, hi)` makes x the unknown: sheaf
// finds the x between lo and hi for which the relation holds, evaluating
// the statements between x and the relation for every trial value. The
// relation may use statements that use x; those are "inner" statements,
// evaluated inside the search, and again afterwards with the answer.
type solveInfo struct {
	relation *Binary
	lo, hi   Expr
	refs     []*Statement // statements the relation names
	needed   map[*Statement]bool
	inner    []*Statement // statements to evaluate for a trial x, in evaluation order
}

// SolveTolerance is the relative width, against the bounds, to which the
// unknown is found.
const SolveTolerance = 1e-12

// MaxSolveIterations bounds the search.
const MaxSolveIterations = 200

// MaxSolveWork bounds the work of one solve statement, nested solves
// included: the number of statement evaluations its search may spend
// (every trial value evaluates the statements inside the search and the
// relation). A solve inside another's search runs a whole search for
// every trial of the outer one, so nesting multiplies the work; without
// a bound, twenty nested solves run for minutes.
const MaxSolveWork = 250_000

// solveBudget is the work left to the solve statement being evaluated.
type solveBudget struct {
	left      int
	depth     int // solves in progress, one inside another
	deepest   int
	exhausted bool
}

// isSolve reports whether a statement's formula is a solve(...).
func isSolve(st *Statement) (*Call, bool) {
	c, ok := st.Expr.(*Call)
	return c, ok && st.Kind == Definition && c.Name == "solve"
}

// prepareSolve checks the shape of a solve statement before names are
// resolved: the relation is an equality and the bounds are the other two
// arguments.
func prepareSolve(st *Statement) *diag.Diagnostic {
	c, _ := isSolve(st)
	rel, ok := c.Args[0].(*Binary)
	if !ok || rel.Op != "==" {
		return errAt(c.Args[0].Pos(), "write solve(left == right, lowest, highest)", "the first argument of solve is the relation to meet, written with ==")
	}
	st.solve = &solveInfo{relation: rel, lo: c.Args[1], hi: c.Args[2]}
	return nil
}

// solveOutside reports a solve(...) that is not a whole right side.
func solveOutside(st *Statement) *diag.Diagnostic {
	var bad Expr
	Walk(st.Expr, func(e Expr) {
		if c, ok := e.(*Call); ok && c.Name == "solve" && e != st.Expr && bad == nil {
			bad = e
		}
	})
	if c, ok := st.Expr.(*Call); ok && c.Name == "solve" && st.Kind != Definition && bad == nil {
		bad = c
	}
	if bad != nil {
		return errAt(bad.Pos(), "write the unknown as its own statement: x = solve(left == right, lowest, highest)", "solve must be the whole right side of a definition")
	}
	return nil
}

// linkSolves adds, for every solve statement, the statements its relation
// uses that do not depend on the unknown as ordinary dependencies, and
// notes the inner statements to evaluate for a trial value.
//
// A solve may sit inside another's search: Phi = solve(N*I == F(Phi), ...)
// inside I = solve(Phi == Phi_want, ...). A relation depends on its own
// unknown either through ordinary formulas or through the relation of a
// solve inside it, so solves are linked innermost first: those whose
// relation reaches their unknown through ordinary formulas, then, with
// their links in place, the ones around them, until none is left.
func (s *Calc) linkSolves() {
	var pending []*Statement
	for _, st := range s.Statements {
		if st.solve != nil && st.Verdict != Errored {
			pending = append(pending, st)
		}
	}
	for len(pending) > 0 {
		var rest []*Statement
		for _, st := range pending {
			inner := s.innerOf(st)
			if !s.relationReaches(st, inner) {
				rest = append(rest, st)
				continue
			}
			// Everything the relation needs that does not move with the
			// unknown must have its value before the search starts: the
			// statements the relation names, and those its inner
			// statements use, wherever they are written.
			for _, r := range s.givens(st, inner) {
				if !containsStmt(st.Deps, r) {
					st.Deps = append(st.Deps, r)
					r.Users = append(r.Users, st)
				}
			}
		}
		if len(rest) == len(pending) {
			for _, st := range rest {
				s.fail(st, errAt(st.solve.relation.Pos(), "the relation must use "+st.Name+", directly or through the statements that use it",
					"the relation does not depend on %s", st.Name))
			}
			break
		}
		pending = rest
	}
	for _, st := range s.Statements {
		if st.solve == nil || st.Verdict == Errored {
			continue
		}
		inner := s.innerOf(st)
		st.solve.needed = map[*Statement]bool{}
		for _, n := range closure(st.solve.refs, func(x *Statement) []*Statement { return x.Deps }) {
			if inner(n) {
				st.solve.needed[n] = true
			}
		}
	}
}

// givens lists the statements a solve's search takes as given: those its
// relation names, and those its inner statements use, that do not depend
// on the unknown.
func (s *Calc) givens(st *Statement, inner func(*Statement) bool) []*Statement {
	var out []*Statement
	seen := map[*Statement]bool{st: true}
	var walk func(x *Statement)
	walk = func(x *Statement) {
		if seen[x] {
			return
		}
		seen[x] = true
		if !inner(x) {
			out = append(out, x)
			return
		}
		for _, d := range x.Deps {
			walk(d)
		}
	}
	for _, r := range st.solve.refs {
		walk(r)
	}
	return out
}

// innerOf tells the statements that depend on a solve's unknown. It
// looks only where it is asked, down the dependencies of the statement
// asked about: a search needs to know this of the statements its relation
// reaches, which are few, not of everything that uses the unknown, which
// may be most of the sheet.
func (s *Calc) innerOf(st *Statement) func(*Statement) bool {
	const (
		unknown = iota
		visiting
		yes
		no
	)
	state := map[*Statement]int{}
	var depends func(x *Statement) bool
	depends = func(x *Statement) bool {
		switch state[x] {
		case yes:
			return true
		case no, visiting:
			return false // a cycle, reported when the sheet is ordered
		}
		state[x] = visiting
		found := false
		for _, d := range x.Deps {
			if d == st || depends(d) {
				found = true
				break
			}
		}
		state[x] = no
		if found {
			state[x] = yes
		}
		return found
	}
	return depends
}

// relationReaches reports whether a solve's relation names its unknown or
// a statement that depends on it.
func (s *Calc) relationReaches(st *Statement, inner func(*Statement) bool) bool {
	for _, r := range st.solve.refs {
		if r == st || inner(r) {
			return true
		}
	}
	return false
}

func containsStmt(list []*Statement, st *Statement) bool {
	for _, x := range list {
		if x == st {
			return true
		}
	}
	return false
}

// checkSolveBounds infers the unknown's dimension from its bounds.
func (s *Calc) checkSolveBounds(st *Statement) *diag.Diagnostic {
	sv := st.solve
	for _, b := range []Expr{sv.lo, sv.hi} {
		if err := infer(b); err != nil {
			return err
		}
	}
	lo, hi := sv.lo.Type(), sv.hi.Type()
	for _, b := range []Expr{sv.lo, sv.hi} {
		if b.Type().IsList() {
			return errAt(b.Pos(), "give one value, such as min(...) or max(...) of the list", "a bound of solve is one value; this is a list")
		}
		if b.Type().IsComplex() {
			return errAt(b.Pos(), "give a real value, such as abs(...) of the phasor", "a bound of solve is a real value; this is a phasor")
		}
		if err := s.lists.layout(b); err != nil {
			return err
		}
	}
	if lo.Dim != hi.Dim {
		return errAt(sv.hi.Pos(), "give both bounds in units of one kind", "the bounds of solve are %s and %s", units.Describe(lo.Dim), units.Describe(hi.Dim))
	}
	st.Type = Type{Dim: lo.Dim, Kind: lo.Kind}
	*st.Expr.Type() = st.Type
	compile(sv.lo)
	compile(sv.hi)
	return nil
}

// checkSolveRelations checks and compiles every relation once the
// statements it uses are checked.
func (s *Calc) checkSolveRelations() {
	for _, st := range s.Statements {
		if st.solve == nil || !st.compiled {
			continue
		}
		for _, r := range st.solve.refs {
			if r != st && !r.compiled {
				st.compiled = false
				st.Verdict = Blocked
				st.Problem = &diag.Diagnostic{Pos: st.Pos, Message: fmt.Sprintf("not evaluated: its relation uses %s, which has an error", r.Name)}
				break
			}
		}
		if !st.compiled {
			continue
		}
		if err := infer(st.solve.relation); err != nil {
			st.compiled = false
			s.fail(st, err)
			continue
		}
		if err := s.lists.layout(st.solve.relation); err != nil {
			st.compiled = false
			s.fail(st, err)
			continue
		}
		compile(st.solve.relation.X)
		compile(st.solve.relation.Y)
		for _, o := range s.Order {
			if st.solve.needed[o] {
				st.solve.inner = append(st.solve.inner, o)
			}
		}
	}
}

// errNoBracket is returned when f has the same sign at both bounds.
var errNoBracket = errors.New("no sign change")

// brent finds a zero of f between a and b, where f(a) and f(b) differ in
// sign, by Brent's method (R. P. Brent, Algorithms for Minimization
// without Derivatives, 1973, chapter 4): bisection made safe, inverse
// quadratic interpolation made fast.
func brent(f func(float64) float64, a, b, tol float64, maxIter int) (float64, error) {
	fa, fb := f(a), f(b)
	if math.IsNaN(fa) || math.IsNaN(fb) {
		return math.NaN(), errors.New("not a number")
	}
	if fa == 0 {
		return a, nil
	}
	if fb == 0 {
		return b, nil
	}
	if (fa > 0) == (fb > 0) {
		return math.NaN(), errNoBracket
	}
	c, fc := a, fa
	d := b - a
	e := d
	for i := 0; i < maxIter; i++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*2.220446049250313e-16*math.Abs(b) + 0.5*tol
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b, nil
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				p = 2 * xm * s
				q = 1 - s
			} else {
				q = fa / fc
				r := fb / fc
				p = s * (2*xm*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			}
			p = math.Abs(p)
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = xm
				e = d
			}
		} else {
			d = xm
			e = d
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else {
			b += math.Copysign(tol1, xm)
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return b, errors.New("not a number")
		}
	}
	return b, errors.New("did not converge")
}

// solveUnit is the unit a solve's unknown and its messages are shown in:
// its display unit, or one picked for the larger bound.
func solveUnit(st *Statement, lo, hi float64) units.Unit {
	if st.Display != nil {
		return *st.Display
	}
	return units.AutoUnit(math.Max(math.Abs(lo), math.Abs(hi)), st.Type.Dim, st.Type.Kind)
}

// solveRoot finds the unknown of a solve statement within the work limit.
func (p *Program) solveRoot(f *Frame, st *Statement) (float64, *diag.Diagnostic) {
	b := &solveBudget{left: MaxSolveWork}
	return p.findRoot(f, st, b)
}

// findRoot searches for the unknown of a solve statement and leaves the
// statements inside the search at their values for the answer. A solve
// inside another's search runs its own search for every trial value, from
// the same budget.
func (p *Program) findRoot(f *Frame, st *Statement, b *solveBudget) (float64, *diag.Diagnostic) {
	sv, v := st.solve, f.Values
	b.depth++
	b.deepest = max(b.deepest, b.depth)
	defer func() { b.depth-- }()
	lo, hi := fnOf(sv.lo)(v), fnOf(sv.hi)(v)
	unit := solveUnit(st, lo, hi)
	at := func(x float64) string { return st.Name + " = " + quantityText(x, unit) }
	if !finite(lo) || !finite(hi) || lo >= hi {
		return 0, errAt(sv.lo.Pos(), "give the lowest value of "+st.Name+" first and the highest second", "the bounds of solve are not an interval: %s to %s",
			quantityText(lo, unit), quantityText(hi, unit))
	}
	var failed *Statement
	var failedAt float64
	var failure *diag.Diagnostic
	residual := func(x float64) float64 {
		if b.left -= len(sv.inner) + 1; b.left < 0 {
			b.exhausted = true
			return math.NaN()
		}
		v[st.slot] = x
		for _, in := range sv.inner {
			var y float64
			if in.solve != nil {
				r, d := p.findRoot(f, in, b)
				if d != nil {
					if failed == nil {
						failed, failedAt, failure = in, x, d
					}
					return math.NaN()
				}
				y = r
			} else {
				y = p.steps[p.stepOf[in.slot]].fn(v)
			}
			if !finite(y) {
				if failed == nil {
					failed, failedAt, failure = in, x, diagnose(in.Expr, v)
				}
				return math.NaN()
			}
			v[in.slot] = y
		}
		return fnOf(sv.relation.X)(v) - fnOf(sv.relation.Y)(v)
	}
	tol := SolveTolerance * math.Max(math.Abs(lo), math.Abs(hi))
	root, err := brent(residual, lo, hi, tol, MaxSolveIterations)
	switch {
	case b.exhausted:
		return 0, errAt(st.Expr.Pos(), "give the unknowns narrower bounds, or nest fewer solves inside one another (each runs a whole search for every trial of the one around it)",
			"solving for %s stopped at the limit of %d evaluations of the statements inside its search (%d solves nested one inside another multiply their trials)",
			st.Name, MaxSolveWork, b.deepest)
	case failed != nil:
		// A failure deep inside nested solves is fixed at the innermost
		// search: its hint names the unknown whose bounds to narrow.
		hint := "narrow the bounds of " + st.Name + " to where " + failed.Name + " can be evaluated"
		if failed.solve != nil && failure.Hint != "" {
			hint = failure.Hint
		}
		return 0, errAt(st.Expr.Pos(), hint,
			"while solving for %s, at %s, %s could not be evaluated: %s", st.Name, at(failedAt), failed.Name, failure.Message)
	case errors.Is(err, errNoBracket):
		rl := residualText(sv, residual(lo))
		rh := residualText(sv, residual(hi))
		return 0, errAt(st.Expr.Pos(), "widen the bounds of "+st.Name+" so that the two sides cross between them, or check the relation",
			"the bounds do not bracket a solution: the left side minus the right side is %s at %s and %s at %s, of the same sign",
			rl, at(lo), rh, at(hi))
	case err != nil:
		return 0, errAt(st.Expr.Pos(), "check the relation between the bounds", "solve found no solution for %s: %v", st.Name, err)
	}
	residual(root)
	return root, nil
}

// residualText writes a residual in a unit for the relation's sides.
func residualText(sv *solveInfo, r float64) string {
	t := sv.relation.X.Type()
	return quantityText(r, units.AutoUnit(math.Abs(r), t.Dim, t.Kind))
}

// quantityText writes an SI value in a unit to four figures, as a
// quantity is written: "2.5 mm", "30°", and a pure number without a unit.
func quantityText(v float64, u units.Unit) string {
	n := units.FormatNumber(u.FromSI(v), 4)
	switch {
	case u.Symbol == "1" || u.Symbol == "":
		return n
	case units.SpaceBefore(u.Symbol):
		return n + " " + u.Symbol
	}
	return n + u.Symbol
}
