package main

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/pdf"
)

// TestPrintWithoutChromium: with no browser on the PATH, print fails with
// the documented exit code and a message that names Debian's package,
// and writes nothing.
func TestPrintWithoutChromium(t *testing.T) {
	t.Setenv("PATH", t.TempDir())
	t.Setenv("SHEAF_CHROMIUM", "")
	out := filepath.Join(t.TempDir(), "p.pdf")
	var stdout, stderr bytes.Buffer
	code := run([]string{"print", filepath.Join("..", "..", "examples", "corran-hill-conveyor"), "-o", out}, &stdout, &stderr)
	if code != exitErrors || !strings.Contains(stderr.String(), "apt-get install chromium") {
		t.Fatalf("exit %d, stderr %q", code, stderr.String())
	}
	if _, err := os.Stat(out); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("print wrote %s without a browser", out)
	}
}

// TestPrintRefusesTheSources: the PDF may not be written among the sources.
func TestPrintRefusesTheSources(t *testing.T) {
	if _, err := pdf.FindChromium(); err != nil {
		t.Skip("skipped: " + err.Error())
	}
	src := filepath.Join(t.TempDir(), "job")
	if err := os.CopyFS(src, os.DirFS(filepath.Join("..", "..", "examples", "corran-hill-conveyor"))); err != nil {
		t.Fatal(err)
	}
	var stdout, stderr bytes.Buffer
	code := run([]string{"print", src, "-o", filepath.Join(src, "p.pdf")}, &stdout, &stderr)
	if code != exitErrors || !strings.Contains(stderr.String(), "inside the package's sources") {
		t.Fatalf("exit %d, stderr %q", code, stderr.String())
	}
}
