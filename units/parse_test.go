package units

import (
	"sort"
	"strings"
	"testing"
	"unicode/utf8"
)

func TestParseExpressions(t *testing.T) {
	watt := d(-3, 2, 1, 0, 0, 0, 0)
	cases := []struct {
		in     string
		symbol string
		dim    Dim
		scale  float64
		kind   Kind
	}{
		// Products and quotients, ASCII and typographic.
		{"kg*m^2/s^3", "kg·m²/s³", watt, 1, Plain},
		{"kg·m²/s³", "kg·m²/s³", watt, 1, Plain},
		{"kg⋅m²/s³", "kg·m²/s³", watt, 1, Plain}, // U+22C5 dot operator
		{"W/(m*K)", "W/(m·K)", d(-3, 1, 1, 0, -1, 0, 0), 1, Plain},
		{"W/(m·K)", "W/(m·K)", d(-3, 1, 1, 0, -1, 0, 0), 1, Plain},
		{"W/(m K)", "W/(m·K)", d(-3, 1, 1, 0, -1, 0, 0), 1, Plain},
		// A force times a length is a torque, an energy per radian (SI
		// Brochure, 9th ed., table 5 note: N·m for moment of force).
		{"N m", "N·m", d(-2, 2, 1, 0, 0, 0, 0), 1, PerRadian},
		{" N  m ", "N·m", d(-2, 2, 1, 0, 0, 0, 0), 1, PerRadian},
		{"N×m", "N·m", d(-2, 2, 1, 0, 0, 0, 0), 1, PerRadian},
		{"kV/mm", "kV/mm", d(-3, 1, 1, -1, 0, 0, 0), 1e6, Plain},
		{"mm*mm", "mm·mm", d(0, 2, 0, 0, 0, 0, 0), 1e-6, Plain},
		// A quotient followed by more keeps its parentheses in print; "A/m·s"
		// would read as A/(m·s) and break the solidus rule.
		{"(A/m)*s", "(A/m)·s", d(1, -1, 0, 1, 0, 0, 0), 1, Plain},
		{"(W/m)/K", "(W/m)/K", d(-3, 1, 1, 0, -1, 0, 0), 1, Plain},
		{"m*(A/s)*K", "(m·A/s)·K", d(-1, 1, 0, 1, 1, 0, 0), 1, Plain},
		// Powers.
		{"m^2", "m²", d(0, 2, 0, 0, 0, 0, 0), 1, Plain},
		{"m**2", "m²", d(0, 2, 0, 0, 0, 0, 0), 1, Plain},
		{"m^+2", "m²", d(0, 2, 0, 0, 0, 0, 0), 1, Plain},
		{"s^-1", "s⁻¹", d(-1, 0, 0, 0, 0, 0, 0), 1, Plain},
		{"s⁻¹", "s⁻¹", d(-1, 0, 0, 0, 0, 0, 0), 1, Plain},
		{"s^−1", "s⁻¹", d(-1, 0, 0, 0, 0, 0, 0), 1, Plain}, // U+2212 minus
		{"m^(-1)", "m⁻¹", d(0, -1, 0, 0, 0, 0, 0), 1, Plain},
		{"mm^2", "mm²", d(0, 2, 0, 0, 0, 0, 0), 1e-6, Plain},
		{"cm³", "cm³", d(0, 3, 0, 0, 0, 0, 0), 1e-6, Plain},
		{"(m/s)^2", "(m/s)²", d(-2, 2, 0, 0, 0, 0, 0), 1, Plain},
		{"kg^99", "kg⁹⁹", Dim{Mass: 99}, 1, Plain},
		// The 1 of a reciprocal.
		{"1/s", "1/s", d(-1, 0, 0, 0, 0, 0, 0), 1, Plain},
		{"1/min", "1/min", d(-1, 0, 0, 0, 0, 0, 0), 1.0 / 60, Plain},
		{"1/K", "1/K", d(0, 0, 0, 0, -1, 0, 0), 1, Plain},
		// Aliases print as the symbol they stand for.
		{"ohm", "Ω", d(-3, 2, 1, -2, 0, 0, 0), 1, Plain},
		{"\u2126", "Ω", d(-3, 2, 1, -2, 0, 0, 0), 1, Plain}, // ohm sign
		{"degC", "°C", DimOf(Temperature), 1, AbsTemp},
		{"degF", "°F", DimOf(Temperature), 5.0 / 9, AbsTemp},
		{"r/min", "rpm", d(-1, 0, 0, 0, 0, 0, 0), 1.0 / 60, Cycle},
		{"r/s", "rps", d(-1, 0, 0, 0, 0, 0, 0), 1, Cycle},
		{"thou", "mil", DimOf(Length), 2.54e-5, Plain},
		{"deg", "°", Dimensionless, 0.017453292519943295, Angle},
		{"arcsec", "″", Dimensionless, 4.84813681109536e-06, Angle},
		// Prefixed aliases.
		{"kohm", "kΩ", d(-3, 2, 1, -2, 0, 0, 0), 1e3, Plain},
		{"Mohm", "MΩ", d(-3, 2, 1, -2, 0, 0, 0), 1e6, Plain},
		{"uohm", "µΩ", d(-3, 2, 1, -2, 0, 0, 0), 1e-6, Plain},
		{"kGs", "kG", d(-2, 0, 1, -1, 0, 0, 0), 0.1, Plain},
		// Kinds follow the algebra: the exponents of rad and of the cycle add.
		{"rad/s", "rad/s", d(-1, 0, 0, 0, 0, 0, 0), 1, Angle},
		{"deg/s", "°/s", d(-1, 0, 0, 0, 0, 0, 0), 0.017453292519943295, Angle},
		{"kHz", "kHz", d(-1, 0, 0, 0, 0, 0, 0), 1e3, Cycle},
		{"Hz/s", "Hz/s", d(-2, 0, 0, 0, 0, 0, 0), 1, Cycle},
		{"V*s/rad", "V·s/rad", d(-2, 2, 1, -1, 0, 0, 0), 1, PerRadian},
		{"N*m/A", "N·m/A", d(-2, 2, 1, -1, 0, 0, 0), 1, PerRadian},
		{"V/rpm", "V/rpm", d(-2, 2, 1, -1, 0, 0, 0), 60, PerCycle},
		{"V/krpm", "V/krpm", d(-2, 2, 1, -1, 0, 0, 0), 0.06, PerCycle},
		{"rad/s^2", "rad/s²", d(-2, 0, 0, 0, 0, 0, 0), 1, Angle},
		{"rad^2", "rad²", Dimensionless, 1, Kind{Rad: 2}},
		{"N*m/rad", "N·m/rad", d(-2, 2, 1, 0, 0, 0, 0), 1, Kind{Rad: -2}},
		{"lbf*ft", "lbf·ft", d(-2, 2, 1, 0, 0, 0, 0), 1.3558179483314004, PerRadian},
		{"rev", "rev", Dimensionless, 1, Cycle},
		{"rev/min", "rev/min", d(-1, 0, 0, 0, 0, 0, 0), 1.0 / 60, Cycle},
		{"krpm", "krpm", d(-1, 0, 0, 0, 0, 0, 0), 1000.0 / 60, Cycle},
		{"J", "J", d(-2, 2, 1, 0, 0, 0, 0), 1, Plain},
		{"kW", "kW", d(-3, 2, 1, 0, 0, 0, 0), 1e3, Active},
		{"MVA", "MVA", d(-3, 2, 1, 0, 0, 0, 0), 1e6, Apparent},
		{"kvar", "kvar", d(-3, 2, 1, 0, 0, 0, 0), 1e3, Reactive},
		{"V*A", "V·A", d(-3, 2, 1, 0, 0, 0, 0), 1, Plain},
		{"kW*h", "kW·h", d(-2, 2, 1, 0, 0, 0, 0), 3.6e6, Plain},
		{"W/K", "W/K", d(-3, 2, 1, 0, -1, 0, 0), 1, Plain},
		{"K/s", "K/s", d(-1, 0, 0, 0, 1, 0, 0), 1, Plain},
	}
	for _, c := range cases {
		u, err := Parse(c.in)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.in, err)
			continue
		}
		if u.Symbol != c.symbol || u.Dim != c.dim || relErr(u.Scale, c.scale) > 1e-15 || u.Kind != c.kind {
			t.Errorf("Parse(%q) = %q %s ×%.17g %s; want %q %s ×%.17g %s",
				c.in, u.Symbol, u.Dim, u.Scale, u.Kind, c.symbol, c.dim, c.scale, c.kind)
		}
	}
}

