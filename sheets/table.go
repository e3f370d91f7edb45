package sheets

import (
	"regexp"
	"strings"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"

	"github.com/sheaf-calc/sheaf/diag"
)

// TableText is a named table of data: a caption paragraph "Table <name>:
// caption" and the pipe table that follows it. Header cells are column
// names with units in brackets: "H [A/m]".
type TableText struct {
	Name    string
	Caption string
	Pos     diag.Pos // of the caption
	Header  []Cell
	Rows    [][]Cell
}

// Cell is the text of a table cell and where it starts.
type Cell struct {
	Text string
	Pos  diag.Pos
}

// tableHead matches a table's caption paragraph.
var tableHead = regexp.MustCompile(`^Table\s+([A-Za-z][A-Za-z0-9_]*)\s*:\s*`)

// KindTableCaption is the node kind of a named table's caption.
var KindTableCaption = ast.NewNodeKind("TableCaption")

// TableCaption stands in the document where a named table's caption was
// written; its children are the caption's text. The pipe table follows it.
type TableCaption struct {
	ast.BaseBlock
	Table *TableText
}

// Kind implements ast.Node.
func (n *TableCaption) Kind() ast.NodeKind { return KindTableCaption }

// Dump implements ast.Node.
func (n *TableCaption) Dump(source []byte, level int) {
	ast.DumpHelper(n, source, level, map[string]string{"Name": n.Table.Name}, nil)
}

// tableCaption turns a caption paragraph "Table <name>: ..." and the pipe
// table right after it into a named table, or returns nil.
func (s *Document) tableCaption(p *ast.Paragraph) *TableCaption {
	if p.Lines().Len() == 0 {
		return nil
	}
	text := s.paragraphText(p)
	m := tableHead.FindStringSubmatch(text)
	if m == nil {
		return nil
	}
	t := &TableText{Name: m[1], Caption: text[len(m[0]):], Pos: s.Pos(p.Lines().At(0).Start)}
	next, ok := p.NextSibling().(*east.Table)
	if !ok {
		s.Diags.Add(t.Pos, "put the pipe table right after the caption line, with no other paragraph between",
			"table %s has no table after its caption", t.Name)
		return nil
	}
	for row := next.FirstChild(); row != nil; row = row.NextSibling() {
		var cells []Cell
		for c := row.FirstChild(); c != nil; c = c.NextSibling() {
			cells = append(cells, s.cell(c))
		}
		if _, header := row.(*east.TableHeader); header {
			t.Header = cells
		} else if t.Rows = append(t.Rows, cells); len(t.Rows) > MaxTableRows {
			break
		}
	}
	s.Tables = append(s.Tables, t)
	n := &TableCaption{Table: t}
	adopt(n, p)
	return n
}

// cell returns the raw text of a table cell and where it starts.
func (s *Document) cell(c ast.Node) Cell {
	var b strings.Builder
	start := -1
	_ = ast.Walk(c, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if t, ok := n.(*ast.Text); ok && entering {
			if start < 0 {
				start = t.Segment.Start
			}
			b.Write(t.Segment.Value(s.Source))
			if t.SoftLineBreak() || t.HardLineBreak() {
				b.WriteByte(' ')
			}
		}
		return ast.WalkContinue, nil
	})
	cell := Cell{Text: strings.TrimSpace(b.String())}
	if start >= 0 {
		cell.Pos = s.Pos(start)
	} else if c.Parent() != nil {
		cell.Pos = s.Pos(tableLineStart(c))
	}
	return cell
}

// tableLineStart finds a byte offset on the line of an empty cell.
func tableLineStart(c ast.Node) int {
	for n := c; n != nil; n = n.PreviousSibling() {
		for ch := n.FirstChild(); ch != nil; ch = ch.NextSibling() {
			if t, ok := ch.(*ast.Text); ok {
				return t.Segment.Start
			}
		}
	}
	return 0
}
