package engine_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/units"
)

// outcome writes what a statement came to, the way the table below
// expects it: "ok <value> <unit>" to four figures, "pass 97.00 %",
// "fail", "blocked", or "error <line>:<col> <message>".
func outcome(calc *engine.Calc, st *engine.Statement) string {
	r := calc.Result(st)
	switch r.Status {
	case engine.OK:
		if st.Kind == engine.Use {
			return "ok"
		}
		if r.List != nil {
			// A list: "ok [1.000, 2.000] mWb".
			var els []string
			for _, x := range r.List {
				els = append(els, units.FormatNumber(r.Shown.FromSI(x), 4))
			}
			return fmt.Sprintf("ok [%s] %s", strings.Join(els, ", "), r.Shown.Symbol)
		}
		return fmt.Sprintf("ok %s %s", units.FormatNumber(r.Shown.FromSI(r.Value), r.Digits(4)), r.Shown.Symbol)
	case engine.Pass, engine.Fail:
		s := r.Status.String()
		if u := r.Utilisation; u == u { // not NaN
			s += " " + units.FormatNumber(u*100, 4) + " %"
		}
		return s
	case engine.Errored:
		return fmt.Sprintf("error %d:%d %s", r.Err.Pos.Line, r.Err.Pos.Col, r.Err.Message)
	}
	return r.Status.String()
}

// sheetOf makes a one-block sheet of lines, the first on line 2.
func sheetOf(path string, lines ...string) engine.SheetSource {
	b := engine.SourceBlock{Fence: diag.Pos{File: path, Line: 1, Col: 1}}
	for i, l := range lines {
		b.Lines = append(b.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: path, Line: i + 2, Col: 1}})
	}
	return engine.SheetSource{Path: path, Blocks: []engine.SourceBlock{b}}
}

// checkerCase is lines in; for each statement named (a definition's name,
// or a check's formula), the outcome out. An outcome ending in "…" need
// only start with the text before it.
type checkerCase struct {
	name  string
	lines []string
	want  map[string]string
}

// A check from a template instance is named "<instance>: check <formula>".

func (c checkerCase) run(t *testing.T, opt engine.Options) {
	t.Helper()
	calc := engine.CompileWith(sheetOf("s.md", c.lines...), opt)
	calc.Evaluate()
	got := map[string]string{}
	for _, st := range calc.Statements {
		key := st.Name
		if st.Kind == engine.Check {
			key = "check " + st.Formula
			if st.Instance != "" {
				key = st.Instance + ": " + key
			}
		}
		got[key] = outcome(calc, st)
	}
	for key, want := range c.want {
		g, ok := got[key]
		switch {
		case !ok:
			t.Errorf("%s: no statement %q among %v", c.name, key, got)
		case strings.HasSuffix(want, "…") && strings.HasPrefix(g, strings.TrimSuffix(want, "…")):
		case g != want:
			t.Errorf("%s: %s is %q, want %q", c.name, key, g, want)
		}
	}
}

