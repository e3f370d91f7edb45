package units

import (
	"math"
	"strconv"
	"strings"
)

// prefixPolicy says which prefixes a preferred unit may take when sheaf picks
// one for a result that has no display unit.
type prefixPolicy uint8

const (
	noPrefix   prefixPolicy = iota
	engPrefix               // any power of 1000 between pico and tera
	downPrefix              // only submultiples: ms, µs, but never ks
	areaPrefix              // for squares and cubes: mm², cm², m², km²
	massPrefix              // µg to kg; above that the tonne reads better than Mg
)

type preferred struct {
	symbol string // unit expression
	head   string // the symbol a prefix attaches to
	exp    int    // the power of the head, which scales the prefix
	policy prefixPolicy
	// plainFrom, when set, keeps the unprefixed unit for values from it up
	// to 1000: flux densities read 0.8976 T, not 897.6 mT.
	plainFrom float64
}

func dimOf(expr string) Dim {
	u, err := Parse(expr)
	if err != nil {
		panic("units: preferred unit " + expr + ": " + err.Error())
	}
	return u.Dim
}

// preferredUnits maps a dimension to the unit an engineer expects to read it
// in. Dimensions not listed print in coherent SI base units.
var preferredUnits = func() map[Dim]preferred {
	rows := []preferred{
		{"m", "m", 1, engPrefix, 0}, {"g", "g", 1, massPrefix, 0}, {"s", "s", 1, downPrefix, 0},
		{"A", "A", 1, engPrefix, 0}, {"K", "K", 1, noPrefix, 0}, {"mol", "mol", 1, engPrefix, 0},
		{"cd", "cd", 1, noPrefix, 0}, {"m^2", "m", 2, areaPrefix, 0.1}, {"m^3", "m", 3, areaPrefix, 0.01},
		{"N", "N", 1, engPrefix, 0}, {"Pa", "Pa", 1, engPrefix, 0}, {"J", "J", 1, engPrefix, 0},
		{"W", "W", 1, engPrefix, 0}, {"C", "C", 1, engPrefix, 0}, {"V", "V", 1, engPrefix, 0},
		{"F", "F", 1, engPrefix, 0}, {"Ω", "Ω", 1, engPrefix, 0}, {"S", "S", 1, engPrefix, 0},
		{"Wb", "Wb", 1, engPrefix, 0}, {"T", "T", 1, engPrefix, 0.01}, {"H", "H", 1, engPrefix, 0},
		{"A/m", "A", 1, engPrefix, 0}, {"V/m", "V", 1, engPrefix, 0}, {"A/m^2", "A", 1, engPrefix, 0},
		{"H/m", "H", 1, engPrefix, 0}, {"F/m", "F", 1, engPrefix, 0}, {"A/Wb", "A", 1, engPrefix, 0},
		{"Ω*m", "Ω", 1, engPrefix, 0}, {"S/m", "S", 1, engPrefix, 0}, {"m/s", "m", 1, engPrefix, 0},
		{"m/s^2", "m", 1, noPrefix, 0}, {"kg*m^2", "", 0, noPrefix, 0}, {"1/K", "", 0, noPrefix, 0},
		{"K/W", "K", 1, noPrefix, 0}, {"W/K", "W", 1, engPrefix, 0}, {"V/s", "V", 1, engPrefix, 0},
		{"A/s", "A", 1, engPrefix, 0}, {"kg/m^3", "", 0, noPrefix, 0}, {"W/m^2", "W", 1, engPrefix, 0},
		{"Wb/m", "Wb", 1, engPrefix, 0}, {"N/m", "N", 1, engPrefix, 0}, {"J/kg", "J", 1, engPrefix, 0},
		{"V/A", "Ω", 1, engPrefix, 0}, {"1/s", "", 0, noPrefix, 0},
	}
	m := map[Dim]preferred{}
	for _, r := range rows {
		d := dimOf(r.symbol)
		if _, dup := m[d]; !dup {
			m[d] = r
		}
	}
	return m
}()

// AutoUnit picks the unit in which to show an SI value v of dimension d and
// kind k when the author gave none: the preferred unit for the dimension,
// with the SI prefix that puts the number between 1 and 1000.
func AutoUnit(v float64, d Dim, k Kind) Unit {
	if u, ok := kindUnit(v, d, k); ok {
		return u
	}
	if d.IsDimensionless() {
		return One
	}
	p, ok := preferredUnits[d]
	if !ok {
		return Unit{Symbol: d.SIUnits(), Dim: d, Scale: 1}
	}
	return withPrefix(v, p)
}

// kindKey picks a unit by dimension and kind.
type kindKey struct {
	dim  Dim
	kind Kind
}

