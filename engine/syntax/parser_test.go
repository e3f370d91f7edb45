package syntax

import (
	"fmt"
	"strings"
	"testing"
	"unicode/utf8"
)

// sexp writes a tree as nested parentheses, with each node's span, so that
// a test states shape and positions at once.
func sexp(n Node) string {
	switch n := n.(type) {
	case *Number:
		return n.Text
	case *Quantity:
		return "[" + n.Text + " " + n.UnitText + "]"
	case *Name:
		return n.Name
	case *Unary:
		return "(" + n.Op + " " + sexp(n.X) + ")"
	case *Binary:
		return "(" + n.Op + " " + sexp(n.X) + " " + sexp(n.Y) + ")"
	case *Call:
		var args []string
		for _, a := range n.Args {
			args = append(args, sexp(a))
		}
		return n.Name + "(" + strings.Join(args, ", ") + ")"
	case *List:
		var elems []string
		for _, e := range n.Elems {
			elems = append(elems, sexp(e))
		}
		return "{" + strings.Join(elems, " ") + "}"
	case *Range:
		s := "(.. " + sexp(n.From) + " " + sexp(n.To)
		if n.Step != nil {
			s += " by " + sexp(n.Step)
		}
		return s + ")"
	case *Index:
		return "(@ " + sexp(n.X) + " " + sexp(n.I) + ")"
	case *Choice:
		return "(when " + sexp(n.Value) + " " + sexp(n.Cond) + " " + sexp(n.Other) + ")"
	}
	return "?"
}

func parse(s string) (Node, *Error) {
	r := []rune(s)
	return Parse(r, 0, len(r))
}

func TestParseShapes(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"1 + 2*3", "(+ 1 (* 2 3))"},
		{"1 - 2 - 3", "(- (- 1 2) 3)"},
		{"a / b / c", "(/ (/ a b) c)"},
		{"3 A + 4j A", "(+ [3 A] [4j A])"},
		{"0.5 + 2.5e-1j", "(+ 0.5 2.5e-1j)"},
		{"230 V ∠ -30 deg", "(∠ [230 V] (- [30 deg]))"},
		{"230 V /_ -30 deg", "(∠ [230 V] (- [30 deg]))"},
		{"a*b ∠ c*d + e", "(+ (∠ (* a b) (* c d)) e)"},
		{"x - a ∠ phi", "(- x (∠ a phi))"},
		{"-a ∠ b", "(∠ (- a) b)"},
		{"2^3^2", "(^ 2 (^ 3 2))"},
		{"-x^2", "(- (^ x 2))"},
		{"-x*y", "(* (- x) y)"},
		{"2^-1*3", "(* (^ 2 (- 1)) 3)"},
		{"x ** 2", "(^ x 2)"},
		{"0.92 T * 180 mm", "(* [0.92 T] [180 mm])"},
		{"2 π*n", "?"}, // the space makes π a unit: refused below
		{"2π*n", "(* (* 2 π) n)"},
		{"a ≤ b", "(<= a b)"},
		{"a·b × c − d", "(- (* (* a b) c) d)"},
		{"sqrt(a^2 + b^2)", "sqrt((+ (^ a 2) (^ b 2)))"},
		{"interp(BH.B, BH.H, H_c, extrapolate)", "interp(BH.B, BH.H, H_c, extrapolate)"},
		{"solve(a*x == b, 0 m, 1 m)", "solve((== (* a x) b), [0 m], [1 m])"},
		{"coil_a.lambda * 2", "(* coil_a.lambda 2)"},
		{"((a))", "a"},
		{"f()", "f()"},
		{"1 V + 2 V < 3 V", "(< (+ [1 V] [2 V]) [3 V])"},
		{"3_000 rpm", "[3_000 rpm]"},
		{"60 cm^2", "[60 cm^2]"},
		{"-25 degC + 10 K", "(+ (- [25 degC]) [10 K])"},
		// Lists, ranges and indexes.
		{"[1.2 mWb, 1.5 mWb, 1.9 mWb]", "{[1.2 mWb] [1.5 mWb] [1.9 mWb]}"},
		{"[1, 2] * 1 mWb", "(* {1 2} [1 mWb])"},
		{"[a + b, -c]", "{(+ a b) (- c)}"},
		{"sum([a, b])", "sum({a b})"},
		{"phi[3]", "(@ phi 3)"},
		{"phi[k + 1]^2", "(^ (@ phi (+ k 1)) 2)"},
		{"BH.B[1]", "(@ BH.B 1)"},
		{"(a * b)[2]", "(@ (* a b) 2)"},
		{"1..12", "(.. 1 12)"},
		{"1 .. N + 1", "(.. 1 (+ N 1))"},
		{"0 deg .. 90 deg by 15 deg", "(.. [0 deg] [90 deg] by [15 deg])"},
		{"0 .. 10 by 2", "(.. 0 10 by 2)"},
		{"[1 .. 3]", "{(.. 1 3)}"},
		{"2 * (1 .. 3)", "(* 2 (.. 1 3))"},
		// Conditional values.
		{"1 when B <= 1.5 T else 1.5 T / B", "(when 1 (<= B [1.5 T]) (/ [1.5 T] B))"},
		{"a when x < 1 else b when x < 2 else 3", "(when a (< x 1) (when b (< x 2) 3))"},
		{"2 * (a when x > 0 else -a)", "(* 2 (when a (> x 0) (- a)))"},
		{"max(0 when a < b else a - b, 1)", "max((when 0 (< a b) (- a b)), 1)"},
		{"2 * a when b < c else d", "(when (* 2 a) (< b c) d)"},
		{"5 when n > 2 else 6", "(when 5 (> n 2) 6)"},
	} {
		n, err := parse(c.in)
		if c.want == "?" {
			if err == nil {
				t.Errorf("%q parsed as %s, want an error", c.in, sexp(n))
			}
			continue
		}
		if err != nil {
			t.Errorf("%q: %v", c.in, err)
			continue
		}
		if got := sexp(n); got != c.want {
			t.Errorf("%q parsed as %s, want %s", c.in, got, c.want)
		}
	}
}