func TestParseCompactRefusesSpaces(t *testing.T) {
	if u, err := ParseCompact("N m"); err == nil {
		t.Errorf("ParseCompact(\"N m\") = %q, want an error: a literal's unit has no spaces", u.Symbol)
	}
	if u, err := ParseCompact("N·m"); err != nil || u.Symbol != "N·m" {
		t.Errorf("ParseCompact(\"N·m\") = %q, %v", u.Symbol, err)
	}
}

// SI Brochure (9th ed.) 5.4.6: a solidus must not be followed on the same
// line by a multiplication or another solidus unless parentheses remove the
// ambiguity: W/(m·K), not W/m/K.
func TestSolidusRule(t *testing.T) {
	for _, c := range []struct {
		in  string
		col int // the second operator
	}{
		{"W/m/K", 3},
		{"A/m*s", 3},
		{"J/kg/K", 4},
		{"W/m·K", 3},
	} {
		e := parseErr(t, c.in)
		if !strings.Contains(e.Error(), "parentheses") {
			t.Errorf("%q: %q does not mention parentheses", c.in, e.Error())
		}
		if e.Col != c.col {
			t.Errorf("%q: Col %d, want %d", c.in, e.Col, c.col)
		}
	}
	for _, ok := range []string{"W/(m*K)", "J/(kg·K)", "A*s/m", "1/(s*m)", "(W/m)/K"} {
		mustParse(t, ok)
	}
}

