// Package build is sheaf's one pipeline from sources to outputs: load and
// evaluate the sheets (project), audit them, work out the render options,
// render the pages and the JSON, and write the manifest that verify checks.
// The build, check and audit commands and verify all go through it, so
// that they cannot disagree on what a package is.
//
// A package is written whole or not at all: it is staged in a hidden
// folder beside the output and swapped in by rename, under a lock that
// keeps a second build out of the same folder (see Run).
package build

import (
	"fmt"
	"io"
	"sync"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// Options say what to build and how.
type Options struct {
	// Digits is the number of significant figures for results when a
	// sheet does not set its own, 1 to 15; 0 means project.DefaultDigits.
	Digits int
	// Version is the tool version that every page and the manifest state.
	Version string
	// NoGraphs leaves the dependency graphs out of the pages.
	NoGraphs bool
	// SourceDateEpoch is the value of SOURCE_DATE_EPOCH, or "": the date
	// the pages state comes from it or from the sources, never the clock.
	SourceDateEpoch string
	// Out is the folder the HTML package is written to, or "" for none.
	Out string
	// JSON is the file the JSON document is written to, or "" for none.
	// Inside Out it becomes part of the package and the manifest lists it.
	JSON string
	// AuditHTML is a file the audit page is also written to, outside the
	// sources, or "" for none.
	AuditHTML string
}

// Result is an evaluated and audited package with the options its pages
// are rendered with.
type Result struct {
	Package *project.Package
	// Render holds the render options; verify sets them from a manifest
	// before rebuilding the pages.
	Render render.Options
	// Sources is the package's source folder (the folder given, or the
	// folder of the one sheet given), absolute and with symlinks resolved.
	Sources string

	// audit, when set, audits the package on first use: a Reload leaves
	// the audit to the package pages, which alone show its findings, and
	// Render.Audit holds an empty report until then.
	audit *lazyAudit
}

// lazyAudit runs the audit of a package once, when it is first needed.
type lazyAudit struct {
	once   sync.Once
	pkg    *project.Package
	report audit.Report
}

func (a *lazyAudit) get() *audit.Report {
	a.once.Do(func() { a.report = audit.Run(a.pkg) })
	return &a.report
}

// packageOptions are the render options of the package pages and the
// JSON: Render, with the audit run when a Reload left it for later.
func (r *Result) packageOptions() render.Options {
	opt := r.Render
	if r.audit != nil {
		opt.Audit = r.audit.get()
	}
	return opt
}

// PackagePages renders the index, the registers and the audit page (see
// render.PackageFiles), auditing the package first when a Reload left the
// audit for later. Many goroutines may call it at once.
func (r *Result) PackagePages() []render.File {
	return render.PackageFiles(r.Package, r.packageOptions())
}

// Load reads, evaluates and audits the package at src (a folder or one
// sheet) and works out the render options. It writes nothing.
func Load(src string, opt Options) (*Result, error) { return load(src, opt, nil, nil) }

// load is Load that hands each page, with the render options, to
// evaluated as soon as the sheet is evaluated (see project.LoadOptions),
// and audits each sheet with audits when it is set (a build audits each
// sheet in evaluated, before letting its calculation go).
func load(src string, opt Options, evaluated func(*project.Package, *project.Sheet, render.Options), audits func(*project.Sheet) *audit.SheetAudit) (*Result, error) {
	if opt.Digits == 0 {
		opt.Digits = project.DefaultDigits
	}
	if opt.Digits < 1 || opt.Digits > 15 {
		return nil, fmt.Errorf("digits must be between 1 and 15, not %d", opt.Digits)
	}
	sources, err := sourceFolder(src)
	if err != nil {
		return nil, err
	}
	// Only a build into a folder renders the pages, which read the trees.
	lo := project.LoadOptions{Prose: opt.Out != ""}
	if evaluated != nil {
		var once sync.Once
		var ropt render.Options
		lo.Evaluated = func(pkg *project.Package, s *project.Sheet) {
			// A sheet page shows that the package has an audit page,
			// not the findings: the report can come later.
			once.Do(func() { ropt = renderOptions(pkg, opt, &audit.Report{}).ForPackage(pkg) })
			evaluated(pkg, s, ropt)
		}
	}
	pkg, err := project.LoadWith(src, lo)
	if err != nil {
		return nil, err
	}
	if audits == nil {
		audits = audit.Sheet
	}
	report := audit.Combine(pkg, audits)
	return &Result{Package: pkg, Sources: sources, Render: renderOptions(pkg, opt, &report)}, nil
}

// renderOptions are the options the pages of pkg are rendered with.
func renderOptions(pkg *project.Package, opt Options, report *audit.Report) render.Options {
	return render.Options{
		Digits: opt.Digits, Version: opt.Version, Audit: report,
		NoGraphs: opt.NoGraphs,
		// Dates come from the sources, never the clock: builds stay byte-identical.
		BuildDate: pkg.BuildDate(opt.SourceDateEpoch),
	}
}

// Run is the whole pipeline: it refuses outputs that would overwrite the
// sources or files sheaf did not write, loads the package, and writes the
// HTML package into opt.Out and the JSON into opt.JSON when they are set.
//
// The package is staged in a hidden folder beside opt.Out and swapped in
// whole, so that a build that is killed or fails leaves the previous
// package exactly as it was. A lock file beside opt.Out refuses a second
// build into the same folder while one runs.
func Run(src string, opt Options) (*Result, error) {
	sources, err := sourceFolder(src)
	if err != nil {
		return nil, err
	}
	if opt.JSON != "" {
		if err := Outside(opt.JSON, sources, "--json", ".json"); err != nil {
			return nil, err
		}
	}
	if opt.AuditHTML != "" {
		if err := Outside(opt.AuditHTML, sources, "--html", "-audit.html"); err != nil {
			return nil, err
		}
	}
	if opt.Out == "" {
		// No page is rendered: nothing needs the Markdown trees.
		res, err := load(src, opt, func(_ *project.Package, s *project.Sheet, _ render.Options) { s.ReleaseProse() }, nil)
		if err != nil {
			return nil, err
		}
		if opt.JSON != "" {
			err = atomicfile.WriteFunc(opt.JSON, 0o644, res.WriteJSON)
		}
		if err == nil {
			err = res.writeAudit(opt.AuditHTML)
		}
		return res, err
	}
	t, err := prepare(opt.Out, sources)
	if err != nil {
		return nil, err
	}
	defer t.unlock()
	res, err := t.build(src, opt)
	if err != nil {
		return res, err
	}
	return res, res.writeAudit(opt.AuditHTML)
}

// writeAudit writes the audit page to path, when there is one.
func (r *Result) writeAudit(path string) error {
	if path == "" {
		return nil
	}
	return atomicfile.Write(path, render.AuditHTML(r.Package, r.Render), 0o644)
}

// Pages renders the index, the registers, the audit and one page per
// sheet, handing each to emit in a fixed order. The result of a Run has
// let go of what its sheet pages need, once written or when none was to
// be written: Load the package to render them.
func (r *Result) Pages(emit func(render.File) error) error {
	for _, s := range r.Package.Sheets {
		if s.ProseReleased() {
			return fmt.Errorf("the pages of %s were written by the build and cannot be rendered again from this result; load the package again", s.Path())
		}
	}
	return render.WriteHTML(r.Package, r.packageOptions(), emit)
}

// WriteJSON writes the package's JSON document.
func (r *Result) WriteJSON(w io.Writer) error {
	return render.WriteJSON(r.Package, r.packageOptions(), w)
}

// Reload brings r up to date with its sources, read again: only the
// sheets an edit touches are evaluated again (project.Package.Reload).
// The package is audited again when the package pages or the JSON are
// first rendered (PackagePages, Pages, WriteJSON): a sheet's page shows
// that the package has an audit page, not its findings, so an edited
// sheet's page is ready before the audit is done. It returns the new result and the
// sheets whose pages must be rendered again beside the package pages:
// every sheet when the change reaches every page (a file added, deleted
// or renamed, another build date, other options), none when nothing
// changed, in which case the result is r. r must come from Load.
func (r *Result) Reload(opt Options) (*Result, []*project.Sheet, error) {
	if opt.Digits == 0 {
		opt.Digits = project.DefaultDigits
	}
	pkg, redone, err := r.Package.Reload()
	if err != nil {
		return nil, nil, err
	}
	if pkg == r.Package && opt.Digits == r.Render.Digits && opt.Version == r.Render.Version && opt.NoGraphs == r.Render.NoGraphs {
		return r, nil, nil
	}
	res := &Result{Package: pkg, Sources: r.Sources, Render: renderOptions(pkg, opt, &audit.Report{}), audit: &lazyAudit{pkg: pkg}}
	was, now := r.Render, res.Render
	if now.BuildDate != was.BuildDate || now.Digits != was.Digits || now.Version != was.Version || now.NoGraphs != was.NoGraphs {
		redone = pkg.Sheets
	}
	return res, redone, nil
}
