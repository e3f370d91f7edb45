package engine_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// The distribution, pitch and winding factors of the 1st, 5th and 7th
// harmonics of a 36-slot, 4-pole, 3-phase winding with a 7/9 pitch,
// written once as functions of the sheet and called for each harmonic,
// and once over a list of the three orders.
//
// Reference: k_d = sin(ν·q·α/2) / (q·sin(ν·α/2)) and k_p = sin(ν·y·π/2),
// the closed forms of every machines text (for instance M. G. Say, The
// Performance and Design of Alternating Current Machines, chapter on
// windings; from memory). With q = 3 and α = 20° electrical they give
// k_d1 = sin 30°/(3 sin 10°) = 0.9598, k_p1 = sin 70° = 0.9397, k_w1 = 0.9019;
// k_d5 = sin 150°/(3 sin 50°) = 0.2176, k_p5 = sin 350° = -0.1736, k_w5 = -0.03778;
// k_d7 = sin 210°/(3 sin 70°) = -0.1774, k_p7 = sin 490° = 0.7660, k_w7 = -0.1359
// (worked by hand, and from memory of the textbook tables of a 7/9 chorded
// winding: k_p1 0.940, k_d1 0.960).
func TestSheetFunctionsWindingFactors(t *testing.T) {
	lines := []string{"Q = 36", "p = 4", "m = 3", "q = Q / (p * m)", "alpha = 2 * pi * p / 2 / Q", "y = 7 / 9",
		"k_d(nu) = sin(nu * q * alpha / 2) / (q * sin(nu * alpha / 2)) ; distribution factor",
		"k_p(nu) = sin(nu * y * pi / 2) ; pitch factor",
		"k_w(nu) = k_d(nu) * k_p(nu) ; winding factor",
		"nus = [1, 5, 7]", "k_ws = k_w(nus)"}
	want := map[int][3]float64{1: {0.9598, 0.9397, 0.9019}, 5: {0.2176, -0.1736, -0.03778}, 7: {-0.1774, 0.7660, -0.1359}}
	for _, nu := range []int{1, 5, 7} {
		lines = append(lines, fmt.Sprintf("d_%d = k_d(%d)", nu, nu), fmt.Sprintf("p_%d = k_p(%d)", nu, nu), fmt.Sprintf("w_%d = k_w(%d)", nu, nu))
	}
	calc := engine.Compile(sheetOf("w.md", lines...))
	calc.Evaluate()
	if len(calc.Diags) != 0 {
		t.Fatal(calc.Diags[0].Error())
	}
	near := func(name string, got, want float64) {
		if math.Abs(got-want) > 5e-4*math.Abs(want) {
			t.Errorf("%s = %.5g, want %.4g", name, got, want)
		}
	}
	ws := calc.Result(calc.Lookup("k_ws")).List
	for i, nu := range []int{1, 5, 7} {
		val := func(n string) float64 { return calc.Result(calc.Lookup(fmt.Sprintf("%s_%d", n, nu))).Value }
		near(fmt.Sprintf("k_d%d", nu), val("d"), want[nu][0])
		near(fmt.Sprintf("k_p%d", nu), val("p"), want[nu][1])
		near(fmt.Sprintf("k_w%d", nu), val("w"), want[nu][2])
		if len(ws) != 3 || ws[i] != val("w") {
			t.Errorf("k_w over the list gives %v; the call for %d gives %g", ws, nu, val("w"))
		}
	}
}

// Calls are checked with their own arguments, and bad definitions and
// calls are located errors.
func TestSheetFunctions(t *testing.T) {
	for _, c := range []checkerCase{
		{"each call is checked with its arguments: one function for several dimensions",
			// 2·3 m = 6 m; 2·4 V = 8 V; 2·[1, 2] s = [2, 4] s; (3 + 4)/2 = 3.5 A.
			[]string{"twice(x) = 2 * x", "a = twice(3 m)", "b = twice(4 V)", "c = twice([1 s, 2 s])", "mid(x, y) = (x + y) / 2", "d = mid(3 A, 4 A)",
				"e = twice(twice(1 m)) + mid(1 m, 3 m)", "g(x) = x * k", "k = 3", "h = g(2)"},
			map[string]string{"a": "ok 6.000 m", "b": "ok 8.000 V", "c": "ok [2.000, 4.000] s", "d": "ok 3.500 A", "e": "ok 6.000 m", "h": "ok 6 1"}},
		{"bad definitions and calls",
			[]string{"f(x) = sin(x)", "a = f(2 m)", "b = f(1, 2)", "r(x) = r(x) + 1", "c = r(1)", "d = frob(1)", "e = f", "g(x, x) = x",
				"m(x) = x + n(x)", "n(x) = m(x) * 2", "u(x) = x + zz", "v(x) = x / 0", "w = v(1)", "mid(x, y) = (x + y) / 2", "z = mid(1 m, 2 s)", "s = 1"},
			map[string]string{
				"a": "error 3:7 in f (defined at 2:1): sin needs a pure number, but its argument is length (m)",
				"b": "error 4:5 f takes 1 argument",
				"r": "error 5:8 function r calls itself: r → r",
				"c": "error 6:5 function r has an error (at 5:8)",
				"d": "error 7:5 unknown function frob…",
				"e": "error 8:5 f is a function of the sheet, not a value",
				"g": "error 9:6 parameter x is named twice",
				"m": "error 10:12 function m calls itself: m → n → m",
				"u": "error 12:12 unknown name zz…",
				"w": "error 14:5 in v (defined at 13:1), at column 10: division by zero",
				"z": "error 16:5 in mid (defined at 15:1), at column 16: cannot add length (m) and time (s)",
				"s": "ok 1 1"}},
	} {
		c.run(t, engine.Options{})
	}
}

