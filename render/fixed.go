package render

import (
	"fmt"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// verdictOf is the stamp and class a check is shown with on a page:
// holds, not met, or fixed for a check whose outcome cannot depend on its
// inputs, which is neither a pass nor a failure.
func verdictOf(s *project.Sheet, st *engine.Statement, r engine.Result) (verdict, class string) {
	if fixed, _ := s.Fixed(st); fixed {
		return "fixed", "fixed"
	}
	if r.Status == engine.Fail {
		return Verdict(r.Status), "fail"
	}
	return Verdict(r.Status), "pass"
}

// fixedNote says why a fixed check is not counted, or "" for a check that
// is not fixed.
func fixedNote(s *project.Sheet, st *engine.Statement) string {
	fixed, holds := s.Fixed(st)
	switch {
	case !fixed:
		return ""
	case holds:
		return "fixed: holds whatever its inputs are (an identity or a fixed ratio), so it proves nothing about the design and is not counted as a pass; show it as a result, or check it against an independent quantity"
	}
	return "fixed: fails whatever its inputs are, so it says nothing about the design and is not counted as a failure; the sheet's algebra is wrong"
}

// fixedChecks lists a sheet's fixed checks, for a table of their own.
func fixedChecks(s *project.Sheet, page, sheet string, digits int) []checkRow {
	var out []checkRow
	for _, st := range s.Calc.Statements {
		if r := s.Calc.Result(st); r.Status == engine.Pass || r.Status == engine.Fail {
			if fixed, _ := s.Fixed(st); fixed {
				out = append(out, checkRow{st: st, r: r, page: page, sheet: sheet, digits: digits, fixed: true})
			}
		}
	}
	return out
}

// fixedSection lists fixed checks apart from the checks that count.
func fixedSection(p *page, rows []checkRow, sheetCol bool) {
	if len(rows) == 0 {
		return
	}
	fixedHead(p)
	checksTable(p, rows, sheetCol)
}

// fixedHead is the heading and the note above a table of fixed checks.
func fixedHead(p *page) {
	p.f("<h3>Fixed checks: not counted</h3>\n<p>These checks cannot fail (or cannot pass): their outcome did not move when every input they rest on was varied. They prove nothing about the design.</p>\n")
}

// checkCounts writes a tally's checks: "10 pass, 1 fail", with the fixed
// checks apart when there are any.
func checkCounts(c project.Counts) string {
	s := fmt.Sprintf("%d pass, %d fail", c.Pass, c.Fail)
	if c.Fixed > 0 {
		s += fmt.Sprintf(", %d fixed (not counted)", c.Fixed)
	}
	return s
}

// utilisationCell is what a table of checks shows for a check's margin:
// nothing for a fixed check, the place in the band for one side of a
// tolerance band, else the utilisation.
func utilisationCell(c checkRow) string {
	switch {
	case c.fixed:
		return "fixed"
	case c.band != "":
		return c.band
	}
	return UtilisationText(c.r.Utilisation)
}

// sheetLine is a statement's terminal line with what only the sheet
// knows: FIXED for a fixed check, and the place in its band for one side
// of a tolerance band.
func sheetLine(s *project.Sheet, st *engine.Statement, digits int) string {
	r := s.Calc.Result(st)
	line := TerminalLine(st, r, digits)
	if r.Status != engine.Pass && r.Status != engine.Fail {
		return line
	}
	if fixed, _ := s.Fixed(st); fixed {
		verdict := "PASS"
		if r.Status == engine.Fail {
			verdict = "FAIL"
		}
		if u := UtilisationText(r.Utilisation); u != "" {
			line = strings.Replace(line, ", utilisation "+u+")", ")", 1) // a margin that cannot move
		}
		return "FIXED" + strings.TrimPrefix(line, verdict) + " — cannot fail, not counted"
	}
	if b := BandText(s, st, digits); b != "" {
		// The place in the band replaces the utilisation, which is near
		// 100 % on both sides of a narrow band wherever the value sits.
		if u := UtilisationText(r.Utilisation); u != "" {
			line = strings.Replace(line, ", utilisation "+u+")", ")", 1)
		}
		line += " — " + b
	}
	return line
}
