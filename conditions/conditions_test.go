package conditions_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"gonum.org/v1/gonum/stat/distuv"
)

// compile makes a one-block sheet of lines, the first on line 2, and
// evaluates it.
func compile(t testing.TB, lines ...string) *engine.Calc {
	t.Helper()
	b := engine.SourceBlock{Fence: diag.Pos{File: "c.md", Line: 1, Col: 1}}
	for i, l := range lines {
		b.Lines = append(b.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: "c.md", Line: i + 2, Col: 1}})
	}
	calc := engine.Compile(engine.SheetSource{Path: "c.md", Blocks: []engine.SourceBlock{b}})
	calc.Evaluate()
	return calc
}

func mustClean(t *testing.T, calc *engine.Calc) {
	t.Helper()
	for _, d := range calc.Diags {
		t.Errorf("unexpected diagnostic %s", d.Error())
	}
}

func statement(t testing.TB, calc *engine.Calc, text string) *engine.Statement {
	t.Helper()
	if st := calc.Lookup(text); st != nil {
		return st
	}
	for _, st := range calc.Statements {
		if st.Text == text || st.Formula == text || st.Name == text && st.Kind != engine.Definition {
			return st
		}
	}
	t.Fatalf("no statement %q", text)
	return nil
}

func near(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Abs(want)
}

// The magnetic circuit of a gapped core is linear while the iron keeps
// one permeability: Φ = N·I/R with R = l_c/(μ0·μr·A) + g/(μ0·A), so a
// sweep of the current must give N·I/R at every point (the magnetic
// Ohm's law of any textbook of electrical machines, e.g. Hughes,
// Electrical and Electronic Technology, 10th ed., ch. 8).
func TestSweepOfLinearCircuitFollowsOhmsLaw(t *testing.T) {
	calc := compile(t,
		"N = 200",
		"I = 2 A",
		"l_c = 0.3 m",
		"A = 9 cm^2",
		"g = 1 mm",
		"mu_r = 1500",
		"R = l_c / (mu_0 * mu_r * A) + g / (mu_0 * A)",
		"Phi = N * I / R",
		"B = Phi / A",
		"B_max = 1.4 T",
		"check B <= B_max",
		"sweep mag: I over 0 A .. 10 A by 0.5 A show Phi, B",
	)
	mustClean(t, calc)
	r := conditions.Run(calc)
	if r == nil || len(r.Sweeps) != 1 {
		t.Fatalf("want one sweep, got %+v", r)
	}
	sw := r.Sweeps[0]
	if len(sw.X) != 21 || len(sw.Curves) != 2 {
		t.Fatalf("want 21 points and 2 curves, got %d and %d", len(sw.X), len(sw.Curves))
	}
	mu0 := 4e-7 * math.Pi * 1.00000000055 // CODATA 2018 μ0, as the units package holds it
	rel := 0.3/(mu0*1500*9e-4) + 1e-3/(mu0*9e-4)
	for i, x := range sw.X {
		want := 200 * x / rel
		if !near(sw.Curves[0].Y[i], want, 1e-6) {
			t.Errorf("point %d (I = %g A): Φ = %g Wb, want N·I/R = %g Wb", i, x, sw.Curves[0].Y[i], want)
		}
	}
	// B rises by 0.209 T per ampere and reaches 1.4 T near I = 6.7 A: the
	// seven points from 7 A up fail, and the worst is the last.
	g, ok := r.Governing(statement(t, calc, "B <= B_max"))
	if !ok || g.Result.Status != engine.Fail || g.Point != 20 {
		t.Fatalf("governing = %+v, want the sweep's last point, failing", g)
	}
	if g.Evaluated != 22 || len(g.Failing) != 1 || !strings.Contains(g.Failing[0], "7 of 21 points") {
		t.Errorf("evaluated %d, failing %v; want 22 conditions and the sweep's 7 failing points", g.Evaluated, g.Failing)
	}
}