// A template's functions are the instance's: inst.k_p(5).
func TestSheetFunctionsFromATemplate(t *testing.T) {
	lib := sheetOf("t/pitch.md", "param y [1] ; coil pitch over pole pitch", "k_p(nu) = sin(nu * y * pi / 2) ; pitch factor", "k_p1 = k_p(1)")
	resolve := func(ref, from string) (engine.SheetSource, string, error) { return lib, "t/pitch.md", nil }
	// sin(7/9·90°) = 0.9397; sin(5·70°) = -0.1736; sin(5/6·90°)·... = sin(75°) = 0.9659.
	checkerCase{"a template exports its functions", []string{"use w = t/pitch with y = 7 / 9", "use v = t/pitch with y = 5 / 6",
		"k_5 = w.k_p(5)", "k_v = v.k_p(1)"},
		map[string]string{"w.k_p1": "ok 0.9397 1", "k_5": "ok -0.1736 1", "k_v": "ok 0.9659 1"}}.run(t, engine.Options{Resolve: resolve})
}

// Functions that call each other several times cannot multiply a formula
// without bound: a statement's calls, and a sheet's, have a limit.
func TestSheetFunctionsAreBounded(t *testing.T) {
	lines := []string{"f_0(x) = x + x"}
	for i := 1; i <= 20; i++ {
		lines = append(lines, fmt.Sprintf("f_%d(x) = f_%d(x) + f_%d(x)", i, i-1, i-1))
	}
	lines = append(lines, "y = f_20(1)", "z = f_3(1)")
	calc := engine.Compile(sheetOf("b.md", lines...))
	calc.Evaluate()
	// f_3 is 2^4 ones: 16.
	if got := outcome(calc, calc.Lookup("z")); got != "ok 16 1" {
		t.Errorf("z is %q", got)
	}
	// f_k is 2^(k+1) terms: one function is the first past 20,000
	// operations, and those that call it have an error.
	first := -1
	for k := 1; k <= 20; k++ {
		got := outcome(calc, calc.Lookup(fmt.Sprintf("f_%d", k)))
		switch {
		case first < 0 && strings.Contains(got, "expand to more than 20000 operations"):
			first = k
		case first >= 0 && !strings.Contains(got, fmt.Sprintf("function f_%d has an error", k-1)):
			t.Errorf("f_%d is %q", k, got)
		}
	}
	if first < 10 || first > 15 {
		t.Errorf("the first function past the limit is f_%d", first)
	}
	if got := outcome(calc, calc.Lookup("y")); !strings.Contains(got, "function f_20 has an error") {
		t.Errorf("y is %q", got)
	}
	// Many statements, each within the limit, and together beyond the sheet's.
	lines = []string{"f_0(x) = x + x"}
	for i := 1; i <= 10; i++ {
		lines = append(lines, fmt.Sprintf("f_%d(x) = f_%d(x) + f_%d(x)", i, i-1, i-1))
	}
	for i := 0; i < 400; i++ {
		lines = append(lines, fmt.Sprintf("y_%d = f_10(%d)", i, i))
	}
	calc = engine.Compile(sheetOf("c.md", lines...))
	calc.Evaluate()
	// f_10 is 2^11 times its argument.
	if got := outcome(calc, calc.Lookup("y_1")); got != "ok 2048 1" {
		t.Errorf("y_1 is %q", got)
	}
	if got := outcome(calc, calc.Lookup("y_399")); !strings.Contains(got, "the limit for one sheet") {
		t.Errorf("y_399 is %q, want the sheet's limit", got)
	}
}

// Names in a function's formula are the sheet's, whoever calls it: a
// parameter of the caller does not reach into the function it calls.
func TestSheetFunctionsScopeIsTheSheet(t *testing.T) {
	// g(2) = 2 + 10 = 12 wherever it is called; f(5) = 12 · 5 = 60.
	checkerCase{"lexical names", []string{"x = 10", "g(y) = y + x", "f(x) = g(2) * x", "z = f(5)", "w = g(2)"},
		map[string]string{"z": "ok 60 1", "w": "ok 12 1"}}.run(t, engine.Options{})
}