// Spans cover the text of the node; binary nodes point at their operator.
func TestParseSpans(t *testing.T) {
	in := "a + sqrt(b*c) - 2 m"
	n, err := parse(in)
	if err != nil {
		t.Fatal(err)
	}
	r := []rune(in)
	text := func(s Span) string { return string(r[s.Start:s.End]) }
	top := n.(*Binary)
	if text(top.Span()) != in || top.At() != 14 {
		t.Errorf("top spans %q and points at %d, want the whole formula and 14", text(top.Span()), top.At())
	}
	call := top.X.(*Binary).Y.(*Call)
	if text(call.Span()) != "sqrt(b*c)" || text(call.Args[0].Span()) != "b*c" {
		t.Errorf("call spans %q, argument %q", text(call.Span()), text(call.Args[0].Span()))
	}
	if q := top.Y.(*Quantity); text(q.Span()) != "2 m" || q.UnitAt != 18 {
		t.Errorf("quantity spans %q with its unit at %d", text(q.Span()), q.UnitAt)
	}
}

// Each error names what is wrong, where (the range of characters), and
// what to do.
func TestParseErrors(t *testing.T) {
	for _, c := range []struct {
		in, msg, hint string
		start, end    int
	}{
		{"a +", "formula ends too early", "after +", 2, 3},
		{"", "formula ends too early", "complete the formula", 0, 1},
		{"(a + b", "this ( is never closed", "add the missing )", 0, 1},
		{"a + b)", "this ) has no matching (", "remove it", 5, 6},
		{"a b", "unexpected b", "missing operator", 2, 3},
		{"a 2 V", "a quantity follows another term without an operator", "*", 2, 5},
		{"3 m s", "a unit symbol follows a quantity after a space", "3 m*s", 4, 5},
		{"1,5 V", "a comma inside a number", "1.5", 1, 2},
		{"2(a + b)", "a ( follows 2 without an operator", "2*(a + b)", 1, 2},
		{"a < b < c", "chains two", "its own check", 6, 7},
		{"a < b and b < c", "'and' is not supported", "its own check", 6, 9},
		{"a = b", "unexpected =", "", 2, 3},
		{"[1, 2", "this [ is never closed", "add the missing ]", 0, 1},
		{"1, 2]", "this ] has no matching [", "", 4, 5},
		{"[1, 2)", "this ) closes a [", "close the [ opened at column 1 with ] first", 5, 6},
		{"[]", "a list needs at least one element", "", 1, 2},
		{"phi[]", "an index is missing", "phi[1]", 4, 5},
		{"phi[1, 2]", "an index holds one number", "phi[2]", 5, 6},
		{"phi [2]", "a [ follows phi after a space", "phi[...]", 4, 5},
		{"1 .. 2 .. 3", "a range has one ..", "", 7, 9},
		{"a by 2", "by gives the step of a range", "from .. to by step", 2, 4},
		{"a when b < c", "a condition needs else and the value when it does not hold", "value when condition else other value", 12, 13},
		{"a else b", "else belongs to a conditional value", "", 2, 6},
		{"1 .. ", "formula ends too early", "", 2, 4},
		{"5 V ± 1 V", "belongs to an input's tolerance", "", 4, 5},
		{"10 V ∠ 30 deg ∠ 5 deg", "a phasor has one ∠", "magnitude ∠ angle", 14, 15},
		{"10 V ∠", "formula ends too early", "after ∠", 5, 6},
		{"4jx", `malformed number "4jx"`, "", 0, 3},
		{"4 j", `unknown unit "j"`, "", 2, 3},
		{"1.2.3", `malformed number "1.2.3"`, "", 0, 5},
		{"2x", `malformed number "2x"`, "2*x", 0, 2},
		{"1e", `malformed number "1e"`, "an exponent needs digits", 0, 2},
		{"2 kv", `unknown unit "kv"`, "did you mean 2 kV?", 2, 4},
		{"1e-400", "too small to hold", "", 0, 6},
		{"1e400", "out of range", "", 0, 5},
		{"_q0 + 1", "name _q0 starts with _", "letter", 0, 3},
		{`"abc"`, "text in quotes", "", 0, 1},
		{"x %", "% must follow a number", "", 2, 3},
		{"a & b", "& is not an operator sheaf knows", "", 2, 3},
		{"60 cm ^ 2", "a power after a space is ambiguous", "60 cm^…", 6, 7},
		{strings.Repeat("(", 101) + "1" + strings.Repeat(")", 101), "nested more than 100 deep", "", 100, 101},
		{strings.Repeat("-", 401) + "1", "nested too deeply", "", 400, 401},
	} {
		_, err := parse(c.in)
		if err == nil {
			t.Errorf("%q: no error, want %q", c.in, c.msg)
			continue
		}
		if !strings.Contains(err.Msg, c.msg) || !strings.Contains(err.Hint, c.hint) || err.Start != c.start || err.End != c.end {
			t.Errorf("%q: %q (hint %q) at %d..%d; want %q (hint with %q) at %d..%d",
				c.in, err.Msg, err.Hint, err.Start, err.End, c.msg, c.hint, c.start, c.end)
		}
	}
}

