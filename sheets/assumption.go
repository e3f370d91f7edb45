package sheets

import (
	"regexp"

	"github.com/yuin/goldmark/ast"

	"github.com/sheaf-calc/sheaf/diag"
)

// AssumptionText is a paragraph of prose that starts "Assumption <id>:". The
// statements that rest on it cite its id with `; assumes: <id>`.
type AssumptionText struct {
	ID   string
	Text string // the paragraph after "Assumption <id>:", lines joined
	Pos  diag.Pos
}

// assumptionHead matches the start of an assumption paragraph.
var assumptionHead = regexp.MustCompile(`^Assumption\s+([A-Za-z0-9][A-Za-z0-9_.-]*)\s*:\s*`)

// KindAssumption is the node kind of an assumption paragraph.
var KindAssumption = ast.NewNodeKind("Assumption")

// AssumptionNode stands in the document where an assumption paragraph was
// written; its children are the paragraph's text.
type AssumptionNode struct {
	ast.BaseBlock
	Assumption *AssumptionText
}

// Kind implements ast.Node.
func (n *AssumptionNode) Kind() ast.NodeKind { return KindAssumption }

// Dump implements ast.Node.
func (n *AssumptionNode) Dump(source []byte, level int) {
	ast.DumpHelper(n, source, level, map[string]string{"ID": n.Assumption.ID}, nil)
}

// assumption turns a paragraph that starts "Assumption <id>:" into an
// assumption node, or returns nil.
func (s *Document) assumption(p *ast.Paragraph) *AssumptionNode {
	lines := p.Lines()
	if lines.Len() == 0 {
		return nil
	}
	text := s.paragraphText(p)
	m := assumptionHead.FindStringSubmatch(text)
	if m == nil {
		return nil
	}
	a := &AssumptionText{ID: m[1], Text: text[len(m[0]):], Pos: s.Pos(lines.At(0).Start)}
	s.Assumptions = append(s.Assumptions, a)
	n := &AssumptionNode{Assumption: a}
	adopt(n, p)
	return n
}

// adopt moves a block's lines and children to the node that replaces it.
func adopt(to ast.Node, from ast.Node) {
	to.SetLines(from.Lines())
	for c := from.FirstChild(); c != nil; {
		next := c.NextSibling()
		to.AppendChild(to, c)
		c = next
	}
}
