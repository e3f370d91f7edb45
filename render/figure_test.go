package render

import (
	"regexp"
	"strings"
	"testing"
)

// The sheets below use invented values in the Tarnwick Weir scenario.

const figureSheet = "# Coil EMF\n\n```sheaf\n" +
	"theta [deg] = 0 deg .. 360 deg by 5 deg ; electrical rotor angle\n" +
	"Lambda = 0.44 Wb ; peak flux linkage of the coil\n" +
	"lambda_s = series(Lambda * (sin(theta) + 0.03 * sin(5 * theta)), theta) ; flux linkage against rotor angle\n" +
	"omega = 2 * pi * 50 Hz ; electrical angular speed\n" +
	"e [V] = -omega * deriv(lambda_s) ; coil EMF ; draw: spectrum\n" +
	"V = 398 V ∠ 0 deg ; terminal voltage per phase\n" +
	"I = 105 A ∠ -36.87 deg ; armature current, lagging\n" +
	"U_Z = I * (0.02 ohm + 1j * 4.0 ohm) ; drop across the synchronous impedance ; draw: phasors V, U_Z, E\n" +
	"E = V + U_Z ; excitation EMF\n" +
	"```\n"

func figures(page string) []string {
	return regexp.MustCompile(`(?s)<figure class="fig">.*?</figure>`).FindAllString(page, -1)
}

// A series shows a plot of y against x under its result, its axes
// labelled quantity / unit in the units the result shows.
func TestSeriesHasAPlotWithAxes(t *testing.T) {
	_, pages := build(t, map[string]string{"emf.md": figureSheet})
	page := pages["sheets/emf.html"]
	figs := figures(page)
	if len(figs) != 4 { // λ_s, e, e's spectrum, the phasors
		t.Fatalf("%d figures, want 4", len(figs))
	}
	for i, want := range [][]string{
		{`<svg class="plot"`, ">θ / °</text>", ">λ_s / mWb</text>", "<figcaption>λ_s against θ</figcaption>"},
		{">θ / °</text>", ">e / V</text>", "<figcaption>e against θ</figcaption>"},
	} {
		for _, w := range want {
			if !strings.Contains(figs[i], w) {
				t.Errorf("figure %d lacks %q", i+1, w)
			}
		}
	}
	// The plot follows the result and lies inside the statement's row.
	row := page[strings.Index(page, `id="L8"`):] // e, on line 8
	if r, f := strings.Index(row[1:], `<div class="row`), strings.Index(row, `<figure class="fig">`); f < 0 || f > r {
		t.Errorf("e's plot is not inside its row")
	}
	if strings.Contains(page, "<script") {
		t.Error("the page holds a script")
	}
}

// draw: spectrum adds the harmonics as shares of the fundamental: the
// 5th of a flux linkage with 3 % of it gives 15 % in the EMF, since
// e = −ω·dλ/dθ multiplies the k-th harmonic by k (differentiation of a
// Fourier series term by term; any calculus text, from memory), and A_1 =
// ω·Λ = 138.2 V, which the central differences at h = 5° damp by
// sin(h)/h = 0.99873 to 138.1 V (the 5th to 14.5 %, labelled 15).
func TestDrawSpectrum(t *testing.T) {
	_, pages := build(t, map[string]string{"emf.md": figureSheet})
	f := figures(pages["sheets/emf.html"])[2]
	for _, want := range []string{">harmonic order k</text>", ">A_k/A_1 / %</text>", ">100</text>", ">15</text>", ">25</text>",
		"Harmonics of e up to the 25th", "A_1 = 138.1 V"} {
		if !strings.Contains(f, want) {
			t.Errorf("the spectrum lacks %q", want)
		}
	}
}

// draw: phasors draws V, then U_Z from V's tip, then E = V + U_Z from the
// origin, each labelled with its value: |U_Z| = 105 A · |0.02 + 4j| Ω =
// 420.0 V at −36.87° + atan(4/0.02) = 52.84°.
func TestDrawPhasors(t *testing.T) {
	_, pages := build(t, map[string]string{"emf.md": figureSheet})
	f := figures(pages["sheets/emf.html"])[3]
	for _, want := range []string{">V 398.0 V ∠ 0°</text>", ">U_Z 420.0 V ∠ 52.84°</text>", ">E ", "drawn tip to tail", " V</text>"} {
		if !strings.Contains(f, want) {
			t.Errorf("the phasor diagram lacks %q", want)
		}
	}
}

// A spectrum the run cannot give (the series is not one period) is a
// note that says where it was asked for, and the page still builds.
func TestSpectrumNotDrawnSaysWhere(t *testing.T) {
	sheet := "# Ramp\n\n```sheaf\ntheta [deg] = 0 deg .. 360 deg by 10 deg\nr = series(theta / 1 deg * 1 V, theta) ; draw: spectrum\n```\n"
	_, pages := build(t, map[string]string{"ramp.md": sheet})
	page := pages["sheets/ramp.html"]
	if !strings.Contains(page, `<p class="note fig-missing">ramp.md:5:`) || !strings.Contains(page, "not periodic") {
		t.Errorf("the page does not say why the spectrum is missing")
	}
	if n := len(figures(page)); n != 1 {
		t.Errorf("%d figures, want the plot of r alone", n)
	}
}

// A draw note the checker refuses is a located error on the page.
func TestBadDrawIsAnError(t *testing.T) {
	sheet := "# Bad\n\n```sheaf\nx = 2 V ; draw: spectrum\nV = 1 V ∠ 0 deg ; draw: phasors V, W\n```\n"
	pkg, pages := build(t, map[string]string{"bad.md": sheet})
	var errs []string
	for _, d := range pkg.Sheets[0].Calc.Diags {
		errs = append(errs, d.Error())
	}
	all := strings.Join(errs, "\n")
	for _, want := range []string{"bad.md:4:11: x is not a series", "bad.md:5:19: unknown name W"} {
		if !strings.Contains(all, want) {
			t.Errorf("errors lack %q:\n%s", want, all)
		}
		if !strings.Contains(pages["sheets/bad.html"], want[strings.Index(want, ": ")+2:]) {
			t.Errorf("the page does not show %q", want)
		}
	}
}