// A check reports its worst case by name, and holds only if it holds in
// every case.
func TestCasesGovern(t *testing.T) {
	calc := compile(t,
		"U = 24 V",
		"R = 3 ohm",
		"I = U / R",
		"I_max = 9 A",
		"check I <= I_max",
		"case low: U = 20 V",
		"case high: U = 28 V, R = 2.9 ohm",
	)
	mustClean(t, calc)
	r := conditions.Run(calc)
	if len(r.Cases) != 2 {
		t.Fatalf("want 2 cases, got %d", len(r.Cases))
	}
	i := statement(t, calc, "I")
	if got := r.Cases[1].Results[i.Index].Value; !near(got, 28/2.9, 1e-12) {
		t.Errorf("I in case high = %g A, want %g A", got, 28/2.9)
	}
	g, ok := r.Governing(statement(t, calc, "I <= I_max"))
	if !ok || g.Where != "case high" || g.Result.Status != engine.Fail || g.Evaluated != 3 {
		t.Fatalf("governing = %+v, want case high, failing, of 3 conditions", g)
	}
	if !near(g.Result.Utilisation, 28/2.9/9, 1e-9) {
		t.Errorf("utilisation %g, want %g", g.Result.Utilisation, 28/2.9/9)
	}
	if len(g.Failing) != 1 || g.Failing[0] != "case high" {
		t.Errorf("fails in %q, want only case high", g.Failing)
	}
	// The sheet as written stays beside the governing case: 24 V / 3 Ω.
	if w := g.AsWritten; w.Status != engine.Pass || !near(w.Left, 8, 1e-12) || !near(w.Right, 9, 1e-12) {
		t.Errorf("as written = %v: %g A against %g A, want pass: 8 A against 9 A", w.Status, w.Left, w.Right)
	}
}

// A check that fails as written counts the sheet as written among the
// conditions it fails in.
func TestFailingAsWrittenIsNamed(t *testing.T) {
	calc := compile(t,
		"U = 30 V",
		"R = 3 ohm",
		"I = U / R",
		"I_max = 9 A",
		"check I <= I_max",
		"case low: U = 20 V",
	)
	mustClean(t, calc)
	g, ok := conditions.Run(calc).Governing(statement(t, calc, "I <= I_max"))
	if !ok || g.Where != "as written" || len(g.Failing) != 1 || g.Failing[0] != "as written" {
		t.Fatalf("governing = %+v, want as written, failing there only", g)
	}
}

// The Monte Carlo mean and standard deviation of a sum and a product of
// independent normal inputs against the analytic ones: for a sum, μx+μy
// and √(σx²+σy²); for a product, μxμy and √(μx²σy²+μy²σx²+σx²σy²)
// (Goodman, "On the exact variance of products", J. Am. Stat. Assoc. 55,
// 1960; from memory).
func TestMonteCarloMomentsOfSumAndProduct(t *testing.T) {
	calc := compile(t,
		"x = 10 V ± σ 1 V",
		"y = 20 V ± σ 2 V",
		"s = x + y",
		"k = 5 A ± σ 0.5 A",
		"p = x * k",
		"sample 100000 times, seed 11",
	)
	mustClean(t, calc)
	sp := conditions.Run(calc).Spread
	if sp == nil || sp.Samples != 100000 || sp.Seed != 11 {
		t.Fatalf("spread %+v", sp)
	}
	got := map[string]conditions.ResultSpread{}
	for _, r := range sp.Results {
		got[r.Stmt.Name] = r
	}
	sum, prod := got["s"], got["p"]
	if !near(sum.Mean, 30, 0.01) || !near(sum.SD, math.Sqrt(5), 0.01) {
		t.Errorf("sum: mean %g, SD %g; want 30 and %g within 1 %%", sum.Mean, sum.SD, math.Sqrt(5))
	}
	wantSD := math.Sqrt(100*0.25 + 25*1 + 1*0.25)
	if !near(prod.Mean, 50, 0.01) || !near(prod.SD, wantSD, 0.01) {
		t.Errorf("product: mean %g, SD %g; want 50 and %g within 1 %%", prod.Mean, prod.SD, wantSD)
	}
}

