package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/internal/version"
	"github.com/sheaf-calc/sheaf/project"
)

const demo = "../../examples/tarnwick-weir"

func writeSheet(t *testing.T, body string) string {
	t.Helper()
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "s.md"), []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	return dir
}

func runCLI(args ...string) (int, string, string) {
	var out, errs bytes.Buffer
	code := run(args, &out, &errs)
	return code, out.String(), errs.String()
}

// readTree returns every file under dir keyed by its relative path.
func readTree(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	files := map[string][]byte{}
	err := filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		data, err := os.ReadFile(p)
		rel, _ := filepath.Rel(dir, p)
		files[rel] = data
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return files
}

func TestBuildIsByteIdenticalAndAtomic(t *testing.T) {
	a, b := t.TempDir(), t.TempDir()
	for _, out := range []string{a, b} {
		code, stdout, stderr := runCLI("build", demo, "-o", out, "--json", filepath.Join(out, "package.json"))
		if code != exitOK {
			t.Fatalf("build exit %d\nstdout: %s\nstderr: %s", code, stdout, stderr)
		}
	}
	fa, fb := readTree(t, a), readTree(t, b)
	if len(fa) < 7 { // index, five sheets, JSON
		t.Fatalf("expected index, five sheet pages and the JSON, got %d files: %v", len(fa), keys(fa))
	}
	for name, data := range fa {
		if strings.Contains(filepath.Base(name), ".tmp") {
			t.Errorf("temporary file left behind: %s", name)
		}
		if !bytes.Equal(data, fb[name]) {
			t.Errorf("%s differs between two builds of the same sources", name)
		}
	}
	if len(fa) != len(fb) {
		t.Errorf("builds wrote %d and %d files", len(fa), len(fb))
	}
}

func keys(m map[string][]byte) []string {
	var k []string
	for n := range m {
		k = append(k, n)
	}
	return k
}

func TestExitCodes(t *testing.T) {
	cases := []struct {
		name  string
		sheet string
		want  int
	}{
		{"all good", "```sheaf\nx = 2 m\ncheck x <= 3 m\n```\n", exitOK},
		{"a check fails", "```sheaf\nx = 2 m\ncheck x <= 1 m\n```\n", exitCheckFailed},
		{"an error", "```sheaf\nx = 2 m + 1 s\n```\n", exitErrors},
		{"an error and a failed check", "```sheaf\nx = 2 m\ncheck x <= 1 m\ny = q\n```\n", exitErrors},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			code, _, _ := runCLI("check", writeSheet(t, c.sheet))
			if code != c.want {
				t.Errorf("exit %d, want %d", code, c.want)
			}
		})
	}
	if code, _, _ := runCLI("build", demo); code != exitErrors {
		t.Errorf("build without -o: exit %d, want %d (usage)", code, exitErrors)
	}
	if code, _, _ := runCLI("frobnicate"); code != exitErrors {
		t.Errorf("unknown command: exit %d, want %d", code, exitErrors)
	}
	if code, _, stderr := runCLI("check", filepath.Join(t.TempDir(), "missing")); code != exitErrors || !strings.Contains(stderr, "missing") {
		t.Errorf("missing folder: exit %d, stderr %q", code, stderr)
	}
}

func TestCheckPrintsResultsAndPositionedErrors(t *testing.T) {
	dir := writeSheet(t, "# t\n\n```sheaf\nU = 230 V\nI = 2 A\nP [kW] = U * I\nbad = U + I\n```\n")
	code, stdout, stderr := runCLI("check", dir)
	if code != exitErrors {
		t.Fatalf("exit %d", code)
	}
	if !strings.Contains(stdout, "P = 0.4600 kW") {
		t.Errorf("result missing from stdout:\n%s", stdout)
	}
	if !strings.Contains(stderr, "s.md:7:9: cannot add voltage (V) and current (A)") {
		t.Errorf("error not reported at file:line:col:\n%s", stderr)
	}
}

