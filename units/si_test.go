package units

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/unit"
	"gonum.org/v1/gonum/unit/constant"
)

// The 22 coherent derived units with special names, SI Brochure (9th ed.,
// 2019), table 4. base is the column "expressed in terms of SI base units",
// written out with d(T, L, M, I, Θ, N, J); other is the column "expressed in
// terms of other SI units" where the brochure gives one.
var siTable4 = []struct {
	name, sym string
	base      Dim
	other     string
	kind      Kind
}{
	{"radian", "rad", d(0, 0, 0, 0, 0, 0, 0), "", Angle},       // m/m
	{"steradian", "sr", d(0, 0, 0, 0, 0, 0, 0), "", Plain},     // m²/m²
	{"hertz", "Hz", d(-1, 0, 0, 0, 0, 0, 0), "", Cycle},        // s⁻¹
	{"newton", "N", d(-2, 1, 1, 0, 0, 0, 0), "", Plain},        // kg m s⁻²
	{"pascal", "Pa", d(-2, -1, 1, 0, 0, 0, 0), "N/m^2", Plain}, // kg m⁻¹ s⁻²
	{"joule", "J", d(-2, 2, 1, 0, 0, 0, 0), "N*m", Plain},      // kg m² s⁻²
	{"watt", "W", d(-3, 2, 1, 0, 0, 0, 0), "J/s", Active},      // kg m² s⁻³; sheaf: active power (IEC 60050-131)
	{"coulomb", "C", d(1, 0, 0, 1, 0, 0, 0), "", Plain},        // A s
	{"volt", "V", d(-3, 2, 1, -1, 0, 0, 0), "W/A", Plain},      // kg m² s⁻³ A⁻¹
	{"farad", "F", d(4, -2, -1, 2, 0, 0, 0), "C/V", Plain},     // kg⁻¹ m⁻² s⁴ A²
	{"ohm", "Ω", d(-3, 2, 1, -2, 0, 0, 0), "V/A", Plain},       // kg m² s⁻³ A⁻²
	{"siemens", "S", d(3, -2, -1, 2, 0, 0, 0), "A/V", Plain},   // kg⁻¹ m⁻² s³ A²
	{"weber", "Wb", d(-2, 2, 1, -1, 0, 0, 0), "V*s", Plain},    // kg m² s⁻² A⁻¹
	{"tesla", "T", d(-2, 0, 1, -1, 0, 0, 0), "Wb/m^2", Plain},  // kg s⁻² A⁻¹
	{"henry", "H", d(-2, 2, 1, -2, 0, 0, 0), "Wb/A", Plain},    // kg m² s⁻² A⁻²
	{"degree Celsius", "°C", d(0, 0, 0, 0, 1, 0, 0), "", AbsTemp},
	{"lumen", "lm", d(0, 0, 0, 0, 0, 0, 1), "cd*sr", Plain},   // cd sr = cd
	{"lux", "lx", d(0, -2, 0, 0, 0, 0, 1), "lm/m^2", Plain},   // cd sr m⁻²
	{"becquerel", "Bq", d(-1, 0, 0, 0, 0, 0, 0), "", Plain},   // s⁻¹
	{"gray", "Gy", d(-2, 2, 0, 0, 0, 0, 0), "J/kg", Plain},    // m² s⁻²
	{"sievert", "Sv", d(-2, 2, 0, 0, 0, 0, 0), "J/kg", Plain}, // m² s⁻²
	{"katal", "kat", d(-1, 0, 0, 0, 0, 1, 0), "", Plain},      // mol s⁻¹
}

