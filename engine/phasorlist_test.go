package engine_test

import (
	"math"
	"math/cmplx"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// phasorListsOf compiles and runs a sheet and returns each named
// statement's value as complex numbers: a list of phasors element by
// element, a list of real values as real parts, a single value as one.
func phasorListsOf(t *testing.T, lines []string) map[string][]complex128 {
	t.Helper()
	calc := engine.CompileWith(sheetOf("s.md", lines...), engine.Options{})
	calc.Evaluate()
	for _, d := range calc.Diags {
		t.Fatalf("%v", d.Error())
	}
	out := map[string][]complex128{}
	for _, st := range calc.Statements {
		r := calc.Result(st)
		if r.Status != engine.OK {
			t.Fatalf("%s: %v", st.Name, r.Status)
		}
		switch {
		case r.Phasors != nil:
			for i, p := range r.Phasors {
				z := complex(p.Re, p.Im)
				out[st.Name] = append(out[st.Name], z)
				if math.Abs(r.List[i]-cmplx.Abs(z)) > 1e-12*r.List[i] {
					t.Errorf("%s[%d]: the list holds %g, not the magnitude of %v", st.Name, i+1, r.List[i], z)
				}
			}
		case r.List != nil:
			for _, x := range r.List {
				out[st.Name] = append(out[st.Name], complex(x, 0))
			}
		case r.Phasor != nil:
			out[st.Name] = []complex128{complex(r.Phasor.Re, r.Phasor.Im)}
		default:
			out[st.Name] = []complex128{complex(r.Value, 0)}
		}
	}
	return out
}

// Lists of phasors against Go's math/cmplx, in SI, to 1e-12: literals in
// both forms and with real elements, element-wise arithmetic with
// phasors, real values and lists of either on both sides, abs, arg, Re,
// Im and conj of each element, sum, mean, count and an index (fixed, and
// a result).
func TestPhasorListsAgainstCmplx(t *testing.T) {
	deg := math.Pi / 180
	z := []complex128{3 + 4i, cmplx.Rect(230, -30*deg), -20 + 1500i, 2}
	r := []float64{1, 2, 4, 8}
	each := func(f func(int, complex128) complex128) []complex128 {
		out := make([]complex128, len(z))
		for i, x := range z {
			out[i] = f(i, x)
		}
		return out
	}
	realOf := func(f func(complex128) float64) []complex128 {
		return each(func(_ int, x complex128) complex128 { return complex(f(x), 0) })
	}
	var sum complex128
	for _, x := range z {
		sum += x
	}
	Z := complex(0.12, 1.7)
	lines := []string{
		"z = [3 V + 4j V, 230 V ∠ -30 deg, 1.5e3j V - 20 V, 2 V] ; one of each form, and a real element",
		"r = [1, 2, 4, 8]",
		"Z = 0.12 Ω + 1.7j Ω",
		"k = 3",
		"a = z + z", "b = z - 1 V", "c = 2 * z", "d = z / Z", "e = Z * z / r", "f = -z", "g = r * 1 V - z",
		"h = z * (1 ∠ 120 deg)", "m = abs(z)", "p [rad] = arg(z)", "re = Re(z)", "im = Im(z)", "w = conj(z)",
		"s = sum(z)", "u = mean(z)", "n = count(z)", "x = z[2]", "y = z[k]", "q = abs(sum(z * conj(z)))",
		"ang [deg] = [0 deg, -120 deg, 120 deg]", "t = 6.35 kV ∠ ang", "o = [1 V, 2 V] ∠ [10 deg, 20 deg]", "l = [1 V, 2 V] ∠ 0.5",
	}
	want := map[string][]complex128{
		"a": each(func(_ int, x complex128) complex128 { return x + x }),
		"b": each(func(_ int, x complex128) complex128 { return x - 1 }),
		"c": each(func(_ int, x complex128) complex128 { return 2 * x }),
		"d": each(func(_ int, x complex128) complex128 { return x / Z }),
		"e": each(func(i int, x complex128) complex128 { return Z * x / complex(r[i], 0) }),
		"f": each(func(_ int, x complex128) complex128 { return -x }),
		"g": each(func(i int, x complex128) complex128 { return complex(r[i], 0) - x }),
		"h": each(func(_ int, x complex128) complex128 { return x * cmplx.Rect(1, 120*deg) }),
		"m": realOf(cmplx.Abs), "p": realOf(cmplx.Phase),
		"re": realOf(func(x complex128) float64 { return real(x) }),
		"im": realOf(func(x complex128) float64 { return imag(x) }),
		"w":  each(func(_ int, x complex128) complex128 { return cmplx.Conj(x) }),
		"s":  {sum}, "u": {sum / 4}, "n": {4}, "x": {z[1]}, "y": {z[2]},
		"t": {cmplx.Rect(6350, 0), cmplx.Rect(6350, -120*deg), cmplx.Rect(6350, 120*deg)},
		"o": {cmplx.Rect(1, 10*deg), cmplx.Rect(2, 20*deg)}, "l": {cmplx.Rect(1, 0.5), cmplx.Rect(2, 0.5)},
		"q": {func() complex128 {
			var s float64
			for _, x := range z {
				s += real(x * cmplx.Conj(x))
			}
			return complex(s, 0)
		}()},
	}
	got := phasorListsOf(t, lines)
	for k, w := range want {
		g := got[k]
		if len(g) != len(w) {
			t.Errorf("%s = %v, want %v", k, g, w)
			continue
		}
		for i := range w {
			if !cnear(g[i], w[i], 1e-12) {
				t.Errorf("%s[%d] = %v, want %v", k, i+1, g[i], w[i])
			}
		}
	}
}

// Three-phase sets. The phase voltages of a balanced set sum to zero
// (common practice: three equal phasors 120° apart close a triangle).
// With the c phase 5 % low, the negative-sequence component by the
// symmetrical-components transform, V_2 = (V_a + a²·V_b + a·V_c)/3 with
// a = 1∠120° (Fortescue's transform, as in Grainger & Stevenson, Power
// System Analysis, 1994, ch. 11, from memory), matches the same sum in
// math/cmplx, and so do the zero and positive sequences. The voltages
// are the invented Tarnwick Weir generator's 6.35 kV phase voltage.
func TestThreePhasePhasorLists(t *testing.T) {
	deg := math.Pi / 180
	lines := []string{
		"V_ph = 6.35 kV ; phase voltage of the 11 kV star winding ; source: TW-G1 ratings (invented)",
		"a = 1 ∠ 120 deg ; the operator of the symmetrical-components transform",
		"U = [V_ph ∠ 0 deg, V_ph ∠ -120 deg, V_ph ∠ 120 deg] ; a balanced set, phases a, b, c",
		"S_bal = sum(U) ; zero for a balanced set",
		"u = 5 % ; unbalance of phase c",
		"W = [V_ph ∠ 0 deg, V_ph ∠ -120 deg, (1 - u) * V_ph ∠ 120 deg] ; phase c 5 % low",
		"V_0 = sum(W) / 3 ; zero sequence",
		"V_1 = sum(W * [1, a, a * a]) / 3 ; positive sequence",
		"V_2 = sum(W * [1, a * a, a]) / 3 ; negative sequence",
		"check abs(S_bal) <= 1e-9 * V_ph ; closes within rounding",
		"check abs(V_2) <= 2 % * V_ph ; within the unbalance a machine carries without derating",
	}
	calc := engine.CompileWith(sheetOf("s.md", lines...), engine.Options{})
	calc.Evaluate()
	if len(calc.Diags) != 0 {
		t.Fatal(calc.Diags)
	}
	phasor := func(name string) complex128 {
		r := calc.Result(calc.Lookup(name))
		if r.Status != engine.OK || r.Phasor == nil {
			t.Fatalf("%s: %v %v", name, r.Status, r.Err)
		}
		return complex(r.Phasor.Re, r.Phasor.Im)
	}
	if s := phasor("S_bal"); cmplx.Abs(s) > 1e-9 {
		t.Errorf("a balanced set sums to %v V, not 0 within 1e-9 V", s)
	}
	v := 6350.0
	a := cmplx.Rect(1, 120*deg)
	va, vb, vc := complex(v, 0), cmplx.Rect(v, -120*deg), cmplx.Rect(0.95*v, 120*deg)
	for name, w := range map[string]complex128{
		"V_0": (va + vb + vc) / 3, "V_1": (va + a*vb + a*a*vc) / 3, "V_2": (va + a*a*vb + a*vc) / 3,
	} {
		if g := phasor(name); !cnear(g, w, 1e-12) {
			t.Errorf("%s = %v, want %v", name, g, w)
		}
	}
	// By hand: only phase c is short, by 0.05·V at 120°; each sequence
	// carries a third of that shortfall: |V_0| = |V_2| = 0.05/3·6350 V = 105.8 V.
	if m := cmplx.Abs(phasor("V_2")); math.Abs(m-0.05/3*v) > 1e-9*v {
		t.Errorf("|V_2| = %g V, want %g V", m, 0.05/3*v)
	}
	for _, name := range []string{"check abs(S_bal) <= 1e-9 * V_ph", "check abs(V_2) <= 2 % * V_ph"} {
		for _, st := range calc.Statements {
			if st.Kind == engine.Check && "check "+st.Formula == name && calc.Result(st).Status != engine.Pass {
				t.Errorf("%s: %v", name, calc.Result(st).Status)
			}
		}
	}
}

// What a list of phasors cannot do is a located error, in the style of
// TestChecker, and leaves the rest of the sheet.
func TestPhasorListErrors(t *testing.T) {
	for _, c := range []checkerCase{
		{"no order, no powers, one dimension, no series, and a bad element found",
			[]string{"U = [230 V ∠ 0 deg, 230 V ∠ -120 deg]", "a = max(U)", "b = min(U)", "c = U^2", "check U <= 1 V",
				"d = [1 V + 1j V, 2 A]", "e = rms(U)", "f = U / [1, 0]", "g = U[3]", "h = sqrt(U)",
				"s = series(U, [0 s, 1 s])", "m = max(abs(U))", "n = product(U)", "x = [1, 2] * 1 s", "y = series(Re(U), x)",
				"k = 2", "i = U[k + 1]", "j = U + [1 V, 2 V, 3 V]", "o = [1 V, 2 V] ∠ [1 rad, 2 rad, 3 rad]",
				"p = [1 V, 2 V] ∠ [1 m, 2 m]", "q = 1 V ∠ (2 * [1 Hz, 2 Hz] * 1 s)"},
			map[string]string{
				"U":              "ok [230.0, 230.0] V",
				"a":              "error 3:9 max needs an order, and phasors have none",
				"b":              "error 4:9 min needs an order, and phasors have none",
				"c":              "error 5:6 sheaf does not raise phasors to powers",
				"check U <= 1 V": "error 6:9 phasors have no order…",
				"d":              "error 7:18 element 2 is current (A), but the list's first element is voltage (V)",
				"e":              "error 8:9 rms of a list of phasors is not supported; sum, mean and count are",
				"f":              "error 9:7 division by zero in element 2",
				"g":              "error 10:7 index 3 is out of range: the list has 2 elements",
				"h":              "error 11:10 sqrt takes real values, but this is a phasor",
				"s":              "error 12:12 series takes…",
				"m":              "ok 230.0 V",
				"n":              "error 14:13 product of a list of phasors is not supported; sum, mean and count are",
				"y":              "error 16:5 a series of 2 samples is too short…",
				"i":              "error 18:9 index 3 is out of range: the list has 2 elements",
				"j":              "error 19:7 cannot add lists of different lengths: 2 and 3 elements",
				"o":              "error 20:16 cannot pair 2 magnitudes with 3 angles",
				"p":              "error 21:18 the angle of a phasor is length (m), not an angle",
				"q":              "error 22:29 the angle of a phasor counts cycles, not radians: a factor 2π is missing",
			}},
	} {
		c.run(t, engine.Options{})
	}
}
