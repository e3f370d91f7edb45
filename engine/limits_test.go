package engine_test

import (
	"fmt"
	"strings"
	"testing"
	"time"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
)

// quickly is the generous bound within which a limit must give its
// message, on a loaded machine too: without the limits these inputs ran
// for minutes or ran out of memory.
const quickly = 2 * time.Second

// compileTimed compiles and evaluates a sheet and fails the test when it
// takes longer than quickly.
func compileTimed(t *testing.T, src engine.SheetSource, opt engine.Options) *engine.Calc {
	t.Helper()
	start := time.Now()
	s := engine.CompileWith(src, opt)
	s.Evaluate()
	if d := time.Since(start); d > quickly {
		t.Fatalf("took %v; a limit must answer within %v", d, quickly)
	}
	return s
}

// block is a formula block of path whose first line is line 2.
func block(path string, lines ...string) engine.SourceBlock {
	b := engine.SourceBlock{Fence: diag.Pos{File: path, Line: 1, Col: 1}}
	for i, l := range lines {
		b.Lines = append(b.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: path, Line: i + 2, Col: 1}})
	}
	return b
}

// wantError asserts one error diagnostic at pos whose message holds msg.
func wantError(t *testing.T, s *engine.Calc, pos, msg string) {
	t.Helper()
	for _, d := range s.Diags {
		if d.Pos.String() == pos && strings.Contains(d.Message, msg) {
			return
		}
	}
	t.Fatalf("no error at %s saying %q; got %v", pos, msg, s.Diags)
}

// wantValue asserts that an independent statement still has its result.
func wantValue(t *testing.T, s *engine.Calc, name string, si float64) {
	t.Helper()
	r := s.Result(s.Lookup(name))
	if r.Status != engine.OK || r.Value != si {
		t.Fatalf("%s should be %v: %+v", name, si, r)
	}
}

// nestedSolves writes n solves, each inside the search of the next: x_1
// is found for every trial of x_2, and so on up to x_n.
func nestedSolves(n int) []string {
	lines := []string{"x_0 = 1"}
	for k := 1; k < n; k++ {
		b := 10 * (k + 1)
		lines = append(lines, fmt.Sprintf("x_%d = solve(x_%d + sin(x_%d) / 2 + exp(x_%d / 40) + x_%d / 100 == x_%d + 1, -%d, %d)", k, k, k, k, k+1, k-1, b, b))
	}
	lines = append(lines, fmt.Sprintf("x_%d = solve(x_%d == x_%d, -%d, %d)", n, n, n-1, 10*(n+1), 10*(n+1)))
	return append(lines, "y = 2 m")
}

// Twenty nested solves ran for minutes (about six times longer for every
// level); the work of one solve statement, nesting included, is bounded.
func TestNestedSolveWorkLimit(t *testing.T) {
	src := engine.SheetSource{Path: "r.md", Blocks: []engine.SourceBlock{block("r.md", nestedSolves(20)...)}}
	s := compileTimed(t, src, engine.Options{})
	// x_20 is the outermost search, on line 22; its formula starts at column 8.
	wantError(t, s, "r.md:22:8", fmt.Sprintf("solving for x_20 stopped at the limit of %d evaluations", engine.MaxSolveWork))
	wantError(t, s, "r.md:22:8", "20 solves nested one inside another")
	wantValue(t, s, "y", 2)
	wantValue(t, s, "x_0", 1)
}

// Four nested solves stay well inside the limit and agree with the
// relations they solve.
func TestNestedSolvesWithinLimit(t *testing.T) {
	s := compileLines(nestedSolves(4)...)
	if len(s.Diags) != 0 {
		t.Fatalf("unexpected diagnostics: %v", s.Diags)
	}
	x3, x4 := s.Result(s.Lookup("x_3")).Value, s.Result(s.Lookup("x_4")).Value
	if !near(x4, x3, 1e-9) {
		t.Fatalf("x_4 = %v should equal x_3 = %v", x4, x3)
	}
}

