package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/sheaf-calc/sheaf/internal/benchdata"
)

// check --json sheet.md used to replace the sheet with the JSON.
func TestCheckJSONOntoASheetIsRefused(t *testing.T) {
	body := "```sheaf\nx = 2 m\n```\n"
	dir := writeSheet(t, body)
	sheet := filepath.Join(dir, "s.md")
	for _, target := range []string{sheet, filepath.Join(dir, "out.json")} {
		code, _, stderr := runCLI("check", sheet, "--json", target)
		if code != exitErrors || !strings.Contains(stderr, "lies inside the package's sources") {
			t.Errorf("check --json %s: exit %d: %s", target, code, stderr)
		}
	}
	if data, _ := os.ReadFile(sheet); string(data) != body {
		t.Errorf("the sheet was overwritten:\n%s", data)
	}
	if _, err := os.Stat(filepath.Join(dir, "out.json")); err == nil {
		t.Error("a JSON was written among the sources")
	}
}

// build -o used to overwrite a folder of the user's own files silently.
func TestBuildIntoAFolderOfTheUsersFilesIsRefused(t *testing.T) {
	out := t.TempDir()
	own := map[string]string{"index.html": "my own home page", "notes.txt": "my notes"}
	for name, body := range own {
		if err := os.WriteFile(filepath.Join(out, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	code, _, stderr := runCLI("build", demo, "-o", out, "--no-graphs")
	if code != exitErrors || !strings.Contains(stderr, out+" holds files that sheaf did not write") {
		t.Errorf("build into the user's folder: exit %d: %s", code, stderr)
	}
	got := readTree(t, out)
	if len(got) != len(own) {
		t.Errorf("the folder now holds %v", keys(got))
	}
	for name, body := range own {
		if string(got[name]) != body {
			t.Errorf("%s was overwritten", name)
		}
	}
	// Nor into the sources.
	src := copyDir(t, demo)
	if code, _, stderr := runCLI("build", src, "-o", filepath.Join(src, "html"), "--no-graphs"); code != exitErrors || !strings.Contains(stderr, "inside the package's sources") {
		t.Errorf("build into the sources: exit %d: %s", code, stderr)
	}
	if _, err := os.Stat(filepath.Join(src, "html")); err == nil {
		t.Error("a build wrote into the sources")
	}
}

// verify used to accept a package with an added page that runs a script.
func TestVerifyFailsOnAnAddedFile(t *testing.T) {
	src := copyDir(t, demo)
	out := t.TempDir()
	if code, _, stderr := runCLI("build", src, "-o", out, "--no-graphs"); code != exitOK {
		t.Fatalf("build: exit %d: %s", code, stderr)
	}
	if err := os.WriteFile(filepath.Join(out, "sheets", "invoice.html"), []byte("<script>steal()</script>"), 0o644); err != nil {
		t.Fatal(err)
	}
	code, stdout, _ := runCLI("verify", out, src)
	if code != exitCheckFailed || !strings.Contains(stdout, "sheets/invoice.html: the package holds this file, which the manifest does not list") {
		t.Errorf("verify with an added page: exit %d:\n%s", code, stdout)
	}
}

// big is a package of 1,000 small sheets in two revisions, and a sheaf
// binary built for the test, shared by the tests that kill and race builds.
type big struct {
	bin, old, new string
}

var (
	bigOnce sync.Once
	bigDir  string
	bigPkg  big
	bigErr  error
)

// bigPackage builds the sheaf binary and writes the two revisions: B
// changes every sheet, deletes 100 and adds 10.
func bigPackage(t *testing.T) big {
	t.Helper()
	if testing.Short() {
		t.Skip("builds a binary and 1,000 sheets; skipped with -short")
	}
	bigOnce.Do(func() {
		goBin, err := exec.LookPath("go")
		if err != nil {
			bigErr = fmt.Errorf("no go command on the PATH to build sheaf with: %w", err)
			return
		}
		if bigDir, bigErr = os.MkdirTemp("", "sheaf-big-"); bigErr != nil {
			return
		}
		bigPkg = big{bin: filepath.Join(bigDir, "sheaf"), old: filepath.Join(bigDir, "rev-A"), new: filepath.Join(bigDir, "rev-B")}
		if out, err := exec.Command(goBin, "build", "-o", bigPkg.bin, ".").CombinedOutput(); err != nil {
			bigErr = fmt.Errorf("go build: %v\n%s", err, out)
			return
		}
		files := benchdata.Package(1000, 10)
		for p, data := range files {
			if bigErr = writeFile(filepath.Join(bigPkg.old, p), data); bigErr != nil {
				return
			}
			var sheet int
			if _, err := fmt.Sscanf(filepath.Base(p), "sheet-%d.md", &sheet); err == nil && sheet%10 == 3 {
				continue // deleted in revision B
			}
			data = bytes.Replace(data, []byte("revision: A"), []byte("revision: B"), 1)
			if bigErr = writeFile(filepath.Join(bigPkg.new, p), data); bigErr != nil {
				return
			}
		}
		for i := 0; i < 10; i++ {
			if bigErr = writeFile(filepath.Join(bigPkg.new, "added", fmt.Sprintf("new-%d.md", i)), []byte(benchdata.Sheet(2000+i, 10))); bigErr != nil {
				return
			}
		}
	})
	if bigErr != nil {
		t.Fatal(bigErr)
	}
	return bigPkg
}

func writeFile(p string, data []byte) error {
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		return err
	}
	return os.WriteFile(p, data, 0o644)
}

// sheaf runs the test's sheaf binary and returns its exit code and output.
func (b big) sheaf(args ...string) (int, string) {
	cmd := exec.Command(b.bin, args...)
	out, err := cmd.CombinedOutput()
	if err != nil && cmd.ProcessState == nil {
		return -1, err.Error()
	}
	return cmd.ProcessState.ExitCode(), string(out)
}

// builtFrom says which revision out verifies against: "A", "B", or ""
// with verify's output when it verifies against neither.
func (b big) builtFrom(out string) (string, string) {
	var said []string
	for rev, src := range map[string]string{"A": b.old, "B": b.new} {
		code, text := b.sheaf("verify", out, src)
		if code == exitOK {
			return rev, ""
		}
		said = append(said, fmt.Sprintf("against revision %s (exit %d): %.600s", rev, code, text))
	}
	return "", strings.Join(said, "\n")
}

// unlisted names the files of a built package that its manifest does not
// list, read here independently of verify.
func unlisted(t *testing.T, out string) []string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(out, "sheaf-manifest.json"))
	if err != nil {
		t.Fatal(err)
	}
	var m struct {
		Pages []struct{ Path string }
		JSON  *struct{ Path string }
	}
	if err := json.Unmarshal(data, &m); err != nil {
		t.Fatal(err)
	}
	listed := map[string]bool{"sheaf-manifest.json": true}
	for _, p := range m.Pages {
		listed[p.Path] = true
	}
	if m.JSON != nil {
		listed[m.JSON.Path] = true
	}
	var extra []string
	for p := range readTree(t, out) {
		if !listed[filepath.ToSlash(p)] {
			extra = append(extra, filepath.ToSlash(p))
		}
	}
	sort.Strings(extra)
	return extra
}

