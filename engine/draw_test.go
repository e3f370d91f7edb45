package engine_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// Draw notes: what a good one asks for, and each bad one a located error
// that leaves its statement computed. The values are invented.
func TestDrawNotes(t *testing.T) {
	calc := engine.Compile(sheetOf("d.md",
		"theta = 0 deg .. 360 deg by 10 deg",
		"e = series(sin(theta) * 1 V, theta) ; coil EMF ; draw: spectrum",
		"V = 230 V ∠ 0 deg",
		"I = 10 A ∠ -30 deg",
		"Z = 0.1 ohm + 1j * 2 ohm",
		"IZ = I * Z ; draw: phasors V, IZ, E",
		"E = V + IZ ; draw: Phasors V, IZ, E ; draw: phasors V, I",
		"x = 2 V ; draw: spectrum",
		"c = series([1 V, 2 V, 3 V, 2 V, 1 V], [0 s, 1 s, 2 s, 3 s, 4 s]) ; draw: spectrum",
		"u = series(sin(theta) * 1 V, [0 deg, 10 deg, 25 deg, 30 deg, 40 deg, 50 deg, 60 deg, 70 deg, 80 deg, 90 deg, 100 deg, 110 deg, 120 deg, 130 deg, 140 deg, 150 deg, 160 deg, 170 deg, 180 deg, 190 deg, 200 deg, 210 deg, 220 deg, 230 deg, 240 deg, 250 deg, 260 deg, 270 deg, 280 deg, 290 deg, 300 deg, 310 deg, 320 deg, 330 deg, 340 deg, 350 deg, 360 deg]) ; draw: spectrum",
		"w = V ; draw: phasors V, Q",
		"y = V ; draw: histogram",
		"z = V ; draw: phasors V, , E",
	))
	var got []string
	for _, d := range calc.Diags {
		got = append(got, d.Error())
	}
	all := strings.Join(got, "\n")
	for _, want := range []string{
		"d.md:8:39: I is current (A) and E is voltage (V)", // a current in a diagram of voltages
		"d.md:9:11: x is not a series",                     // spectrum on a single value
		"d.md:10:68: c has 4 samples per period",           // too coarse for harmonics
		"d.md:11:356: u is sampled unevenly",
		"d.md:12:9: unknown name Q",
		`d.md:13:9: sheaf draws no "histogram"`,
		`d.md:14:9: "" is not a name`,
	} {
		if !strings.Contains(all, want) {
			t.Errorf("diagnostics lack %q; have:\n%s", want, all)
		}
	}
	if n := len(got); n != 7 {
		t.Errorf("%d diagnostics, want 7:\n%s", n, all)
	}
	calc.Evaluate()
	for _, name := range []string{"e", "E", "x", "w"} {
		if r := calc.Result(calc.Lookup(name)); r.Status != engine.OK {
			t.Errorf("%s: %v %v; a bad draw note must not stop the value", name, r.Status, r.Err)
		}
	}
	ds := calc.Drawings(calc.Lookup("E"))
	if len(ds) != 1 || ds[0].Kind != engine.DrawPhasors || strings.Join(ds[0].Names, " ") != "V IZ E" {
		t.Errorf("E's drawings: %+v, want the one good diagram of V, IZ, E", ds)
	}
	if ds := calc.Drawings(calc.Lookup("e")); len(ds) != 1 || ds[0].Kind != engine.DrawSpectrum {
		t.Errorf("e's drawings: %+v, want a spectrum", ds)
	}
	if got := engine.SeriesAxisName(calc.Lookup("e")); got != "theta" {
		t.Errorf("e's axis is named %q, want theta", got)
	}
}

// Harmonics against the closed form of a two-term Fourier series: y =
// 3·sin θ + 0.4·sin 3θ − 0.1·cos 5θ has A_1 = 3, A_3 = 0.4, A_5 = 0.1 and
// no other harmonic (the definition of a Fourier series; e.g. Kreyszig,
// Advanced Engineering Mathematics, 10th ed., §11.1; from memory).
func TestResultHarmonicsAgainstClosedForm(t *testing.T) {
	calc := engine.Compile(sheetOf("h.md", "theta = 0 deg .. 360 deg by 5 deg",
		"y = series((3 * sin(theta) + 0.4 * sin(3 * theta) - 0.1 * cos(5 * theta)) * 1 V, theta)",
		"s = 2 V"))
	calc.Evaluate()
	r := calc.Result(calc.Lookup("y"))
	a, err := r.Harmonics(100)
	if err != nil {
		t.Fatal(err)
	}
	// 72 samples a period resolve harmonics up to (72 − 1)/2 = 35.
	if len(a) != 35 {
		t.Fatalf("%d harmonics, want the 35 that 72 samples resolve", len(a))
	}
	want := map[int]float64{1: 3, 3: 0.4, 5: 0.1}
	for k := 1; k <= len(a); k++ {
		if math.Abs(a[k-1]-want[k]) > 1e-12 {
			t.Errorf("A_%d = %.15g V, want %g V", k, a[k-1], want[k])
		}
	}
	if _, err := calc.Result(calc.Lookup("s")).Harmonics(5); err == nil {
		t.Error("a single value gave harmonics")
	}
	half := r
	half.Over, half.List = r.Over[:37], r.List[:37] // half a period: ends differ
	if _, err := half.Harmonics(5); err == nil || !strings.Contains(err.Error(), "not periodic") {
		t.Errorf("half a period: %v, want not periodic", err)
	}
}

// FuzzDrawNote compiles a sheet whose statements carry a draw note of any
// text: no panic, and every drawing kept is one sheaf draws, of names the
// sheet defines.
func FuzzDrawNote(f *testing.F) {
	for _, seed := range []string{"spectrum", "phasors V, E", "Phasors  V ,E", "phasors", "phasors ,", "phasors V,,E",
		"phasors gen.V, gen.E", "spectrum V", "histogram", "", "phasors V; draw: spectrum", "phasors (V, E)", "phasors é, ∠"} {
		f.Add(seed)
	}
	f.Fuzz(func(t *testing.T, note string) {
		calc := engine.Compile(sheetOf("f.md", "theta = 0 deg .. 360 deg by 30 deg", "V = 1 V ∠ 0 deg",
			"E = V * 2 ; draw: "+note, "s = series(sin(theta) * 1 V, theta) ; draw: "+note))
		for _, name := range []string{"E", "s"} {
			st := calc.Lookup(name)
			if st == nil {
				continue
			}
			for _, d := range calc.Drawings(st) {
				if d.Kind != engine.DrawSpectrum && d.Kind != engine.DrawPhasors {
					t.Fatalf("%s: kept a drawing of kind %q", name, d.Kind)
				}
				for _, n := range d.Names {
					if calc.DrawnPhasor(st, n) == nil {
						t.Fatalf("%s: kept a drawing of unknown %q", name, n)
					}
				}
			}
		}
	})
}
