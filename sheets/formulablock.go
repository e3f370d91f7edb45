package sheets

import (
	"strings"

	"github.com/yuin/goldmark/ast"
)

// KindFormulaBlock is the node kind of a formula block: a fenced code
// block whose info word is sheaf.
var KindFormulaBlock = ast.NewNodeKind("FormulaBlock")

// FormulaBlock stands in the document where a formula block was written;
// the renderer draws the block's statements there.
type FormulaBlock struct {
	ast.BaseBlock
	Block *FormulaText
	// Index is the block's place among the sheet's formula blocks.
	Index int
}

// Kind implements ast.Node.
func (n *FormulaBlock) Kind() ast.NodeKind { return KindFormulaBlock }

// Dump implements ast.Node.
func (n *FormulaBlock) Dump(source []byte, level int) { ast.DumpHelper(n, source, level, nil, nil) }

// formulaBlock turns a fenced code block into a formula block, recording
// its lines with their positions, or returns nil for other code.
func (s *Document) formulaBlock(fc *ast.FencedCodeBlock) *FormulaBlock {
	if !IsFormulaBlock(fc, s.Source) {
		return nil
	}
	b := &FormulaText{}
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
		b.Lines = append(b.Lines, TextLine{Text: txt, Pos: pos})
	}
	s.Blocks = append(s.Blocks, b)
	n := &FormulaBlock{Block: b, Index: len(s.Blocks) - 1}
	n.SetLines(fc.Lines())
	return n
}

// IsFormulaBlock reports whether a fenced code block is a formula block.
func IsFormulaBlock(fc *ast.FencedCodeBlock, source []byte) bool {
	return string(fc.Language(source)) == InfoWord
}
