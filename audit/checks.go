package audit

import (
	"fmt"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// fixedChecks reports the checks of a sheet whose outcome cannot depend on
// their inputs: they look like assurance and give none.
func fixedChecks(s *project.Sheet) []Finding {
	var out []Finding
	for _, st := range s.Calc.Statements {
		fixed, holds := s.Fixed(st)
		if !fixed {
			continue
		}
		name := "check " + st.Formula
		how := "holds whatever its inputs are"
		if !holds {
			how = "fails whatever its inputs are"
		}
		out = append(out, finding("fixed-check", st.Pos, name,
			"%s %s: its sides kept their ratio or their difference when every input it rests on was varied; show it as a result, or check against an independent quantity",
			name, how).in(s, st))
	}
	return out
}

// recalledDefaults reports the template defaults recalled from memory
// that checks of the sheet rest on: the using sheet has not confirmed
// them, yet a pass or a failure turns on them. They are reported at the
// use statement of the sheet that brought them in, one finding per use
// naming every such default and the first check resting on it.
func recalledDefaults(s *project.Sheet) []Finding {
	var out []Finding
	kept := s.Calc.KeptDefaults()
	for i := 0; i < len(kept); {
		use := kept[i].Use
		var parts []string
		for ; i < len(kept) && kept[i].Use == use; i++ {
			k := kept[i]
			if !fromMemory(k.Default.Source) {
				continue
			}
			also := ""
			if k.Checks > 1 {
				also = " and " + plural(k.Checks-1, "other check")
			}
			parts = append(parts, fmt.Sprintf("%s = %s (source %q; under check %s%s)", k.Default.Name, literalText(k.Default.Expr), k.Default.Source, instanceName(k.First), also))
		}
		if len(parts) == 0 {
			continue
		}
		out = append(out, finding("recalled-default", use.Pos, use.Name,
			"checks rest on defaults of %s recalled from memory: %s; confirm each for this job and set it in the use statement, with its source",
			use.Template, strings.Join(parts, "; ")).in(s, use))
	}
	return out
}

// fromMemory reports whether a source says its value is recalled.
func fromMemory(source string) bool {
	return strings.Contains(strings.ToLower(source), "from memory")
}

func instanceName(st *engine.Statement) string {
	if st.Instance != "" {
		return st.Instance + ": " + st.Formula
	}
	return st.Formula
}

// plural writes a count with a noun: "1 other check", "2 other checks".
func plural(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

// BandEdge is the share of a tolerance band's width, from the edge a check
// guards, within which a passing side of the band is a thin margin: a
// value in the middle of a narrow band is not near its limit, however
// close to 100 % the utilisation of each side.
const BandEdge = 0.05

// bandMargins reports the sides of tolerance bands that pass with the
// value within BandEdge of the edge they guard.
func bandMargins(s *project.Sheet) []Finding {
	var out []Finding
	for _, st := range s.Calc.Statements {
		b, ok := s.Band(st)
		if !ok || s.Calc.Result(st).Status != engine.Pass {
			continue
		}
		if fixed, _ := s.Fixed(st); fixed {
			continue
		}
		pos := b.Position()
		from := pos // from the lower edge, for the check of the lower limit
		if st == b.High {
			from = 1 - pos
		}
		if from < BandEdge {
			name := "check " + st.Formula
			out = append(out, finding("thin-margin", st.Pos, name, "%s passes with the value at %.1f %% of its tolerance band, within %.0f %% of the edge", name, pos*100, BandEdge*100).in(s, st))
		}
	}
	return out
}
