package render

import (
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
)

// JSONLeftOut is a part of a template instance that was not evaluated
// because optional inputs it rests on were not set.
type JSONLeftOut struct {
	Params     []string          `json:"params"`
	Statements []JSONLeftOutItem `json:"statements"`
}

// JSONLeftOutItem is one statement left out: a check (no name) or a
// definition, as the template writes it.
type JSONLeftOutItem struct {
	Kind string   `json:"kind"` // "definition" or "check"
	Name string   `json:"name,omitempty"`
	Pos  diag.Pos `json:"pos"`
	Text string   `json:"text"`
}

// JSONKeptDefault is a template default the instance kept that checks
// rest on.
type JSONKeptDefault struct {
	Name   string `json:"name"`
	Value  string `json:"value"`
	Source string `json:"source,omitempty"`
	// FirstCheck is the first check resting on it, as the register names
	// checks; Checks counts all of them.
	FirstCheck string `json:"first_check"`
	Checks     int    `json:"checks"`
}

// jsonUseParts fills in what a use statement carries of its template.
func jsonUseParts(calc *engine.Calc, use *engine.Statement, j *JSONStatement) {
	p := use.Parts
	if p == nil {
		return
	}
	j.Validity, j.TemplateSources = p.Validity, p.Sources
	if use.Instance != "" {
		return // the parts left out and the defaults kept go to the sheet's own use
	}
	for _, lo := range p.LeftOut {
		jl := JSONLeftOut{Params: lo.Params, Statements: []JSONLeftOutItem{}}
		for _, st := range lo.Statements {
			it := JSONLeftOutItem{Kind: "definition", Name: st.Name, Pos: st.Pos, Text: st.Text}
			if st.Kind == engine.Check {
				it.Kind, it.Name = "check", ""
			}
			jl.Statements = append(jl.Statements, it)
		}
		j.LeftOut = append(j.LeftOut, jl)
	}
	for _, k := range calc.KeptDefaultsOf(use) {
		j.DefaultsKept = append(j.DefaultsKept, JSONKeptDefault{Name: k.Default.Name, Value: exprText(k.Default.Expr),
			Source: k.Default.Source, FirstCheck: checkName(k.First), Checks: k.Checks})
	}
}
