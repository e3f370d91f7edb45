// Package sheets reads Markdown calculation sheets: the front matter that
// fills the title block, the prose, and the formula blocks with the exact
// file:line:col of every line. It knows nothing of evaluation; the engine
// takes the formula lines, the renderer takes the document.
package sheets

import (
	"bytes"
	"regexp"
	"slices"
	"strings"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	east "github.com/yuin/goldmark/extension/ast"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"go.abhg.dev/goldmark/frontmatter"

	"github.com/sheaf-calc/sheaf/diag"
)

// InfoWord marks a fenced code block as a formula block: ```sheaf.
const InfoWord = "sheaf"

// Sheet is one parsed Markdown file.
type Sheet struct {
	Path   string // as shown in messages, relative to the package folder
	Source []byte // the cleaned source the positions refer to
	Meta   Meta
	Doc    ast.Node // the goldmark document, for rendering prose
	Blocks []*Block // formula blocks in document order
	// Assumptions are the paragraphs marked as assumptions, in order.
	Assumptions []*Assumption
	// Tables are the pipe tables introduced by a caption paragraph
	// "Table <name>: ...", in order.
	Tables []*Table
	Diags  diag.List

	index lineIndex
}

// Assumption is a paragraph of prose that starts "Assumption <id>:". The
// statements that rest on it cite its id with `; assumes: <id>`.
type Assumption struct {
	ID   string
	Text string // the paragraph after "Assumption <id>:", lines joined
	Pos  diag.Pos
	Node *ast.Paragraph
}

// Table is a named table of data: a caption paragraph "Table <name>:
// caption" and the pipe table that follows it. Header cells are column
// names with units in brackets: "H [A/m]".
type Table struct {
	Name        string
	Caption     string
	Pos         diag.Pos // of the caption
	Header      []Cell
	Rows        [][]Cell
	CaptionNode *ast.Paragraph
	Node        ast.Node
}

// Cell is the text of a table cell and where it starts.
type Cell struct {
	Text string
	Pos  diag.Pos
}

// tableHead matches a table's caption paragraph.
var tableHead = regexp.MustCompile(`^Table\s+([A-Za-z][A-Za-z0-9_]*)\s*:\s*`)

// assumptionHead matches the start of an assumption paragraph.
var assumptionHead = regexp.MustCompile(`^Assumption\s+([A-Za-z0-9][A-Za-z0-9_.-]*)\s*:\s*`)

// Block is one formula block.
type Block struct {
	Node  *ast.FencedCodeBlock
	Fence diag.Pos // where the opening fence is
	Lines []Line
}

// Line is one line of a formula block with the position of its first
// character.
type Line struct {
	Text string
	Pos  diag.Pos
}

// Extensions are the goldmark extensions a sheet is parsed with; a renderer
// adds the same so that every node has a renderer.
func Extensions() []goldmark.Extender {
	return []goldmark.Extender{extension.Table, extension.Strikethrough}
}

var (
	withFrontMatter = goldmark.New(
		goldmark.WithExtensions(append(Extensions(), &frontmatter.Extender{Formats: []frontmatter.Format{frontmatter.YAML}})...),
		goldmark.WithParserOptions(parser.WithAutoHeadingID()),
	)
	plain = goldmark.New(goldmark.WithExtensions(Extensions()...), goldmark.WithParserOptions(parser.WithAutoHeadingID()))
)

// Parse reads a sheet. It never fails: problems become diagnostics in
// Sheet.Diags, and whatever could be read is kept.
func Parse(path string, raw []byte) *Sheet {
	if d := tooLarge(path, raw); d != nil {
		s := &Sheet{Path: path, Diags: diag.List{*d}, index: newLineIndex(nil)}
		s.Doc = plain.Parser().Parse(text.NewReader(nil))
		return s
	}
	src, diags := cleanSource(path, raw)
	src = tidyFrontMatterFences(src)
	s := &Sheet{Path: path, Source: src, Diags: diags, index: newLineIndex(src)}

	md := plain
	if opensFrontMatter(src) {
		if closesFrontMatter(src) {
			md = withFrontMatter
		} else {
			s.Diags.Add(diag.Pos{File: path, Line: 1, Col: 1},
				"add a line with --- after the last field, or remove the first line if this is not front matter",
				"front matter opened here is never closed")
		}
	}
	ctx := parser.NewContext()
	s.Doc = md.Parser().Parse(text.NewReader(src), parser.WithContext(ctx))
	if fm := frontmatter.Get(ctx); fm != nil {
		s.Meta = decodeMeta(path, frontMatterText(src), &s.Diags)
	}
	s.collectBlocks()
	return s
}

// opensFrontMatter reports whether the first line is a YAML fence.
func opensFrontMatter(src []byte) bool {
	first, _, _ := bytes.Cut(src, []byte("\n"))
	return isFence(first)
}

func closesFrontMatter(src []byte) bool {
	lines := bytes.Split(src, []byte("\n"))
	open := bytes.TrimRight(lines[0], " \t")
	for _, l := range lines[1:] {
		if bytes.Equal(bytes.TrimRight(l, " \t"), open) {
			return true
		}
	}
	return false
}