func TestUnknownUnitSuggestions(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"kv", "kV"},
		{"KV", "kV"},
		{"mWB", "mWb"},
		{"tesla", "T"},
		{"Tesla", "T"},
		{"volts", "V"},
		{"henrys", "H"},
		{"Wbb", "Wb"},
	} {
		e := parseErr(t, c.in)
		if !strings.Contains(e.Hint, "did you mean "+c.want+"?") {
			t.Errorf("%q: hint %q, want \"did you mean %s?\"", c.in, e.Hint, c.want)
		}
		if !strings.Contains(e.Msg, "unknown unit") {
			t.Errorf("%q: message %q", c.in, e.Msg)
		}
		if s := Suggest(c.in); s != c.want {
			t.Errorf("Suggest(%q) = %q, want %q", c.in, s, c.want)
		}
	}
	// Nothing close: no guess, but still a way forward.
	e := parseErr(t, "xyzzy")
	if strings.Contains(e.Hint, "did you mean") || !strings.Contains(e.Hint, "sheaf units") {
		t.Errorf("xyzzy: hint %q", e.Hint)
	}
	if s := Suggest("q"); s != "" {
		t.Errorf("Suggest(\"q\") = %q; one letter is too little to guess from", s)
	}
}

func TestParseErrors(t *testing.T) {
	cases := []struct {
		in   string
		col  int    // character (rune) offset of the offending character
		msg  string // part of the message
		hint string // part of the hint, if any
	}{
		{"mm2", 2, "caret", "mm^2"},
		{"m2", 1, "caret", "m^2"},
		{"m)", 1, "unbalanced", ""},
		{"(m", 0, "unbalanced", ")"},
		{"kg*xx", 3, "unknown unit \"xx\"", ""},
		{"µm/qq", 3, "unknown unit \"qq\"", ""}, // µ is two bytes but one character
		{"Ω·xyz", 2, "unknown unit \"xyz\"", ""},
		{"kg*m^2 x", 7, "unknown unit \"x\"", ""},
		{"kg/s x", 4, "solidus", "parentheses"}, // the space multiplies
		{"m^", 1, "whole number", "m^2"},
		{"m^0", 2, "power 0", ""},
		{"m^100", 1, "too large", ""},
		{"m^(2", 4, "missing ')'", ""},
		{"m⁻", 1, "superscript minus", ""},
		{"2m", 0, "numbers", ""},
		{"12/s", 0, "numbers", ""},
		{"kg*", 3, "ends too early", ""},
		{"A_g", 1, "unexpected '_'", ""},
		{"m^99*m^99", 5, "too large", "99"}, // Dim holds int8; must not wrap
		{"(m^50)^2", 0, "too large", ""},
		{"Qm^11", 0, "range", ""}, // 1e330 overflows float64
		{"qm^11", 0, "range", ""},
		// °C and °F stand alone.
		{"degC/s", 0, "absolute temperature", "K/s"},
		{"W/°C", 2, "absolute temperature", "W/K"},
		{"°F^2", 0, "absolute temperature", ""},
		{"°C*m", 0, "absolute temperature", ""},
	}
	for _, c := range cases {
		e := parseErr(t, c.in)
		if e.Col != c.col {
			t.Errorf("%q: Col %d, want %d (%v)", c.in, e.Col, c.col, e)
		}
		if n := utf8.RuneCountInString(c.in); e.Col < 0 || e.Col > n {
			t.Errorf("%q: Col %d outside the expression", c.in, e.Col)
		}
		if !strings.Contains(e.Msg, c.msg) {
			t.Errorf("%q: message %q, want it to contain %q", c.in, e.Msg, c.msg)
		}
		if !strings.Contains(e.Hint, c.hint) {
			t.Errorf("%q: hint %q, want it to contain %q", c.in, e.Hint, c.hint)
		}
		if c.hint != "" && !strings.Contains(e.Error(), c.hint) {
			t.Errorf("%q: Error() %q leaves out the hint", c.in, e.Error())
		}
	}
}

