package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
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
