package engine

import (
	"fmt"
	"slices"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
)

// InstanceParts is what the page of a use statement shows of its template
// beside the instance's results.
type InstanceParts struct {
	// Validity and Sources are the template's, from its front matter:
	// where it holds, and the published references it rests on.
	Validity, Sources []string
	// LeftOut are the parts of the instance that were not evaluated, one
	// for each set of optional parameters not set, in the order written.
	LeftOut []LeftOut
}

// LeftOut is a part of an instance that rests on optional parameters the
// use statement does not set. Its statements are not evaluated, not
// counted as passing or failing, and are not an error; a statement of the
// using sheet that names one is.
type LeftOut struct {
	// Params would enable the part, named as the use statement sets them
	// (inner.PDIV_pp for one of an instance inside the template), sorted.
	Params []string
	// Statements are those left out, under the instance's names, in the
	// order written. The unset parameters are not among them.
	Statements []*Statement
}

// Checks counts the checks of a part left out.
func (l LeftOut) Checks() int {
	n := 0
	for _, st := range l.Statements {
		if st.Kind == Check {
			n++
		}
	}
	return n
}

// leftOutName is why a name of an instance has no statement.
type leftOutName struct {
	use    *Statement
	params []string
}

// leaveOut drops from an instance every statement that rests, through
// the template's own formulas, on an optional parameter the use statement
// does not set, and records what it dropped on the use. Parts that inner
// instances left out count as resting on the inner parameters.
func (x *expander) leaveOut(use *Statement, body []*Statement, top bool) []*Statement {
	seeds, inner := x.leftOutSeeds(use, body)
	if len(seeds) == 0 {
		use.Parts.LeftOut = inner // checks alone left out inside, if any
		return body
	}
	rests := spread(seeds, nameUsers(use, body))
	var kept []*Statement
	groups := inner
	for _, st := range body {
		ps, dropped := rests[st]
		if st.Kind == Param && st.Expr == nil {
			dropped = true // an optional parameter not set
		}
		if !dropped {
			kept = append(kept, st)
			continue
		}
		if st.Kind != Param {
			groups = addLeftOut(groups, ps, st)
		}
	}
	at := map[*Statement]int{}
	for i, st := range body {
		at[st] = i + 1 // parts of inner instances, not in body, stay first
	}
	for _, g := range groups {
		slices.SortStableFunc(g.Statements, func(a, b *Statement) int { return at[a] - at[b] })
	}
	use.Parts.LeftOut = groups
	if top {
		x.recordLeftOut(use, seeds, rests)
	}
	return kept
}

// nameUsers maps each name that the template's own formulas use to the
// statements that use it.
func nameUsers(use *Statement, body []*Statement) map[string][]*Statement {
	users := map[string][]*Statement{}
	for _, st := range body {
		if st.Overridden && st.Use == use {
			// The using sheet wrote this formula: a left-out name in it
			// is an error there, not a part to leave out.
			continue
		}
		var seen []string
		Walk(st.Expr, func(e Expr) {
			var n string
			switch v := e.(type) {
			case *Ref:
				n = v.Name
			case *Apply:
				n = v.Name
			}
			if n != "" && !slices.Contains(seen, n) {
				seen = append(seen, n)
				users[n] = append(users[n], st)
			}
		})
	}
	return users
}

// spread follows the seeds through the statements that use them, and
// returns every statement reached with the parameters it waits for. A
// statement is visited again only when what it waits for grows, at most
// once per parameter, so a long chain costs its length.
func spread(seeds []seed, users map[string][]*Statement) map[*Statement][]string {
	rests := map[*Statement][]string{}
	queue := seeds
	for len(queue) > 0 {
		sd := queue[0]
		queue = queue[1:]
		for _, u := range users[sd.name] {
			merged := mergeNames(rests[u], sd.params)
			if len(merged) == len(rests[u]) {
				continue
			}
			rests[u] = merged
			if u.Name != "" {
				queue = append(queue, seed{u.Name, merged})
			}
		}
	}
	return rests
}

// seed is a name left out, with the parameters it waits for.
type seed struct {
	name   string
	params []string
}

