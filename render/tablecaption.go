package render

import (
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/sheets"
)

// tableCaption draws a named table's caption, with the anchor that
// formulas reading the table link to.
func (r *blockRenderer) tableCaption(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	if entering {
		w.WriteString(`<p class="caption" id="T-` + esc(n.(*sheets.TableCaption).Table.Name) + `">`)
	} else {
		w.WriteString("</p>\n")
	}
	return ast.WalkContinue, nil
}
