package render_test

import (
	"encoding/json"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// The bad-input table: each case is a small sheet with one bad statement
// (or one bad file feature) among good ones. A case passes when the error
// is reported at the place an editor shows (line and column from 1,
// columns in characters), says what is wrong, and leaves everything that
// does not depend on it computed and rendered.
//
// Every case is built by badSheet, which lays a sheet out as
//
//	 1  # Bad input
//	 2
//	 3  Prose before the block.        (the case's prose; may span lines)
//	 4
//	 5  ```sheaf
//	 6  l_a = 2 m ; a good input
//	 7  U_a = 3 V
//	 8  <the case's lines>             (so the first bad line is line 8)
//	 …  P_a = U_a * 2 A
//	 …  check l_a <= 5 m
//	 …  ```
//
// with every line moved down by the front matter, when a case has one.

// wantDiag is a diagnostic a case must produce.
type wantDiag struct {
	pos  string // file:line:col
	msg  string // a stable part of the message
	hint string // a stable part of the hint, if any
	warn bool   // a warning rather than an error
}

// good is a statement that must come out right whatever the bad one does.
type good struct {
	name string  // a definition's name, or a check's text
	si   float64 // the SI value (definitions)
	html string  // what the sheet page must show for it
}

// in is an input: the page shows it as written.
func in(name, text, unit string, si float64) good {
	return good{name: name, si: si, html: mathValue(text, unit)}
}

// res is a computed result: the page shows it to four figures.
func res(name, text, unit string, si float64) good { return in(name, text, unit, si) }

// pass is a check that must pass, showing both sides in unit.
func pass(text, left, op, right, unit string) good {
	return good{name: text, html: mathValue(left, unit) + "<mo>" + op + "</mo>" + mathValue(right, unit)}
}

// mathValue is the MathML of a number and its unit as the pages write it.
func mathValue(number, unit string) string {
	s := "<mn>" + number + "</mn>"
	if unit != "" {
		s += `<mspace width="0.2em"></mspace><mtext>` + unit + "</mtext>"
	}
	return s
}

// baseGood are the template's own good statements.
var baseGood = []good{
	in("l_a", "2", "m", 2),
	in("U_a", "3", "V", 3),
	res("P_a", "6.000", "W", 6),
	pass("check l_a <= 5 m", "2.000", "≤", "5.000", "m"),
}

type badCase struct {
	name  string
	front string   // front matter lines, fences included; "" for none
	prose string   // line 3 onwards; "" for the default
	bad   []string // the case's lines, from line 8 (after front matter)
	want  []wantDiag
	good  []good // good statements among the case's lines
	// status, when set, is the status the named statement must have.
	status map[string]engine.Status
	// noErrors says the case must produce no error at all.
	noErrors bool
	// html, when set, is text the sheet page must contain.
	html string
}

func badSheet(c badCase) string {
	var b strings.Builder
	if c.front != "" {
		b.WriteString(c.front + "\n")
	}
	prose := c.prose
	if prose == "" {
		prose = "Prose before the block."
	}
	b.WriteString("# Bad input\n\n" + prose + "\n\n```sheaf\nl_a = 2 m ; a good input\nU_a = 3 V\n")
	for _, l := range c.bad {
		b.WriteString(l + "\n")
	}
	b.WriteString("P_a = U_a * 2 A\ncheck l_a <= 5 m\n```\n\nProse after the block.\n")
	return b.String()
}

func badCases() []badCase {
	temps := []good{in("T_1", "20", "°C", 293.15)}
	speed := []good{in("n", "1500", "rpm", 25)}
	return []badCase{
		{name: "unknown unit", bad: []string{"V_b = 2 kv"},
			want: []wantDiag{{pos: "s.md:8:9", msg: `unknown unit "kv"`, hint: "did you mean 2 kV?"}}},
		{name: "unknown name", bad: []string{"P_b = U_x * 2 A"},
			want: []wantDiag{{pos: "s.md:8:7", msg: "unknown name U_x", hint: "did you mean U_a?"}}},
		{name: "voltage plus current", bad: []string{"x_b = 1 V + 2 A"},
			want: []wantDiag{{pos: "s.md:8:11", msg: "cannot add voltage (V) and current (A)"}}},
		{name: "display unit of another dimension", bad: []string{"l_b [V] = l_a"},
			want: []wantDiag{{pos: "s.md:8:6", msg: "display unit V measures voltage (V), but l_b is length (m)"}}},
		{name: "sin of a length", bad: []string{"s_b = sin(l_a)"},
			want: []wantDiag{{pos: "s.md:8:11", msg: "sin needs a pure number, but its argument is length (m)"}}},
		{name: "exponent with a unit", bad: []string{"e_b = 2^l_a"},
			want: []wantDiag{{pos: "s.md:8:9", msg: "the exponent has a unit: it is length (m)"}}},
		{name: "exponent not fixed on a quantity", bad: []string{"k_b = 3", "A_b = l_a^k_b"},
			good: []good{in("k_b", "3", "", 3)},
			want: []wantDiag{{pos: "s.md:9:11", msg: "the exponent of length (m) must be a fixed number"}}},
		{name: "square root of a length", bad: []string{"r_b = sqrt(l_a)"},
			want: []wantDiag{{pos: "s.md:8:12", msg: "the square root of length (m) has no unit"}}},
		{name: "cycle of three", bad: []string{"c_1 = c_2 + 1", "c_2 = c_3 + 1", "c_3 = c_1 + 1"},
			want: []wantDiag{
				{pos: "s.md:8:1", msg: "c_1 is defined in terms of itself: c_1 → c_2 → c_3 → c_1"},
				{pos: "s.md:9:1", msg: "c_2 is defined in terms of itself: c_1 → c_2 → c_3 → c_1"},
				{pos: "s.md:10:1", msg: "c_3 is defined in terms of itself: c_1 → c_2 → c_3 → c_1"},
			}},
		{name: "self reference", bad: []string{"s_b = s_b + 1 m"},
			want: []wantDiag{{pos: "s.md:8:1", msg: "s_b is defined in terms of itself: s_b → s_b"}}},
		{name: "duplicate definition", bad: []string{"l_a = 5 m"},
			want: []wantDiag{{pos: "s.md:8:1", msg: "l_a is already defined at 6:1"}}},
		{name: "division by zero", bad: []string{"z_b = U_a / (l_a - l_a)"},
			want: []wantDiag{{pos: "s.md:8:11", msg: "division by zero"}}},
		{name: "overflow", bad: []string{"o_b = 1e200 m * 1e200 m"},
			want: []wantDiag{{pos: "s.md:8:15", msg: "the result overflows"}}},
		{name: "number with two points", bad: []string{"m_1 = 1.2.3"},
			want: []wantDiag{{pos: "s.md:8:7", msg: `malformed number "1.2.3"`}}},
		{name: "exponent without digits", bad: []string{"m_2 = 1e"},
			want: []wantDiag{{pos: "s.md:8:7", msg: `malformed number "1e"`, hint: "an exponent needs digits"}}},
		{name: "letter glued to a number", bad: []string{"m_3 = 2x"},
			want: []wantDiag{{pos: "s.md:8:7", msg: `malformed number "2x"`, hint: "2*x"}}},
		{name: "formula ends after an operator", bad: []string{"q_e = l_a +"},
			want: []wantDiag{{pos: "s.md:8:11", msg: "formula ends too early", hint: "after +"}}},
		// _q0 is how the parser stands in for the first literal; a name
		// spelt so must not pick up the 5 V.
		{name: "name starting with _ in a formula", bad: []string{"r_q = 5 V * _q0"},
			want: []wantDiag{{pos: "s.md:8:13", msg: "name _q0 starts with _"}}},
		{name: "value too large for its display unit", bad: []string{"y_b [nm] = 1e306 m"},
			want: []wantDiag{{pos: "s.md:8:6", msg: "beyond the range of a number when shown in nm"}}},
		{name: "dimension exponent beyond int8", bad: []string{"x_9 = 1 m^99", "y_9 = x_9*x_9"},
			good: []good{in("x_9", "1", "m⁹⁹", 1)},
			want: []wantDiag{{pos: "s.md:9:10", msg: "exponent beyond ±127"}}},
		{name: "parenthesis never closed", bad: []string{"p_1 = (l_a + 1 m"},
			want: []wantDiag{{pos: "s.md:8:7", msg: "unbalanced parentheses: this ( is never closed"}}},
		{name: "parenthesis never opened", bad: []string{"p_2 = l_a + 1 m)"},
			want: []wantDiag{{pos: "s.md:8:16", msg: "unbalanced parentheses: this ) has no matching ("}}},
		{name: "empty formula block", prose: "Prose before the block.\n\n```sheaf\n```",
			want: []wantDiag{{pos: "s.md:5:1", msg: "formula block is empty"}}},
		{name: "front matter never closed", front: "---\ntitle: Open",
			want: []wantDiag{{pos: "s.md:1:1", msg: "front matter opened here is never closed"}}},
		// Columns count characters, and each byte that is not UTF-8 counts
		// as one (it shows as one replacement character): the ö before the
		// bad byte is two bytes but one column, so the byte is column 18,
		// though it is the 19th byte of its line.
		{name: "invalid UTF-8 in prose", prose: "Pr\xc3\xb6se with a bad \xff byte.",
			want: []wantDiag{{pos: "s.md:3:18", msg: "byte 0xff is not valid UTF-8"}}},
		// µ is two bytes, so the bad byte is column 14 and byte 15.
		{name: "invalid UTF-8 in a formula", bad: []string{"u_b = 2 µm + \xfe"},
			want: []wantDiag{
				{pos: "s.md:8:14", msg: "byte 0xfe is not valid UTF-8"},
				{pos: "s.md:8:14", msg: "the formula holds a byte that is not valid UTF-8"},
			}},
		{name: "1 MB formula line", bad: []string{"x_big = 1" + strings.Repeat(" + 1", 250_000)},
			want: []wantDiag{{pos: "s.md:8:1", msg: "statement is 1000009 characters long; the limit is 10000"}}},
		{name: "1 MB prose line", prose: strings.Repeat("prose ", 175_000) + "END-OF-LONG-LINE",
			noErrors: true, html: "END-OF-LONG-LINE"},
		// The 101st ( is column 107: "n_b = " is six characters.
		{name: "10,000 nested parentheses", bad: []string{"n_b = " + strings.Repeat("(", 10_000) + "1" + strings.Repeat(")", 10_000)},
			want: []wantDiag{{pos: "s.md:8:107", msg: "parentheses nested more than 100 deep"}}},
		{name: "= missing", bad: []string{"x_b 2 m"},
			want: []wantDiag{{pos: "s.md:8:5", msg: "expected = after x_b"}}},
		{name: ":= for =", bad: []string{"y_b := 2 m"},
			want: []wantDiag{{pos: "s.md:8:5", msg: "unexpected :=", hint: "y_b = ..."}}},
		// The = is expected just after the name: column 4 of a 3-character line.
		{name: "only a name", bad: []string{"q_b"},
			want: []wantDiag{{pos: "s.md:8:4", msg: "expected = after q_b"}}},
		{name: "reserved word as a name", bad: []string{"in = 2"},
			want: []wantDiag{{pos: "s.md:8:1", msg: "in is a reserved word"}}},
		{name: "function name as a name", bad: []string{"sqrt = 2"},
			want: []wantDiag{{pos: "s.md:8:1", msg: "sqrt is the name of a built-in function"}}},
		{name: "constant redefined", bad: []string{"mu_0 = 1"},
			want: []wantDiag{{pos: "s.md:8:1", msg: "mu_0 is a built-in constant"}}},
		{name: "name starting with _", bad: []string{"_x = 2"},
			want: []wantDiag{{pos: "s.md:8:1", msg: "name _x starts with _"}}},
		{name: "comparison in a definition", bad: []string{"c_b = l_a < 3 m"},
			want: []wantDiag{{pos: "s.md:8:11", msg: "a definition cannot hold a comparison"}}},
		{name: "check without comparison", bad: []string{"check l_a"},
			want: []wantDiag{{pos: "s.md:8:7", msg: "a check needs one comparison"}}},
		{name: "chained comparison", bad: []string{"check 1 m < l_a < 3 m"},
			want: []wantDiag{{pos: "s.md:8:17", msg: "a check holds one comparison; a < b < c chains two"}}},
		{name: "and in a check", bad: []string{"check l_a < 3 m and l_a > 1 m"},
			want: []wantDiag{{pos: "s.md:8:17", msg: "'and' is not supported"}}},
		{name: "unknown function", bad: []string{"f_b = sqr(l_a^2)"},
			want: []wantDiag{{pos: "s.md:8:7", msg: "unknown function sqr", hint: "did you mean sqrt?"}}},
		{name: "wrong number of arguments", bad: []string{"t_b = atan2(1)"},
			want: []wantDiag{{pos: "s.md:8:7", msg: "atan2 takes 2 arguments"}}},
		{name: "string in a formula", bad: []string{`s_b = "abc"`},
			want: []wantDiag{{pos: "s.md:8:7", msg: "text in quotes is not allowed in a formula"}}},
		{name: "percent not after a number", bad: []string{"q_b = l_a %"},
			want: []wantDiag{{pos: "s.md:8:11", msg: "% must follow a number"}}},
		{name: "rpm shown in rad/s without 2π", bad: []string{"n = 1500 rpm", "omega [rad/s] = n"}, good: speed,
			want: []wantDiag{{pos: "s.md:9:8", msg: "omega is a rotational frequency (cycles), and showing it in rad/s would drop a factor 2π",
				hint: "omega [rad/s] = 2*pi*n"}}},
		{name: "rad/s shown in Hz", bad: []string{"w_b = 10 rad/s", "f_b [Hz] = w_b"},
			good: []good{in("w_b", "10", "rad/s", 10)},
			want: []wantDiag{{pos: "s.md:9:6", msg: "f_b is an angular velocity (radians), and showing it in Hz would add a factor 2π",
				hint: "f_b [Hz] = w_b/(2*pi)"}}},
		{name: "rpm plus rad/s", bad: []string{"n = 1500 rpm", "w_b = 10 rad/s", "s_b = n + w_b"},
			good: append([]good{in("w_b", "10", "rad/s", 10)}, speed...),
			want: []wantDiag{{pos: "s.md:10:9", msg: "cannot add an angle-based quantity (rad) and a cycle-based one (Hz, rpm)"}}},
		{name: "absolute temperature plus absolute temperature", bad: []string{"T_b = 20 degC + 30 degC"},
			want: []wantDiag{{pos: "s.md:8:15", msg: "cannot add two absolute temperatures"}}},
		{name: "absolute temperature multiplied", bad: []string{"T_1 = 20 degC", "T_c = 2 * T_1"}, good: temps,
			want: []wantDiag{{pos: "s.md:9:9", msg: "cannot multiply or divide an absolute temperature"}}},
		{name: "temperature difference shown in degC", bad: []string{"T_1 = 20 degC", "T_2 = 30 degC", "d_T [degC] = T_2 - T_1"},
			good: append([]good{in("T_2", "30", "°C", 303.15)}, temps...),
			want: []wantDiag{{pos: "s.md:10:6", msg: "d_T is a temperature difference and cannot be shown in °C"}}},
		{name: "check of degC against a K difference", bad: []string{"T_1 = 20 degC", "check T_1 <= 5 K"}, good: temps,
			want: []wantDiag{{pos: "s.md:9:11", msg: "cannot compare an absolute temperature (°C or °F) with a temperature difference (K)"}}},
		{name: "blocked by a failed statement", bad: []string{"x_1 = U_a / (l_a - l_a)", "y_1 = x_1 * 2"},
			want: []wantDiag{
				{pos: "s.md:8:11", msg: "division by zero"},
				{pos: "s.md:9:1", msg: "not evaluated: it uses x_1, which has an error"},
			},
			status: map[string]engine.Status{"x_1": engine.Errored, "y_1": engine.Blocked}},
		// The flow sequence on line 3 is never closed. yaml.v3 itself names
		// line 2, where the mapping began; sheaf names the line to fix.
		{name: "bad YAML in front matter", front: "---\ntitle: Fine\nrevision: [A\ndate: 2024-05-01\n---",
			want: []wantDiag{{pos: "s.md:3:1", msg: "front matter: did not find expected ',' or ']'"}}},
		{name: "front-matter field misindented", front: "---\ntitle: Fine\nclient:\n  - Harrow Vale Water\n subject: Pumps\n---",
			want: []wantDiag{{pos: "s.md:5:1", msg: "front matter: did not find expected key"}}},
		{name: "front-matter field that is not text", front: "---\ntitle: Fine\nclient: [Harrow, Vale]\n---",
			want: []wantDiag{{pos: "s.md:3:9", msg: `front-matter field "client" must be text`}}},
		{name: "unknown front-matter key", front: "---\ntitle: Fine\nreviewer: J. Okafor\n---",
			want: []wantDiag{{pos: "s.md:3:1", msg: `unknown front-matter field "reviewer"`, warn: true}}, noErrors: true},
		{name: "digits out of range", front: "---\ntitle: Fine\ndigits: 99\n---",
			want: []wantDiag{{pos: "s.md:3:9", msg: "digits must be a whole number of significant figures", hint: "from 1 to 15"}}},
	}
}

func TestBadInput(t *testing.T) {
	cases := badCases()
	if len(cases) < 40 {
		t.Fatalf("only %d cases", len(cases))
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			src := badSheet(c)
			pkg := project.FromFiles("pkg", map[string][]byte{"s.md": []byte(src)})
			if len(pkg.Sheets) != 1 {
				t.Fatalf("%d sheets", len(pkg.Sheets))
			}
			sh := pkg.Sheets[0]

			// Every diagnostic: the package's, and each statement's own
			// (a blocked statement's reason is not a package diagnostic).
			all := append(diag.List{}, pkg.Diags...)
			for _, st := range sh.Calc.Statements {
				r := sh.Calc.Result(st)
				if r.Err != nil && r.Status == engine.Blocked {
					all = append(all, *r.Err)
				}
			}
			for _, w := range c.want {
				if !hasDiag(all, w) {
					t.Errorf("no diagnostic at %s with %q (hint %q, warning %v); got:\n%s", w.pos, w.msg, w.hint, w.warn, list(all))
				}
			}
			if c.noErrors && pkg.Diags.Errors() != 0 {
				t.Errorf("want no errors, got:\n%s", list(pkg.Diags))
			}

			// (c) good statements are untouched, and no diagnostic sits on
			// their lines.
			goods := append(append([]good{}, baseGood...), c.good...)
			for _, g := range goods {
				st := find(sh.Calc, g.name)
				if st == nil {
					t.Errorf("%s: statement not found", g.name)
					continue
				}
				r := sh.Calc.Result(st)
				for _, d := range pkg.Diags {
					if d.Pos.Line == st.Pos.Line {
						t.Errorf("%s: diagnostic on a good line: %s", g.name, d.Error())
					}
				}
				if st.Kind == engine.Check {
					if r.Status != engine.Pass {
						t.Errorf("%s: status %v, want pass", g.name, r.Status)
					}
					continue
				}
				if r.Status != engine.OK {
					t.Errorf("%s: status %v (%v), want ok", g.name, r.Status, r.Err)
					continue
				}
				if math.Abs(r.Value-g.si) > 1e-12*math.Abs(g.si) {
					t.Errorf("%s = %v in SI, want %v", g.name, r.Value, g.si)
				}
			}
			for name, want := range c.status {
				if st := find(sh.Calc, name); st == nil || sh.Calc.Result(st).Status != want {
					t.Errorf("%s: want status %v, got %+v", name, want, st)
				}
			}

			// (d) the renderers succeed; the page shows every good result
			// in its own row, and the JSON carries the diagnostics.
			files, err := render.HTML(pkg, render.Options{Version: "test"})
			if err != nil {
				t.Fatalf("HTML: %v", err)
			}
			page := pageFor(files, sh.Page)
			if page == "" {
				t.Fatalf("no page %s", sh.Page)
			}
			for _, g := range goods {
				st := find(sh.Calc, g.name)
				if st == nil {
					continue
				}
				row := rowOf(page, st.Pos.Line)
				if !strings.Contains(row, g.html) {
					t.Errorf("%s: page row L%d lacks %s:\n%s", g.name, st.Pos.Line, g.html, clip(row))
				}
				if st.Kind == engine.Check && !strings.Contains(row, `<span class="stamp">holds</span>`) {
					t.Errorf("%s: page row L%d has no holds stamp", g.name, st.Pos.Line)
				}
			}
			if c.html != "" && !strings.Contains(page, c.html) {
				t.Errorf("page lacks %q", c.html)
			}
			data, err := render.JSON(pkg, render.Options{Version: "test"})
			if err != nil {
				t.Fatalf("JSON: %v", err)
			}
			var doc render.JSONDoc
			if err := json.Unmarshal(data, &doc); err != nil {
				t.Fatalf("JSON does not decode: %v", err)
			}
			for _, w := range c.want {
				found := false
				for _, d := range doc.Diags {
					found = found || d.Pos.String() == w.pos && strings.Contains(d.Message, w.msg)
				}
				for _, s := range doc.Sheets {
					for _, st := range s.Statements {
						found = found || st.Error != nil && st.Error.Pos.String() == w.pos && strings.Contains(st.Error.Message, w.msg)
					}
				}
				if !found {
					t.Errorf("JSON lacks the diagnostic at %s with %q", w.pos, w.msg)
				}
			}
		})
	}
}

