package audit_test

import (
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/project"
)

const front = "---\ntitle: t\nrevision: A\nchecked by: C. Hecker\n---\n"

func run(t *testing.T, files map[string]string) audit.Report {
	t.Helper()
	in := map[string][]byte{}
	for k, v := range files {
		in[k] = []byte(v)
	}
	pkg := project.FromFiles("pkg", in)
	if len(pkg.Diags) != 0 {
		t.Fatalf("sheet errors: %v", pkg.Diags)
	}
	return audit.Run(pkg)
}

// find returns the findings of a code.
func find(r audit.Report, code string) []audit.Finding {
	var out []audit.Finding
	for _, f := range r.Findings {
		if f.Code == code {
			out = append(out, f)
		}
	}
	return out
}

func TestInputWithoutSource(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\nl = 2 m ; a length\nA = l^2 ; area ; source: drawing 7\nx = A * 2 ; twice\n```\n"})
	got := find(r, "no-source")
	if len(got) != 1 || got[0].Subject != "l" || got[0].Pos.String() != "a.md:7:1" {
		t.Fatalf("no-source findings: %+v", got)
	}
	if r.Open() != 1 {
		t.Errorf("open findings %d, want 1: %+v", r.Open(), r.Findings)
	}
}

func TestBuriedFactorFoundButTwoPiNot(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\n" +
		"n = 1500 rpm ; speed ; source: nameplate\n" +
		"omega [rad/s] = 2 * pi * n ; angular speed\n" + // 2 and pi: not findings
		"P = 1.15 * omega * 1 s ; a buried service factor\n" + // 1.15: a finding; 1 s strips a unit: not
		"Q = P^2 / 4 ; a square and a quarter\n" + // exponent 2 and 4: not findings
		"R = P * 3 V ; a quantity buried in a formula\n```\n"})
	buried := find(r, "buried-number")
	if len(buried) != 1 || !strings.Contains(buried[0].Message, "1.15") || buried[0].Pos.String() != "a.md:9:5" {
		t.Fatalf("buried-number findings: %+v", buried)
	}
	if q := find(r, "buried-quantity"); len(q) != 1 || !strings.Contains(q[0].Message, "3 V") {
		t.Errorf("buried-quantity findings: %+v", q)
	}
}

func TestAcceptedFindingNoLongerFails(t *testing.T) {
	open := front + "```sheaf\nk = 1.2 ; factor ; source: handbook\nT = 20 N*m ; torque ; source: test\nT_d = 1.15 * k * T ; design torque\n```\n"
	r := run(t, map[string]string{"a.md": open})
	if r.Open() != 1 || find(r, "buried-number")[0].Accepted {
		t.Fatalf("before acceptance: %+v", r.Findings)
	}
	accepted := strings.Replace(open, "; design torque", "; design torque ; accept buried-number: the 1.15 service factor is fixed by the client's standard", 1)
	r = run(t, map[string]string{"a.md": accepted})
	f := find(r, "buried-number")
	if r.Open() != 0 || len(f) != 1 || !f[0].Accepted || !strings.Contains(f[0].Reason, "client's standard") {
		t.Fatalf("after acceptance: open %d, %+v", r.Open(), r.Findings)
	}
}

func TestAcceptanceMustMatchAndGiveAReason(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\n" +
		"k = 2 ; factor ; source: handbook ; accept no-source: wrong code here\n" +
		"x = 1.5 m ; a length ; source: drawing ; accept buried-numbr: typo\n" +
		"y = 1.07 * x ; scaled ; accept buried-number:\n```\n"})
	if u := find(r, "unknown-acceptance"); len(u) != 2 {
		t.Errorf("unknown-acceptance findings: %+v", u)
	}
	if w := find(r, "acceptance-without-reason"); len(w) != 1 {
		t.Errorf("acceptance-without-reason findings: %+v", w)
	}
	if b := find(r, "buried-number"); len(b) != 1 || b[0].Accepted {
		t.Errorf("an acceptance without a reason must not accept: %+v", b)
	}
}

func TestSheetLevelAcceptanceAndTitleBlock(t *testing.T) {
	r := run(t, map[string]string{"a.md": "---\ntitle: t\n---\n```sheaf\nx = 1 m ; a ; source: s\ny = x ; b\n```\n"})
	if f := find(r, "no-checker"); len(f) != 1 || f[0].Pos.String() != "a.md:1:1" || f[0].Accepted {
		t.Fatalf("no-checker: %+v", f)
	}
	r = run(t, map[string]string{"a.md": "---\ntitle: t\naccept:\n  no-checker: an internal note, not issued\n---\n```sheaf\nx = 1 m ; a ; source: s\ny = x ; b\n```\n"})
	if f := find(r, "no-checker"); len(f) != 1 || !f[0].Accepted || r.Open() != 0 {
		t.Fatalf("accepted no-checker: %+v", r.Findings)
	}
}

func TestCheckAgainstLiteralThinMarginAndOpenSource(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\n" +
		"B = 1.58 T ; flux density ; source: TBC\n" +
		"B_max = 1.6 T ; limit ; source: design basis\n" +
		"check B <= 1.6 T ; literal limit\n" +
		"check B <= B_max ; named limit, 98.75 % used\n```\n"})
	if f := find(r, "check-literal"); len(f) != 1 || !strings.Contains(f[0].Message, "1.6 T") {
		t.Errorf("check-literal: %+v", f)
	}
	if f := find(r, "thin-margin"); len(f) != 2 {
		t.Errorf("thin-margin (both checks are at 98.75 %%): %+v", f)
	}
	if f := find(r, "open-source"); len(f) != 1 || f[0].Subject != "B" {
		t.Errorf("open-source: %+v", f)
	}
}

func TestInconsistentInputsAcrossSheetsOfOneProject(t *testing.T) {
	a := "---\nproject: P\nrevision: A\nchecked by: C\n---\n```sheaf\nU_n = 690 V ; rated voltage ; source: data sheet\ny = 2 * U_n ; twice\n```\n"
	b := strings.Replace(a, "690 V", "400 V", 1)
	other := strings.Replace(b, "project: P", "project: Q", 1)
	r := run(t, map[string]string{"a.md": a, "b.md": b, "c.md": other})
	f := find(r, "inconsistent-input")
	if len(f) != 1 || f[0].Pos.File != "b.md" || !strings.Contains(f[0].Message, "690 V") {
		t.Fatalf("inconsistent-input: %+v", f)
	}
}

func TestEveryRuleHasAStableDocumentedCode(t *testing.T) {
	seen := map[string]bool{}
	for _, r := range audit.Rules {
		if seen[r.Code] || r.Code == "" || r.Title == "" || r.Why == "" {
			t.Errorf("rule %+v is duplicate or undocumented", r)
		}
		seen[r.Code] = true
	}
}

// A finding on the second line of a statement belongs to the statement,
// whose acceptance is written on its first line's annotations.
func TestAcceptanceOfContinuedStatement(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\nx = 1.5 m ; a length ; source: drawing\n" +
		"y = x * (1 +\n    0.07) ; scaled ; accept buried-number: the margin the client fixed\nz = y ; used ; source: drawing\n```\n"})
	got := find(r, "buried-number")
	if len(got) != 1 || got[0].Pos.Line != 9 || !got[0].Accepted {
		t.Fatalf("buried-number findings: %+v", got)
	}
}
