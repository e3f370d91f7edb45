package units

import (
	"math"
	"testing"
)

// Conversion factors of NIST Special Publication 811 (2008 edition),
// Appendix B.8 "Factors for units listed alphabetically". Each row names the
// B.8 entry as NIST prints it, the SI unit NIST converts to, and the factor.
//
// The factors were read from a transcription of the B.8 table (the web
// version of SP 811, physics.nist.gov/Pubs/SP811/appenB8.html, as tabulated
// in the NISTunits R package, file R/NISTfactors.R), not typed from memory.
// B.8 prints exact factors in bold face; the transcription drops the bold,
// so the exact column is from memory. Every row marked exact is also exact
// by definition (1959 yard and pound, standard gravity 9.806 65 m/s², the
// 1954 standard atmosphere, the thermochemical calorie), as the notes say.
//
// A rounded factor is compared within half a unit in NIST's seventh figure
// (which bounds the relative error by 5e-7); an exact one within float64
// round-off (1e-15 relative), because a decimal such as 0.0254 has no
// exact binary form.
var nistB8 = []struct {
	entry  string  // B.8 entry
	sym    string  // sheaf spelling
	si     string  // the SI unit B.8 converts to
	factor float64 // as printed in B.8
	exact  bool    // bold in B.8 (from memory, see above)
}{
	// Length.
	{"inch (in)", "in", "m", 2.54e-02, true},
	{"foot (ft)", "ft", "m", 3.048e-01, true},
	{"mil (0.001 in)", "mil", "m", 2.54e-05, true},
	{"mil (0.001 in), via the alias thou", "thou", "m", 2.54e-05, true},
	{"mile (mi)", "mi", "m", 1.609344e+03, true},
	{"yard (yd)", "yd", "m", 9.144e-01, true},
	{"ångström (Å)", "Å", "m", 1.0e-10, true},
	// Area and volume.
	{"circular mil", "cmil", "m^2", 5.067075e-10, false},
	{"square inch (in²)", "in^2", "m^2", 6.4516e-04, true},
	{"square foot (ft²)", "ft^2", "m^2", 9.290304e-02, true},
	{"hectare (ha)", "ha", "m^2", 1.0e+04, true},
	{"cubic inch (in³)", "in^3", "m^3", 1.638706e-05, false},
	{"gallon (U.S.) (gal)", "gal", "m^3", 3.785412e-03, false},
	{"liter (L)", "L", "m^3", 1.0e-03, true},
	// Mass.
	{"pound (avoirdupois) (lb)", "lb", "kg", 4.535924e-01, false},
	// B.8 footnote to the pound: exactly 0.453 592 37 kg (from memory; the
	// 1959 international yard and pound agreement).
	{"pound (avoirdupois), footnote: exact value", "lb", "kg", 0.45359237, true},
	{"ounce (avoirdupois) (oz)", "oz", "kg", 2.834952e-02, false},
	{"ton, metric (t)", "t", "kg", 1.0e+03, true},
	// Force and pressure.
	{"pound-force (lbf)", "lbf", "N", 4.448222e+00, false},
	{"kilogram-force (kgf)", "kgf", "N", 9.80665e+00, true},
	{"dyne (dyn)", "dyn", "N", 1.0e-05, true},
	{"pound-force per square inch (psi) (lbf/in²)", "psi", "Pa", 6.894757e+03, false},
	{"pound-force per square inch, written lbf/in²", "lbf/in^2", "Pa", 6.894757e+03, false},
	{"bar (bar)", "bar", "Pa", 1.0e+05, true},
	{"millibar (mbar)", "mbar", "Pa", 1.0e+02, true},
	{"atmosphere, standard (atm)", "atm", "Pa", 1.01325e+05, true},
	{"torr (Torr)", "Torr", "Pa", 1.333224e+02, false},
	{"millimeter of mercury, conventional (mmHg)", "mmHg", "Pa", 1.333224e+02, false},
	// Energy, power, torque.
	{"erg (erg)", "erg", "J", 1.0e-07, true},
	{"calorie_th (cal_th)", "cal", "J", 4.184e+00, true},
	{"kilocalorie_th (kcal_th)", "kcal", "J", 4.184e+03, true},
	{"British thermal unit_IT (Btu_IT)", "Btu", "J", 1.055056e+03, false},
	{"British thermal unit_IT per hour (Btu_IT/h)", "Btu/h", "W", 2.930711e-01, false},
	{"watt hour (W · h)", "Wh", "J", 3.6e+03, true},
	{"kilowatt hour (kW · h)", "kWh", "J", 3.6e+06, true},
	{"kilowatt hour, written kW·h", "kW*h", "J", 3.6e+06, true},
	// B.8 prints the electronvolt from the CODATA value of its day; since
	// 2019 e is exact and 1.602 176 634e-19 J rounds to the same 7 figures.
	{"electronvolt (eV)", "eV", "J", 1.602177e-19, false},
	{"horsepower (550 ft · lbf/s) (hp)", "hp", "W", 7.456999e+02, false},
	{"foot pound-force per second (ft · lbf/s)", "ft*lbf/s", "W", 1.355818e+00, false},
	{"pound-force foot (lbf · ft)", "lbf*ft", "N*m", 1.355818e+00, false},
	// CGS electromagnetic units.
	{"gauss (Gs, G)", "G", "T", 1.0e-04, true},
	{"gauss (Gs, G), symbol Gs", "Gs", "T", 1.0e-04, true},
	{"maxwell (Mx)", "Mx", "Wb", 1.0e-08, true},
	{"oersted (Oe)", "Oe", "A/m", 7.957747e+01, false},
	// NIST writes the gilbert Gi; sheaf's table uses Gb (see the report).
	{"gilbert (Gi)", "Gb", "A", 7.957747e-01, false},
	// Plane angle.
	{"degree (°)", "°", "rad", 1.745329e-02, false},
	{"degree (°), via the alias deg", "deg", "rad", 1.745329e-02, false},
	{"minute (′)", "′", "rad", 2.908882e-04, false},
	{"second (″)", "″", "rad", 4.848137e-06, false},
	// Time.
	{"minute (min)", "min", "s", 6.0e+01, true},
	{"hour (h)", "h", "s", 3.6e+03, true},
	{"day (d)", "d", "s", 8.64e+04, true},
	// Velocity.
	{"mile per hour (mi/h)", "mph", "m/s", 4.4704e-01, true},
	{"mile per hour, written mi/h", "mi/h", "m/s", 4.4704e-01, true},
	{"kilometer per hour (km/h)", "km/h", "m/s", 2.777778e-01, false},
	{"knot (nautical mile per hour)", "kn", "m/s", 5.144444e-01, false},
	{"foot per minute (ft/min)", "ft/min", "m/s", 5.08e-03, true},
	// Flow and density.
	{"gallon (U.S.) per minute (gpm) (gal/min)", "gal/min", "m^3/s", 6.30902e-05, false},
	{"pound per cubic foot (lb/ft³)", "lb/ft^3", "kg/m^3", 1.601846e+01, false},
}

