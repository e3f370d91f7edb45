package engine_test

import (
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// Quantity literals: where a unit ends, and the powers that read two ways.
func TestQuantityLiteralPowers(t *testing.T) {
	s := compileLines(
		"A = 60 cm^2",   // 1: an area of 60 cm²
		"B = (60 cm)^2", // 2: the square of a length of 60 cm
		"C = 2 m**2",    // 3: ** is the same power as ^
		"D = 60 cm ^ 2", // 4 (line 5 of the sheet: compileLines opens a fence first): ambiguous, refused
		"E = 5 mm * 2",  // 5: a space ends the unit; * 2 multiplies
	)
	want := map[string]float64{"A": 60e-4, "B": 0.36, "C": 2, "E": 0.01}
	for name, v := range want {
		r := s.Result(s.Lookup(name))
		if r.Status != engine.OK || !near(r.Value, v, 1e-12) {
			t.Errorf("%s: status %v value %g, want %g", name, r.Status, r.Value, v)
		}
	}
	d := s.Result(s.Lookup("D"))
	if d.Status != engine.Errored || d.Err.Pos.Line != 5 || d.Err.Pos.Col != 11 ||
		!strings.Contains(d.Err.Message, "ambiguous") || !strings.Contains(d.Err.Hint, "(60 cm)^") {
		t.Errorf("D: %v %+v", d.Status, d.Err)
	}
}

func TestReservedWordsAsNames(t *testing.T) {
	s := compileLines("check = 2", "use = 3", "param = 4", "x = 1")
	for i, word := range []string{"check", "use", "param"} {
		r := s.Result(s.Statements[i])
		if r.Status != engine.Errored || r.Err.Message != word+" is a reserved word" || r.Err.Pos.Col != 1 {
			t.Errorf("%s = ...: %v %+v", word, r.Status, r.Err)
		}
	}
	if x := s.Result(s.Lookup("x")); x.Status != engine.OK {
		t.Error("x must still evaluate")
	}
}
