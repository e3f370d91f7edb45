package conditions_test

import (
	"fmt"
	"runtime"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
)

// fiftyStatements is a sheet of 50 statements: ten inputs and forty
// results in chains over them, ending in a check, as a machine sheet is.
func fiftyStatements(extra ...string) []string {
	lines := []string{
		"U = 400 V ± 10 %", "R = 2 ohm ± 5 %", "L = 30 mH ± 3 %", "f = 50 Hz", "N = 120",
		"A = 0.02 m^2 ± 2 %", "g = 2 mm ± σ 0.05 mm", "mu_r = 1500 ± 20 %", "l_c = 0.4 m", "k = 0.95",
	}
	lines = append(lines,
		"X = 2 * pi * f * L", "Z = sqrt(R^2 + X^2)", "I = U / Z", "P = I^2 * R",
		"Rel = g / (mu_0 * A) + l_c / (mu_0 * mu_r * A)", "Phi = N * I / Rel", "B = Phi / A")
	prev := "B"
	for i := len(lines); i < 49; i++ {
		name := fmt.Sprintf("q_%d", i)
		lines = append(lines, fmt.Sprintf("%s = %s * k + B * (1 - k)", name, prev))
		prev = name
	}
	lines = append(lines, "check "+prev+" <= 1.6 T")
	return append(lines, extra...)
}

func benchCalc(b *testing.B, lines []string, tables ...engine.TableSource) *engine.Calc {
	blk := engine.SourceBlock{Fence: diag.Pos{File: "b.md", Line: 1, Col: 1}}
	for i, l := range lines {
		blk.Lines = append(blk.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: "b.md", Line: i + 2, Col: 1}})
	}
	calc := engine.Compile(engine.SheetSource{Path: "b.md", Blocks: []engine.SourceBlock{blk}, Tables: tables})
	calc.Evaluate()
	if len(calc.Diags) > 0 {
		b.Fatal(calc.Diags)
	}
	return calc
}

// 10,000 sweep points of a 50-statement sheet; the target is 20 ms.
func BenchmarkSweep10000Points(b *testing.B) {
	lines := fiftyStatements()
	for i, l := range lines { // the sweep alone, no tolerances
		if at := strings.IndexAny(l, "±"); at > 0 {
			lines[i] = l[:at]
		}
	}
	calc := benchCalc(b, append(lines, "sweep su: U over 1 V .. 10000 V by 1 V show B"))
	b.ResetTimer()
	for b.Loop() {
		if r := conditions.Run(calc); len(r.Sweeps[0].X) != 10000 {
			b.Fatal("want 10000 points")
		}
	}
}

// 100,000 Monte Carlo samples of a 50-statement sheet, on one core and on
// every core; the target is 0.5 s on one core, less on two.
func BenchmarkMonteCarlo100000(b *testing.B) {
	calc := benchCalc(b, fiftyStatements("sample 100000 times, seed 1"))
	for _, cores := range []int{1, runtime.NumCPU()} {
		b.Run(fmt.Sprintf("cores=%d", cores), func(b *testing.B) {
			defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(cores))
			for b.Loop() {
				if r := conditions.Run(calc); r.Spread.Samples != 100000 {
					b.Fatal("want 100000 samples")
				}
			}
		})
	}
}

// An open-circuit characteristic of 100 points through a saturating
// circuit, with a solve for the flux at every point; the target is 50 ms.
func BenchmarkOpenCircuitCharacteristic(b *testing.B) {
	at := func(s string) engine.CellSource {
		return engine.CellSource{Text: s, Pos: diag.Pos{File: "b.md", Line: 1, Col: 1}}
	}
	bh := engine.TableSource{Name: "BH", Pos: diag.Pos{File: "b.md", Line: 1, Col: 1}, Header: []engine.CellSource{at("H [A/m]"), at("B [T]")}}
	for _, row := range [][2]string{{"0", "0"}, {"100", "0.8"}, {"180", "1.2"}, {"400", "1.4"}, {"2000", "1.6"}, {"10000", "1.8"}, {"100000", "2.13"}} {
		bh.Rows = append(bh.Rows, []engine.CellSource{at(row[0]), at(row[1])})
	}
	calc := benchCalc(b, []string{
		"N = 120", "I_f = 20 A", "l_c = 0.4 m", "A_c = 0.05 m^2", "g = 4 mm",
		"F = N * I_f", "R_g = g / (mu_0 * A_c)", "Phi_top = F / R_g",
		"Phi = solve(F == interp(BH.H, BH.B, Phi / A_c, extrapolate) * l_c + Phi * R_g, 0 * Phi_top, Phi_top)",
		"E = 4.44 * 50 Hz * 300 * Phi",
		"sweep occ: I_f over 1 A .. 100 A by 1 A show E",
	}, bh)
	b.ResetTimer()
	for b.Loop() {
		if r := conditions.Run(calc); r.Sweeps[0].Curves[0].Failed != 0 {
			b.Fatal("a point of the characteristic has no value")
		}
	}
}
