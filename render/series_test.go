package render

import (
	"strings"
	"testing"
)

// A series shows compactly: its y values by their ends, in y's unit, the
// span of its x in x's unit and its number of samples, and no table of
// values (the JSON holds them all). The coil is invented (seriesSheets).
func TestSeriesShowsLengthSpanAndUnits(t *testing.T) {
	sheet := "# Coil EMF waveform\n\n```sheaf\ntheta [deg] = 0 deg .. 360 deg by 5 deg ; electrical rotor angle\n" +
		"Lambda = 0.44 Wb ; peak flux linkage of the coil ; source: invented\n" +
		"lambda_c = Lambda * (sin(theta) + 0.03 * sin(5 * theta)) ; flux linkage\n" +
		"lambda_s = series(lambda_c, theta) ; flux linkage against rotor angle\n" +
		"omega = 2 * pi * 50 Hz ; electrical angular speed\ne = -omega * deriv(lambda_s) ; coil EMF\n```\n"
	_, pages := build(t, map[string]string{"coil-emf.md": sheet})
	page := pages["sheets/coil-emf.html"]
	for _, want := range []string{
		// λ_s in mWb over the rotor angle in degrees; e in volts over the same.
		`<mtext>mWb</mtext><mspace width="0.4em"></mspace><mtext>over 0 … 360.0° (73 samples)</mtext>`,
		`<mtext>V</mtext><mspace width="0.4em"></mspace><mtext>over 0 … 360.0° (73 samples)</mtext>`,
	} {
		if !strings.Contains(page, want) {
			t.Errorf("sheet page lacks %q", want)
		}
	}
	// Tables of values for θ and λ_c, the two lists; none for the series.
	if n := strings.Count(page, `<table class="list-values">`); n != 2 {
		t.Errorf("the page has %d tables of values, want 2 (the lists, not the series)", n)
	}
}
