package units

import (
	"math"
	"strings"
	"testing"
)

// FormatNumber's doc comment: sig significant figures with trailing zeros
// kept; plain decimals from 0.001 up to (not including) a million, an
// exponent otherwise; the notation is chosen after rounding; ASCII minus.
func TestFormatNumber(t *testing.T) {
	cases := []struct {
		x    float64
		sig  int
		want string
	}{
		{0.92, 4, "0.9200"}, // trailing zeros state the precision
		{-0.92, 4, "-0.9200"},
		{999.96, 4, "1000"}, // rounds to 1000, not 1000.0
		{1234567, 4, "1.235e+06"},
		{-1234567, 4, "-1.235e+06"},
		// 0.00012345 is stored as 1.23449999…e-4, so it rounds down.
		{0.00012345, 4, "1.234e-04"},
		{0.001, 4, "0.001000"},      // the lower bound is plain
		{0.0009999, 4, "9.999e-04"}, // just under it is not
		{0.00099996, 4, "0.001000"}, // unless rounding lifts it to 0.001
		{999999.4, 4, "1.000e+06"},  // rounding lifts it to a million
		// No more than four digits before the decimal point: past 9999 a
		// power of ten (issue: no result shows five digits unprefixed).
		{999400, 4, "9.994e+05"},
		{9999, 4, "9999"},
		{9999.6, 4, "1.000e+04"}, // rounding lifts it to five digits
		{12345, 4, "1.234e+04"},  // 12345 is held exactly: half rounds to even
		{12.5, 4, "12.50"},
		{100, 4, "100.0"},
		{1000, 4, "1000"},
		{2.5e-3, 3, "0.00250"},
		{6.02214076e23, 4, "6.022e+23"},
		{-1.6e-19, 2, "-1.6e-19"},
		// Zero, NaN and infinities.
		{0, 4, "0"},
		{math.Copysign(0, -1), 4, "0"},
		{math.NaN(), 4, "NaN"},
		{math.Inf(1), 4, "+Inf"},
		{math.Inf(-1), 4, "-Inf"},
		// One figure and fifteen.
		{0.92, 1, "0.9"},
		{95, 1, "100"},
		{0.96, 1, "1"},
		{-0.00004, 1, "-4e-05"},
		{0.1, 15, "0.100000000000000"},
		{1.0 / 3, 15, "0.333333333333333"},
		{123456.789, 15, "1.23456789000000e+05"},
		{1234.56789, 15, "1234.56789000000"},
		{math.Pi * 1e8, 15, "3.14159265358979e+08"},
		// Out-of-range figures are clamped to 1 and 17.
		{0.92, 0, "0.9"},
		{0.92, -3, "0.9"},
		{0.1, 20, "0.10000000000000001"},
	}
	for _, c := range cases {
		if got := FormatNumber(c.x, c.sig); got != c.want {
			t.Errorf("FormatNumber(%v, %d) = %q, want %q", c.x, c.sig, got, c.want)
		}
	}
}

// countFigures counts the significant figures of a formatted number that
// shows its precision (a decimal point or an exponent); ok is false for a
// plain integer such as "123500", whose trailing zeros are ambiguous.
func countFigures(s string) (int, bool) {
	mant, _ := SplitExponent(strings.TrimPrefix(s, "-"))
	if !strings.ContainsAny(s, ".e") {
		return 0, false
	}
	return len(strings.TrimLeft(strings.Replace(mant, ".", "", 1), "0")), true
}

// Every figure count from 1 to 17, on values just below, at and just above
// powers of ten, where a Log10-based exponent used to be off by one (sheaf
// printed 999.9999999999999 to 16 figures with 15).
func TestFormatNumberFigureCount(t *testing.T) {
	for k := -8; k <= 8; k++ {
		p := math.Pow10(k)
		for _, x := range []float64{p, math.Nextafter(p, 0), math.Nextafter(p, math.Inf(1)), p * (1 - 1e-16), 3 * p, -p} {
			for sig := 1; sig <= 17; sig++ {
				s := FormatNumber(x, sig)
				if n, ok := countFigures(s); ok && n != sig {
					t.Errorf("FormatNumber(%.17g, %d) = %q has %d figures", x, sig, s, n)
				}
			}
		}
	}
}