// A flat sum of many terms is not nesting: it parses without recursion.
func TestFlatSumIsNotNesting(t *testing.T) {
	in := "1" + strings.Repeat(" + 1", 2400)
	n, err := parse(in)
	if err != nil {
		t.Fatalf("a flat sum of 2,401 terms: %v", err)
	}
	depth := 0
	for b, ok := n.(*Binary); ok; b, ok = b.X.(*Binary) {
		depth++
	}
	if depth != 2400 {
		t.Errorf("%d additions, want 2400", depth)
	}
}

// FuzzParse checks that any text parses or gives an error whose range lies
// inside the formula, without panicking, and that a tree's spans nest.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"1 + 2*3", "-x^2", "sqrt(a, b)", "2π*n", "60 cm^2", "a < b < c", "(", ")", "1,5 V",
		"3 m s", "f(", "interp(T.y, T.x, 3 A, extrapolate)", "1..2", "±", "∠", "[", "\xff", "2(a)", "x ** -2",
		"[1.2 mWb, 1.5 mWb]", "phi[2]", "0 deg .. 90 deg by 15 deg", "[1, 2)", "a [1]", "sum(T.x[1 .. 3])", "[[1]][1][1]",
		"1 when B <= 1.5 T else 1.5 T / B", "a when b else", "(a when b < c else d)[1]",
		"3 A + 4j A", "4j", "230 V ∠ -30 deg", "230 V /_ -30 deg", "a*b ∠ c + d", "1 ∠ 2 ∠ 3", "2j π", "1e3j kV", "4jx", "/_"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if !utf8.ValidString(s) || len(s) > 2000 {
			return
		}
		r := []rune(s)
		n, err := Parse(r, 0, len(r))
		if err != nil {
			if err.Start < 0 || err.End > len(r)+1 || err.Start > err.End || err.Msg == "" {
				t.Fatalf("%q: error %q at %d..%d outside the formula", s, err.Msg, err.Start, err.End)
			}
			return
		}
		checkSpans(t, s, n, Span{0, len(r)})
	})
}

