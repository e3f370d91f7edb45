package render

import (
	"strings"
	"testing"
)

const traced = "# Trace\n\nAssumption cold-start: the machine starts from ambient temperature.\n\n```sheaf\n" +
	"T_a = 40 degC ; ambient ; source: site survey ; assumes: cold-start\n" + // line 6
	"dT = 80 K ; rise ; source: heat run ; assume: the rise of the type test holds for this unit\n" + // line 7
	"T_w = T_a + dT ; winding temperature\n" + // line 8
	"T_max = 155 degC ; class F limit ; source: IEC 60085 (from memory)\n" + // line 9
	"check T_w <= T_max ; within the thermal class\n" + // line 10
	"k = 2 ; unrelated ; source: s\n```\n"

func TestTraceabilityLinksAndRestsOn(t *testing.T) {
	pkg, pages := build(t, map[string]string{"t.md": traced})
	if len(pkg.Diags) != 0 {
		t.Fatalf("unexpected diagnostics: %v", pkg.Diags)
	}
	page := pages["sheets/t.html"]
	row := page[strings.Index(page, `id="L8"`):]
	row = row[:strings.Index(row, `id="L9"`)]
	for _, want := range []string{
		`uses <a href="#L6">`, `<a href="#L7">`, `used by <a href="#L10">check at line 10</a>`,
		"rests on 2 inputs and 2 assumptions",
		`<a href="#A-cold-start">cold-start</a>: the machine starts from ambient temperature.`,
		`<a href="#L7">dT</a>: the rise of the type test holds for this unit`,
	} {
		if !strings.Contains(row, want) {
			t.Errorf("the row of T_w lacks %q", want)
		}
	}
	if strings.Contains(row, "#L11") {
		t.Error("T_w is traced to an input it does not use")
	}
	// The assumption paragraph lists what rests on it; the register too.
	box := page[strings.Index(page, `id="A-cold-start"`):]
	box = box[:strings.Index(box, "</div>")]
	for _, want := range []string{`href="#L6"`, `href="#L8"`, `href="#L10"`} {
		if !strings.Contains(box, want) {
			t.Errorf("the assumption box lacks %s", want)
		}
	}
	reg := pages["assumptions.html"]
	if !strings.Contains(reg, "cold-start") || !strings.Contains(reg, "the rise of the type test") || !strings.Contains(reg, `sheets/t.html#L10`) {
		t.Error("the assumptions register lacks an assumption or a dependent")
	}
	if !strings.Contains(pages["inputs.html"], `<a class="loc" href="sheets/t.html#L9">9</a>`) {
		t.Error("the inputs register does not point at the input's line")
	}
}

func TestUnknownAssumptionIsAnError(t *testing.T) {
	pkg, _ := build(t, map[string]string{"t.md": strings.Replace(traced, "assumes: cold-start", "assumes: cold-strat", 1)})
	if len(pkg.Diags) != 1 || pkg.Diags[0].Pos.String() != "t.md:6:49" || !strings.Contains(pkg.Diags[0].Message, "unknown assumption cold-strat") ||
		!strings.Contains(pkg.Diags[0].Hint, "cold-start") {
		t.Fatalf("diagnostics: %v", pkg.Diags)
	}
	// The calculation still runs.
	if calc := pkg.Sheets[0].Calc; calc.Result(calc.Lookup("T_w")).Value != 393.15 {
		t.Errorf("T_w not evaluated: %+v", calc.Result(calc.Lookup("T_w")))
	}
}
