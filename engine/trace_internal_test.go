package engine

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/diag"
)

func compileText(text string, prose ...AssumptionSource) *Calc {
	var lines []SourceLine
	for i, l := range strings.Split(text, "\n") {
		lines = append(lines, SourceLine{Text: l, Pos: diag.Pos{File: "t.md", Line: i + 2, Col: 1}})
	}
	s := Compile(SheetSource{Path: "t.md", Assumptions: prose, Blocks: []SourceBlock{{Fence: diag.Pos{File: "t.md", Line: 1, Col: 1}, Lines: lines}}})
	s.Evaluate()
	return s
}

// RestsOn, worked out for all statements at once, agrees with a fresh
// walk of each statement's dependencies: through assumptions cited and
// made, solves, a cycle, an error and the statements it blocks.
func TestRestsOnAgreesWithWalk(t *testing.T) {
	s := compileText(`l_g = 2.5 mm ; gap ; assumes: uniform-gap
A = 0.01 m^2 ; area
mu = 1 ; assume: no saturation
R = l_g / (mu_0 * mu * A)
N = 100
F = solve(F / R == 1 mWb * N / N, 0 A, 1e6 A)
I = F / N
B = I * 2 ; assumes: uniform-gap, steel
c_1 = c_2 + I
c_2 = c_1
q = unknown + A
r = q * 2
check I <= 100 A ; assumes: steel
z = 3`,
		AssumptionSource{ID: "uniform-gap", Text: "The gap is uniform.", Pos: diag.Pos{File: "t.md", Line: 20, Col: 1}},
		AssumptionSource{ID: "steel", Text: "The steel is linear.", Pos: diag.Pos{File: "t.md", Line: 21, Col: 1}})
	if len(s.Diags) == 0 {
		t.Fatal("the sheet should hold its cycle and its unknown name")
	}
	for _, st := range s.Statements {
		in, as := s.RestsOn(st)
		win, was := s.restsOnSlow(st)
		if !slices.Equal(in, win) || !slices.Equal(as, was) {
			t.Errorf("%s: rests on %v and %v; the walk finds %v and %v", st.Text, names(in), ids(as), names(win), ids(was))
		}
	}
	if in, as := s.RestsOn(s.Lookup("B")); len(in) != 4 || len(as) != 3 {
		t.Errorf("B rests on %v and %v", names(in), ids(as))
	}
}

func names(sts []*Statement) []string {
	var out []string
	for _, st := range sts {
		out = append(out, st.Name)
	}
	return out
}

func ids(as []*Assumption) []string {
	var out []string
	for _, a := range as {
		out = append(out, a.ID)
	}
	return out
}

// BenchmarkRestsOnChain asks what every statement of a chain of
// MaxStatements rests on, as a sheet's page does. Walking each
// statement's dependencies afresh was quadratic: minutes for this chain.
func BenchmarkRestsOnChain(b *testing.B) {
	var text strings.Builder
	text.WriteString("a_0 = 1 m")
	for i := 1; i < MaxStatements; i++ {
		fmt.Fprintf(&text, "\na_%d = a_%d + 1 m", i, i-1)
	}
	src := text.String()
	b.ResetTimer()
	for range b.N {
		b.StopTimer()
		s := compileText(src)
		b.StartTimer()
		for _, st := range s.Statements {
			if in, _ := s.RestsOn(st); len(in) != 1 {
				b.Fatalf("%s rests on %d inputs", st.Name, len(in))
			}
		}
	}
}

// exactIndex finds the same row as a scan of every row for the first x
// equal to the key within a relative 1e-9: among repeats, near repeats,
// zero, negative values and keys between rows.
func TestExactIndexAgreesWithScan(t *testing.T) {
	vals := []float64{5, -3, 0, 1e-300, 2, 2, 2 * (1 + 5e-10), 2 * (1 - 5e-10), 7e12, math.Copysign(0, -1), 1e9, 1e9 + 0.5, -3}
	c := &Column{Values: vals}
	ix := newExactIndex(c)
	scan := func(key float64) int {
		for i, v := range vals {
			if sameX(v, key) {
				return i
			}
		}
		return -1
	}
	keys := append([]float64{2 * (1 + 1.4e-9), 2 * (1 - 1.4e-9), 1.5, 0.1, 1e-301, -1e-300, 1e9 + 0.9, math.NaN()}, vals...)
	for _, k := range keys {
		if got, want := ix.find(k), scan(k); got != want {
			t.Errorf("key %v: row %d, a scan finds %d", k, got, want)
		}
	}
}
