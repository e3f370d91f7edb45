package render

import (
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/revdiff"
	"github.com/sheaf-calc/sheaf/units"
)

// diffLabels name the kinds of change for people.
var diffLabels = map[revdiff.Kind]string{
	revdiff.SheetAdded: "sheet added", revdiff.SheetRemoved: "sheet removed",
	revdiff.InputChanged: "input changed", revdiff.InputAdded: "input added", revdiff.InputRemoved: "input removed",
	revdiff.FormulaChanged: "formula changed", revdiff.ResultAdded: "result added", revdiff.ResultRemoved: "result removed",
	revdiff.ResultMoved: "result moved", revdiff.CheckFlipped: "check flipped", revdiff.CheckAdded: "check added",
	revdiff.CheckRemoved: "check removed", revdiff.StatusChanged: "now fails to evaluate",
	revdiff.InstanceAdded: "instance added", revdiff.InstanceRemoved: "instance removed", revdiff.TemplateChanged: "template changed",
	revdiff.CaseAdded: "case added", revdiff.CaseRemoved: "case removed", revdiff.CaseChanged: "case changed",
	revdiff.ToleranceChanged: "tolerance changed",
}

// DiffLabel names a kind of change.
func DiffLabel(k revdiff.Kind) string { return diffLabels[k] }

// outcomeText says what a statement came to: a value, a verdict with its
// utilisation, or an error.
func outcomeText(st *engine.Statement, r engine.Result, digits int) string {
	if st == nil {
		return "—"
	}
	if st.Kind == engine.Use {
		return "use of " + st.Template
	}
	switch r.Status {
	case engine.OK:
		if st.IsInput() {
			v, u := InputText(st)
			return strings.TrimSpace(v + " " + u)
		}
		return ValueText(r.Value, r.Shown, r.Digits(digits))
	case engine.Pass, engine.Fail:
		s := strings.ToUpper(r.Status.String())
		if u := UtilisationText(r.Utilisation); u != "" {
			s += " (" + u + ")"
		}
		return s
	}
	return r.Status.String()
}

// relText writes a relative change as a signed percentage.
func relText(rel float64) string {
	switch {
	case math.IsNaN(rel):
		return ""
	case math.IsInf(rel, 0):
		return "from zero"
	}
	s := units.FormatNumber(rel*100, 3) + " %"
	if rel > 0 {
		s = "+" + s
	}
	return s
}

func diffSubject(c revdiff.Change) string {
	s := subjectOf(c)
	if c.Case != "" {
		s += " in case " + c.Case
	}
	return s
}

func subjectOf(c revdiff.Change) string {
	if c.Name == "" {
		return ""
	}
	switch c.Kind {
	case revdiff.CaseAdded, revdiff.CaseRemoved, revdiff.CaseChanged:
		return "case " + c.Name
	}
	if c.Kind == revdiff.CheckFlipped || c.Kind == revdiff.CheckAdded || c.Kind == revdiff.CheckRemoved ||
		(c.New != nil && c.New.Kind == engine.Check) || (c.Old != nil && c.Old.Kind == engine.Check) {
		return "check " + c.Name
	}
	return SymbolText(c.Name)
}

// conditionSides is what a changed case or tolerance reads on either
// side; ok is false for other changes.
func conditionSides(c revdiff.Change) (before, after string, ok bool) {
	side := func(st *engine.Statement) string {
		switch {
		case st == nil:
			return "—"
		case c.Kind != revdiff.ToleranceChanged:
			return st.Formula
		case st.Tol == nil:
			return st.Formula + ", no tolerance"
		}
		return st.Formula + " " + st.Tol.Text
	}
	switch c.Kind {
	case revdiff.CaseAdded, revdiff.CaseRemoved, revdiff.CaseChanged, revdiff.ToleranceChanged:
		return side(c.Old), side(c.New), true
	}
	return "", "", false
}

// formulaOf is what a changed formula reads on one side.
func formulaOf(st *engine.Statement) string {
	if st == nil {
		return "—"
	}
	if st.DisplayText != "" {
		return "[" + st.DisplayText + "] " + st.Formula
	}
	return st.Formula
}

