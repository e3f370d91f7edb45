package engine_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// Lists, statement by statement, in the style of TestChecker: each case
// is a sheet's lines and the outcome of the statements named, worked by
// hand beside it. The flux values are invented for the tests.
func TestLists(t *testing.T) {
	for _, c := range []checkerCase{
		{"flux linkage of turns that link different flux, and the effective flux",
			// λ = Σ φ_k (the definition of flux linkage for turns that link
			// different flux; common practice). By hand: 2.41 + 2.38 + 2.30 +
			// 2.17 = 9.26 mWb over N = 4 turns; λ/N = 2.315 mWb.
			[]string{"phi_k = [2.41 mWb, 2.38 mWb, 2.30 mWb, 2.17 mWb]", "N = count(phi_k)", "lambda = sum(phi_k)", "Phi_eff = lambda / N",
				"phi_u [µWb] = phi_k"},
			map[string]string{"phi_k": "ok [2.410, 2.380, 2.300, 2.170] mWb", "N": "ok 4 1", "lambda": "ok 9.260 mWb",
				"Phi_eff": "ok 2.315 mWb", "phi_u": "ok [2410, 2380, 2300, 2170] µWb"}},
		{"element-wise arithmetic with a list and a single value on either side, and two lists",
			[]string{"a = [1 m, 2 m, 4 m]", "b = [3 m, 2 m, 1 m]", "s = a + b", "d = a - 1 m", "e = 8 m - a", "p = a * b", "q = a / b",
				"r = 2 * a", "n = -a", "w = a^2", "h = sqrt(a * b)", "k = 12 m^2 / a", "u = +a"},
			// [4, 4, 5] m; [0, 1, 3] m; [7, 6, 4] m; [3, 4, 4] m²; [0.3333, 1, 4]; [2, 4, 8] m;
			// [-1, -2, -4] m; [1, 4, 16] m²; [√3, 2, 2] m; [12, 6, 3] m.
			map[string]string{"s": "ok [4.000, 4.000, 5.000] m", "d": "ok [0, 1.000, 3.000] m", "e": "ok [7.000, 6.000, 4.000] m",
				"p": "ok [3.000, 4.000, 4.000] m²", "q": "ok [0.3333, 1.000, 4.000] 1", "r": "ok [2.000, 4.000, 8.000] m",
				"n": "ok [-1.000, -2.000, -4.000] m", "w": "ok [1.000, 4.000, 16.00] m²", "h": "ok [1.732, 2.000, 2.000] m",
				"k": "ok [12.00, 6.000, 3.000] m", "u": "ok [1.000, 2.000, 4.000] m"}},
		{"reductions",
			[]string{"x = [3 V, -4 V, 12 V]", "s = sum(x)", "p = product([2, 3, 4])", "m = mean(x)", "lo = min(x)", "hi = max(x)",
				"r = rms([3 V, 4 V])", "c = count(x)", "a = product([2 m, 3 m])", "z = min(x[1], x[2])"},
			// 11 V; 24; 11/3 = 3.667 V; -4 V; 12 V; √((9 + 16)/2) = 3.536 V; 3; 6 m²; -4 V.
			map[string]string{"s": "ok 11.00 V", "p": "ok 24 1", "m": "ok 3.667 V", "lo": "ok -4.000 V", "hi": "ok 12.00 V",
				"r": "ok 3.536 V", "c": "ok 3 1", "a": "ok 6.000 m²", "z": "ok -4.000 V"}},
		{"ranges: whole numbers, quantities with a step, downwards, and a step that does not divide exactly",
			[]string{"k = 1 .. 5", "th [deg] = 0 deg .. 90 deg by 30 deg", "d = 10 .. 0 by -2.5", "f = 0 .. 1 by 0.25", "g = 0 .. 1 by 0.3",
				"y = sin(th)", "t = sum(0 .. 1 by 0.1)"},
			// sin 0°, 30°, 60°, 90° = 0, 0.5, 0.8660, 1; 0 + 0.1 + ... + 1.0 = 5.5.
			map[string]string{"k": "ok [1.000, 2.000, 3.000, 4.000, 5.000] 1", "th": "ok [0, 30.00, 60.00, 90.00] °", "d": "ok [10.00, 7.500, 5.000, 2.500, 0] 1",
				"f": "ok [0, 0.2500, 0.5000, 0.7500, 1.000] 1", "g": "ok [0, 0.3000, 0.6000, 0.9000] 1",
				"y": "ok [0, 0.5000, 0.8660, 1.000] 1", "t": "ok 5.500 1"}},
		{"indexing counts from 1, with a fixed or a computed index",
			[]string{"phi = [2.41 mWb, 2.38 mWb, 2.30 mWb]", "a = phi[1]", "b = phi[3]", "k = 2", "c = phi[k]", "d = (phi * 2)[k + 1]",
				"j = 4", "e = phi[j]", "f = phi[k / 4]"},
			map[string]string{"a": "ok 2.410 mWb", "b": "ok 2.300 mWb", "c": "ok 2.380 mWb", "d": "ok 4.600 mWb",
				"e": "error 9:9 index 4 is out of range: the list has 3 elements", "f": "error 10:11 index 0.5 is out of range: the list has 3 elements"}},
		{"bad lists are located errors, and leave the rest",
			[]string{"a = [1 m, 2 m, 3 m]", "b = [1 m, 2 m]", "c = a + b", "v = [1 V, 2 V, 3 V]", "d = a + v", "e = [1 m, 2 s]",
				"f = a[4]", "g = a[0]", "h = sum(2 m)", "i = max(2 m)", "check a <= 3 m", "n = 3", "j = 1 .. n", "l = 0 m .. 1 m",
				"m = 0 .. 1 by 0", "o = [a, 1 m]", "p = hypot(a, a)", "q = 2 ^ (a / 1 m)", "r = 1 m / (a - 2 m)", "s = n[1]", "u = 5 .. 1",
				"w = 0 .. 1 by 1e-6", "x = sum(a) + 1 m"},
			map[string]string{
				"c":              "error 4:7 cannot add lists of different lengths: 3 and 2 elements",
				"d":              "error 6:7 cannot add length (m) and voltage (V)",
				"e":              "error 7:11 element 2 is time (s), but the list's first element is length (m)",
				"f":              "error 8:7 index 4 is out of range: the list has 3 elements",
				"g":              "error 9:7 index 0 is out of range: the list has 3 elements",
				"h":              "error 10:9 sum works on the elements of a list, but this is a single value",
				"i":              "error 11:9 max of one single value is that value",
				"check a <= 3 m": "error 12:7 a comparison takes single values; its left side is a list of 3",
				"j":              "error 14:10 the ends and the step of a range must be fixed values, not results",
				"l":              "error 15:9 a range of quantities needs its step",
				"m":              "error 16:15 the step of the range is zero, or leads away from its second end",
				"o":              "error 17:6 element 1 is a list; a list's elements are single values",
				"p":              "error 18:11 hypot takes one real value for each argument; this is a list",
				"q":              "error 19:12 the exponent is a list; an exponent is one number",
				"r":              "error 20:9 division by zero in element 2",
				"s":              "error 21:5 only a list has elements; this is a single value",
				"u":              "error 22:7 the step of the range is zero, or leads away from its second end",
				"w":              "error 23:7 the range has 1000001 elements; the limit is 100000",
				"x":              "ok 7.000 m"}},
	} {
		c.run(t, engine.Options{})
	}
}

