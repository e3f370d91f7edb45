package sheets

import (
	"bytes"
	"sort"
	"unicode/utf8"

	"github.com/sheaf-calc/sheaf/diag"
)

// cleanSource prepares raw file bytes for parsing: it drops a UTF-8 byte
// order mark, turns CRLF line ends into LF, and replaces every byte that is
// not valid UTF-8 by U+FFFD one for one, so that character columns stay
// where the author's editor shows them. It reports the first bad byte on
// each line, up to a handful.
func cleanSource(path string, raw []byte) ([]byte, diag.List) {
	raw = bytes.TrimPrefix(raw, []byte("\xef\xbb\xbf"))
	if bytes.Contains(raw, []byte("\r\n")) {
		raw = bytes.ReplaceAll(raw, []byte("\r\n"), []byte("\n"))
	}
	if utf8.Valid(raw) {
		return raw, nil
	}
	var diags diag.List
	out := make([]byte, 0, len(raw)+16)
	line, col, lastBadLine := 1, 1, 0
	for i := 0; i < len(raw); {
		r, n := utf8.DecodeRune(raw[i:])
		if r == utf8.RuneError && n == 1 {
			if line != lastBadLine && len(diags) < 10 {
				diags.Add(diag.Pos{File: path, Line: line, Col: col}, "save the file as UTF-8",
					"byte 0x%02x is not valid UTF-8", raw[i])
				lastBadLine = line
			}
			out = utf8.AppendRune(out, utf8.RuneError)
		} else {
			out = append(out, raw[i:i+n]...)
		}
		if r == '\n' {
			line, col = line+1, 1
		} else {
			col++
		}
		i += n
	}
	return out, diags
}

// lineIndex turns byte offsets into line and character columns.
type lineIndex struct {
	src    []byte
	starts []int // byte offset of the start of each line
}

func newLineIndex(src []byte) lineIndex {
	starts := []int{0}
	for i, b := range src {
		if b == '\n' {
			starts = append(starts, i+1)
		}
	}
	return lineIndex{src: src, starts: starts}
}

// pos returns the line and character column of a byte offset.
func (ix lineIndex) pos(offset int) (line, col int) {
	if offset > len(ix.src) {
		offset = len(ix.src)
	}
	if offset < 0 {
		offset = 0
	}
	l := sort.Search(len(ix.starts), func(i int) bool { return ix.starts[i] > offset }) - 1
	return l + 1, utf8.RuneCount(ix.src[ix.starts[l]:offset]) + 1
}

// lineText returns line n (from 1) without its line end.
func (ix lineIndex) lineText(n int) string {
	if n < 1 || n > len(ix.starts) {
		return ""
	}
	start := ix.starts[n-1]
	end := len(ix.src)
	if n < len(ix.starts) {
		end = ix.starts[n] - 1
	}
	return string(ix.src[start:end])
}