// A failure inside a nested solve names the unknown whose bounds to
// narrow (P, whose search met G undefined), not the outer one, and a pure
// number is written without a unit "1".
func TestNestedSolveMessage(t *testing.T) {
	s := compileLines(
		"P_want = 2",
		"I = solve(P == P_want, 0, 10)",
		"F = 3 * I",
		"G = sqrt(P - 1)",
		"P = solve(F == G * 5, 0, 10)",
		"z = 1000",
	)
	d := s.Result(s.Lookup("I")).Err
	if d == nil {
		t.Fatal("I should fail")
	}
	if d.Pos.String() != "r.md:3:5" {
		t.Errorf("at %s, want r.md:3:5", d.Pos)
	}
	const msg = "while solving for I, at I = 0, P could not be evaluated: while solving for P, at P = 0, G could not be evaluated: square root of a negative number"
	if d.Message != msg {
		t.Errorf("message\n %s\nwant\n %s", d.Message, msg)
	}
	if d.Hint != "narrow the bounds of P to where G can be evaluated" {
		t.Errorf("hint %q", d.Hint)
	}
	if strings.Contains(d.Message, " 1,") || strings.Contains(d.Message, "0 1") {
		t.Errorf("a pure number written with the unit 1: %s", d.Message)
	}
	wantValue(t, s, "z", 1000)
}

// Bounds that do not bracket a root are written without "1" for pure
// numbers, and the hint names the unknown.
func TestSolveBracketMessagePureNumbers(t *testing.T) {
	s := compileLines("x = solve(x^2 == -1000, 0, 1000)")
	d := s.Result(s.Lookup("x")).Err
	if d == nil {
		t.Fatal("x should fail")
	}
	const msg = "the bounds do not bracket a solution: the left side minus the right side is 1000 at x = 0 and 1.001e+06 at x = 1000, of the same sign"
	if d.Message != msg || !strings.Contains(d.Hint, "widen the bounds of x") {
		t.Errorf("got %q; hint %q", d.Message, d.Hint)
	}
}

// A flat sum or product of 2,400 terms is one level of nesting, not
// 2,400; it was refused as "nested too deeply".
func TestFlatSumIsNotNesting(t *testing.T) {
	s := compileLines(
		"a = 1 m",
		"s = "+strings.Repeat("a + ", 2399)+"a",
		"d = "+strings.Repeat("a - ", 2399)+"a",
		"p = "+strings.Repeat("1 * ", 2399)+"1",
		"q = "+strings.Repeat("2 / ", 2399)+"2",
	)
	if len(s.Diags) != 0 {
		t.Fatalf("unexpected diagnostics: %v", s.Diags)
	}
	wantValue(t, s, "a", 1)
	if v := s.Result(s.Lookup("s")).Value; v != 2400 {
		t.Errorf("s = %v", v)
	}
	if v := s.Result(s.Lookup("d")).Value; v != -2398 {
		t.Errorf("d = %v", v)
	}
}

// Real nesting is still limited: a power tower and nested calls are
// operations inside one another.
func TestDeepNestingStillRefused(t *testing.T) {
	s := compileLines(
		"a = 1",
		"t = "+strings.Repeat("a ^ ", 500)+"a",
		"u = "+strings.Repeat("-", 500)+"a",
	)
	wantError(t, s, "r.md:3:1605", "formula nested too deeply") // the 401st power
	wantError(t, s, "r.md:4:405", "formula nested too deeply")
	wantValue(t, s, "a", 1)
}

// templates is a resolver over template sources keyed by their path.
func templates(srcs map[string]engine.SheetSource) engine.Resolver {
	return func(ref, from string) (engine.SheetSource, string, error) {
		src, ok := srcs[ref]
		if !ok {
			return engine.SheetSource{}, "", fmt.Errorf("no sheet %s", ref)
		}
		return src, ref, nil
	}
}

// doubling writes templates t0 … t<levels>, each of which uses the next
// twice; the last holds one statement.
func doubling(levels int) map[string]engine.SheetSource {
	srcs := map[string]engine.SheetSource{}
	for k := 0; k <= levels; k++ {
		name := fmt.Sprintf("t%d", k)
		lines := []string{"v = 1"}
		if k < levels {
			next := fmt.Sprintf("t%d", k+1)
			lines = append(lines, "use a = "+next, "use b = "+next)
		}
		srcs[name] = engine.SheetSource{Path: name + ".md", Blocks: []engine.SourceBlock{block(name+".md", lines...)}}
	}
	return srcs
}