// The engine's checker, statement by statement: each case is a sheet's
// lines, and the status, value (in the unit it is shown in) or error of
// the statements named. Values are worked by hand beside each case.
func TestChecker(t *testing.T) {
	for _, c := range []checkerCase{
		{"each operator with a slot, a constant and a formula on either side",
			[]string{"a = 6 m", "b = 2 m", "c = a - 1 m", "d = 1 m - a", "e = a - b*b/b", "f = (a+b) - (a-b)",
				"g = a / 2", "h = 12 m^2 / a", "i = a / (b + b)", "j = (a + b) / b", "k = (a*b) / 4 m", "l = 4 m^2 / (a - b)"},
			// 5, -5, 4 and 4 m; 3 m, 2 m, 1.5, 4, 3 m, 1 m.
			map[string]string{"c": "ok 5.000 m", "d": "ok -5.000 m", "e": "ok 4.000 m", "f": "ok 4.000 m",
				"g": "ok 3.000 m", "h": "ok 2.000 m", "i": "ok 1.500 1", "j": "ok 4.000 1", "k": "ok 3.000 m", "l": "ok 1.000 m"}},
		{"powers: the squares, cubes, roots and inverses the compiler specialises, and a general one",
			[]string{"x = 3 m", "p = x^2", "q = x^3", "r = (4 m^2)^0.5", "s = x^-1", "n = 2", "u = n^n^n", "w = (x*x)^0.5"},
			// 9 m², 27 m³, 2 m, 0.3333 /m, 2^4 = 16, 3 m.
			map[string]string{"p": "ok 9.000 m²", "q": "ok 27.00 m³", "r": "ok 2.000 m", "s": "ok 0.3333 m⁻¹", "u": "ok 16.00 1", "w": "ok 3.000 m"}},
		{"long product chains and pairs keep the tree's arithmetic",
			[]string{"f = 50 Hz", "N = 120", "k_w = 0.95", "Phi = 10 mWb", "E = sqrt(2)*pi*f*N*k_w*Phi",
				"g = 1 mm", "A = 0.01 m^2", "R_g = g/(mu_0*A)", "R_2 = g/(mu_0*A) + g/(mu_0*A)", "q = f*N/(k_w*N)"},
			// E = 4.44288 × 50 × 120 × 0.95 × 0.01 = 253.2 V; R_g = 1e-3/(4π×1e-7 × 0.01) = 79.58 kA/Wb; q = 52.63 Hz.
			map[string]string{"E": "ok 253.2 V", "R_g": "ok 79.58 kA/Wb", "R_2": "ok 159.2 kA/Wb", "q": "ok 52.63 Hz"}},
		{"checks: every comparison, and utilisation from both sides",
			[]string{"U = 9.7 kV", "W = 10 kV", "check U < W", "check U <= W", "check W > U", "check W >= U", "check U == 9.7 kV", "check U > W"},
			map[string]string{"check U < W": "pass 97.00 %", "check U <= W": "pass 97.00 %", "check W > U": "pass 97.00 %",
				"check W >= U": "pass 97.00 %", "check U == 9.7 kV": "pass", "check U > W": "fail 103.1 %"}},
		{"functions of one, two and many arguments",
			[]string{"a = 3 m", "b = 4 m", "c = hypot(a, b)", "d = min(a, b, 2 m)", "e = max(a, b, 2 m)", "f = atan2(b, a)",
				"g = abs(-2 V)", "h = round(2.5)", "i = floor(2.7)", "j = ceil(2.1)", "k = ln(exp(2))", "l = log10(1000)"},
			// 5 m; 2 m; 4 m; atan(4/3) = 53.13°; 2 V; 3; 2; 3; 2; 3.
			map[string]string{"c": "ok 5.000 m", "d": "ok 2.000 m", "e": "ok 4.000 m", "f": "ok 53.13 °", "g": "ok 2.000 V",
				"h": "ok 3 1", "i": "ok 2 1", "j": "ok 3 1", "k": "ok 2.000 1", "l": "ok 3.000 1"}},
		{"a bad statement is reported where it is and blocks only what uses it",
			[]string{"a = 2 m", "b = a + 3 s", "c = b * 2", "d = a * 2", "e = frob(a)", "f = sqrt(-a*a)/1 m", "g = f + 1"},
			map[string]string{"b": "error 3:7 …", "c": "blocked", "d": "ok 4.000 m", "e": "error 6:5 unknown function frob…",
				"f": "error 7:5 …", "g": "blocked"}},
		{"names: unknown, reserved, defined twice",
			[]string{"x = 1 m", "y = z + x", "x = 2 m", "check = 3", "w = x * 2"},
			map[string]string{"y": "error 3:5 unknown name z…", "w": "ok 2.000 m"}},
		{"a cycle names its members and leaves the rest",
			[]string{"a = b + 1", "b = a + 1", "c = 5 V"},
			map[string]string{"a": "error 2:1 …", "b": "error 3:1 …", "c": "ok 5.000 V"}},
		{"display units convert and must agree",
			[]string{"B [T] = 12 kG", "l [mm] = 0.25 m", "v [V] = 3 A"},
			map[string]string{"B": "ok 1.200 T", "l": "ok 250.0 mm", "v": "error 4:4 …"}},
		{"a solve finds its root inside its bounds",
			[]string{"x = solve(x^2 == 2, 0, 2)", "y = solve(y == 3, 0, 2)"},
			map[string]string{"x": "ok 1.414 1", "y": "error 3:…"}},
	} {
		c.run(t, engine.Options{})
	}
}

