// Package sheets reads Markdown calculation sheets: the front matter that
// fills the title block, the prose, and the formula blocks with the exact
// file:line:col of every line. It knows nothing of evaluation; the engine
// takes the formula lines, the renderer takes the document.
package sheets

import (
	"bytes"
	"slices"
	"strings"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"go.abhg.dev/goldmark/frontmatter"

	"github.com/sheaf-calc/sheaf/diag"
)

// InfoWord marks a fenced code block as a formula block: ```sheaf.
const InfoWord = "sheaf"

// Document is one parsed Markdown file.
type Document struct {
	Path   string // as shown in messages, relative to the package folder
	Source []byte // the cleaned source the positions refer to
	Meta   Meta
	Doc    ast.Node       // the goldmark document, for rendering prose
	Blocks []*FormulaText // formula blocks in document order
	// Assumptions are the paragraphs marked as assumptions, in order.
	Assumptions []*AssumptionText
	// Tables are the pipe tables introduced by a caption paragraph
	// "Table <name>: ...", in order.
	Tables []*TableText
	Diags  diag.List

	index lineIndex
}

// FormulaText is one formula block.
type FormulaText struct {
	Fence diag.Pos // where the opening fence is
	Lines []TextLine
}

// TextLine is one line of a formula block with the position of its first
// character.
type TextLine struct {
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
func Parse(path string, raw []byte) *Document {
	if d := tooLarge(path, raw); d != nil {
		s := &Document{Path: path, Diags: diag.List{*d}, index: newLineIndex(nil)}
		s.Doc = plain.Parser().Parse(text.NewReader(nil))
		return s
	}
	src, diags := cleanSource(path, raw)
	src = tidyFrontMatterFences(src)
	s := &Document{Path: path, Source: src, Diags: diags, index: newLineIndex(src)}

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
func (s *Document) Pos(offset int) diag.Pos {
	line, col := s.index.pos(offset)
	return diag.Pos{File: s.Path, Line: line, Col: col}
}

// LineText returns line n of the source, for snippets under errors.
func (s *Document) LineText(n int) string { return s.index.lineText(n) }

// collectBlocks replaces the constructs of a sheet in its document with
// node kinds of sheaf's own, recording what each holds: formula blocks,
// assumption paragraphs and the captions of named tables. The renderer
// has one renderer for each kind.
func (s *Document) collectBlocks() {
	var swaps [][2]ast.Node
	_ = ast.Walk(s.Doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering {
			return ast.WalkContinue, nil
		}
		var with ast.Node
		switch n := n.(type) {
		case *ast.Paragraph:
			if a := s.assumption(n); a != nil {
				with = a
			} else if t := s.tableCaption(n); t != nil {
				with = t
			}
		case *ast.FencedCodeBlock:
			if b := s.formulaBlock(n); b != nil {
				with = b
			}
		default:
			return ast.WalkContinue, nil
		}
		if with != nil {
			swaps = append(swaps, [2]ast.Node{n, with})
		}
		return ast.WalkSkipChildren, nil
	})
	for _, sw := range swaps {
		sw[0].Parent().ReplaceChild(sw[0].Parent(), sw[0], sw[1])
	}
}

// paragraphText returns a paragraph's lines joined by spaces.
func (s *Document) paragraphText(p *ast.Paragraph) string {
	lines := p.Lines()
	var parts []string
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		parts = append(parts, strings.TrimSpace(string(seg.Value(s.Source))))
	}
	return strings.Join(parts, " ")
}

func sortStrings(s []string) []string {
	slices.Sort(s)
	return s
}
