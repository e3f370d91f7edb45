package units

import (
	"errors"
	"math"
	"testing"
	"unicode/utf8"
)

// FuzzParse checks properties that hold for every input:
//   - Parse, ParseCompact and ScanCompact never panic;
//   - a refusal is a *Error whose Col lies inside the expression;
//   - a unit Parse accepts has a finite, non-zero scale and exponents
//     within ±99, and its printed Symbol parses again to the same
//     dimension, kind and offset, with a scale equal within 1e-12;
//   - ScanCompact returns a length within the input, on a rune boundary.
//
// The round trip holds for aliases too, because an alias prints as the
// symbol it stands for ("ohm" as Ω, "Gs" as G, "r/min" as rpm).
func FuzzParse(f *testing.F) {
	for _, s := range []string{
		"kg*m^2/s^3", "kg·m²/s³", "W/(m*K)", "N m", "s⁻¹", "m^(-1)", "1/s",
		"kohm", "r/min", "degC", "µm", "Gs", "rad/s", "(m/s)^2",
		"W/m/K", "mm2", "kv", "degC/s", "m)", "A_g", "", "m\xff", "m^99*m^99",
		"Qm^11", "((((m))))", "kV/mm * l", "T*A_g",
		"(1/1) 1", // once printed as 1/1·1, which Parse refuses
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		checkRefusal := func(fn string, err error) {
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("%s(%q): error %T %v, want *units.Error", fn, s, err, err)
			}
			if e.Col < 0 || e.Col > utf8.RuneCountInString(s) {
				t.Fatalf("%s(%q): Col %d outside the expression", fn, s, e.Col)
			}
		}
		u, err := Parse(s)
		if err != nil {
			checkRefusal("Parse", err)
		} else {
			if u.Scale == 0 || math.IsInf(u.Scale, 0) || math.IsNaN(u.Scale) {
				t.Fatalf("Parse(%q) scale %g", s, u.Scale)
			}
			for _, e := range u.Dim {
				if e > maxUnitExp || e < -maxUnitExp {
					t.Fatalf("Parse(%q) dimension %s beyond ±%d", s, u.Dim, maxUnitExp)
				}
			}
			v, err := Parse(u.Symbol)
			if err != nil {
				t.Fatalf("Parse(%q) prints %q, which does not parse: %v", s, u.Symbol, err)
			}
			if v.Dim != u.Dim || v.Kind != u.Kind || v.Offset != u.Offset || relErr(v.Scale, u.Scale) > 1e-12 {
				t.Fatalf("Parse(%q) = %+v, but its symbol parses to %+v", s, u, v)
			}
		}
		if _, err := ParseCompact(s); err != nil {
			checkRefusal("ParseCompact", err)
		}
		n := ScanCompact(s)
		if n < 0 || n > len(s) {
			t.Fatalf("ScanCompact(%q) = %d, outside 0..%d", s, n, len(s))
		}
		if !onRuneBoundary(s, n) {
			t.Fatalf("ScanCompact(%q) = %d, inside a character", s, n)
		}
		if n > 0 {
			_, _ = ParseCompact(s[:n]) // what the formula reader does next; must not panic
		}
	})
}

// onRuneBoundary reports whether byte offset n falls between the runes of
// s as range and DecodeRuneInString step through it; an invalid byte counts
// as a rune of its own, so the test holds for invalid UTF-8 too.
func onRuneBoundary(s string, n int) bool {
	for i := range s {
		if i == n {
			return true
		}
	}
	return n == len(s)
}
