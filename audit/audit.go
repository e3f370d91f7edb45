// Package audit reads a compiled calculation package the way a careful
// checker does and lists what deserves a second look: inputs without a
// source, numbers buried in formulas, checks against unnamed limits,
// results that read badly, inputs that disagree between sheets, thin
// margins and more. Every finding has a stable code, so that a firm can
// agree which findings may be accepted and record the acceptance, with its
// reason, in the sheet itself.
package audit

import (
	"fmt"
	"math"
	"path"
	"regexp"
	"slices"
	"sort"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// Rule describes one kind of finding.
type Rule struct {
	Code  string // stable: never renamed or reused
	Title string
	Why   string // what a checker would say, and how to resolve it
}

// Rules lists every finding sheaf's audit can report, in the order the
// README documents them.
var Rules = []Rule{
	{"no-source", "input without a source", "every input should say where it comes from: a drawing, a data sheet, a test report or a standard; add `; source: ...`"},
	{"no-description", "input without a description", "a checker should not have to guess what an input is; add a description after `;`"},
	{"open-source", "input whose source is still open", "a source marked TBC, TBD or to be confirmed is a hold point: confirm it before issue"},
	{"unused-input", "input that nothing uses", "an input no formula uses is a leftover or a formula that forgot it; delete it or use it"},
	{"unused-result", "undescribed result that nothing uses", "a result that nothing uses and that has no description is probably a leftover; describe it if it is a result of the sheet, or delete it"},
	{"buried-number", "number buried in a formula", "a factor such as 1.15 inside a formula hides an assumption; name it as an input with a source (small whole numbers, halves and quarters, and exponents are fine)"},
	{"buried-quantity", "quantity buried in a formula", "a value with a unit inside a formula is an input in disguise; name it as an input with a source"},
	{"check-literal", "check against an unnamed limit", "the limit a check compares against should be a named input with a source, so that the checker can trace it"},
	{"awkward-magnitude", "result that reads badly", "the number needs an exponent or the unit has no name; give the result a display unit such as [kV] or [mWb]"},
	{"inconsistent-input", "input that disagrees with another sheet", "the same name has another value in another sheet of the package; make them agree, or rename one"},
	{"hand-transfer", "input typed across from another sheet", "a number copied from another sheet of the package goes stale when that sheet changes; take the live result instead: take name = result from sheet"},
	{"thin-margin", "check within 5 % of its limit", "a pass with a utilisation above 95 % leaves little margin for the uncertainty of the inputs; confirm the margin is enough. A side of a tolerance band is judged by the band: within 5 % of the band's width from the edge it guards"},
	{"fixed-check", "check that cannot fail", "a check whose outcome did not move when every input it rests on was varied (an identity, a fixed ratio such as 4.44 against √2·π) proves nothing about the design; it is shown apart and not counted as a pass. Show it as a result, or check against an independent quantity"},
	{"recalled-default", "check resting on a template default recalled from memory", "a check turns on a template default whose source says it is recalled from memory; confirm the value for this job against the source and set it in the use statement, with its source"},
	{"fails-within-tolerance", "check that fails within its inputs' tolerances", "a check that holds as written but fails at the worst combination of the tolerances of the inputs it rests on: the parts as made need not keep the pass. Tighten the tolerances that move it most, give the design more margin, or accept it with the reason (a probability of failure the client accepts)"},
	{"case-not-evaluated", "check not worked out in a load case", "a check that could not be worked out in one of the sheet's load cases: its governing case may be the one not seen. Fix what the case makes fail, or take the case out"},
	{"no-checker", "sheet without a checker or revision", "the title block should name the revision and who checked the sheet"},
	{"unknown-acceptance", "acceptance of a finding that is not there", "an `accept` names a code that does not occur at that place; remove it or fix the code"},
	{"acceptance-without-reason", "acceptance without a reason", "an accepted finding must say why it is acceptable"},
}

// RuleByCode finds a rule.
func RuleByCode(code string) (Rule, bool) {
	for _, r := range Rules {
		if r.Code == code {
			return r, true
		}
	}
	return Rule{}, false
}

// Finding is one thing the audit reports.
type Finding struct {
	Code    string   `json:"code"`
	Pos     diag.Pos `json:"pos"`
	Subject string   `json:"subject,omitempty"` // the statement's name or formula
	Message string   `json:"message"`
	// Accepted is set when the sheet accepts this finding; Reason says why.
	Accepted bool   `json:"accepted"`
	Reason   string `json:"reason,omitempty"`
	// Sheet is the sheet whose page shows the statement, and Instance the
	// template instance it belongs to: a finding inside a template is
	// placed at its first use.
	Sheet    string `json:"sheet,omitempty"`
	Instance string `json:"instance,omitempty"`
}

// in places a finding on the page of sheet s, at statement st if any.
func (f Finding) in(s *project.Sheet, st *engine.Statement) Finding {
	f.Sheet = s.Path()
	if st != nil {
		f.Instance = st.Instance
	}
	return f
}

// Report is the audit of a package.
type Report struct {
	Findings []Finding `json:"findings"`
}

// Open counts the findings not accepted.
func (r Report) Open() int {
	n := 0
	for _, f := range r.Findings {
		if !f.Accepted {
			n++
		}
	}
	return n
}

// ThinMargin is the utilisation above which a passing check is reported.
const ThinMargin = 0.95

// Run audits a package. Findings come sorted by position and code.
func Run(pkg *project.Package) Report {
	return Combine(pkg, Sheet)
}

// Combine audits a package from what each sheet's audit found (of gives
// it, once per sheet): the sheets' own findings, and the rules across
// sheets, which read only what Sheet kept. A build audits each sheet with
// Sheet while its calculation is alive, and combines once every sheet is
// done.
func Combine(pkg *project.Package, of func(*project.Sheet) *SheetAudit) Report {
	var r Report
	audits := make([]*SheetAudit, len(pkg.Sheets))
	for i, s := range pkg.Sheets {
		audits[i] = of(s)
		r.Findings = append(r.Findings, audits[i].findings...)
	}
	r.Findings = append(r.Findings, inconsistentInputs(audits)...)
	r.Findings = append(r.Findings, handTransfers(pkg, audits)...)
	applyAcceptances(audits, &r)
	sort.SliceStable(r.Findings, func(i, j int) bool {
		a, b := r.Findings[i], r.Findings[j]
		if c := diag.Compare(a.Pos, b.Pos); c != 0 {
			return c < 0
		}
		return a.Code < b.Code
	})
	// A finding inside a template is one finding, however many sheets or
	// instances use the template.
	kept := r.Findings[:0]
	for i, f := range r.Findings {
		if i > 0 && f.Code == r.Findings[i-1].Code && f.Pos == r.Findings[i-1].Pos {
			continue
		}
		kept = append(kept, f)
	}
	r.Findings = kept
	return r
}

func finding(code string, pos diag.Pos, subject, format string, args ...any) Finding {
	return Finding{Code: code, Pos: pos, Subject: subject, Message: fmt.Sprintf(format, args...)}
}

// withSheet places a finding about an acceptance on the page of the file
// that wrote it.
func withSheet(f Finding) Finding {
	f.Sheet = f.Pos.File
	return f
}

func sheetFindings(s *project.Sheet) []Finding {
	var out []Finding
	m := s.Doc.Meta
	if m.CheckedBy == "" || m.Revision == "" {
		var missing []string
		if m.Revision == "" {
			missing = append(missing, "revision")
		}
		if m.CheckedBy == "" {
			missing = append(missing, "checked by")
		}
		out = append(out, finding("no-checker", diag.Pos{File: s.Path(), Line: 1, Col: 1}, "",
			"the title block has no %s", strings.Join(missing, " and no ")).in(s, nil))
	}
	for _, st := range s.Calc.Statements {
		for _, f := range statementFindings(st, s.Calc.Result(st)) {
			if f.Code == "thin-margin" {
				if _, inBand := s.Band(st); inBand {
					continue // bandMargins judges a side of a band by the band
				}
			}
			out = append(out, f.in(s, st))
		}
	}
	out = append(out, fixedChecks(s)...)
	out = append(out, bandMargins(s)...)
	out = append(out, recalledDefaults(s)...)
	out = append(out, toleranceFailures(s)...)
	out = append(out, unevaluatedCases(s)...)
	return out
}

var openMarkers = []string{"tbc", "tbd", "tba", "to be confirmed", "to be decided", "preliminary", "example value", "?"}

func statementFindings(st *engine.Statement, r engine.Result) []Finding {
	var out []Finding
	name := st.Name
	if st.Kind == engine.Check {
		name = "check " + st.Formula
	}
	if r.Status == engine.Errored || r.Status == engine.Blocked || r.Status == engine.Pending {
		return nil // errors are reported as errors
	}
	if st.IsInput() && st.Overridden {
		// A value written straight into a use statement has nowhere to name
		// its source: it belongs in the sheet as an input of its own.
		return []Finding{finding("no-source", st.Expr.Pos(), name,
			"the value given for %s in use %s has no source; name it as an input of the sheet, with its source", name, st.Instance)}
	}
	if st.IsInput() {
		switch {
		case st.Source == "":
			out = append(out, finding("no-source", st.Pos, name, "input %s has no source", name))
		case isOpen(st.Source):
			out = append(out, finding("open-source", st.Pos, name, "the source of %s is still open: %q", name, st.Source))
		}
		if st.Description == "" {
			out = append(out, finding("no-description", st.Pos, name, "input %s has no description", name))
		}
		// A template offers values that a using sheet need not all use.
		if len(st.Users) == 0 && st.Instance == "" {
			out = append(out, finding("unused-input", st.Pos, name, "nothing uses input %s", name))
		}
		return out
	}
	if st.Kind == engine.Definition && len(st.Users) == 0 && st.Description == "" && st.Instance == "" {
		out = append(out, finding("unused-result", st.Pos, name, "nothing uses %s and it has no description", name))
	}
	out = append(out, buried(st, name)...)
	if st.Kind == engine.Check {
		if r.Status == engine.Pass && r.Utilisation > ThinMargin && !math.IsNaN(r.Utilisation) {
			out = append(out, finding("thin-margin", st.Pos, name, "%s passes at %.1f %% utilisation", name, r.Utilisation*100))
		}
	}
	if st.Kind == engine.Definition && st.Display == nil && r.Status == engine.OK && readsBadly(st, r) {
		out = append(out, finding("awkward-magnitude", st.Pos, name, "%s shows as %s %s", name,
			units.FormatNumber(r.Shown.FromSI(r.Value), 4), r.Shown.Symbol))
	}
	return out
}

func isOpen(source string) bool {
	s := strings.ToLower(source)
	for _, m := range openMarkers {
		if m == "?" {
			if strings.HasSuffix(strings.TrimSpace(s), "?") {
				return true
			}
			continue
		}
		if containsWord(s, m) {
			return true
		}
	}
	return false
}

func containsWord(s, w string) bool {
	for i := strings.Index(s, w); i >= 0; {
		before := i == 0 || !isLetter(s[i-1])
		after := i+len(w) == len(s) || !isLetter(s[i+len(w)])
		if before && after {
			return true
		}
		j := strings.Index(s[i+1:], w)
		if j < 0 {
			break
		}
		i += 1 + j
	}
	return false
}

func isLetter(b byte) bool { return b >= 'a' && b <= 'z' || b >= 'A' && b <= 'Z' }

// buried finds numbers and quantities inside a formula that are not plain
// small factors, and, in a check, a limit written as a literal.
func buried(st *engine.Statement, name string) []Finding {
	var out []Finding
	var exponents = map[engine.Expr]bool{}
	engine.Walk(st.Expr, func(e engine.Expr) {
		if b, ok := e.(*engine.Binary); ok && b.Op == "^" {
			exponents[b.Y] = true
		}
	})
	var limits = map[engine.Expr]bool{}
	if st.Kind == engine.Check {
		cmp := st.Compare()
		for _, side := range []engine.Expr{cmp.X, cmp.Y} {
			if literal(side) {
				limits[side] = true
				out = append(out, finding("check-literal", side.Pos(), name, "%s compares against the unnamed value %s", name, literalText(side)))
			}
		}
	}
	engine.Walk(st.Expr, func(e engine.Expr) {
		if exponents[e] || limits[e] {
			return
		}
		switch n := e.(type) {
		case *engine.Number:
			if !plainFactor(n.Value) {
				out = append(out, finding("buried-number", n.Pos(), name, "the number %s is buried in the formula of %s", n.Text, name))
			}
		case *engine.Quantity:
			if !plainQuantity(n) {
				out = append(out, finding("buried-quantity", n.Pos(), name, "the value %s %s is buried in the formula of %s", n.Text, n.Unit.Symbol, name))
			}
		}
	})
	return out
}

// literal reports whether a check side is a bare number or quantity,
// possibly negated.
func literal(e engine.Expr) bool {
	if u, ok := e.(*engine.Unary); ok {
		e = u.X
	}
	switch n := e.(type) {
	case *engine.Quantity:
		return true
	case *engine.Number:
		return n.Value != 0
	}
	return false
}

func literalText(e engine.Expr) string {
	text, _ := engine.LiteralString(e)
	return text
}

// plainFactor tells the numbers a formula may hold without comment: small
// whole numbers (the 2 of 2·π, the 3 of √3), halves and quarters.
func plainFactor(v float64) bool {
	a := math.Abs(v)
	if a == math.Trunc(a) && a <= 12 {
		return true
	}
	switch a {
	case 0.5, 0.25, 0.75, 1.5:
		return true
	}
	return false
}

// plainQuantity tells the quantities a formula may hold without comment:
// one of a unit, which only strips or names a unit, as in x/(1 m), and
// right angles, as in sin(90 deg).
func plainQuantity(q *engine.Quantity) bool {
	if q.Value == 1 {
		return true
	}
	if q.Unit.Kind == units.Angle {
		deg := q.SI * 180 / math.Pi
		return math.Abs(deg-math.Round(deg/90)*90) < 1e-9
	}
	return false
}

// readsBadly reports whether a result shown in the unit sheaf picked needs
// an exponent, or has a unit with no name.
func readsBadly(st *engine.Statement, r engine.Result) bool {
	v := math.Abs(r.Shown.FromSI(r.Value))
	if v != 0 && (v < 1e-3 || v >= 1e6) {
		return true
	}
	return strings.Contains(r.Shown.Symbol, "·") && r.Shown.Symbol == st.Type.Dim.SIUnits()
}

// inconsistentInputs finds inputs of the same name and dimension with
// different values in different sheets of the same project (sheets whose
// front matter names another project describe another machine, where the
// same symbol may well mean another thing).
func inconsistentInputs(audits []*SheetAudit) []Finding {
	type key struct{ project, name string }
	first := map[key]*inputFact{}
	var out []Finding
	for _, a := range audits {
		for i := range a.inputs {
			in := &a.inputs[i]
			if !in.ok {
				continue
			}
			k := key{a.project, in.name}
			f, ok := first[k]
			if !ok {
				first[k] = in
				continue
			}
			if f.dim != in.dim {
				continue // a different quantity that shares a symbol
			}
			if !same(f.value, in.value) {
				out = append(out, Finding{Code: "inconsistent-input", Pos: in.pos, Subject: in.name,
					Message: fmt.Sprintf("%s is %s here but %s in %s:%d", in.name, in.text, f.text, f.sheet, f.pos.Line),
					Sheet:   a.sheet, Instance: in.instance})
			}
		}
	}
	return out
}

func same(a, b float64) bool {
	return a == b || math.Abs(a-b) <= 1e-12*math.Max(math.Abs(a), math.Abs(b))
}

func inputText(st *engine.Statement) string { return literalText(st.Expr) }

// applyAcceptances marks findings that a sheet accepts: `; accept code:
// reason` on the statement for findings at that statement, and the
// front matter's accept field for findings of the sheet as a whole. An
// acceptance that matches nothing, or gives no reason, is a finding too.
func applyAcceptances(audits []*SheetAudit, r *Report) {
	type key struct {
		file string
		line int
		code string
	}
	lines := statementLines(audits)
	byStatement := map[key][]int{}
	for i, f := range r.Findings {
		k := key{f.Pos.File, statementLine(lines, f), f.Code}
		byStatement[k] = append(byStatement[k], i)
	}
	for _, a := range audits {
		for _, acc := range a.accepts {
			k := key{acc.file, acc.line, acc.code}
			if strings.TrimSpace(acc.reason) == "" {
				r.Findings = append(r.Findings, withSheet(finding("acceptance-without-reason", acc.pos, acc.subject, "accept %s gives no reason", k.code)))
				continue
			}
			idx, ok := byStatement[k]
			if !ok {
				msg := "accept %s matches no finding here"
				if _, known := RuleByCode(k.code); !known {
					msg = "accept %s names no finding sheaf knows"
				}
				r.Findings = append(r.Findings, withSheet(finding("unknown-acceptance", acc.pos, acc.subject, msg, k.code)))
				continue
			}
			for _, i := range idx {
				r.Findings[i].Accepted = true
				r.Findings[i].Reason = acc.reason
			}
		}
	}
}

// statementLines lists, for every file, the lines on which statements
// start: the sheets' own, and those of the templates their instances come
// from, which keep the template's file.
func statementLines(audits []*SheetAudit) map[string][]int {
	lines := map[string][]int{}
	for _, a := range audits {
		for f, l := range a.lines {
			lines[f] = append(lines[f], l...)
		}
	}
	// Sorted, so that statementLine finds a line by binary search: a
	// sheet of many statements with many findings stays fast.
	for f, l := range lines {
		slices.Sort(l)
		lines[f] = slices.Compact(l)
	}
	return lines
}

// statementLine is the line of the statement a finding belongs to: its own
// line for most, the statement's first line for a finding inside a formula
// that spans lines, 1 for the sheet as a whole.
func statementLine(lines map[string][]int, f Finding) int {
	if f.Pos.Line == 1 {
		return 1
	}
	starts, ok := lines[f.Pos.File]
	if !ok {
		return f.Pos.Line
	}
	// The last start at or before the finding's line.
	i, found := slices.BinarySearch(starts, f.Pos.Line)
	if !found {
		i--
	}
	if i < 0 || starts[i] < 1 {
		return 1
	}
	return starts[i]
}

// handTransfers finds inputs whose source names another sheet of the
// package: a number typed across, which goes stale when that sheet
// changes. A sheet is named by its file name, its title, or as "sheet 01"
// for a file whose name starts with 01, at the start of the source or
// after from, see, per or in (so that "field study sheet 02", a sheet of
// another document, is not taken for one of the package's).
func handTransfers(pkg *project.Package, audits []*SheetAudit) []Finding {
	var out []Finding
	names := newSheetNames(pkg.Sheets)
	at := make(map[*project.Sheet]*SheetAudit, len(pkg.Sheets))
	for i, s := range pkg.Sheets {
		at[s] = audits[i]
	}
	for i, s := range pkg.Sheets {
		for _, in := range audits[i].inputs {
			if in.source == "" || in.instance != "" {
				continue
			}
			other := names.first(in.source, s)
			if other == nil {
				continue
			}
			ref := strings.TrimSuffix(other.Path(), ".md")
			remote := "<result>"
			if at[other].defines[in.name] {
				remote = in.name
			}
			out = append(out, Finding{Code: "hand-transfer", Pos: in.pos, Subject: in.name,
				Message: fmt.Sprintf("input %s is typed across from %s (source: %q); take it live: take %s = %s from %s",
					in.name, other.Path(), in.source, in.name, remote, ref),
				Sheet: s.Path()})
		}
	}
	return out
}

var sheetNumber = regexp.MustCompile(`(?i)(^|\b(from|see|per|in)\s+)sheet\s+(\d+)\b`)

// namesSheet reports whether a source text names a sheet of the package.
func namesSheet(source string, s *project.Sheet) bool {
	low := strings.ToLower(source)
	file := strings.ToLower(path.Base(s.Path()))
	stem := strings.TrimSuffix(file, ".md")
	if strings.Contains(low, file) || containsWord(low, stem) || (s.Doc.Meta.Title != "" && strings.Contains(low, strings.ToLower(s.Doc.Meta.Title))) {
		return true
	}
	for _, m := range sheetNumber.FindAllStringSubmatch(source, -1) {
		if n := m[3]; strings.HasPrefix(stem, n) && (len(stem) == len(n) || !isDigit(stem[len(n)])) {
			return true
		}
	}
	return false
}

func isDigit(c byte) bool { return c >= '0' && c <= '9' }
