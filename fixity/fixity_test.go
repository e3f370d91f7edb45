package fixity_test

import (
	"path/filepath"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// sheet builds a one-sheet package from formula lines.
func sheet(t *testing.T, lines string) *project.Sheet {
	t.Helper()
	pkg := project.FromFiles("t", map[string][]byte{"s.md": []byte("# s\n\n```sheaf\n" + lines + "```\n")})
	for _, d := range pkg.Diags {
		t.Fatalf("diagnostic: %v", d)
	}
	return pkg.Sheets[0]
}

func fixedOf(t *testing.T, s *project.Sheet, formula string) (fixed, holds bool) {
	t.Helper()
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Check && st.Formula == formula {
			return s.Fixed(st)
		}
	}
	t.Fatalf("no check %s", formula)
	return false, false
}

func TestFixedChecks(t *testing.T) {
	s := sheet(t, `N = 42 ; turns ; source: x
f = 50 Hz ; frequency ; source: x
Phi = 12 mWb ; flux ; source: x
U_max = 150 V ; limit ; source: x
E_a = 4.44 * f * N * Phi ; the short form
E_b = sqrt(2) * pi * f * N * Phi ; the exact form
E_c = 2 * pi * f * N * Phi / sqrt(2) ; the exact form written otherwise
k_w = 0.955 ; winding factor ; source: x
E_d = E_b * k_w ; with the winding factor
check E_b == E_c ; an identity: the same algebra both sides
check 4.44 <= sqrt(2) * pi ; a fixed ratio, resting on no input
check E_a <= E_b ; a fixed ratio: 4.44 against sqrt(2)*pi, whatever the coil
check E_d + 1 V >= E_d ; a fixed difference
check E_d <= U_max ; a real check: it moves with every input
check round(N / 2) * 2 == N ; a real check on a count: an odd N fails it
check E_a >= 0 V ; a real check against zero
`)
	for _, c := range []struct {
		formula      string
		fixed, holds bool
	}{
		{"E_b == E_c", true, true},
		{"4.44 <= sqrt(2) * pi", true, true},
		{"E_a <= E_b", true, true},
		{"E_d + 1 V >= E_d", true, true},
		{"E_d <= U_max", false, false},
		{"round(N / 2) * 2 == N", false, false},
		{"E_a >= 0 V", false, false},
	} {
		fixed, holds := fixedOf(t, s, c.formula)
		if fixed != c.fixed || (fixed && holds != c.holds) {
			t.Errorf("check %s: fixed %v holds %v, want fixed %v holds %v", c.formula, fixed, holds, c.fixed, c.holds)
		}
	}
	c := s.Counts()
	if c.Fixed != 4 || c.Pass != 3 || c.Fail != 0 {
		t.Errorf("counts: %d fixed, %d pass, %d fail; want 4, 3, 0", c.Fixed, c.Pass, c.Fail)
	}
}

// A check that never holds is fixed too: it is a mistake in the sheet, not
// a finding about the design, and it is not counted as a failure.
func TestFixedFailure(t *testing.T) {
	s := sheet(t, "a = 3 m ; x ; source: x\ncheck 2 * a <= a ; never holds for a positive a\n")
	if fixed, holds := fixedOf(t, s, "2 * a <= a"); !fixed || holds {
		t.Errorf("fixed %v holds %v, want fixed and never holding", fixed, holds)
	}
	if c := s.Counts(); c.Fail != 0 || c.Fixed != 1 {
		t.Errorf("counts %+v: want the fixed check apart from the failures", c)
	}
}

// A check whose input cannot be varied without leaving its model's range
// (a table read outside its rows) is not called fixed on no evidence.
func TestNoEvidenceNotFixed(t *testing.T) {
	s := sheet(t, "x = 2 m ; x ; source: x\ny = sqrt((x - 2 m) * (2 m - x)) ; zero only at 2 m\ncheck y <= y ; would be an identity, but no varied run evaluates\n")
	if fixed, _ := fixedOf(t, s, "y <= y"); fixed {
		t.Errorf("called fixed with no run that varied x and evaluated")
	}
}

// In both demos, the one fixed check is the saturating pole circuit's
// agreement of the solve with the direct reading of the curve: an
// agreement of two methods, fixed for every input, which the variation
// must find. Every other check (design limits, tolerance bands, the
// winding's divisibility, the insulation margins) moves with its inputs
// and must not be flagged.
func TestDemosFixedChecks(t *testing.T) {
	for _, demo := range []string{"tarnwick-weir", "corran-hill-conveyor"} {
		pkg, err := project.Load(filepath.Join("..", "examples", demo))
		if err != nil {
			t.Fatal(err)
		}
		found, real := 0, 0
		for _, s := range pkg.Sheets {
			for _, st := range s.Calc.Statements {
				if r := s.Calc.Result(st); st.Kind != engine.Check || (r.Status != engine.Pass && r.Status != engine.Fail) {
					continue
				}
				fixed, _ := s.Fixed(st)
				switch {
				case st.Formula == "I_s == I_w":
					found++
					if !fixed {
						t.Errorf("%s %v: check I_s == I_w (instance %s) is not found fixed", demo, st.Pos, st.Instance)
					}
				case fixed:
					t.Errorf("%s %v: check %s is flagged fixed", demo, st.Pos, st.Formula)
				default:
					real++
				}
			}
		}
		if demo == "tarnwick-weir" && found == 0 {
			t.Errorf("the demo has no check I_s == I_w to find")
		}
		if real < 10 {
			t.Errorf("%s: only %d real checks seen", demo, real)
		}
		t.Logf("%s: %d agreement checks found fixed, %d real checks not flagged", demo, found, real)
	}
}

// Revision A of the hydro demo had the two checks that the reviewer of
// issue 13 found could not fail: sheet 03's "cross-check" of the speed
// EMF against itself, an identity, and sheet 02's 4.44 form against the
// exact one, a fixed ratio. The variation finds both, and nothing else.
func TestRevisionAFixedChecks(t *testing.T) {
	pkg, err := project.Load(filepath.Join("..", "examples", "tarnwick-weir-rev-A"))
	if err != nil {
		t.Fatal(err)
	}
	got := map[string]bool{}
	for _, s := range pkg.Sheets {
		for _, st := range s.Calc.Statements {
			if fixed, _ := s.Fixed(st); fixed {
				got[s.Path()+": "+st.Formula] = true
			}
		}
	}
	want := map[string]bool{
		"02-coil-emf.md: abs(coil.E_rms_444 - coil.E_rms) <= 0.001 * coil.E_rms": true,
		"03-speed-voltage.md: e_t == e_t2":                                       true,
	}
	if len(got) != len(want) {
		t.Errorf("fixed checks %v, want %v", got, want)
	}
	for k := range want {
		if !got[k] {
			t.Errorf("%s is not found fixed (found %v)", k, got)
		}
	}
}
