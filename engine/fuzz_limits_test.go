package engine_test

import (
	"fmt"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
)

// fuzzTemplates is the resolver of FuzzTemplateUse: t0 … t9 are the same
// template text with NEXT standing for the next of them, so that the
// fuzzer can build chains, doublings and cycles; t10 does not exist.
func fuzzTemplates(text string) (engine.Resolver, map[string]int) {
	lines := map[string]int{"s.md": 0}
	srcs := map[string]engine.SheetSource{}
	for k := range 10 {
		name := "t" + strconv.Itoa(k)
		body := strings.ReplaceAll(text, "NEXT", "t"+strconv.Itoa(k+1))
		ls := strings.Split(body, "\n")
		lines[name+".md"] = len(ls) + 1
		srcs[name] = engine.SheetSource{Path: name + ".md", Title: name, Blocks: []engine.SourceBlock{block(name+".md", ls...)},
			Tables: []engine.TableSource{{Name: "BH", Pos: diag.Pos{File: name + ".md", Line: 1, Col: 1},
				Header: []engine.CellSource{{Text: "H [A/m]"}, {Text: "B [T]"}},
				Rows:   [][]engine.CellSource{{{Text: "0"}, {Text: "0"}}, {{Text: "100"}, {Text: "0.5"}}}}}}
	}
	return func(ref, from string) (engine.SheetSource, string, error) {
		src, ok := srcs[ref]
		if !ok {
			return engine.SheetSource{}, "", fmt.Errorf("no sheet %s", ref)
		}
		return src, ref, nil
	}, lines
}

// FuzzTemplateUse expands use statements of a fuzzed sheet over a fuzzed
// template. Whatever the input, it does not panic, stays within the
// limits on instances and statements, points every diagnostic at a line
// of the sheet or template it belongs to, and ends every statement with
// an outcome.
func FuzzTemplateUse(f *testing.F) {
	for _, seed := range [][2]string{
		{"use a = t0 with N = 3\nx = a.lambda * 2", "param N [1] ; turns\nPhi = 1 mWb\nlambda [Wb] = N * Phi\ncheck lambda <= 1 Wb"},
		{"use a = t0\nuse b = t0", "v = 1\nuse a = NEXT\nuse b = NEXT"},
		{"use a = t0", "use self = t0"},
		{"use a = t0 with x = 1, x = 2", "x = 1 m"},
		{"use a = t0 with y = 1", "x = 1 m"},
		{"use a = t0 with N = (1,\n    2)", "param N [1]"},
		{"use a = \"t0\" with N = 1 m", "param N [1]\nH = interp(BH.H, BH.B, N * 1 T)"},
		{"use = t0\nuse a t0\nuse a = \nuse a = t0 wit N = 1", "param N"},
		{"x = 1\nuse x = t0", "x = 2\nuse x = NEXT"},
		{"use a = t0 with N = a.v", "param N [1]\nv = N"},
		{"use a = t0\ny = a.BH.B", "B_c = interp(BH.B, BH.H, 50 A/m)"},
		{"use a = t9\nuse b = t10", "param N [1]"},
		{"use a = t0 with N = 2\nx = a.m\nuse b = t0 with N = 1, V = 3 V", "param N [1]\nparam V [V] optional ; volts\nm = V * N\ncheck m <= 5 V\ncheck N <= 4\nuse c = NEXT with V = V, N = 1\nw = c.m / 2"},
		{"use a = t0 with V = 1 V optional", "param V [V]   optional   optional\nparam W [V] optional x\nparam X optional"},
	} {
		f.Add(seed[0], seed[1])
	}
	f.Fuzz(func(t *testing.T, sheet, tmpl string) {
		resolve, lines := fuzzTemplates(tmpl)
		sl := strings.Split(sheet, "\n")
		lines["s.md"] = len(sl) + 1
		s := engine.CompileWith(engine.SheetSource{Path: "s.md", Blocks: []engine.SourceBlock{block("s.md", sl...)}}, engine.Options{Resolve: resolve})
		s.Evaluate()
		instances := 0
		for _, st := range s.Statements {
			if st.Kind == engine.Use {
				instances++
			}
		}
		if instances > engine.MaxInstances || len(s.Statements) > engine.MaxStatements+len(sl) {
			t.Fatalf("%d instances, %d statements", instances, len(s.Statements))
		}
		for _, d := range s.Diags {
			n, ok := lines[d.Pos.File]
			if !ok || d.Pos.Line < 1 || d.Pos.Line > n || d.Pos.Col < 1 {
				t.Fatalf("diagnostic outside its file: %s", d.Error())
			}
			if d.Message == "" || !utf8.ValidString(d.Message) && utf8.ValidString(sheet+tmpl) {
				t.Fatalf("diagnostic without a readable message: %q", d.Error())
			}
		}
		for _, st := range s.Statements {
			checkOutcome(t, s, st)
		}
	})
}