// A table's columns are lists of its rows, in the column's unit, and a
// table read at a list is read at each element.
func TestTableColumnsAreLists(t *testing.T) {
	src := sheetOf("s.md", "l = sum(T.phi)", "N = count(T.k)", "e = T.phi / T.k", "m = interp(T.phi, T.k, T.k)",
		"i = interp(T.phi, T.k, [1.5, 3])", "o = interp(T.phi, T.k, [1, 5])", "p = pick(T.phi, T.k, [4, 2])", "q = pick(T.phi, T.k, [4, 3])")
	src.Tables = append(src.Tables, fuzzTable("k [1]|phi [mWb]\n1|2.0\n2|4.5\n4|9.0"))
	calc := engine.Compile(src)
	calc.Evaluate()
	// 2.0 + 4.5 + 9.0 = 15.5 mWb; 3 rows; [2, 2.25, 2.25] mWb; the rows
	// themselves; halfway between rows 1 and 2, and between 2 and 4:
	// 3.25 and 6.75 mWb; rows 4 and 2.
	for name, want := range map[string]string{"l": "ok 15.50 mWb", "N": "ok 3 1", "e": "ok [2.000, 2.250, 2.250] mWb",
		"m": "ok [2.000, 4.500, 9.000] mWb", "i": "ok [3.250, 6.750] mWb",
		"o": "error 7:24 k = 5.000 (element 2) lies outside table T (k from 1.000 … 4.000)",
		"p": "ok [9.000, 4.500] mWb", "q": "error 9:22 no row of table T has k = 3.000 (element 2)"} {
		if got := outcome(calc, calc.Lookup(name)); got != want {
			t.Errorf("%s is %q, want %q", name, got, want)
		}
	}
}

