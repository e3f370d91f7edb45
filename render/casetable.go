package render

import (
	"math"
	"slices"
	"strings"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// caseColumn is one condition of a table of cases: its name and the
// statement's result there.
type caseColumn struct {
	head string
	res  engine.Result
	gov  bool // the governing condition of a check
}

// caseColumns are a statement's results as written and in each case of
// the sheet, or nil when the sheet has no cases or the statement comes
// out the same in every one.
func caseColumns(s *project.Sheet, st *engine.Statement) []caseColumn {
	if s.Conditions == nil || len(s.Conditions.Cases) == 0 {
		return nil
	}
	cols := []caseColumn{{head: "as written", res: asWritten(s, st)}}
	g, governed := s.Conditions.Governing(st)
	cols[0].gov = governed && g.Case == nil && g.Sweep == nil
	differs := false
	for _, c := range s.Conditions.Cases {
		if st.Index >= len(c.Results) {
			return nil
		}
		r := c.Results[st.Index]
		differs = differs || !sameOutcome(r, cols[0].res)
		cols = append(cols, caseColumn{head: "case " + c.Stmt.Name, res: r, gov: governed && g.Case == c.Stmt})
	}
	if !differs {
		return nil
	}
	return cols
}

// sameOutcome reports whether two results of a statement show the same.
func sameOutcome(a, b engine.Result) bool {
	return a.Status == b.Status && sameFloat(a.Value, b.Value) && sameFloat(a.Left, b.Left) && sameFloat(a.Right, b.Right) &&
		slices.EqualFunc(a.List, b.List, sameFloat) && (a.Phasor == nil) == (b.Phasor == nil) && (a.Phasor == nil || *a.Phasor == *b.Phasor)
}

func sameFloat(a, b float64) bool { return a == b || math.IsNaN(a) && math.IsNaN(b) }

// writeCaseTable writes beside a statement that its sheet's cases move a
// table with one column per condition: a value in the statement's shown
// unit; for a check its two sides, its utilisation and its verdict, the
// governing condition marked.
func writeCaseTable(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	cols := caseColumns(s, st)
	if cols == nil {
		return
	}
	w.WriteString("<div class=\"scroll casetable\"><table class=\"cases\">\n<thead><tr><th></th>")
	for _, c := range cols {
		if c.gov {
			w.WriteString(`<th class="gov">` + esc(c.head) + ` <span class="govmark">governs</span></th>`)
		} else {
			w.WriteString("<th>" + esc(c.head) + "</th>")
		}
	}
	w.WriteString("</tr></thead>\n<tbody>\n")
	shown := cols[0].res.Shown
	if st.Kind != engine.Check {
		caseRow(w, symbolHTML(st.Name), cols, func(r engine.Result) string {
			r.Shown = shown
			switch {
			case r.Phasor != nil:
				return PhasorText(r, digits)
			case r.List != nil:
				return ListText(r, digits)
			}
			return ValueText(r.Value, shown, r.Digits(digits))
		})
	} else {
		cmp := st.Compare()
		calc := s.Calc
		caseRow(w, "<math>"+formulaML(calc, cmp.X, symbolic, digits)+"</math>", cols, func(r engine.Result) string { return ValueText(r.Left, shown, digits) })
		caseRow(w, "<math>"+formulaML(calc, cmp.Y, symbolic, digits)+"</math>", cols, func(r engine.Result) string { return ValueText(r.Right, shown, digits) })
		caseRow(w, "demand / capacity", cols, func(r engine.Result) string {
			if u := UtilisationText(r.Utilisation); u != "" {
				return u
			}
			return "—"
		})
		caseRow(w, "verdict", cols, func(r engine.Result) string { return Verdict(r.Status) })
	}
	w.WriteString("</tbody>\n</table></div>\n")
}

// caseRow writes one row of a table of cases: a heading (HTML) and each
// condition's cell, the text that cell gives for a result that has a
// value, and why not for one that has none.
func caseRow(w sink, head string, cols []caseColumn, cell func(engine.Result) string) {
	w.WriteString("<tr><th>" + head + "</th>")
	for _, c := range cols {
		cls := "num"
		if c.gov {
			cls += " gov"
		}
		if c.res.Status == engine.Fail {
			cls += " short"
		}
		text := ""
		switch c.res.Status {
		case engine.OK, engine.Pass, engine.Fail:
			text = cell(c.res)
		case engine.Blocked:
			text = "not evaluated"
		default:
			text = "error"
		}
		w.WriteString(`<td class="` + cls + `">` + esc(text) + "</td>")
	}
	w.WriteString("</tr>\n")
}

// writeGoverning writes under a check's relation where it governs: the
// condition it comes out worst in, how many conditions it was worked out
// in, and those it fails in.
func writeGoverning(w sink, s *project.Sheet, st *engine.Statement) {
	g, ok := s.Conditions.Governing(st)
	if !ok || g.Case == nil && g.Sweep == nil && !movedByConditions(s, st) {
		return // a check no condition moves: as written is all there is to say
	}
	w.WriteString("<p class=\"governs\"><span class=\"kw\">governs:</span> " + governLink(g) + " · worked out in " + Count(g.Evaluated, "condition") + " · ")
	if len(g.Failing) == 0 {
		w.WriteString("holds in every one")
	} else {
		w.WriteString("<span class=\"short\">fails in: " + esc(strings.Join(g.Failing, ", ")) + "</span>")
	}
	w.WriteString("</p>\n")
}

// governLink names a governing condition, linked to its case or sweep.
func governLink(g conditions.Governing) string {
	switch {
	case g.Case != nil:
		return `<a href="#` + anchor(g.Case) + `">` + esc(g.Where) + "</a>"
	case g.Sweep != nil:
		return `<a href="#` + anchor(g.Sweep.Stmt) + `">` + esc(g.Where) + "</a>"
	}
	return esc(g.Where)
}

// movedByConditions reports whether a check comes out otherwise in a case
// or rests on a swept input.
func movedByConditions(s *project.Sheet, st *engine.Statement) bool {
	if caseColumns(s, st) != nil {
		return true
	}
	for i := range s.Conditions.Sweeps {
		for _, chk := range s.Conditions.Sweeps[i].Checks {
			if chk.Stmt == st {
				return true
			}
		}
	}
	return false
}
