package project

import (
	"errors"
	"fmt"
	"io/fs"
	"path"
	"sort"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/sheets"
)

// Tables read from CSV files. A caption "Table BH from data/bh.csv: ..."
// names a CSV file of the package, by its path relative to the sheet (or
// template) that names it. The file is a source like a sheet: it is read
// with the package's files (so from a git revision too), under the same
// rules (inside the folder, no link out of it), hashed into the package
// stamp and into the stamp of every sheet whose tables, or whose
// templates' tables, read it, and a sheet is evaluated again when it
// changes (Update).

// DataFile is a CSV file that a page's tables read, as the package holds it.
type DataFile struct {
	Path string // inside the package, with forward slashes
	Data []byte
}

// DataFiles lists the CSV files the pages' tables read, directly or
// through their templates, sorted by path: a built package carries a
// copy of each beside the pages, for the tables to link to.
func (p *Package) DataFiles() []DataFile {
	out := make([]DataFile, 0, len(p.data))
	for path, data := range p.data {
		out = append(out, DataFile{Path: path, Data: data})
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Path < out[j].Path })
	return out
}

// dataOf gathers the data files the sheets read, from files.
func dataOf(pages []*Sheet, files map[string][]byte) map[string][]byte {
	out := map[string][]byte{}
	for _, s := range pages {
		for _, u := range s.uses {
			if data, ok := files[u]; ok && isData(u) {
				out[u] = data
			}
		}
	}
	return out
}

// source is sourceOf for a sheet or template of the package: its tables
// read from files get their cells, and used notes every file they name.
func (r *resolver) source(doc *sheets.Document, used *usedFiles) engine.SheetSource {
	return sourceOf(doc, func(t *sheets.TableText, from string) engine.TableSource { return r.table(t, from, used) })
}

// table reads the CSV file a table names. Every problem is the table's
// error: at the file's name in the caption when the file cannot be had,
// in the file itself when its contents are wrong.
func (r *resolver) table(t *sheets.TableText, from string, used *usedFiles) engine.TableSource {
	ts := engine.TableSource{Name: t.Name, Caption: t.Caption, Pos: t.Pos}
	fail := func(hint, format string, args ...any) engine.TableSource {
		ts.Err = &diag.Diagnostic{Pos: t.FilePos, Message: fmt.Sprintf(format, args...), Hint: hint}
		return ts
	}
	if strings.HasPrefix(from, sheets.LibraryPrefix) {
		return fail("write the rows as a pipe table", "a built-in template reads no files, and table %s names %s", t.Name, t.File)
	}
	p, written, inside := dataPath(t.File, from)
	switch {
	case !written:
		return fail("write the path relative to this sheet, with /, as data/bh.csv", "table %s names %s, which is not a path inside the package folder", t.Name, t.File)
	case !inside:
		return fail("copy the file into the package folder and name it by its path from this sheet",
			"the file %s of table %s lies outside the package folder; sheaf reads only files inside the package", t.File, t.Name)
	case !isData(p):
		return fail("save the data as a CSV file (.csv), a header of names with units and a row of numbers per line",
			"table %s names %s, which is not a CSV file (.csv)", t.Name, t.File)
	}
	used.note(p)
	ts.File = p
	data, err := r.data(p)
	if errors.Is(err, fs.ErrNotExist) {
		return fail(r.missingHint(p), "table %s reads %s, which the package does not have", t.Name, p)
	}
	if err != nil {
		return fail("check that the file is a plain file sheaf may read, inside the package", "table %s cannot read %s: %v", t.Name, p, err)
	}
	cells, d := sheets.ReadCSV(p, data)
	if d != nil {
		ts.Err = d
		return ts
	}
	ts.Header, ts.Rows = cellsOf(cells.Header), rowsOf(cells.Rows)
	return ts
}

// missingHint says what to do about a data file the package lacks: the
// name of one that differs only in case, or where files must lie.
func (r *resolver) missingHint(p string) string {
	r.mu.Lock()
	defer r.mu.Unlock()
	for _, f := range mapKeys(r.files) {
		if strings.EqualFold(f, p) {
			return "the package has " + f + ": write the name with the same capitals"
		}
	}
	if !Selected(p) {
		return "files in folders whose names start with . are not part of the package: move the file"
	}
	return "put the file there, or correct the path (it is relative to the sheet that names it)"
}

// data returns a data file of the package, reading it from the folder
// when the package reads its files as they are named (one sheet).
func (r *resolver) data(p string) ([]byte, error) {
	r.mu.Lock()
	defer r.mu.Unlock()
	if data, ok := r.files[p]; ok {
		return data, nil
	}
	if r.more == nil || !Selected(p) {
		return nil, fs.ErrNotExist
	}
	data, err := r.more.read(p)
	if err != nil {
		return nil, err
	}
	r.files[p] = data
	return data, nil
}

// dataPath is the package file that ref, written in the file at from,
// names: a path relative to from. written is false for a path written as
// an absolute or Windows path, inside false for one that leaves the
// package folder.
func dataPath(ref, from string) (p string, written, inside bool) {
	if path.IsAbs(ref) || strings.ContainsAny(ref, "\\:") {
		return "", false, false
	}
	p = path.Clean(path.Join(path.Dir(from), ref))
	return p, true, p != ".." && !strings.HasPrefix(p, "../")
}

// note records a package file that a sheet rests on.
func (u *usedFiles) note(p string) {
	u.mu.Lock()
	defer u.mu.Unlock()
	if u.paths == nil {
		u.paths = map[string]bool{}
	}
	u.paths[p] = true
}
