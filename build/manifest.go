package build

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"strings"

	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// ManifestName is the manifest's file name in a built package.
const ManifestName = "sheaf-manifest.json"

// Manifest records what a build was made from and every file it made: a
// built package holds the manifest and the files it lists, nothing else.
type Manifest struct {
	Tool      string               `json:"tool"` // "sheaf <version>"
	Version   string               `json:"version"`
	Stamp     string               `json:"stamp"`
	BuildDate string               `json:"build_date,omitempty"`
	Digits    int                  `json:"digits"`
	Graphs    bool                 `json:"graphs"`
	Sources   []project.SourceFile `json:"sources"`
	Pages     []Page               `json:"pages"`
	// JSON is the JSON document when the build wrote it into the package.
	JSON *Page `json:"json,omitempty"`
	// Sampling lists the Monte Carlo count and seed of each sheet with
	// tolerances, so that a reader can repeat the figures.
	Sampling []Sampling `json:"sampling,omitempty"`
}

// Sampling is the Monte Carlo count and seed one sheet's tolerances were
// sampled with.
type Sampling struct {
	Sheet   string `json:"sheet"`
	Samples int    `json:"samples"`
	Seed    uint64 `json:"seed"`
}

// Page is one output file with its hash; Path is inside the package, with
// forward slashes.
type Page struct {
	Path   string `json:"path"`
	SHA256 string `json:"sha256"`
}

// NewManifest describes a build of res that made pages.
func NewManifest(res *Result, pages []Page) Manifest {
	opt := res.Render
	return Manifest{
		Tool: "sheaf " + opt.Version, Version: opt.Version, Stamp: project.StampOf(res.Package.Files, opt.Version),
		BuildDate: opt.BuildDate, Digits: opt.Digits, Graphs: !opt.NoGraphs, Sources: res.Package.Files, Pages: pages,
		Sampling: samplingOf(res.Package),
	}
}

// samplingOf lists the sheets sampled, in the package's order.
func samplingOf(pkg *project.Package) []Sampling {
	var out []Sampling
	for _, s := range pkg.Sheets {
		if sp := s.Sampled(); sp != nil {
			out = append(out, Sampling{Sheet: s.Path(), Samples: sp.Samples, Seed: sp.Seed})
		}
	}
	return out
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

// ParseManifest reads a manifest and refuses one that sheaf did not write.
func ParseManifest(data []byte) (Manifest, error) {
	var m Manifest
	if err := json.Unmarshal(data, &m); err != nil {
		return m, err
	}
	if !strings.HasPrefix(m.Tool, "sheaf ") {
		return m, fmt.Errorf("its tool is %q, not sheaf", m.Tool)
	}
	return m, nil
}
