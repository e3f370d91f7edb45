// Package verify proves that a delivered calculation package was built from
// the sources it names. A build writes a manifest beside its pages: the tool
// version, the package stamp, the hash of every source file and of every
// page. The package pages state the package stamp; each sheet's page states
// the stamp of the sources it rests on (its sheet, the templates it uses,
// the sheets it takes from), so that an edit changes only the pages it
// touches. Verify reads the sources again, recomputes every stamp, rebuilds
// the pages in memory, and names every file that differs and every file of
// the package that the manifest does not list.
package verify

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strings"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// Problem is one reason a package does not verify.
type Problem struct {
	File    string // the source or page concerned, or "" for the package
	Message string
}

// Result is the outcome of a verification.
type Result struct {
	Manifest build.Manifest
	Stamp    string // the stamp recomputed from the sources
	Problems []Problem
}

// OK reports whether the package verified.
func (r Result) OK() bool { return len(r.Problems) == 0 }

var stampMeta = regexp.MustCompile(`<meta name="sheaf-stamp" content="([^"]*)">`)

// Verify checks a built package folder against a source folder. It reads
// only files inside the built folder, and holds the folder to exactly the
// files its manifest lists.
func Verify(built, sources, toolVersion string) (Result, error) {
	var r Result
	root, err := os.OpenRoot(built)
	if err != nil {
		return r, fmt.Errorf("cannot read the package %s: %w", built, err)
	}
	defer root.Close()
	data, err := root.ReadFile(build.ManifestName)
	if err != nil {
		return r, fmt.Errorf("%s has no %s: was it built by sheaf? (%w)", built, build.ManifestName, err)
	}
	if r.Manifest, err = build.ParseManifest(data); err != nil {
		return r, fmt.Errorf("%s: not a manifest sheaf wrote: %w", filepath.Join(built, build.ManifestName), err)
	}
	m := r.Manifest
	problem := func(file, format string, args ...any) {
		r.Problems = append(r.Problems, Problem{File: file, Message: fmt.Sprintf(format, args...)})
	}
	digits := m.Digits
	if digits < 1 || digits > 15 {
		problem(build.ManifestName, "the manifest states %d significant figures, and a build states 1 to 15", digits)
		digits = 0 // the default, to go on comparing the sources
	}
	res, err := build.Load(sources, build.Options{Version: toolVersion, Digits: digits, NoGraphs: !m.Graphs})
	if err != nil {
		return r, err
	}
	res.Render.BuildDate = m.BuildDate
	pkg := res.Package
	checkSources(m, pkg, problem)

	// The package stamp, as the manifest and the package pages state it.
	r.Stamp = project.StampOf(pkg.Files, m.Version)
	if r.Stamp != m.Stamp {
		problem("", "the sources give the stamp %s, the package states %s", r.Stamp, m.Stamp)
	}
	delivered := readListed(root, m, pageStamps(pkg, m), problem)
	checkUnlisted(root, m, problem)

	// A rebuild with the same tool must give the same pages.
	if m.Version != toolVersion {
		problem("", "the package was built by sheaf %s and this is sheaf %s: the pages cannot be rebuilt to compare", m.Version, toolVersion)
		return r, nil
	}
	if len(r.Problems) > 0 {
		return r, nil // the sources already differ; a rebuild would only repeat it
	}
	return r, rebuild(res, m, delivered, problem)
}

// checkSources compares the sources, file by file, with the manifest's.
func checkSources(m build.Manifest, pkg *project.Package, problem func(file, format string, args ...any)) {
	want := map[string]project.SourceFile{}
	for _, f := range m.Sources {
		want[f.Path] = f
	}
	have := map[string]bool{}
	for _, f := range pkg.Files {
		have[f.Path] = true
		w, ok := want[f.Path]
		switch {
		case !ok:
			problem(f.Path, "this source is not among the files the package was built from")
		case w.SHA256 != f.SHA256:
			problem(f.Path, "this source differs from the one the package was built from (SHA-256 %s…, built from %s…)", short(f.SHA256), short(w.SHA256))
		}
	}
	for _, f := range m.Sources {
		if !have[f.Path] {
			problem(f.Path, "the package was built from this source, which is missing")
		}
	}
}

// short is the start of a hash, for messages.
func short(h string) string {
	if len(h) > 12 {
		return h[:12]
	}
	return h
}

// listed is every file the manifest lists, the manifest included.
func listed(m build.Manifest) []build.Page {
	files := append([]build.Page(nil), m.Pages...)
	if m.JSON != nil {
		files = append(files, *m.JSON)
	}
	return files
}

