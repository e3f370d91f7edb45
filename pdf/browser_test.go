package pdf

import (
	"bytes"
	"context"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"

	"github.com/sheaf-calc/sheaf/build"
)

// These tests run in a real headless Chromium. Without one they skip, so
// that go test ./... runs anywhere; .ci/run installs Debian's chromium and
// poppler-utils, so CI runs them.

func startBrowser(t *testing.T) *Browser {
	t.Helper()
	if _, err := FindChromium(); errors.Is(err, ErrNoChromium) {
		t.Skip("skipped: " + err.Error())
	}
	ctx, cancel := context.WithTimeout(context.Background(), 3*time.Minute)
	t.Cleanup(cancel)
	b, err := Start(ctx)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(b.Close)
	return b
}

// demo builds the demo package into a fresh folder and returns it with the
// build's result.
func demo(t *testing.T, name string) (string, *build.Result) {
	t.Helper()
	out := filepath.Join(t.TempDir(), "out")
	res, err := build.Run(filepath.Join("..", "examples", name), build.Options{Version: "test", Out: out, SourceDateEpoch: "1796083200"})
	if err != nil {
		t.Fatal(err)
	}
	return out, res
}

// pdfPages extracts the text of each page of a PDF with pdftotext, with
// runs of white space made one space.
func pdfPages(t *testing.T, data []byte) []string {
	t.Helper()
	if _, err := exec.LookPath("pdftotext"); err != nil {
		t.Skip("skipped: pdftotext not found; install Debian's package poppler-utils")
	}
	cmd := exec.Command("pdftotext", "-enc", "UTF-8", "-", "-")
	cmd.Stdin = bytes.NewReader(data)
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("pdftotext: %v", err)
	}
	pages := strings.Split(string(out), "\f")
	if n := len(pages); n > 0 && strings.TrimSpace(pages[n-1]) == "" {
		pages = pages[:n-1]
	}
	space := regexp.MustCompile(`\s+`)
	for i, p := range pages {
		pages[i] = space.ReplaceAllString(p, " ")
	}
	return pages
}

// TestPrintedSheetsCarryTheTitleBlockOnEveryPage prints every sheet of the
// two demo packages on A4 and on Letter and reads each PDF page back: each
// must carry the sheet's title, job and revision, "Sheet n of N" and
// "page x of y".
func TestPrintedSheetsCarryTheTitleBlockOnEveryPage(t *testing.T) {
	b := startBrowser(t)
	tab, cancel := b.Tab()
	defer cancel()
	space := regexp.MustCompile(`\s+`)
	for _, name := range []string{"tarnwick-weir", "corran-hill-conveyor"} {
		out, res := demo(t, name)
		n := len(res.Package.Sheets)
		for _, paper := range []Paper{A4, Letter} {
			for i, s := range res.Package.Sheets {
				address, err := FileURL(filepath.Join(out, filepath.FromSlash(s.Page)))
				if err != nil {
					t.Fatal(err)
				}
				data, _, err := Print(tab, address, Layout{Paper: paper})
				if err != nil {
					t.Fatal(err)
				}
				pages := pdfPages(t, data)
				if len(pages) == 0 {
					t.Fatalf("%s on %s: no pages", s.Path(), paper.Name)
				}
				m := s.Doc.Meta
				title := space.ReplaceAllString(s.Title(), " ")
				for x, text := range pages {
					for _, want := range []string{
						title, m.Job, "Rev. " + m.Revision,
						"Sheet " + itoa(i+1) + " of " + itoa(n),
						"page " + itoa(x+1) + " of " + itoa(len(pages)),
					} {
						if !strings.Contains(text, want) {
							t.Errorf("%s on %s, page %d of %d: lacks %q\n%s", s.Path(), paper.Name, x+1, len(pages), want, clip(text))
						}
					}
				}
				t.Logf("%s %s on %s: %d pages", name, s.Path(), paper.Name, len(pages))
			}
		}
	}
}

func itoa(i int) string { return strconv.Itoa(i) }

func clip(s string) string {
	if len(s) > 600 {
		return s[:600] + "…"
	}
	return s
}

// media emulates a medium ("print" or "screen") and a viewport width.
func media(kind string, width int64) chromedp.Action[chromedp.Void] {
	return chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
		if _, err := chromedp.EmulateViewport(width, 900)(ctx, tg); err != nil {
			return err
		}
		_, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: kind})
		return err
	})
}

// overflowing lists the elements that reach past the window's right edge
// or before its left one, as "tag.class (left..right)".
const overflowing = `(function(){var w=document.documentElement.clientWidth,out=[];
document.querySelectorAll("body *").forEach(function(e){var r=e.getBoundingClientRect();
if(r.width===0&&r.height===0)return;
if(r.right>w+0.5||r.left<-0.5)out.push(e.tagName.toLowerCase()+"."+(e.getAttribute("class")||"")+" ("+Math.round(r.left)+".."+Math.round(r.right)+" of "+w+")");});
return out})()`

