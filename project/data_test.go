package project_test

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// An invented DC curve of the Tarnwick Weir pole plate: four rows, enough
// to read between by hand.
const plateCSV = "# DC magnetisation curve, demo values\nH [A/m],B [T]\n0,0\n250,0.40\n400,0.70\n650,1.00\n"

// csvFiles is a package in which a.md reads data/plate.csv itself, e.md
// reads it through a template whose table names it (relative to the
// template), b.md takes from a.md, and c.md reads nothing.
func csvFiles() map[string][]byte {
	return map[string][]byte{
		"data/plate.csv": []byte(plateCSV),
		"a.md": []byte("# Pole\n\nTable BH from data/plate.csv: DC curve of the pole plate\n\n```sheaf\n" +
			"H = 300 A/m ; field strength ; source: field study FS-2417-03\nB [T] = interp(BH.B, BH.H, H) ; flux density\n```\n"),
		"b.md": []byte("```sheaf\ntake B from a\nA = 0.1 m^2 ; pole area ; source: drawing TW-R-104\nPhi [Wb] = B * A ; flux\n```\n"),
		"c.md": []byte("```sheaf\nU = 400 V ; supply ; source: single-line diagram\n```\n"),
		"_t/curve.md": []byte("---\ntemplate: true\n---\nTable BH from ../data/plate.csv: the plate's curve\n\n```sheaf\n" +
			"param H [A/m] ; field strength\nB [T] = interp(BH.B, BH.H, H) ; flux density\n```\n"),
		"e.md": []byte("```sheaf\nuse p = _t/curve with H = 500 A/m\n```\n"),
	}
}

func value(t *testing.T, pkg *project.Package, file, name string) float64 {
	t.Helper()
	s := sheet(t, pkg, file)
	st := s.Calc.Lookup(name)
	if st == nil {
		t.Fatalf("%s has no %s; diagnostics %v", file, name, pkg.Diags)
	}
	r := s.Calc.Result(st)
	if r.Status != engine.OK {
		t.Fatalf("%s.%s: %+v; diagnostics %v", file, name, r, pkg.Diags)
	}
	return r.Value
}

