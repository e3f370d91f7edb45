package render

import (
	"strconv"
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/sheets"
)

// formulaBlock draws a formula block: its statements and its comment
// lines, in the order written.
func (r *blockRenderer) formulaBlock(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	if entering {
		fb := n.(*sheets.FormulaBlock)
		r.block(w, fb.Block, fb.Index)
	}
	return ast.WalkSkipChildren, nil
}

func (r *blockRenderer) block(w sink, b *sheets.FormulaText, bi int) {
	byLine := map[int]*engine.Statement{}
	for _, st := range r.sheet.Calc.Statements {
		if st.Block == bi && st.Instance == "" {
			byLine[st.Pos.Line] = st
		}
	}
	w.WriteString("<div class=\"calc\">\n")
	if len(byLine) == 0 {
		for _, d := range r.sheet.Calc.Diags {
			if d.Pos == b.Fence {
				w.WriteString(`<div class="row error" id="L` + strconv.Itoa(d.Pos.Line) + `"><p class="msg"><span class="loc">` +
					esc(d.Pos.String()) + "</span> " + esc(messageText(d)) + "</p></div>\n")
			}
		}
	}
	for _, l := range b.Lines {
		if st, ok := byLine[l.Pos.Line]; ok {
			writeStatement(w, r.sheet, st, r.digits)
			continue
		}
		if t := strings.TrimSpace(l.Text); strings.HasPrefix(t, "#") {
			w.WriteString("<p class=\"comment\">" + esc(strings.TrimSpace(strings.TrimLeft(t, "#"))) + "</p>\n")
		}
	}
	w.WriteString("</div>\n")
}
