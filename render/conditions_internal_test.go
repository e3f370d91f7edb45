package render

import (
	"slices"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// A sweep's table shows every point up to maxSweepRows; beyond, evenly
// chosen points with the first, the last and each point asked for.
func TestSweepRows(t *testing.T) {
	if got := sweepRows(13, []int{12}); len(got) != 13 || got[0] != 0 || got[12] != 12 {
		t.Errorf("13 points: rows %v, want all", got)
	}
	got := sweepRows(1000, []int{14, 999, -1, 5000})
	if got[0] != 0 || got[len(got)-1] != 999 || !slices.Contains(got, 14) || !slices.IsSorted(got) {
		t.Errorf("1000 points: rows %v, want the first, the last and 14, in order", got)
	}
	if len(got) != maxSweepRows+1 {
		t.Errorf("1000 points: %d rows, want %d evenly chosen and the worst", len(got), maxSweepRows)
	}
	if got := groupDigits("1000000", " "); got != "1 000 000" {
		t.Errorf("groupDigits = %q", got)
	}
	if got := groupDigits("4096", " "); got != "4096" {
		t.Errorf("a four-digit count is not grouped (SI Brochure, 5.4.4): %q", got)
	}
}

// FuzzToleranceMathML writes any tolerance text as MathML: it never
// panics, escapes what it is given and keeps its elements balanced.
func FuzzToleranceMathML(f *testing.F) {
	for _, s := range []string{"± 0.2 mm", "± 5 %", "+/- 5 % normal", "in 3.8 mm .. 4.3 mm", "± σ 0.05 mm", "± 2e-3 m uniform",
		"± 1.5E+2 kV", "in -3 K..+4 K", "± (2 * 0.1 mm) triangular", "± <b>&", "± 5 ..", "..", "in 1.2.3", "± 1e", "±\u00a0µm"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		for _, d := range []engine.Distribution{engine.Band, engine.Normal} {
			ml := toleranceMathML(&engine.Tolerance{Text: s, Dist: d})
			if strings.Count(ml, "<mtext>") != strings.Count(ml, "</mtext>") || strings.Count(ml, "<mo>") != strings.Count(ml, "</mo>") ||
				strings.Count(ml, "<mn>") != strings.Count(ml, "</mn>") {
				t.Fatalf("unbalanced MathML for %q: %s", s, ml)
			}
			if strings.Contains(s, "<") && strings.Contains(ml, "<b>") {
				t.Fatalf("%q is not escaped: %s", s, ml)
			}
		}
	})
}
