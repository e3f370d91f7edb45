package engine_test

import (
	"math"
	"strings"
	"sync"
	"testing"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/internal/benchdata"
)

// A magnetic circuit with an air gap and an independent branch, as one
// Program run many times with other inputs. Closed form: Φ = N·I/R with
// R = g/(μ₀·A) (any magnetics text; common practice).
var circuit = []string{
	"g = 2 mm",
	"A = 0.01 m^2",
	"N = 200",
	"I = 5 A",
	"R [kA/Wb] = g/(mu_0*A)",
	"Phi [mWb] = N*I/R",
	"B = Phi/A",
	"check B <= 1.6 T",
	"m = 3 kg",
	"W [N] = m*9.81 m/s^2",
}

func program(t *testing.T, lines ...string) (*engine.Calc, *engine.Program) {
	t.Helper()
	s := compileLines(lines...)
	for _, d := range s.Diags {
		t.Fatalf("unexpected diagnostic: %s", d.Error())
	}
	return s, s.Program()
}

func slot(t *testing.T, p *engine.Program, name string) int {
	t.Helper()
	i, ok := p.Input(name)
	if !ok {
		t.Fatalf("%s is not an input", name)
	}
	return i
}

func TestRunWithOverridesReevaluatesOnlyDependents(t *testing.T) {
	s, p := program(t, circuit...)
	f := p.NewFrame()
	p.Run(f, nil)
	phi := s.Lookup("Phi").Index
	want := func(i, g float64) float64 { return 200 * i / (g / (4e-7 * math.Pi * 0.01)) }
	if !near(f.Values[phi], want(5, 2e-3), 1e-6) {
		t.Fatalf("Φ = %g, want %g", f.Values[phi], want(5, 2e-3))
	}
	all := f.Evals()
	if all != len(circuit) {
		t.Errorf("first run evaluated %d statements, want %d", all, len(circuit))
	}
	// A new current moves Φ, B and the check, and nothing else.
	p.Run(f, []engine.Set{{Slot: slot(t, p, "I"), SI: 15}})
	if got := f.Evals() - all; got != 3 {
		t.Errorf("a new current re-evaluated %d statements, want 3 (Φ, B, the check)", got)
	}
	if !near(f.Values[phi], want(15, 2e-3), 1e-6) {
		t.Errorf("Φ = %g after I = 15 A, want %g", f.Values[phi], want(15, 2e-3))
	}
	check := s.Statements[7].Index
	if f.Status[check] != engine.Fail {
		t.Errorf("B = %g T: the check is %s, want fail", f.Values[s.Lookup("B").Index], f.Status[check])
	}
	// Inputs set once stay set: a new gap keeps the new current.
	p.Run(f, []engine.Set{{Slot: slot(t, p, "g"), SI: 4e-3}})
	if !near(f.Values[phi], want(15, 4e-3), 1e-6) || f.Status[check] != engine.Pass {
		t.Errorf("Φ = %g, check %s; want %g and pass", f.Values[phi], f.Status[check], want(15, 4e-3))
	}
	// The sheet's own results are those of the base run.
	s.Evaluate()
	if r := s.Result(s.Lookup("Phi")); !near(r.Value, want(5, 2e-3), 1e-6) {
		t.Errorf("the sheet shows Φ = %g, want the base case %g", r.Value, want(5, 2e-3))
	}
}

// A zero gap divides by zero: Φ fails, what uses it is blocked, the
// independent branch keeps its value; a sound gap brings all back.
func TestRunFailsAndRecovers(t *testing.T) {
	s, p := program(t, circuit...)
	f := p.NewFrame()
	p.Run(f, []engine.Set{{Slot: slot(t, p, "g"), SI: 0}})
	at := func(n string) int { return s.Lookup(n).Index }
	if f.Status[at("Phi")] != engine.Errored || !strings.Contains(f.Errs[at("Phi")].Message, "division by zero") {
		t.Errorf("Φ with no gap: %s %v", f.Status[at("Phi")], f.Errs[at("Phi")])
	}
	if f.Status[at("B")] != engine.Blocked || f.Status[at("W")] != engine.OK {
		t.Errorf("B is %s and W is %s; want blocked and ok", f.Status[at("B")], f.Status[at("W")])
	}
	p.Run(f, []engine.Set{{Slot: slot(t, p, "g"), SI: 2e-3}})
	if f.Status[at("Phi")] != engine.OK || f.Status[at("B")] != engine.OK || f.Errs[at("B")] != nil {
		t.Errorf("after a sound gap: Φ %s, B %s (%v)", f.Status[at("Phi")], f.Status[at("B")], f.Errs[at("B")])
	}
}

