package audit_test

import (
	"strings"
	"testing"
)

// A check that holds as written and fails within its inputs' tolerances
// is a finding; one that holds over the whole band is not.
func TestFailsWithinTolerance(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\n" +
		"U = 400 V ± 10 % ; supply ; source: spec S-1\n" +
		"U_w = 430 V ; withstand ; source: spec S-1\n" +
		"U_v = 460 V ; withstand of the better part ; source: spec S-1\n" +
		"check U <= U_w ; within the withstand\n" +
		"check U <= U_v ; within the better withstand\n" +
		"sample 20000 times, seed 2\n```\n"})
	got := find(r, "fails-within-tolerance")
	if len(got) != 1 || got[0].Subject != "check U <= U_w" || got[0].Pos.String() != "a.md:10:1" {
		t.Fatalf("findings %+v, want one at the check against 430 V", got)
	}
	// 400 V ± 10 % reaches 440 V: above 430 V, below 460 V.
	if !strings.Contains(got[0].Message, "U (100 %)") {
		t.Errorf("message %q should name U as what moves it", got[0].Message)
	}
}

// A check that a load case cannot work out is reported.
func TestCaseNotEvaluated(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\n" +
		"V = 10 V ; supply ; source: spec S-1\n" +
		"V_0 = 2 V ; offset ; source: spec S-1\n" +
		"I_max = 2 A ; limit ; source: spec S-1\n" +
		"R_0 = 5 ohm ; load ; source: spec S-1\n" +
		"I = sqrt((V - V_0) * V_0) / R_0 ; current\n" +
		"check I <= I_max ; current within its limit\n" +
		"case cold: V = 1 V ; a supply below the offset\n```\n"})
	got := find(r, "case-not-evaluated")
	if len(got) != 1 || !strings.Contains(got[0].Message, "case cold") {
		t.Fatalf("findings %+v, want the check not worked out in case cold", got)
	}
}
