// Package diag holds source positions and the diagnostics that every stage
// of sheaf reports against them, printed as file:line:col: message.
package diag

import (
	"cmp"
	"fmt"
	"slices"
	"strings"
)

// Pos is a place in a source file. Line and Col count from 1; Col counts
// characters (Unicode code points), not bytes, so that it matches what an
// editor shows for Greek letters and unit symbols.
type Pos struct {
	File string `json:"file"`
	Line int    `json:"line"`
	Col  int    `json:"col"`
}

// String formats the position as file:line:col.
func (p Pos) String() string {
	if p.Line == 0 {
		return p.File
	}
	return fmt.Sprintf("%s:%d:%d", p.File, p.Line, p.Col)
}

// Shift returns the position cols characters further along the same line.
func (p Pos) Shift(cols int) Pos {
	p.Col += cols
	return p
}

// Compare orders positions by file, line and column.
func Compare(a, b Pos) int {
	return cmp.Or(strings.Compare(a.File, b.File), cmp.Compare(a.Line, b.Line), cmp.Compare(a.Col, b.Col))
}

// Severity tells whether a diagnostic stops a result (Error) or only
// informs (Warning).
type Severity int

// Severities, from most to least serious.
const (
	Error Severity = iota
	Warning
)

func (s Severity) String() string {
	if s == Warning {
		return "warning"
	}
	return "error"
}

// Diagnostic is one message tied to a source position. Message says what is
// wrong in the user's words; Hint, when set, says how to fix it.
type Diagnostic struct {
	Pos Pos `json:"pos"`
	// End, when set, is where the text the diagnostic is about ends (the
	// column after its last character, on the same line), for a caret
	// snippet under the source line.
	End      Pos      `json:"-"`
	Severity Severity `json:"-"`
	Message  string   `json:"message"`
	Hint     string   `json:"hint,omitempty"`
}

// Error formats the diagnostic as file:line:col: message (hint).
func (d Diagnostic) Error() string {
	var b strings.Builder
	b.WriteString(d.Pos.String())
	b.WriteString(": ")
	if d.Severity == Warning {
		b.WriteString("warning: ")
	}
	b.WriteString(d.Message)
	if d.Hint != "" {
		b.WriteString("; ")
		b.WriteString(d.Hint)
	}
	return b.String()
}

// List collects diagnostics from every stage.
type List []Diagnostic

// Add appends an error at pos.
func (l *List) Add(pos Pos, hint, format string, args ...any) {
	*l = append(*l, Diagnostic{Pos: pos, Message: fmt.Sprintf(format, args...), Hint: hint})
}

// Sort orders the list by position, then message, so that output is
// deterministic whatever order the stages found them in.
func (l List) Sort() {
	slices.SortStableFunc(l, func(a, b Diagnostic) int {
		return cmp.Or(Compare(a.Pos, b.Pos), strings.Compare(a.Message, b.Message))
	})
}

// Errors counts the diagnostics of severity Error.
func (l List) Errors() int {
	n := 0
	for _, d := range l {
		if d.Severity == Error {
			n++
		}
	}
	return n
}

// Snippet returns the diagnostic's source line and, under it, carets
// beneath the characters it is about, each line indented by four spaces;
// "" when src (the file's text) does not hold the line.
func (d Diagnostic) Snippet(src []byte) string {
	if d.Pos.Line < 1 || d.Pos.Col < 1 {
		return ""
	}
	lines := strings.Split(string(src), "\n")
	if d.Pos.Line > len(lines) {
		return ""
	}
	line := []rune(strings.TrimRight(lines[d.Pos.Line-1], "\r"))
	from := d.Pos.Col - 1
	if from > len(line) {
		return ""
	}
	to := from + 1
	if d.End.Line == d.Pos.Line && d.End.Col > d.Pos.Col {
		to = min(d.End.Col-1, len(line))
	}
	to = max(to, from+1)
	var b strings.Builder
	b.WriteString("    " + string(line) + "\n    ")
	for _, c := range line[:from] {
		if c == '\t' {
			b.WriteRune('\t') // tabs keep the columns an editor shows
		} else {
			b.WriteRune(' ')
		}
	}
	b.WriteString(strings.Repeat("^", to-from) + "\n")
	return b.String()
}
