package revdiff_test

import (
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/revdiff"
)

const casesA = "---\ntitle: Supply\n---\n```sheaf\n" +
	"U = 24 V ; supply ; source: spec\n" +
	"R = 3 ohm ± 5 % ; load ; source: spec\n" +
	"I = U / R ; current\n" +
	"I_max = 9 A ; limit ; source: spec\n" +
	"check I <= I_max ; within the limit\n" +
	"case low: U = 20 V\n" +
	"case high: U = 26 V\n" +
	"case cold: R = 2.8 ohm\n```\n"

// Load cases are compared case by case: a case that sets another value
// moves the results in that case only and can flip a check there; a case
// added or removed, and a tolerance changed, are changes of their own.
func TestCasesComparedCaseByCase(t *testing.T) {
	casesB := strings.Replace(casesA, "case high: U = 26 V", "case high: U = 28 V", 1)
	casesB = strings.Replace(casesB, "case cold: R = 2.8 ohm\n", "case hot: R = 3.3 ohm\n", 1)
	casesB = strings.Replace(casesB, "± 5 %", "± 10 %", 1)
	r := revdiff.Compare(pkg(t, map[string]string{"a.md": casesA}), pkg(t, map[string]string{"a.md": casesB}), revdiff.DefaultThreshold)
	var got []string
	for _, c := range r.Changes {
		got = append(got, string(c.Kind)+" "+c.Name+" "+c.Case)
	}
	want := []string{
		"tolerance-changed R ",
		"result-moved I high",       // 26 V/3 Ω to 28 V/3 Ω: +7.7 %
		"check-flipped I <= I_max ", // governed by case high: 9.33 A against 9 A
		"check-flipped I <= I_max high",
		"case-added hot ",
		"case-removed cold ",
		"case-changed high ",
	}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Fatalf("changes:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
}

// Identical sources with cases give no change.
func TestIdenticalCasesNoChange(t *testing.T) {
	r := revdiff.Compare(pkg(t, map[string]string{"a.md": casesA}), pkg(t, map[string]string{"a.md": casesA}), revdiff.DefaultThreshold)
	if len(r.Changes) != 0 {
		t.Fatalf("identical sources give %d changes: %+v", len(r.Changes), r.Changes)
	}
}