func TestSIDerivedUnitsTable4(t *testing.T) {
	if len(siTable4) != 22 {
		t.Fatalf("table 4 has 22 units, the test lists %d", len(siTable4))
	}
	derived := 0
	for i := range Table {
		if Table[i].Class == DerivedSI {
			derived++
		}
	}
	if derived != 22 {
		t.Errorf("unit table has %d rows of class DerivedSI, SI Brochure table 4 has 22", derived)
	}
	for _, r := range siTable4 {
		u := mustParse(t, r.sym)
		if u.Dim != r.base {
			t.Errorf("%s (%s): dimension %s, SI Brochure table 4 gives %s", r.name, r.sym, u.Dim, r.base)
		}
		if u.Scale != 1 {
			t.Errorf("%s (%s): scale %g, a coherent unit has 1", r.name, r.sym, u.Scale)
		}
		if u.Kind != r.kind {
			t.Errorf("%s (%s): kind %s, want %s", r.name, r.sym, u.Kind, r.kind)
		}
		if def, ok := DefOf(r.sym); !ok || def.Class != DerivedSI || def.Name != r.name {
			t.Errorf("%s (%s): table row %+v, want class DerivedSI named %q", r.name, r.sym, def, r.name)
		}
		if r.other != "" {
			o := mustParse(t, r.other)
			if o.Dim != u.Dim || o.Scale != 1 {
				t.Errorf("%s: %s is %s ×%g, table 4 says it equals %s (%s)", r.name, r.other, o.Dim, o.Scale, r.sym, u.Dim)
			}
		}
	}
	// °C is the kelvin in size, offset by 273.15 (table 4, note).
	if c := mustParse(t, "°C"); c.Offset != 273.15 {
		t.Errorf("°C offset %g, want 273.15", c.Offset)
	}
}

// gonumDim converts gonum's dimension map to a Dim. ok is false when gonum
// uses a dimension sheaf does not have (its angle).
func gonumDim(g unit.Dimensions) (Dim, bool) {
	var out Dim
	for k, v := range g {
		switch k {
		case unit.TimeDim:
			out[Time] = int8(v)
		case unit.LengthDim:
			out[Length] = int8(v)
		case unit.MassDim:
			out[Mass] = int8(v)
		case unit.CurrentDim:
			out[Current] = int8(v)
		case unit.TemperatureDim:
			out[Temperature] = int8(v)
		case unit.MoleDim:
			out[Amount] = int8(v)
		case unit.LuminousIntensityDim:
			out[Luminous] = int8(v)
		default:
			return out, false
		}
	}
	return out, true
}

// An independent check of our dimensions against gonum/unit's types.
// gonum treats the angle as a dimension of its own (AngleDim, symbol rad),
// while the SI makes the radian and steradian 1 (SI Brochure, table 4 and
// its note); so rad, sr and the angular units are not compared with gonum.
// gonum has no type for lumen, lux or katal.
func TestDimensionsAgainstGonum(t *testing.T) {
	cases := []struct {
		sym string
		g   unit.Uniter
	}{
		{"s", unit.Time(1)},
		{"m", unit.Length(1)},
		{"kg", unit.Mass(1)},
		{"A", unit.Current(1)},
		{"K", unit.Temperature(1)},
		{"mol", unit.Mole(1)},
		{"cd", unit.LuminousIntensity(1)},
		{"Hz", unit.Frequency(1)},
		{"N", unit.Force(1)},
		{"Pa", unit.Pressure(1)},
		{"J", unit.Energy(1)},
		{"W", unit.Power(1)},
		{"C", unit.Charge(1)},
		{"V", unit.Voltage(1)},
		{"F", unit.Capacitance(1)},
		{"Ω", unit.Resistance(1)},
		{"S", unit.Conductance(1)},
		{"Wb", unit.MagneticFlux(1)},
		{"T", unit.MagneticFluxDensity(1)},
		{"H", unit.Inductance(1)},
		{"Bq", unit.Radioactivity(1)},
		{"Gy", unit.AbsorbedRadioactiveDose(1)},
		{"Sv", unit.EquivalentRadioactiveDose(1)},
		{"m^2", unit.Area(1)},
		{"m^3", unit.Volume(1)},
		{"m/s", unit.Velocity(1)},
		{"m/s^2", unit.Acceleration(1)},
	}
	for _, c := range cases {
		want, ok := gonumDim(c.g.Unit().Dimensions())
		if !ok {
			t.Errorf("%s: gonum's dimensions %v hold one sheaf lacks", c.sym, c.g.Unit().Dimensions())
			continue
		}
		if got := mustParse(t, c.sym).Dim; got != want {
			t.Errorf("%s: dimension %s, gonum/unit says %s", c.sym, got, want)
		}
	}
	// The skip above is not silent: gonum's radian really has a dimension.
	if _, ok := gonumDim(unit.Angle(1).Unit().Dimensions()); ok {
		t.Errorf("gonum's Angle no longer has a dimension of its own; compare rad against it")
	}
}