// The root-sum-square of a linear function's tolerances is
// √Σ(aᵢ·tᵢ)² exactly (the tolerance stack of any text on tolerancing,
// e.g. Fortini, Design and Tolerancing, 1967; common practice).
func TestRSSOfLinearFunction(t *testing.T) {
	calc := compile(t,
		"a = 12 mm ± 0.1 mm",
		"b = 30 mm ± 0.25 mm triangular",
		"c = 5 mm in 4.9 mm .. 5.2 mm",
		"d = 3 mm ± σ 0.02 mm",
		"gap = b - 2 * a - c + 0.5 * d",
		"gap_min = 0.2 mm",
		"check gap >= gap_min",
	)
	mustClean(t, calc)
	sp := conditions.Run(calc).Spread
	var gap conditions.ResultSpread
	for _, r := range sp.Results {
		if r.Stmt.Name == "gap" {
			gap = r
		}
	}
	// c's band is 0.3 mm wide: its half-width is 0.15 mm; d's tolerance
	// is 3σ.
	want := math.Sqrt(math.Pow(2*0.1e-3, 2) + math.Pow(0.25e-3, 2) + math.Pow(0.15e-3, 2) + math.Pow(0.5*0.06e-3, 2))
	if math.Abs(gap.RSS-want) > 1e-9*want {
		t.Errorf("RSS %.15g m, want %.15g m", gap.RSS, want)
	}
	chk := sp.Checks[0]
	if math.Abs(chk.RSS-want) > 1e-9*want {
		t.Errorf("check's RSS %.15g m, want %.15g m", chk.RSS, want)
	}
	if chk.Ranking[0].Input.Name != "b" || chk.Ranking[len(chk.Ranking)-1].Input.Name != "d" {
		t.Errorf("ranking starts %s and ends %s; want b first and d last", chk.Ranking[0].Input.Name, chk.Ranking[len(chk.Ranking)-1].Input.Name)
	}
}

// The worst case found by corners against a hand enumeration of the
// eight corners of three inputs.
func TestWorstCaseByCorners(t *testing.T) {
	calc := compile(t,
		"U = 230 V ± 10 %",
		"R = 40 ohm ± 5 %",
		"L = 0.1 H ± 0.01 H",
		"f = 50 Hz",
		"Z = sqrt(R^2 + (2 * pi * f * L)^2)",
		"I = U / Z",
		"I_max = 5.3 A",
		"check I <= I_max",
	)
	mustClean(t, calc)
	chk := conditions.Run(calc).Spread.Checks[0]
	worst := 0.0
	for _, u := range []float64{207, 253} {
		for _, r := range []float64{38, 42} {
			for _, l := range []float64{0.09, 0.11} {
				if i := u / math.Hypot(r, 2*math.Pi*50*l); i > worst {
					worst = i
				}
			}
		}
	}
	if chk.Method != "corners" || !near(chk.Worst.Left, worst, 1e-12) {
		t.Errorf("worst case %g A by %s, want %g A by corners", chk.Worst.Left, chk.Method, worst)
	}
	if chk.Worst.Status != engine.Fail {
		t.Errorf("at %g A against 5.3 A the worst corner must fail", worst)
	}
	if got := chk.WorstAt; !near(got[0], 253, 1e-12) || !near(got[1], 38, 1e-12) || !near(got[2], 0.09, 1e-12) {
		t.Errorf("worst corner at %v, want U high, R low, L low", got)
	}
}

// A value whose effect turns within its band is not bounded by its
// corners: the interior point is found.
func TestWorstCaseFindsInteriorTurn(t *testing.T) {
	calc := compile(t,
		"x = 1 ± 0.5",
		"y = (x - 1)^2",
		"check y <= 0.3",
		"check 0.05 <= y",
	)
	mustClean(t, calc)
	sp := conditions.Run(calc).Spread
	lower := sp.Checks[1]
	if lower.Method != "corners and interior points" || lower.Worst.Status != engine.Fail || math.Abs(lower.Worst.Right) > 1e-12 {
		t.Errorf("worst %+v by %s; want y = 0 at x = 1, failing, found as an interior point", lower.Worst, lower.Method)
	}
}

