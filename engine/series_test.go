package engine_test

import (
	"fmt"
	"math"
	"sync"
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
		{"a function of the sheet's own over a series keeps its x, and a phase of a negated sine",
			[]string{"x = 0 deg .. 360 deg by 30 deg", "s = series(sin(x) * 1 V, x)", "f(a) = a * 2", "y = f(s)", "v = valueat(y, 75 deg)",
				"p = harmonicphase(-s, 1)"},
			// Between 2·sin 60° = 1.732 V and 2·sin 90° = 2 V, halfway: 1.866 V.
			// −sin θ = cos(θ + 90°).
			map[string]string{"v": "ok 1.866 V", "p": "ok 90.00 °"}},
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

// The Fourier series of a square wave of amplitude 1, (4/π)·Σ sin(kθ)/k
// over odd k, and of a triangular wave of amplitude 1, (8/π²)·Σ
// (−1)^((k−1)/2)·sin(kθ)/k² over odd k, with no even harmonics
// (Kreyszig, Advanced Engineering Mathematics, 10th ed., §11.1 and
// §11.2; from memory), against harmonic and harmonicphase from 1,024
// samples of one period.
//
// N samples cannot give those amplitudes to 1e-6: harmonic k + mN of the
// wave folds onto harmonic k (aliasing), and the sums of the folded
// series are closed forms, from the partial fractions π·cot(πx) =
// Σ 1/(x+m) and π²/sin²(πx) = Σ 1/(x+m)² (Ahlfors, Complex Analysis, 3rd
// ed., ch. 5, §2.1; from memory): (4/N)·cot(πk/N) for the square wave and
// 8/(N·sin(πk/N))² for the triangular one. So each is checked against its
// sampled closed form within 1e-9, and against the Fourier series within
// what aliasing leaves, 4πk/(3N²) and 8/(3N²) (the first terms of those
// forms' expansions); the triangle's 2.5e-6 and the square's 4.0e-6·k are
// beyond 1e-6 at N = 1,024 for any method that reads only the samples.
func TestHarmonicsOfSquareAndTriangularWaves(t *testing.T) {
	const N = 1024
	// sin θ/√(sin²θ + 1e-18) is ±1 within 1e-14 at every sample but the
	// three at the jumps (0°, 180°, 360°), where it is within 3e-7 of 0,
	// the mean of the two sides, as the Fourier series gives there.
	lines := []string{"theta = 0 deg .. 360 deg by 0.3515625 deg", "u_sq = sin(theta) / sqrt(sin(theta)^2 + 1e-18)",
		"u_tri = 2 / pi * asin(sin(theta))", "sq = series(u_sq, theta)", "tr = series(u_tri, theta)"}
	for k := 1; k <= 15; k++ {
		lines = append(lines, fmt.Sprintf("A_%d = harmonic(sq, %d)", k, k), fmt.Sprintf("B_%d = harmonic(tr, %d)", k, k),
			fmt.Sprintf("phi_%d = harmonicphase(sq, %d)", k, k), fmt.Sprintf("psi_%d = harmonicphase(tr, %d)", k, k))
	}
	calc := engine.Compile(sheetOf("w.md", lines...))
	calc.Evaluate()
	val := func(n string) float64 {
		r := calc.Result(calc.Lookup(n))
		if r.Status != engine.OK {
			t.Fatalf("%s: %v %v", n, r.Status, r.Err)
		}
		return r.Value
	}
	near := func(what string, got, want, tol float64) {
		if math.Abs(got-want) > tol {
			t.Errorf("%s is %.10f, want %.10f within %.2g (off by %.2g)", what, got, want, tol, got-want)
		}
	}
	for k := 1; k <= 15; k++ {
		kf := float64(k)
		A, B := val(fmt.Sprintf("A_%d", k)), val(fmt.Sprintf("B_%d", k))
		if k%2 == 0 {
			near(fmt.Sprintf("harmonic %d of the square wave", k), A, 0, 1e-9)
			near(fmt.Sprintf("harmonic %d of the triangular wave", k), B, 0, 1e-9)
			continue
		}
		x := math.Pi * kf / N
		near(fmt.Sprintf("harmonic %d of the square wave against its sampled form", k), A, 4.0/N/math.Tan(x), 1e-9)
		near(fmt.Sprintf("harmonic %d of the triangular wave against its sampled form", k), B, 8/math.Pow(N*math.Sin(x), 2), 1e-9)
		near(fmt.Sprintf("harmonic %d of the square wave against 4/(πk)", k), A, 4/(math.Pi*kf), 1.01*4*math.Pi*kf/(3*N*N))
		near(fmt.Sprintf("harmonic %d of the triangular wave against 8/(π²k²)", k), B, 8/(math.Pi*math.Pi*kf*kf), 1.01*8/(3*N*N))
		// sin(kθ) = cos(kθ − 90°): every odd harmonic of the square wave has
		// phase −90°; the triangle's alternate, −90° and +90°.
		near(fmt.Sprintf("phase of harmonic %d of the square wave", k), val(fmt.Sprintf("phi_%d", k)), -math.Pi/2, 1e-6)
		want := -math.Pi / 2
		if k%4 == 3 {
			want = math.Pi / 2
		}
		near(fmt.Sprintf("phase of harmonic %d of the triangular wave", k), val(fmt.Sprintf("psi_%d", k)), want, 1e-6)
	}
}

// THD of a sum of sines, √(0.05² + 0.03²) = 0.05831 exactly (the definition
// of total harmonic distortion relative to the fundamental, IEC 60050-551,
// 551-20-13; from memory), and of the triangular wave, √(π⁴/96 − 1) =
// 0.1212 from Σ 1/k⁴ over odd k = π⁴/96 (Kreyszig, 10th ed., §11.1,
// Parseval's identity; from memory), within what 1,024 samples leave.
func TestTHD(t *testing.T) {
	calc := engine.Compile(sheetOf("t.md", "theta = 0 deg .. 360 deg by 0.3515625 deg",
		"u = 100 V * (sin(theta) + 0.05 * sin(5 * theta) + 0.03 * sin(7 * theta))", "d_u = thd(series(u, theta))",
		"w = 2 / pi * asin(sin(theta))", "d_w = thd(series(w, theta))"))
	calc.Evaluate()
	for _, c := range []struct {
		name      string
		want, tol float64
	}{{"d_u", math.Hypot(0.05, 0.03), 1e-12}, {"d_w", math.Sqrt(math.Pow(math.Pi, 4)/96 - 1), 1e-4}} {
		r := calc.Result(calc.Lookup(c.name))
		if r.Status != engine.OK || math.Abs(r.Value-c.want) > c.tol {
			t.Errorf("%s = %.12g (%v %v), want %.12g within %g", c.name, r.Value, r.Status, r.Err, c.want, c.tol)
		}
	}
}

// Bad inputs to harmonic analysis, each a located error.
func TestHarmonicsBadInputs(t *testing.T) {
	for _, c := range []checkerCase{
		{"uneven samples, known when checked",
			[]string{"x = [0 deg, 40 deg, 90 deg, 135 deg, 180 deg, 225 deg, 270 deg, 315 deg, 360 deg]",
				"s = series(sin(x), x)", "a = harmonic(s, 1)"},
			map[string]string{"a": "error 4:14 the samples are uneven: the step from sample 1 to sample 2 differs from the mean step; harmonics need even samples"}},
		{"uneven samples known only when the sheet runs, and a frequency in cycles times d/dθ",
			[]string{"c = 1", "x = [0 deg, 40 deg, 90 deg, 135 deg, 180 deg, 225 deg, 270 deg, 315 deg, 360 deg] * c",
				"s = series(sin(x) * 1 Wb, x)", "a = harmonic(s, 1)", "f = 50 Hz", "e = -f * deriv(s)", "omega = 2 * pi * f", "e_2 = -omega * deriv(s)",
				"v = e_2[4]"},
			// At 135°, between steps of 45°: (sin 180° − sin 90°)/(π/2) = −0.6366 Wb/rad, times −ω = 200.0 V.
			map[string]string{"a": "error 5:14 the samples are uneven: the step from sample 1 to sample 2 differs from the mean step; harmonics need even samples",
				"e": "error 7:8 this product mixes radians and cycles (cycles with per radian): a factor 2π is missing or one too many",
				"v": "ok 200.0 V"}},
		{"not periodic over its span, too coarse, a harmonic the sampling does not resolve, not a whole number",
			[]string{"x = 0 deg .. 360 deg by 30 deg", "s = series(x / (1 rad) * 1 V, x)", "a = harmonic(s, 1)",
				"c = thd(series([0, 1, 0, -1, 0, 1, 0], 0 deg .. 360 deg by 60 deg))",
				"t = series(sin(x) * 1 V, x)", "k = harmonic(t, 6)", "h = harmonic(t, 2.5)", "p = thd(t)",
				"p2 = thd(t^2)"},
			map[string]string{"a": "error 4:14 the series is not periodic over its span: its last sample differs from its first",
				"k": "error 7:17 the sampling is too coarse for harmonic 6: 12 samples per period resolve harmonics up to 5",
				"h": "error 8:17 harmonic 2.5 is not a whole number from 1", "p2": "error 10:6 the series has no fundamental (its 1st harmonic is zero)",
				"c": "error 5:9 the sampling is too coarse for harmonics: the series has 6 samples per period"}},
	} {
		c.run(t, engine.Options{})
	}
}

// Four goroutines share one Program whose sheet takes harmonics, each
// frame with its own amplitude: each FFT's scratch space is its own (run
// with -race, as CI does). The 5th harmonic is 0.05·U by construction.
func TestHarmonicsSharedByGoroutines(t *testing.T) {
	s, p := program(t, "theta = 0 deg .. 360 deg by 1 deg", "U = 100 V", "u = U * (sin(theta) + 0.05 * sin(5 * theta))",
		"A_5 = harmonic(series(u, theta), 5)")
	a5, in := s.Lookup("A_5").Index, slot(t, p, "U")
	var wg sync.WaitGroup
	errs := make(chan string, 4)
	for w := 0; w < 4; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			f := p.NewFrame()
			for i := 0; i < 50; i++ {
				U := float64(100 + 10*((i+w)%7))
				p.Run(f, []engine.Set{{Slot: in, SI: U}})
				if got := f.Values[a5]; math.Abs(got-0.05*U) > 1e-9*U {
					errs <- fmt.Sprintf("U = %g V: A_5 = %g V, want %g V", U, got, 0.05*U)
					return
				}
			}
		}(w)
	}
	wg.Wait()
	close(errs)
	for e := range errs {
		t.Error(e)
	}
}