func TestNISTSP811AppendixB8(t *testing.T) {
	if len(nistB8) < 30 {
		t.Fatalf("only %d NIST rows; the suite promises at least 30", len(nistB8))
	}
	for _, r := range nistB8 {
		u, err := Parse(r.sym)
		if err != nil {
			t.Errorf("%s: Parse(%q): %v", r.entry, r.sym, err)
			continue
		}
		si := mustParse(t, r.si)
		if u.Dim != si.Dim {
			t.Errorf("%s: %q has dimension %s, NIST converts it to %s (%s)", r.entry, r.sym, u.Dim, r.si, si.Dim)
		}
		if u.Offset != 0 {
			t.Errorf("%s: %q has an offset %g; only °C and °F should", r.entry, r.sym, u.Offset)
		}
		want := r.factor * si.Scale // si.Scale is 1 for every coherent target
		if r.exact {
			if e := relErr(u.Scale, want); e > 1e-15 {
				t.Errorf("%s: 1 %s = %.17g %s, NIST (exact) %.17g; relative error %.2g",
					r.entry, r.sym, u.Scale, r.si, want, e)
			}
			continue
		}
		if diff := math.Abs(u.Scale - want); diff > halfLastFigure(want)*(1+1e-9) {
			t.Errorf("%s: 1 %s = %.10g %s, NIST prints %.7g; off by %.3g, more than the rounding of 7 figures",
				r.entry, r.sym, u.Scale, r.si, want, diff)
		}
		if e := relErr(u.Scale, want); e > 5e-7 {
			t.Errorf("%s: relative error %.3g > 5e-7", r.entry, e)
		}
	}
}

