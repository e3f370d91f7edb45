package render

import (
	"strings"
	"testing"
)

// A phasor shows as its magnitude in its unit ∠ its angle in degrees, in
// the result and where a formula substitutes it; formulas show ∠ and an
// imaginary literal's j as written. Values invented (Tarnwick Weir).
func TestPhasorsShowAsMagnitudeAngle(t *testing.T) {
	sheet := "# Excitation\n\n```sheaf\nV = 6.35 kV ∠ 0 deg ; phase voltage\nI = 525 A /_ -31.79 deg ; armature current\n" +
		"Z_s = 0.04 Ω + 11.5j Ω ; synchronous impedance\nE [kV] = V + I * Z_s ; excitation EMF\nI_b = 3 A + 4j A\nS = (2 A + 1 A) ∠ 10 deg\nP = E * conj(I)\n```\n"
	pkg, pages := build(t, map[string]string{"exc.md": sheet})
	page := pages["sheets/exc.html"]
	for _, want := range []string{
		// E = V + I·Z_s = 6.350 kV∠0° + 525.0 A∠−31.79°·11.50 Ω∠89.80° = 10.83 kV∠28.20°
		"<mn>10.83</mn><mspace width=\"0.2em\"></mspace><mtext>kV</mtext><mo>∠</mo><mn>28.20</mn><mo>°</mo>",
		"<mo>∠</mo><mrow><mo>−</mo><mn>31.79</mn></mrow><mo>°</mo>",
		// 11.5j Ω as written: the number, then j.
		"<mrow><mn>11.5</mn><mi>j</mi></mrow>",
		// (2 A + 1 A) ∠ 10°: the sum in parentheses.
		"<mrow><mrow><mo>(</mo><mrow><mn>2</mn>",
		// conj(I) as I*.
		"<msup><mrow><mi>I</mi></mrow><mo>*</mo></msup>",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("sheet page lacks %q", want)
		}
	}
	var lines []string
	for _, st := range pkg.Sheets[0].Calc.Statements {
		lines = append(lines, TerminalLine(st, pkg.Sheets[0].Calc.Result(st), 4))
	}
	text := strings.Join(lines, "\n")
	for _, want := range []string{"E = 10.83 kV ∠ 28.20°", "Z_s = 11.50 Ω ∠ 89.80°", "I_b = 5.000 A ∠ 53.13°", "S = 3.000 A ∠ 10.00°"} {
		if !strings.Contains(text, want) {
			t.Errorf("terminal lacks %q in\n%s", want, text)
		}
	}
}

// A list of phasors shows each element as its magnitude ∠ its angle, the
// magnitudes in the list's one unit: inline for a short list, and in the
// table of values for a long one; in the terminal too. Values invented
// (Tarnwick Weir): the three phase voltages, and twelve phasors 30° apart.
func TestPhasorListsShowAsMagnitudeAngle(t *testing.T) {
	sheet := "# Phases\n\n```sheaf\nV_ph = 6.35 kV ; phase voltage ; source: invented\nU = V_ph ∠ [0 deg, -120 deg, 120 deg] ; phases a, b, c\n" +
		"th [deg] = 0 deg .. 330 deg by 30 deg\nW = 1 A ∠ th\nU_b = U[2]\n```\n"
	pkg, pages := build(t, map[string]string{"ph.md": sheet})
	page := pages["sheets/ph.html"]
	for _, want := range []string{
		"<mn>6.350</mn><mo>∠</mo><mn>0</mn><mo>°</mo><mo>,</mo><mn>6.350</mn><mo>∠</mo><mrow><mo>−</mo><mn>120.0</mn></mrow><mo>°</mo>",
		"<td>1.000 ∠ 150.0°</td>", // the 6th of the twelve, in the table of values
	} {
		if !strings.Contains(page, want) {
			t.Errorf("sheet page lacks %q", want)
		}
	}
	var lines []string
	for _, st := range pkg.Sheets[0].Calc.Statements {
		lines = append(lines, TerminalLine(st, pkg.Sheets[0].Calc.Result(st), 4))
	}
	text := strings.Join(lines, "\n")
	for _, want := range []string{"U = [6.350 ∠ 0°, 6.350 ∠ -120.0°, 6.350 ∠ 120.0°] kV", "U_b = 6.350 kV ∠ -120.0°",
		"W = [1.000 ∠ 0°, 1.000 ∠ 30.00°, 1.000 ∠ 60.00°, …, 1.000 ∠ -30.00°] A (12 values)"} {
		if !strings.Contains(text, want) {
			t.Errorf("terminal lacks %q in\n%s", want, text)
		}
	}
}
