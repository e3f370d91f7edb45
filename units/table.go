package units

import "math"

// Class groups units the way the SI Brochure does.
type Class uint8

// The classes of the unit table.
const (
	BaseSI     Class = iota // SI base unit (SI Brochure table 2)
	DerivedSI               // coherent derived unit with a special name (table 4)
	AcceptedSI              // non-SI unit accepted for use with the SI (table 8)
	Other                   // other units an electrical-machine engineer meets
)

func (c Class) String() string {
	return [...]string{"SI base", "SI derived", "accepted with SI", "other"}[c]
}

// Def is one row of the unit table. A row is defined either by a dimension
// (base rows) or by a scale times a unit expression over rows above it, so
// the table states each unit the way a handbook defines it, and the parser
// does the arithmetic once at start-up.
type Def struct {
	Symbol  string   // the symbol as the SI Brochure or the trade writes it
	Aliases []string // ASCII or alternative spellings accepted on input
	Name    string
	Class   Class
	Prefix  bool    // SI prefixes may be attached
	Scale   float64 // SI value of one unit = Scale × Of (plus Offset)
	Of      string  // the defining unit expression; "" for base rows
	Dim     Dim     // base rows only
	Offset  float64 // added before scaling: K = (x + Offset) × Scale
	Kind    Kind
	Note    string // where the definition comes from, or a remark

	unit Unit // resolved at start-up
}

// Unit returns the row as a parsed unit.
func (d *Def) Unit() Unit { return d.unit }

func base(sym, name string, b Base, scale float64) Def {
	return Def{Symbol: sym, Name: name, Class: BaseSI, Prefix: true, Scale: scale, Dim: DimOf(b)}
}

