package render

import (
	"regexp"
	"strings"
	"testing"
)

// imageSheet shows images at remote addresses written every way Markdown
// allows, one beside the sheet, and a raw <img> tag.
const imageSheet = "# Pole\n\n" +
	"![pole drawing](https://example.com/pole.png)\n\n" +
	"![](http://example.com/a.png)\n\n" +
	"![map](//cdn.example.net/m.png \"title\")\n\n" +
	"![slash](/\\evil.example/x.png)\n\n" +
	"![upper][r]\n\n[r]: HTTPS://EXAMPLE.ORG/r.png\n\n" +
	"![tab](<ht\ttp://example.com/t.png>)\n\n" +
	"![script](javascript:alert(1))\n\n" +
	"![file](file:///etc/passwd)\n\n" +
	"![local](fig/coil.png)\n\n" +
	"<img src=\"https://example.com/raw.png\">\n\n" +
	"```sheaf\nx = 1 m ; a length ; source: s\n```\n"

var imgSrc = regexp.MustCompile(`<img\b[^>]*\bsrc="([^"]*)"`)

// A page loads nothing from the network: an image at a remote address
// becomes a link, its text and its address; only the image beside the
// sheet stays an image.
func TestRemoteImagesBecomeLinks(t *testing.T) {
	_, pages := build(t, map[string]string{"pole.md": imageSheet})
	page := pages["sheets/pole.html"]
	srcs := imgSrc.FindAllStringSubmatch(page, -1)
	if len(srcs) != 1 || srcs[0][1] != "fig/coil.png" {
		t.Errorf("images in the page: %v, want only fig/coil.png", srcs)
	}
	if n := strings.Count(page, "<img"); n != 1 {
		t.Errorf("%d <img> tags in the page, want 1", n)
	}
	for _, want := range []string{
		`<a class="remote-image" href="https://example.com/pole.png">pole drawing</a> (https://example.com/pole.png)`,
		`<a class="remote-image" href="http://example.com/a.png">http://example.com/a.png</a>`,
		`<a class="remote-image" href="//cdn.example.net/m.png">map</a> (//cdn.example.net/m.png)`,
		`>slash</a> (/\evil.example/x.png)`,
		`<a class="remote-image" href="HTTPS://EXAMPLE.ORG/r.png">upper</a>`,
		`>tab</a>`,
		`script (javascript:alert(1))`,
		`file (file:///etc/passwd)`,
	} {
		if !strings.Contains(page, want) {
			t.Errorf("page lacks %s", want)
		}
	}
	if strings.Contains(page, `href="javascript`) || strings.Contains(page, `href="file`) {
		t.Error("a javascript: or file: address became a link")
	}
}

func TestRemoteAddress(t *testing.T) {
	for dest, want := range map[string]bool{
		"https://x/a.png": true, "HTTP://x": true, "//x/a": true, `\\x\a`: true, `/\x`: true, `\/x`: true,
		" \t//x": true, "ht\ttp://x": true, "data:image/png;base64,AA": true, "C:/x.png": true, "file:///x": true,
		"a.png": false, "fig/a.png": false, "../a.png": false, "/abs/a.png": false, "a:b/../c.png": true,
		"fig/a:b.png": false, "?q=1:2": false, "#x:y": false, "": false, "1a:b": false,
	} {
		if got := remoteAddress(dest); got != want {
			t.Errorf("remoteAddress(%q) = %v, want %v", dest, got, want)
		}
	}
}
