// Package revdiff compares two revisions of a calculation package and says
// what a checker needs to look at again: inputs that changed, formulas
// that changed, results that moved by more than a threshold, and checks
// that flipped between pass and fail.
package revdiff

import (
	"math"
	"sort"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// Kind names a kind of change.
type Kind string

// The kinds of change, in the order a report lists them.
const (
	SheetAdded     Kind = "sheet-added"
	SheetRemoved   Kind = "sheet-removed"
	InputChanged   Kind = "input-changed"
	InputAdded     Kind = "input-added"
	InputRemoved   Kind = "input-removed"
	FormulaChanged Kind = "formula-changed"
	ResultAdded    Kind = "result-added"
	ResultRemoved  Kind = "result-removed"
	ResultMoved    Kind = "result-moved"
	CheckFlipped   Kind = "check-flipped"
	CheckAdded     Kind = "check-added"
	CheckRemoved   Kind = "check-removed"
	StatusChanged  Kind = "status-changed"
	// An instance of a template added or removed is one change; the
	// statements it brings are not listed one by one.
	InstanceAdded   Kind = "instance-added"
	InstanceRemoved Kind = "instance-removed"
	// TemplateChanged is a use statement that names another template.
	TemplateChanged Kind = "template-changed"
	// A load case added, removed, or setting other inputs or values.
	CaseAdded   Kind = "case-added"
	CaseRemoved Kind = "case-removed"
	CaseChanged Kind = "case-changed"
	// ToleranceChanged is an input whose tolerance changed.
	ToleranceChanged Kind = "tolerance-changed"
)

var kindOrder = map[Kind]int{SheetAdded: 0, SheetRemoved: 1, InputChanged: 2, InputAdded: 3, InputRemoved: 4,
	FormulaChanged: 5, ResultAdded: 6, ResultRemoved: 7, ResultMoved: 8, CheckFlipped: 9, CheckAdded: 10,
	CheckRemoved: 11, StatusChanged: 12, InstanceAdded: 13, InstanceRemoved: 14, TemplateChanged: 15,
	CaseAdded: 16, CaseRemoved: 17, CaseChanged: 18, ToleranceChanged: 2}

// Change is one difference between the revisions. Old and New are the
// statements on either side (nil where there is none), with their results.
type Change struct {
	Kind  Kind
	Sheet string
	Name  string // a definition's name, or a check's formula
	Old   *engine.Statement
	New   *engine.Statement
	// OldResult and NewResult are what the statements gave.
	OldResult, NewResult engine.Result
	// Rel is the relative change of a moved result, (new-old)/|old|.
	Rel float64
	// Case is the load case a result moved or a check flipped in, "" for
	// the sheet as written.
	Case string
}

// Pos is where the change is in the new revision, else in the old.
func (c Change) Pos() diag.Pos {
	if c.New != nil {
		return c.New.Pos
	}
	if c.Old != nil {
		return c.Old.Pos
	}
	return diag.Pos{File: c.Sheet}
}

// Report lists the changes between two packages.
type Report struct {
	Threshold float64
	Changes   []Change
}

// Count returns how many changes are of a kind.
func (r Report) Count(k Kind) int {
	n := 0
	for _, c := range r.Changes {
		if c.Kind == k {
			n++
		}
	}
	return n
}

// DefaultThreshold is the relative change below which a result is not
// reported as moved: rounding in the fourth significant figure.
const DefaultThreshold = 1e-4

// Compare lists the changes from old to new. Sheets are matched by path,
// definitions by name, and checks by their formula (or, when a check's
// formula changed, by its description).
func Compare(old, new *project.Package, threshold float64) Report {
	r := Report{Threshold: threshold}
	olds := map[string]*project.Sheet{}
	for _, s := range old.Sheets {
		olds[s.Path()] = s
	}
	news := map[string]bool{}
	for _, s := range new.Sheets {
		news[s.Path()] = true
		o, ok := olds[s.Path()]
		if !ok {
			r.Changes = append(r.Changes, Change{Kind: SheetAdded, Sheet: s.Path()})
			continue
		}
		r.Changes = append(r.Changes, compareSheet(o, s, threshold)...)
	}
	for _, s := range old.Sheets {
		if !news[s.Path()] {
			r.Changes = append(r.Changes, Change{Kind: SheetRemoved, Sheet: s.Path()})
		}
	}
	sort.SliceStable(r.Changes, func(i, j int) bool {
		a, b := r.Changes[i], r.Changes[j]
		if a.Sheet != b.Sheet {
			return a.Sheet < b.Sheet
		}
		if kindOrder[a.Kind] != kindOrder[b.Kind] {
			return kindOrder[a.Kind] < kindOrder[b.Kind]
		}
		return diag.Compare(a.Pos(), b.Pos()) < 0
	})
	return r
}

func compareSheet(o, n *project.Sheet, threshold float64) []Change {
	d := &differ{o: o, n: n, threshold: threshold, path: n.Path()}
	d.instances()
	d.definitions()
	d.checks()
	d.cases()
	return d.out
}

// differ gathers the changes between two revisions of one sheet.
type differ struct {
	o, n      *project.Sheet
	threshold float64
	path      string
	skip      map[string]bool // instances present on one side only
	out       []Change
	// defs and chks pair the definitions and checks both revisions have,
	// for the comparison case by case.
	defs, chks [][2]*engine.Statement
}

func (d *differ) add(k Kind, name string, a, b *engine.Statement, rel float64) {
	c := Change{Kind: k, Sheet: d.path, Name: name, Old: a, New: b, Rel: rel}
	if a != nil {
		c.OldResult = d.o.Calc.Result(a)
	}
	if b != nil {
		c.NewResult = d.n.Calc.Result(b)
	}
	d.out = append(d.out, c)
}

// instances compares the instances, by name: one added or removed is
// reported once, and the statements inside it are left out after.
func (d *differ) instances() {
	oldUses, newUses := uses(d.o), uses(d.n)
	d.skip = map[string]bool{}
	for name, b := range newUses {
		a, ok := oldUses[name]
		switch {
		case !ok:
			d.add(InstanceAdded, name, nil, b, 0)
			d.skip[name] = true
		case a.Template != b.Template:
			d.add(TemplateChanged, name, a, b, 0)
		}
	}
	for name, a := range oldUses {
		if _, ok := newUses[name]; !ok {
			d.add(InstanceRemoved, name, a, nil, 0)
			d.skip[name] = true
		}
	}
}

// skipped reports whether st lies in an instance that only one side has.
func (d *differ) skipped(st *engine.Statement) bool {
	for inst := st.Instance; inst != ""; {
		if d.skip[inst] {
			return true
		}
		i := strings.LastIndexByte(inst, '.')
		if i < 0 {
			break
		}
		inst = inst[:i]
	}
	return false
}

// definitions compares the definitions and taken results, by name.
func (d *differ) definitions() {
	named := func(st *engine.Statement) bool {
		return (st.Kind == engine.Definition || st.Kind == engine.Take) && st.Name != ""
	}
	oldDefs := map[string]*engine.Statement{}
	for _, st := range d.o.Calc.Statements {
		if named(st) {
			oldDefs[st.Name] = st
		}
	}
	seen := map[string]bool{}
	for _, b := range d.n.Calc.Statements {
		if !named(b) || seen[b.Name] || d.skipped(b) {
			continue
		}
		seen[b.Name] = true
		if a, ok := oldDefs[b.Name]; ok {
			d.definition(a, b)
			d.defs = append(d.defs, [2]*engine.Statement{a, b})
		} else if b.IsInput() {
			d.add(InputAdded, b.Name, nil, b, 0)
		} else {
			d.add(ResultAdded, b.Name, nil, b, 0)
		}
	}
	for _, a := range d.o.Calc.Statements {
		if a.Kind != engine.Definition || a.Name == "" || seen[a.Name] || d.skipped(a) {
			continue
		}
		seen[a.Name] = true
		if a.IsInput() {
			d.add(InputRemoved, a.Name, a, nil, 0)
		} else {
			d.add(ResultRemoved, a.Name, a, nil, 0)
		}
	}
}

// definition compares one definition present in both revisions.
func (d *differ) definition(a, b *engine.Statement) {
	ra, rb := d.o.Calc.Result(a), d.n.Calc.Result(b)
	switch {
	case a.IsInput() && b.IsInput():
		if norm(a.Formula) != norm(b.Formula) {
			d.add(InputChanged, b.Name, a, b, relative(ra, rb))
		}
		if toleranceOf(a) != toleranceOf(b) {
			d.add(ToleranceChanged, b.Name, a, b, 0)
		}
	case norm(a.Formula) != norm(b.Formula) || displayOf(a) != displayOf(b):
		d.add(FormulaChanged, b.Name, a, b, relative(ra, rb))
	case ra.Status == engine.OK && rb.Status == engine.OK:
		if rel := relative(ra, rb); math.Abs(rel) > d.threshold {
			d.add(ResultMoved, b.Name, a, b, rel)
		}
	}
	if (ra.Status == engine.OK) != (rb.Status == engine.OK) {
		d.add(StatusChanged, b.Name, a, b, 0)
	}
}

// checks compares the checks, matched by formula, then by description.
func (d *differ) checks() {
	oldChecks := checks(d.o, d.skipped)
	used := map[*engine.Statement]bool{}
	for _, b := range checks(d.n, d.skipped) {
		a := match(oldChecks, b, used)
		if a == nil {
			d.add(CheckAdded, b.Formula, nil, b, 0)
			continue
		}
		used[a] = true
		d.chks = append(d.chks, [2]*engine.Statement{a, b})
		if norm(a.Formula) != norm(b.Formula) {
			d.add(FormulaChanged, b.Formula, a, b, 0)
		}
		if verdict(d.o.Calc.Result(a)) != verdict(d.n.Calc.Result(b)) {
			d.add(CheckFlipped, b.Formula, a, b, 0)
		}
	}
	for _, a := range oldChecks {
		if !used[a] {
			d.add(CheckRemoved, a.Formula, a, nil, 0)
		}
	}
}

func checks(s *project.Sheet, skip func(*engine.Statement) bool) []*engine.Statement {
	var out []*engine.Statement
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Check && !skip(st) {
			out = append(out, st)
		}
	}
	return out
}