// The seven SI base units (SI Brochure, table 2), each of scale 1.
func TestSIBaseUnits(t *testing.T) {
	for _, c := range []struct {
		sym string
		b   Base
	}{
		{"s", Time}, {"m", Length}, {"kg", Mass}, {"A", Current},
		{"K", Temperature}, {"mol", Amount}, {"cd", Luminous},
	} {
		u := mustParse(t, c.sym)
		if u.Dim != DimOf(c.b) || relErr(u.Scale, 1) > 1e-15 || u.Offset != 0 || u.Kind != Plain {
			t.Errorf("%s: %+v, want base dimension %s, scale 1", c.sym, u, DimOf(c.b))
		}
	}
	// Prefixes attach to the gram, never to the kilogram (SI Brochure 3.2).
	if u := mustParse(t, "mg"); relErr(u.Scale, 1e-6) > 1e-15 {
		t.Errorf("mg = %g kg, want 1e-6", u.Scale)
	}
	for _, bad := range []string{"mkg", "µkg", "kkg"} {
		parseErr(t, bad)
	}
}

// The SI prefixes, SI Brochure (9th ed.) table 7, with the four the 27th
// CGPM added in 2022 (resolution 3, from memory): ronna, quetta, ronto,
// quecto.
var siPrefixes = []struct {
	sym, name string
	exp       int
}{
	{"Q", "quetta", 30}, {"R", "ronna", 27}, {"Y", "yotta", 24}, {"Z", "zetta", 21},
	{"E", "exa", 18}, {"P", "peta", 15}, {"T", "tera", 12}, {"G", "giga", 9},
	{"M", "mega", 6}, {"k", "kilo", 3}, {"h", "hecto", 2}, {"da", "deca", 1},
	{"d", "deci", -1}, {"c", "centi", -2}, {"m", "milli", -3}, {"µ", "micro", -6},
	{"n", "nano", -9}, {"p", "pico", -12}, {"f", "femto", -15}, {"a", "atto", -18},
	{"z", "zepto", -21}, {"y", "yocto", -24}, {"r", "ronto", -27}, {"q", "quecto", -30},
}

func TestSIPrefixes(t *testing.T) {
	if len(siPrefixes) != 24 || len(Prefixes) != 24 {
		t.Fatalf("want 24 prefixes; test lists %d, package %d", len(siPrefixes), len(Prefixes))
	}
	for i, want := range siPrefixes {
		if got := Prefixes[i]; got.Symbol != want.sym || got.Name != want.name || got.Exp != want.exp {
			t.Errorf("prefix %d: %+v, want %+v", i, got, want)
		}
		// Metre, second, and the gram (whose coherent unit is kg).
		for _, c := range []struct {
			unit  string
			scale float64
		}{{"m", 1}, {"s", 1}, {"g", 1e-3}, {"V", 1}} {
			sym := want.sym + c.unit
			if sym == "Gs" {
				continue // the gauss, not a gigasecond: see TestPrefixCollisions
			}
			u, err := Parse(sym)
			if err != nil {
				t.Errorf("%s (%s%s): %v", sym, want.name, c.unit, err)
				continue
			}
			if w := c.scale * math.Pow10(want.exp); relErr(u.Scale, w) > 1e-15 {
				t.Errorf("%s: scale %.17g, want %g", sym, u.Scale, w)
			}
			if u.Symbol != sym {
				t.Errorf("%s prints as %q", sym, u.Symbol)
			}
		}
	}
	// The 2022 prefixes, spelled out.
	for _, c := range []struct {
		sym   string
		scale float64
		dim   Dim
	}{
		{"Qm", 1e30, DimOf(Length)},
		{"Rm", 1e27, DimOf(Length)},
		{"rg", 1e-30, DimOf(Mass)}, // a rontogram is 1e-27 g = 1e-30 kg
		{"qs", 1e-30, DimOf(Time)},
		{"QW", 1e30, d(-3, 2, 1, 0, 0, 0, 0)},
	} {
		u := mustParse(t, c.sym)
		if u.Dim != c.dim || relErr(u.Scale, c.scale) > 1e-15 {
			t.Errorf("%s: %s × %g, want %s × %g", c.sym, u.Dim, u.Scale, c.dim, c.scale)
		}
	}
	// micro: the micro sign U+00B5, the Greek mu U+03BC and ASCII u all read
	// as micro and print with the micro sign.
	for _, sym := range []string{"\u00b5m", "\u03bcm", "um"} {
		u := mustParse(t, sym)
		if u.Symbol != "\u00b5m" || relErr(u.Scale, 1e-6) > 1e-15 {
			t.Errorf("%q: %q × %g, want µm × 1e-6", sym, u.Symbol, u.Scale)
		}
	}
	if u := mustParse(t, "\u03bcF"); relErr(u.Scale, 1e-6) > 1e-15 || u.Dim != d(4, -2, -1, 2, 0, 0, 0) {
		t.Errorf("μF: %+v", u)
	}
}

