package project_test

import (
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

// writeFiles writes files (path → content, forward slashes) below dir.
func writeFiles(t *testing.T, dir string, files map[string]string) {
	t.Helper()
	for p, content := range files {
		full := filepath.Join(dir, filepath.FromSlash(p))
		if err := os.MkdirAll(filepath.Dir(full), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(full, []byte(content), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

func symlink(t *testing.T, target, link string) {
	t.Helper()
	if err := os.Symlink(target, link); err != nil {
		t.Skipf("cannot make symbolic links here: %v", err)
	}
}

// secret is the content of a file outside the package that a link points
// to; it must never come back in a package or a message.
const secret = "# Outside\n\nroot:x:0:0:secret-line-42\n\n```sheaf\ns = 42 m\n```\n"

// loadFails asserts that Load refuses dir, naming each of want, saying
// what to do, and showing nothing of the target.
func loadFails(t *testing.T, dir string, want ...string) {
	t.Helper()
	pkg, err := project.Load(dir)
	if err == nil {
		t.Fatalf("loaded a package with %d sheets; want an error", len(pkg.Sheets))
	}
	msg := err.Error()
	for _, w := range want {
		if !strings.Contains(msg, w) {
			t.Errorf("error does not name %s: %s", w, msg)
		}
	}
	if strings.Contains(msg, "secret-line-42") {
		t.Errorf("error shows the target's content: %s", msg)
	}
}

// A sheet that is a link to a file outside the package (a passwd.md link
// put the file's lines into a page) is refused, naming the link.
func TestSymlinkedSheetOutsideRefused(t *testing.T) {
	base := t.TempDir()
	writeFiles(t, base, map[string]string{"outside/passwd": secret, "pkg/a.md": otherSheet})
	pkg := filepath.Join(base, "pkg")
	symlink(t, filepath.Join(base, "outside", "passwd"), filepath.Join(pkg, "passwd.md"))
	loadFails(t, pkg, filepath.Join(pkg, "passwd.md")+" is a symbolic link to "+filepath.Join(base, "outside", "passwd"),
		"outside the package folder", "copy the file into the package, or remove the link")
	// Asked for by name, the sheet is refused too.
	loadFails(t, filepath.Join(pkg, "passwd.md"), "passwd.md is a symbolic link", "outside the package folder")
}

// A template that is a link out of the package, and a folder that is a
// link out of it, are refused in the same way.
func TestSymlinkedTemplateAndFolderOutsideRefused(t *testing.T) {
	base := t.TempDir()
	writeFiles(t, base, map[string]string{
		"outside/coil.md":     secret,
		"outside/shared/x.md": secret,
		"pkg/a.md":            "```sheaf\nuse c = _t/coil\nl = 2 m\n```\n",
	})
	pkg := filepath.Join(base, "pkg")
	if err := os.Mkdir(filepath.Join(pkg, "_t"), 0o755); err != nil {
		t.Fatal(err)
	}
	symlink(t, filepath.Join(base, "outside", "coil.md"), filepath.Join(pkg, "_t", "coil.md"))
	symlink(t, filepath.Join(base, "outside", "shared"), filepath.Join(pkg, "shared"))
	loadFails(t, pkg, filepath.Join(pkg, "_t", "coil.md")+" is a symbolic link", filepath.Join(pkg, "shared")+" is a symbolic link")

	// The one sheet alone reads only the template it uses: the link is
	// an error at the use statement, and the rest of the sheet computes.
	one, err := project.Load(filepath.Join(pkg, "a.md"))
	if err != nil {
		t.Fatal(err)
	}
	if len(one.Diags) != 1 || one.Diags[0].Pos.String() != "a.md:2:9" || !strings.Contains(one.Diags[0].Message, "coil.md is a symbolic link") {
		t.Fatalf("diagnostics: %v", one.Diags)
	}
	if strings.Contains(fmt.Sprint(one.Diags), "secret-line-42") || len(one.Files) != 1 {
		t.Errorf("the target was read: %v, %d files", one.Diags, len(one.Files))
	}
	if l := one.Sheets[0].Calc.Lookup("l"); l == nil || one.Sheets[0].Calc.Result(l).Value != 2 {
		t.Errorf("l: %+v", l)
	}
}

// Links that stay inside the package are read like the files they name.
func TestSymlinkInsidePackageRead(t *testing.T) {
	pkg := t.TempDir()
	writeFiles(t, pkg, map[string]string{
		"lib/coil.md": coilTemplate,
		"job.md":      "```sheaf\nuse a = _t/coil with N = 10\n```\n",
	})
	if err := os.Mkdir(filepath.Join(pkg, "_t"), 0o755); err != nil {
		t.Fatal(err)
	}
	symlink(t, filepath.Join("..", "lib", "coil.md"), filepath.Join(pkg, "_t", "coil.md"))
	p, err := project.Load(pkg)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Diags) != 0 {
		t.Fatalf("diagnostics: %v", p.Diags)
	}
	if st := sheet(t, p, "job.md").Calc.Lookup("a.lambda"); st == nil || sheet(t, p, "job.md").Calc.Result(st).Value != 0.01 {
		t.Fatalf("a.lambda: %+v", st)
	}
}

// a.md, a.MD and a.Md wrote one page and lost two; they are refused,
// named, before anything is built.
func TestCaseCollidingSheetsRefused(t *testing.T) {
	pkg := t.TempDir()
	writeFiles(t, pkg, map[string]string{
		"a.md": otherSheet, "a.MD": otherSheet, "a.Md": otherSheet,
		"sub/Coil.md": otherSheet, "sub/coil.md": otherSheet,
		"b.md": otherSheet,
	})
	loadFails(t, pkg, "a.MD, a.Md, a.md", "sub/Coil.md, sub/coil.md", "rename them")
}

// check one.md read every .md below the sheet's folder and failed on one
// unreadable file there (here, a link to nothing). It reads the sheet and
// the templates it uses, and nothing else.
func TestOneSheetReadsOnlyWhatItUses(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{
		"one.md":         "```sheaf\nuse a = _t/coil with N = 10\nl = 2 m\n```\n",
		"_t/coil.md":     coilTemplate,
		"_t/unused.md":   "```sheaf\nbroken = (\n```\n",
		"other.md":       "```sheaf\nx = unknown_name\n```\n",
		"deep/nested.md": otherSheet,
	})
	symlink(t, filepath.Join(dir, "missing.md"), filepath.Join(dir, "dangling.md"))
	if _, err := project.Load(dir); err == nil {
		t.Fatal("the folder holds a link to nothing: loading it whole should fail")
	}
	pkg, err := project.Load(filepath.Join(dir, "one.md"))
	if err != nil {
		t.Fatal(err)
	}
	var read []string
	for _, f := range pkg.Files {
		read = append(read, f.Path)
	}
	if !slices.Equal(read, []string{"_t/coil.md", "one.md"}) {
		t.Errorf("read %v", read)
	}
	if len(pkg.Sheets) != 1 || len(pkg.Diags) != 0 {
		t.Fatalf("%d sheets, diagnostics %v", len(pkg.Sheets), pkg.Diags)
	}
	if st := pkg.Sheets[0].Calc.Lookup("a.lambda"); st == nil || pkg.Sheets[0].Calc.Result(st).Value != 0.01 {
		t.Fatalf("a.lambda: %+v", st)
	}
}

// The package folder itself may be named through a link: the folder as
// given is the package, and its files are read.
func TestPackageFolderGivenAsLink(t *testing.T) {
	base := t.TempDir()
	writeFiles(t, base, map[string]string{"real/a.md": otherSheet})
	symlink(t, filepath.Join(base, "real"), filepath.Join(base, "link"))
	pkg, err := project.Load(filepath.Join(base, "link"))
	if err != nil {
		t.Fatal(err)
	}
	if len(pkg.Sheets) != 1 || len(pkg.Diags) != 0 {
		t.Fatalf("%d sheets, diagnostics %v", len(pkg.Sheets), pkg.Diags)
	}
}
