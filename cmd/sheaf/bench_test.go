package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"syscall"
	"testing"

	"github.com/sheaf-calc/sheaf/internal/benchdata"
)

// TestMain lets a benchmark run the command in a process of its own: with
// SHEAF_RUN_MAIN set, the test binary is sheaf.
func TestMain(m *testing.M) {
	if os.Getenv("SHEAF_RUN_MAIN") != "" {
		main()
	}
	code := m.Run()
	if bigDir != "" {
		_ = os.RemoveAll(bigDir)
	}
	os.Exit(code)
}

// BenchmarkBuildProcess1000x50 runs `sheaf build --no-graphs` on a
// generated package of 1,000 sheets of 50 statements in a fresh process,
// as a user would, and reports the process's peak resident memory (the
// operating system's figure) and its time. Target: under 300 MB.
func BenchmarkBuildProcess1000x50(b *testing.B) {
	src := b.TempDir()
	for p, data := range benchdata.Package(1000, 50) {
		full := filepath.Join(src, filepath.FromSlash(p))
		if err := os.MkdirAll(filepath.Dir(full), 0o755); err != nil {
			b.Fatal(err)
		}
		if err := os.WriteFile(full, data, 0o644); err != nil {
			b.Fatal(err)
		}
	}
	out := b.TempDir()
	var peak int64
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		cmd := exec.Command(os.Args[0], "build", src, "-o", out, "--no-graphs")
		cmd.Env = append(os.Environ(), "SHEAF_RUN_MAIN=1")
		if outp, err := cmd.CombinedOutput(); err != nil {
			b.Fatalf("build: %v\n%s", err, outp)
		}
		if ru, ok := cmd.ProcessState.SysUsage().(*syscall.Rusage); ok && ru.Maxrss*1024 > peak {
			peak = ru.Maxrss * 1024 // Linux reports kilobytes
		}
	}
	b.ReportMetric(float64(peak)/(1<<20), "maxrss-MB")
}