// A table read from a CSV file is read as the same table in a pipe table
// would be; the file is a source of the package and of the pages that
// read it, and the package keeps it to publish.
func TestCSVTableIsASource(t *testing.T) {
	pkg := project.FromFiles("pkg", csvFiles())
	if len(pkg.Diags) != 0 {
		t.Fatal(pkg.Diags)
	}
	// Worked by hand: 0.40 T + (300 − 250)/(400 − 250) · 0.30 T = 0.50 T;
	// 0.70 T + (500 − 400)/(650 − 400) · 0.30 T = 0.82 T.
	if b := value(t, pkg, "a.md", "B"); abs(b-0.5) > 1e-12 {
		t.Errorf("a.md: B = %v T, want 0.5 T", b)
	}
	if b := value(t, pkg, "e.md", "p.B"); abs(b-0.82) > 1e-12 {
		t.Errorf("e.md: p.B = %v T, want 0.82 T", b)
	}
	if tb := sheet(t, pkg, "a.md").Calc.Tables[0]; tb.File != "data/plate.csv" || tb.Columns[1].Unit.Symbol != "T" {
		t.Errorf("table %+v", tb)
	}
	var files []string
	for _, f := range pkg.Files {
		files = append(files, f.Path)
	}
	if !slices.Contains(files, "data/plate.csv") {
		t.Errorf("sources %v lack the CSV file", files)
	}
	if d := pkg.DataFiles(); len(d) != 1 || d[0].Path != "data/plate.csv" || string(d[0].Data) != plateCSV {
		t.Errorf("data files %+v", d)
	}
	for file, want := range map[string][]string{
		"a.md": {"a.md", "data/plate.csv"},
		"b.md": {"a.md", "b.md", "data/plate.csv"},
		"c.md": {"c.md"},
		"e.md": {"_t/curve.md", "data/plate.csv", "e.md"},
	} {
		var got []string
		for _, f := range pkg.RestsOn(sheet(t, pkg, file)) {
			got = append(got, f.Path)
		}
		if !slices.Equal(got, want) {
			t.Errorf("%s rests on %v, want %v", file, got, want)
		}
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// An edit of the CSV file changes the package stamp and the stamps of the
// sheets that rest on it, and of no other.
func TestCSVEditChangesTheStamps(t *testing.T) {
	base := csvFiles()
	before := project.FromFiles("pkg", base)
	after := project.FromFiles("pkg", edited(t, base, "data/plate.csv", "400,0.70", "400,0.72"))
	if before.Stamp() == after.Stamp() {
		t.Error("the package stamp did not change")
	}
	for file, changes := range map[string]bool{"a.md": true, "b.md": true, "c.md": false, "e.md": true} {
		was, now := before.SheetStamp(sheet(t, before, file), "test"), after.SheetStamp(sheet(t, after, file), "test")
		if (was != now) != changes {
			t.Errorf("%s: stamp changed %v, want %v", file, was != now, changes)
		}
	}
}

// The preview's update evaluates again exactly the sheets whose tables,
// or whose templates' tables, read an edited CSV file, and those that
// take from them, and gives what a full load gives.
func TestUpdateRedoesSheetsThatReadAnEditedCSV(t *testing.T) {
	base := csvFiles()
	prev := project.FromFiles("pkg", base)
	files := edited(t, base, "data/plate.csv", "400,0.70", "400,0.72")
	pkg, redone := prev.Update(files)
	if got, want := paths(redone), []string{"a.md", "b.md", "e.md"}; !slices.Equal(got, want) {
		t.Errorf("evaluated again %v, want %v", got, want)
	}
	if sheet(t, pkg, "c.md") != sheet(t, prev, "c.md") {
		t.Error("c.md, which reads no file, was evaluated again")
	}
	// 0.40 T + 50/150 · 0.32 T
	if b := value(t, pkg, "a.md", "B"); abs(b-(0.40+0.32/3)) > 1e-12 {
		t.Errorf("B = %v T after the edit", b)
	}
	samePages(t, pkg, project.FromFiles("pkg", files))

	// A CSV file that arrives is a file added: the whole package again.
	added := edited(t, base, "c.md", "", "")
	added["data/other.csv"] = []byte("x,y\n1,2\n3,4\n")
	pkg, redone = prev.Update(added)
	if len(redone) != len(pkg.Sheets) {
		t.Errorf("a CSV file added: %d of %d sheets evaluated again", len(redone), len(pkg.Sheets))
	}
	samePages(t, pkg, project.FromFiles("pkg", added))
}

// Each way a table's file can be wrong is an error of the table, where it
// is: the file's name in the caption when the file cannot be had, in the
// file itself when what it holds is wrong. Formulas that read the table
// are not evaluated; the others are.
func TestCSVTableErrors(t *testing.T) {
	var long strings.Builder
	long.WriteString("H [A/m],B [T]\n")
	for i := 0; i <= engine.MaxTableRows; i++ {
		fmt.Fprintf(&long, "%d,%d\n", i, i)
	}
	sheetNaming := func(file string) []byte {
		return []byte("# S\n\nTable BH from " + file + ": curve\n\n```sheaf\nH = 300 A/m ; field ; source: demo\n" +
			"B [T] = interp(BH.B, BH.H, H)\n```\n")
	}
	for _, tc := range []struct {
		name, ref, csv, at, msg string
	}{
		{"missing", "data/none.csv", "", "s.md:3:15", "which the package does not have"},
		{"outside", "../plate.csv", "", "s.md:3:15", "outside the package folder"},
		{"absolute", "/etc/plate.csv", "", "s.md:3:15", "not a path inside the package"},
		{"not CSV", "data/plate.txt", "", "s.md:3:15", "not a CSV file"},
		{"in a dot folder", ".hidden/plate.csv", "", "s.md:3:15", "which the package does not have"},
		{"case", "data/Plate.csv", "", "s.md:3:15", "which the package does not have"},
		{"malformed row", "data/plate.csv", "H [A/m],B [T]\n0,0\n250,\"0.40\n", "data/plate.csv:3:10", "not well-formed CSV"},
		{"cells short", "data/plate.csv", "H [A/m],B [T]\n0,0\n250\n400,0.7\n", "data/plate.csv:3:1", "has 1 cells for 2 columns"},
		{"decimal comma", "data/plate.csv", "H [A/m],B [T]\n0,0\n250,0,40\n", "data/plate.csv:3:1", "3 cells for 2 columns"},
		{"a word", "data/plate.csv", "H [A/m],B [T]\n0,0\n250, n/a\n", "data/plate.csv:3:6", `cell "n/a" of table BH is not a number`},
		{"unit", "data/plate.csv", "H [A/m],B [Tesla]\n0,0\n250,0.4\n", "data/plate.csv:1:9", "unit of column B"},
		{"too many rows", "data/plate.csv", long.String(), fmt.Sprintf("data/plate.csv:%d:1", engine.MaxTableRows+2), "more than 10000 rows"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			files := map[string][]byte{"s.md": sheetNaming(tc.ref), "data/plate.csv": []byte(plateCSV)}
			if tc.csv != "" {
				files["data/plate.csv"] = []byte(tc.csv)
			}
			pkg := project.FromFiles("pkg", files)
			var found bool
			for _, d := range pkg.Diags {
				if d.Pos.String() == tc.at && strings.Contains(d.Message, tc.msg) {
					found = true
				}
			}
			if !found {
				t.Errorf("no error at %s with %q; diagnostics:\n%v", tc.at, tc.msg, pkg.Diags)
			}
			s := sheet(t, pkg, "s.md")
			if r := s.Calc.Result(s.Calc.Lookup("B")); r.Status == engine.OK {
				t.Error("B was evaluated from a table with an error")
			}
			if r := s.Calc.Result(s.Calc.Lookup("H")); r.Status != engine.OK {
				t.Errorf("H, which reads no table, is %v", r.Status)
			}
		})
	}
	pkg := project.FromFiles("pkg", map[string][]byte{"s.md": sheetNaming("data/Plate.csv"), "data/plate.csv": []byte(plateCSV)})
	if d := pkg.Diags[0]; !strings.Contains(d.Hint, "the package has data/plate.csv") {
		t.Errorf("a name in other capitals: hint %q", d.Hint)
	}
}

// From a folder: a CSV file that is a link out of the package refuses the
// package, naming the link; CSV files whose names differ only in case are
// refused; one sheet given alone reads the file its table names.
func TestCSVFilesOnDisk(t *testing.T) {
	dir := t.TempDir()
	writeFiles(t, dir, map[string]string{"job/a.md": string(csvFiles()["a.md"]), "job/data/plate.csv": plateCSV, "secret.csv": plateCSV})
	one, err := project.Load(filepath.Join(dir, "job", "a.md"))
	if err != nil {
		t.Fatal(err)
	}
	if b := value(t, one, "a.md", "B"); abs(b-0.5) > 1e-12 || len(one.Files) != 2 {
		t.Errorf("one sheet: B = %v, files %v", b, one.Files)
	}
	whole, err := project.Load(filepath.Join(dir, "job"))
	if err != nil {
		t.Fatal(err)
	}
	if whole.SheetStamp(whole.Sheets[0], "t") != one.SheetStamp(one.Sheets[0], "t") {
		t.Error("the sheet's stamp read alone differs from the one in its package")
	}
	if err := os.Symlink(filepath.Join(dir, "secret.csv"), filepath.Join(dir, "job", "data", "out.csv")); err != nil {
		t.Skip("no symbolic links here:", err)
	}
	if _, err := project.Load(filepath.Join(dir, "job")); err == nil || !strings.Contains(err.Error(), "out.csv is a symbolic link") {
		t.Errorf("a link out of the package: %v", err)
	}
	os.Remove(filepath.Join(dir, "job", "data", "out.csv"))
	writeFiles(t, dir, map[string]string{"job/data/PLATE.csv": plateCSV})
	if _, err := project.Load(filepath.Join(dir, "job")); err == nil || !strings.Contains(err.Error(), "data/PLATE.csv, data/plate.csv") {
		t.Errorf("names that differ in case: %v", err)
	}
}

// A package read from a git revision has its CSV files, and the same
// stamp as the folder.
func TestRevisionKeepsCSVFiles(t *testing.T) {
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not on the PATH")
	}
	repo := t.TempDir()
	writeFiles(t, repo, map[string]string{"calcs/a.md": string(csvFiles()["a.md"]), "calcs/data/plate.csv": plateCSV})
	for _, args := range [][]string{{"init", "-q"}, {"add", "."}, {"commit", "-q", "-m", "A"}} {
		cmd := exec.Command("git", args...)
		cmd.Dir = repo
		cmd.Env = append(os.Environ(), "GIT_AUTHOR_NAME=t", "GIT_AUTHOR_EMAIL=t@example.invalid",
			"GIT_COMMITTER_NAME=t", "GIT_COMMITTER_EMAIL=t@example.invalid", "GIT_CONFIG_GLOBAL=/dev/null")
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("git %v: %v\n%s", args, err, out)
		}
	}
	t.Chdir(repo)
	pkg, err := project.LoadRevision("HEAD:calcs")
	if err != nil {
		t.Fatal(err)
	}
	if len(pkg.Diags) != 0 || len(pkg.Files) != 2 {
		t.Fatalf("files %v, diagnostics %v", pkg.Files, pkg.Diags)
	}
	if b := value(t, pkg, "a.md", "B"); abs(b-0.5) > 1e-12 {
		t.Errorf("B = %v", b)
	}
	disk, err := project.Load("calcs")
	if err != nil {
		t.Fatal(err)
	}
	if disk.Stamp() != pkg.Stamp() {
		t.Error("the revision and the folder give different stamps")
	}
}