// uses maps a sheet's instances, nested ones included, to their use
// statements.
func uses(s *project.Sheet) map[string]*engine.Statement {
	out := map[string]*engine.Statement{}
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Use {
			name := st.Name
			if st.Instance != "" {
				name = st.Instance + "." + name
			}
			out[name] = st
		}
	}
	return out
}

func match(olds []*engine.Statement, b *engine.Statement, used map[*engine.Statement]bool) *engine.Statement {
	for _, a := range olds {
		if !used[a] && norm(a.Formula) == norm(b.Formula) {
			return a
		}
	}
	if b.Description != "" {
		for _, a := range olds {
			if !used[a] && a.Description == b.Description {
				return a
			}
		}
	}
	// A check whose limit was rewritten keeps its left side and operator.
	for _, a := range olds {
		if !used[a] && sameLeft(a, b) {
			return a
		}
	}
	return nil
}

// sameLeft reports whether two checks compare the same left side with the
// same operator.
func sameLeft(a, b *engine.Statement) bool {
	ca, cb := a.Compare(), b.Compare()
	if ca == nil || cb == nil || ca.Op != cb.Op {
		return false
	}
	la, lb := leftText(a), leftText(b)
	return la != "" && la == lb
}

// leftText is a check's formula up to its comparison operator, without spaces.
func leftText(st *engine.Statement) string {
	f := norm(st.Formula)
	for _, op := range []string{"<=", ">=", "==", "≤", "≥", "<", ">"} {
		if i := strings.Index(f, op); i > 0 {
			return f[:i]
		}
	}
	return ""
}

// verdict is a check's outcome: pass, fail or error.
func verdict(r engine.Result) string {
	switch r.Status {
	case engine.Pass:
		return "pass"
	case engine.Fail:
		return "fail"
	}
	return "error"
}

func displayOf(st *engine.Statement) string {
	if st.Display == nil {
		return ""
	}
	return st.Display.Symbol
}

// norm compares formulas without regard to spaces.
func norm(s string) string { return strings.Join(strings.Fields(s), "") }

// relative is (new-old)/|old|, or ±Inf when old is zero and new is not.
func relative(a, b engine.Result) float64 {
	if a.Status != engine.OK || b.Status != engine.OK {
		return math.NaN()
	}
	if a.Value == b.Value {
		return 0
	}
	if a.Value == 0 {
		return math.Inf(int(math.Copysign(1, b.Value)))
	}
	return (b.Value - a.Value) / math.Abs(a.Value)
}

func toleranceOf(st *engine.Statement) string {
	if st.Tol == nil {
		return ""
	}
	return norm(st.Tol.Text)
}
