package project_test

import (
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/diag"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// Results taken from another sheet: live values, display units, renames,
// folders, and the mistakes, each with its message at the take statement.
func TestTakeFromAnotherSheet(t *testing.T) {
	files := map[string][]byte{
		"01-circuit.md": []byte("# C\n\n```sheaf\ng = 2 mm ; gap ; source: drawing\nA = 0.01 m^2 ; area ; source: drawing\n" +
			"R = g/(mu_0*A) ; reluctance\nPhi [mWb] = 200*5 A/R ; flux\n```\n"),
		"emf/02-emf.md": []byte("# E\n\n```sheaf\ntake Phi from ../01-circuit\n" + // line 4
			"take Phi_0 [Wb] = Phi from ../01-circuit\n" + // line 5
			"N = 10 ; turns ; source: drawing\nlambda = N*Phi ; linkage\n" +
			"take R_x = Rr from ../01-circuit\n" + // line 8
			"take z from ../nowhere\n```\n"), // line 9
		"c.md": []byte("# C\n```sheaf\ntake x from d\ny = 2 ; a ; source: s\n```\n"),
		"d.md": []byte("# D\n```sheaf\ntake y from c\nx = 3 ; b ; source: s\n```\n"),
	}
	pkg := project.FromFiles("p", files)
	emf := sheet(t, pkg, "emf/02-emf.md")
	phi := 200 * 5 / (2e-3 / (4e-7 * math.Pi * 0.01)) // Φ = N·I/R, common practice
	if st := emf.Calc.Lookup("Phi"); emf.Calc.Result(st).Status != engine.OK || !near(emf.Calc.Result(st).Value, phi) || emf.Calc.Result(st).Shown.Symbol != "mWb" || st.TakenPath != "01-circuit.md" {
		t.Errorf("Phi taken: %s %g %s from %q", emf.Calc.Result(st).Status, emf.Calc.Result(st).Value, emf.Calc.Result(st).Shown.Symbol, st.TakenPath)
	}
	if st := emf.Calc.Lookup("Phi_0"); emf.Calc.Result(st).Status != engine.OK || emf.Calc.Result(st).Shown.Symbol != "Wb" || st.Remote != "Phi" {
		t.Errorf("Phi_0 taken: %s in %s from %s", emf.Calc.Result(st).Status, emf.Calc.Result(st).Shown.Symbol, st.Remote)
	}
	if st := emf.Calc.Lookup("lambda"); emf.Calc.Result(st).Status != engine.OK || !near(emf.Calc.Result(st).Value, 10*phi) {
		t.Errorf("lambda = %g, want %g", emf.Calc.Result(st).Value, 10*phi)
	}
	wantDiag(t, pkg, "emf/02-emf.md:8:12", "01-circuit.md defines no result Rr")
	wantDiag(t, pkg, "emf/02-emf.md:9:13", "no sheet nowhere.md in the package")
	wantDiag(t, pkg, "c.md:3:13", "sheets take results from each other in a cycle: c.md → d.md → c.md")
	wantDiag(t, pkg, "d.md:3:13", "in a cycle")
	for pos, hint := range map[string]string{"emf/02-emf.md:8:12": "did you mean R?", "c.md:3:13": "work the value out itself"} {
		if !slices.ContainsFunc(pkg.Diags, func(d diag.Diagnostic) bool { return d.Pos.String() == pos && strings.Contains(d.Hint, hint) }) {
			t.Errorf("the diagnostic at %s does not hint %q", pos, hint)
		}
	}
	if st := sheet(t, pkg, "c.md").Calc.Lookup("y"); sheet(t, pkg, "c.md").Calc.Result(st).Status != engine.OK {
		t.Errorf("a statement beside the failed take: %s", sheet(t, pkg, "c.md").Calc.Result(st).Status)
	}
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Abs(b) }