// The probability of failure of a check on one normal input against the
// normal CDF (gonum's distuv).
func TestProbabilityOfFailureAgainstNormalCDF(t *testing.T) {
	calc := compile(t,
		"V = 690 V ± σ 20 V",
		"V_max = 720 V",
		"check V <= V_max",
		"sample 200000 times, seed 3",
	)
	mustClean(t, calc)
	chk := conditions.Run(calc).Spread.Checks[0]
	want := 1 - distuv.Normal{Mu: 690, Sigma: 20}.CDF(720)
	if math.Abs(chk.Fail-want) > 0.005 {
		t.Errorf("P(fail) = %.4f, want %.4f within 0.5 percentage points", chk.Fail, want)
	}
	if !(chk.FailLo < want && want < chk.FailHi) {
		t.Errorf("the 95 %% interval %.4f–%.4f misses %.4f", chk.FailLo, chk.FailHi, want)
	}
}

// Same sources, same figures: the samples do not depend on the cores.
func TestSpreadIsDeterministic(t *testing.T) {
	lines := []string{"a = 1 m ± 1 %", "b = 2 m ± σ 0.01 m", "c = a * b", "check c <= 2.04 m^2", "sample 30000 times, seed 5"}
	one := conditions.Run(compile(t, lines...)).Spread
	two := conditions.Run(compile(t, lines...)).Spread
	if one.Checks[0].Fail != two.Checks[0].Fail || one.Results[0].Mean != two.Results[0].Mean || one.Results[0].SD != two.Results[0].SD {
		t.Errorf("two runs differ: %+v and %+v", one.Checks[0], two.Checks[0])
	}
}

// Bad conditions are located errors, and leave the rest of the sheet
// alone.
func TestBadConditions(t *testing.T) {
	cases := []struct {
		line, want string
		at         string // the error's column is where this starts in line
	}{
		{"case hot: Z = 3 ohm", "Z is a result, not an input", "Z ="},
		{"case hot: Q = 3 ohm", "unknown name Q", "Q ="},
		{"case hot: R = 3 V", "R is resistance (Ω), but this value is voltage (V)", "3 V"},
		{"sweep s: Z over 1 ohm .. 2 ohm by 0.1 ohm", "Z is a result, not an input", "Z over"},
		{"sweep s: R over 1 ohm .. 1 ohm by 0.1 ohm", "the sweep has 1 point; a sweep needs two or more", "1 ohm .."},
		{"sweep s: R over 1 ohm .. 2 ohm by 0.1 ohm in cold", "cold is not a case of the sheet", "cold"},
		{"sweep s: U over 1 V .. 2 V by 0.1 V show Z", "Z does not depend on U", "Z"},
		{"sweep s: R over 1 ohm .. 2 ohm by 0.1 ohm show U", "U is not a single result that a sweep can gather", "U"},
		{"W = 2 * R ± 0.1 ohm", "a tolerance on a computed value", "±"},
		{"W = 3 ohm ± σ -0.1 ohm", "a normal distribution needs σ above zero", "-0.1"},
		{"W = 3 ohm ± 0.1 V", "the tolerance is voltage (V), but W is resistance (Ω)", "0.1 V"},
		{"sample 2000000 times", "2000000 samples are more than the limit of 1000000", "2000000"},
	}
	for _, c := range cases {
		calc := compile(t, "U = 24 V", "R = 3 ohm", "Z = R * 2", "I = U / R", c.line)
		var found *diag.Diagnostic
		for i := range calc.Diags {
			if calc.Diags[i].Pos.Line == 6 {
				found = &calc.Diags[i]
			}
		}
		if found == nil {
			t.Errorf("%s: no error on line 6; diags %v", c.line, calc.Diags)
			continue
		}
		col := len([]rune(c.line[:strings.LastIndex(c.line, c.at)])) + 1
		if !strings.Contains(found.Message, c.want) || found.Pos.Col != col || found.Hint == "" {
			t.Errorf("%s: got %d:%d %s (hint %q); want column %d and %q", c.line, found.Pos.Line, found.Pos.Col, found.Message, found.Hint, col, c.want)
		}
		if r := calc.Result(calc.Lookup("I")); r.Status != engine.OK {
			t.Errorf("%s: I = U/R is independent of the bad line but came out %v", c.line, r.Status)
		}
	}
}

