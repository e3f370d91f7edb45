package revdiff_test

import (
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/revdiff"
)

const revA = "---\ntitle: Tank\n---\n```sheaf\n" +
	"h = 0.5 m ; height ; source: drawing\n" +
	"rho = 1000 kg/m^3 ; water ; source: handbook\n" +
	"a = 0.30 m ; side ; source: drawing\n" +
	"A = a^2 ; base area\n" +
	"V = A * h ; volume\n" +
	"M = V * rho ; mass of water\n" +
	"M_max = 50 kg ; limit ; source: crane rating\n" +
	"W = 12 kg ; unrelated weight ; source: catalogue\n" +
	"check M <= M_max ; the crane can lift the full tank\n" +
	"check W <= M_max ; the empty tank is liftable\n```\n"

func pkg(t *testing.T, files map[string]string) *project.Package {
	t.Helper()
	in := map[string][]byte{}
	for k, v := range files {
		in[k] = []byte(v)
	}
	p := project.FromFiles("pkg", in)
	if len(p.Diags) != 0 {
		t.Fatalf("sheet errors: %v", p.Diags)
	}
	return p
}

func TestOneChangedInputMovesThreeResultsAndFlipsACheck(t *testing.T) {
	revB := strings.Replace(revA, "a = 0.30 m", "a = 0.32 m", 1)
	r := revdiff.Compare(pkg(t, map[string]string{"tank.md": revA}), pkg(t, map[string]string{"tank.md": revB}), revdiff.DefaultThreshold)

	kinds := map[revdiff.Kind][]string{}
	for _, c := range r.Changes {
		kinds[c.Kind] = append(kinds[c.Kind], c.Name)
	}
	if got := kinds[revdiff.InputChanged]; len(got) != 1 || got[0] != "a" {
		t.Errorf("changed inputs %v, want [a]", got)
	}
	if got := strings.Join(kinds[revdiff.ResultMoved], ","); got != "A,V,M" {
		t.Errorf("moved results %q, want A,V,M", got)
	}
	if got := kinds[revdiff.CheckFlipped]; len(got) != 1 || got[0] != "M <= M_max" {
		t.Errorf("flipped checks %v, want [M <= M_max]", got)
	}
	if len(r.Changes) != 5 {
		t.Errorf("%d changes, want 5 (1 input, 3 results, 1 check): %+v", len(r.Changes), r.Changes)
	}
	for _, c := range r.Changes {
		if c.Kind == revdiff.ResultMoved && c.Name == "M" {
			// (0.32² - 0.30²) / 0.30² = 13.78 %
			if want := (0.32*0.32 - 0.09) / 0.09; math.Abs(c.Rel-want) > 1e-9 {
				t.Errorf("M moved %g, want %g", c.Rel, want)
			}
			if c.New.Pos.Line != 10 {
				t.Errorf("M reported at line %d", c.New.Pos.Line)
			}
		}
	}
}

func TestThresholdAndFormulaChanges(t *testing.T) {
	revB := strings.Replace(revA, "a = 0.30 m", "a = 0.30001 m", 1)
	r := revdiff.Compare(pkg(t, map[string]string{"tank.md": revA}), pkg(t, map[string]string{"tank.md": revB}), 0.01)
	if r.Count(revdiff.ResultMoved) != 0 || r.Count(revdiff.InputChanged) != 1 {
		t.Errorf("a move of 0.007 %% must stay below a 1 %% threshold: %+v", r.Changes)
	}
	revC := strings.Replace(revA, "V = A * h", "V = A * h * 0.9", 1)
	r = revdiff.Compare(pkg(t, map[string]string{"tank.md": revA}), pkg(t, map[string]string{"tank.md": revC}), revdiff.DefaultThreshold)
	if r.Count(revdiff.FormulaChanged) != 1 || r.Count(revdiff.ResultMoved) != 1 {
		t.Errorf("a changed formula for V and the mass it moves: %+v", r.Changes)
	}
}

func TestSheetsAddedAndRemoved(t *testing.T) {
	r := revdiff.Compare(pkg(t, map[string]string{"tank.md": revA, "old.md": "# old\n"}),
		pkg(t, map[string]string{"tank.md": revA, "new.md": "# new\n"}), revdiff.DefaultThreshold)
	if r.Count(revdiff.SheetAdded) != 1 || r.Count(revdiff.SheetRemoved) != 1 || len(r.Changes) != 2 {
		t.Errorf("%+v", r.Changes)
	}
}

