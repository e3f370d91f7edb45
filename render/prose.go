package render

import (
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
)

// blockRenderer draws sheaf's own constructs where the Markdown has them:
// formula blocks (formulablock.go), assumptions (assumption.go) and named
// tables' captions (tablecaption.go); and images (image.go), which load
// nothing from the network. Each construct is a node kind of the
// sheets package with one renderer here; a new construct is a new pair.
type blockRenderer struct {
	sheet  *project.Sheet
	digits int
}

// RegisterFuncs implements renderer.NodeRenderer.
func (r *blockRenderer) RegisterFuncs(reg renderer.NodeRendererFuncRegisterer) {
	reg.Register(sheets.KindFormulaBlock, r.formulaBlock)
	reg.Register(sheets.KindAssumption, r.assumption)
	reg.Register(sheets.KindTableCaption, r.tableCaption)
	reg.Register(ast.KindFencedCodeBlock, r.code)
	reg.Register(ast.KindImage, r.image)
}

// code draws a fenced code block that is not a formula block as code.
func (r *blockRenderer) code(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	if !entering {
		return ast.WalkSkipChildren, nil
	}
	fc := n.(*ast.FencedCodeBlock)
	w.WriteString("<pre><code")
	if lang := string(fc.Language(source)); lang != "" {
		w.WriteString(` class="language-` + esc(lang) + `"`)
	}
	w.WriteString(">")
	for i := 0; i < fc.Lines().Len(); i++ {
		seg := fc.Lines().At(i)
		w.WriteString(esc(string(seg.Value(source))))
	}
	w.WriteString("</code></pre>\n")
	return ast.WalkSkipChildren, nil
}