// The same closed form over time, e = −dλ/dt for λ = Λ·sin(ωt) at 50 Hz,
// sampled 1,024 times over one period: within 1e-4 of ω·Λ.
func TestSeriesDerivativeOverTime(t *testing.T) {
	calc := engine.Compile(sheetOf("t.md", "t = 0 ms .. 20 ms by 0.01953125 ms", "Lambda = 1.8 Wb", "omega = 2 * pi * 50 Hz",
		"lambda_t = series(Lambda * sin(omega * t), t)", "e = -deriv(lambda_t)"))
	calc.Evaluate()
	r := calc.Result(calc.Lookup("e"))
	if r.Status != engine.OK || len(r.Over) != 1025 {
		t.Fatalf("e: %v %v, %d x values", r.Status, r.Err, len(r.Over))
	}
	if got := r.Shown.Symbol; got != "V" {
		t.Errorf("e shows in %q, want V", got)
	}
	const Lambda, omega = 1.8, 2 * math.Pi * 50
	worst := 0.0
	for i, ti := range r.Over {
		worst = math.Max(worst, math.Abs(r.List[i]+omega*Lambda*math.Cos(omega*ti))/(omega*Lambda))
	}
	if worst > 1e-4 {
		t.Errorf("−dλ/dt of Λ·sin ωt is off by %.3g of ω·Λ, want within 1e-4", worst)
	}
}