// Two git revisions of one folder, read through git itself.
func TestGitRevisions(t *testing.T) {
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not on the PATH")
	}
	repo := t.TempDir()
	gitRun := func(args ...string) {
		t.Helper()
		cmd := exec.Command("git", args...)
		cmd.Dir = repo
		cmd.Env = append(os.Environ(), "GIT_AUTHOR_NAME=t", "GIT_AUTHOR_EMAIL=t@example.invalid",
			"GIT_COMMITTER_NAME=t", "GIT_COMMITTER_EMAIL=t@example.invalid", "GIT_CONFIG_GLOBAL=/dev/null")
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("git %v: %v\n%s", args, err, out)
		}
	}
	dir := filepath.Join(repo, "calcs")
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	write := func(s string) {
		if err := os.WriteFile(filepath.Join(dir, "tank.md"), []byte(s), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	gitRun("init", "-q")
	write(revA)
	gitRun("add", ".")
	gitRun("commit", "-q", "-m", "A")
	write(strings.Replace(revA, "a = 0.30 m", "a = 0.32 m", 1))
	gitRun("commit", "-q", "-am", "B")

	wd, _ := os.Getwd()
	defer os.Chdir(wd)
	if err := os.Chdir(repo); err != nil {
		t.Fatal(err)
	}
	oldPkg, err := project.LoadAny("HEAD~1:calcs")
	if err != nil {
		t.Fatal(err)
	}
	newPkg, err := project.LoadAny("HEAD:calcs")
	if err != nil {
		t.Fatal(err)
	}
	r := revdiff.Compare(oldPkg, newPkg, revdiff.DefaultThreshold)
	if r.Count(revdiff.InputChanged) != 1 || r.Count(revdiff.ResultMoved) != 3 || r.Count(revdiff.CheckFlipped) != 1 {
		t.Errorf("git revisions: %+v", r.Changes)
	}
	if oldPkg.Sheets[0].Path() != "tank.md" {
		t.Errorf("sheet path %q, want tank.md", oldPkg.Sheets[0].Path())
	}
	// From inside the folder, git names it "." at a revision.
	if err := os.Chdir(dir); err != nil {
		t.Fatal(err)
	}
	here, err := project.LoadAny("HEAD~1:.")
	if err != nil {
		t.Fatal(err)
	}
	if len(here.Sheets) != 1 || here.Sheets[0].Path() != "tank.md" || here.Stamp() != oldPkg.Stamp() {
		t.Errorf("HEAD~1:. from inside the folder read %d sheets, stamp %s vs %s", len(here.Sheets), here.Stamp(), oldPkg.Stamp())
	}
	if _, err := project.LoadAny("HEAD~5:calcs"); err == nil {
		t.Error("a revision that does not exist must be an error")
	}
}

// The same sources read from a folder and from a git revision are the same
// package: templates in _ folders included, dotted folders left out.
func TestIdenticalSourcesAcrossGitRevisions(t *testing.T) {
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not on the PATH")
	}
	repo := t.TempDir()
	files := map[string]string{
		"calcs/tank.md":            "# T\n```sheaf\nuse w = _templates/wall with t = 12 mm\nA = w.t*2 m ; area\n```\n",
		"calcs/_templates/wall.md": "---\ntemplate: true\n---\n# W\n```sheaf\nparam t [mm] ; thickness\nm_w [kg/m^2] = t*7850 kg/m^3 ; mass per area\n```\n",
		"calcs/.drafts/ignore.md":  "# D\n```sheaf\nx = 1\n```\n",
		"calcs/notes.txt":          "not a sheet",
		"calcs/sub/second.md":      "# S\n```sheaf\ntake A from ../tank\nB = 3*A ; thrice\n```\n",
	}
	for name, body := range files {
		p := filepath.Join(repo, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	for _, args := range [][]string{{"init", "-q"}, {"add", "."}, {"commit", "-q", "-m", "A"}} {
		cmd := exec.Command("git", args...)
		cmd.Dir = repo
		cmd.Env = append(os.Environ(), "GIT_AUTHOR_NAME=t", "GIT_AUTHOR_EMAIL=t@example.invalid",
			"GIT_COMMITTER_NAME=t", "GIT_COMMITTER_EMAIL=t@example.invalid", "GIT_CONFIG_GLOBAL=/dev/null")
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("git %v: %v\n%s", args, err, out)
		}
	}
	wd, _ := os.Getwd()
	defer os.Chdir(wd)
	if err := os.Chdir(repo); err != nil {
		t.Fatal(err)
	}
	atRev, err := project.LoadAny("HEAD:calcs")
	if err != nil {
		t.Fatal(err)
	}
	folder, err := project.LoadAny("calcs")
	if err != nil {
		t.Fatal(err)
	}
	if len(folder.Diags) != 0 {
		t.Fatalf("the package has errors: %v", folder.Diags)
	}
	if r := revdiff.Compare(atRev, folder, revdiff.DefaultThreshold); len(r.Changes) != 0 {
		t.Errorf("identical sources differ across git and the folder: %+v", r.Changes)
	}
	if atRev.Stamp() != folder.Stamp() || len(atRev.Templates) != 1 || len(atRev.Sheets) != 2 {
		t.Errorf("stamps %s and %s, %d templates, %d sheets", atRev.Stamp(), folder.Stamp(), len(atRev.Templates), len(atRev.Sheets))
	}
}

// A change in the sheet taken from moves the results of the sheet that
// takes: the difference between two revisions follows the reference.
func TestDiffFollowsTakes(t *testing.T) {
	rev := func(gap string) *project.Package {
		return pkg(t, map[string]string{
			"a.md": "# A\n```sheaf\ng = " + gap + " ; gap ; source: drawing\nx = 2*g ; twice\n```\n",
			"b.md": "# B\n```sheaf\ntake x from a\ny = 3*x ; thrice\n```\n",
		})
	}
	r := revdiff.Compare(rev("2 mm"), rev("3 mm"), revdiff.DefaultThreshold)
	var moved []string
	for _, c := range r.Changes {
		if c.Sheet == "b.md" && c.Kind == revdiff.ResultMoved {
			moved = append(moved, c.Name)
		}
	}
	if strings.Join(moved, " ") != "x y" {
		t.Errorf("results moved in b.md: %v, want x and y; all changes %+v", moved, r.Changes)
	}
}