// leftOutSeeds finds the unset optional parameters of an instance and the
// statements its inner instances left out, renamed into this instance;
// inner is those inner parts as parts of this instance.
func (x *expander) leftOutSeeds(use *Statement, body []*Statement) (seeds []seed, inner []LeftOut) {
	prefix := use.Name + "."
	for _, st := range body {
		switch {
		case st.Kind == Param && st.Optional && st.Expr == nil && st.Use == use:
			seeds = append(seeds, seed{st.Name, []string{strings.TrimPrefix(st.Name, prefix)}})
		case st.Kind == Use && st.Use == use && st.Parts != nil:
			in := strings.TrimPrefix(st.Name, prefix) + "."
			for _, lo := range st.Parts.LeftOut {
				ps := make([]string, len(lo.Params))
				for i, p := range lo.Params {
					ps[i] = in + p
				}
				for _, l := range lo.Statements {
					l.Instance = prefix + l.Instance
					if l.Name != "" {
						l.Name = prefix + l.Name
						seeds = append(seeds, seed{l.Name, ps})
					}
					inner = addLeftOut(inner, ps, l)
				}
			}
		}
	}
	return seeds, inner
}

// recordLeftOut keeps the names of a use of the sheet itself that were
// left out, for the error at a statement that names one.
func (x *expander) recordLeftOut(use *Statement, seeds []seed, rests map[*Statement][]string) {
	s := x.sheet
	if s.leftOut == nil {
		s.leftOut = map[string]*leftOutName{}
	}
	for _, sd := range seeds {
		s.leftOut[sd.name] = &leftOutName{use, sd.params}
	}
	for st, ps := range rests {
		if st.Name != "" {
			s.leftOut[st.Name] = &leftOutName{use, ps}
		}
	}
}

// addLeftOut files a statement under the part of its parameters. Parts
// that share a parameter are one part: the no-load test of a motor is
// one part, though its EMF rests on two of its inputs and its speed on
// the third. Statements keep the order they are filed in.
func addLeftOut(groups []LeftOut, params []string, st *Statement) []LeftOut {
	first := -1
	for i := 0; i < len(groups); i++ {
		if !sharesName(groups[i].Params, params) {
			continue
		}
		if first < 0 {
			first = i
			continue
		}
		// st joins two parts into one.
		g := &groups[first]
		g.Params = mergeNames(g.Params, groups[i].Params)
		g.Statements = append(g.Statements, groups[i].Statements...)
		groups = slices.Delete(groups, i, i+1)
		i--
	}
	if first < 0 {
		return append(groups, LeftOut{Params: params, Statements: []*Statement{st}})
	}
	g := &groups[first]
	g.Params = mergeNames(g.Params, params)
	g.Statements = append(g.Statements, st)
	return groups
}

func sharesName(a, b []string) bool {
	for _, x := range a {
		if slices.Contains(b, x) {
			return true
		}
	}
	return false
}

// mergeNames returns the sorted union of two sorted lists of names.
func mergeNames(a, b []string) []string {
	out := append(append([]string{}, a...), b...)
	slices.Sort(out)
	return slices.Compact(out)
}

// leftOutError is the error at a name the sheet uses that an instance
// left out, or nil for a name no instance left out.
func (s *Calc) leftOutError(r *Ref) *diag.Diagnostic {
	lo := s.leftOut[r.Name]
	if lo == nil {
		return nil
	}
	with := strings.Join(lo.params, " = ..., ") + " = ..."
	verb := "is"
	if len(lo.params) > 1 {
		verb = "are"
	}
	return errAt(r.Pos(), fmt.Sprintf("set it in the use statement at %d:%d, after with: %s", lo.use.Pos.Line, lo.use.Pos.Col, with),
		"%s is not evaluated: instance %s leaves it out because %s %s not set", r.Name, lo.use.Name, lo.inputs(), verb)
}

// inputs names the unset inputs: "the optional input V_i of t/parts".
func (lo *leftOutName) inputs() string {
	if len(lo.params) == 1 {
		return "the optional input " + lo.params[0] + " of " + lo.use.Template
	}
	return "the optional inputs " + strings.Join(lo.params, ", ") + " of " + lo.use.Template
}
