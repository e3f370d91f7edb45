package sheets

import (
	"strings"
	"testing"
)

// A formula block indented under a list item, its line indented with a tab:
// the characters keep the columns an editor shows.
func TestTabIndentedBlockLineInAListItem(t *testing.T) {
	s := Parse("a.md", []byte("- ```sheaf\n\tx = 1 qq\n  ```\n"))
	if len(s.Blocks) != 1 || len(s.Blocks[0].Lines) != 1 {
		t.Fatalf("blocks: %+v", s.Blocks)
	}
	l := s.Blocks[0].Lines[0]
	// "qq" is the 8th character of line 2 (the tab is the 1st).
	at := l.Pos.Col + len([]rune(l.Text[:len(l.Text)-2]))
	if l.Pos.Line != 2 || at != 8 {
		t.Errorf("qq maps to %d:%d, want 2:8 (line %q at %v)", l.Pos.Line, at, l.Text, l.Pos)
	}
}

// A tab in the front matter is named where it stands: YAML refuses tabs for
// indentation and says so in words a sheet's author does not use.
func TestTabInFrontMatterIsNamed(t *testing.T) {
	for _, c := range []struct{ src, pos string }{
		{"---\ntitle: x\n\tjob: y\n---\n# S\n", "f.md:3:1"},
		{"---\ntitle: x\nrevisions:\n  - rev: A\n \t  date: 2026-01-02\n---\n# S\n", "f.md:5:2"},
	} {
		s := Parse("f.md", []byte(c.src))
		if len(s.Diags) != 1 || s.Diags[0].Pos.String() != c.pos || !strings.Contains(s.Diags[0].Message, "a tab character") ||
			!strings.Contains(s.Diags[0].Hint, "spaces") {
			t.Errorf("%q: diagnostics %v, want one naming the tab at %s", c.src, s.Diags, c.pos)
		}
	}
}