// A sweep point and a Monte Carlo sample allocate nothing: the
// allocations of a run do not grow with its points or samples.
func TestNoAllocationPerPoint(t *testing.T) {
	allocs := func(lines ...string) float64 {
		calc := compile(t, lines...)
		mustClean(t, calc)
		return testing.AllocsPerRun(3, func() { conditions.Run(calc) })
	}
	base := []string{"U = 24 V", "R = 3 ohm", "I = U / R", "P = U * I", "check P <= 300 W"}
	few := allocs(append(base, "sweep s: U over 1 V .. 100 V by 1 V show I, P")...)
	many := allocs(append(base, "sweep s: U over 1 V .. 10000 V by 1 V show I, P")...)
	// The curves' and checks' slices grow with the points; nothing else
	// may.
	if many-few > 8 {
		t.Errorf("a sweep of 10000 points allocates %.0f times, one of 100 points %.0f: a point allocates", many, few)
	}
	tol := []string{"U = 24 V ± 5 %", "R = 3 ohm ± σ 0.05 ohm", "I = U / R", "P = U * I", "check P <= 220 W"}
	small := allocs(append(tol, "sample 4096 times")...)
	large := allocs(append(tol, "sample 40960 times")...)
	// Each chunk of 4096 samples has its stream and tallies: ten chunks
	// may allocate a few dozen times more, not once per sample.
	if large-small > 200 {
		t.Errorf("40960 samples allocate %.0f times, 4096 samples %.0f: a sample allocates", large, small)
	}
}

// FuzzConditions compiles a sheet with cases, sweeps and tolerances from
// the fuzz string and runs it over them: whatever the input, nothing
// panics, and every governing condition is one the sheet declares.
func FuzzConditions(f *testing.F) {
	for _, seed := range []string{
		"U = 24 V ± 5 %\nR = 3 ohm in 2.9 ohm .. 3.2 ohm\nI = U / R\ncheck I <= 9 A\ncase low: U = 20 V\ncase high: U = 28 V, R = 2.9 ohm\nsweep s: U over 18 V .. 30 V by 1 V show I\nsample 500 times, seed 4",
		"x = 1 ± 0.5 triangular\ny = (x - 1)^2\ncheck y <= 0.3\ncheck 0.05 <= y\nz = 2 ± σ 0.1\nw = x * z\nsample 100 times",
		"a = 1 m ± σ -1 m\nb = a in 2 m .. 1 m\ncase c: a = 1 s\nsweep d: b over 1 m .. 1 m by 1 m\nsweep e: a over [1 m, 2 m] in nope show b\nsample 0 times",
		"t = 40 degC ± 5 K\nu = t + 10 K\ncheck u <= 60 degC\ncase hot: t = 50 degC\nsweep w: t over 20 degC .. 60 degC by 10 K show u",
	} {
		f.Add(seed)
	}
	f.Fuzz(func(t *testing.T, src string) {
		lines := strings.Split(src, "\n")
		if len(lines) > 40 || strings.Contains(src, "sample") && strings.ContainsAny(src, "0123456789") && len(src) > 400 {
			return // keep each run short: the limits are tested on their own
		}
		calc := compile(t, lines...)
		r := conditions.Run(calc)
		for _, st := range calc.Statements {
			g, ok := r.Governing(st)
			if !ok {
				continue
			}
			if g.Case == nil && g.Sweep == nil && g.Where != "as written" {
				t.Fatalf("governing condition %q is neither as written, a case nor a sweep", g.Where)
			}
		}
	})
}

// A curve draws results against an input and governs no check: the
// checks keep their verdict as written, and its points name none.
func TestCurveGovernsNoCheck(t *testing.T) {
	calc := compile(t,
		"I = 2 A", "R = 5 ohm", "U = I * R", "U_max = 30 V", "check U <= U_max",
		"curve vi: I over 0 A .. 10 A by 1 A show U",
	)
	mustClean(t, calc)
	r := conditions.Run(calc)
	if _, ok := r.Governing(statement(t, calc, "U <= U_max")); ok {
		t.Error("a curve governs a check")
	}
	if c := r.Sweeps[0].Checks; len(c) != 0 {
		t.Errorf("curve's checks %+v, want none: a curve says nothing about them", c)
	}
	if y := r.Sweeps[0].Curves[0].Y; y[10] != 50 {
		t.Errorf("U at 10 A = %g V, want 50 V", y[10])
	}
	if st := statement(t, calc, "U <= U_max"); calc.Result(st).Status != engine.Pass {
		t.Errorf("the check as written must hold")
	}
}