// inside reports whether a manifest path names a file inside the package:
// relative, with forward slashes, and no "." or ".." element.
func inside(p string) bool {
	return fs.ValidPath(p) && p != "." && !strings.Contains(p, "\\")
}

// pageStamp is the stamp a page must state: on a sheet's page the stamp
// of the sources that page rests on, on any other the manifest's.
type pageStamp func(page string) (stamp, what string)

// pageStamps works out, from the sources, the stamp each page must state.
func pageStamps(pkg *project.Package, m build.Manifest) pageStamp {
	bySheet := map[string]string{}
	for _, s := range pkg.Sheets {
		bySheet[s.Page] = pkg.SheetStamp(s, m.Version)
	}
	return func(page string) (string, string) {
		if st, ok := bySheet[page]; ok {
			return st, "the sources this sheet rests on give"
		}
		return m.Stamp, "the package's is"
	}
}

// readListed reads and hashes every file the manifest lists, refusing any
// path that would leave the package, checks the stamp each page states,
// and returns the contents by path.
func readListed(root *os.Root, m build.Manifest, want pageStamp, problem func(file, format string, args ...any)) map[string][]byte {
	delivered := map[string][]byte{}
	for _, pg := range listed(m) {
		if !inside(pg.Path) || pg.Path == build.ManifestName {
			problem(pg.Path, "the manifest names this file, which is not a file of the package; a manifest sheaf writes names only files inside it")
			continue
		}
		if _, dup := delivered[pg.Path]; dup {
			problem(pg.Path, "the manifest lists this file twice")
			continue
		}
		data, err := root.ReadFile(pg.Path)
		if errors.Is(err, fs.ErrNotExist) {
			problem(pg.Path, "page listed in the manifest is missing")
			continue
		}
		if err != nil {
			problem(pg.Path, "page listed in the manifest cannot be read inside the package: %v", err)
			continue
		}
		delivered[pg.Path] = data
		sum := sha256.Sum256(data)
		if hex.EncodeToString(sum[:]) != pg.SHA256 {
			problem(pg.Path, "page has been changed since it was built")
		}
		if sm := stampMeta.FindSubmatch(data); sm != nil {
			if stamp, what := want(pg.Path); string(sm[1]) != stamp {
				problem(pg.Path, "page states the stamp %s; %s %s", sm[1], what, stamp)
			}
		} else if strings.HasSuffix(pg.Path, ".html") {
			problem(pg.Path, "page states no stamp; every page a build makes states one")
		}
	}
	return delivered
}

// checkUnlisted names every file in the package that the manifest does not
// list: an added page, a stale page of a deleted sheet, a script.
func checkUnlisted(root *os.Root, m build.Manifest, problem func(file, format string, args ...any)) {
	known := map[string]bool{build.ManifestName: true}
	for _, pg := range listed(m) {
		known[pg.Path] = true
	}
	err := fs.WalkDir(root.FS(), ".", func(p string, d fs.DirEntry, err error) error {
		switch {
		case err != nil:
			problem(p, "cannot be read: %v", err)
		case d.IsDir():
		case !known[p]:
			problem(p, "the package holds this file, which the manifest does not list")
		case !d.Type().IsRegular():
			problem(p, "this file of the package is not a plain file (a link or a device)")
		}
		return nil
	})
	if err != nil {
		problem("", "cannot list the package's files: %v", err)
	}
}

// rebuild renders the pages and the JSON again and compares them with the
// delivered ones.
func rebuild(res *build.Result, m build.Manifest, delivered map[string][]byte, problem func(file, format string, args ...any)) error {
	rebuilt := map[string]bool{}
	err := res.Pages(func(f render.File) error {
		rebuilt[f.Path] = true
		if d, ok := delivered[f.Path]; ok && !bytes.Equal(d, f.Data) {
			problem(f.Path, "page differs from a rebuild of these sources")
		} else if !ok {
			problem(f.Path, "a rebuild makes this page, which the package lacks")
		}
		return nil
	})
	if err != nil {
		return err
	}
	if m.JSON != nil {
		rebuilt[m.JSON.Path] = true
		h := sha256.New()
		if err := res.WriteJSON(h); err != nil {
			return err
		}
		if hex.EncodeToString(h.Sum(nil)) != m.JSON.SHA256 {
			problem(m.JSON.Path, "the JSON differs from a rebuild of these sources")
		}
	}
	var extra []string
	for p := range delivered {
		if !rebuilt[p] {
			extra = append(extra, p)
		}
	}
	sort.Strings(extra)
	for _, p := range extra {
		problem(p, "the package holds this page, which a rebuild does not make")
	}
	return nil
}
