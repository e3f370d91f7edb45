package sheets

import (
	"regexp"
	"strings"
	"unicode/utf8"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"

	"github.com/sheaf-calc/sheaf/diag"
)

// TableText is a named table of data: a caption paragraph "Table <name>:
// caption" and the pipe table that follows it, or a caption "Table <name>
// from <file.csv>: caption" that names a CSV file of the package, which
// the project reads (ReadCSV). Header cells are column names with units
// in brackets: "H [A/m]".
type TableText struct {
	Name    string
	Caption string
	Pos     diag.Pos // of the caption
	Header  []Cell
	Rows    [][]Cell
	// File is the CSV file as written after "from", relative to the
	// sheet, and FilePos where it is written; "" for a pipe table.
	File    string
	FilePos diag.Pos
}

// Cell is the text of a table cell and where it starts.
type Cell struct {
	Text string
	Pos  diag.Pos
}

// tableHead matches a table's caption paragraph; tableFrom the start of
// one that names a file.
var (
	tableHead = regexp.MustCompile(`^Table\s+([A-Za-z][A-Za-z0-9_]*)\s*:\s*`)
	tableFrom = regexp.MustCompile(`^Table\s+([A-Za-z][A-Za-z0-9_]*)\s+from\s+`)
)

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
	if m := tableFrom.FindStringSubmatch(text); m != nil {
		return s.fileTable(p, text, m)
	}
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

// fileTable reads a caption "Table <name> from <file>: caption", whose
// rows are in the file; m is what tableFrom matched.
func (s *Document) fileTable(p *ast.Paragraph, text string, m []string) *TableCaption {
	pos := s.Pos(p.Lines().At(0).Start)
	file, caption, _ := strings.Cut(text[len(m[0]):], ":")
	t := &TableText{Name: m[1], Caption: strings.TrimSpace(caption), Pos: pos, File: strings.TrimSpace(file), FilePos: pos}
	// The file is where it is written when it is on the caption's first line.
	seg := p.Lines().At(0)
	if first := strings.TrimSpace(string(seg.Value(s.Source))); len(first) >= len(m[0]) {
		t.FilePos = pos.Shift(utf8.RuneCountInString(text[:len(m[0])]))
	}
	if t.File == "" {
		s.Diags.Add(pos, "write the file after from, as Table BH from data/bh.csv: caption", "table %s names no file after from", t.Name)
		return nil
	}
	if _, ok := p.NextSibling().(*east.Table); ok {
		s.Diags.Add(pos, "keep the rows in the file and remove the pipe table, or remove \"from "+t.File+"\" to use the pipe table",
			"table %s is read from %s, and a pipe table follows its caption too", t.Name, t.File)
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