// kill -9 at a random moment of a rebuild used to leave new pages beside
// old ones under the old manifest. Now the folder is always one whole
// package, of the old sources or of the new.
func TestKilledRebuildLeavesAWholePackage(t *testing.T) {
	b := bigPackage(t)
	out := filepath.Join(t.TempDir(), "pkg")
	start := time.Now()
	if code, text := b.sheaf("build", b.old, "-o", out, "--no-graphs"); code != exitOK {
		t.Fatalf("first build: exit %d: %s", code, text)
	}
	full := time.Since(start)
	rng := rand.New(rand.NewPCG(8, 2026)) // the same moments on every run
	for i := 0; i < 4; i++ {
		src := map[bool]string{true: b.new, false: b.old}[i%2 == 0]
		// From the loading of the sheets to just past the end of a build:
		// staging, swapping, and now and then a build that completes.
		delay := full/4 + time.Duration(rng.Int64N(int64(full)))
		cmd := exec.Command(b.bin, "build", src, "-o", out, "--no-graphs")
		if err := cmd.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(delay)
		_ = cmd.Process.Kill() // SIGKILL: no clean-up runs
		_ = cmd.Wait()
		if extra := unlisted(t, out); len(extra) > 0 {
			t.Errorf("killed after %v: the package holds %d files its manifest does not list, such as %s", delay, len(extra), extra[0])
		}
		rev, said := b.builtFrom(out)
		if rev == "" {
			t.Fatalf("killed after %v of a %v build: the package verifies against neither revision:\n%s", delay, full, said)
		}
		t.Logf("killed after %v of a %v build: a whole package of revision %s", delay, full, rev)
	}
	// The next build clears what the killed ones left beside the package.
	if code, text := b.sheaf("build", b.new, "-o", out, "--no-graphs"); code != exitOK {
		t.Fatalf("build after the kills: exit %d: %s", code, text)
	}
	if rev, said := b.builtFrom(out); rev != "B" {
		t.Errorf("the last build does not verify against its sources:\n%s", said)
	}
	entries, _ := os.ReadDir(filepath.Dir(out))
	for _, e := range entries {
		if strings.Contains(e.Name(), "staging") || strings.Contains(e.Name(), "old") {
			t.Errorf("left beside the package: %s", e.Name())
		}
	}
}