func hasDiag(all diag.List, w wantDiag) bool {
	for _, d := range all {
		if d.Pos.String() == w.pos && strings.Contains(d.Message, w.msg) && strings.Contains(d.Hint, w.hint) &&
			(d.Severity == diag.Warning) == w.warn {
			return true
		}
	}
	return false
}

func list(l diag.List) string {
	var b strings.Builder
	for _, d := range l {
		b.WriteString("\t" + clip(d.Error()) + "\n")
	}
	return b.String()
}

func clip(s string) string {
	if len(s) > 300 {
		return s[:300] + "…"
	}
	return s
}

// find returns the definition of a name, or the check written as text.
func find(s *engine.Calc, name string) *engine.Statement {
	for _, st := range s.Statements {
		if st.Kind == engine.Definition && st.Name == name && s.Result(st).Status != engine.Errored {
			return st
		}
		if st.Kind == engine.Check && st.Text == name {
			return st
		}
	}
	for _, st := range s.Statements {
		if st.Name == name {
			return st
		}
	}
	return nil
}

func pageFor(files []render.File, path string) string {
	for _, f := range files {
		if f.Path == path {
			return string(f.Data)
		}
	}
	return ""
}

// rowOf returns the part of a page from the row anchored at a line to the
// next anchored row.
func rowOf(page string, line int) string {
	id := ` id="L` + strconv.Itoa(line) + `"`
	i := strings.Index(page, id)
	if i < 0 {
		return ""
	}
	rest := page[i+len(id):]
	if j := strings.Index(rest, ` id="L`); j >= 0 {
		rest = rest[:j]
	}
	return rest
}