// A template's cases set its instance's inputs, so every sheet that uses
// the template shares them: a package-wide set of supply cases.
func TestCasesFromATemplate(t *testing.T) {
	b := engine.SourceBlock{Fence: diag.Pos{File: "a.md", Line: 1, Col: 1}}
	for i, l := range []string{"use dc = _templates/supply", "R = 11 ohm", "I = dc.U / R", "I_max = 21 A", "check I <= I_max"} {
		b.Lines = append(b.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: "a.md", Line: i + 2, Col: 1}})
	}
	tb := engine.SourceBlock{Fence: diag.Pos{File: "_templates/supply.md", Line: 4, Col: 1}}
	for i, l := range []string{"U = 220 V ; supply ; source: spec", "case low-battery: U = 187 V", "case boost: U = 242 V"} {
		tb.Lines = append(tb.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: "_templates/supply.md", Line: i + 5, Col: 1}})
	}
	resolve := func(name, from string) (engine.SheetSource, string, error) {
		return engine.SheetSource{Path: "_templates/supply.md", Blocks: []engine.SourceBlock{tb}}, "_templates/supply.md", nil
	}
	calc := engine.CompileWith(engine.SheetSource{Path: "a.md", Blocks: []engine.SourceBlock{b}}, engine.Options{Resolve: resolve})
	calc.Evaluate()
	mustClean(t, calc)
	r := conditions.Run(calc)
	if len(r.Cases) != 2 || r.Cases[1].Stmt.Name != "dc.boost" {
		t.Fatalf("cases %+v, want the template's two, named for the instance", r.Cases)
	}
	g, ok := r.Governing(statement(t, calc, "I <= I_max"))
	if !ok || g.Where != "case dc.boost" || g.Result.Status != engine.Fail {
		t.Fatalf("governing %+v, want case dc.boost failing (242 V / 11 Ω = 22 A)", g)
	}
}

// The limits of one sheet's conditions: toleranced inputs, and the work
// of its sweeps and samples, each a located error that leaves the rest.
func TestConditionLimits(t *testing.T) {
	var lines []string
	for i := range engine.MaxTolerances + 1 {
		lines = append(lines, fmt.Sprintf("x_%d = 1 m ± 1 mm", i))
	}
	calc := compile(t, lines...)
	if len(calc.Diags) != 1 || calc.Diags[0].Pos.Line != engine.MaxTolerances+2 || !strings.Contains(calc.Diags[0].Message, "more than 64 toleranced inputs") {
		t.Errorf("want one error at the 65th tolerance, got %v", calc.Diags)
	}
	// 2,000 statements swept over 100,000 points twice and more: past
	// 500 million evaluations.
	lines = []string{"a = 1 m"}
	for i := range 2000 {
		lines = append(lines, fmt.Sprintf("b_%d = a * %d", i, i+2))
	}
	lines = append(lines, "sweep s1: a over 1 m .. 100000 m by 1 m", "sweep s2: a over 1 m .. 100000 m by 1 m", "sweep s3: a over 1 m .. 100000 m by 1 m", "sample 300000 times")
	calc = compile(t, lines...)
	var msgs []string
	for _, d := range calc.Diags {
		msgs = append(msgs, fmt.Sprintf("%d: %s", d.Pos.Line, d.Message))
	}
	if len(msgs) != 2 || !strings.Contains(msgs[0], "sweeps evaluate more than 500000000") || !strings.Contains(msgs[1], "300000 samples of 2005 statements") {
		t.Errorf("want the third sweep and the sample count refused, got %v", msgs)
	}
	if r := calc.Result(calc.Lookup("b_7")); r.Status != engine.OK {
		t.Errorf("b_7 is independent of the limits but came out %v", r.Status)
	}
}

