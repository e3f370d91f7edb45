package project

import (
	"fmt"
	"sort"
	"strings"
	"sync"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/sheets"
)

// usedFiles records the package files that one sheet's use statements
// reach, directly or through the templates they use, found or not.
type usedFiles struct {
	mu    sync.Mutex
	paths map[string]bool
}

// recording is resolve that first notes the package file a use names.
func (u *usedFiles) recording(resolve engine.Resolver) engine.Resolver {
	return func(ref, from string) (engine.SheetSource, string, error) {
		if !strings.HasPrefix(ref, sheets.LibraryPrefix) && !strings.HasPrefix(from, sheets.LibraryPrefix) {
			if p, err := templatePath(ref, from); err == nil {
				u.mu.Lock()
				if u.paths == nil {
					u.paths = map[string]bool{}
				}
				u.paths[p] = true
				u.mu.Unlock()
			}
		}
		return resolve(ref, from)
	}
}

func (u *usedFiles) sorted() []string {
	out := make([]string, 0, len(u.paths))
	for p := range u.paths {
		out = append(out, p)
	}
	sort.Strings(out)
	return out
}

// Reload reads the package's folder again and brings the package up to
// date with it (see Update). It returns the package and the sheets that
// were evaluated again; a package read from one sheet is loaded afresh.
func (p *Package) Reload() (*Package, []*Sheet, error) {
	if !p.whole {
		pkg, err := Load(p.loadedFrom)
		if err != nil {
			return nil, nil, err
		}
		return pkg, pkg.Sheets, nil
	}
	f, err := openFolder(p.Root)
	if err != nil {
		return nil, nil, err
	}
	files, err := f.readAll()
	if err != nil {
		return nil, nil, err
	}
	if !hasSheets(files) {
		return nil, nil, fmt.Errorf("%s holds no Markdown sheets (*.md)", p.Root)
	}
	if err := distinctNames(mapKeys(files)); err != nil {
		return nil, nil, err
	}
	pkg, redone := p.Update(files)
	return pkg, redone, nil
}

// Update returns the package that files, keyed by path, make, and the
// sheets of it that were evaluated again, in path order. When the files
// are those of p under the same names, only the sheets an edit touches
// are read and evaluated again: a changed sheet, every sheet whose use
// statements reach a changed file, and every sheet that takes a result
// from one of these, directly or not; every other sheet is p's own, as
// it was. A file added, deleted or renamed, or one that turns from a page
// into a template or back, rebuilds every sheet. The result is the
// package a full load of files gives. p is left as it was; it must come
// from Load or Update, and no sheet of it may have released its prose.
func (p *Package) Update(files map[string][]byte) (*Package, []*Sheet) {
	now := sourceFiles(files)
	docs, changed, ok := p.reuse(files, now)
	if !ok {
		pkg := build(p.Root, files, nil, nil, LoadOptions{})
		pkg.loadedFrom = p.loadedFrom
		return pkg, pkg.Sheets
	}
	if len(changed) == 0 {
		return p, nil
	}
	redo := p.touched(changed)
	keep := map[string]*Sheet{}
	for _, s := range p.Sheets {
		if !redo[s.Path()] {
			keep[s.Path()] = s
		}
	}
	pkg := assemble(p.Root, files, docs, nil, nil, nil, keep, nil)
	pkg.loadedFrom = p.loadedFrom
	var redone []*Sheet
	for _, s := range pkg.Sheets {
		if redo[s.Path()] {
			redone = append(redone, s)
		}
	}
	return pkg, redone
}

// reuse pairs each of the sheets among the files, in path order, with p's
// parsed document when the file is unchanged, and parses the changed
// ones; a changed data file is marked changed. It reports
// false when the change is not one Update can confine: other names, a
// page that turns template or back, or a package it cannot reuse.
func (p *Package) reuse(files map[string][]byte, now []SourceFile) ([]*sheets.Document, map[string]bool, bool) {
	if !p.whole || len(now) != len(p.Files) {
		return nil, nil, false
	}
	old := make(map[string]*sheets.Document, len(p.Files))
	for _, s := range p.Sheets {
		if s.ProseReleased() {
			return nil, nil, false
		}
		old[s.Path()] = s.Doc
	}
	for _, d := range p.Templates {
		old[d.Path] = d
	}
	var docs []*sheets.Document
	changed := map[string]bool{}
	for i, f := range now {
		if f.Path != p.Files[i].Path {
			return nil, nil, false
		}
		if !isSheet(f.Path) {
			// A data file: the sheets whose tables read it are touched.
			if f.SHA256 != p.Files[i].SHA256 {
				changed[f.Path] = true
			}
			continue
		}
		was, ok := old[f.Path]
		if !ok {
			return nil, nil, false
		}
		doc := was
		if f.SHA256 != p.Files[i].SHA256 {
			changed[f.Path] = true
			doc = sheets.Parse(f.Path, files[f.Path])
			if isTemplate(doc) != isTemplate(was) {
				return nil, nil, false
			}
		}
		docs = append(docs, doc)
	}
	return docs, changed, true
}

// touched is the set of p's sheets that an edit of the changed files
// touches: those the files are, those whose uses reach them (templates,
// and the data files their tables or their templates' tables read), and those
// that take from any of these, directly or not. The takes of p suffice:
// a sheet whose takes change is itself changed.
func (p *Package) touched(changed map[string]bool) map[string]bool {
	takers := map[string][]string{}
	redo := map[string]bool{}
	var queue []string
	for _, s := range p.Sheets {
		for _, t := range s.takes {
			takers[t] = append(takers[t], s.Path())
		}
		hit := changed[s.Path()]
		for _, u := range s.uses {
			hit = hit || changed[u]
		}
		if hit {
			redo[s.Path()] = true
			queue = append(queue, s.Path())
		}
	}
	for len(queue) > 0 {
		q := queue[0]
		queue = queue[1:]
		for _, t := range takers[q] {
			if !redo[t] {
				redo[t] = true
				queue = append(queue, t)
			}
		}
	}
	return redo
}

// RestsOn lists the source files the page of s rests on, sorted by path:
// the sheet itself, the templates its use statements reach, and what each
// sheet it takes a result from rests on (a sheet on a cycle of takes
// takes nothing, and rests on the names of the sheets it would take
// from). A file that a use or take names and that the package lacks is
// listed with an empty SHA256, so that its arrival changes the stamp.
// The package's Files must be final.
func (p *Package) RestsOn(s *Sheet) []SourceFile {
	out := make([]SourceFile, len(s.rests))
	for k, path := range s.rests {
		out[k] = SourceFile{Path: path}
		i := sort.Search(len(p.Files), func(i int) bool { return p.Files[i].Path >= path })
		if i < len(p.Files) && p.Files[i].Path == path {
			out[k] = p.Files[i]
		}
	}
	return out
}

// SheetStamp is the stamp of the sources the page of s rests on (RestsOn),
// with the tool version, worked out as the package stamp is.
func (p *Package) SheetStamp(s *Sheet, toolVersion string) string {
	return StampOf(p.RestsOn(s), toolVersion)
}
