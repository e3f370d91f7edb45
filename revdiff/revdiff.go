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
)

var kindOrder = map[Kind]int{SheetAdded: 0, SheetRemoved: 1, InputChanged: 2, InputAdded: 3, InputRemoved: 4,
	FormulaChanged: 5, ResultAdded: 6, ResultRemoved: 7, ResultMoved: 8, CheckFlipped: 9, CheckAdded: 10,
	CheckRemoved: 11, StatusChanged: 12, InstanceAdded: 13, InstanceRemoved: 14, TemplateChanged: 15}

// Change is one difference between the revisions. Old and New are the
// statements on either side (nil where there is none).
type Change struct {
	Kind  Kind
	Sheet string
	Name  string // a definition's name, or a check's formula
	Old   *engine.Statement
	New   *engine.Statement
	// Rel is the relative change of a moved result, (new-old)/|old|.
	Rel float64
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
	var out []Change
	path := n.Path()
	add := func(k Kind, name string, a, b *engine.Statement, rel float64) {
		out = append(out, Change{Kind: k, Sheet: path, Name: name, Old: a, New: b, Rel: rel})
	}
	// Instances, by name: one added or removed is reported once, and the
	// statements inside it are left out below.
	oldUses, newUses := uses(o), uses(n)
	skip := map[string]bool{} // instances present on one side only
	for name, b := range newUses {
		a, ok := oldUses[name]
		switch {
		case !ok:
			add(InstanceAdded, name, nil, b, 0)
			skip[name] = true
		case a.Template != b.Template:
			add(TemplateChanged, name, a, b, 0)
		}
	}
	for name, a := range oldUses {
		if _, ok := newUses[name]; !ok {
			add(InstanceRemoved, name, a, nil, 0)
			skip[name] = true
		}
	}
	inSkipped := func(st *engine.Statement) bool {
		for inst := st.Instance; inst != ""; {
			if skip[inst] {
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
	// Definitions, by name.
	oldDefs := map[string]*engine.Statement{}
	for _, st := range o.Calc.Statements {
		if (st.Kind == engine.Definition || st.Kind == engine.Take) && st.Name != "" {
			oldDefs[st.Name] = st
		}
	}
	seen := map[string]bool{}
	for _, b := range n.Calc.Statements {
		if (b.Kind != engine.Definition && b.Kind != engine.Take) || b.Name == "" || seen[b.Name] || inSkipped(b) {
			continue
		}
		seen[b.Name] = true
		a, ok := oldDefs[b.Name]
		switch {
		case !ok && b.IsInput():
			add(InputAdded, b.Name, nil, b, 0)
		case !ok:
			add(ResultAdded, b.Name, nil, b, 0)
		case a.IsInput() && b.IsInput():
			if norm(a.Formula) != norm(b.Formula) {
				add(InputChanged, b.Name, a, b, relative(a, b))
			}
		default:
			if norm(a.Formula) != norm(b.Formula) || displayOf(a) != displayOf(b) {
				add(FormulaChanged, b.Name, a, b, relative(a, b))
			} else if a.Status == engine.OK && b.Status == engine.OK {
				if rel := relative(a, b); math.Abs(rel) > threshold {
					add(ResultMoved, b.Name, a, b, rel)
				}
			}
		}
		if ok && (a.Status == engine.OK) != (b.Status == engine.OK) {
			add(StatusChanged, b.Name, a, b, 0)
		}
	}
	for _, a := range o.Calc.Statements {
		if a.Kind != engine.Definition || a.Name == "" || seen[a.Name] || inSkipped(a) {
			continue
		}
		seen[a.Name] = true
		if a.IsInput() {
			add(InputRemoved, a.Name, a, nil, 0)
		} else {
			add(ResultRemoved, a.Name, a, nil, 0)
		}
	}
	// Checks, by formula, then by description.
	oldChecks := checks(o, inSkipped)
	used := map[*engine.Statement]bool{}
	for _, b := range checks(n, inSkipped) {
		a := match(oldChecks, b, used)
		if a == nil {
			add(CheckAdded, b.Formula, nil, b, 0)
			continue
		}
		used[a] = true
		if norm(a.Formula) != norm(b.Formula) {
			add(FormulaChanged, b.Formula, a, b, 0)
		}
		if verdict(a) != verdict(b) {
			add(CheckFlipped, b.Formula, a, b, 0)
		}
	}
	for _, a := range oldChecks {
		if !used[a] {
			add(CheckRemoved, a.Formula, a, nil, 0)
		}
	}
	return out
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
func verdict(st *engine.Statement) string {
	switch st.Status {
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
func relative(a, b *engine.Statement) float64 {
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