// A sum over equal flux in every turn is N·Φ, the flux linkage of a coil
// whose turns all link one flux; the scalar formula checks the list.
func TestListSumMatchesScalarFluxLinkage(t *testing.T) {
	calc := engine.Compile(sheetOf("s.md", "Phi = 3.7 mWb", "N = 12", "lam_1 = N * Phi", "phi_k = Phi + 0 mWb * (1 .. 12)", "lam_2 = sum(phi_k)"))
	calc.Evaluate()
	l1, l2 := calc.Result(calc.Lookup("lam_1")).Value, calc.Result(calc.Lookup("lam_2")).Value
	if l1 == 0 || math.Abs(l2-l1) > 1e-12*l1 {
		t.Errorf("sum over 12 equal turns is %g Wb, N·Φ is %g Wb", l2, l1)
	}
}

// Frames of one program hold their lists apart, and a run writes them in
// place: running a frame again allocates nothing.
func TestListFramesAreSeparate(t *testing.T) {
	calc := engine.Compile(sheetOf("s.md", "a = 2", "x = a * (1 .. 1000)", "s = sum(x)"))
	p := calc.Program()
	f1, f2 := p.NewFrame(), p.NewFrame()
	slot, _ := p.Input("a")
	p.Run(f1, nil)
	p.Run(f2, []engine.Set{{Slot: slot, SI: 3}})
	sum := func(f *engine.Frame) float64 { return p.Results(f)[calc.Lookup("s").Index].Value }
	// 2 × 500500 and 3 × 500500.
	if sum(f1) != 1001000 || sum(f2) != 1501500 {
		t.Errorf("sums %g and %g, want 1001000 and 1501500", sum(f1), sum(f2))
	}
	if n := testing.AllocsPerRun(20, func() { p.Run(f1, []engine.Set{{Slot: slot, SI: 4}}) }); n != 0 {
		t.Errorf("a run of a list sheet allocates %v times", n)
	}
}

// A list of literals in one unit is an input, written as its author wrote
// it, so that the inputs register and the audit ask for its source; a
// run cannot set it, since its length is fixed.
func TestListOfLiteralsIsAnInput(t *testing.T) {
	calc := engine.Compile(sheetOf("s.md", "phi_k = [2.41 mWb, 2.38 mWb, -2.30 mWb]", "l = [1 mm, 2 m]", "m = [1 mm, 2 mm * 2]", "s = sum(phi_k)"))
	calc.Evaluate()
	if v, ok := engine.LiteralString(calc.Lookup("phi_k").Expr); !ok || v != "[2.41, 2.38, -2.30] mWb" || !calc.Lookup("phi_k").IsInput() {
		t.Errorf("phi_k reads %q (%v) and is an input: %v", v, ok, calc.Lookup("phi_k").IsInput())
	}
	for _, name := range []string{"l", "m"} {
		if calc.Lookup(name).IsInput() {
			t.Errorf("%s is an input; its elements are not literals in one unit", name)
		}
	}
	if _, ok := calc.Program().Input("phi_k"); ok {
		t.Error("a run could set the list phi_k as one value")
	}
}