func TestJSONCarriesValuesAndPositions(t *testing.T) {
	dir := writeSheet(t, "```sheaf\nl = 25 mm ; a length ; source: drawing 1\nA [mm^2] = l^2\n```\n")
	out := filepath.Join(t.TempDir(), "p.json")
	if code, _, stderr := runCLI("check", dir, "--json", out); code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	data, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Sheets []struct {
			Statements []struct {
				Name string
				Pos  struct {
					File      string
					Line, Col int
				}
				Dimension string
				Input     bool
				Source    string
				SI        struct {
					Value float64
					Unit  string
				}
				Display struct {
					Value      float64
					Unit, Text string
				}
			}
		}
	}
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	st := doc.Sheets[0].Statements
	if st[0].Name != "l" || !st[0].Input || st[0].Source != "drawing 1" || st[0].SI.Value != 0.025 || st[0].Display.Unit != "mm" {
		t.Errorf("input l: %+v", st[0])
	}
	if st[1].Pos.Line != 3 || st[1].Pos.Col != 1 || st[1].Dimension != "L^2" || st[1].Display.Text != "625.0" || st[1].Display.Unit != "mm²" {
		t.Errorf("result A: %+v", st[1])
	}
	if got, want := st[1].SI.Value, 0.025*0.025; got < want*(1-1e-12) || got > want*(1+1e-12) {
		t.Errorf("A in SI = %g, want %g", got, want)
	}
}

func TestUnitsListsTheTable(t *testing.T) {
	code, stdout, _ := runCLI("units")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	for _, want := range []string{"weber", "tesla", "rpm", "quetta", "mu_0", "°C"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("units output lacks %q", want)
		}
	}
}

