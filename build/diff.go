package build

import (
	"fmt"
	"io"

	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
	"github.com/sheaf-calc/sheaf/revdiff"
)

// DiffOptions say how to compare two revisions of a package.
type DiffOptions struct {
	// Threshold is the smallest relative change of a result to report.
	Threshold float64
	// Digits is the significant figures of values, 1 to 15; 0 means
	// project.DefaultDigits. A sheet's front matter may set its own.
	Digits int
	// Version is the tool version the page states.
	Version string
	// HTML is the file the page of changes is written to, or "".
	HTML string
}

// Diff reads two revisions of a package (each a folder, a file, or
// <revision>:<folder> of a git repository), writes their differences to w
// one a line, and the page of changes to opt.HTML when it is set.
func Diff(oldRef, newRef string, opt DiffOptions, w io.Writer) (revdiff.Report, error) {
	if opt.Digits == 0 {
		opt.Digits = project.DefaultDigits
	}
	if opt.Digits < 1 || opt.Digits > 15 {
		return revdiff.Report{}, fmt.Errorf("digits must be between 1 and 15, not %d", opt.Digits)
	}
	if opt.HTML != "" {
		for _, ref := range []string{oldRef, newRef} {
			if sources, err := sourceFolder(ref); err == nil {
				if err := Outside(opt.HTML, sources, "--html", ".html"); err != nil {
					return revdiff.Report{}, err
				}
			}
		}
	}
	oldPkg, err := project.LoadAny(oldRef)
	if err != nil {
		return revdiff.Report{}, err
	}
	newPkg, err := project.LoadAny(newRef)
	if err != nil {
		return revdiff.Report{}, err
	}
	r := revdiff.Compare(oldPkg, newPkg, opt.Threshold)
	ropt := render.Options{Version: opt.Version, Digits: opt.Digits}
	render.DiffTerminal(r, oldPkg, newPkg, oldRef, newRef, ropt, w)
	if opt.HTML != "" {
		page := render.DiffHTML(r, oldPkg, newPkg, oldRef, newRef, ropt)
		if err := atomicfile.Write(opt.HTML, page, 0o644); err != nil {
			return r, err
		}
	}
	return r, nil
}
