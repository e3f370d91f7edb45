package project_test

import (
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// A check that a load case cannot work out shows the case's error, named
// for the case, where the check stands.
func TestCaseErrorNamesTheCase(t *testing.T) {
	pkg := project.FromFiles("p", map[string][]byte{"a.md": []byte("```sheaf\nV = 10 V\nV_0 = 2 V\nI = sqrt((V - V_0) * V_0) / 5 ohm\ncheck I <= 2 A\ncase cold: V = 1 V\n```\n")})
	s := pkg.Sheets[0]
	for _, st := range s.Calc.Statements {
		if st.Kind != engine.Check {
			continue
		}
		r := s.Calc.Result(st)
		if r.Status != engine.Errored && r.Status != engine.Blocked || r.Err == nil || !strings.HasPrefix(r.Err.Message, "case cold: ") {
			t.Errorf("check shows %v %+v, want the error of case cold, named", r.Status, r.Err)
		}
	}
	// The case is no result, and the check, blocked in it, is counted as
	// not evaluated rather than as a pass.
	if c := s.Counts(); c.Results != 3 || c.Blocked != 1 || c.Pass+c.Fail != 0 {
		t.Errorf("counts %+v, want 3 results (V, V_0, I), the check not evaluated in case cold, no verdict", c)
	}
}

// A check that itself fails to evaluate in a case is an error of the
// sheet's counts, though not among its diagnostics as written.
func TestCaseErrorCounted(t *testing.T) {
	pkg := project.FromFiles("p", map[string][]byte{"a.md": []byte("```sheaf\nV = 10 V\nV_0 = 2 V\ncheck sqrt((V - V_0) * V_0) / 5 ohm <= 2 A\ncase cold: V = 1 V\n```\n")})
	s := pkg.Sheets[0]
	if c := s.Counts(); c.Errors != 1 || c.Pass+c.Fail+c.Blocked != 0 {
		t.Errorf("counts %+v, want the check's error in case cold counted once", c)
	}
}
