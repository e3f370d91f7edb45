package project_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/sheets"
)

// Issue 13, item 4: lib/emf-waveform. No published example of a sampled
// flux linkage was recalled, so the template is compared with closed forms
// and with the same calculation written out in Go, independently of
// sheaf's engine; its checks are made to fail.

// TestLibraryEMFWaveformSinusoid compares a sinusoidal flux linkage with its closed
// form: λ = Λ·sin θ gives e = −ω·Λ·cos θ, E_rms = ω·Λ/√2 and no harmonics.
func TestLibraryEMFWaveformSinusoid(t *testing.T) {
	_, byPath := loadLibrary(t)
	s := byPath["emf-waveform-closed-forms.md"]
	allPass(t, s)
	// 12 poles at 500 rpm: 50 Hz; Λ = 0.20 Wb.
	w, lam := 2*math.Pi*6*500.0/60, 0.20
	// Three-point differences read sin(h)/h of a sine's slope at a 1° step,
	// 5e-5 low inside the period, and h²/3 = 1.0e-4 off at the ends, where
	// they are one-sided.
	const diffTol = 2e-4
	closeTo(t, "gen.omega", libraryValue(t, s, "gen.omega"), w, 1e-12)
	closeTo(t, "gen.f", libraryValue(t, s, "gen.f"), 50, 1e-12)
	closeTo(t, "gen.E_rms against ω·Λ/√2", libraryValue(t, s, "gen.E_rms"), w*lam/math.Sqrt2, diffTol)
	closeTo(t, "gen.E_pk against ω·Λ", libraryValue(t, s, "gen.E_pk"), w*lam, diffTol)
	closeTo(t, "gen.E_1 against ω·Λ", libraryValue(t, s, "gen.E_1"), w*lam, diffTol)
	closeTo(t, "gen.k_crest against √2", libraryValue(t, s, "gen.k_crest"), math.Sqrt2, diffTol)
	for _, k := range []string{"gen.E_3", "gen.E_5", "gen.E_7"} {
		if v := libraryValue(t, s, k); !(math.Abs(v) < 1e-5*w*lam) {
			t.Errorf("%s = %g V: a sine has no harmonics", k, v)
		}
	}
	if d := libraryValue(t, s, "gen.thd_e"); !(d < 1e-4) {
		t.Errorf("gen.thd_e = %g for a sine", d)
	}
	// Sign convention: e = −ω·dλ/dθ, so e(0) = −ω·Λ and the fundamental,
	// −ω·Λ·cos θ = ω·Λ·cos(θ + 180°), has the phase ±180°.
	e := listValues(t, s, "gen.e")
	closeTo(t, "gen.e at θ = 0", e[0], -w*lam, diffTol)
	closeTo(t, "gen.e at θ = 90°", e[90]+1, 1, diffTol) // cos 90° = 0
	closeTo(t, "|gen.phi_1| against 180°", math.Abs(libraryValue(t, s, "gen.phi_1")), math.Pi, 1e-6)
}

// trapezoidLambda is the flux linkage, in units of its slope through zero
// Λ_d, of a coil whose EMF is a trapezoid with a flat top 120° wide and
// flanks of 60°: the integral of that shape, written out piece by piece
// (not the folded-angle form the sheet uses).
func trapezoidLambda(u float64) float64 {
	a := math.Pi / 3
	switch {
	case u <= a:
		return u
	case u <= 2*a:
		return u - 3/math.Pi*(u-a)*(u-a)
	case u <= 4*a:
		return a - (u - 2*a)
	case u <= 5*a:
		return -a - (u - 4*a) + 3/math.Pi*(u-4*a)*(u-4*a)
	default:
		return -a + (u - 5*a)
	}
}

