package render

import (
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

// A short list shows inline with its unit; a long one by its ends inline
// and in full in a table below, ten values a row; formulas show list
// literals, ranges and indexes as written. Values invented.
func TestListsShowInlineOrAsATable(t *testing.T) {
	sheet := "# Turns\n\n```sheaf\n" +
		"phi_k = [2.41 mWb, 2.38 mWb, 2.30 mWb] ; flux linked by each turn group\n" +
		"lambda = sum(phi_k) ; flux linkage\n" +
		"theta [deg] = 0 deg .. 360 deg by 15 deg ; rotor positions\n" +
		"p_2 = phi_k[2]\n" +
		"k = 1 .. 500\n```\n"
	_, pages := build(t, map[string]string{"turns.md": sheet})
	page := pages["sheets/turns.html"]
	for _, want := range []string{
		// φ_k = [2.41 mWb, ...] = [2.410, 2.380, 2.300] mWb
		`<mo fence="true">[</mo><mn>2.410</mn><mo>,</mo><mn>2.380</mn><mo>,</mo><mn>2.300</mn><mo fence="true">]</mo><mspace width="0.2em"></mspace><mtext>mWb</mtext>`,
		// λ = sum(φ_k) = sum([2.410, 2.380, 2.300] mWb) = 7.090 mWb
		"<mn>7.090</mn>",
		// 0° … 360° by 15°: 25 values, shown by their ends and in a table.
		`<mtext>by</mtext>`, `<mo>…</mo><mo>,</mo><mn>360.0</mn>`, "(25 values)",
		`<table class="list-values"><caption>θ in °</caption>`,
		"<tr><th>21</th><td>300.0</td><td>315.0</td><td>330.0</td><td>345.0</td><td>360.0</td></tr>",
		// An index as written.
		`<mo fence="true">[</mo><mn>2</mn><mo fence="true">]</mo>`,
		// 500 values: rows 1 to 100 and 401 to 500, with those between counted.
		"<tr><th>91</th>", "300 values not shown", "<tr><th>401</th><td>401</td>", "<td>500</td></tr>",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("sheet page lacks %q", want)
		}
	}
	if strings.Contains(page, "<tr><th>101</th>") || strings.Contains(page, "<tr><th>391</th>") {
		t.Error("the table shows rows it should leave out")
	}
}

// A conditional value shows as a piecewise rule: a brace, the value with
// its condition, and the other value with "otherwise".
func TestChoiceShowsAsAPiecewiseRule(t *testing.T) {
	sheet := "# Knee\n\n```sheaf\nB = 1.62 T ; flux density\nB_s = 1.5 T ; knee\nk_s = 1 when B <= B_s else B_s / B ; saturation factor\n```\n"
	_, pages := build(t, map[string]string{"knee.md": sheet})
	page := pages["sheets/knee.html"]
	for _, want := range []string{
		`<mo fence="true" stretchy="true">{</mo><mtable columnalign="left"><mtr><mtd><mn>1</mn></mtd><mtd><mtext>when</mtext>`,
		`<mtd><mtext>otherwise</mtext></mtd></mtr></mtable></mrow>`,
		// 1.5 T / 1.62 T = 0.9259.
		"<mn>0.9259</mn>",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("sheet page lacks %q", want)
		}
	}
}

// A function of the sheet shows its definition with its parameters and no
// value; a call shows as written, with its value. Values from the
// closed form sin(7/9 · 90°) = 0.9397.
func TestSheetFunctionShowsDefinitionAndCalls(t *testing.T) {
	sheet := "# Pitch\n\n```sheaf\ny = 7 / 9 ; coil pitch over pole pitch\nk_p(nu) = sin(nu * y * pi / 2) ; pitch factor\nk_p1 = k_p(1) ; fundamental\n```\n"
	_, pages := build(t, map[string]string{"pitch.md": sheet})
	page := pages["sheets/pitch.html"]
	for _, want := range []string{
		`<div class="row def function" id="`,
		"<mo>\u2061</mo><mrow><mo>(</mo><mi>ν</mi><mo>)</mo></mrow></mrow><mo>=</mo>",
		"<mo>\u2061</mo><mrow><mo>(</mo><mn>1</mn><mo>)</mo></mrow></mrow>",
		"<mn>0.9397</mn>",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("sheet page lacks %q", want)
		}
	}
}

// The same sheet of lists, conditional values and functions gives the same
// bytes, page and JSON, build after build.
func TestListsRenderDeterministically(t *testing.T) {
	files := map[string]string{"turns.md": "# Turns\n\n```sheaf\nphi_k = [2.41 mWb, 2.38 mWb, 2.30 mWb] ; flux per turn group\nlambda = sum(phi_k)\n" +
		"k_p(nu) = sin(nu * 7 / 9 * pi / 2) ; pitch factor\nw = k_p([1, 5, 7])\n```\n"}
	files["more.md"] = "# More\n\n```sheaf\nk = 1 .. 300\nx = 2 when count(k) > 10 else 3\nf(a, b) = a * b + x\ny = f(k, 2)\nz = frob(k)\n```\n"
	_, first := build(t, files)
	_, second := build(t, files)
	for name, page := range first {
		if page != second[name] {
			t.Errorf("%s differs between two renders", name)
		}
	}
	in := map[string][]byte{}
	for k, v := range files {
		in[k] = []byte(v)
	}
	a, errA := JSON(project.FromFiles("pkg", in), Options{Version: "test"})
	b, errB := JSON(project.FromFiles("pkg", in), Options{Version: "test"})
	if errA != nil || errB != nil || string(a) != string(b) {
		t.Errorf("the JSON differs between two builds (%v, %v)", errA, errB)
	}
}
