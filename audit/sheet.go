package audit

import (
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// SheetAudit is what the audit learns from one sheet while its
// calculation is alive: the sheet's own findings, and the little that the
// rules across sheets read of it (its inputs, the names it defines, its
// acceptances, the lines its statements start on). It holds no statement,
// so that a build of thousands of sheets can let each calculation go once
// its page is written and still audit the package.
type SheetAudit struct {
	sheet   string // the sheet's path
	project string // the project its front matter names
	// findings are the sheet's own, not yet accepted or sorted.
	findings []Finding
	inputs   []inputFact
	defines  map[string]bool
	accepts  []acceptFact
	lines    map[string][]int // statement start lines by file, unsorted
}

// inputFact is an input as the rules across sheets read it.
type inputFact struct {
	name, text, source, instance, sheet string
	pos                                 diag.Pos
	dim                                 units.Dim
	value                               float64
	ok                                  bool // evaluated without error
}

// acceptFact is one acceptance a sheet writes: in its front matter
// (line 1 of the sheet) or on a statement.
type acceptFact struct {
	file                  string
	line                  int
	code, reason, subject string
	pos                   diag.Pos
}

// Sheet audits one sheet by itself and keeps what Combine needs of it.
func Sheet(s *project.Sheet) *SheetAudit {
	a := &SheetAudit{sheet: s.Path(), project: s.Doc.Meta.Project, findings: sheetFindings(s),
		defines: map[string]bool{}, lines: map[string][]int{}}
	for _, acc := range s.Doc.Meta.Accept {
		a.accepts = append(a.accepts, acceptFact{file: s.Path(), line: 1, code: acc.Code, reason: acc.Reason, pos: acc.Pos})
	}
	calc := s.Calc
	for _, st := range calc.Statements {
		a.lines[st.Pos.File] = append(a.lines[st.Pos.File], st.Pos.Line)
		for _, n := range st.Notes {
			if n.Key == "accept" {
				// A template's statements keep the template's file, where
				// both their findings and their acceptances lie.
				a.accepts = append(a.accepts, acceptFact{file: st.Pos.File, line: st.Pos.Line, code: n.Arg, reason: n.Value, subject: st.Name, pos: n.Pos})
			}
		}
		if st.Kind == engine.Definition && calc.Lookup(st.Name) == st {
			a.defines[st.Name] = true
		}
		if st.IsInput() {
			r := calc.Result(st)
			a.inputs = append(a.inputs, inputFact{name: st.Name, text: inputText(st), source: st.Source, instance: st.Instance,
				sheet: s.Path(), pos: st.Pos, dim: st.Type.Dim, value: r.Value, ok: r.Status == engine.OK})
		}
	}
	return a
}
