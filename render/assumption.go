package render

import (
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/sheets"
)

// assumption draws an assumption paragraph as a boxed assumption that
// lists what rests on it.
func (r *blockRenderer) assumption(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	a := n.(*sheets.AssumptionNode).Assumption
	if entering {
		w.WriteString(`<div class="assumption" id="A-` + esc(a.ID) + `"><p>`)
		return ast.WalkContinue, nil
	}
	w.WriteString("</p>")
	for _, ea := range r.sheet.Calc.Assumptions {
		if ea.Statement == nil && ea.ID == a.ID {
			if len(ea.Dependents) == 0 {
				w.WriteString(`<p class="links">No statement cites this assumption.</p>`)
			} else {
				w.WriteString(`<p class="links">`)
				writeLinks(w, "Resting on it:", ea.Dependents)
				w.WriteString("</p>")
			}
			break
		}
	}
	w.WriteString("</div>\n")
	return ast.WalkContinue, nil
}