func TestParseLimits(t *testing.T) {
	for _, in := range []string{"", "   ", "\t"} {
		if e := parseErr(t, in); !strings.Contains(e.Msg, "empty") || e.Hint == "" {
			t.Errorf("%q: %v", in, e)
		}
	}
	// MaxUnitLength counts characters; padding keeps the expression valid.
	atLimit := strings.Repeat(" ", MaxUnitLength-3) + "m/s"
	if _, err := Parse(atLimit); err != nil {
		t.Errorf("a %d-character unit: %v", MaxUnitLength, err)
	}
	if e := parseErr(t, " "+atLimit); !strings.Contains(e.Msg, "longer than") {
		t.Errorf("a %d-character unit: %v", MaxUnitLength+1, e)
	}
	// Characters, not bytes: 200 micro signs are 400 bytes but 200 characters.
	if e := parseErr(t, strings.Repeat("µ", MaxUnitLength)); strings.Contains(e.Msg, "longer than") {
		t.Errorf("200 characters refused as too long: %v", e)
	}
	for _, in := range []string{"m\xff", "\xc3", "k\xe2\x82"} {
		if e := parseErr(t, in); !strings.Contains(e.Msg, "UTF-8") {
			t.Errorf("%q: %v", in, e)
		}
	}
	deep := strings.Repeat("(", 30) + "m" + strings.Repeat(")", 30)
	if e := parseErr(t, deep); !strings.Contains(e.Msg, "nested") {
		t.Errorf("deep nesting: %v", e)
	}
}

