// Package atomicfile writes files so that a reader sees either the old
// content or the new, never half of either: write a temporary file beside
// the target, then rename it over the target. It does not wait for the
// disk (fsync): what sheaf writes is rebuilt from the sources, and a
// thousand-page package would spend most of its build waiting.
package atomicfile

import (
	"io"
	"os"
	"path/filepath"
)

// Write replaces path with data atomically, creating parent folders.
func Write(path string, data []byte, perm os.FileMode) error {
	return WriteFunc(path, perm, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// WriteFunc replaces path atomically with what fill writes.
func WriteFunc(path string, perm os.FileMode, fill func(io.Writer) error) error {
	dir := filepath.Dir(path)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return err
	}
	name := tmp.Name()
	ok := false
	defer func() {
		if !ok {
			_ = tmp.Close()
			_ = os.Remove(name)
		}
	}()
	if err := fill(tmp); err != nil {
		return err
	}
	if err := tmp.Close(); err != nil {
		return err
	}
	if err := os.Chmod(name, perm); err != nil {
		return err
	}
	if err := os.Rename(name, path); err != nil {
		return err
	}
	ok = true
	return nil
}