// usingSheet is a sheet with an independent input, a use of t0 on line 3
// and another independent input.
func usingSheet() engine.SheetSource {
	return engine.SheetSource{Path: "s.md", Blocks: []engine.SourceBlock{block("s.md", "l = 2 m", "use top = t0", "k = 3")}}
}

// Templates that each use the next twice, 30 levels deep, grew to
// gigabytes: the nesting is refused at the using sheet's use statement.
func TestTemplateDepthLimit(t *testing.T) {
	s := compileTimed(t, usingSheet(), engine.Options{Resolve: templates(doubling(30))})
	wantError(t, s, "s.md:3:11", fmt.Sprintf("templates nested more than %d deep: t0 → t1 → t2", engine.MaxTemplateDepth))
	if len(s.Diags) != 1 {
		t.Errorf("want one error, got %d: %v", len(s.Diags), s.Diags[:min(3, len(s.Diags))])
	}
	wantValue(t, s, "l", 2)
	wantValue(t, s, "k", 3)
}

// Twelve doubling levels stay within the depth limit but make 8,190
// instances: refused at the use statement, whole.
func TestTemplateInstanceLimit(t *testing.T) {
	s := compileTimed(t, usingSheet(), engine.Options{Resolve: templates(doubling(12))})
	wantError(t, s, "s.md:3:11", fmt.Sprintf("the templates expand to more than %d instances", engine.MaxInstances))
	if len(s.Diags) != 1 || len(s.Statements) != 3 {
		t.Errorf("want one error and the three statements of the sheet, got %v and %d statements", s.Diags, len(s.Statements))
	}
	wantValue(t, s, "l", 2)
	wantValue(t, s, "k", 3)
	// Eight levels (510 instances) are fine.
	s = compileTimed(t, usingSheet(), engine.Options{Resolve: templates(doubling(8))})
	if len(s.Diags) != 0 || s.Lookup("top.a.b.a.v") == nil {
		t.Fatalf("eight levels: %v", s.Diags)
	}
}

// A few instances of a large template pass the statement limit.
func TestTemplateStatementLimit(t *testing.T) {
	lines := make([]string, 1000)
	for i := range lines {
		lines[i] = fmt.Sprintf("v_%d = %d", i, i)
	}
	big := engine.SheetSource{Path: "big.md", Blocks: []engine.SourceBlock{block("big.md", lines...)}}
	var uses []string
	n := engine.MaxStatements/1000 + 1
	for i := range n {
		uses = append(uses, fmt.Sprintf("use u_%d = big", i))
	}
	uses = append(uses, "k = 3")
	src := engine.SheetSource{Path: "s.md", Blocks: []engine.SourceBlock{block("s.md", uses...)}}
	s := compileTimed(t, src, engine.Options{Resolve: templates(map[string]engine.SheetSource{"big": big})})
	// The sheet's own n+1 statements count too; u_i is on line i+2.
	i, total := 0, n+1+1000
	for ; total <= engine.MaxStatements; total += 1000 {
		i++
	}
	wantError(t, s, fmt.Sprintf("s.md:%d:%d", i+2, len(fmt.Sprintf("use u_%d = ", i))+1), fmt.Sprintf("the templates expand to more than %d statements", engine.MaxStatements))
	wantValue(t, s, "k", 3)
	wantValue(t, s, "u_0.v_7", 7)
}

// A sheet of its own statements past the limit keeps those before it.
func TestSheetStatementLimit(t *testing.T) {
	lines := make([]string, engine.MaxStatements+5)
	for i := range lines {
		lines[i] = fmt.Sprintf("v_%d = %d", i, i)
	}
	s := compileTimed(t, engine.SheetSource{Path: "s.md", Blocks: []engine.SourceBlock{block("s.md", lines...)}}, engine.Options{})
	wantError(t, s, fmt.Sprintf("s.md:%d:1", engine.MaxStatements+2), fmt.Sprintf("the sheet has more than %d statements", engine.MaxStatements))
	if len(s.Statements) != engine.MaxStatements {
		t.Errorf("%d statements compiled", len(s.Statements))
	}
	wantValue(t, s, "v_0", 0)
}