// threePointDeriv differentiates evenly spaced samples: central differences
// inside, the second-order one-sided formula at the ends.
func threePointDeriv(y []float64, h float64) []float64 {
	n := len(y)
	d := make([]float64, n)
	for i := 1; i < n-1; i++ {
		d[i] = (y[i+1] - y[i-1]) / (2 * h)
	}
	d[0] = (-3*y[0] + 4*y[1] - y[2]) / (2 * h)
	d[n-1] = (3*y[n-1] - 4*y[n-2] + y[n-3]) / (2 * h)
	return d
}

// dftAmplitude is the amplitude of the k-th harmonic of one period of
// samples whose last repeats the first, by the discrete Fourier sum.
func dftAmplitude(y []float64, k int) float64 {
	n := len(y) - 1
	var re, im float64
	for i := range n {
		a := 2 * math.Pi * float64(k*i) / float64(n)
		re += y[i] * math.Cos(a)
		im += y[i] * math.Sin(a)
	}
	return 2 * math.Hypot(re, im) / float64(n)
}

// TestLibraryEMFWaveformTrapezoid compares the flat-topped EMF of the brushless DC
// motor with the Fourier series of a trapezoid (a square wave's 4E/(πk)
// times sin(kα/2)/(kα/2) for flanks α wide: the convolution theorem, worked
// here) and with its own differences and discrete Fourier sums in Go.
func TestLibraryEMFWaveformTrapezoid(t *testing.T) {
	_, byPath := loadLibrary(t)
	s := byPath["emf-waveform-closed-forms.md"]
	w := 2 * math.Pi * 2 * 3000.0 / 60
	lamd := 12 * 0.050 / (5 * math.Pi)
	flat := w * lamd // 24.0 V
	closeTo(t, "flat top by hand", flat, 24.0, 1e-12)

	// Closed forms of the continuous trapezoid. The numerical derivative
	// reads the k-th harmonic sin(kh)/(kh) low at the step h = 1°, and the
	// RMS value to O(h²): 0.5 % covers both.
	alpha, h := math.Pi/3, math.Pi/180
	closeTo(t, "mot.E_pk", libraryValue(t, s, "mot.E_pk"), flat, 1e-9)
	closeTo(t, "mot.E_rms against E·√7/3", libraryValue(t, s, "mot.E_rms"), flat*math.Sqrt(7)/3, libraryRelTol)
	ek := func(k float64) float64 { return 4 * flat / (math.Pi * k) * math.Abs(math.Sin(k*alpha/2)/(k*alpha/2)) }
	for k, name := range map[float64]string{1: "mot.E_1", 3: "mot.E_3", 5: "mot.E_5", 7: "mot.E_7"} {
		closeTo(t, name+" against the Fourier series", libraryValue(t, s, name), ek(k), libraryRelTol)
		closeTo(t, name+" against the series, damped by sin(kh)/(kh)", libraryValue(t, s, name), ek(k)*math.Sin(k*h)/(k*h), 2e-4)
	}
	// THD of the trapezoid: √(2·E_rms² − E_1²)/E_1 = √(14/9 − 144/π⁴)/(12/π²).
	thd := math.Sqrt(14.0/9-144/math.Pow(math.Pi, 4)) / (12 / (math.Pi * math.Pi))
	closeTo(t, "mot.thd_e against the closed form", libraryValue(t, s, "mot.thd_e"), thd, libraryRelTol)
	closeTo(t, "E_1 by hand, 12·E/π²", ek(1), 12*flat/(math.Pi*math.Pi), 1e-12)

	// Worked again in Go: samples, differences, trapezoidal RMS, DFT.
	lam := make([]float64, 361)
	for i := range lam {
		lam[i] = lamd * trapezoidLambda(float64(i)*h)
	}
	d := threePointDeriv(lam, h)
	e := make([]float64, len(d))
	for i := range d {
		e[i] = -w * d[i]
	}
	got := listValues(t, s, "mot.e")
	if len(got) != len(e) {
		t.Fatalf("mot.e has %d samples, want %d", len(got), len(e))
	}
	for i := range e {
		if math.Abs(got[i]-e[i]) > 1e-9*flat {
			t.Fatalf("mot.e[%d] = %.12g, want %.12g", i+1, got[i], e[i])
		}
	}
	closeTo(t, "mot.e at θ = 0 (source convention: λ rising, e negative)", got[0], -flat, 1e-9)
	var sq float64
	for i := 1; i < len(e); i++ {
		sq += (e[i-1]*e[i-1] + e[i]*e[i]) / 2 * h
	}
	closeTo(t, "mot.E_rms against Go", libraryValue(t, s, "mot.E_rms"), math.Sqrt(sq/(2*math.Pi)), 1e-9)
	for k, name := range map[int]string{1: "mot.E_1", 3: "mot.E_3", 5: "mot.E_5", 7: "mot.E_7"} {
		closeTo(t, name+" against Go's DFT", libraryValue(t, s, name), dftAmplitude(e, k), 1e-8)
	}
	var hsum float64
	for k := 2; k <= (len(e)-2)/2; k++ {
		a := dftAmplitude(e, k)
		hsum += a * a
	}
	closeTo(t, "mot.thd_e against Go's DFT", libraryValue(t, s, "mot.thd_e"), math.Sqrt(hsum)/dftAmplitude(e, 1), 1e-7)
	closeTo(t, "mot.eps_7", libraryValue(t, s, "mot.eps_7"), 1-math.Sin(7*h)/(7*h), 1e-9)
}

