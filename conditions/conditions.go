// Package conditions answers a sheet's checks over the conditions its
// design must survive: its load cases, its sweeps of one input, and the
// tolerances of its inputs. It runs the sheet's compiled Program once per
// case, once per sweep point and once per Monte Carlo sample, each run
// re-evaluating only what depends on the inputs it varies.
//
// A check holds only if it holds as written, in every case and at every
// sweep point; it is shown where it comes out worst, its governing
// condition. Tolerances do not change a check's verdict: they report the
// worst case, a root-sum-square estimate and the probability of failure
// beside it, and the audit reports a check that fails within them.
package conditions

import (
	"github.com/sheaf-calc/sheaf/engine"
)

// Report is what the conditions of one sheet gave.
type Report struct {
	Cases  []CaseRun
	Sweeps []SweepRun
	Spread *Spread
	govern map[*engine.Statement]Governing
}

// CaseRun is one load case's results, by statement index.
type CaseRun struct {
	Stmt    *engine.Statement
	Results []engine.Result
}

// Governing is where a check comes out worst over the sheet's cases and
// sweeps.
type Governing struct {
	// Where names the condition: "as written", "case rated",
	// "sweep occ, point 31".
	Where string
	// Case is the case statement, or nil; Sweep and Point the sweep and
	// the index of its point.
	Case  *engine.Statement
	Sweep *SweepRun
	Point int
	// Result is the check there; AsWritten is the check in the sheet as
	// written, which the page shows beside the cases.
	Result    engine.Result
	AsWritten engine.Result
	// Evaluated counts the conditions the check was worked out in, the
	// sheet as written among them; Failing names those where it fails.
	Evaluated int
	Failing   []string
}

// Governing returns the governing condition of a check that the sheet's
// cases or sweeps reach.
func (r *Report) Governing(st *engine.Statement) (Governing, bool) {
	if r == nil {
		return Governing{}, false
	}
	g, ok := r.govern[st]
	return g, ok
}

// SpreadOf returns the tolerance figures, nil for a sheet without
// tolerances.
func (r *Report) SpreadOf() *Spread {
	if r == nil {
		return nil
	}
	return r.Spread
}

// Case returns a case's results, by the case statement.
func (r *Report) Case(st *engine.Statement) *CaseRun {
	if r == nil {
		return nil
	}
	for i := range r.Cases {
		if r.Cases[i].Stmt == st {
			return &r.Cases[i]
		}
	}
	return nil
}

// Run works the sheet out over its conditions. It must run after the
// sheet's Evaluate and before its Release, and returns nil for a sheet
// with no case, sweep or tolerance. It is deterministic: the same sheet
// gives the same report, on any number of cores.
func Run(calc *engine.Calc) *Report {
	var cases, sweeps, tolerated []*engine.Statement
	var sampling *engine.Statement
	for _, st := range calc.Statements {
		if st.Verdict == engine.Errored {
			continue
		}
		switch {
		case st.Kind == engine.Case:
			cases = append(cases, st)
		case st.Kind == engine.Sweep:
			sweeps = append(sweeps, st)
		case st.Kind == engine.Sampling:
			sampling = st
		case st.Tol != nil && calc.Result(st).Status == engine.OK:
			tolerated = append(tolerated, st)
		}
	}
	if len(cases)+len(sweeps)+len(tolerated) == 0 {
		return nil
	}
	p := calc.Program()
	r := &Report{govern: map[*engine.Statement]Governing{}}
	for _, st := range calc.Statements {
		if st.Kind == engine.Check && settled(calc.Result(st).Status) && (len(cases) > 0 || reachedBySweep(calc, st, sweeps)) {
			res := calc.Result(st)
			g := Governing{Where: "as written", Result: res, AsWritten: res, Evaluated: 1}
			if res.Status == engine.Fail {
				g.Failing = []string{"as written"}
			}
			r.govern[st] = g
		}
	}
	for _, c := range cases {
		f := p.NewFrame()
		p.Run(f, caseSets(c))
		run := CaseRun{Stmt: c, Results: p.Results(f)}
		r.Cases = append(r.Cases, run)
		for st := range r.govern {
			r.consider(st, Governing{Where: "case " + c.Name, Case: c, Result: run.Results[st.Index]})
		}
	}
	for _, s := range sweeps {
		r.Sweeps = append(r.Sweeps, runSweep(calc, p, s))
	}
	for i := range r.Sweeps {
		r.considerSweep(p, &r.Sweeps[i])
	}
	for st, g := range r.govern {
		if g.Evaluated == 1 {
			delete(r.govern, st) // no case or sweep reaches it
		}
	}
	if len(tolerated) > 0 {
		r.Spread = runSpread(calc, p, tolerated, sampling)
	}
	return r
}

func settled(s engine.Status) bool { return s == engine.Pass || s == engine.Fail }

// reachedBySweep reports whether a sweep varies an input the check rests
// on.
func reachedBySweep(calc *engine.Calc, st *engine.Statement, sweeps []*engine.Statement) bool {
	for _, s := range sweeps {
		if s.Cond.Governs && restsOn(calc, st, s.Cond.Input) {
			return true
		}
	}
	return false
}

// caseSets are the inputs a case sets, as a run takes them.
func caseSets(c *engine.Statement) []engine.Set {
	sets := make([]engine.Set, len(c.Cond.Sets))
	for i, s := range c.Cond.Sets {
		sets[i] = engine.Set{Slot: s.Input.Index, SI: s.SI}
	}
	return sets
}

// consider counts one more condition of a check and keeps it if the check
// comes out worse there.
func (r *Report) consider(st *engine.Statement, g Governing) {
	cur := r.govern[st]
	cur.Evaluated++
	if g.Result.Status == engine.Fail {
		cur.Failing = append(cur.Failing, g.Where)
	}
	if worse(st, g.Result, cur.Result) {
		g.Evaluated, g.Failing, g.AsWritten = cur.Evaluated, cur.Failing, cur.AsWritten
		cur = g
	}
	r.govern[st] = cur
}

// worse reports whether a check's result a is worse than b: an error is
// worst, then a failure, then the larger shortfall of capacity.
func worse(st *engine.Statement, a, b engine.Result) bool {
	ra, rb := rank(a.Status), rank(b.Status)
	if ra != rb {
		return ra > rb
	}
	if !settled(a.Status) {
		return false
	}
	op := st.Compare().Op
	return shortfall(op, a.Left, a.Right) > shortfall(op, b.Left, b.Right)
}

func rank(s engine.Status) int {
	switch s {
	case engine.Pass:
		return 1
	case engine.Fail:
		return 2
	case engine.Errored, engine.Blocked:
		return 3
	}
	return 0
}