// kindUnits are the units that show a kind, for the dimensions where
// engineers name it: an angle in degrees, a rotational frequency in Hz, a
// torque in N·m, a back-EMF constant in V·s/rad or V/krpm, active,
// apparent and reactive power in W, VA and var.
var kindUnits = func() map[kindKey]preferred {
	rows := []preferred{
		{"°", "", 0, noPrefix, 0}, {"rev", "", 0, noPrefix, 0}, {"rad/s", "", 0, noPrefix, 0},
		{"rad/s^2", "", 0, noPrefix, 0}, {"Hz", "Hz", 1, engPrefix, 0}, {"N*m", "N", 1, engPrefix, 0},
		{"V*s/rad", "", 0, noPrefix, 0}, {"V/krpm", "", 0, noPrefix, 0}, {"N*m/rad", "N", 1, engPrefix, 0},
		{"W", "W", 1, engPrefix, 0}, {"VA", "VA", 1, engPrefix, 0}, {"var", "var", 1, engPrefix, 0},
		{"°C", "", 0, noPrefix, 0},
	}
	m := map[kindKey]preferred{}
	for _, r := range rows {
		u, err := Parse(r.symbol)
		if err != nil {
			panic("units: kind unit " + r.symbol + ": " + err.Error())
		}
		m[kindKey{u.Dim, u.Kind}] = r
	}
	return m
}()

func kindUnit(v float64, d Dim, k Kind) (Unit, bool) {
	if k.IsPlain() {
		return Unit{}, false
	}
	p, ok := kindUnits[kindKey{d, k}]
	if !ok {
		return Unit{}, false
	}
	return withPrefix(v, p), true
}

func withPrefix(v float64, p preferred) Unit {
	u, _ := Parse(p.symbol)
	if p.policy == noPrefix || v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return u
	}
	mag := math.Abs(v) / u.Scale // the value in the unprefixed unit
	if p.plainFrom > 0 && mag >= p.plainFrom && mag < 1000 {
		return u
	}
	var candidates []int
	switch p.policy {
	case engPrefix:
		candidates = []int{-12, -9, -6, -3, 0, 3, 6, 9, 12}
	case downPrefix:
		candidates = []int{-12, -9, -6, -3, 0}
	case areaPrefix:
		candidates = []int{-3, -2, 0, 3}
	case massPrefix:
		candidates = []int{-9, -6, -3, 0, 3}
	}
	// Choose the largest prefix that leaves a number of at least 1.
	best := candidates[0]
	for _, e := range candidates {
		if mag/math.Pow10(e*p.exp) >= 1-1e-12 {
			best = e
		}
	}
	if best == 0 {
		return u
	}
	pr, _ := prefixByExp(best)
	out := u
	out.Scale = u.Scale * math.Pow10(best*p.exp)
	out.Symbol = strings.Replace(u.Symbol, p.head, pr.Symbol+p.head, 1)
	return out
}

// FormatNumber writes x to sig significant figures, keeping trailing zeros
// (they state the precision). Numbers from 0.001 up to 9999 print in
// plain decimals, others with an exponent: "1.235e+09". The minus sign is
// ASCII; renderers may set a typographic one.
func FormatNumber(x float64, sig int) string {
	if sig < 1 {
		sig = 1
	}
	if sig > 17 {
		sig = 17
	}
	switch {
	case math.IsNaN(x):
		return "NaN"
	case math.IsInf(x, 1):
		return "+Inf"
	case math.IsInf(x, -1):
		return "-Inf"
	case x == 0:
		return "0"
	}
	// Round first, then decide the notation from the rounded value, so that
	// 999.96 to 4 figures prints as 1000, not 1000.0.
	// The decimal exponent comes from the rounded text, not from Log10,
	// which returns 3 for 999.9999999999999 and so drops a figure.
	s := strconv.FormatFloat(x, 'e', sig-1, 64)
	r, _ := strconv.ParseFloat(s, 64)
	_, e := SplitExponent(s)
	if e < -3 || e >= 4 {
		return strconv.FormatFloat(r, 'e', sig-1, 64)
	}
	decimals := sig - 1 - e
	if decimals < 0 {
		decimals = 0
	}
	return strconv.FormatFloat(r, 'f', decimals, 64)
}

// SplitExponent splits "1.235e+09" into "1.235" and 9; plain numbers give
// the number and 0.
func SplitExponent(s string) (string, int) {
	i := strings.IndexByte(s, 'e')
	if i < 0 {
		return s, 0
	}
	e, err := strconv.Atoi(s[i+1:])
	if err != nil {
		return s, 0
	}
	return s[:i], e
}

// SpaceBefore reports whether a number is separated from this unit symbol
// by a space. The SI Brochure (9th ed., 5.4.3) puts a space before every
// unit symbol except the plane-angle degree, minute and second: 30°, 5′.
func SpaceBefore(symbol string) bool {
	switch symbol {
	case "°", "′", "″":
		return false
	}
	return true
}