// TestNothingWiderThanThePrintedPage lays every page of the demo out for
// print at the width that A4 leaves between the margins (186 mm, the
// narrower of A4 and Letter) and looks for any element past either edge.
func TestNothingWiderThanThePrintedPage(t *testing.T) {
	b := startBrowser(t)
	tab, cancel := b.Tab()
	defer cancel()
	const a4Content = 703 // (210 mm - 2 × 12 mm) at 96 px per inch
	for _, page := range demoPages(t) {
		if err := chromedp.Do(tab, media("print", a4Content), chromedp.Navigate(page)); err != nil {
			t.Fatal(err)
		}
		for _, view := range []View{IssueView, CheckerView} {
			if err := SetView(tab, view); err != nil {
				t.Fatal(err)
			}
			over, err := chromedp.Run(tab, chromedp.Evaluate[[]string](overflowing))
			if err != nil {
				t.Fatal(err)
			}
			if len(over) > 0 {
				t.Errorf("%s (view %d) printed: %d elements wider than the page, first %v", filepath.Base(page), view, len(over), over[:min(5, len(over))])
			}
		}
	}
}

// TestPhoneWidth opens every page of the demo in a 400 px window: the
// document must be no wider than the window (tables scroll in their own box).
func TestPhoneWidth(t *testing.T) {
	b := startBrowser(t)
	tab, cancel := b.Tab()
	defer cancel()
	for _, page := range demoPages(t) {
		if err := chromedp.Do(tab, media("screen", 400), chromedp.Navigate(page)); err != nil {
			t.Fatal(err)
		}
		for _, view := range []View{IssueView, CheckerView} {
			if err := SetView(tab, view); err != nil {
				t.Fatal(err)
			}
			w, err := chromedp.Run(tab, chromedp.Evaluate[[]int](`[document.documentElement.scrollWidth,document.body.scrollWidth,window.innerWidth]`))
			if err != nil {
				t.Fatal(err)
			}
			if w[0] > 400 || w[1] > 400 {
				over, _ := chromedp.Run(tab, chromedp.Evaluate[[]string](overflowing))
				t.Errorf("%s (view %d) at 400 px: document %d px wide, body %d px; past the edge: %v", filepath.Base(page), view, w[0], w[1], over[:min(5, len(over))])
			}
		}
	}
}

// TestViews checks that the issue view hides positions, uses, used-by and
// rests-on, and that the checker view shows them, on screen and on paper.
func TestViews(t *testing.T) {
	b := startBrowser(t)
	tab, cancel := b.Tab()
	defer cancel()
	out, res := demo(t, "tarnwick-weir")
	address, err := FileURL(filepath.Join(out, filepath.FromSlash(res.Package.Sheets[0].Page)))
	if err != nil {
		t.Fatal(err)
	}
	// Shown elements of each kind the checker reads, and the text of the
	// page as a reader sees it.
	const count = `(function(){var n={};["a.loc","details.trace","span.links.ck","span.setby",".row .eq"].forEach(function(s){
n[s]=Array.prototype.filter.call(document.querySelectorAll(s),function(e){return e.getClientRects().length>0}).length});
n.text=document.body.innerText.indexOf("used by")>=0?1:0;return n})()`
	for _, kind := range []string{"screen", "print"} {
		if err := chromedp.Do(tab, media(kind, 900), chromedp.Navigate(address)); err != nil {
			t.Fatal(err)
		}
		issue, err := chromedp.Run(tab, chromedp.Evaluate[map[string]int](count))
		if err != nil {
			t.Fatal(err)
		}
		if err := SetView(tab, CheckerView); err != nil {
			t.Fatal(err)
		}
		checker, err := chromedp.Run(tab, chromedp.Evaluate[map[string]int](count))
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s: issue view %v, checker view %v", kind, issue, checker)
		for _, sel := range []string{"a.loc", "details.trace", "span.links.ck", "text"} {
			if issue[sel] != 0 {
				t.Errorf("%s: the issue view shows %d of %s", kind, issue[sel], sel)
			}
			if checker[sel] == 0 {
				t.Errorf("%s: the checker view shows no %s", kind, sel)
			}
		}
		if issue[".row .eq"] == 0 || issue[".row .eq"] != checker[".row .eq"] {
			t.Errorf("%s: both views must show every equation: %d and %d", kind, issue[".row .eq"], checker[".row .eq"])
		}
	}
}

// demoPages builds the demo and returns the file:// address of every page.
func demoPages(t *testing.T) []string {
	t.Helper()
	out, _ := demo(t, "tarnwick-weir")
	var pages []string
	err := filepath.Walk(out, func(p string, info os.FileInfo, err error) error {
		if err == nil && strings.HasSuffix(p, ".html") {
			u, err := FileURL(p)
			if err != nil {
				return err
			}
			pages = append(pages, u)
		}
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return pages
}
