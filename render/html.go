// Package render shows a compiled package: self-contained HTML pages with
// MathML formulas, a JSON document of every value, and terminal reports.
// It computes nothing; every number comes from the engine.
package render

import (
	"bytes"
	"fmt"
	"html"
	"net/url"
	"path"
	"regexp"
	"runtime"
	"strings"
	"sync"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
)

// Options control rendering.
type Options struct {
	// Digits is the number of significant figures for results when a sheet
	// does not set its own; 0 means project.DefaultDigits.
	Digits int
	// Version is the tool version printed in every footer.
	Version string
	// NoGraphs leaves the dependency graphs out of the sheet pages.
	NoGraphs bool
	// BuildDate is the date the pages state, from the sources or
	// SOURCE_DATE_EPOCH (see project.Package.BuildDate); "" states none.
	BuildDate string
	// Audit, when set, adds the audit page and the findings to the JSON.
	Audit *audit.Report
	// Digests, when set, holds what the package pages and the JSON read
	// of sheets whose calculation may be gone (see Digest); the digest of
	// a sheet it lacks is made when needed.
	Digests *Digests

	stamp string // the package stamp, worked out once per render
}

// File is one output file of a built package.
type File struct {
	Path string // inside the output folder, with forward slashes
	Data []byte
}

// Caution is printed on every page: the results of a calculation package
// support, and never replace, a qualified engineer's judgment.
const Caution = "Calculations support, and never replace, the judgment of a qualified engineer. " +
	"Insulation margins and high-voltage tests can hurt people: follow local codes, the applicable standards " +
	"and licensed practice, and leave high-voltage testing to trained people with the right equipment."

// HTML renders the package index and one page per sheet, in a fixed order.
func HTML(pkg *project.Package, opt Options) ([]File, error) {
	var files []File
	err := WriteHTML(pkg, opt, func(f File) error {
		files = append(files, f)
		return nil
	})
	return files, err
}

// ForPackage is opt with what every page of pkg shares worked out once,
// for callers that render pages one at a time (SheetFile). pkg.Files must
// be final.
func (opt Options) ForPackage(pkg *project.Package) Options {
	opt.stamp = project.StampOf(pkg.Files, opt.Version)
	return opt
}

// PackageFiles renders the index, the registers and the audit page, in a
// fixed order.
func PackageFiles(pkg *project.Package, opt Options) []File {
	var files []File
	_ = EachPackageFile(pkg, opt, func(f File) error {
		files = append(files, f)
		return nil
	})
	return files
}

// EachPackageFile renders the files of PackageFiles one at a time,
// handing each to emit before the next is rendered, so that the pages of
// a large package are not in memory together. It stops at emit's first
// error.
func EachPackageFile(pkg *project.Package, opt Options, emit func(File) error) error {
	if opt.stamp == "" {
		opt = opt.ForPackage(pkg)
	}
	return packagePages(pkg, opt, emit)
}

// proses keeps the prose renderers of SheetFile, which cost more to make
// than a page does to render.
var proses = sync.Pool{New: func() any { return newProse() }}

// SheetFile renders the page of one sheet. Many goroutines may call it at
// once; opt should come from ForPackage, or each page works out the
// package stamp again.
func SheetFile(pkg *project.Package, s *project.Sheet, opt Options) (File, error) {
	pr := proses.Get().(*prose)
	defer proses.Put(pr)
	data, err := sheetPage(pkg, s, opt, pr)
	if err != nil {
		return File{}, fmt.Errorf("%s: %w", s.Path(), err)
	}
	return File{Path: s.Page, Data: data}, nil
}

