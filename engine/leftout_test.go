package engine_test

import (
	"slices"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// partsTemplate is an invented template with a part for each optional
// input, one for both, and a check that rests on no optional input.
var partsTemplate = sheetOf("t/parts.md",
	"param U [kV]              ; working voltage, RMS",
	"param V_i [kV] optional   ; inception voltage, peak",
	"param V_w [kV] optional   ; withstand voltage, peak",
	"k = 1.25                  ; margin ; source: common practice",
	"U_max = 10 kV             ; largest peak of the model ; source: common practice",
	"U_pk = sqrt(2) * U        ; peak working voltage",
	"m = V_i / U_pk            ; inception margin",
	"check m >= k              ; rests on V_i and U",
	"check k * U_pk <= V_w     ; rests on V_w and U",
	"check V_i <= V_w          ; rests on both optional inputs",
	"check U_pk <= U_max       ; rests on no optional input",
)

func partsResolver(extra map[string]engine.SheetSource) engine.Resolver {
	return func(ref, from string) (engine.SheetSource, string, error) {
		if src, ok := extra[ref]; ok {
			return src, ref, nil
		}
		return partsTemplate, "t/parts.md", nil
	}
}

// leftOut writes an instance's left-out parts as "V_i: ins.m, check m >= k".
func leftOut(use *engine.Statement) []string {
	var out []string
	for _, lo := range use.Parts.LeftOut {
		var names []string
		for _, st := range lo.Statements {
			if st.Kind == engine.Check {
				names = append(names, "check "+st.Formula)
			} else {
				names = append(names, st.Name)
			}
		}
		out = append(out, strings.Join(lo.Params, "+")+": "+strings.Join(names, ", "))
	}
	return out
}

// Optional inputs: a part whose optional input is set is evaluated; one
// whose input is not set is left out, neither counted nor an error, and
// named on the use; a check resting on no optional input always runs.
// Values by hand: U_pk = √2 · 2 kV = 2.828 kV; m = 5 / 2.828 = 1.768;
// k · U_pk = 3.536 kV against 8 kV.
func TestOptionalParts(t *testing.T) {
	for _, c := range []struct {
		name     string
		use      string
		want     map[string]string
		absent   []string
		leftOut  []string
		pass     int
		fail     int
		kept     []string // defaults kept that checks rest on
		problems int
	}{
		{"both set: every part is evaluated", "use ins = t/parts with U = 2 kV, V_i = 5 kV, V_w = 8 kV",
			map[string]string{"ins.m": "ok 1.768 1", "ins: check m >= k": "pass 70.71 %", "ins: check k * U_pk <= V_w": "pass 44.19 %",
				"ins: check V_i <= V_w": "pass 62.50 %", "ins: check U_pk <= U_max": "pass 28.28 %"},
			nil, nil, 4, 0, []string{"ins.k", "ins.U_max"}, 0},
		{"neither set: only the check on no optional input runs", "use ins = t/parts with U = 2 kV",
			map[string]string{"ins.U_pk": "ok 2.828 kV", "ins: check U_pk <= U_max": "pass 28.28 %"},
			[]string{"ins.m", "ins.V_i", "ins.V_w", "ins: check m >= k", "ins: check k * U_pk <= V_w", "ins: check V_i <= V_w"},
			// The check of both joins the parts of V_i and V_w into one.
			[]string{"V_i+V_w: ins.m, check m >= k, check k * U_pk <= V_w, check V_i <= V_w"}, 1, 0,
			// k rests only under left-out checks: it is not listed.
			[]string{"ins.U_max"}, 0},
		{"one set: the part of the other and the part of both are left out", "use ins = t/parts with U = 2 kV, V_i = 2 kV",
			// m = 2 / 2.828 = 0.7071 fails against 1.25.
			map[string]string{"ins.m": "ok 0.7071 1", "ins: check m >= k": "fail 176.8 %"},
			[]string{"ins: check k * U_pk <= V_w", "ins: check V_i <= V_w"},
			// V_i is set, so the check of both waits for V_w alone.
			[]string{"V_w: check k * U_pk <= V_w, check V_i <= V_w"}, 1, 1, []string{"ins.k", "ins.U_max"}, 0},
	} {
		calc := engine.CompileWith(sheetOf("s.md", c.use), engine.Options{Resolve: partsResolver(nil)})
		calc.Evaluate()
		if len(calc.Diags) != c.problems {
			t.Errorf("%s: diagnostics %v", c.name, calc.Diags)
		}
		checkerCase{c.name, []string{c.use}, c.want}.run(t, engine.Options{Resolve: partsResolver(nil)})
		var pass, fail int
		names := map[string]bool{}
		for _, st := range calc.Statements {
			key := st.Name
			if st.Kind == engine.Check {
				key = st.Instance + ": check " + st.Formula
			}
			names[key] = true
			switch calc.Result(st).Status {
			case engine.Pass:
				pass++
			case engine.Fail:
				fail++
			case engine.Errored, engine.Blocked:
				t.Errorf("%s: %s did not run: %v", c.name, key, calc.Result(st).Err)
			}
		}
		for _, a := range c.absent {
			if names[a] {
				t.Errorf("%s: %s is in the instance; it should be left out", c.name, a)
			}
		}
		if pass != c.pass || fail != c.fail {
			t.Errorf("%s: %d pass and %d fail, want %d and %d", c.name, pass, fail, c.pass, c.fail)
		}
		use := calc.Lookup("ins.U_pk").Use
		if got := leftOut(use); !slices.Equal(got, c.leftOut) {
			t.Errorf("%s: left out %q, want %q", c.name, got, c.leftOut)
		}
		var kept []string
		for _, k := range calc.KeptDefaults() {
			if k.Use != use {
				t.Errorf("%s: default %s kept under use %s", c.name, k.Default.Name, k.Use.Name)
			}
			kept = append(kept, k.Default.Name)
		}
		if !slices.Equal(kept, c.kept) {
			t.Errorf("%s: defaults kept %q, want %q", c.name, kept, c.kept)
		}
	}
}

// A statement of the using sheet that names a left-out result, or the
// unset input itself, has an error at the name that says what to set;
// what does not use it keeps its result.
func TestOptionalPartNamed(t *testing.T) {
	checkerCase{"naming a left-out result",
		[]string{"use ins = t/parts with U = 2 kV", "a = 2 * ins.m", "b = ins.V_i", "c = ins.U_pk / 2", "check ins.m >= 1", "d = a + 1"},
		map[string]string{
			"a":                "error 3:9 ins.m is not evaluated: instance ins leaves it out because the optional input V_i of t/parts is not set",
			"b":                "error 4:5 ins.V_i is not evaluated: instance ins leaves it out because the optional input V_i of t/parts is not set",
			"check ins.m >= 1": "error 6:7 ins.m is not evaluated…",
			"c":                "ok 1.414 kV",
			"d":                "blocked…",
		}}.run(t, engine.Options{Resolve: partsResolver(nil)})
	calc := engine.CompileWith(sheetOf("s.md", "use ins = t/parts with U = 2 kV", "a = 2 * ins.m"), engine.Options{Resolve: partsResolver(nil)})
	if len(calc.Diags) != 1 || !strings.Contains(calc.Diags[0].Hint, "use statement at 2:1, after with: V_i = ...") {
		t.Errorf("the error should say where to set V_i: %v", calc.Diags)
	}
	// An input the template does not declare optional is still required.
	calc = engine.CompileWith(sheetOf("s.md", "use ins = t/parts with V_i = 5 kV"), engine.Options{Resolve: partsResolver(nil)})
	if len(calc.Diags) != 1 || !strings.Contains(calc.Diags[0].Message, "t/parts needs U [kV]") || strings.Contains(calc.Diags[0].Message, "V_w") {
		t.Errorf("only U is required: %v", calc.Diags)
	}
}

// An instance inside a template: the outer template passes its own
// optional input to the inner one, and what rests on it in both is left
// out when the using sheet does not set it.
func TestOptionalPartsNested(t *testing.T) {
	outer := sheetOf("t/outer.md",
		"param V_i [kV] optional ; inception voltage",
		"use pd = t/parts with U = 1 kV, V_i = V_i, V_w = 9 kV",
		"r = pd.m / 2 ; half the margin",
		"check pd.U_pk <= 2 kV ; rests on no optional input")
	res := partsResolver(map[string]engine.SheetSource{"t/outer": outer})
	calc := engine.CompileWith(sheetOf("s.md", "use o = t/outer"), engine.Options{Resolve: res})
	calc.Evaluate()
	if len(calc.Diags) != 0 {
		t.Fatalf("diagnostics: %v", calc.Diags)
	}
	use := calc.Statements[0]
	got := leftOut(use)
	want := []string{"V_i: o.pd.V_i, o.pd.m, check m >= k, check V_i <= V_w, o.r"}
	if !slices.Equal(got, want) {
		t.Errorf("left out %q, want %q", got, want)
	}
	for _, name := range []string{"o.pd.m", "o.r", "o.pd.V_i"} {
		if calc.Lookup(name) != nil {
			t.Errorf("%s should be left out", name)
		}
	}
	checkerCase{"nested, unset", []string{"use o = t/outer"},
		map[string]string{"o.pd: check k * U_pk <= V_w": "pass 19.64 %", "o: check pd.U_pk <= 2 kV": "pass 70.71 %"}}.run(t, engine.Options{Resolve: res})
	// An inner part of checks alone, for an input the outer template
	// leaves unset, is named on the sheet's use with the inner name.
	outer2 := sheetOf("t/outer2.md", "use pd = t/parts with U = 1 kV, V_i = 3 kV", "r = pd.m / 2 ; half the margin")
	res2 := partsResolver(map[string]engine.SheetSource{"t/outer2": outer2})
	calc = engine.CompileWith(sheetOf("s.md", "use o = t/outer2"), engine.Options{Resolve: res2})
	if got, want := leftOut(calc.Statements[0]), []string{"pd.V_w: check k * U_pk <= V_w, check V_i <= V_w"}; !slices.Equal(got, want) || len(calc.Diags) != 0 {
		t.Errorf("left out %q, want %q; %v", got, want, calc.Diags)
	}
	// Set, the same parts run: m = 5 / 1.414 = 3.536, r = 1.768.
	checkerCase{"nested, set", []string{"use o = t/outer with V_i = 5 kV"},
		map[string]string{"o.r": "ok 1.768 1", "o.pd: check m >= k": "pass 35.36 %"}}.run(t, engine.Options{Resolve: res})
}

// The word optional after a param's unit, and what is refused.
func TestOptionalParamSyntax(t *testing.T) {
	for _, c := range []struct{ line, want string }{
		{"param V [kV] optional", ""},
		{"param V [kV]   optional   ; note", ""},
		{"param V [kV] optionally", "unexpected text after param V [kV]"},
		{"param V [kV] optional x", "unexpected text after param V [kV]"},
		{"param V optional", "param V needs a unit in [ ]"},
	} {
		tpl := sheetOf("t/one.md", c.line, "W = 2 * V ; twice")
		calc := engine.CompileWith(sheetOf("s.md", "use x = t/one"), engine.Options{Resolve: func(string, string) (engine.SheetSource, string, error) { return tpl, "t/one.md", nil }})
		got := ""
		if len(calc.Diags) > 0 {
			got = calc.Diags[0].Message
		}
		if c.want == "" && got != "" || !strings.Contains(got, c.want) {
			t.Errorf("%q: got %q, want %q", c.line, got, c.want)
		}
	}
}

// Parts that share no optional input stay apart, each named with the
// inputs that would enable it; a result that rests on two unset inputs
// names both.
func TestOptionalPartsApart(t *testing.T) {
	tpl := sheetOf("t/two.md",
		"param A [V] optional ; first", "param B [V] optional ; second", "param C [V] optional ; third",
		"x = 2 * A ; twice A", "check x <= 10 V ; x within its range",
		"y = B + C ; B and C", "check y <= 5 V ; y within its range", "z = 1 V ; always there ; source: common practice")
	res := engine.Options{Resolve: func(string, string) (engine.SheetSource, string, error) { return tpl, "t/two.md", nil }}
	calc := engine.CompileWith(sheetOf("s.md", "use u = t/two with C = 1 V", "w = u.y + u.z"), res)
	got := leftOut(calc.Statements[0])
	want := []string{"A: u.x, check x <= 10 V", "B: u.y, check y <= 5 V"}
	if !slices.Equal(got, want) {
		t.Errorf("left out %q, want %q", got, want)
	}
	calc = engine.CompileWith(sheetOf("s.md", "use u = t/two", "w = u.y + u.z"), res)
	if got, want := leftOut(calc.Statements[0]), []string{"A: u.x, check x <= 10 V", "B+C: u.y, check y <= 5 V"}; !slices.Equal(got, want) {
		t.Errorf("left out %q, want %q", got, want)
	}
	if len(calc.Diags) != 1 || calc.Diags[0].Message != "u.y is not evaluated: instance u leaves it out because the optional inputs B, C of t/two are not set" ||
		calc.Diags[0].Hint != "set it in the use statement at 2:1, after with: B = ..., C = ..." {
		t.Errorf("got %v", calc.Diags)
	}
}