// A table of more rows than the limit is an error at its caption; the
// statements that do not read it keep their results.
func TestTableRowLimit(t *testing.T) {
	ts := engine.TableSource{Name: "BH", Pos: diag.Pos{File: "s.md", Line: 3, Col: 1},
		Header: []engine.CellSource{{Text: "H [A/m]"}, {Text: "B [T]"}}}
	for i := range engine.MaxTableRows + 1 {
		ts.Rows = append(ts.Rows, []engine.CellSource{{Text: fmt.Sprint(i)}, {Text: fmt.Sprint(float64(i) / 1e4)}})
	}
	src := engine.SheetSource{Path: "s.md", Tables: []engine.TableSource{ts},
		Blocks: []engine.SourceBlock{block("s.md", "B = interp(BH.B, BH.H, 5 A/m)", "k = 3")}}
	s := compileTimed(t, src, engine.Options{})
	wantError(t, s, "s.md:3:1", fmt.Sprintf("table BH has more than %d rows", engine.MaxTableRows))
	wantValue(t, s, "k", 3)
	ts.Rows = ts.Rows[:engine.MaxTableRows]
	s = compileTimed(t, src2(src, ts), engine.Options{})
	if b := s.Result(s.Lookup("B")); b.Status != engine.OK || !near(b.Value, 5e-4, 1e-12) {
		t.Fatalf("a table of %d rows: %v", engine.MaxTableRows, s.Diags)
	}
}

func src2(src engine.SheetSource, ts engine.TableSource) engine.SheetSource {
	src.Tables = []engine.TableSource{ts}
	return src
}

// lines writes n statements with f(i) and an independent k = 3 last.
func lines(n int, f func(i int) string) []string {
	out := make([]string, 0, n+1)
	for i := range n {
		out = append(out, f(i))
	}
	return append(out, "k = 3")
}

// A sheet of thousands of unknown names looked for a close name to each
// among all the others: 15 s for 5,000. The first few get a suggestion.
func TestManyUnknownNamesQuick(t *testing.T) {
	src := engine.SheetSource{Path: "r.md", Blocks: []engine.SourceBlock{block("r.md", lines(5000, func(i int) string {
		return fmt.Sprintf("x_%d = y_%d", i, i)
	})...)}}
	s := compileTimed(t, src, engine.Options{})
	wantError(t, s, "r.md:2:7", "unknown name y_0")
	if h := s.Result(s.Lookup("x_0")).Err.Hint; !strings.Contains(h, "did you mean") {
		t.Errorf("the first unknown name gets no suggestion: %q", h)
	}
	wantValue(t, s, "k", 3)
}

// Every member of a long cycle listed every other: 20,000 members took
// minutes and gigabytes. The message lists the first few and the count.
func TestLongCycleQuick(t *testing.T) {
	n := engine.MaxStatements - 1
	src := engine.SheetSource{Path: "r.md", Blocks: []engine.SourceBlock{block("r.md", lines(n, func(i int) string {
		return fmt.Sprintf("a_%d = a_%d + 1 m", i, (i+n-1)%n)
	})...)}}
	s := compileTimed(t, src, engine.Options{})
	wantError(t, s, "r.md:2:1", fmt.Sprintf("a_0 is defined in terms of itself: a_0 → a_%d → a_%d", n-1, n-2))
	wantError(t, s, "r.md:2:1", fmt.Sprintf("… (%d statements in all) → a_0", n))
	wantValue(t, s, "k", 3)
}

// Past MaxSolves, solve statements are refused at their formula; the
// ones before keep their results, and so do statements that use none.
func TestSolveCountLimit(t *testing.T) {
	src := engine.SheetSource{Path: "r.md", Blocks: []engine.SourceBlock{block("r.md", append([]string{"x_0 = 1"}, lines(engine.MaxSolves+50, func(i int) string {
		return fmt.Sprintf("x_%d = solve(x_%d^2 == x_%d + 1, 0, 100)", i+1, i+1, i)
	})...)...)}}
	s := compileTimed(t, src, engine.Options{})
	n := engine.MaxSolves + 1
	wantError(t, s, fmt.Sprintf("r.md:%d:%d", n+2, len(fmt.Sprintf("x_%d = ", n))+1), fmt.Sprintf("the sheet has more than %d solve statements", engine.MaxSolves))
	if x := s.Result(s.Lookup("x_1")); x.Status != engine.OK || !near(x.Value*x.Value, 2, 1e-9) {
		t.Fatalf("x_1: %+v", x)
	}
	wantValue(t, s, "k", 3)
}
