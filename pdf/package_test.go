package pdf

import (
	"bytes"
	"context"
	"errors"
	"path/filepath"
	"strings"
	"testing"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
)

// TestNoChromiumNamesTheDebianPackage: with no browser to be found, the
// message says what to install.
func TestNoChromiumNamesTheDebianPackage(t *testing.T) {
	t.Setenv("PATH", t.TempDir())
	t.Setenv("SHEAF_CHROMIUM", "")
	_, err := FindChromium()
	if !errors.Is(err, ErrNoChromium) || !strings.Contains(err.Error(), "apt-get install chromium") {
		t.Fatalf("FindChromium = %v, want the message naming Debian's package chromium", err)
	}
	t.Setenv("SHEAF_CHROMIUM", filepath.Join(t.TempDir(), "no-such-browser"))
	if _, err := FindChromium(); err == nil || !strings.Contains(err.Error(), "SHEAF_CHROMIUM") {
		t.Fatalf("FindChromium with a missing SHEAF_CHROMIUM = %v", err)
	}
}

// TestPackagePDF prints the demo's index and first two sheets into one PDF
// twice: the text is the same both times, the pages add up, and there is
// a bookmark per part at the part's first page.
func TestPackagePDF(t *testing.T) {
	b := startBrowser(t)
	out, res := demo(t, "tarnwick-weir")
	var parts []Part
	for _, p := range []string{"index.html", res.Package.Sheets[0].Page, res.Package.Sheets[1].Page} {
		u, err := FileURL(filepath.Join(out, filepath.FromSlash(p)))
		if err != nil {
			t.Fatal(err)
		}
		parts = append(parts, Part{Address: u})
	}
	var texts []string
	for range 2 {
		data, n, err := Package(context.Background(), b, parts, Layout{Paper: A4})
		if err != nil {
			t.Fatal(err)
		}
		pages := pdfPages(t, data)
		if len(pages) != n {
			t.Fatalf("Package says %d pages, the PDF has %d", n, len(pages))
		}
		texts = append(texts, strings.Join(pages, "\f"))
		marks, err := api.Bookmarks(bytes.NewReader(data), model.NewDefaultConfiguration())
		if err != nil {
			t.Fatal(err)
		}
		if len(marks) != len(parts) || marks[0].PageFrom != 1 || marks[1].PageFrom <= 1 || marks[2].PageFrom <= marks[1].PageFrom {
			t.Fatalf("bookmarks %+v", marks)
		}
		if marks[1].Title != res.Package.Sheets[0].Title() {
			t.Errorf("bookmark %q, want the sheet's title %q", marks[1].Title, res.Package.Sheets[0].Title())
		}
		// The second sheet's first page is where its bookmark points.
		if !strings.Contains(pages[marks[2].PageFrom-1], "Sheet 2 of 6") || !strings.Contains(pages[marks[2].PageFrom-1], "page 1 of") {
			t.Errorf("page %d does not start sheet 2", marks[2].PageFrom)
		}
	}
	if texts[0] != texts[1] {
		t.Error("the same sources printed twice give different text")
	}
}

// TestGraphOnItsOwnPage: asked for, a sheet's dependency graph prints on
// a page of its own after the sheet, under the title block; not asked
// for, no page shows it.
func TestGraphOnItsOwnPage(t *testing.T) {
	b := startBrowser(t)
	tab, cancel := b.Tab()
	defer cancel()
	out, res := demo(t, "corran-hill-conveyor")
	u, err := FileURL(filepath.Join(out, filepath.FromSlash(res.Package.Sheets[0].Page)))
	if err != nil {
		t.Fatal(err)
	}
	for _, graphs := range []bool{false, true} {
		data, _, err := Print(tab, u, Layout{Paper: A4, Graphs: graphs})
		if err != nil {
			t.Fatal(err)
		}
		pages := pdfPages(t, data)
		var with []int
		for i, p := range pages {
			if strings.Contains(p, "Dependency graph") {
				with = append(with, i+1)
			}
		}
		switch {
		case !graphs && len(with) > 0:
			t.Errorf("not asked for, the graph prints on pages %v", with)
		case graphs && len(with) != 1:
			t.Errorf("asked for, the graph prints on pages %v, want one page", with)
		case graphs:
			// The graph follows the sheet's statements, before the inputs
			// register, on a page that starts with it under the title block.
			p := pages[with[0]-1]
			if !strings.Contains(p, "Sheet 1 of 3") || with[0] == 1 {
				t.Errorf("the graph's page lacks the title block or is the sheet's first page:\n%s", clip(p))
			}
			if len(p) > 0 && strings.Contains(p[:strings.Index(p, "Dependency graph")], "holds") {
				t.Errorf("the graph shares its page with the sheet's checks:\n%s", clip(p))
			}
		}
	}
}