// The emf-waveform checks fail where a waveform or its sampling breaks them.
func TestLibraryEMFWaveformChecksCanFail(t *testing.T) {
	// A 10 % 5th harmonic in the flux linkage is a 50 % 5th in the EMF.
	wantFail(t, checkStatus(t, starterWith(t, "emf-waveform", map[string]string{
		"lambda": "0.20 Wb * (sin(0 deg .. 360 deg by 1 deg) + 0.1 * sin(5 * (0 deg .. 360 deg by 1 deg)))"})),
		"thd_e <= thd_max", "E_pk <= E_pk_max")
	// 0.30 Wb: 94 V peak against the 80 V the insulation accepts.
	wantFail(t, checkStatus(t, starterWith(t, "emf-waveform", map[string]string{
		"lambda": "0.30 Wb * sin(0 deg .. 360 deg by 1 deg)"})),
		"E_pk <= E_pk_max")
	// 6° steps lose 8.6 % of the 7th harmonic.
	wantFail(t, checkStatus(t, starterWith(t, "emf-waveform", map[string]string{
		"theta":  "0 deg .. 360 deg by 6 deg",
		"lambda": "0.20 Wb * sin(0 deg .. 360 deg by 6 deg)"})),
		"eps_7 <= eps_max")
}

// Rule 4 and issue 13: the template carries the cautions, defers to local
// codes, the standards and licensed practice, and states its sign
// convention.
func TestLibraryEMFWaveformCautions(t *testing.T) {
	templateCautions(t, "emf-waveform")
	data, _ := sheets.LibrarySource("emf-waveform")
	for _, want := range []string{"Sign convention", "e = −dλ/dt", "u = +ω·dλ/dθ"} {
		if !strings.Contains(string(data), want) {
			t.Errorf("lib/emf-waveform does not state its sign convention: no %q", want)
		}
	}
}

// templateCautions checks that a template says what rule 4 asks and states
// its limits.
func templateCautions(t *testing.T, name string) {
	t.Helper()
	data, ok := sheets.LibrarySource(name)
	if !ok {
		t.Fatalf("no template %s", name)
	}
	for _, want := range []string{"Safety", "local codes", "applicable standards", "licensed practice", "from memory", "Limits of validity"} {
		if !strings.Contains(string(data), want) {
			t.Errorf("lib/%s does not say %q", name, want)
		}
	}
}