// solve runs inside every frame: the current that gives a wanted flux,
// I = Φ·R/N, found again for each gap.
func TestRunSolvesPerFrame(t *testing.T) {
	s, p := program(t, "g = 2 mm", "A = 0.01 m^2", "N = 200", "Phi_w = 10 mWb",
		"R = g/(mu_0*A)", "Phi = N*I/R", "I = solve(Phi == Phi_w, 0 A, 1000 A)")
	f := p.NewFrame()
	for _, g := range []float64{1e-3, 2e-3, 3e-3} {
		p.Run(f, []engine.Set{{Slot: slot(t, p, "g"), SI: g}})
		want := 0.01 * g / (4e-7 * math.Pi * 0.01) / 200
		if got := f.Values[s.Lookup("I").Index]; !near(got, want, 1e-9) {
			t.Errorf("g = %g m: I = %g A, want %g A", g, got, want)
		}
	}
}

// Four goroutines share one Program, each with its own frame; run with
// -race (CI does), this also shows that a run writes nothing shared.
func TestProgramSharedByGoroutines(t *testing.T) {
	s, p := program(t, circuit...)
	phi := s.Lookup("Phi").Index
	gap := slot(t, p, "g")
	var wg sync.WaitGroup
	errs := make(chan string, 4)
	for w := 0; w < 4; w++ {
		wg.Add(1)
		go func(w int) {
			defer wg.Done()
			f := p.NewFrame()
			for i := 0; i < 200; i++ {
				g := 1e-3 * float64(1+(i+w)%5)
				p.Run(f, []engine.Set{{Slot: gap, SI: g}})
				if want := 200 * 5 / (g / (4e-7 * math.Pi * 0.01)); !near(f.Values[phi], want, 1e-9) {
					errs <- "a frame's flux does not follow its own gap"
					return
				}
			}
		}(w)
	}
	wg.Wait()
	close(errs)
	for e := range errs {
		t.Error(e)
	}
}

// benchLines takes the formula lines of one synthetic sheet.
func benchLines(statements int) []string {
	var out []string
	in := false
	for _, l := range strings.Split(benchdata.Sheet(1, statements), "\n") {
		switch {
		case strings.HasPrefix(l, "```sheaf"):
			in = true
		case strings.HasPrefix(l, "```"):
			in = false
		case in:
			out = append(out, l)
		}
	}
	return out
}

// BenchmarkRerun re-runs a compiled 50-statement sheet with one input
// changed: the cost of a sweep point or a preview edit. Target: under
// 1 µs. See BENCHMARKS.md.
func BenchmarkRerun(b *testing.B) {
	lines := benchLines(50)
	block := engine.SourceBlock{}
	for i, l := range lines {
		block.Lines = append(block.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: "b.md", Line: i + 1, Col: 1}})
	}
	s := engine.Compile(engine.SheetSource{Path: "b.md", Blocks: []engine.SourceBlock{block}})
	if len(s.Diags) != 0 || len(s.Statements) != 50 {
		b.Fatalf("%d statements, %v", len(s.Statements), s.Diags)
	}
	p := s.Program()
	f := p.NewFrame()
	p.Run(f, nil)
	in, ok := p.Input("g_0")
	if !ok {
		b.Fatal("no input g_0")
	}
	sets := [2][]engine.Set{{{Slot: in, SI: 2.5e-3}}, {{Slot: in, SI: 3e-3}}}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		p.Run(f, sets[i&1])
	}
}
