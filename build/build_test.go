package build

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"testing"

	"github.com/sheaf-calc/sheaf/render"
)

// sheetA and sheetB are two revisions of a small package: B changes a
// value in one sheet and deletes another.
var (
	sheetA = map[string]string{
		"coil.md": "# Coil\n\n```sheaf\nN = 120 ; turns ; source: drawing C-1\nI = 4 A ; field current ; source: test T-1\nF = N * I\ncheck F <= 600 A\n```\n",
		"gap.md":  "# Gap\n\n```sheaf\ng = 2 mm ; air gap ; source: drawing C-2\n```\n",
	}
	sheetB = map[string]string{
		"coil.md": "# Coil\n\n```sheaf\nN = 130 ; turns ; source: drawing C-1\nI = 4 A ; field current ; source: test T-1\nF = N * I\ncheck F <= 600 A\n```\n",
	}
)

// writeSources writes a package's files into a new folder.
func writeSources(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for p, body := range files {
		full := filepath.Join(dir, filepath.FromSlash(p))
		if err := os.MkdirAll(filepath.Dir(full), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(full, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// tree returns every file below dir, keyed by its path; nil if dir is missing.
func tree(t *testing.T, dir string) map[string]string {
	t.Helper()
	files := map[string]string{}
	err := filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		data, err := os.ReadFile(p)
		rel, _ := filepath.Rel(dir, p)
		files[filepath.ToSlash(rel)] = string(data)
		return err
	})
	if errors.Is(err, os.ErrNotExist) {
		return nil
	}
	if err != nil {
		t.Fatal(err)
	}
	return files
}

func opts(out string) Options {
	return Options{Version: "test", NoGraphs: true, Out: out}
}

// mustBuild builds src into out and fails the test on any error.
func mustBuild(t *testing.T, src, out string) {
	t.Helper()
	if _, err := Run(src, opts(out)); err != nil {
		t.Fatalf("build %s into %s: %v", src, out, err)
	}
}

// leftovers lists the hidden staging and aside folders beside out.
func leftovers(t *testing.T, out string) []string {
	t.Helper()
	entries, err := os.ReadDir(filepath.Dir(out))
	if err != nil {
		t.Fatal(err)
	}
	var left []string
	for _, e := range entries {
		if strings.Contains(e.Name(), ".sheaf-staging") || strings.Contains(e.Name(), ".sheaf-old") {
			left = append(left, e.Name())
		}
	}
	return left
}

// sameTree fails unless dir holds exactly the files of want.
func sameTree(t *testing.T, dir string, want map[string]string) {
	t.Helper()
	got := tree(t, dir)
	for p, body := range want {
		if got[p] != body {
			t.Errorf("%s changed or is missing", p)
		}
	}
	for p := range got {
		if _, ok := want[p]; !ok {
			t.Errorf("%s was added", p)
		}
	}
}

func TestFailingWriteLeavesThePreviousPackage(t *testing.T) {
	a, b := writeSources(t, sheetA), writeSources(t, sheetB)
	out := filepath.Join(t.TempDir(), "pkg")
	mustBuild(t, a, out)
	before := tree(t, out)

	// The disk fills up, or the folder turns read-only, at the third file.
	for _, fault := range []error{syscall.ENOSPC, syscall.EROFS} {
		n := 0
		writeFile = func(name string, data []byte, perm os.FileMode) error {
			if n++; n == 3 {
				return &os.PathError{Op: "write", Path: name, Err: fault}
			}
			return os.WriteFile(name, data, perm)
		}
		_, err := Run(b, opts(out))
		writeFile = os.WriteFile
		if err == nil || !errors.Is(err, fault) || !strings.Contains(err.Error(), "is left as it was") {
			t.Fatalf("a build whose write fails with %v: error %v", fault, err)
		}
		sameTree(t, out, before)
		if left := leftovers(t, out); len(left) > 0 {
			t.Errorf("a failed build left %v beside the package", left)
		}
	}

	// The next build succeeds, and the page of the deleted sheet is gone.
	mustBuild(t, b, out)
	after := tree(t, out)
	if _, ok := after["sheets/gap.html"]; ok {
		t.Error("the page of a deleted sheet survived the rebuild")
	}
	if _, ok := after["sheets/coil.html"]; !ok || after["sheets/coil.html"] == before["sheets/coil.html"] {
		t.Error("the rebuild did not replace the changed sheet's page")
	}
}

func TestSecondBuildIntoTheSameFolderIsRefused(t *testing.T) {
	a, b := writeSources(t, sheetA), writeSources(t, sheetB)
	out := filepath.Join(t.TempDir(), "pkg")
	started, release := make(chan struct{}), make(chan struct{})
	var once sync.Once
	writeFile = func(name string, data []byte, perm os.FileMode) error {
		once.Do(func() { close(started); <-release })
		return os.WriteFile(name, data, perm)
	}
	defer func() { writeFile = os.WriteFile }()
	first := make(chan error)
	go func() {
		_, err := Run(a, opts(out))
		first <- err
	}()
	<-started // the first build is half-way through writing
	_, err := Run(b, opts(out))
	close(release)
	if err == nil || !strings.Contains(err.Error(), "another sheaf build is writing "+out) {
		t.Errorf("second build while the first runs: %v", err)
	}
	if err := <-first; err != nil {
		t.Fatalf("first build: %v", err)
	}
	res, err := Load(a, opts(out))
	if err != nil {
		t.Fatal(err)
	}
	if got, want := tree(t, out)["sheets/coil.html"], pageOf(t, res, "sheets/coil.html"); got != want {
		t.Error("the package is not the first build's")
	}
	// Once the first build is done, the folder is free again.
	mustBuild(t, b, out)
}

// pageOf renders one page of a package in memory.
func pageOf(t *testing.T, res *Result, path string) string {
	t.Helper()
	var page string
	if err := res.Pages(func(f render.File) error {
		if f.Path == path {
			page = string(f.Data)
		}
		return nil
	}); err != nil {
		t.Fatal(err)
	}
	return page
}

func TestRefusesAFolderOfTheUsersOwnFiles(t *testing.T) {
	src := writeSources(t, sheetA)
	out := writeSources(t, map[string]string{"notes.txt": "my notes", "index.html": "my own page"})
	_, err := Run(src, opts(out))
	if err == nil || !strings.Contains(err.Error(), "holds files that sheaf did not write") || !strings.Contains(err.Error(), out) {
		t.Fatalf("build into a folder of the user's files: %v", err)
	}
	sameTree(t, out, map[string]string{"notes.txt": "my notes", "index.html": "my own page"})

	// An empty folder, and one that sheaf built, are fine.
	empty := t.TempDir()
	mustBuild(t, src, empty)
	mustBuild(t, src, empty)
	// A file is not a folder.
	file := filepath.Join(out, "notes.txt")
	if _, err := Run(src, opts(file)); err == nil || !strings.Contains(err.Error(), "is a file, not a folder") {
		t.Errorf("build into a file: %v", err)
	}
}

func TestNeverWritesIntoTheSources(t *testing.T) {
	src := writeSources(t, sheetA)
	before := tree(t, src)
	for _, c := range []struct{ name, out, json, want string }{
		{"-o the source folder", src, "", "lies inside the package's sources"},
		{"-o below the sources", filepath.Join(src, "html"), "", "lies inside the package's sources"},
		{"-o above the sources", filepath.Dir(src), "", "holds the package's sources"},
		{"--json onto a sheet", "", filepath.Join(src, "coil.md"), "--json " + filepath.Join(src, "coil.md") + " lies inside the package's sources"},
		{"--json beside the sheets", filepath.Join(t.TempDir(), "pkg"), filepath.Join(src, "p.json"), "lies inside the package's sources"},
	} {
		t.Run(c.name, func(t *testing.T) {
			opt := opts(c.out)
			opt.JSON = c.json
			_, err := Run(src, opt)
			if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "for example") {
				t.Errorf("error %v, want %q and what to do", err, c.want)
			}
		})
	}
	// One sheet given: its folder is the sources.
	opt := opts("")
	opt.JSON = filepath.Join(src, "coil.md")
	if _, err := Run(filepath.Join(src, "coil.md"), opt); err == nil {
		t.Error("check --json onto the sheet itself was not refused")
	}
	sameTree(t, src, before)
}

func TestJSONInsideThePackageIsListed(t *testing.T) {
	src := writeSources(t, sheetA)
	out := filepath.Join(t.TempDir(), "pkg")
	opt := opts(out)
	opt.JSON = filepath.Join(out, "data", "package.json")
	if _, err := Run(src, opt); err != nil {
		t.Fatal(err)
	}
	m, err := ParseManifest([]byte(tree(t, out)[ManifestName]))
	if err != nil {
		t.Fatal(err)
	}
	data := tree(t, out)["data/package.json"]
	if m.JSON == nil || m.JSON.Path != "data/package.json" || m.JSON.SHA256 != PageOf(render.File{Data: []byte(data)}).SHA256 {
		t.Errorf("manifest lists the JSON as %+v", m.JSON)
	}
	// The JSON may not take a page's place.
	opt.JSON = filepath.Join(out, "index.html")
	if _, err := Run(src, opt); err == nil || !strings.Contains(err.Error(), "would replace a file of the package") {
		t.Errorf("--json onto the index: %v", err)
	}
}

func TestLeftoversOfAKilledBuildAreCleanedUp(t *testing.T) {
	a, b := writeSources(t, sheetA), writeSources(t, sheetB)
	parent := t.TempDir()
	out := filepath.Join(parent, "pkg")
	mustBuild(t, a, out)
	old := tree(t, out)

	// Killed while staging: a half-written staging folder.
	staging := filepath.Join(parent, ".pkg.sheaf-staging")
	if err := os.MkdirAll(filepath.Join(staging, "sheets"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(staging, "index.html"), []byte("half"), 0o644); err != nil {
		t.Fatal(err)
	}
	// Killed between the two renames where folders cannot be exchanged:
	// the previous package lies aside and the output is missing. A failing
	// build restores it.
	if err := os.Rename(out, filepath.Join(parent, ".pkg.sheaf-old")); err != nil {
		t.Fatal(err)
	}
	writeFile = func(string, []byte, os.FileMode) error { return syscall.ENOSPC }
	_, err := Run(b, opts(out))
	writeFile = os.WriteFile
	if err == nil {
		t.Fatal("the failing build succeeded")
	}
	sameTree(t, out, old)
	if left := leftovers(t, out); len(left) > 0 {
		t.Errorf("leftovers %v not cleaned up", left)
	}
	mustBuild(t, b, out)
	if left := leftovers(t, out); len(left) > 0 {
		t.Errorf("leftovers %v after a good build", left)
	}
}

func TestSwapWithoutExchange(t *testing.T) {
	a, b := writeSources(t, sheetA), writeSources(t, sheetB)
	out := filepath.Join(t.TempDir(), "pkg")
	exchangeFolders = func(string, string) error { return errNoExchange }
	defer func() { exchangeFolders = exchange }()
	mustBuild(t, a, out)
	mustBuild(t, b, out)
	res, err := Load(b, opts(out))
	if err != nil {
		t.Fatal(err)
	}
	if got := tree(t, out); got["sheets/coil.html"] != pageOf(t, res, "sheets/coil.html") || got["sheets/gap.html"] != "" {
		t.Error("the package after a two-rename swap is not the second build's")
	}
	if left := leftovers(t, out); len(left) > 0 {
		t.Errorf("leftovers %v", left)
	}
}

// A read-only folder in the previous package does not stop the build
// from replacing it whole. (Root writes into read-only folders, so the
// fault is real only for other users; the failing writes above cover it
// for everyone.)
func TestReadOnlySheetsFolder(t *testing.T) {
	if os.Geteuid() == 0 {
		t.Skip("root writes into read-only folders")
	}
	a, b := writeSources(t, sheetA), writeSources(t, sheetB)
	out := filepath.Join(t.TempDir(), "pkg")
	mustBuild(t, a, out)
	if err := os.Chmod(filepath.Join(out, "sheets"), 0o555); err != nil {
		t.Fatal(err)
	}
	mustBuild(t, b, out)
	res, err := Load(b, opts(out))
	if err != nil {
		t.Fatal(err)
	}
	if got := tree(t, out); got["sheets/coil.html"] != pageOf(t, res, "sheets/coil.html") || !bytes.Contains([]byte(got[ManifestName]), []byte(res.Package.Files[0].SHA256)) {
		t.Error("the package is not the second build's")
	}
	if left := leftovers(t, out); len(left) > 0 {
		t.Errorf("leftovers %v", left)
	}
}
