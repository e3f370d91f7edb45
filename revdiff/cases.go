package revdiff

import (
	"math"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// cases compares the load cases, by name: one added or removed, one that
// sets other inputs or values, and in every case both revisions have,
// each result and check that both have. A result's move in a case is
// reported where the sheet as written did not move it alike, so that an
// input changed in every case is one change, not one per case.
func (d *differ) cases() {
	oldCases, newCases := caseStatements(d.o), caseStatements(d.n)
	seen := map[string]bool{}
	for _, b := range newCases {
		seen[b.Name] = true
		a := find(oldCases, b.Name)
		if a == nil {
			d.add(CaseAdded, b.Name, nil, b, 0)
			continue
		}
		if norm(a.Formula) != norm(b.Formula) {
			d.add(CaseChanged, b.Name, a, b, 0)
		}
		d.inCase(d.o.Conditions.Case(a), d.n.Conditions.Case(b))
	}
	for _, a := range oldCases {
		if !seen[a.Name] {
			d.add(CaseRemoved, a.Name, a, nil, 0)
		}
	}
}

func caseStatements(s *project.Sheet) []*engine.Statement {
	var out []*engine.Statement
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Case && st.Verdict == engine.OK {
			out = append(out, st)
		}
	}
	return out
}

func find(sts []*engine.Statement, name string) *engine.Statement {
	for _, st := range sts {
		if st.Name == name {
			return st
		}
	}
	return nil
}

// inCase compares the results and checks of one case.
func (d *differ) inCase(oc, nc *conditions.CaseRun) {
	if oc == nil || nc == nil {
		return
	}
	name := nc.Stmt.Name
	for _, p := range d.defs {
		a, b := p[0], p[1]
		if a.IsInput() || b.IsInput() {
			continue
		}
		ra, rb := oc.Results[a.Index], nc.Results[b.Index]
		rel := relative(ra, rb)
		base := relative(d.o.Calc.Result(a), d.n.Calc.Result(b))
		switch {
		case (ra.Status == engine.OK) != (rb.Status == engine.OK):
			d.addIn(StatusChanged, name, b.Name, a, b, ra, rb, 0)
		case !math.IsNaN(rel) && math.Abs(rel) > d.threshold && !(math.Abs(rel-base) <= d.threshold):
			d.addIn(ResultMoved, name, b.Name, a, b, ra, rb, rel)
		}
	}
	for _, p := range d.chks {
		a, b := p[0], p[1]
		ra, rb := oc.Results[a.Index], nc.Results[b.Index]
		if verdict(ra) != verdict(rb) {
			d.addIn(CheckFlipped, name, b.Formula, a, b, ra, rb, 0)
		}
	}
}

// addIn records a change found in a load case, with the results there.
func (d *differ) addIn(k Kind, inCase, name string, a, b *engine.Statement, ra, rb engine.Result, rel float64) {
	d.out = append(d.out, Change{Kind: k, Sheet: d.path, Name: name, Old: a, New: b, OldResult: ra, NewResult: rb, Rel: rel, Case: inCase})
}