func checkSpans(t *testing.T, s string, n Node, outer Span) {
	sp := n.Span()
	if sp.Start < outer.Start || sp.End > outer.End || sp.Start > sp.End || n.At() < sp.Start || n.At() > sp.End {
		t.Fatalf("%q: %s spans %v, outside %v", s, fmt.Sprintf("%T", n), sp, outer)
	}
	switch n := n.(type) {
	case *Unary:
		checkSpans(t, s, n.X, sp)
	case *Binary:
		checkSpans(t, s, n.X, sp)
		checkSpans(t, s, n.Y, sp)
	case *Call:
		for _, a := range n.Args {
			checkSpans(t, s, a, sp)
		}
	case *List:
		for _, e := range n.Elems {
			checkSpans(t, s, e, sp)
		}
	case *Range:
		checkSpans(t, s, n.From, sp)
		checkSpans(t, s, n.To, sp)
		if n.Step != nil {
			checkSpans(t, s, n.Step, sp)
		}
	case *Index:
		checkSpans(t, s, n.X, sp)
		checkSpans(t, s, n.I, sp)
	case *Choice:
		checkSpans(t, s, n.Value, sp)
		checkSpans(t, s, n.Cond, sp)
		checkSpans(t, s, n.Other, sp)
	}
}

// A j right after the digits makes a number or a quantity imaginary; the
// value is the coefficient of j.
func TestImaginaryLiterals(t *testing.T) {
	for _, c := range []struct {
		in   string
		val  float64
		unit string
	}{{"4j", 4, ""}, {"4j A", 4, "A"}, {"1.5e3j V", 1500, "V"}, {"0.25j kV", 0.25, "kV"}} {
		n, err := parse(c.in)
		if err != nil {
			t.Fatalf("%q: %v", c.in, err)
		}
		switch n := n.(type) {
		case *Number:
			if !n.Imag || n.Value != c.val || c.unit != "" {
				t.Errorf("%q: number %+v", c.in, n)
			}
		case *Quantity:
			if !n.Imag || n.Value != c.val || n.UnitText != c.unit {
				t.Errorf("%q: quantity %+v", c.in, n)
			}
		default:
			t.Errorf("%q: %T", c.in, n)
		}
	}
	if n, _ := parse("4 A"); n.(*Quantity).Imag {
		t.Error("4 A read as imaginary")
	}
}
