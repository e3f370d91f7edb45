package project

import (
	"archive/tar"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path"
	"strings"
)

// LoadRevision reads a package as it was at a git revision. spec is
// "<revision>:<folder>", as git names a tree: "HEAD~1:examples/job" or
// "v1.2:calcs". The folder is taken relative to the current directory.
// It needs git on the PATH.
func LoadRevision(spec string) (*Package, error) {
	rev, folder, ok := strings.Cut(spec, ":")
	if !ok || rev == "" {
		return nil, fmt.Errorf("%q is neither a folder nor <git revision>:<folder>", spec)
	}
	if folder == "" {
		folder = "."
	}
	// git archive names files relative to the current directory.
	root := path.Clean(strings.ReplaceAll(folder, "\\", "/"))
	if root == ".." || strings.HasPrefix(root, "../") || path.IsAbs(root) {
		return nil, fmt.Errorf("%s: name a folder below the current directory, or run sheaf from a folder that contains it", spec)
	}
	archive, err := git("archive", "--format=tar", rev, "--", pathspec(folder))
	if err != nil {
		return nil, err
	}
	files := map[string][]byte{}
	tr := tar.NewReader(bytes.NewReader(archive))
	for {
		h, err := tr.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("reading %s from git: %w", spec, err)
		}
		if h.Typeflag != tar.TypeReg {
			continue
		}
		rel := strings.TrimPrefix(h.Name, root+"/")
		if root == "." {
			rel = h.Name
		}
		if rel == h.Name && root != "." || !Selected(rel) {
			continue
		}
		data, err := io.ReadAll(tr)
		if err != nil {
			return nil, err
		}
		files[rel] = data
	}
	if !hasSheets(files) {
		return nil, fmt.Errorf("%s holds no Markdown sheets at revision %s", folder, rev)
	}
	if err := distinctNames(mapKeys(files)); err != nil {
		return nil, fmt.Errorf("%s: %w", spec, err)
	}
	return FromFiles(spec, files), nil
}

func pathspec(folder string) string {
	if folder == "." {
		return "."
	}
	return strings.TrimSuffix(folder, "/")
}

// Selected is the one rule that says which files of a folder, or of a git
// revision of it, make up a package: Markdown sheets (.md, any case) and
// CSV data files (.csv, any case) that lie in no folder whose name starts
// with "." (a folder starting with "_" holds templates, which belong to
// the package). rel is the file's path inside the package, with forward
// slashes.
func Selected(rel string) bool {
	if !isSheet(rel) && !isData(rel) {
		return false
	}
	parts := strings.Split(rel, "/")
	for _, p := range parts[:len(parts)-1] {
		if strings.HasPrefix(p, ".") {
			return false
		}
	}
	return true
}

// isSheet reports whether a package file is a Markdown sheet by its name.
func isSheet(rel string) bool { return strings.EqualFold(path.Ext(rel), ".md") }

// isData reports whether a package file is a CSV data file by its name.
func isData(rel string) bool { return strings.EqualFold(path.Ext(rel), ".csv") }

// hasSheets reports whether the files hold at least one sheet.
func hasSheets(files map[string][]byte) bool {
	for p := range files {
		if isSheet(p) {
			return true
		}
	}
	return false
}

func git(args ...string) ([]byte, error) {
	cmd := exec.Command("git", args...)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		var ee *exec.Error
		if errors.As(err, &ee) {
			return nil, fmt.Errorf("reading a git revision needs git on the PATH: %w", err)
		}
		return nil, fmt.Errorf("git %s: %s", strings.Join(args, " "), strings.TrimSpace(stderr.String()))
	}
	return out, nil
}

// LoadAny reads a package from a folder or file, or, when no such path
// exists and the argument has the form <revision>:<folder>, from git.
func LoadAny(arg string) (*Package, error) {
	if _, err := os.Stat(arg); err == nil || !strings.Contains(arg, ":") {
		return Load(arg)
	}
	return LoadRevision(arg)
}
