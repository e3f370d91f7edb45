package units

import (
	"errors"
	"math"
	"strconv"
	"testing"
)

// mustParse parses a unit expression the test relies on, failing the test
// (not panicking) when it does not parse.
func mustParse(t testing.TB, s string) Unit {
	t.Helper()
	u, err := Parse(s)
	if err != nil {
		t.Fatalf("Parse(%q): %v", s, err)
	}
	return u
}

// parseErr parses an expression that must fail and returns the *Error.
func parseErr(t testing.TB, s string) *Error {
	t.Helper()
	u, err := Parse(s)
	if err == nil {
		t.Fatalf("Parse(%q) = %q, want an error", s, u.Symbol)
	}
	var e *Error
	if !errors.As(err, &e) {
		t.Fatalf("Parse(%q) error %T, want *units.Error", s, err)
	}
	return e
}

// relErr is |got−want|/|want|; want must not be zero.
func relErr(got, want float64) float64 {
	return math.Abs(got-want) / math.Abs(want)
}

// halfLastFigure returns half a unit in the last of the seven significant
// figures NIST SP 811 prints ("7.957 747 E+01" gives 0.5e-5): a value
// rounded to seven figures lies at most this far from the printed one.
func halfLastFigure(printed float64) float64 {
	s := strconv.FormatFloat(printed, 'e', 6, 64)
	_, e := SplitExponent(s)
	return 0.5 * math.Pow10(e-6)
}

// d builds a dimension from its exponents in the SI Brochure's order
// T L M I Θ N J, so that tables can be read against the brochure.
func d(t, l, m, i, th, n, j int8) Dim {
	return Dim{Time: t, Length: l, Mass: m, Current: i, Temperature: th, Amount: n, Luminous: j}
}