// WriteHTML renders the index and then each sheet's page, handing every
// page to emit as soon as it and all pages before it are ready. Pages are
// rendered in parallel but emitted in a fixed order, and only a few are
// held in memory at once.
func WriteHTML(pkg *project.Package, opt Options, emit func(File) error) error {
	opt = opt.ForPackage(pkg)
	if err := packagePages(pkg, opt, emit); err != nil {
		return err
	}
	type result struct {
		file File
		err  error
	}
	workers := runtime.GOMAXPROCS(0)
	slots := make([]chan result, len(pkg.Sheets))
	for i := range slots {
		slots[i] = make(chan result, 1)
	}
	next := make(chan int)
	done := make(chan struct{})
	defer close(done)
	// A token bounds how far rendering runs ahead of emitting.
	tokens := make(chan struct{}, 2*workers)
	go func() {
		defer close(next)
		for i := range pkg.Sheets {
			select {
			case tokens <- struct{}{}:
			case <-done:
				return
			}
			select {
			case next <- i:
			case <-done:
				return
			}
		}
	}()
	for w := 0; w < workers; w++ {
		go func() {
			pr := newProse()
			for i := range next {
				s := pkg.Sheets[i]
				data, err := sheetPage(pkg, s, opt, pr)
				if err != nil {
					err = fmt.Errorf("%s: %w", s.Path(), err)
				}
				slots[i] <- result{File{Path: s.Page, Data: data}, err}
			}
		}()
	}
	for i := range pkg.Sheets {
		r := <-slots[i]
		<-tokens
		if r.err != nil {
			return r.err
		}
		if err := emit(r.file); err != nil {
			return err
		}
	}
	return nil
}

func esc(s string) string { return html.EscapeString(s) }

// rel returns the path from a page to the package root: "../" for
// sheets/x.html, "../../" for sheets/sub/x.html.
func rel(page string) string {
	return strings.Repeat("../", strings.Count(page, "/"))
}

// page is an HTML page under construction.
type page struct {
	bytes.Buffer
}

func (p *page) f(format string, args ...any) { fmt.Fprintf(&p.Buffer, format, args...) }

// titleBlock is what the header of every page shows, and what repeats at
// the top of every printed page.
type titleBlock struct {
	kicker, heading, subject string
	number                   string      // "Sheet 2 of 5", for a sheet's page
	fields                   [][2]string // label, value; empty values are left out
}

// frame is what every page of a package shares.
type frame struct {
	title string // the browser's title
	block titleBlock
	root  string // path from the page to the package folder: "", "../"
	// stamp is the package stamp on a package page, and on a sheet's page
	// the stamp of the sources that page rests on (project.RestsOn), so
	// that an edit changes only the pages it touches.
	stamp     string
	stampName string // what the footer calls the stamp
	date      string
	pages     []navItem // the package pages that exist
}

type navItem struct{ path, label string }

