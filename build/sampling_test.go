package build

import (
	"path/filepath"
	"strings"
	"testing"
)

// The manifest records the Monte Carlo count and seed of every sheet with
// tolerances, so that the figures can be repeated; a sheet without them
// is not listed.
func TestManifestRecordsSampling(t *testing.T) {
	src := writeSources(t, map[string]string{
		"a.md": "# a\n\n```sheaf\nU = 400 V ± 5 % ; supply ; source: spec\nV_w = 450 V ; limit ; source: spec\ncheck U <= V_w\nsample 5000 times, seed 9\n```\n",
		"b.md": "# b\n\n```sheaf\nx = 2 m ; length ; source: drawing\n```\n",
		"c.md": "# c\n\n```sheaf\ny = 2 m ± 1 mm ; length ; source: drawing\nz = 2 * y\n```\n",
	})
	out := filepath.Join(t.TempDir(), "pkg")
	mustBuild(t, src, out)
	m := tree(t, out)[ManifestName]
	want := `"sampling": [
    {
      "sheet": "a.md",
      "samples": 5000,
      "seed": 9
    },
    {
      "sheet": "c.md",
      "samples": 10000,
      "seed": 1
    }
  ]`
	if !strings.Contains(m, want) {
		t.Errorf("manifest lacks the sampling of a.md and c.md (the defaults):\n%s", m)
	}
}
