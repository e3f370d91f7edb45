package engine_test

import (
	"math"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/sheaf-calc/sheaf/engine"
)

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// FuzzStatement compiles a one-block sheet from the fuzz string, one line
// per line, and evaluates it. Whatever the input, every diagnostic points
// at a place inside the block, every statement ends with an outcome, and
// every result is a finite number shown in a unit of its own dimension.
func FuzzStatement(f *testing.F) {
	for _, seed := range []string{
		"l_g = 2.5 mm ; air gap ; source: drawing 7 rev B\nA_g = 0.01 m^2\nR_g [kA/Wb] = l_g / (mu_0 * A_g)",
		"n = 1500 rpm\nomega [rad/s] = 2*pi*n\ncheck omega <= 200 rad/s",
		"T_a = 40 degC\nT_h = T_a + 80 K\ncheck T_h <= 155 degC",
		"x = (1 +\n  2)\ny = x^2",
		"check [kV] 2 kV <= 3 kV",
		"a = 1 V + 2 A",
		"b = 1e200 m * 1e200 m\nc = b / 0",
		"c_1 = c_2\nc_2 = c_1",
		"d = 1.2.3\ne = 2x\nf = 1e",
		"g = (((1)\nh = 1))",
		"check 1 < 2 < 3\ncheck 1 < 2 and 2 < 3",
		"in = 2\nsqrt = 3\n_x = 1\nmu_0 = 1",
		"s = \"text\"\np = 5 %\nq = x %",
		"u = 2 \xff m",
		"θ = 30 °\nk = sin(θ) * 2 µm",
		"y [nm] = 1e306 m\ncheck 1e306 m <= 1 nm\nz = y",
		"x = 1 m^99\ny = x*x\nw = 5 V * _q0",
		"phi = [2.41 mWb, 2.38 mWb, 2.30 mWb]\nlambda = sum(phi)\nPhi_e = lambda / count(phi)\nb = phi[2] + phi[4]",
		"k = 1 .. 12\nth = 0 deg .. 90 deg by 15 deg\ny = sin(th) * k[1 .. 7]\nc = [1 m, 2 s] + (1 .. 3)",
		"a = [1, 2] + [1, 2, 3]\nm = max(a)\nr = rms(1 / (k - 3))\nk = 1 .. 5\ncheck a <= 3",
		"B = 1.62 T\nk = 1 when B <= 1.5 T else 1.5 T / B\ny = 1 / B when B > 2 T else 0 / T\nz = (1 when k < 1 else 2 s) * 2",
		"k_p(nu) = sin(nu * y * pi / 2)\ny = 7 / 9\nw = k_p([1, 5, 7])\nf(x) = f(x)\ng(a, a) = a\nh = k_p(1 m) + k_p(1, 2) + nope(3)\nm(x) = n(x)\nn(x) = m(x) * x",
		"V = 6.35 kV ∠ 0 deg\nI = 525 A /_ -31.8 deg\nE = V + I * (0.04 Ω + 11.5j Ω)\nd [deg] = arg(E)\ncheck abs(E) <= 12 kV",
		"z = 3 A + 4j A\nw = conj(z) / z\ncheck z <= 1 A\nq = z + 1 V\nr = Re(2)\ns = sqrt(z)\nu = z / (0 A + 0j A)\nl = [z, 1j]",
		"p = 5 V ∠ 3 m\nc = 1j ∠ 2\nk(x) = x * 2\nm = k(1j)\ny = 1j when 1 < 2 else 2j\nt = 4jx + 4 j",
		"th = 0 deg .. 360 deg by 30 deg\ns = series(sin(th) * 1 Wb, th)\ne = -314 rad/s * deriv(s)\nE = rms(e)\nA = harmonic(e, 5)\nd = thd(e)\nv = valueat(s, 400 deg)",
		"x = [0 s, 1 s, 1 s, 2 s]\ns = series([1 V, 2 V, 3 V, 4 V], x)\ni = integral(s)\np = peak(s) + s\nq = harmonicphase(s, 0)\nr = s + s\nc = 1 when 1 < 2 else s",
		"U = 24 V ± 5 %\nR = 3 ohm in 2.9 ohm .. 3.2 ohm triangular\nI = U / R\ncase low: U = 20 V\ncase hi-1: U = 28 V, R = 2.9 ohm\nsweep s: U over 18 V .. 30 V by 1 V in low show I\nsample 500 times, seed 4",
		"x = 2 * y ± 1\ny = 1 ± σ -2\ncase c: y = 1 m\ncase c: y = 2\nsweep c: y over [1, 2]\nsweep d: x over 1 .. 1\nsample 9999999 times\nsample 1 times, seed x\nz = 3 ± 2 normal extra\nw = 1 in 2 .. 0",
		"V = 6.35 kV\nU = V ∠ [0 deg, -120 deg, 120 deg]\nS = sum(U)\nm = max(U)\nz = [1 V + 2j V, 3 V] / [1, 0]\nw = abs(U) * arg(U)\nk = U[4]\nc = U ∠ 1\nq = [1 V, 2 V] ∠ [1, 2, 3]\nr = series(Re(U), [1 s, 2 s, 3 s])",
		"param V [kV] optional ; a template's\nparam W [V] optional x\nx = 2 * V\ncheck x <= 1 kV",
	} {
		f.Add(seed)
	}
	f.Fuzz(func(t *testing.T, src string) {
		lines := strings.Split(src, "\n")
		s := compileLines(lines...)
		// The fence is line 1 and the block's lines are 2 to len(lines)+1.
		for _, d := range s.Diags {
			if d.Pos.Line < 1 || d.Pos.Col < 1 || d.Pos.Line > len(lines)+1 {
				t.Fatalf("diagnostic outside the input (%d lines): %s", len(lines), d.Error())
			}
			if d.Pos.Line == 1 {
				if d.Pos.Col != 1 {
					t.Fatalf("diagnostic on the fence at column %d: %s", d.Pos.Col, d.Error())
				}
				continue
			}
			// One past the last character is where a missing token goes.
			if n := utf8.RuneCountInString(lines[d.Pos.Line-2]); d.Pos.Col > n+1 {
				t.Fatalf("diagnostic at column %d of a %d-character line: %s", d.Pos.Col, n, d.Error())
			}
		}
		for _, st := range s.Statements {
			r := s.Result(st)
			switch r.Status {
			case engine.OK:
				if st.IsCondition() {
					continue // a condition has no value of its own
				}
				if !finite(r.Value) || !finite(r.Shown.FromSI(r.Value)) {
					t.Fatalf("%q: ok with value %v, shown as %v %s", st.Text, r.Value, r.Shown.FromSI(r.Value), r.Shown.Symbol)
				}
				if r.Shown.Dim != st.Type.Dim {
					t.Fatalf("%q: a %v shown in %s", st.Text, st.Type.Dim, r.Shown.Symbol)
				}
			case engine.Pass, engine.Fail:
				if !finite(r.Left) || !finite(r.Right) || !finite(r.Shown.FromSI(r.Left)) || !finite(r.Shown.FromSI(r.Right)) {
					t.Fatalf("%q: %v with sides %v, %v", st.Text, r.Status, r.Left, r.Right)
				}
				if r.Shown.Dim != st.Type.Dim {
					t.Fatalf("%q: a %v compared in %s", st.Text, st.Type.Dim, r.Shown.Symbol)
				}
			case engine.Errored, engine.Blocked:
				if r.Err == nil {
					t.Fatalf("%q: %v without a reason", st.Text, r.Status)
				}
			case engine.Pending:
				if st.Kind != engine.FunctionDef {
					t.Fatalf("%q: status %v after Evaluate", st.Text, r.Status)
				}
			default:
				t.Fatalf("%q: status %v after Evaluate", st.Text, r.Status)
			}
		}
	})
}
