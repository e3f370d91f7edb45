package engine

import "slices"

// KeptDefault is a template default an instance kept, not set by its use
// statement, that checks of the sheet rest on: a pass or a failure turns
// on a value the using sheet did not write.
type KeptDefault struct {
	// Use is the use statement of the sheet itself that brought the
	// default in, through nested instances.
	Use *Statement
	// Default is the template's input, with its value and its source.
	Default *Statement
	// First is the first check, in the order written, that rests on it;
	// Checks counts every check that does.
	First  *Statement
	Checks int
}

// KeptDefaults lists the template defaults that evaluated checks of the
// sheet rest on, use by use in the order the checks first reach them. The
// page lists them under each use; the audit reports those recalled from
// memory.
func (s *Calc) KeptDefaults() []KeptDefault {
	var out []KeptDefault
	at := map[*Statement]int{}
	for _, st := range s.Statements {
		if st.Kind != Check {
			continue
		}
		if r := s.Result(st); r.Status != Pass && r.Status != Fail {
			continue
		}
		inputs, _ := s.RestsOn(st)
		for _, in := range inputs {
			use := TopUse(in)
			if use == nil || in.Overridden || in.Kind == Take {
				continue
			}
			i, seen := at[in]
			if !seen {
				i = len(out)
				at[in] = i
				out = append(out, KeptDefault{Use: use, Default: in, First: st})
			}
			out[i].Checks++
		}
	}
	// Group by use, keeping the order in which each use is first reached.
	rank := map[*Statement]int{}
	for _, k := range out {
		if _, ok := rank[k.Use]; !ok {
			rank[k.Use] = len(rank)
		}
	}
	slices.SortStableFunc(out, func(a, b KeptDefault) int { return rank[a.Use] - rank[b.Use] })
	return out
}

// KeptDefaultsOf is KeptDefaults for one use statement of the sheet,
// worked out for every use at once the first time an evaluated sheet is
// asked, so that a page of many instances costs one walk.
func (s *Calc) KeptDefaultsOf(use *Statement) []KeptDefault {
	s.keptMu.Lock()
	defer s.keptMu.Unlock()
	if s.kept != nil {
		return s.kept[use]
	}
	byUse := map[*Statement][]KeptDefault{}
	for _, k := range s.KeptDefaults() {
		byUse[k.Use] = append(byUse[k.Use], k)
	}
	if s.results != nil {
		s.kept = byUse // results are fixed once evaluated
	}
	return byUse[use]
}

// TopUse is the use statement of the sheet itself that brought a
// template's statement in, through nested instances; nil for a statement
// of the sheet's own.
func TopUse(st *Statement) *Statement {
	u := st.Use
	for u != nil && u.Use != nil {
		u = u.Use
	}
	return u
}
