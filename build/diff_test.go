package build

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The diff and audit pages are never written into the sources, and the
// diff reports a moved result to the digits asked for.
func TestDiffAndAuditPagesStayOutOfTheSources(t *testing.T) {
	old := writeSources(t, map[string]string{"u.md": "```sheaf\nU = 9.712345 kV ; stress ; source: study\nV = 2 * U ; twice\n```\n"})
	src := writeSources(t, map[string]string{"u.md": "```sheaf\nU = 9.812345 kV ; stress ; source: study\nV = 2 * U ; twice\n```\n"})
	before := tree(t, src)
	var out bytes.Buffer
	if _, err := Diff(old, src, DiffOptions{Threshold: 1e-4, Digits: 6, HTML: filepath.Join(src, "changes.html")}, &out); err == nil ||
		!strings.Contains(err.Error(), "inside the package's sources") {
		t.Errorf("diff --html into the sources: %v", err)
	}
	opt := opts("")
	opt.AuditHTML = filepath.Join(src, "audit.html")
	if _, err := Run(src, opt); err == nil || !strings.Contains(err.Error(), "inside the package's sources") {
		t.Errorf("audit --html into the sources: %v", err)
	}
	sameTree(t, src, before)

	page := filepath.Join(t.TempDir(), "changes.html")
	if _, err := Diff(old, src, DiffOptions{Threshold: 1e-4, Digits: 6, HTML: page}, &out); err != nil {
		t.Fatal(err)
	}
	// V = 19.4247 kV before and 19.6247 kV after, to six figures.
	if !strings.Contains(out.String(), "19.4247 kV → 19.6247 kV") {
		t.Errorf("diff output:\n%s", out.String())
	}
	if data, err := os.ReadFile(page); err != nil || !bytes.Contains(data, []byte("19.6247")) {
		t.Errorf("diff page: %v", err)
	}
}
