package render

import (
	"html"
	"net/url"
	"path"
	"regexp"
	"strings"
	"testing"
)

var hrefAttr = regexp.MustCompile(`href="([^"]*)"`)

// Links to pages are percent-encoded: a sheet named "a b#c%.md" (and
// others with characters that mean something in an address) gets links
// that a browser follows to its page, and each link's target holds the
// anchor it names.
func TestLinksToPagesArePercentEncoded(t *testing.T) {
	sheet := "---\ntitle: odd name\n---\nAssumption same: one flux.\n\n```sheaf\nx = 1 m ; a length ; source: s\ny = 2 * x ; twice ; assumes: same\ncheck y <= 3 m ; short enough\n```\n"
	files := map[string]string{"a b#c%.md": sheet, "sub dir/q?&.md": sheet, "plain.md": sheet}
	_, pages := build(t, files)
	if !strings.Contains(pages["index.html"], `href="sheets/a%20b%23c%25.html"`) {
		t.Error(`the index does not link to sheets/a%20b%23c%25.html`)
	}
	links := 0
	for from, page := range pages {
		for _, m := range hrefAttr.FindAllStringSubmatch(page, -1) {
			u, err := url.Parse(html.UnescapeString(m[1]))
			if err != nil {
				t.Errorf("%s: link %s: %v", from, m[1], err)
				continue
			}
			if u.Scheme != "" || u.Host != "" {
				continue
			}
			target := from
			if u.Path != "" {
				target = path.Join(path.Dir(from), u.Path)
				links++
			}
			to, ok := pages[target]
			if !ok {
				t.Errorf("%s: link %s leads to %s, which is not a page", from, m[1], target)
				continue
			}
			if u.Fragment != "" && !strings.Contains(to, `id="`+u.Fragment+`"`) {
				t.Errorf("%s: link %s names an anchor %s has not", from, m[1], target)
			}
		}
	}
	if links < 10 {
		t.Errorf("only %d links between pages were checked", links)
	}
}