// open writes the head of a page: the document head, and a frame table
// whose header (the title block) and footer (the stamp) a browser repeats
// on every printed page.
func (p *page) open(fr frame, version string) {
	p.f("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
	p.f("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
	p.f("<meta name=\"generator\" content=\"sheaf %s\">\n", esc(version))
	p.f("<meta name=\"sheaf-stamp\" content=\"%s\">\n", esc(fr.stamp))
	p.f("<title>%s</title>\n<style>%s</style>\n</head>\n<body>\n", esc(fr.title), pageCSS+conditionsCSS)
	p.f("<table class=\"frame\">\n<thead><tr><td>\n")
	fr.block.write(p)
	p.f("</td></tr></thead>\n")
	p.f("<tfoot><tr><td><p class=\"stampline\">%s <code>%s</code>", fr.stampName, esc(fr.stamp))
	if fr.date != "" {
		p.f(" · built %s", esc(fr.date))
	}
	p.f(" · sheaf %s</p></td></tr></tfoot>\n<tbody><tr><td>\n", esc(version))
	p.f("<nav class=\"pkg\">")
	for i, n := range fr.pages {
		if i > 0 {
			p.f(" · ")
		}
		p.f("<a href=\"%s%s\">%s</a>", fr.root, n.path, esc(n.label))
	}
	// The view switch: a checkbox that the stylesheet reads with :has(),
	// so that a page without scripts still shows the checker's notes on
	// demand, on screen and on paper.
	p.f("<label class=\"viewswitch\" title=\"Show positions, uses, used-by and what each result rests on\">" +
		"<input type=\"checkbox\" id=\"checker-view\"> Checker view</label>")
	p.f("</nav>\n")
}

// write draws a title block as a drawing office does: the project, the
// heading and the subject, over a grid of ruled cells, one per field, that
// wraps to the width of the page rather than losing its right half.
func (b titleBlock) write(p *page) {
	p.f("<header class=\"titleblock\">\n<div class=\"tb-head\">\n")
	if b.kicker != "" {
		p.f("<p class=\"kicker\">%s</p>\n", esc(b.kicker))
	}
	if b.number != "" {
		p.f("<p class=\"sheetno\">%s</p>\n", esc(b.number))
	}
	p.f("<h1>%s</h1>\n", esc(b.heading))
	if b.subject != "" {
		p.f("<p class=\"subject\">%s</p>\n", esc(b.subject))
	}
	p.f("</div>\n<dl>\n")
	for _, kv := range b.fields {
		if kv[1] != "" {
			// A date does not break at its hyphens in a narrow cell.
			p.f("<div><dt>%s</dt><dd>%s</dd></div>\n", kv[0], isoDate.ReplaceAllString(esc(kv[1]), `<span class="date">$0</span>`))
		}
	}
	p.f("</dl>\n</header>\n")
}

var isoDate = regexp.MustCompile(`\b\d{4}-\d{2}-\d{2}\b`)

// close writes the cautions and the footer, and ends the page.
func (p *page) close(version, what string) {
	p.f("<aside class=\"caution\"><strong>Caution.</strong> %s</aside>\n", esc(Caution))
	p.f("<footer>%s Built by sheaf %s.</footer>\n", what, esc(version))
	p.f("</td></tr></tbody>\n</table>\n</body>\n</html>\n")
}

// packageFrame is the frame every page of a package shares.
func packageFrame(pkg *project.Package, opt Options) frame {
	stamp := opt.stamp
	if stamp == "" {
		stamp = project.StampOf(pkg.Files, opt.Version)
	}
	fr := frame{stamp: stamp, stampName: "Package stamp", date: opt.BuildDate}
	fr.pages = []navItem{{"index.html", "Package index"}, {"inputs.html", "Inputs register"}, {"assumptions.html", "Assumptions register"}, {"standards.html", "Standards register"}}
	if opt.Audit != nil {
		fr.pages = append(fr.pages, navItem{"audit.html", "Audit"})
	}
	return fr
}

// sheetFrame is the frame of a sheet's page: the package's, with the stamp
// of the sources the page rests on in place of the package stamp.
func sheetFrame(pkg *project.Package, s *project.Sheet, opt Options) frame {
	fr := packageFrame(pkg, opt)
	fr.stamp, fr.stampName = pkg.SheetStamp(s, opt.Version), "Stamp of this sheet's sources"
	return fr
}

// sheetFields are a sheet's title-block fields.
func sheetFields(m sheets.Meta, sheetPath string) [][2]string {
	return [][2]string{
		{"Client", m.Client}, {"Job", m.Job}, {"Revision", m.Revision}, {"Date", m.Date}, {"File", sheetPath},
		{"Prepared", signed(m.PreparedBy, m.PreparedOn)}, {"Checked", signed(m.CheckedBy, m.CheckedOn)},
		{"Approved", signed(m.ApprovedBy, m.ApprovedOn)},
	}
}

// signed writes a sign-off: "R. Okonkwo-Hale, 2026-11-30".
func signed(by, on string) string {
	switch {
	case by == "":
		return ""
	case on == "":
		return by
	}
	return by + ", " + on
}

func messageText(d diag.Diagnostic) string {
	msg := d.Message
	if d.Severity == diag.Warning {
		msg = "warning: " + msg
	}
	if d.Hint != "" {
		msg += " — " + d.Hint
	}
	return msg
}

// InputText returns an input's value and unit as the author wrote them.
func InputText(st *engine.Statement) (value, unit string) {
	value, unit, _ = engine.LiteralText(st.Expr)
	return value, unit
}

// pageHref is a page's address in a link: each part of its path
// percent-encoded, so that a sheet named "a b#c%.md" links to
// "sheets/a%20b%23c%25.html", then escaped for HTML.
func pageHref(page string) string {
	parts := strings.Split(page, "/")
	for i, p := range parts {
		parts[i] = url.PathEscape(p)
	}
	return esc(strings.Join(parts, "/"))
}

// packageTitle names the package: the project named in the sheets, else
// the folder's name.
func packageTitle(pkg *project.Package) string {
	for _, s := range pkg.Sheets {
		if s.Doc.Meta.Project != "" {
			return s.Doc.Meta.Project
		}
	}
	return path.Base(strings.TrimRight(strings.ReplaceAll(pkg.Root, "\\", "/"), "/"))
}
