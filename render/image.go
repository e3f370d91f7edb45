package render

import (
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/renderer/html"
	"github.com/yuin/goldmark/util"
)

// image draws a Markdown image. A page loads nothing from the network, so
// an image at a remote address becomes a plain link: its text and its
// address. An image beside the sheet is drawn as goldmark draws it.
func (r *blockRenderer) image(w util.BufWriter, source []byte, n ast.Node, entering bool) (ast.WalkStatus, error) {
	if !entering {
		return ast.WalkContinue, nil
	}
	img := n.(*ast.Image)
	alt := plainText(source, img)
	dest := string(img.Destination)
	href := util.EscapeHTML(util.URLEscape(img.Destination, true))
	if html.IsDangerousURL(href) {
		href = nil
	}
	if !remoteAddress(dest) {
		w.WriteString(`<img src="` + string(href) + `" alt="` + esc(alt) + `"`)
		if img.Title != nil {
			w.WriteString(` title="` + esc(string(img.Title)) + `"`)
		}
		w.WriteString(">")
		return ast.WalkSkipChildren, nil
	}
	text := alt
	if text == "" {
		text = dest
	}
	if href != nil {
		w.WriteString(`<a class="remote-image" href="` + string(href) + `">` + esc(text) + "</a>")
	} else {
		w.WriteString(esc(text))
	}
	if text != dest {
		w.WriteString(" (" + esc(dest) + ")")
	}
	return ast.WalkSkipChildren, nil
}

// plainText is the text of a node's inline children, as an image's
// description.
func plainText(source []byte, n ast.Node) string {
	var b strings.Builder
	for c := n.FirstChild(); c != nil; c = c.NextSibling() {
		switch t := c.(type) {
		case *ast.Text:
			b.Write(t.Segment.Value(source))
			if t.SoftLineBreak() || t.HardLineBreak() {
				b.WriteByte(' ')
			}
		case *ast.String:
			b.Write(t.Value)
		default:
			b.WriteString(plainText(source, c))
		}
	}
	return b.String()
}

// remoteAddress says whether an image's address could load from anywhere
// but the package: it names a scheme (http:, https:, file:, data:, a
// drive letter), or a host ("//host/x", and "\\host" or "/\host", which
// browsers read the same). Browsers drop leading blanks and controls, and
// tabs and line ends anywhere, so those are dropped first.
func remoteAddress(dest string) bool {
	d := strings.Map(func(r rune) rune {
		if r == '\t' || r == '\n' || r == '\r' {
			return -1
		}
		return r
	}, strings.TrimLeft(dest, "\x00\x01\x02\x03\x04\x05\x06\x07\x08\t\n\v\f\r\x0e\x0f\x10\x11\x12\x13\x14\x15\x16\x17\x18\x19\x1a\x1b\x1c\x1d\x1e\x1f "))
	if len(d) >= 2 && (d[0] == '/' || d[0] == '\\') && (d[1] == '/' || d[1] == '\\') {
		return true
	}
	i := strings.IndexAny(d, ":/?#\\")
	return i > 0 && d[i] == ':' && isScheme(d[:i])
}

// isScheme says whether s is a URL scheme: a letter, then letters, digits,
// "+", "-" or ".".
func isScheme(s string) bool {
	for i, c := range s {
		letter := c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z'
		if !letter && (i == 0 || !(c >= '0' && c <= '9' || c == '+' || c == '-' || c == '.')) {
			return false
		}
	}
	return s != ""
}
