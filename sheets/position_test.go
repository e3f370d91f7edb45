package sheets

import "testing"

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
