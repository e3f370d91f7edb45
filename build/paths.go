package build

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// sourceFolder is the folder whose files make the package at src: src
// itself, or the folder of the one sheet src names.
func sourceFolder(src string) (string, error) {
	info, err := os.Stat(src)
	if err != nil {
		return "", fmt.Errorf("cannot read %s: %w", src, err)
	}
	if !info.IsDir() {
		src = filepath.Dir(src)
	}
	return resolve(src)
}

// resolve makes p absolute and resolves the symlinks in the part of it
// that exists, so that two names of one folder compare equal.
func resolve(p string) (string, error) {
	abs, err := filepath.Abs(p)
	if err != nil {
		return "", err
	}
	rest := ""
	for dir := abs; ; dir = filepath.Dir(dir) {
		real, err := filepath.EvalSymlinks(dir)
		if err == nil {
			return filepath.Join(real, rest), nil
		}
		if !errors.Is(err, fs.ErrNotExist) || dir == filepath.Dir(dir) {
			return "", err
		}
		rest = filepath.Join(filepath.Base(dir), rest)
	}
}

// within reports whether p is dir or lies below it; both are resolved.
func within(p, dir string) bool {
	rel, err := filepath.Rel(dir, p)
	return err == nil && filepath.IsLocal(rel)
}

// Outside refuses a file that a flag names when it lies inside the
// package's source folder: sheaf never writes among the sources (a JSON
// written to sheet.md would replace the sheet). ext is the extension of
// the file the message suggests instead.
func Outside(path, sources, flag, ext string) error {
	p, err := resolve(path)
	if err != nil {
		return fmt.Errorf("%s %s: %w", flag, path, err)
	}
	if within(p, sources) {
		return fmt.Errorf("%s %s lies inside the package's sources (%s): sheaf never writes there; "+
			"write it outside, for example to %s", flag, path, sources, filepath.Join(filepath.Dir(sources), filepath.Base(sources)+ext))
	}
	return nil
}
