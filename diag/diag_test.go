package diag

import "testing"

func TestSnippet(t *testing.T) {
	src := []byte("# S\n\n```sheaf\n\tV_b = 2 kv + µ\n```\n")
	d := Diagnostic{Pos: Pos{File: "s.md", Line: 4, Col: 10}, End: Pos{File: "s.md", Line: 4, Col: 12}}
	if got, want := d.Snippet(src), "    \tV_b = 2 kv + µ\n    \t        ^^\n"; got != want {
		t.Errorf("snippet %q, want %q", got, want)
	}
	// No end: one caret; a line the source does not have: nothing.
	d.End = Pos{}
	if got, want := d.Snippet(src), "    \tV_b = 2 kv + µ\n    \t        ^\n"; got != want {
		t.Errorf("snippet %q, want %q", got, want)
	}
	d.Pos.Line = 40
	if got := d.Snippet(src); got != "" {
		t.Errorf("snippet of a missing line %q", got)
	}
}