// checkOutcome asserts that an evaluated statement has a sound outcome.
func checkOutcome(t *testing.T, calc *engine.Calc, st *engine.Statement) {
	t.Helper()
	r := calc.Result(st)
	switch r.Status {
	case engine.OK:
		if st.Kind != engine.Use && (!finite(r.Value) || r.Shown.Dim != st.Type.Dim) {
			t.Fatalf("%q: ok with value %v shown in %s", st.Text, r.Value, r.Shown.Symbol)
		}
	case engine.Pass, engine.Fail:
		if !finite(r.Left) || !finite(r.Right) {
			t.Fatalf("%q: %v with sides %v, %v", st.Text, r.Status, r.Left, r.Right)
		}
	case engine.Errored, engine.Blocked:
		if r.Err == nil {
			t.Fatalf("%q: %v without a reason", st.Text, r.Status)
		}
	default:
		t.Fatalf("%q: status %v after Evaluate", st.Text, r.Status)
	}
}

// fuzzTable reads a table from text: one row a line, cells separated by
// |, the first line the header; cell positions follow the text.
func fuzzTable(text string) engine.TableSource {
	ts := engine.TableSource{Name: "T", Pos: diag.Pos{File: "s.md", Line: 1, Col: 1}}
	for i, line := range strings.Split(text, "\n") {
		var row []engine.CellSource
		col := 1
		for _, c := range strings.Split(line, "|") {
			row = append(row, engine.CellSource{Text: c, Pos: diag.Pos{File: "s.md", Line: i + 2, Col: col}})
			col += utf8.RuneCountInString(c) + 1
		}
		if i == 0 {
			ts.Header = row
		} else {
			ts.Rows = append(ts.Rows, row)
		}
	}
	return ts
}

// FuzzTable reads a fuzzed table and reads it back through interp, spline
// and pick at a fuzzed value. A table either fails with a diagnostic in
// its own text or has columns of finite values, one per row; every read
// of it is a finite value or an error with a reason.
func FuzzTable(f *testing.F) {
	for _, seed := range []struct {
		table string
		x     float64
	}{
		{"H [A/m] | B [T]\n0 | 0\n100 | 0.5\n400 | 1.2\n2000 | 1.6", 250},
		{"H [A/m] | B [T]\n0 | 0\n100 | 0.5", 100},
		{"H [A/m] | B [T]\n0 | 0\n0 | 0.5\n1 | 1", 0.5},
		{"H [A/m] | B [T]\n5 | 0\n1 | 0.5\n-3 | 1", -1},
		{"H [kA/m] | B [mT]\n1_000 | −5\n2e3 | 1e308", 1500},
		{"H [A/m] | B [T]\n0 | 0\n1 | x", 0},
		{"H [A/m | B [T]\n0 | 0\n1 | 1", 0},
		{"H [A/m] | H [T]\n0 | 0\n1 | 1", 0},
		{"H [furlong] | B\n0 | 0\n1 | 1", 0},
		{"H [A/m] | B [T]\n0 | 0 | 3\n1 | 1", 0},
		{"H [A/m] | B [T]\n0 | 0", 0},
		{"H [A/m] | B [T]\nNaN | 0\nInf | 1", 0},
		{"H [degC] | B [K]\n-273.15 | 0\n0 | 273.15", -100},
		{"", 0},
	} {
		f.Add(seed.table, seed.x)
	}
	f.Fuzz(func(t *testing.T, table string, x float64) {
		ts := fuzzTable(table)
		at := strconv.FormatFloat(x, 'g', -1, 64) + " A/m"
		src := engine.SheetSource{Path: "s.md", Tables: []engine.TableSource{ts}, Blocks: []engine.SourceBlock{block("s.md",
			"x_r = "+at,
			"y_i = interp(T.B, T.H, x_r)",
			"y_e = interp(T.B, T.H, x_r, extrapolate)",
			"y_s = spline(T.B, T.H, x_r)",
			"y_p = pick(T.B, T.H, x_r)",
			"k = 3",
		)}}
		s := engine.CompileWith(src, engine.Options{})
		s.Evaluate()
		lines := strings.Count(table, "\n") + 2
		for _, d := range s.Diags {
			// The block's lines are 2 to 7; the table's are 1 to lines.
			if d.Pos.File != "s.md" || d.Pos.Line < 1 || d.Pos.Line > max(lines, 7) || d.Pos.Col < 1 {
				t.Fatalf("diagnostic outside the input: %s", d.Error())
			}
		}
		tab := s.Tables[0]
		if tab.Err == nil {
			for _, c := range tab.Columns {
				if len(c.Values) != len(ts.Rows) || len(c.Values) > engine.MaxTableRows {
					t.Fatalf("column %s has %d values for %d rows", c.Name, len(c.Values), len(ts.Rows))
				}
				for _, v := range c.Values {
					if !finite(v) {
						t.Fatalf("column %s holds %v", c.Name, v)
					}
				}
			}
		}
		for _, st := range s.Statements {
			checkOutcome(t, s, st)
		}
		if k := s.Lookup("k"); k == nil || s.Result(k).Status != engine.OK || s.Result(k).Value != 3 {
			t.Fatalf("an independent statement lost its result: %+v", s.Result(k))
		}
	})
}
