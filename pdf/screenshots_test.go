package pdf

import (
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"github.com/chromedp/chromedp"
)

// TestScreenshots writes the README's pictures of a demo sheet (the issue
// view, the checker view, at 400 px, and a printed page) into the folder
// that SHEAF_SCREENSHOTS names; without it the test skips:
//
//	SHEAF_SCREENSHOTS=$PWD/docs/screenshots go test ./pdf -run TestScreenshots
func TestScreenshots(t *testing.T) {
	dir := os.Getenv("SHEAF_SCREENSHOTS")
	if dir == "" {
		t.Skip("skipped: set SHEAF_SCREENSHOTS to a folder to write the README's screenshots")
	}
	b := startBrowser(t)
	tab, cancel := b.Tab()
	defer cancel()
	out, res := demo(t, "tarnwick-weir")
	u, err := FileURL(filepath.Join(out, filepath.FromSlash(res.Package.Sheets[1].Page)))
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name  string
		width int64
		view  View
		at    string
	}{{"issue-view", 1000, IssueView, ""}, {"checker-view", 1000, CheckerView, "#L31"}, {"phone", 400, IssueView, ""}} {
		if err := chromedp.Do(tab, media("screen", c.width), chromedp.Navigate(u+c.at)); err != nil {
			t.Fatal(err)
		}
		if err := SetView(tab, c.view); err != nil {
			t.Fatal(err)
		}
		png, err := chromedp.Run(tab, chromedp.CaptureScreenshot())
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, c.name+".png"), png, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	data, _, err := Print(tab, u, Layout{Paper: A4})
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(t.TempDir(), "sheet.pdf")
	if err := os.WriteFile(file, data, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := exec.Command("pdftoppm", "-png", "-r", "70", "-f", "3", "-l", "3", "-singlefile", file, filepath.Join(dir, "printed-page")).Run(); err != nil {
		t.Fatalf("pdftoppm: %v", err)
	}
}