// Temperatures are conversions with an offset, B.8's formulas
// T/K = (t/°F + 459.67)/1.8 and T/K = t/°C + 273.15, not factors.
func TestNISTTemperatureConversions(t *testing.T) {
	cases := []struct {
		entry  string
		sym    string
		in     float64
		kelvin float64
	}{
		{"degree Fahrenheit: water boils", "°F", 212, 373.15},
		{"degree Fahrenheit: water freezes", "°F", 32, 273.15},
		{"degree Fahrenheit: the scales cross", "degF", -40, 233.15},
		{"degree Fahrenheit: absolute zero", "℉", -459.67, 0},
		{"degree Celsius: water freezes", "°C", 0, 273.15},
		{"degree Celsius: water boils", "degC", 100, 373.15},
		{"degree Celsius: the scales cross", "℃", -40, 233.15},
		{"degree Celsius: absolute zero", "°C", -273.15, 0},
	}
	for _, c := range cases {
		u := mustParse(t, c.sym)
		if u.Dim != DimOf(Temperature) || u.Kind != AbsTemp {
			t.Errorf("%s: %q is %s of kind %s, want Θ, absolute temperature", c.entry, c.sym, u.Dim, u.Kind)
		}
		got := u.ToSI(c.in)
		if math.Abs(got-c.kelvin) > 1e-12*373.15 {
			t.Errorf("%s: %g %s = %.15g K, want %g K", c.entry, c.in, c.sym, got, c.kelvin)
		}
		if back := u.FromSI(c.kelvin); math.Abs(back-c.in) > 1e-12*500 {
			t.Errorf("%s: %g K = %.15g %s, want %g", c.entry, c.kelvin, back, c.sym, c.in)
		}
	}
	// A temperature interval of 1 °F is 5/9 K (B.8: 5.555 556 E-01).
	if f := mustParse(t, "°F").Scale; math.Abs(f-5.555556e-01) > halfLastFigure(5.555556e-01) {
		t.Errorf("°F interval = %.10g K, NIST prints 5.555 556 E-01", f)
	}
}

// B.8: "revolution per minute (rpm) (r/min)" to radian per second,
// 1.047 198 E-01. sheaf keeps rpm a rotational frequency (cycles per
// second), so the 2π belongs to the formula: here, to the test.
func TestNISTRevolutionPerMinute(t *testing.T) {
	for _, sym := range []string{"rpm", "r/min"} {
		u := mustParse(t, sym)
		if u.Dim != (Dim{Time: -1}) || u.Kind != Cycle {
			t.Errorf("%q: dimension %s kind %s, want T⁻¹ cycles", sym, u.Dim, u.Kind)
		}
		if relErr(u.Scale, 1.0/60) > 1e-15 {
			t.Errorf("%q: scale %.17g, want 1/60 s⁻¹", sym, u.Scale)
		}
		omega := 2 * math.Pi * u.Scale
		const nist = 1.047198e-01
		if math.Abs(omega-nist) > halfLastFigure(nist) {
			t.Errorf("1 %s × 2π = %.10g rad/s, NIST prints 1.047 198 E-01", sym, omega)
		}
	}
	// B.8: revolution (r) = 6.283 185 rad; r/s is one revolution per second.
	rps := mustParse(t, "r/s")
	if rps.Kind != Cycle || math.Abs(2*math.Pi*rps.Scale-6.283185) > halfLastFigure(6.283185) {
		t.Errorf("r/s: kind %s, 2π × scale = %.10g, want cycles and 6.283 185", rps.Kind, 2*math.Pi*rps.Scale)
	}
	if k := mustParse(t, "rad/s").Kind; k != Angle {
		t.Errorf("rad/s kind %s, want angle", k)
	}
}