func TestSplitExponent(t *testing.T) {
	for _, c := range []struct {
		in   string
		mant string
		exp  int
	}{
		{"1.235e+09", "1.235", 9},
		{"1e-04", "1", -4},
		{"-6.022e+23", "-6.022", 23},
		{"0.9200", "0.9200", 0},
		{"NaN", "NaN", 0},
		{"1e+x", "1e+x", 0}, // a broken exponent is left alone
	} {
		m, e := SplitExponent(c.in)
		if m != c.mant || e != c.exp {
			t.Errorf("SplitExponent(%q) = %q, %d; want %q, %d", c.in, m, e, c.mant, c.exp)
		}
	}
}

func TestAutoUnit(t *testing.T) {
	var (
		flux    = mustParse(t, "Wb").Dim
		length  = DimOf(Length)
		mass    = DimOf(Mass)
		fluxDen = mustParse(t, "T").Dim
		area    = d(0, 2, 0, 0, 0, 0, 0)
		perTime = d(-1, 0, 0, 0, 0, 0, 0)
	)
	cases := []struct {
		name  string
		v     float64 // SI value
		dim   Dim
		kind  Kind
		sym   string
		shown float64 // v in that unit
	}{
		{"flux", 0.0294, flux, Plain, "mWb", 29.4},
		{"negative flux", -0.0294, flux, Plain, "mWb", -29.4},
		{"length", 2.5e-3, length, Plain, "mm", 2.5},
		{"length", 1500, length, Plain, "km", 1.5},
		{"mass below a kilogram", 0.5, mass, Plain, "g", 500},
		{"mass", 2, mass, Plain, "kg", 2},
		{"flux density in a gap", 0.8976, fluxDen, Plain, "T", 0.8976},
		{"flux density at the plain limit", 0.01, fluxDen, Plain, "T", 0.01},
		{"small flux density", 5e-3, fluxDen, Plain, "mT", 5},
		{"area", 0.032, area, Plain, "cm²", 320},
		{"area", 2.5e-6, area, Plain, "mm²", 2.5},
		{"area", 4, area, Plain, "m²", 4},
		{"volume", 2e-5, d(0, 3, 0, 0, 0, 0, 0), Plain, "cm³", 20},
		{"time: submultiples only", 1.5e-3, DimOf(Time), Plain, "ms", 1.5},
		{"time: never ks", 5400, DimOf(Time), Plain, "s", 5400},
		{"capacitance", 4.7e-6, mustParse(t, "F").Dim, Plain, "µF", 4.7},
		{"voltage", 230e3, mustParse(t, "V").Dim, Plain, "kV", 230},
		{"zero keeps the plain unit", 0, mustParse(t, "V").Dim, Plain, "V", 0},
		{"absolute temperature", 293.15, DimOf(Temperature), AbsTemp, "°C", 20},
		{"temperature difference", 20, DimOf(Temperature), Plain, "K", 20},
		{"frequency", 50, perTime, Cycle, "Hz", 50},
		{"frequency", 2e3, perTime, Cycle, "kHz", 2},
		{"frequency", 2.5e6, perTime, Cycle, "MHz", 2.5},
		{"angular velocity", 157, perTime, Angle, "rad/s", 157},
		{"plain T⁻¹", 3, perTime, Plain, "1/s", 3},
		{"angle", math.Pi / 2, Dimensionless, Angle, "°", 90},
		{"pure number", 0.5, Dimensionless, Plain, "1", 0.5},
		{"no preferred unit", 3, d(0, 4, 0, 0, 0, 0, 0), Plain, "m⁴", 3},
	}
	for _, c := range cases {
		u := AutoUnit(c.v, c.dim, c.kind)
		if u.Symbol != c.sym {
			t.Errorf("%s: AutoUnit(%g, %s, %s) = %q, want %q", c.name, c.v, c.dim, c.kind, u.Symbol, c.sym)
			continue
		}
		if u.Dim != c.dim && c.sym != "1" {
			t.Errorf("%s: %q has dimension %s, want %s", c.name, u.Symbol, u.Dim, c.dim)
		}
		if got := u.FromSI(c.v); math.Abs(got-c.shown) > 1e-12*math.Max(1, math.Abs(c.shown)) {
			t.Errorf("%s: %g SI shows as %.15g %s, want %g", c.name, c.v, got, u.Symbol, c.shown)
		}
		// The unit it picks must be one Parse reads back the same way.
		if p, err := Parse(u.Symbol); err != nil || relErr(p.Scale, u.Scale) > 1e-15 || p.Dim != u.Dim {
			t.Errorf("%s: %q does not parse back: %+v, %v", c.name, u.Symbol, p, err)
		}
	}
	// NaN and infinities keep the plain unit rather than guess a prefix.
	for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		if u := AutoUnit(v, flux, Plain); u.Symbol != "Wb" {
			t.Errorf("AutoUnit(%g, flux) = %q, want Wb", v, u.Symbol)
		}
	}
}

