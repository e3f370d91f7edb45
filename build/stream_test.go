package build

import (
	"encoding/json"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/render"
)

// TestPagesWrittenAsSheetsEvaluateAreThePagesOfLoad holds the build, which
// renders each sheet's page while the other sheets still compile, to the
// pages of the whole evaluated package rendered at the end, byte for byte
// and in the manifest's order; for a folder with templates and results
// taken across sheets, and for one sheet read with its templates.
func TestPagesWrittenAsSheetsEvaluateAreThePagesOfLoad(t *testing.T) {
	demo := filepath.Join("..", "examples", "tarnwick-weir")
	for _, src := range []string{demo, filepath.Join(demo, "02-coil-emf.md")} {
		t.Run(filepath.Base(src), func(t *testing.T) {
			out := filepath.Join(t.TempDir(), "out")
			opt := Options{Version: "test", Out: out}
			built, err := Run(src, opt)
			if err != nil {
				t.Fatal(err)
			}
			res, err := Load(src, opt)
			if err != nil {
				t.Fatal(err)
			}
			got := tree(t, out)
			var order []string
			if err := res.Pages(func(f render.File) error {
				order = append(order, f.Path)
				if got[f.Path] != string(f.Data) {
					t.Errorf("%s differs from the page rendered after loading", f.Path)
				}
				return nil
			}); err != nil {
				t.Fatal(err)
			}
			var m Manifest
			if err := json.Unmarshal([]byte(got[ManifestName]), &m); err != nil {
				t.Fatal(err)
			}
			var listed []string
			for _, p := range m.Pages {
				listed = append(listed, p.Path)
			}
			if strings.Join(listed, " ") != strings.Join(order, " ") {
				t.Errorf("manifest lists %v, want %v", listed, order)
			}
			if len(got) != len(order)+1 || len(order) < 5 {
				t.Errorf("the build wrote %d files for %d pages", len(got), len(order))
			}
			if err := built.Pages(func(render.File) error { return nil }); err == nil {
				t.Error("the pages of a build that let go of its sheets' trees rendered again")
			}
		})
	}
}