// copyDir copies a folder of sheets, with its sub-folders.
func copyDir(t *testing.T, from string) string {
	t.Helper()
	to := t.TempDir()
	for rel, data := range readTree(t, from) {
		p := filepath.Join(to, rel)
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return to
}

func TestVerify(t *testing.T) {
	src := copyDir(t, demo)
	out := t.TempDir()
	if code, _, stderr := runCLI("build", src, "-o", out); code != exitOK {
		t.Fatalf("build: exit %d: %s", code, stderr)
	}
	code, stdout, _ := runCLI("verify", out, src)
	if code != exitOK || !strings.HasPrefix(stdout, "verified:") {
		t.Fatalf("verify of an untouched build: exit %d: %s", code, stdout)
	}

	// One character of one source changes: verify fails and names the file.
	sheet := filepath.Join(src, "03-speed-voltage.md")
	data, _ := os.ReadFile(sheet)
	changed := strings.Replace(string(data), "B_1 = 0.83 T", "B_1 = 0.84 T", 1)
	if changed == string(data) {
		t.Fatal("the demo sheet no longer has the line this test edits")
	}
	if err := os.WriteFile(sheet, []byte(changed), 0o644); err != nil {
		t.Fatal(err)
	}
	code, stdout, _ = runCLI("verify", out, src)
	if code != exitCheckFailed || !strings.Contains(stdout, "03-speed-voltage.md: this source differs") {
		t.Errorf("verify after a one-character change: exit %d:\n%s", code, stdout)
	}
	if err := os.WriteFile(sheet, data, 0o644); err != nil {
		t.Fatal(err)
	}

	// A page edited after the build is named too.
	page := filepath.Join(out, "sheets", "02-coil-emf.html")
	html, _ := os.ReadFile(page)
	edited := strings.Replace(string(html), "<mn>", "<mn>1", 1)
	if edited == string(html) {
		t.Fatal("the page has no number for this test to edit")
	}
	if err := os.WriteFile(page, []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	code, stdout, _ = runCLI("verify", out, src)
	if code != exitCheckFailed || !strings.Contains(stdout, "sheets/02-coil-emf.html: page has been changed since it was built") {
		t.Errorf("verify after a page was edited: exit %d:\n%s", code, stdout)
	}

	// A source added to the folder is named.
	if err := os.WriteFile(page, html, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(src, "06-extra.md"), []byte("# extra\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	code, stdout, _ = runCLI("verify", out, src)
	if code != exitCheckFailed || !strings.Contains(stdout, "06-extra.md: this source is not among") {
		t.Errorf("verify with an extra source: exit %d:\n%s", code, stdout)
	}
}

// The package pages carry the package stamp; each sheet's page carries the
// stamp of the sources it rests on (see project.Package.RestsOn).
func TestEveryPageCarriesTheStampAndTheSourceDate(t *testing.T) {
	out := t.TempDir()
	t.Setenv("SOURCE_DATE_EPOCH", "")
	if code, _, stderr := runCLI("build", demo, "-o", out, "--no-graphs"); code != exitOK {
		t.Fatalf("build: %s", stderr)
	}
	var manifest struct {
		Stamp     string `json:"stamp"`
		BuildDate string `json:"build_date"`
	}
	data, _ := os.ReadFile(filepath.Join(out, "sheaf-manifest.json"))
	if err := json.Unmarshal(data, &manifest); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(manifest.Stamp, "sha256:") || len(manifest.Stamp) != 71 {
		t.Fatalf("stamp %q", manifest.Stamp)
	}
	// The latest date in the demo's front matter, not today.
	if manifest.BuildDate != "2026-12-02" {
		t.Errorf("build date %q, want the sources' latest date 2026-12-02", manifest.BuildDate)
	}
	pkg, err := project.Load(demo)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]string{}
	for _, s := range pkg.Sheets {
		want[s.Page] = pkg.SheetStamp(s, version.Version)
	}
	for name, page := range readTree(t, out) {
		if !strings.HasSuffix(name, ".html") {
			continue
		}
		stamp, sheet := want[name]
		if !sheet {
			stamp = manifest.Stamp
		}
		meta := `<meta name="sheaf-stamp" content="` + stamp + `">`
		if !bytes.Contains(page, []byte(meta)) || !bytes.Contains(page, []byte("<code>"+stamp+"</code>")) {
			t.Errorf("%s does not carry its stamp %s (sheet page: %v)", name, stamp, sheet)
		}
		if sheet && bytes.Contains(page, []byte(manifest.Stamp)) {
			t.Errorf("%s carries the package stamp", name)
		}
	}
	// SOURCE_DATE_EPOCH wins over the sources.
	t.Setenv("SOURCE_DATE_EPOCH", "1767225600") // 2026-01-01T00:00:00Z
	out2 := t.TempDir()
	if code, _, _ := runCLI("build", demo, "-o", out2, "--no-graphs"); code != exitOK {
		t.Fatal("build with SOURCE_DATE_EPOCH failed")
	}
	index, _ := os.ReadFile(filepath.Join(out2, "index.html"))
	if !bytes.Contains(index, []byte("built 2026-01-01")) {
		t.Errorf("SOURCE_DATE_EPOCH did not set the build date")
	}
}

func TestAuditAndDiffCommandsOnTheDemo(t *testing.T) {
	code, stdout, _ := runCLI("audit", demo)
	if code != exitOK || !strings.Contains(stdout, "0 findings open, 6 accepted") {
		t.Errorf("audit of the demo: exit %d:\n%s", code, stdout)
	}
	code, stdout, _ = runCLI("audit", "../../examples/tarnwick-weir-rev-A")
	if code != exitCheckFailed || !strings.Contains(stdout, "[no-source] input N_1 has no source") {
		t.Errorf("audit of revision A: exit %d:\n%s", code, stdout)
	}
	html := filepath.Join(t.TempDir(), "changes.html")
	code, stdout, _ = runCLI("diff", "../../examples/tarnwick-weir-rev-A", demo, "--html", html)
	if code != exitOK || !strings.Contains(stdout, "check flipped    check k_m * ins.U_tt_s <= U_w_tt: FAIL (118 %) → PASS (15.7 %)") {
		t.Errorf("diff of the demo's revisions: exit %d:\n%s", code, stdout)
	}
	page, err := os.ReadFile(html)
	if err != nil || !bytes.Contains(page, []byte("<del>787.5 V</del>")) {
		t.Errorf("diff page: %v", err)
	}
}

// A job starts from a library template in two commands, and builds.
func TestStartAJobFromATemplate(t *testing.T) {
	job := filepath.Join(t.TempDir(), "J-101")
	code, stdout, stderr := runCLI("templates", "copy", "magnetic-circuit", job)
	if code != exitOK || !strings.Contains(stdout, "_templates") {
		t.Fatalf("copy: exit %d: %s %s", code, stdout, stderr)
	}
	out := filepath.Join(t.TempDir(), "out")
	if code, stdout, stderr := runCLI("build", job, "-o", out, "--no-graphs"); code != exitOK || !strings.Contains(stdout, "1 sheet,") {
		t.Fatalf("build of the starter job: exit %d: %s %s", code, stdout, stderr)
	}
	// The starter's example values are open until the job's replace them.
	code, stdout, _ = runCLI("audit", job)
	if code != exitCheckFailed || !strings.Contains(stdout, "[open-source]") {
		t.Errorf("audit of the starter job: exit %d:\n%s", code, stdout)
	}
	// Copying over an existing job is refused.
	if code, _, stderr := runCLI("templates", "copy", "magnetic-circuit", job); code != exitErrors || !strings.Contains(stderr, "already exists") {
		t.Errorf("second copy: exit %d: %s", code, stderr)
	}
	code, stdout, _ = runCLI("templates")
	for _, name := range []string{"lib/flux-linkage", "lib/magnetic-circuit-saturating", "lib/insulation-margin"} {
		if code != exitOK || !strings.Contains(stdout, name) {
			t.Errorf("templates lacks %s", name)
		}
	}
}
