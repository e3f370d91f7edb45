package pdf

import (
	"context"
	"fmt"
	"net/url"
	"path/filepath"
	"strings"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"
)

// Paper is a paper size the pages are laid out for.
type Paper struct {
	Name string
	Size chromedp.PaperSize // inches
}

// The paper sizes the print stylesheet is made for, portrait.
var (
	A4     = Paper{"A4", chromedp.PaperA4}
	Letter = Paper{"Letter", chromedp.PaperLetter}
)

// PaperNamed returns the paper of a name, "a4" or "letter".
func PaperNamed(name string) (Paper, error) {
	switch strings.ToLower(name) {
	case "a4":
		return A4, nil
	case "letter":
		return Letter, nil
	}
	return Paper{}, fmt.Errorf("unknown paper %q: give a4 or letter", name)
}

// View says which view of a page is printed.
type View int

const (
	// IssueView is what goes to the client: formulas, substitutions,
	// results, checks, sources and cautions.
	IssueView View = iota
	// CheckerView adds positions, uses, used-by and what each result
	// rests on.
	CheckerView
)

// Layout says how pages are printed.
type Layout struct {
	Paper Paper
	View  View
	// Graphs prints each sheet's dependency graph on a page of its own
	// after the sheet; without it the graph stays off paper.
	Graphs bool
}

// FileURL is the file:// address of a file on disk.
func FileURL(path string) (string, error) {
	abs, err := filepath.Abs(path)
	if err != nil {
		return "", err
	}
	return (&url.URL{Scheme: "file", Path: filepath.ToSlash(abs)}).String(), nil
}

// SetView turns the page's view switch to view; the page must be open in
// tab. The switch is the page's own checkbox, so the browser lays the
// page out exactly as a reader who ticked it sees it.
func SetView(tab context.Context, view View) error {
	return setBox(tab, "checker-view", view == CheckerView)
}

// setBox ticks or clears one of the page's checkboxes.
func setBox(tab context.Context, id string, on bool) error {
	want := "false"
	if on {
		want = "true"
	}
	_, err := chromedp.Run(tab, chromedp.Evaluate[bool](
		`(function(){var b=document.getElementById("`+id+`");if(!b)return false;b.checked=`+want+`;return true})()`))
	return err
}

// Print opens the page at address in tab and prints it as the layout
// says: margins and the page counter come from the page's print
// stylesheet. It returns the PDF and the page's title.
func Print(tab context.Context, address string, l Layout) ([]byte, string, error) {
	// Print as the print stylesheet says, whatever medium the tab emulated.
	reset := chromedp.Func(func(ctx context.Context, t *chromedp.Target) error {
		_, err := cdp.Call(ctx, t, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{})
		return err
	})
	if err := chromedp.Do(tab, reset, chromedp.Navigate(address)); err != nil {
		return nil, "", fmt.Errorf("opening %s: %w", address, err)
	}
	if err := SetView(tab, l.View); err != nil {
		return nil, "", err
	}
	if err := setBox(tab, "print-graph", l.Graphs); err != nil {
		return nil, "", err
	}
	title, err := chromedp.Run(tab, chromedp.Title())
	if err != nil {
		return nil, "", err
	}
	data, err := chromedp.Run(tab, chromedp.PrintToPDF(
		chromedp.PDFPaper(l.Paper.Size),
		chromedp.PDFPrintBackground(),
		chromedp.PDFOutlineAndTagged(),
	))
	if err != nil {
		return nil, "", fmt.Errorf("printing %s: %w", address, err)
	}
	return data, title, nil
}