// Two builds into one folder at once used to both exit 0 and leave a
// mixture. Now the second is refused while the first holds the folder.
// Revision B deletes sheets and adds others, so two builds that both
// wrote into the folder leave pages that the last manifest does not list.
func TestConcurrentBuildsDoNotInterleave(t *testing.T) {
	b := bigPackage(t)
	for round, lag := range []time.Duration{0, 100 * time.Millisecond, 300 * time.Millisecond} {
		out := filepath.Join(t.TempDir(), "pkg")
		type result struct {
			code int
			text string
		}
		results := make(chan result, 2)
		for i, src := range []string{b.old, b.new} {
			cmd := exec.Command(b.bin, "build", src, "-o", out, "--no-graphs")
			if i > 0 {
				time.Sleep(lag)
			}
			go func() {
				text, _ := cmd.CombinedOutput()
				results <- result{cmd.ProcessState.ExitCode(), string(text)}
			}()
		}
		ok := 0
		for range 2 {
			r := <-results
			switch {
			case r.code == exitOK:
				ok++
			case r.code == exitErrors && strings.Contains(r.text, "another sheaf build is writing "+out):
			default:
				t.Errorf("round %d, a concurrent build: exit %d: %s", round, r.code, r.text)
			}
		}
		if ok == 0 {
			t.Errorf("round %d: both concurrent builds were refused", round)
		}
		if extra := unlisted(t, out); len(extra) > 0 {
			t.Errorf("round %d: the package holds %d files its manifest does not list, such as %s", round, len(extra), extra[0])
		}
		rev, said := b.builtFrom(out)
		if rev == "" {
			t.Errorf("round %d: after two concurrent builds the package verifies against neither revision:\n%s", round, said)
		}
		t.Logf("round %d: %d of 2 builds ran, a whole package of revision %s", round, ok, rev)
	}
}

// A read-only sheets/ folder in the previous package used to stop a
// rebuild half-way, with the new index beside the old pages. (Root writes
// into read-only folders, so the fault is real only for other users.)
func TestRebuildOverAReadOnlySheetsFolder(t *testing.T) {
	if os.Geteuid() == 0 {
		t.Skip("root writes into read-only folders")
	}
	src := copyDir(t, demo)
	out := filepath.Join(t.TempDir(), "pkg")
	if code, _, stderr := runCLI("build", src, "-o", out, "--no-graphs"); code != exitOK {
		t.Fatalf("build: exit %d: %s", code, stderr)
	}
	old := copyDir(t, src)
	if err := os.Chmod(filepath.Join(out, "sheets"), 0o555); err != nil {
		t.Fatal(err)
	}
	defer func() { _ = os.Chmod(filepath.Join(out, "sheets"), 0o755) }()
	sheet := filepath.Join(src, "03-speed-voltage.md")
	data, _ := os.ReadFile(sheet)
	changed := strings.Replace(string(data), "B_1 = 0.83 T", "B_1 = 0.84 T", 1)
	if changed == string(data) {
		t.Fatal("the demo sheet no longer has the line this test edits")
	}
	if err := os.WriteFile(sheet, []byte(changed), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, stderr := runCLI("build", src, "-o", out, "--no-graphs")
	verified := false
	for _, from := range []string{src, old} {
		if c, _, _ := runCLI("verify", out, from); c == exitOK {
			verified = true
		}
	}
	if !verified {
		t.Errorf("after a rebuild over a read-only sheets/ (exit %d: %s) the package verifies against neither the old nor the new sources", code, stderr)
	}
}
