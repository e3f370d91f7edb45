package audit

import (
	"fmt"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// toleranceFailures reports the checks that hold as the sheet is written
// but fail somewhere within the tolerances of their inputs: a pass that
// the parts as made need not keep.
func toleranceFailures(s *project.Sheet) []Finding {
	sp := s.Conditions.SpreadOf()
	if sp == nil {
		return nil
	}
	var out []Finding
	for _, c := range sp.Checks {
		if s.Calc.Result(c.Stmt).Status != engine.Pass || c.Worst.Status != engine.Fail {
			continue
		}
		var moves []string
		for _, r := range c.Ranking[:min(3, len(c.Ranking))] {
			moves = append(moves, fmt.Sprintf("%s (%s %%)", r.Input.Name, units.FormatNumber(r.Share*100, 2)))
		}
		out = append(out, finding("fails-within-tolerance", c.Stmt.Pos, "check "+c.Stmt.Formula,
			"check %s holds as written but fails at the worst combination of its inputs' tolerances (found by %s); the Monte Carlo share of failures is %s %% (95 %%: %s–%s %%) in %d samples; the inputs that move it most: %s; tighten those tolerances or give the design more margin, or accept it with the reason",
			c.Stmt.Formula, c.Method, pct(c.Fail), pct(c.FailLo), pct(c.FailHi), sp.Samples, strings.Join(moves, ", ")).in(s, c.Stmt))
	}
	return out
}

func pct(p float64) string { return units.FormatNumber(p*100, 2) }

// unevaluatedCases reports the checks that could not be worked out in a
// load case of the sheet: the case where the check governs may be the
// one not seen.
func unevaluatedCases(s *project.Sheet) []Finding {
	r := s.Conditions
	if r == nil {
		return nil
	}
	var out []Finding
	for _, st := range s.Calc.Statements {
		if _, ok := r.Governing(st); !ok {
			continue
		}
		var missed []string
		for _, c := range r.Cases {
			if res := c.Results[st.Index]; res.Status != engine.Pass && res.Status != engine.Fail {
				missed = append(missed, c.Stmt.Name)
			}
		}
		if len(missed) > 0 {
			out = append(out, finding("case-not-evaluated", st.Pos, "check "+st.Formula,
				"check %s could not be worked out in case %s, so its governing case is not known; fix what the case makes fail (its page shows the error), or take the case out",
				st.Formula, strings.Join(missed, ", ")).in(s, st))
		}
	}
	return out
}