// Table lists every unit sheaf knows, in the order `sheaf units` prints them.
// Exact definitions are used wherever one exists; NIST SP 811 (2008)
// Appendix B gives the rounded factors that the tests compare against.
var Table = []Def{
	// SI base units (SI Brochure, table 2). The kilogram is held as the gram
	// so that prefixes attach the way the SI Brochure says (mg, not µkg).
	base("s", "second", Time, 1),
	base("m", "metre", Length, 1),
	base("g", "gram", Mass, 1e-3),
	base("A", "ampere", Current, 1),
	base("K", "kelvin", Temperature, 1),
	base("mol", "mole", Amount, 1),
	base("cd", "candela", Luminous, 1),

	// The 22 coherent derived units with special names (SI Brochure, table 4).
	{Symbol: "rad", Name: "radian", Class: DerivedSI, Prefix: true, Scale: 1, Of: "1", Kind: Angle},
	{Symbol: "sr", Name: "steradian", Class: DerivedSI, Prefix: true, Scale: 1, Of: "1"},
	{Symbol: "Hz", Name: "hertz", Class: DerivedSI, Prefix: true, Scale: 1, Of: "s^-1", Kind: Cycle},
	{Symbol: "N", Name: "newton", Class: DerivedSI, Prefix: true, Scale: 1, Of: "kg*m*s^-2"},
	{Symbol: "Pa", Name: "pascal", Class: DerivedSI, Prefix: true, Scale: 1, Of: "N/m^2"},
	{Symbol: "J", Name: "joule", Class: DerivedSI, Prefix: true, Scale: 1, Of: "N*m"},
	{Symbol: "W", Name: "watt", Class: DerivedSI, Prefix: true, Scale: 1, Of: "J/s", Kind: Active,
		Note: "active power; VA and var name apparent and reactive power (IEC 60050-131)"},
	{Symbol: "C", Name: "coulomb", Class: DerivedSI, Prefix: true, Scale: 1, Of: "A*s"},
	{Symbol: "V", Name: "volt", Class: DerivedSI, Prefix: true, Scale: 1, Of: "W/A"},
	{Symbol: "F", Name: "farad", Class: DerivedSI, Prefix: true, Scale: 1, Of: "C/V"},
	{Symbol: "Ω", Aliases: []string{"ohm", "\u2126"}, Name: "ohm", Class: DerivedSI, Prefix: true, Scale: 1, Of: "V/A"},
	{Symbol: "S", Name: "siemens", Class: DerivedSI, Prefix: true, Scale: 1, Of: "A/V"},
	{Symbol: "Wb", Name: "weber", Class: DerivedSI, Prefix: true, Scale: 1, Of: "V*s"},
	{Symbol: "T", Name: "tesla", Class: DerivedSI, Prefix: true, Scale: 1, Of: "Wb/m^2"},
	{Symbol: "H", Name: "henry", Class: DerivedSI, Prefix: true, Scale: 1, Of: "Wb/A"},
	{Symbol: "°C", Aliases: []string{"degC", "℃"}, Name: "degree Celsius", Class: DerivedSI, Scale: 1, Of: "K", Offset: 273.15, Kind: AbsTemp,
		Note: "an absolute temperature; write differences in K"},
	{Symbol: "lm", Name: "lumen", Class: DerivedSI, Prefix: true, Scale: 1, Of: "cd*sr"},
	{Symbol: "lx", Name: "lux", Class: DerivedSI, Prefix: true, Scale: 1, Of: "lm/m^2"},
	{Symbol: "Bq", Name: "becquerel", Class: DerivedSI, Prefix: true, Scale: 1, Of: "s^-1"},
	{Symbol: "Gy", Name: "gray", Class: DerivedSI, Prefix: true, Scale: 1, Of: "J/kg"},
	{Symbol: "Sv", Name: "sievert", Class: DerivedSI, Prefix: true, Scale: 1, Of: "J/kg"},
	{Symbol: "kat", Name: "katal", Class: DerivedSI, Prefix: true, Scale: 1, Of: "mol/s"},

	// Non-SI units accepted for use with the SI (SI Brochure, table 8).
	{Symbol: "min", Name: "minute", Class: AcceptedSI, Scale: 60, Of: "s"},
	{Symbol: "h", Name: "hour", Class: AcceptedSI, Scale: 3600, Of: "s"},
	{Symbol: "d", Name: "day", Class: AcceptedSI, Scale: 86400, Of: "s"},
	{Symbol: "°", Aliases: []string{"deg"}, Name: "degree (angle)", Class: AcceptedSI, Scale: math.Pi / 180, Of: "rad", Kind: Angle},
	{Symbol: "′", Aliases: []string{"arcmin"}, Name: "minute (angle)", Class: AcceptedSI, Scale: math.Pi / 10800, Of: "rad", Kind: Angle},
	{Symbol: "″", Aliases: []string{"arcsec"}, Name: "second (angle)", Class: AcceptedSI, Scale: math.Pi / 648000, Of: "rad", Kind: Angle},
	{Symbol: "ha", Name: "hectare", Class: AcceptedSI, Scale: 1e4, Of: "m^2"},
	{Symbol: "L", Name: "litre", Class: AcceptedSI, Prefix: true, Scale: 1e-3, Of: "m^3"},
	{Symbol: "t", Name: "tonne", Class: AcceptedSI, Scale: 1e3, Of: "kg"},
	{Symbol: "eV", Name: "electronvolt", Class: AcceptedSI, Prefix: true, Scale: 1.602176634e-19, Of: "J",
		Note: "exact since the 2019 SI: 1 eV = e × 1 V"},

	// Rotation. rpm and r/s count one revolution as 1, like the hertz: they
	// are rotational frequencies (ISO 80000-3, item 3-17.2), not angular
	// velocities. 2π rad/s is one r/s; sheaf asks for the 2π in the formula.
	// The unit parser gives a force times a length (N·m) the kind of a
	// torque, an energy per radian.
	{Symbol: "rpm", Aliases: []string{"r/min"}, Name: "revolution per minute", Class: Other, Scale: 1.0 / 60, Of: "s^-1", Kind: Cycle,
		Note: "rotational frequency; omega = 2*pi*n gives rad/s"},
	{Symbol: "rps", Aliases: []string{"r/s"}, Name: "revolution per second", Class: Other, Scale: 1, Of: "s^-1", Kind: Cycle,
		Note: "rotational frequency; omega = 2*pi*n gives rad/s"},
	{Symbol: "krpm", Name: "thousand revolutions per minute", Class: Other, Scale: 1000, Of: "rpm", Kind: Cycle,
		Note: "as motor data sheets print back-EMF constants: V/krpm"},
	{Symbol: "rev", Name: "revolution", Class: Other, Scale: 1, Of: "1", Kind: Cycle,
		Note: "one whole turn, counted as 1; 1 rev = 2*pi rad only through a written 2*pi"},

	// Ratios.
	{Symbol: "%", Name: "percent", Class: Other, Scale: 1e-2, Of: "1"},
	{Symbol: "‰", Name: "per mille", Class: Other, Scale: 1e-3, Of: "1"},
	{Symbol: "ppm", Name: "part per million", Class: Other, Scale: 1e-6, Of: "1"},

	// Temperature.
	{Symbol: "°F", Aliases: []string{"degF", "℉"}, Name: "degree Fahrenheit", Class: Other, Scale: 5.0 / 9, Of: "K", Offset: 459.67, Kind: AbsTemp,
		Note: "an absolute temperature; NIST SP 811 B.8: T/K = (t/°F + 459.67)/1.8"},

	// Length, area, volume, speed (exact by the 1959 international yard and pound agreement).
	{Symbol: "in", Name: "inch", Class: Other, Scale: 0.0254, Of: "m"},
	{Symbol: "ft", Name: "foot", Class: Other, Scale: 0.3048, Of: "m"},
	{Symbol: "yd", Name: "yard", Class: Other, Scale: 0.9144, Of: "m"},
	{Symbol: "mi", Name: "mile", Class: Other, Scale: 1609.344, Of: "m"},
	{Symbol: "mil", Aliases: []string{"thou"}, Name: "mil (thousandth of an inch)", Class: Other, Scale: 2.54e-5, Of: "m"},
	{Symbol: "cmil", Name: "circular mil", Class: Other, Scale: math.Pi / 4, Of: "mil^2", Note: "area of a circle one mil across"},
	{Symbol: "Å", Name: "ångström", Class: Other, Scale: 1e-10, Of: "m"},
	{Symbol: "gal", Name: "gallon (US)", Class: Other, Scale: 231, Of: "in^3"},
	{Symbol: "mph", Name: "mile per hour", Class: Other, Scale: 1, Of: "mi/h"},
	{Symbol: "kn", Name: "knot", Class: Other, Scale: 1852.0 / 3600, Of: "m/s"},

	// Mass, force, pressure.
	{Symbol: "lb", Name: "pound (avoirdupois)", Class: Other, Scale: 0.45359237, Of: "kg"},
	{Symbol: "oz", Name: "ounce (avoirdupois)", Class: Other, Scale: 1.0 / 16, Of: "lb"},
	{Symbol: "kgf", Name: "kilogram-force", Class: Other, Scale: 9.80665, Of: "N", Note: "standard acceleration of gravity 9.80665 m/s²"},
	{Symbol: "lbf", Name: "pound-force", Class: Other, Scale: 9.80665 / 0.3048, Of: "lb*ft/s^2"},
	{Symbol: "dyn", Name: "dyne", Class: Other, Scale: 1e-5, Of: "N"},
	{Symbol: "bar", Name: "bar", Class: Other, Prefix: true, Scale: 1e5, Of: "Pa"},
	{Symbol: "atm", Name: "standard atmosphere", Class: Other, Scale: 101325, Of: "Pa"},
	{Symbol: "Torr", Name: "torr", Class: Other, Scale: 1.0 / 760, Of: "atm"},
	{Symbol: "mmHg", Name: "conventional millimetre of mercury", Class: Other, Scale: 133.322387415, Of: "Pa"},
	{Symbol: "psi", Name: "pound-force per square inch", Class: Other, Scale: 1, Of: "lbf/in^2"},

	// Energy and power.
	{Symbol: "erg", Name: "erg", Class: Other, Scale: 1e-7, Of: "J"},
	{Symbol: "cal", Name: "calorie (thermochemical)", Class: Other, Prefix: true, Scale: 4.184, Of: "J"},
	{Symbol: "Btu", Name: "British thermal unit (IT)", Class: Other, Scale: 1055.05585262, Of: "J"},
	{Symbol: "Wh", Name: "watt hour", Class: Other, Prefix: true, Scale: 3600, Of: "J"},
	{Symbol: "hp", Name: "horsepower (550 ft·lbf/s)", Class: Other, Scale: 550, Of: "ft*lbf/s"},
	{Symbol: "VA", Name: "volt-ampere (apparent power)", Class: Other, Prefix: true, Scale: 1, Of: "V*A", Kind: Apparent},
	{Symbol: "var", Name: "var (reactive power)", Class: Other, Prefix: true, Scale: 1, Of: "V*A", Kind: Reactive},

	// CGS electromagnetic units (Gaussian system).
	{Symbol: "G", Aliases: []string{"Gs"}, Name: "gauss", Class: Other, Prefix: true, Scale: 1e-4, Of: "T"},
	{Symbol: "Mx", Name: "maxwell", Class: Other, Prefix: true, Scale: 1e-8, Of: "Wb"},
	{Symbol: "Oe", Name: "oersted", Class: Other, Prefix: true, Scale: 1000 / (4 * math.Pi), Of: "A/m"},
	{Symbol: "Gb", Name: "gilbert", Class: Other, Scale: 10 / (4 * math.Pi), Of: "A"},
}