// The rms and the mean of a sine sampled evenly over one period, against
// the closed forms (peak/√2 and 0: for N ≥ 3 even samples over a period,
// the mean of sin² is exactly 1/2 and the mean of sin is 0), and a list
// in a template's input and in a solve's relation.
func TestListsAgainstClosedFormsAndInReuse(t *testing.T) {
	calc := engine.Compile(sheetOf("s.md", "theta = 0 deg .. 345 deg by 15 deg", "U = 325 V", "u = U * sin(theta)",
		"U_rms = rms(u)", "U_av = mean(u)", "k = 1 .. 4", "x = solve(sum(k * x) == 20 A, 0 A, 10 A)"))
	calc.Evaluate()
	val := func(n string) float64 { return calc.Result(calc.Lookup(n)).Value }
	if got, want := val("U_rms"), 325/math.Sqrt2; math.Abs(got-want) > 1e-12*want {
		t.Errorf("rms of 24 samples of 325 V·sin is %.15g V, want 325/√2 = %.15g V", got, want)
	}
	if got := val("U_av"); math.Abs(got) > 1e-12 {
		t.Errorf("mean over one period is %g V, want 0", got)
	}
	// Σ k·x = 10·x = 20 A, so x = 2 A.
	if got := val("x"); math.Abs(got-2) > 1e-9 {
		t.Errorf("solve over a list gives %g A, want 2 A", got)
	}
}

// A template's input may be set to a list, written over several lines,
// and a take of a list is refused with the way round it.
func TestListsInTemplatesAndTakes(t *testing.T) {
	turns := sheetOf("t/turns.md", "param phi [mWb] ; flux per turn group", "lambda = sum(phi) ; flux linkage")
	resolve := func(ref, from string) (engine.SheetSource, string, error) {
		return turns, "t/turns.md", nil
	}
	field := engine.Compile(sheetOf("field.md", "phi_k = [1 mWb, 2 mWb] ; flux per turn group", "lam = sum(phi_k) ; linkage"))
	field.Evaluate()
	take := func(ref, from string) (*engine.Calc, string, error) { return field, "field.md", nil }
	checkerCase{"lists in templates and takes",
		// 1.5 + 2.5 + 3.0 = 7.0 mWb; 3 mWb taken.
		[]string{"use c = t/turns with phi = [1.5 mWb, 2.5 mWb,", "    3.0 mWb]", "take p = phi_k from field", "take lam from field"},
		map[string]string{"c.lambda": "ok 7.000 mWb", "p": "error 4:1 phi_k in field.md is a list; take reads single values", "lam": "ok 3.000 mWb"}}.run(t, engine.Options{Resolve: resolve, Take: take})
}

// A range of absolute temperatures runs between two temperatures by a
// difference in K; its elements are temperatures, shown in the ends' unit.
func TestRangeOfTemperatures(t *testing.T) {
	calc := compileLines("T = 20 degC .. 60 degC by 10 K", "T_h = T + 80 K", "bad = 20 degC .. 60 K by 10 K", "bad2 = 20 degC .. 60 degC by 10 degC")
	r := calc.Result(calc.Lookup("T_h"))
	if r.Status != engine.OK || len(r.List) != 5 || math.Abs(r.List[4]-(333.15+80)) > 1e-9 || r.Shown.Symbol != "°C" {
		t.Errorf("T_h = %+v, want five temperatures up to 140 °C, shown in °C", r)
	}
	for name, want := range map[string]string{"bad": "needs a temperature at each end", "bad2": "must be a difference in K"} {
		if r := calc.Result(calc.Lookup(name)); r.Status != engine.Errored || !strings.Contains(r.Err.Message, want) {
			t.Errorf("%s: %+v, want an error saying %q", name, r.Err, want)
		}
	}
}
