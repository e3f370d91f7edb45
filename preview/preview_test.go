package preview

import (
	"context"
	"errors"
	"io"
	"net/http"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/pdf"
	"github.com/sheaf-calc/sheaf/render"
)

const sheet = "03-speed-voltage.md"

// start copies the demo into a fresh folder and serves it; it returns the
// server's address and the copy.
func start(t *testing.T) (string, string, *Server) {
	t.Helper()
	src := filepath.Join(t.TempDir(), "tarnwick-weir")
	if err := os.CopyFS(src, os.DirFS(filepath.Join("..", "examples", "tarnwick-weir"))); err != nil {
		t.Fatal(err)
	}
	srv, err := New(src, build.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	ln, err := Listen(0)
	if err != nil {
		t.Fatal(err)
	}
	hs := &http.Server{Handler: srv}
	go hs.Serve(ln)
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan struct{})
	go func() { srv.Watch(ctx, nil); close(done) }()
	t.Cleanup(func() { cancel(); hs.Close(); <-done })
	time.Sleep(100 * time.Millisecond) // let the watcher add its folders
	return "http://" + ln.Addr().String(), src, srv
}

// lineOf is the line number of the first line of the sheet that starts with prefix.
func lineOf(t *testing.T, text, prefix string) int {
	for i, l := range strings.Split(text, "\n") {
		if strings.HasPrefix(l, prefix) {
			return i + 1
		}
	}
	t.Fatalf("no line starts %q", prefix)
	return 0
}

// edit replaces old by new in the sheet, as an editor saves it.
func edit(t *testing.T, file, old, new string) {
	t.Helper()
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(data), old) {
		t.Fatalf("%s lacks %q", file, old)
	}
	if err := os.WriteFile(file, []byte(strings.Replace(string(data), old, new, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestPreviewInTheBrowser opens a demo sheet in Chromium from the preview
// server, edits an input on disk and sees the new result in the open page
// without a reload by hand; then breaks the formula and sees the error in
// place; then fixes it. The time each change took to show is logged; the
// speed target lives in BenchmarkPreviewEdit.
func TestPreviewInTheBrowser(t *testing.T) {
	if _, err := pdf.FindChromium(); errors.Is(err, pdf.ErrNoChromium) {
		t.Skip("skipped: " + err.Error())
	}
	base, src, _ := start(t)
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	b, err := pdf.Start(ctx)
	if err != nil {
		t.Fatal(err)
	}
	defer b.Close()
	tab, closeTab := b.Tab()
	defer closeTab()
	file := filepath.Join(src, sheet)
	data, _ := os.ReadFile(file)
	in := "L" + strconv.Itoa(lineOf(t, string(data), "B_1 = "))
	out := "L" + strconv.Itoa(lineOf(t, string(data), "Phi_1 [mWb]"))
	if err := chromedp.Do(tab, chromedp.Navigate(base+"/sheets/03-speed-voltage.html")); err != nil {
		t.Fatal(err)
	}
	row := func(id string) (string, string) {
		r, err := chromedp.Run(tab, chromedp.Evaluate[[]string](`(function(){var e=document.getElementById("`+id+`");return e?[e.className,e.textContent]:["",""]})()`))
		if err != nil || len(r) != 2 {
			return "", ""
		}
		return r[0], r[1]
	}
	_, before := row(out)
	if before == "" {
		t.Fatal("the page has no row for Phi_1")
	}
	// Mark the open page: a reload by the page itself clears the mark,
	// and nothing else here reloads it.
	waitFor := func(what string, ok func() bool) {
		t.Helper()
		start := time.Now()
		for time.Since(start) < 20*time.Second {
			if ok() {
				t.Logf("%s: shown %v after the save", what, time.Since(start).Round(time.Millisecond))
				return
			}
			time.Sleep(20 * time.Millisecond)
		}
		class, text := row(out)
		cur, _ := os.ReadFile(file)
		t.Logf("file line: %q", strings.Split(string(cur), "\n")[lineOf(t, string(cur), "Phi_1")-1])
		t.Fatalf("%s: not shown in the open page; the row is %q: %.300s", what, class, text)
	}
	edit(t, file, "B_1 = 0.83 T", "B_1 = 0.86 T")
	waitFor("the new input and result", func() bool {
		_, inText := row(in)
		_, outText := row(out)
		return strings.Contains(inText, "0.86") && outText != "" && outText != before
	})
	edit(t, file, "Phi_1 [mWb] = 2 / pi * B_1", "Phi_1 [mWb] = 2 / pi * B_1 *")
	waitFor("the error in place", func() bool {
		class, text := row(out)
		return strings.Contains(class, "error") && strings.Contains(text, sheet+":")
	})
	edit(t, file, "Phi_1 [mWb] = 2 / pi * B_1 *", "Phi_1 [mWb] = 2 / pi * B_1")
	waitFor("the fixed result", func() bool {
		class, text := row(out)
		return !strings.Contains(class, "error") && strings.Contains(class, "row") && text != before
	})
}

// get fetches a served page.
func get(t *testing.T, url string) string {
	t.Helper()
	res, err := http.Get(url)
	if err != nil {
		t.Fatal(err)
	}
	defer res.Body.Close()
	body, _ := io.ReadAll(res.Body)
	return string(body)
}

// TestPreviewKeepsServing: a renamed package folder and a deleted sheet
// show the reason on the served pages, which stay the last good ones; the
// folder put back clears it. Served pages carry the reload script; the
// built pages never do.
func TestPreviewKeepsServing(t *testing.T) {
	base, src, srv := start(t)
	page := get(t, base+"/index.html")
	if !strings.Contains(page, eventsPath) || strings.Contains(page, `role="alert"`) {
		t.Fatal("a served page must carry the reload script and no alert")
	}
	res, err := build.Load(src, build.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	if err := res.Pages(func(f render.File) error {
		if strings.Contains(string(f.Data), "<script") {
			t.Errorf("built page %s carries a script", f.Path)
		}
		return nil
	}); err != nil {
		t.Fatal(err)
	}
	wait := func(what string, ok func(string) bool) {
		t.Helper()
		n := srv.Builds()
		for start := time.Now(); time.Since(start) < 20*time.Second; time.Sleep(20 * time.Millisecond) {
			if srv.Builds() > n || ok(get(t, base+"/index.html")) {
				if body := get(t, base+"/index.html"); ok(body) {
					return
				}
			}
		}
		t.Fatalf("%s: not shown", what)
	}
	moved := src + "-renamed"
	if err := os.Rename(src, moved); err != nil {
		t.Fatal(err)
	}
	wait("the renamed folder", func(body string) bool {
		return strings.Contains(body, `role="alert"`) && strings.Contains(body, "Calculation package")
	})
	if err := os.Rename(moved, src); err != nil {
		t.Fatal(err)
	}
	wait("the folder put back", func(body string) bool { return !strings.Contains(body, `role="alert"`) })
	if err := os.Remove(filepath.Join(src, sheet)); err != nil {
		t.Fatal(err)
	}
	wait("the deleted sheet", func(body string) bool {
		return strings.Contains(body, `role="alert"`) || !strings.Contains(body, "03-speed-voltage")
	})
	if got := get(t, base+"/sheets/no-such.html"); !strings.Contains(got, "no page") {
		t.Errorf("an unknown page: %q", got)
	}
}
