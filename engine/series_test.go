package engine_test

import (
	"math"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// Series, statement by statement, in the style of TestChecker: a good
// sheet's values worked by hand beside it, and each bad input a located
// error. The samples are invented for the tests.
func TestSeries(t *testing.T) {
	for _, c := range []checkerCase{
		{"a series over a range, its operations, and arithmetic with single values",
			[]string{"x = 0 s .. 3 s by 1 s", "y = [0 V, 1 V, 4 V, 9 V]", "s = series(y, x)", "d = deriv(s)", "I = integral(s)",
				"p = peak(-s)", "m = mean(s)", "r = rms(s)", "v = valueat(s, 2.5 s)", "w = 2 * s", "n = count(s)", "e = s[3]"},
			// y = t² V/s²: central differences are exact for a parabola, so
			// dy/dx = [0, 2, 4, 6] V/s. Trapezoids: (0+1)/2 + (1+4)/2 + (4+9)/2
			// = 9.5 V·s; mean 9.5/3 = 3.167 V; rms √((0+1 + 1+16 + 16+81)/2/3)
			// = √19.17 = 4.378 V (9.5 V·s is 9.5 Wb, and shows so); between 4 V and 9 V at 2.5 s: 6.5 V.
			map[string]string{"d": "ok [0, 2.000, 4.000, 6.000] V/s", "I": "ok 9.500 Wb", "p": "ok 9.000 V", "m": "ok 3.167 V",
				"r": "ok 4.378 V", "v": "ok 6.500 V", "w": "ok [0, 2.000, 8.000, 18.00] V", "n": "ok 4 1", "e": "ok 4.000 V"}},
		{"a repeated x in a list literal is refused at the sample",
			[]string{"s = series([1 V, 2 V, 3 V, 4 V], [0 s, 1 s, 1 s, 2 s])"},
			map[string]string{"s": "error 2:45 x of sample 3 repeats x of sample 2; the x of a series must rise strictly"}},
		{"a falling x that is known only when the sheet runs",
			[]string{"k = 2 s", "x = [0 s, 1 s, k, 1.5 s]", "s = series([1 V, 2 V, 3 V, 4 V], x)"},
			map[string]string{"s": "error 4:34 x of sample 4 is below x of sample 3; the x of a series must rise strictly"}},
		{"y and x of different lengths, too few samples, a single value",
			[]string{"a = series([1 V, 2 V, 3 V], 1 s .. 4 s by 1 s)", "b = series([1 V, 2 V, 3 V], [1 s, 2 s, 3 s])",
				"c = series(1 V, 1 s .. 4 s by 1 s)", "d = deriv([1 V, 2 V])"},
			map[string]string{"a": "error 2:5 y has 3 samples but x has 4", "b": "error 3:5 a series of 3 samples is too short to describe a shape",
				"c": "error 4:12 series takes two lists of real values; this is one value",
				"d": "error 5:11 deriv works on a sampled series; this is 2 elements"}},
		{"a value outside the span, x in the wrong unit, two series added",
			[]string{"s = series([1 V, 2 V, 3 V, 4 V], 0 s .. 3 s by 1 s)", "a = valueat(s, 4 s)", "b = valueat(s, 1 m)", "c = s + s"},
			map[string]string{"a": "error 3:16 x = 4.000 s is outside the series' span, 0 s to 3.000 s",
				"b": "error 4:16 x must be one value of time (s), as the series' x is; this is length (m)",
				"c": "error 5:7 an operation on a series takes a single value on its other side; here both sides are lists or series"}},
	} {
		c.run(t, engine.Options{})
	}
}

// The derivative of λ = Λ·sin(ωt) against the closed form ω·Λ·cos(ωt),
// within 1e-4 of ω·Λ at every sample (d/dt sin = cos: any calculus text,
// e.g. Stewart, Calculus, 8th ed., §3.3; from memory), with the kinds of
// issue 7: e = -ω·dλ/dθ over rotor angle gives volts. Λ and ω invented.
func TestSeriesDerivativeOfASine(t *testing.T) {
	calc := engine.Compile(sheetOf("s.md", "theta = 0 deg .. 360 deg by 0.3515625 deg", "Lambda = 1.8 Wb", "omega = 314.159 rad/s",
		"lambda_s = series(Lambda * sin(theta), theta)", "e = -omega * deriv(lambda_s)", "E_pk = peak(e)"))
	calc.Evaluate()
	st := calc.Lookup("e")
	r := calc.Result(st)
	if r.Status != engine.OK || len(r.Over) != 1025 {
		t.Fatalf("e: %v %v, %d x values", r.Status, r.Err, len(r.Over))
	}
	if got := r.Shown.Symbol; got != "V" && got != "kV" {
		t.Errorf("e shows in %q, want volts", got)
	}
	const Lambda, omega = 1.8, 314.159
	worst := 0.0
	for i, th := range r.Over {
		want := -omega * Lambda * math.Cos(th)
		worst = math.Max(worst, math.Abs(r.List[i]-want)/(omega*Lambda))
	}
	if worst > 1e-4 {
		t.Errorf("derivative of Λ·sin θ is off by %.3g of ω·Λ, want within 1e-4", worst)
	}
}
