package project_test

import (
	"fmt"
	"strings"
	"testing"
	"time"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
)

// quickly is the generous bound within which a limit must give its
// message, on a loaded machine too.
const quickly = 2 * time.Second

// tableSheet is a sheet with a table BH of rows rows (its caption on
// line 3) and a block that reads it and defines y = 2 m.
func tableSheet(rows int) string {
	var b strings.Builder
	b.WriteString("# Curve\n\nTable BH: a long curve\n\n| H [A/m] | B [T] |\n|---|---|\n")
	for i := range rows {
		fmt.Fprintf(&b, "| %d | %.6f |\n", i, float64(i)*1e-6)
	}
	b.WriteString("\n```sheaf\nx = interp(BH.B, BH.H, 5 A/m)\ny = 2 m\n```\n")
	return b.String()
}

// loadTimed builds a package and fails when it takes longer than quickly.
func loadTimed(t *testing.T, files map[string]string) *project.Package {
	t.Helper()
	start := time.Now()
	pkg := build(t, files)
	if d := time.Since(start); d > quickly {
		t.Fatalf("took %v; a limit must answer within %v", d, quickly)
	}
	return pkg
}

// wantDiag asserts a diagnostic at pos whose message holds msg.
func wantDiag(t *testing.T, pkg *project.Package, pos, msg string) {
	t.Helper()
	for _, d := range pkg.Diags {
		if d.Pos.String() == pos && strings.Contains(d.Message, msg) {
			return
		}
	}
	t.Fatalf("no diagnostic at %s saying %q; got %v", pos, msg, pkg.Diags)
}

const otherSheet = "```sheaf\nl = 2 m\n```\n"

// A 1,000,000-row table made build run out of memory. The sheet (22 MB)
// is refused before it is parsed, with the table named at its first row;
// the other sheet keeps its result.
func TestMillionRowTable(t *testing.T) {
	pkg := loadTimed(t, map[string]string{"curve.md": tableSheet(1_000_000), "other.md": otherSheet})
	wantDiag(t, pkg, "curve.md:5:1", fmt.Sprintf("the table here has more than %d rows, the limit for one table", sheets.MaxTableRows))
	if st := sheet(t, pkg, "other.md").Calc.Lookup("l"); st == nil || sheet(t, pkg, "other.md").Calc.Result(st).Status != engine.OK || sheet(t, pkg, "other.md").Calc.Result(st).Value != 2 {
		t.Fatalf("l: %+v", st)
	}
	if n := len(sheet(t, pkg, "curve.md").Calc.Statements); n != 0 {
		t.Errorf("a refused sheet has %d statements", n)
	}
}

// A table past the row limit in a sheet of ordinary size is an error at
// its caption; the sheet's other statements keep their results.
func TestTableRowLimitInSheet(t *testing.T) {
	pkg := loadTimed(t, map[string]string{"curve.md": tableSheet(sheets.MaxTableRows + 1)})
	wantDiag(t, pkg, "curve.md:3:1", fmt.Sprintf("table BH has more than %d rows, the limit for one table", engine.MaxTableRows))
	s := sheet(t, pkg, "curve.md")
	if st := s.Calc.Lookup("y"); st == nil || s.Calc.Result(st).Status != engine.OK || s.Calc.Result(st).Value != 2 {
		t.Fatalf("y: %+v", st)
	}
	if rows := len(s.Doc.Tables[0].Rows); rows > sheets.MaxTableRows+1 {
		t.Errorf("the reader kept %d rows", rows)
	}
	pkg = build(t, map[string]string{"curve.md": tableSheet(sheets.MaxTableRows)})
	if len(pkg.Diags) != 0 {
		t.Fatalf("a table of %d rows: %v", sheets.MaxTableRows, pkg.Diags)
	}
}

// The reader and the engine agree on the row limit: the reader keeps one
// row past it so that the engine can refuse the table.
func TestTableRowLimitsAgree(t *testing.T) {
	if sheets.MaxTableRows != engine.MaxTableRows {
		t.Fatalf("sheets.MaxTableRows %d, engine.MaxTableRows %d", sheets.MaxTableRows, engine.MaxTableRows)
	}
}

// A sheet past the size limit is refused whole at its first line.
func TestSheetSizeLimit(t *testing.T) {
	big := "# Big\n\n" + strings.Repeat("Prose that goes on. ", sheets.MaxSheetBytes/20+1) + "\n"
	pkg := loadTimed(t, map[string]string{"big.md": big, "other.md": otherSheet})
	wantDiag(t, pkg, "big.md:1:1", fmt.Sprintf("the sheet is larger than %d MiB", sheets.MaxSheetBytes>>20))
	if st := sheet(t, pkg, "other.md").Calc.Lookup("l"); st == nil || sheet(t, pkg, "other.md").Calc.Result(st).Status != engine.OK {
		t.Fatalf("l: %+v", st)
	}
}