// DiffTerminal writes a revision diff as text, one change a line, grouped
// by sheet, with file:line.
func DiffTerminal(r revdiff.Report, oldPkg, newPkg *project.Package, oldName, newName string, opt Options, w io.Writer) {
	digitsOf := sheetDigits(oldPkg, newPkg, opt.Digits)
	fmt.Fprintf(w, "changes from %s to %s (results that moved by more than %s)\n", oldName, newName, relTextAbs(r.Threshold))
	sheet := ""
	for _, c := range r.Changes {
		if c.Sheet != sheet {
			sheet = c.Sheet
			fmt.Fprintf(w, "\n%s\n", sheet)
		}
		pos := c.Pos()
		where := ""
		if pos.Line > 0 {
			where = fmt.Sprintf("%s:%d", pos.File, pos.Line)
		}
		line := fmt.Sprintf("  %-16s %s", DiffLabel(c.Kind), diffSubject(c))
		d := digitsOf(c.Sheet)
		switch c.Kind {
		case revdiff.CaseAdded, revdiff.CaseRemoved, revdiff.CaseChanged, revdiff.ToleranceChanged:
			b, a, _ := conditionSides(c)
			line += fmt.Sprintf(": %s → %s", b, a)
		case revdiff.FormulaChanged:
			line += fmt.Sprintf(": %s → %s", formulaOf(c.Old), formulaOf(c.New))
			if c.Old != nil && c.New != nil && c.Old.Kind == engine.Definition {
				line += fmt.Sprintf("  (%s → %s)", outcomeText(c.Old, c.OldResult, d), outcomeText(c.New, c.NewResult, d))
			}
		case revdiff.InputChanged, revdiff.ResultMoved, revdiff.CheckFlipped, revdiff.StatusChanged,
			revdiff.InputAdded, revdiff.InputRemoved, revdiff.ResultAdded, revdiff.ResultRemoved, revdiff.CheckAdded, revdiff.CheckRemoved:
			line += fmt.Sprintf(": %s → %s", outcomeText(c.Old, c.OldResult, d), outcomeText(c.New, c.NewResult, d))
			if rt := relText(c.Rel); rt != "" && c.Rel != 0 {
				line += "  (" + rt + ")"
			}
		}
		if where != "" {
			line += "  " + where
		}
		fmt.Fprintln(w, line)
	}
	counts := []string{}
	for _, k := range []revdiff.Kind{revdiff.InputChanged, revdiff.FormulaChanged, revdiff.ResultMoved, revdiff.CheckFlipped} {
		counts = append(counts, fmt.Sprintf("%d %s", r.Count(k), DiffLabel(k)))
	}
	fmt.Fprintf(w, "\n%s; %d changes in all\n", strings.Join(counts, ", "), len(r.Changes))
}

// sheetDigits gives each sheet's significant figures in a diff: the new
// revision's front matter, else the old one's, else def.
func sheetDigits(oldPkg, newPkg *project.Package, def int) func(string) int {
	set := map[string]int{}
	for _, pkg := range []*project.Package{oldPkg, newPkg} {
		for _, s := range pkg.Sheets {
			set[s.Path()] = s.Digits(def)
		}
	}
	return func(sheet string) int {
		if d, ok := set[sheet]; ok {
			return d
		}
		if def > 0 {
			return def
		}
		return project.DefaultDigits
	}
}

func relTextAbs(t float64) string { return units.FormatNumber(t*100, 2) + " %" }

// DiffHTML renders a revision diff as one self-contained page that marks
// each change.
func DiffHTML(r revdiff.Report, oldPkg, newPkg *project.Package, oldName, newName string, opt Options) []byte {
	p := &page{}
	digitsOf := sheetDigits(oldPkg, newPkg, opt.Digits)
	fr := packageFrame(newPkg, opt)
	fr.pages = nil
	fr.title = "Changes — " + packageTitle(newPkg)
	fr.block = titleBlock{kicker: packageTitle(newPkg), heading: "Changes between revisions",
		fields: [][2]string{{"From", oldName}, {"To", newName}, {"Threshold", relTextAbs(r.Threshold)}}}
	p.open(fr, opt.Version)
	p.f("<section class=\"status\"><p>")
	for i, k := range []revdiff.Kind{revdiff.InputChanged, revdiff.FormulaChanged, revdiff.ResultMoved, revdiff.CheckFlipped} {
		if i > 0 {
			p.f(" · ")
		}
		p.f("<strong>%d</strong> %s", r.Count(k), esc(DiffLabel(k)))
	}
	p.f(" · %d changes in all</p>\n<p class=\"loc\">From %s (stamp %s) to %s (stamp %s).</p></section>\n",
		len(r.Changes), esc(oldName), esc(project.StampOf(oldPkg.Files, opt.Version)), esc(newName), esc(project.StampOf(newPkg.Files, opt.Version)))
	if len(r.Changes) == 0 {
		p.f("<p>No differences.</p>\n")
	}
	sheet := ""
	for _, c := range r.Changes {
		if c.Sheet != sheet {
			if sheet != "" {
				p.f("</tbody>\n</table>\n")
			}
			sheet = c.Sheet
			p.f("<h2>%s</h2>\n<table class=\"diff\">\n<thead><tr><th>Change</th><th>Statement</th><th>Before</th><th>After</th><th>Moved</th><th>Line</th></tr></thead>\n<tbody>\n", esc(sheet))
		}
		d := digitsOf(c.Sheet)
		before, after := outcomeText(c.Old, c.OldResult, d), outcomeText(c.New, c.NewResult, d)
		if c.Kind == revdiff.FormulaChanged {
			before, after = formulaOf(c.Old)+" = "+before, formulaOf(c.New)+" = "+after
		}
		if b, a, ok := conditionSides(c); ok {
			before, after = b, a
		}
		moved := ""
		if c.Rel != 0 {
			moved = relText(c.Rel)
		}
		line := ""
		if pos := c.Pos(); pos.Line > 0 {
			line = fmt.Sprint(pos.Line)
		}
		p.f("<tr class=\"%s\"><td><span class=\"kind\">%s</span></td><td>%s</td><td><del>%s</del></td><td><ins>%s</ins></td><td class=\"num\">%s</td><td class=\"loc\">%s</td></tr>\n",
			esc(string(c.Kind)), esc(DiffLabel(c.Kind)), esc(diffSubject(c)), esc(before), esc(after), esc(moved), line)
	}
	if sheet != "" {
		p.f("</tbody>\n</table>\n")
	}
	p.close(opt.Version, "Revision changes.")
	return p.Bytes()
}
