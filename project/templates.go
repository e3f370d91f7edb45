package project

import (
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/sheets"
)

// TemplateInput is an input of a template that a using sheet may set:
// a required parameter, or an input with a default value.
type TemplateInput struct {
	Name        string
	Unit        string // the unit it is measured in; "1" for a pure number
	Description string
	Required    bool   // a param: the using sheet must set it
	Optional    bool   // an optional param: what rests on it is left out when it is not set
	Default     string // the template's own value, for an input with one
	Source      string // where the template's own value comes from
	Example     string // from `; example: ...`, a value for a starter sheet
}

// TemplateInputs lists the inputs of a parsed template, in the order written.
func TemplateInputs(doc *sheets.Document) []TemplateInput {
	calc := engine.Compile(sourceOf(doc, nil))
	var out []TemplateInput
	for _, st := range calc.Statements {
		if st.Kind != engine.Param && !st.IsInput() {
			continue
		}
		in := TemplateInput{Name: st.Name, Description: st.Description, Required: st.Kind == engine.Param && !st.Optional, Optional: st.Optional, Source: st.Source}
		for _, n := range st.Notes {
			if n.Key == "example" {
				in.Example = n.Value
			}
		}
		if st.Display != nil {
			in.Unit = st.Display.Symbol
		}
		if st.Kind != engine.Param {
			in.Default = st.Formula
			if _, u, ok := engine.LiteralText(st.Expr); ok && in.Unit == "" {
				in.Unit = u // the unit the template's own value is written in
			}
		}
		if in.Unit == "" {
			in.Unit = "1"
		}
		out = append(out, in)
	}
	return out
}
