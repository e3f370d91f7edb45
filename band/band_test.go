package band_test

import (
	"math"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

func sheet(t *testing.T, lines string) *project.Sheet {
	t.Helper()
	pkg := project.FromFiles("t", map[string][]byte{"s.md": []byte("```sheaf\n" + lines + "```\n")})
	if len(pkg.Diags) != 0 {
		t.Fatalf("%v", pkg.Diags)
	}
	return pkg.Sheets[0]
}

func check(t *testing.T, s *project.Sheet, formula string) *engine.Statement {
	t.Helper()
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Check && st.Formula == formula {
			return st
		}
	}
	t.Fatalf("no check %s", formula)
	return nil
}

func TestBandPairs(t *testing.T) {
	s := sheet(t, `x = 1.9 ; x ; source: s
lo = 1.7 ; x ; source: s
hi = 2.2 ; x ; source: s
y = 5 m ; y ; source: s
check lo <= x ; written the other way round
check x <= hi
check y <= 6 m ; one side only
check y >= 7 m ; limits that cross make no band
`)
	b, ok := s.Band(check(t, s, "lo <= x"))
	if !ok || b.High != check(t, s, "x <= hi") || math.Abs(b.Position()-0.4) > 1e-12 {
		t.Errorf("band %+v, %v; want x at 40 %% of 1.7–2.2", b, ok)
	}
	if _, ok := s.Band(check(t, s, "y <= 6 m")); ok {
		t.Errorf("limits that cross were taken for a band")
	}
}
