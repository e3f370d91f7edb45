package render

import (
	"strconv"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/util"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/sheets"
)

// SourcesDir is the folder of a built package that holds a copy of every
// data file the pages' tables read, under its path in the sources, so
// that a table read from a file links to the very file it was read from.
const SourcesDir = "sources/"

// fileTableRows is how many rows a table read from a file shows in full;
// a longer one shows its first and last half of that.
const fileTableRows = 200

// tableCaption draws a named table's caption, with the anchor that
// formulas reading the table link to. A table read from a file has no
// pipe table after it in the sheet: its caption is followed by the file's
// name, linked to the package's copy, and the table as read.
func (r *blockRenderer) tableCaption(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	t := n.(*sheets.TableCaption).Table
	if entering {
		w.WriteString(`<p class="caption" id="T-` + esc(t.Name) + `">`)
		return ast.WalkContinue, nil
	}
	w.WriteString("</p>\n")
	if t.File != "" {
		r.fileTable(w, t)
	}
	return ast.WalkContinue, nil
}

// fileTable writes where a table was read from and its rows as read, in
// the units of its header, or the table's error.
func (r *blockRenderer) fileTable(w util.BufWriter, text *sheets.TableText) {
	var t *engine.LookupTable
	for _, c := range r.sheet.Calc.Tables {
		if c.Name == text.Name {
			t = c
			break
		}
	}
	if t == nil {
		return
	}
	if t.Err != nil {
		w.WriteString(`<p class="tablefile">Read from <code>` + esc(text.File) + `</code>: <span class="error">` + esc(t.Err.Error()) + "</span></p>\n")
		return
	}
	rows := len(t.Columns[0].Values)
	w.WriteString(`<p class="tablefile">Read from <a href="` + esc(rel(r.sheet.Page)+SourcesDir+t.File) + `"><code>` + esc(t.File) + `</code></a>, ` +
		strconv.Itoa(rows) + " rows.</p>\n")
	w.WriteString(`<div class="scroll"><table class="data"><thead><tr>`)
	for _, c := range t.Columns {
		h := c.Name
		if c.Unit.Symbol != "1" {
			h += " [" + c.Unit.Symbol + "]"
		}
		w.WriteString("<th>" + esc(h) + "</th>")
	}
	w.WriteString("</tr></thead>\n<tbody>\n")
	for i := 0; i < rows; i++ {
		if rows > fileTableRows && i == fileTableRows/2 {
			skip := rows - fileTableRows
			w.WriteString(`<tr><td colspan="` + strconv.Itoa(len(t.Columns)) + `">… ` + strconv.Itoa(skip) + " rows more, in the file …</td></tr>\n")
			i += skip - 1
			continue
		}
		w.WriteString("<tr>")
		for _, c := range t.Columns {
			w.WriteString(`<td class="num">` + esc(c.Texts[i]) + "</td>")
		}
		w.WriteString("</tr>\n")
	}
	w.WriteString("</tbody></table></div>\n")
}
