package render

import (
	"fmt"
	"io"
	"strings"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// Terminal writes a plain-text report of every result and check to out,
// and every diagnostic as file:line:col: message to errs.
func Terminal(pkg *project.Package, opt Options, out, errs io.Writer) {
	for _, s := range pkg.Sheets {
		digits := s.Digits(opt.Digits)
		fmt.Fprintf(out, "%s — %s\n", s.Path(), s.Title())
		for _, st := range s.Calc.Statements {
			line := sheetLine(s, st, digits)
			if line == "" {
				continue
			}
			line += conditionsNote(s, st)
			if st.Instance != "" {
				// From a template: indented under its use statement.
				fmt.Fprintf(out, "          %s\n", line)
				continue
			}
			fmt.Fprintf(out, "  %4d  %s\n", st.Pos.Line, line)
			if st.Kind == engine.Use && st.Parts != nil {
				for _, lo := range st.Parts.LeftOut {
					fmt.Fprintf(out, "          %s\n", LeftOutLine(lo))
				}
			}
		}
		fmt.Fprintln(out)
	}
	WriteDiagnostics(pkg, errs)
	fmt.Fprintln(out, Summary(pkg))
}

// WriteDiagnostics writes every diagnostic as file:line:col: message, with
// the source line and carets under what it is about.
func WriteDiagnostics(pkg *project.Package, errs io.Writer) {
	sources := map[string][]byte{}
	for _, s := range pkg.Sheets {
		sources[s.Path()] = s.Doc.Source
	}
	for _, s := range pkg.Templates {
		sources[s.Path] = s.Source
	}
	for _, d := range pkg.DataFiles() {
		sources[d.Path] = d.Data
	}
	for _, d := range pkg.Diags {
		fmt.Fprintln(errs, d.Error())
		fmt.Fprint(errs, d.Snippet(sources[d.Pos.File]))
	}
}

// Summary states a package's outcome in one line: "5 sheets, 102 results,
// 12 checks: 12 pass, 0 fail; 0 errors".
func Summary(pkg *project.Package) string {
	c := pkg.Counts()
	s := fmt.Sprintf("%s, %s, %s: %s; %s", Count(len(pkg.Sheets), "sheet"), Count(c.Results, "result"),
		Count(c.Checks(), "check"), checkCounts(c), Count(c.Errors, "error"))
	if c.Blocked > 0 {
		s += fmt.Sprintf("; %d not evaluated", c.Blocked)
	}
	return s
}

// Count writes a number with a noun, singular or plural: "1 error",
// "3 errors".
func Count(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

// TerminalLine writes one statement's outcome as a line of text.
func TerminalLine(st *engine.Statement, r engine.Result, digits int) string {
	if line, ok := conditionLine(st, r); ok {
		return line
	}
	if st.Kind == engine.Use && r.Status == engine.OK {
		return fmt.Sprintf("use %s = %s", st.Name, strings.Join(strings.Fields(st.Formula), " "))
	}
	if st.Kind == engine.FunctionDef && r.Status != engine.Errored {
		return fmt.Sprintf("%s(%s) = %s", SymbolText(st.Name), strings.Join(st.Params, ", "), strings.Join(strings.Fields(st.Formula), " "))
	}
	switch r.Status {
	case engine.OK:
		if r, ok := st.Expr.(*engine.Ref); ok && r.Target != nil && r.Target.IsInput() && sameUnit(st.Display, r.Target) {
			// A name that only passes an input on reads as that input.
			v, u := InputText(r.Target)
			if units.SpaceBefore(u) && u != "" {
				v += " "
			}
			return fmt.Sprintf("%s = %s%s", SymbolText(st.Name), v, u)
		}
		if st.IsInput() {
			v, u := InputText(st)
			if units.SpaceBefore(u) && u != "" {
				v += " "
			}
			if shownConverted(st) {
				u += " = " + ValueText(r.Value, r.Shown, r.Digits(digits))
			}
			return fmt.Sprintf("%s = %s%s", SymbolText(st.Name), v, u)
		}
		if r.Phasor != nil {
			return fmt.Sprintf("%s = %s", SymbolText(st.Name), PhasorText(r, digits))
		}
		return fmt.Sprintf("%s = %s", SymbolText(st.Name), resultText(r, digits))
	case engine.Pass, engine.Fail:
		cmp := st.Compare()
		verdict := "PASS"
		if r.Status == engine.Fail {
			verdict = "FAIL"
		}
		s := fmt.Sprintf("%s  %s%s  (%s %s %s", verdict, instancePrefix(st), st.Formula,
			ValueText(r.Left, r.Shown, digits), relations[cmp.Op], ValueText(r.Right, r.Shown, digits))
		if u := UtilisationText(r.Utilisation); u != "" {
			s += ", utilisation " + u
		}
		return s + ")"
	case engine.Blocked:
		name := st.Name
		if st.Kind == engine.Check {
			name = "check"
		}
		return fmt.Sprintf("%s: %s", name, r.Err.Message)
	case engine.Errored:
		name := st.Name
		if name == "" {
			name = "statement"
		}
		return fmt.Sprintf("%s: error (see below)", name)
	}
	return ""
}

// ValueText writes an SI value in a unit: "34.74 mWb".
func ValueText(si float64, u units.Unit, digits int) string {
	s := units.FormatNumber(u.FromSI(si), digits)
	if u.Symbol != "" && u.Symbol != "1" {
		if units.SpaceBefore(u.Symbol) {
			s += " "
		}
		s += u.Symbol
	}
	return s
}

// instancePrefix names the instance a statement comes from: "c1: ".
func instancePrefix(st *engine.Statement) string {
	if st.Instance == "" {
		return ""
	}
	return st.Instance + ": "
}

// shownConverted reports whether an input has a display unit other than
// the one it was written in, so that it shows in both: B [T] = 12 kG.
func shownConverted(st *engine.Statement) bool {
	return st.IsInput() && !sameUnit(st.Display, st)
}

// sameUnit reports whether a display unit (nil for none) shows an input the
// way it was written.
func sameUnit(display *units.Unit, input *engine.Statement) bool {
	if display == nil {
		return true
	}
	_, u := InputText(input)
	return display.Symbol == u || (display.Symbol == "1" && u == "")
}

// AuditTerminal writes the audit's findings one a line, file:line:col:
// [code] message, the accepted ones too when all is set, and a count.
func AuditTerminal(r audit.Report, all bool, w io.Writer) {
	for _, f := range r.Findings {
		if f.Accepted && !all {
			continue
		}
		line := fmt.Sprintf("%s: [%s] %s", f.Pos, f.Code, f.Message)
		if f.Accepted {
			line += " (accepted: " + f.Reason + ")"
		}
		fmt.Fprintln(w, line)
	}
	fmt.Fprintf(w, "%s open, %d accepted\n", Count(r.Open(), "finding"), len(r.Findings)-r.Open())
}

// LeftOutLine says in one line what part of an instance was left out:
// "not evaluated, PDIV_pp not set: ins.m_PD, check m_PD >= EF".
func LeftOutLine(lo engine.LeftOut) string {
	var what []string
	for _, st := range lo.Statements {
		if st.Kind == engine.Check {
			what = append(what, "check "+st.Formula)
		} else {
			what = append(what, st.Name)
		}
	}
	return "not evaluated, " + strings.Join(lo.Params, ", ") + " not set: " + strings.Join(what, ", ")
}
