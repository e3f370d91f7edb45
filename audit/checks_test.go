package audit_test

import (
	"strings"
	"testing"
)

// An identity is a fixed check, reported where it is written; a check
// against a named limit is not. The identity and the limit are the demo
// kind: the EMF of a coil in its exact form, written twice.
func TestFixedCheckFound(t *testing.T) {
	r := run(t, map[string]string{"a.md": front + "```sheaf\n" +
		"N = 42 ; turns ; source: coil drawing C-1\n" +
		"f = 50 Hz ; frequency ; source: rating plate\n" +
		"Phi = 12 mWb ; peak flux ; source: magnetic design M-2\n" +
		"U_max = 150 V ; highest EMF the insulation is rated for ; source: coil drawing C-1\n" +
		"E_a [V] = sqrt(2) * pi * f * N * Phi ; the EMF\n" +
		"E_b [V] = 2 * pi * f * N * Phi / sqrt(2) ; the EMF again\n" +
		"check E_a == E_b ; the two forms agree\n" +
		"check E_a <= U_max ; within the rating\n" +
		"```\n"})
	got := find(r, "fixed-check")
	if len(got) != 1 || got[0].Pos.String() != "a.md:13:1" || !strings.Contains(got[0].Message, "holds whatever its inputs are") {
		t.Fatalf("fixed-check findings: %+v", got)
	}
}

// A check resting on a template default recalled from memory is reported
// at the use statement, naming the default; once the sheet sets the value
// the finding goes, and an acceptance on the use statement accepts it.
func TestRecalledDefault(t *testing.T) {
	tmpl := "---\ntemplate: true\n---\n```sheaf\n" +
		"param B [T] ; flux density\n" +
		"B_max = 1.6 T ; design limit ; source: common practice (from memory)\n" +
		"B_sat = 2.0 T ; saturation ; source: steel data sheet S-9\n" +
		"check B <= B_max ; within the design limit\n" +
		"check B <= B_sat ; below saturation\n" +
		"```\n"
	use := func(line string) map[string]string {
		return map[string]string{"_t/core.md": tmpl, "a.md": front + "```sheaf\n" +
			"B_c = 1.2 T ; core flux density ; source: magnetic design M-2\n" +
			"B_lim = 1.5 T ; design limit of this job ; source: design basis DB-4, clause 2\n" + line + "\n```\n"}
	}
	r := run(t, use("use c = _t/core with B = B_c"))
	got := find(r, "recalled-default")
	if len(got) != 1 || got[0].Pos.String() != "a.md:9:1" || !strings.Contains(got[0].Message, "c.B_max = 1.6 T") ||
		strings.Contains(got[0].Message, "B_sat") || got[0].Accepted {
		t.Fatalf("recalled-default findings: %+v", got)
	}
	if got := find(run(t, use("use c = _t/core with B = B_c, B_max = B_lim")), "recalled-default"); len(got) != 0 {
		t.Errorf("the sheet set the default, yet: %+v", got)
	}
	r = run(t, use("use c = _t/core with B = B_c ; accept recalled-default: the limit was agreed with the client in meeting 7"))
	if got := find(r, "recalled-default"); len(got) != 1 || !got[0].Accepted {
		t.Errorf("the acceptance did not apply: %+v", r.Findings)
	}
}

// A side of a tolerance band is judged by where the value sits in the
// band: in the middle of a narrow ±2 % band both utilisations are near
// 98 %, which is not a thin margin; near an edge it is, for that edge only.
func TestBandThinMargin(t *testing.T) {
	sheet := func(e string) map[string]string {
		return map[string]string{"a.md": front + "```sheaf\n" +
			"U = 400 V ; rated voltage ; source: rating plate\n" +
			"t = 2 % ; tolerance ; source: purchase specification PS-1, clause 4\n" +
			"E = " + e + " ; EMF at no load ; source: test report TR-1\n" +
			"check E >= (1 - t) * U ; not below the band\n" +
			"check E <= (1 + t) * U ; not above the band\n```\n"}
	}
	if f := find(run(t, sheet("401 V")), "thin-margin"); len(f) != 0 {
		t.Errorf("the middle of the band is no thin margin: %+v", f)
	}
	f := find(run(t, sheet("407.5 V")), "thin-margin")
	if len(f) != 1 || f[0].Pos.Line != 11 || !strings.Contains(f[0].Message, "96.9 % of its tolerance band") {
		t.Errorf("near the upper edge: %+v", f)
	}
}
