package project_test

import (
	"os"
	"os/exec"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

// A package read from a git revision has its templates: folders whose
// names start with _ were skipped there (unlike a folder on disk), so a
// diff against a revision showed every template input as added.
func TestRevisionKeepsTemplates(t *testing.T) {
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git is not on the PATH")
	}
	repo := t.TempDir()
	writeFiles(t, repo, map[string]string{
		"calcs/_t/coil.md":   coilTemplate,
		"calcs/.drafts/x.md": otherSheet,
		"calcs/job.md":       "```sheaf\nuse a = _t/coil with N = 10\n```\n",
	})
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
	if len(pkg.Diags) != 0 || len(pkg.Sheets) != 1 || len(pkg.Templates) != 1 || len(pkg.Files) != 2 {
		t.Fatalf("%d sheets, %d templates, %d files, diagnostics %v", len(pkg.Sheets), len(pkg.Templates), len(pkg.Files), pkg.Diags)
	}
	disk, err := project.Load("calcs")
	if err != nil {
		t.Fatal(err)
	}
	if disk.Stamp() != pkg.Stamp() {
		t.Errorf("the revision and the folder differ: %s vs %s", pkg.Stamp(), disk.Stamp())
	}
}