// CODATA 2018 recommended values (Tiesinga et al., Rev. Mod. Phys. 93,
// 025010 (2021); citation and values from memory, the two uncertainties
// as gonum's unit/constant generator also records them) with their
// standard uncertainties, and the exact c.
func TestConstantsCODATA2018(t *testing.T) {
	get := func(name string) Constant {
		c, ok := ConstantByName(name)
		if !ok {
			t.Fatalf("no constant %s", name)
		}
		return c
	}
	mu0, eps0, c0 := get("mu_0"), get("epsilon_0"), get("c_0")

	// μ₀ = 1.256 637 062 12(19) × 10⁻⁶ N A⁻².
	if diff := math.Abs(mu0.Value - 1.25663706212e-6); diff > 0.00000000019e-6 {
		t.Errorf("mu_0 = %.15g, CODATA 2018 1.25663706212e-6 ± 1.9e-16; off by %.3g", mu0.Value, diff)
	}
	// ε₀ = 8.854 187 8128(13) × 10⁻¹² F m⁻¹. Ours is 1/(μ₀c²) with the
	// CODATA 2018 μ₀. gonum's constant.ElectricConstant is the pre-2019
	// 1/(4π·10⁻⁷·c²) = 8.854 187 817…e-12, about 4.8e-21 away, more than
	// three standard uncertainties; sheaf does not use it.
	if diff := math.Abs(eps0.Value - 8.8541878128e-12); diff > 0.0000000013e-12 {
		t.Errorf("epsilon_0 = %.15g, CODATA 2018 8.8541878128e-12 ± 1.3e-21; off by %.3g", eps0.Value, diff)
	}
	if gonumEps := float64(constant.ElectricConstant); math.Abs(gonumEps-eps0.Value) < 1e-22 {
		t.Logf("gonum's ElectricConstant now agrees with ours (%.15g); the note above is out of date", gonumEps)
	}
	// c₀ = 299 792 458 m s⁻¹, exact (SI defining constant).
	if c0.Value != 299792458 {
		t.Errorf("c_0 = %.17g, want exactly 299792458", c0.Value)
	}
	// μ₀ε₀c² = 1 holds by construction; a check that the three agree.
	if p := mu0.Value * eps0.Value * c0.Value * c0.Value; math.Abs(p-1) > 1e-15 {
		t.Errorf("mu_0·epsilon_0·c_0² = %.17g, want 1", p)
	}
	// Dimensions, SI Brochure table 4 units: H/m, F/m, m/s.
	for _, c := range []struct {
		k   Constant
		dim Dim
	}{
		{mu0, d(-2, 1, 1, -2, 0, 0, 0)},  // H/m = kg m s⁻² A⁻²
		{eps0, d(4, -3, -1, 2, 0, 0, 0)}, // F/m = kg⁻¹ m⁻³ s⁴ A²
		{c0, d(-1, 1, 0, 0, 0, 0, 0)},
		{get("pi"), Dimensionless},
	} {
		if c.k.Dim != c.dim {
			t.Errorf("%s: dimension %s, want %s", c.k.Name, c.k.Dim, c.dim)
		}
		if c.k.Source == "" {
			t.Errorf("%s has no source", c.k.Name)
		}
	}
	if get("pi").Value != math.Pi {
		t.Errorf("pi is not math.Pi")
	}
	if _, ok := ConstantByName("e"); ok {
		t.Errorf("e must stay free for the sheet")
	}
}