func TestDescribe(t *testing.T) {
	for _, c := range []struct {
		unit, want string
	}{
		{"V", "voltage (V)"},
		{"Wb", "magnetic flux (Wb)"},
		{"V*s", "magnetic flux (Wb)"},
		{"T", "magnetic flux density (T)"},
		{"A/m", "magnetic field strength (A/m)"},
		{"H/m", "permeability (H/m)"},
		{"N*m", "energy or torque (J)"},
		{"g", "mass (kg)"}, // the coherent unit, although the table holds g
		{"V/A", "resistance (Ω)"},
		{"1/s", "frequency (1/s)"},
		{"m^3", "volume (m³)"},
		{"kg*m^2", "moment of inertia (kg·m²)"},
		{"m^4", "a quantity in m⁴"},
		{"kg/m", "a quantity in kg·m⁻¹"},
		{"V/m^3", "a quantity in kg·m⁻¹·s⁻³·A⁻¹"},
		{"1", "a pure number"},
	} {
		if got := Describe(mustParse(t, c.unit).Dim); got != c.want {
			t.Errorf("Describe(%s) = %q, want %q", c.unit, got, c.want)
		}
	}
}

func TestDimArithmetic(t *testing.T) {
	volt := d(-3, 2, 1, -1, 0, 0, 0)
	amp := DimOf(Current)
	watt := d(-3, 2, 1, 0, 0, 0, 0)
	if got := volt.Mul(amp); got != watt {
		t.Errorf("V·A = %s, want W %s", got, watt)
	}
	if got := watt.Div(amp); got != volt {
		t.Errorf("W/A = %s, want V %s", got, volt)
	}
	if got := volt.Div(volt); !got.IsDimensionless() {
		t.Errorf("V/V = %s", got)
	}
	if got := DimOf(Length).Pow(3); got != d(0, 3, 0, 0, 0, 0, 0) {
		t.Errorf("L^3 = %s", got)
	}
	if got := volt.Pow(-1); got != d(3, -2, -1, 1, 0, 0, 0) {
		t.Errorf("V^-1 = %s", got)
	}
	if got := volt.Pow(0); got != Dimensionless {
		t.Errorf("V^0 = %s", got)
	}
	// Mul and Div return new values; the receiver is unchanged.
	if volt != d(-3, 2, 1, -1, 0, 0, 0) {
		t.Errorf("Mul changed its receiver")
	}
}

