package engine

import (
	"slices"
	"sort"
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
)

// Assumption is something a calculation takes as given: a paragraph of
// prose the author marked as an assumption (with an id that statements
// cite with `; assumes: id`), or a statement marked `; assume: why`.
type Assumption struct {
	ID   string
	Text string
	Pos  diag.Pos
	// Statement is set when the assumption is a statement of its own.
	Statement *Statement
	// Direct are the statements that cite it or are it; Dependents are
	// every statement whose result rests on it, directly or through others,
	// in the order written.
	Direct     []*Statement
	Dependents []*Statement
}

// AssumptionSource is a prose assumption as the sheet reader found it.
type AssumptionSource struct {
	ID   string
	Text string
	Pos  diag.Pos
}

// linkAssumptions ties every `assumes:` to the sheet's prose assumptions,
// turns `assume:` statements into assumptions, and works out what rests on
// each. An unknown id is an error at its annotation; it does not stop the
// calculation.
func (s *Calc) linkAssumptions(prose []AssumptionSource) {
	byID := map[string]*Assumption{}
	for _, p := range prose {
		if first, dup := byID[p.ID]; dup {
			s.Diags.Add(p.Pos, "give each assumption its own id", "assumption %s is already declared at %d:%d", p.ID, first.Pos.Line, first.Pos.Col)
			continue
		}
		a := &Assumption{ID: p.ID, Text: p.Text, Pos: p.Pos}
		byID[p.ID] = a
		s.Assumptions = append(s.Assumptions, a)
	}
	for _, st := range s.Statements {
		if st.Assumption != "" {
			a := &Assumption{ID: st.Name, Text: st.Assumption, Pos: st.Pos, Statement: st, Direct: []*Statement{st}}
			if st.Name == "" {
				a.ID = "line-" + strconv.Itoa(st.Pos.Line)
			}
			s.Assumptions = append(s.Assumptions, a)
		}
		for _, id := range st.Assumes {
			a, ok := byID[id]
			if !ok {
				s.Diags.Add(notePos(st, "assumes"), s.assumptionHint(byID), "unknown assumption %s", id)
				continue
			}
			a.Direct = append(a.Direct, st)
			if st.Kind == Use {
				// Everything an instance computes rests on what its use assumes.
				a.Direct = append(a.Direct, s.instanceStatements(st)...)
			}
		}
	}
	for _, a := range s.Assumptions {
		a.Dependents = closure(a.Direct, func(st *Statement) []*Statement { return st.Users })
	}
}

// instanceStatements lists the statements of a use's instance, nested
// instances included.
func (s *Calc) instanceStatements(use *Statement) []*Statement {
	var out []*Statement
	for _, st := range s.Statements {
		for u := st.Use; u != nil; u = u.Use {
			if u == use {
				out = append(out, st)
				break
			}
		}
	}
	return out
}

func (s *Calc) assumptionHint(byID map[string]*Assumption) string {
	if len(byID) == 0 {
		return "declare it in the prose with a paragraph that starts: Assumption " + "<id>: ..."
	}
	ids := make([]string, 0, len(byID))
	for id := range byID {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	return "this sheet declares " + strings.Join(ids, ", ")
}

func notePos(st *Statement, key string) diag.Pos {
	for _, n := range st.Notes {
		if n.Key == key {
			return n.Pos
		}
	}
	return st.Pos
}

// closure returns every statement reachable from start through next,
// start included, in the order written.
func closure(start []*Statement, next func(*Statement) []*Statement) []*Statement {
	seen := map[*Statement]bool{}
	var out []*Statement
	var walk func(st *Statement)
	walk = func(st *Statement) {
		if seen[st] {
			return
		}
		seen[st] = true
		out = append(out, st)
		for _, n := range next(st) {
			walk(n)
		}
	}
	for _, st := range start {
		walk(st)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Index < out[j].Index })
	return out
}

// RestsOn returns the inputs and the assumptions that a statement's result
// ultimately rests on, through every statement it uses, in the order
// written. A statement that is itself an input or an assumption is among
// them. A result taken from another sheet counts as an input here: the
// page links to the sheet it comes from. The first call works them out for
// every statement at once, in evaluation order, so that a long chain costs
// its length, not its square.
func (s *Calc) RestsOn(st *Statement) (inputs []*Statement, assumptions []*Assumption) {
	s.traceOnce.Do(s.traceAll)
	if t := s.traces[st.Index]; t.done {
		return t.inputs, t.assumptions
	}
	return s.restsOnSlow(st)
}

// trace is what one statement rests on.
type trace struct {
	done        bool
	inputs      []*Statement
	assumptions []*Assumption
}

// traceAll works out every statement's trace from those of the statements
// it uses, which come before it in evaluation order. A statement in a
// cycle is left to restsOnSlow.
func (s *Calc) traceAll() {
	s.traces = make([]trace, len(s.Statements))
	rank := map[*Assumption]int{}
	direct := map[*Statement][]*Assumption{}
	for i, a := range s.Assumptions {
		rank[a] = i
		for _, d := range a.Direct {
			if l := direct[d]; len(l) == 0 || l[len(l)-1] != a {
				direct[d] = append(direct[d], a)
			}
		}
	}
	for _, st := range s.Order {
		var ins [][]*Statement
		var ass [][]*Assumption
		if st.IsInput() || st.Kind == Take {
			ins = append(ins, []*Statement{st})
		}
		if d := direct[st]; len(d) > 0 {
			ass = append(ass, d)
		}
		ok := true
		for _, d := range st.Deps {
			t := s.traces[d.Index]
			if !t.done {
				ok = false
				break
			}
			ins, ass = append(ins, t.inputs), append(ass, t.assumptions)
		}
		if ok {
			s.traces[st.Index] = trace{done: true,
				inputs:      union(ins, func(x *Statement) int { return x.Index }),
				assumptions: union(ass, func(a *Assumption) int { return rank[a] })}
		}
	}
}

// union merges lists each sorted by key into one sorted list without
// repeats. A single non-empty list is shared, not copied: a chain of
// statements that each use the one before share one list.
func union[T comparable](lists [][]T, key func(T) int) []T {
	var nonEmpty [][]T
	for _, l := range lists {
		if len(l) > 0 {
			nonEmpty = append(nonEmpty, l)
		}
	}
	switch len(nonEmpty) {
	case 0:
		return nil
	case 1:
		return nonEmpty[0]
	}
	var out []T
	for _, l := range nonEmpty {
		out = append(out, l...)
	}
	sort.SliceStable(out, func(i, j int) bool { return key(out[i]) < key(out[j]) })
	return slices.CompactFunc(out, func(a, b T) bool { return a == b })
}

// restsOnSlow walks a statement's dependencies afresh.
func (s *Calc) restsOnSlow(st *Statement) (inputs []*Statement, assumptions []*Assumption) {
	all := closure([]*Statement{st}, func(x *Statement) []*Statement { return x.Deps })
	in := map[*Statement]bool{}
	for _, x := range all {
		in[x] = true
		if x.IsInput() || x.Kind == Take {
			inputs = append(inputs, x)
		}
	}
	for _, a := range s.Assumptions {
		for _, d := range a.Direct {
			if in[d] {
				assumptions = append(assumptions, a)
				break
			}
		}
	}
	return inputs, assumptions
}