// Templates and results taken from other sheets, through the options a
// package gives the engine.
func TestCheckerTemplatesAndTakes(t *testing.T) {
	coil := sheetOf("t/coil.md", "param N [1] ; turns", "Phi = 1 mWb ; flux", "lambda [Wb] = N * Phi ; linkage", "check lambda <= 1 Wb")
	loop := sheetOf("t/loop.md", "use inner = t/loop")
	resolve := func(ref, from string) (engine.SheetSource, string, error) {
		switch ref {
		case "t/coil":
			return coil, "t/coil.md", nil
		case "t/loop":
			return loop, "t/loop.md", nil
		}
		return engine.SheetSource{}, "", fmt.Errorf("no template %s", ref)
	}
	field := engine.Compile(sheetOf("field.md", "Phi_0 = 40 mWb ; flux", "I_f = 20 A ; current", "bad = I_f + Phi_0"))
	field.Evaluate()
	take := func(ref, from string) (*engine.Calc, string, error) {
		if ref == "field" {
			return field, "field.md", nil
		}
		return nil, "", &engine.TakeError{Msg: "no sheet " + ref, Hint: "name a sheet of the package"}
	}
	opt := engine.Options{Resolve: resolve, Take: take}
	for _, c := range []checkerCase{
		{"instances with their own values; the user's formula keeps the user's names",
			[]string{"N_f = 120", "use a = t/coil with N = N_f", "use b = t/coil with N = 2*N_f, Phi = 2 mWb", "L = a.lambda + b.lambda"},
			// 0.12 Wb and 0.48 Wb: 0.6 Wb.
			map[string]string{"a": "ok", "a.lambda": "ok 0.1200 Wb", "b.lambda": "ok 0.4800 Wb", "L": "ok 600.0 mWb",
				"a: check lambda <= 1 Wb": "pass 12.00 %", "b: check lambda <= 1 Wb": "pass 48.00 %"}},
		{"a use must set every parameter, and only inputs",
			[]string{"use a = t/coil", "use b = t/coil with N = 3, Q = 2", "use c = t/nothing", "use d = t/loop", "x = 1 m"},
			map[string]string{"a": "error 2:9 t/coil needs N…", "b": "error 3:28 template t/coil has no input Q", "c": "error 4:9 no template t/nothing",
				"d": "ok", "d.inner": "error 2:13 template cycle: t/loop.md → t/loop.md", "x": "ok 1.000 m"}},
		{"taken results are live, and a take names what is wrong",
			[]string{"take Phi_0 from field", "take I [A] = I_f from field", "take P = Phi_1 from field", "take Q = Phi_0 from elsewhere",
				"take B = bad from field", "lambda = 10 * Phi_0", "take J [V] = I_f from field"},
			map[string]string{"Phi_0": "ok 40.00 mWb", "I": "ok 20.00 A", "J": "error 8:9 display unit V measures voltage…", "P": "error 4:10 field.md defines no result Phi_1",
				"Q": "error 5:21 no sheet elsewhere", "B": "blocked", "lambda": "ok 400.0 mWb"}},
	} {
		c.run(t, opt)
	}
	// Without a package there is nothing to take or use.
	checkerCase{"alone", []string{"take x from field", "use a = t/coil with N = 1", "y = 2 m"},
		map[string]string{"x": "error 2:…", "a": "error 3:…", "y": "ok 2.000 m"}}.run(t, engine.Options{})
}

// Release drops the compiled code; the results stay.
func TestReleaseKeepsResults(t *testing.T) {
	calc := engine.Compile(sheetOf("r.md", "a = 2 m", "b = a * a * a * a"))
	calc.Evaluate()
	calc.Release()
	if got := outcome(calc, calc.Lookup("b")); got != "ok 16.00 m⁴" {
		t.Errorf("after Release b is %q", got)
	}
	if s := engine.Errored.String(); s != "error" {
		t.Errorf("Errored prints as %q", s)
	}
	if v, ok := engine.LiteralString(calc.Lookup("a").Expr); !ok || v != "2 m" {
		t.Errorf("literal %q %v", v, ok)
	}
}