// tidyFrontMatterFences drops trailing spaces and tabs from the front
// matter's opening and closing lines. The front-matter extension takes only
// a line of bare dashes as a fence: "--- " would open nothing, or close
// nothing and swallow the whole sheet as front matter. Columns elsewhere
// do not move.
func tidyFrontMatterFences(src []byte) []byte {
	lines := bytes.Split(src, []byte("\n"))
	if !isFence(lines[0]) {
		return src
	}
	open := bytes.TrimRight(lines[0], " \t")
	for i, l := range lines[1:] {
		if bytes.Equal(bytes.TrimRight(l, " \t"), open) {
			lines[0], lines[i+1] = open, open
			return bytes.Join(lines, []byte("\n"))
		}
	}
	return src
}

// frontMatterText returns the lines between the opening fence and the
// first line that repeats it, as the front-matter extension reads them.
func frontMatterText(src []byte) []byte {
	lines := bytes.Split(src, []byte("\n"))
	open := bytes.TrimRight(lines[0], " \t")
	for i, l := range lines[1:] {
		if bytes.Equal(bytes.TrimRight(l, " \t"), open) {
			return bytes.Join(lines[1:i+1], []byte("\n"))
		}
	}
	return nil
}

func isFence(l []byte) bool {
	l = bytes.TrimRight(l, " \t")
	return len(l) >= 3 && len(bytes.Trim(l, "-")) == 0
}

// Pos returns the position of a byte offset into Source.
func (s *Sheet) Pos(offset int) diag.Pos {
	line, col := s.index.pos(offset)
	return diag.Pos{File: s.Path, Line: line, Col: col}
}

// LineText returns line n of the source, for snippets under errors.
func (s *Sheet) LineText(n int) string { return s.index.lineText(n) }

func (s *Sheet) collectBlocks() {
	_ = ast.Walk(s.Doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if p, ok := n.(*ast.Paragraph); ok && entering {
			s.collectAssumption(p)
			s.collectTable(p)
			return ast.WalkSkipChildren, nil
		}
		fc, ok := n.(*ast.FencedCodeBlock)
		if !entering || !ok || !IsFormulaBlock(fc, s.Source) {
			return ast.WalkContinue, nil
		}
		b := &Block{Node: fc}
		if fc.Info != nil {
			b.Fence = s.Pos(fc.Info.Segment.Start)
			// Point at the fence itself, not at the info word.
			line := s.LineText(b.Fence.Line)
			b.Fence.Col = len([]rune(line)) - len([]rune(strings.TrimLeft(line, " \t>"))) + 1
		}
		lines := fc.Lines()
		for i := 0; i < lines.Len(); i++ {
			seg := lines.At(i)
			// Value includes, as spaces, what is left of a tab that the
			// block's indentation cut into; those spaces stand before the
			// segment's first character, so the line starts that much earlier.
			txt := strings.TrimRight(string(seg.Value(s.Source)), "\n")
			pos := s.Pos(seg.Start)
			pos.Col -= seg.Padding
			b.Lines = append(b.Lines, Line{Text: txt, Pos: pos})
		}
		s.Blocks = append(s.Blocks, b)
		return ast.WalkSkipChildren, nil
	})
}

// collectAssumption records a paragraph that starts "Assumption <id>:".
func (s *Sheet) collectAssumption(p *ast.Paragraph) {
	lines := p.Lines()
	if lines.Len() == 0 {
		return
	}
	var parts []string
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		parts = append(parts, strings.TrimSpace(string(seg.Value(s.Source))))
	}
	text := strings.Join(parts, " ")
	m := assumptionHead.FindStringSubmatch(text)
	if m == nil {
		return
	}
	s.Assumptions = append(s.Assumptions, &Assumption{ID: m[1], Text: text[len(m[0]):], Pos: s.Pos(lines.At(0).Start), Node: p})
}

// paragraphText returns a paragraph's lines joined by spaces.
func (s *Sheet) paragraphText(p *ast.Paragraph) string {
	lines := p.Lines()
	var parts []string
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		parts = append(parts, strings.TrimSpace(string(seg.Value(s.Source))))
	}
	return strings.Join(parts, " ")
}

// collectTable records a caption paragraph "Table <name>: ..." and the
// pipe table right after it.
func (s *Sheet) collectTable(p *ast.Paragraph) {
	if p.Lines().Len() == 0 {
		return
	}
	text := s.paragraphText(p)
	m := tableHead.FindStringSubmatch(text)
	if m == nil {
		return
	}
	t := &Table{Name: m[1], Caption: text[len(m[0]):], Pos: s.Pos(p.Lines().At(0).Start), CaptionNode: p}
	next, ok := p.NextSibling().(*east.Table)
	if !ok {
		s.Diags.Add(t.Pos, "put the pipe table right after the caption line, with no other paragraph between",
			"table %s has no table after its caption", t.Name)
		return
	}
	t.Node = next
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
}

// cell returns the raw text of a table cell and where it starts.
func (s *Sheet) cell(c ast.Node) Cell {
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

// TableAt returns the table a caption paragraph introduces, or nil.
func (s *Sheet) TableAt(p *ast.Paragraph) *Table {
	for _, t := range s.Tables {
		if t.CaptionNode == p {
			return t
		}
	}
	return nil
}

// AssumptionAt returns the assumption a paragraph declares, or nil.
func (s *Sheet) AssumptionAt(p *ast.Paragraph) *Assumption {
	for _, a := range s.Assumptions {
		if a.Node == p {
			return a
		}
	}
	return nil
}

// IsFormulaBlock reports whether a fenced code block is a formula block.
func IsFormulaBlock(fc *ast.FencedCodeBlock, source []byte) bool {
	lang := fc.Language(source)
	return string(lang) == InfoWord
}

func sortStrings(s []string) []string {
	slices.Sort(s)
	return s
}