// A sweep of an absolute temperature runs from one temperature to the
// other by a difference in K, and a winding's hot spot follows the
// ambient one for one (a temperature rise over the ambient, common
// practice).
func TestSweepOfTemperature(t *testing.T) {
	calc := compile(t, "T_a = 40 degC", "dT = 80 K", "T_h = T_a + dT", "check T_h <= 130 degC",
		"sweep amb: T_a over 20 degC .. 60 degC by 5 K show T_h")
	mustClean(t, calc)
	r := conditions.Run(calc)
	sw := r.Sweeps[0]
	if len(sw.X) != 9 || math.Abs(sw.X[0]-293.15) > 1e-9 || math.Abs(sw.X[8]-333.15) > 1e-9 {
		t.Fatalf("points %v K, want 293.15 K to 333.15 K by 5 K", sw.X)
	}
	if math.Abs(sw.Curves[0].Y[8]-(333.15+80)) > 1e-9 {
		t.Errorf("T_h at 60 °C = %g K, want %g K", sw.Curves[0].Y[8], 333.15+80)
	}
	g, _ := r.Governing(statement(t, calc, "T_h <= 130 degC"))
	if g.Result.Status != engine.Fail || g.Point != 8 {
		t.Errorf("governing %+v, want the 60 °C point failing (140 °C against 130 °C)", g)
	}
	bad := compile(t, "T_a = 40 degC", "sweep amb: T_a over 20 degC .. 60 degC by 5 degC")
	if len(bad.Diags) != 1 || !strings.Contains(bad.Diags[0].Message, "a difference in K") {
		t.Errorf("a step written as a temperature: %v", bad.Diags)
	}
}

// A case, a sweep or a tolerance written in another kind than its input
// is refused where it is written, whatever the SI numbers: 157 rad/s is
// not 1500 rpm, and a forgotten 2π would pass silently otherwise.
func TestConditionsKeepTheInputsKind(t *testing.T) {
	for _, line := range []string{
		"case c: n = 157 rad/s",
		"sweep s: n over 100 rad/s .. 200 rad/s by 10 rad/s show omega",
		"m = 1500 rpm ± 10 rad/s",
		"w = 100 rad/s in 90 rpm .. 110 rad/s",
	} {
		calc := compile(t, "n = 1500 rpm", "omega [rad/s] = 2 * pi * n", line)
		if len(calc.Diags) != 1 || calc.Diags[0].Pos.Line != 4 || !strings.Contains(calc.Diags[0].Message, "angle-based quantity (rad) and a cycle-based one") {
			t.Errorf("%s: %v, want one error on line 4 naming the rad and the cycle", line, calc.Diags)
		}
	}
	ok := compile(t, "n = 1500 rpm", "omega [rad/s] = 2 * pi * n", "case c: n = 25 Hz", "sweep s: n over 600 rpm .. 1800 rpm by 100 rpm show omega", "m = 1500 rpm ± 1 Hz")
	mustClean(t, ok)
}

// A sweep run in a case that has an error is an error of its own, and a
// sweep may name a case written after it (a fuzzed sheet once ran a
// sweep in a broken case and crashed).
func TestSweepInABrokenOrLaterCase(t *testing.T) {
	calc := compile(t, "U = 24 V", "R = 3 ohm", "I = U / R",
		"sweep s: U over 18 V .. 30 V by 1 V in high show I", "case high: U = 28 V, R = 2 V")
	var msgs []string
	for _, d := range calc.Diags {
		msgs = append(msgs, d.Error())
	}
	if len(msgs) != 2 || !strings.Contains(msgs[0], "case high has an error") || !strings.Contains(msgs[1], "R is resistance") {
		t.Fatalf("diags %v, want the sweep's error naming the broken case, and the case's", msgs)
	}
	conditions.Run(calc) // and no panic
	ok := compile(t, "U = 24 V", "R = 3 ohm", "I = U / R",
		"sweep s: U over 18 V .. 30 V by 1 V in high show I", "case high: R = 2.9 ohm")
	mustClean(t, ok)
	if sw := conditions.Run(ok).Sweeps[0]; math.Abs(sw.Curves[0].Y[0]-18/2.9) > 1e-12 {
		t.Errorf("I at 18 V in case high = %g A, want %g A", sw.Curves[0].Y[0], 18/2.9)
	}
}
