package project

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"sort"
	"strings"
)

// folder reads the files of a package folder, and nothing outside it: a
// file or folder that is a symbolic link resolving outside the folder is
// an error that names the link, and nothing of its target is read.
type folder struct {
	root string // as given
	real string // with every symbolic link resolved
}

func openFolder(root string) (*folder, error) {
	abs, err := filepath.Abs(root)
	if err != nil {
		return nil, fmt.Errorf("cannot read %s: %w", root, err)
	}
	real, err := filepath.EvalSymlinks(abs)
	if err != nil {
		return nil, fmt.Errorf("cannot read %s: %w", root, err)
	}
	return &folder{root: root, real: real}, nil
}

// outside is the error for a link whose target lies outside the folder.
func (f *folder) outside(rel, target string) error {
	return fmt.Errorf("%s is a symbolic link to %s, outside the package folder %s; sheaf reads only files inside the package: copy the file into the package, or remove the link",
		filepath.Join(f.root, filepath.FromSlash(rel)), target, f.root)
}

// inside reports whether a resolved path lies within the folder.
func (f *folder) inside(real string) bool {
	rel, err := filepath.Rel(f.real, real)
	return err == nil && rel != ".." && !strings.HasPrefix(rel, ".."+string(filepath.Separator)) && !filepath.IsAbs(rel)
}

// read reads one file by its path inside the folder, with forward
// slashes, refusing it when it or a folder on its way resolves outside.
func (f *folder) read(rel string) ([]byte, error) {
	p := filepath.Join(f.root, filepath.FromSlash(rel))
	// Each step on the way may be a link: check them from the top, so that
	// the error names the first link that leaves.
	parts := strings.Split(rel, "/")
	for i := range parts {
		step := strings.Join(parts[:i+1], "/")
		sp := filepath.Join(f.root, filepath.FromSlash(step))
		info, err := os.Lstat(sp)
		if err != nil {
			return nil, fmt.Errorf("cannot read %s: %w", p, err)
		}
		if info.Mode()&fs.ModeSymlink == 0 {
			continue
		}
		real, err := filepath.EvalSymlinks(sp)
		if err != nil {
			return nil, fmt.Errorf("cannot read %s: %w", sp, err)
		}
		if !f.inside(real) {
			return nil, f.outside(step, real)
		}
	}
	data, err := os.ReadFile(p)
	if err != nil {
		return nil, fmt.Errorf("cannot read %s: %w", p, err)
	}
	return data, nil
}

// readAll reads every package file (Selected: sheets and data files) below the folder, skipping folders whose
// names start with ".". Every link that resolves outside the folder is
// named in the error; links to folders inside it are not followed (their
// files are read where they lie).
func (f *folder) readAll() (map[string][]byte, error) {
	files := map[string][]byte{}
	var leaving []error
	// A trailing separator makes the walk follow the folder itself when it
	// is a link: the folder as given is the package, wherever it lies.
	top := f.root + string(filepath.Separator)
	err := filepath.WalkDir(top, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		name := d.Name()
		if d.IsDir() {
			if p != top && strings.HasPrefix(name, ".") {
				return filepath.SkipDir
			}
			return nil
		}
		rel, _ := filepath.Rel(f.root, p)
		rel = filepath.ToSlash(rel)
		if d.Type()&fs.ModeSymlink != 0 {
			real, err := filepath.EvalSymlinks(p)
			if err != nil {
				return fmt.Errorf("cannot read %s: %w", p, err)
			}
			if !f.inside(real) {
				leaving = append(leaving, f.outside(rel, real))
				return nil
			}
			if info, err := os.Stat(p); err == nil && info.IsDir() {
				return nil
			}
		}
		if !Selected(rel) {
			return nil
		}
		data, err := os.ReadFile(p)
		if err != nil {
			return fmt.Errorf("cannot read %s: %w", p, err)
		}
		files[rel] = data
		return nil
	})
	if err != nil {
		return nil, err
	}
	if len(leaving) > 0 {
		return nil, errors.Join(leaving...)
	}
	return files, nil
}

// distinctNames refuses sheets whose paths differ only in the case of
// letters (a.md, a.MD, A.md): their pages would be one file, on every
// system for a.md and a.MD, and where names ignore case for a.md and A.md.
// Data files whose paths differ only in case (bh.csv, BH.csv) are refused
// too: where names ignore case a table would read either.
func distinctNames(paths []string) error {
	byKey := map[string][]string{}
	for _, p := range paths {
		// A sheet's page drops the extension; a data file keeps its name.
		k := "data:" + strings.ToLower(p)
		if isSheet(p) {
			k = strings.ToLower(strings.TrimSuffix(p, path.Ext(p)))
		}
		byKey[k] = append(byKey[k], p)
	}
	var clashes []string
	for _, ps := range byKey {
		if len(ps) > 1 {
			sort.Strings(ps)
			clashes = append(clashes, strings.Join(ps, ", "))
		}
	}
	if len(clashes) == 0 {
		return nil
	}
	sort.Strings(clashes)
	return fmt.Errorf("files whose names differ only in the case of letters would be one file where names ignore case (a sheet's page, or a table's data): %s; rename them so that each name is distinct whatever the case",
		strings.Join(clashes, "; "))
}
