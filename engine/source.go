package engine

import (
	"strings"
	"unicode"

	"github.com/sheaf-calc/sheaf/diag"
)

// SourceLine is one line of a formula block with the position of its first
// character; SourceBlock is the lines of one block; SheetSource is a sheet as the
// engine sees it.
type SourceLine struct {
	Text string
	Pos  diag.Pos
}

// SourceBlock is one formula block.
type SourceBlock struct {
	Fence diag.Pos // where the block opens, for errors about the block
	Lines []SourceLine
}

// SheetSource is everything the engine needs from one sheet.
type SheetSource struct {
	Path string
	// Title and Caution come from the front matter; when the sheet is used
	// as a template they go to the use statement, for the page to show.
	Title, Caution string
	// Validity and Sources come from the front matter too: where the
	// template holds, and the published references it rests on.
	Validity, Sources []string
	Blocks            []SourceBlock
	Assumptions       []AssumptionSource // prose assumptions, in the order written
	Tables            []TableSource      // named tables, in the order written
}

// MaxStatementLength bounds one statement, in characters. A formula longer
// than this is a mistake (or an attack) and is refused with a message, so
// that one runaway line cannot stall the package.
const MaxStatementLength = 10000

// text is the source of one statement: its characters and, for each
// physical line it spans, where that line starts.
type text struct {
	runes  []rune
	starts []lineStart
}

type lineStart struct {
	off int // rune offset into runes
	pos diag.Pos
}

// pos maps a rune offset to a file position.
func (t *text) pos(off int) diag.Pos {
	ls := t.starts[0]
	for _, s := range t.starts[1:] {
		if s.off > off {
			break
		}
		ls = s
	}
	return ls.pos.Shift(off - ls.off)
}

func (t *text) String() string { return string(t.runes) }

// splitStatements turns a block's lines into statements. Blank lines and
// lines starting with # are comments. A statement continues on the next
// line when that line is indented and the statement so far has an open
// parenthesis or ends with a comma (as a long use ... with list does).
func splitStatements(b SourceBlock) []*text {
	var out []*text
	var cur *text
	depth, comma := 0, false
	for _, l := range b.Lines {
		trimmed := strings.TrimSpace(l.Text)
		indented := len(l.Text) > 0 && unicode.IsSpace(rune(l.Text[0]))
		if cur != nil && (depth > 0 || comma) && indented && trimmed != "" && !strings.HasPrefix(trimmed, "#") {
			cur.starts = append(cur.starts, lineStart{off: len(cur.runes) + 1, pos: l.Pos})
			cur.runes = append(cur.runes, '\n')
			cur.runes = append(cur.runes, []rune(l.Text)...)
			depth += parenDepth(l.Text)
			comma = endsWithComma(l.Text)
			continue
		}
		if trimmed == "" || strings.HasPrefix(trimmed, "#") {
			continue
		}
		cur = &text{runes: []rune(l.Text), starts: []lineStart{{0, l.Pos}}}
		depth, comma = parenDepth(l.Text), endsWithComma(l.Text)
		out = append(out, cur)
	}
	return out
}

// endsWithComma reports whether a line's formula part (it has no ;
// annotation) ends with a comma.
func endsWithComma(s string) bool {
	if strings.ContainsAny(s, ";#") {
		return false
	}
	return strings.HasSuffix(strings.TrimSpace(s), ",")
}

// parenDepth counts open parentheses and brackets in the formula part of
// a line (before any ; annotation or # comment), so that a list may run
// on over indented lines.
func parenDepth(s string) int {
	d := 0
	for _, r := range s {
		switch r {
		case '(', '[':
			d++
		case ')', ']':
			d--
		case ';', '#':
			return d
		}
	}
	return d
}