func TestDimRootAndPowFits(t *testing.T) {
	area := d(0, 2, 0, 0, 0, 0, 0)
	length := DimOf(Length)
	for _, c := range []struct {
		name string
		in   Dim
		n    int
		want Dim
		ok   bool
	}{
		{"sqrt of an area", area, 2, length, true},
		{"sqrt of T⁻²", d(-2, 0, 0, 0, 0, 0, 0), 2, d(-1, 0, 0, 0, 0, 0, 0), true},
		{"cube root of a volume", d(0, 3, 0, 0, 0, 0, 0), 3, length, true},
		{"sqrt of a length", length, 2, Dim{}, false},
		{"sqrt of a volume", d(0, 3, 0, 0, 0, 0, 0), 2, Dim{}, false},
		{"sqrt of a voltage", d(-3, 2, 1, -1, 0, 0, 0), 2, Dim{}, false},
		{"zeroth root", area, 0, Dim{}, false},
	} {
		got, ok := c.in.Root(c.n)
		if ok != c.ok || (ok && got != c.want) {
			t.Errorf("%s: Root(%d) of %s = %s, %v; want %s, %v", c.name, c.n, c.in, got, ok, c.want, c.ok)
		}
	}
	for _, c := range []struct {
		name string
		in   Dim
		p    float64
		want Dim
		ok   bool
	}{
		{"area^0.5", area, 0.5, length, true},
		{"length^0.5", length, 0.5, Dim{}, false},
		{"length^2", length, 2, area, true},
		{"area^-1.5", area, -1.5, d(0, -3, 0, 0, 0, 0, 0), true},
		{"length^0.3", length, 0.3, Dim{}, false},
		{"length^200 overflows int8", length, 200, Dim{}, false},
		{"pure number^0.5", Dimensionless, 0.5, Dimensionless, true},
		{"length^NaN", length, math.NaN(), Dim{}, false},
	} {
		got, ok := c.in.PowFits(c.p)
		if ok != c.ok || (ok && got != c.want) {
			t.Errorf("%s: PowFits(%g) of %s = %s, %v; want %s, %v", c.name, c.p, c.in, got, ok, c.want, c.ok)
		}
	}
}

func TestDimStrings(t *testing.T) {
	for _, c := range []struct {
		dim                 Dim
		str, ascii, siUnits string
	}{
		{d(-3, 2, 1, -1, 0, 0, 0), "T⁻³ L² M I⁻¹", "T^-3 L^2 M I^-1", "kg·m²·s⁻³·A⁻¹"},
		{d(0, -1, 0, 0, 1, 0, 0), "L⁻¹ Θ", "L^-1 Θ", "m⁻¹·K"},
		{d(-1, 0, 0, 0, 0, 1, 0), "T⁻¹ N", "T^-1 N", "s⁻¹·mol"},
		{d(0, 12, 0, 0, 0, 0, 0), "L¹²", "L^12", "m¹²"},
		{d(0, 0, 0, 0, 0, 0, 1), "J", "J", "cd"},
		{Dimensionless, "1", "1", "1"},
	} {
		if got := c.dim.String(); got != c.str {
			t.Errorf("String() = %q, want %q", got, c.str)
		}
		if got := c.dim.ASCII(); got != c.ascii {
			t.Errorf("ASCII() = %q, want %q", got, c.ascii)
		}
		if got := c.dim.SIUnits(); got != c.siUnits {
			t.Errorf("SIUnits() = %q, want %q", got, c.siUnits)
		}
	}
}

func TestKindAndUnitMethods(t *testing.T) {
	for k, want := range map[Kind]string{Plain: "plain", Angle: "angle", Cycle: "cycles", AbsTemp: "absolute temperature"} {
		if k.String() != want {
			t.Errorf("Kind(%d).String() = %q, want %q", k, k.String(), want)
		}
	}
	degF := mustParse(t, "°F")
	if !degF.IsAffine() || mustParse(t, "K").IsAffine() {
		t.Errorf("IsAffine: °F %v, K %v", degF.IsAffine(), mustParse(t, "K").IsAffine())
	}
	mm := mustParse(t, "mm")
	if got := mm.ToSI(2.5); math.Abs(got-2.5e-3) > 1e-18 {
		t.Errorf("2.5 mm = %g m", got)
	}
	if got := mm.FromSI(2.5e-3); math.Abs(got-2.5) > 1e-12 {
		t.Errorf("2.5e-3 m = %g mm", got)
	}
	if One.Scale != 1 || !One.Dim.IsDimensionless() || One.Symbol != "1" {
		t.Errorf("One = %+v", One)
	}
}
