package main

import (
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"syscall"
	"testing"
	"time"
)

// sheafProcess runs sheaf in a process of its own (the test binary, see
// TestMain) with the given environment added, and fails the test if it
// does not exit with one of the codes allowed.
func sheafProcess(t *testing.T, env []string, args ...string) {
	t.Helper()
	cmd := exec.Command(os.Args[0], args...)
	cmd.Env = append(append(os.Environ(), "SHEAF_RUN_MAIN=1"), env...)
	out, err := cmd.CombinedOutput()
	if code := cmd.ProcessState.ExitCode(); code != exitOK && code != exitCheckFailed {
		t.Fatalf("sheaf %s: %v (exit %d)\n%s", strings.Join(args, " "), err, code, out)
	}
}

// listTree returns the paths of everything under dir.
func listTree(t *testing.T, dir string) []string {
	t.Helper()
	var paths []string
	err := filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if p != dir {
			paths = append(paths, p)
		}
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return paths
}

// No command writes into the shared temp folder or the user's cache
// folder: there is no compiled code that someone else could plant there
// (issue 8: go-graphviz compiled its WebAssembly into $TMPDIR/go-graphviz
// at the start of every command, even --version, and ran what it found).
func TestCommandsWriteNothingIntoTempOrCache(t *testing.T) {
	tmp, cache, home := t.TempDir(), t.TempDir(), t.TempDir()
	env := []string{"TMPDIR=" + tmp, "XDG_CACHE_HOME=" + cache, "HOME=" + home}
	out := filepath.Join(t.TempDir(), "pkg")
	commands := [][]string{
		{"--version"},
		{"check", demo},
		{"build", demo, "-o", out},
		{"verify", out, demo},
		{"units"},
	}
	for _, args := range commands {
		sheafProcess(t, env, args...)
		for _, dir := range []string{tmp, cache, home} {
			if left := listTree(t, dir); len(left) > 0 {
				t.Fatalf("sheaf %s left %s", strings.Join(args, " "), strings.Join(left, ", "))
			}
		}
	}
}

// A graph layout planted in the cache folder that sheaf once used
// ($XDG_CACHE_HOME/sheaf/graph-<SHA-256>.svg) never reaches a page: after
// a build, every file there is replaced by a script, another is added,
// and a rebuild's pages hold none of it.
func TestPlantedGraphCacheIsNotRead(t *testing.T) {
	tmp, cache, home := t.TempDir(), t.TempDir(), t.TempDir()
	env := []string{"TMPDIR=" + tmp, "XDG_CACHE_HOME=" + cache, "HOME=" + home}
	out := filepath.Join(t.TempDir(), "pkg")
	sheafProcess(t, env, "build", demo, "-o", out)

	const planted = `<svg><script>alert("planted")</script></svg>`
	old := filepath.Join(cache, "sheaf")
	if err := os.MkdirAll(old, 0o755); err != nil {
		t.Fatal(err)
	}
	targets := append(listTree(t, old), filepath.Join(old, "graph-"+strings.Repeat("0", 64)+".svg"))
	for _, p := range targets {
		if err := os.WriteFile(p, []byte(planted), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	sheafProcess(t, env, "build", demo, "-o", out)
	graphs := 0
	for rel, data := range readTree(t, out) {
		if strings.Contains(string(data), "planted") {
			t.Errorf("%s holds the planted cache file", rel)
		}
		if strings.Contains(string(data), `class="node"`) {
			graphs++
		}
	}
	if graphs == 0 {
		t.Fatal("the build drew no dependency graph")
	}
}

// A file planted where go-graphviz kept its compiled WebAssembly
// ($TMPDIR/go-graphviz/wazero-<version>-<arch>-<os>/<SHA-256 of the
// module>) is never opened: each is a named pipe, which would hold any
// reader until the deadline, and every command returns at once.
func TestPlantedCompiledCodeIsNotRead(t *testing.T) {
	tmp := t.TempDir()
	const module = "65d05e8bbea8a6610d0686e4cb2ab62ff93a257de48b3587eb75f15ddf3c84ca" // Graphviz in go-graphviz v0.2.10
	for _, v := range []string{"v1.10.1", "dev"} {
		dir := filepath.Join(tmp, "go-graphviz", "wazero-"+v+"-"+runtime.GOARCH+"-"+runtime.GOOS)
		if err := os.MkdirAll(dir, 0o755); err != nil {
			t.Fatal(err)
		}
		if err := syscall.Mkfifo(filepath.Join(dir, module), 0o666); err != nil {
			t.Fatal(err)
		}
	}
	env := []string{"TMPDIR=" + tmp, "XDG_CACHE_HOME=" + t.TempDir(), "HOME=" + t.TempDir()}
	for _, args := range [][]string{{"--version"}, {"build", demo, "-o", filepath.Join(t.TempDir(), "pkg")}} {
		ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
		cmd := exec.CommandContext(ctx, os.Args[0], args...)
		cmd.Env = append(append(os.Environ(), "SHEAF_RUN_MAIN=1"), env...)
		out, err := cmd.CombinedOutput()
		late := ctx.Err() == context.DeadlineExceeded
		cancel()
		if late {
			t.Fatalf("sheaf %s opened a file planted in $TMPDIR/go-graphviz and waited on it", strings.Join(args, " "))
		}
		if err != nil {
			t.Fatalf("sheaf %s: %v\n%s", strings.Join(args, " "), err, out)
		}
	}
}