func TestScanCompact(t *testing.T) {
	for _, c := range []struct {
		in, want string
		unit     bool // the scanned text is a unit ParseCompact accepts
	}{
		{"T*A_g", "T", true},                 // times a name
		{"kV/mm * l", "kV/mm", true},         // a space ends the unit
		{"V/x", "V", true},                   // x is not a unit
		{"W/(m*K)+1", "W/(m*K)", true},       // a group, then an operator
		{"A_g", "A_g", false},                // a name: taken whole so the error can name it
		{"m2", "m2", false},                  // a misspelt power, likewise
		{"m)", "m", true},                    // the caller's parenthesis
		{"mm*N_t", "mm", true},               // the doc comment's example
		{"kg*m^2/s^3 x", "kg*m^2/s^3", true}, // powers and a quotient
		{"s⁻¹)", "s⁻¹", true},                // superscripts are several bytes
		{"µm", "µm", true},                   // so is the micro sign
		{"Ω/m", "Ω/m", true},
		{"m^(-1)/s", "m^(-1)/s", true},
		{"kV/(mm", "kV", true}, // an unclosed group is not taken
		{"m/1", "m", true},     // nor a 1 after the operator
		{"2", "", false},       // no unit here
		{"", "", false},
		{"_x", "", false},
	} {
		n := ScanCompact(c.in)
		if n < 0 || n > len(c.in) || c.in[:n] != c.want {
			t.Errorf("ScanCompact(%q) = %d, want %q", c.in, n, c.want)
			continue
		}
		if _, err := ParseCompact(c.want); (err == nil) != c.unit {
			t.Errorf("ParseCompact(%q) after the scan: %v, want a unit: %v", c.want, err, c.unit)
		}
	}
}

// TestPrefixCollisions lists every spelling "prefix + unit" that is also a
// symbol or alias of the table. Lookup tries the exact spelling first, so
// such a spelling always means the table's unit, never the prefixed one.
func TestPrefixCollisions(t *testing.T) {
	var prefixable, fixed []string
	for _, p := range allPrefixSpellings {
		for _, s := range reg.spelled {
			whole := p.spelling + s
			if _, ok := reg.bySymbol[whole]; !ok {
				continue
			}
			if reg.bySymbol[s].Prefix {
				prefixable = append(prefixable, whole)
			} else {
				fixed = append(fixed, whole)
			}
		}
	}
	sort.Strings(prefixable)
	sort.Strings(fixed)

	// Accepted: "Gs" could be giga + second, but it is the gauss, as NIST
	// SP 811 B.8 writes it ("gauss (Gs, G)"); nobody writes a gigasecond.
	if got, want := strings.Join(prefixable, " "), "Gs"; got != want {
		t.Errorf("prefix + prefixable unit spelling a table symbol: %q, want %q;"+
			" decide which reading an engineer expects before accepting a new one", got, want)
	}
	if u := mustParse(t, "Gs"); u.Symbol != "G" || relErr(u.Scale, 1e-4) > 1e-15 {
		t.Errorf("Gs = %q ×%g, want the gauss", u.Symbol, u.Scale)
	}

	// These would collide if their unit took prefixes; each must stay
	// without, so that the symbol keeps its one reading:
	//   cd   candela, not centi-day        (d takes no prefix)
	//   cmil circular mil, not centi-mil   (mil takes no prefix)
	//   ft   foot, not femto-tonne         (t takes no prefix)
	//   krpm a row of its own: rpm takes no other prefix
	//   min  minute, not milli-inch        (in takes no prefix)
	//   yd   yard, not yocto-day           (d takes no prefix)
	if got, want := strings.Join(fixed, " "), "cd cmil ft krpm min yd"; got != want {
		t.Errorf("prefix + unprefixable unit spelling a table symbol: %q, want %q", got, want)
	}
	for _, sym := range []string{"cd", "cmil", "ft", "min", "yd"} {
		if def, _ := DefOf(sym); def == nil || def.Symbol != sym {
			t.Errorf("%s does not resolve to its own table row", sym)
		}
	}
}
