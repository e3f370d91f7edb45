package render

import (
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// What the page and the terminal show of kinds: an input with a display
// unit in both units, a torque in N·m, a count without decimals.
func TestKindsAsShown(t *testing.T) {
	src := "# K\n\n```sheaf\n" +
		"B [T] = 12 kG ; source: s\n" + // line 4
		"k_t = 0.4584 N*m/A ; source: s\n" +
		"I = 10 A ; source: s\n" +
		"T_m = k_t*I\n" + // line 7
		"p = 2 ; source: s\n" +
		"Q_s = 36 ; source: s\n" +
		"N_c = 2*p*Q_s\n" + // line 10
		"```\n"
	pkg, pages := build(t, map[string]string{"k.md": src})
	if len(pkg.Diags) != 0 {
		t.Fatalf("unexpected diagnostics: %v", pkg.Diags)
	}
	calc := pkg.Sheets[0].Calc
	for name, want := range map[string]string{"B": "B = 12 kG = 1.200 T", "T_m": "T_m = 4.584 N·m", "N_c": "N_c = 144"} {
		if got := TerminalLine(calc.Lookup(name), calc.Result(calc.Lookup(name)), 4); got != want {
			t.Errorf("terminal: %q, want %q", got, want)
		}
	}
	page := pages["sheets/k.html"]
	row := func(id string) string {
		r := page[strings.Index(page, `id="`+id+`"`):]
		return r[:strings.Index(r, "</div>")] // the equation, all its steps
	}
	if b := row("L4"); !strings.Contains(b, "<mn>1.200</mn>") || !strings.Contains(b, "<mtext>T</mtext>") {
		t.Errorf("the page does not show B in T beside 12 kG: %s", b)
	}
	if r := row("L7"); !strings.Contains(r, "<mtext>N·m</mtext>") || strings.Contains(r, "<mtext>J</mtext>") {
		t.Errorf("the torque is not shown in N·m: %s", r)
	}
	if r := row("L10"); !strings.Contains(r, "<mn>144</mn>") {
		t.Errorf("the count does not show as 144: %s", r)
	}
	if calc.Result(calc.Lookup("N_c")).Status != engine.OK {
		t.Error("N_c not evaluated")
	}
}
