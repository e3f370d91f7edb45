// Package verify proves that a delivered calculation package was built from
// the sources it names. A build writes a manifest beside its pages: the tool
// version, the package stamp, the hash of every source file and of every
// page. Verify reads the sources again, recomputes the stamp, rebuilds the
// pages in memory, and names every file that differs.
package verify

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"sort"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// ManifestName is the manifest's file name in a built package.
const ManifestName = "sheaf-manifest.json"

// Manifest records what a build was made from and what it made.
type Manifest struct {
	Tool      string               `json:"tool"` // "sheaf <version>"
	Version   string               `json:"version"`
	Stamp     string               `json:"stamp"`
	BuildDate string               `json:"build_date,omitempty"`
	Digits    int                  `json:"digits"`
	Graphs    bool                 `json:"graphs"`
	Sources   []project.SourceFile `json:"sources"`
	Pages     []Page               `json:"pages"`
}

// Page is one output file with its hash.
type Page struct {
	Path   string `json:"path"`
	SHA256 string `json:"sha256"`
}

// NewManifest describes a build.
func NewManifest(pkg *project.Package, opt render.Options, pages []Page) Manifest {
	return Manifest{
		Tool: "sheaf " + opt.Version, Version: opt.Version, Stamp: project.StampOf(pkg.Files, opt.Version),
		BuildDate: opt.BuildDate, Digits: opt.Digits, Graphs: !opt.NoGraphs, Sources: pkg.Files, Pages: pages,
	}
}

// PageOf hashes an output file for the manifest.
func PageOf(f render.File) Page {
	sum := sha256.Sum256(f.Data)
	return Page{Path: f.Path, SHA256: hex.EncodeToString(sum[:])}
}

// Marshal writes the manifest as indented JSON.
func (m Manifest) Marshal() ([]byte, error) {
	data, err := json.MarshalIndent(m, "", "  ")
	return append(data, '\n'), err
}

// Problem is one reason a package does not verify.
type Problem struct {
	File    string // the source or page concerned, or "" for the package
	Message string
}

// Result is the outcome of a verification.
type Result struct {
	Manifest Manifest
	Stamp    string // the stamp recomputed from the sources
	Problems []Problem
}

// OK reports whether the package verified.
func (r Result) OK() bool { return len(r.Problems) == 0 }

var stampMeta = regexp.MustCompile(`<meta name="sheaf-stamp" content="([^"]*)">`)

// Verify checks a built package folder against a source folder.
func Verify(built, sources, toolVersion string) (Result, error) {
	var r Result
	data, err := os.ReadFile(filepath.Join(built, ManifestName))
	if err != nil {
		return r, fmt.Errorf("%s has no %s: was it built by sheaf? (%w)", built, ManifestName, err)
	}
	if err := json.Unmarshal(data, &r.Manifest); err != nil {
		return r, fmt.Errorf("%s: %w", filepath.Join(built, ManifestName), err)
	}
	m := r.Manifest
	pkg, err := project.Load(sources)
	if err != nil {
		return r, err
	}
	problem := func(file, format string, args ...any) {
		r.Problems = append(r.Problems, Problem{File: file, Message: fmt.Sprintf(format, args...)})
	}

	// The sources, file by file.
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
			problem(f.Path, "this source differs from the one the package was built from (SHA-256 %s…, built from %s…)", f.SHA256[:12], w.SHA256[:12])
		}
	}
	for _, f := range m.Sources {
		if !have[f.Path] {
			problem(f.Path, "the package was built from this source, which is missing")
		}
	}

	// The stamp, as every page states it.
	r.Stamp = project.StampOf(pkg.Files, m.Version)
	if r.Stamp != m.Stamp {
		problem("", "the sources give the stamp %s, the package states %s", r.Stamp, m.Stamp)
	}
	delivered := map[string][]byte{}
	for _, pg := range m.Pages {
		data, err := os.ReadFile(filepath.Join(built, filepath.FromSlash(pg.Path)))
		if err != nil {
			problem(pg.Path, "page listed in the manifest is missing")
			continue
		}
		delivered[pg.Path] = data
		sum := sha256.Sum256(data)
		if hex.EncodeToString(sum[:]) != pg.SHA256 {
			problem(pg.Path, "page has been changed since it was built")
		}
		if sm := stampMeta.FindSubmatch(data); sm != nil && string(sm[1]) != m.Stamp {
			problem(pg.Path, "page states the stamp %s, not the package's", sm[1])
		}
	}

	// A rebuild with the same tool must give the same pages.
	if m.Version != toolVersion {
		problem("", "the package was built by sheaf %s and this is sheaf %s: the pages cannot be rebuilt to compare", m.Version, toolVersion)
		return r, nil
	}
	if len(r.Problems) > 0 {
		return r, nil // the sources already differ; a rebuild would only repeat it
	}
	report := audit.Run(pkg)
	opt := render.Options{Version: toolVersion, Digits: m.Digits, NoGraphs: !m.Graphs, BuildDate: m.BuildDate, Audit: &report}
	rebuilt := map[string]bool{}
	err = render.WriteHTML(pkg, opt, func(f render.File) error {
		rebuilt[f.Path] = true
		if d, ok := delivered[f.Path]; ok && !bytes.Equal(d, f.Data) {
			problem(f.Path, "page differs from a rebuild of these sources")
		} else if !ok {
			problem(f.Path, "a rebuild makes this page, which the package lacks")
		}
		return nil
	})
	if err != nil {
		return r, err
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
	return r, nil
}
