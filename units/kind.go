package units

import (
	"strconv"
	"strings"
)

// Kind separates quantities that share a dimension but must not be
// converted into one another silently. The SI makes the radian and the
// cycle both 1, so rpm, Hz and rad/s all have dimension T⁻¹, and N·m and J
// are both M L² T⁻². sheaf keeps, beside the seven SI exponents, the
// exponents of the radian and of the cycle (revolution) as if both were
// base quantities (the proposals to make plane angle a base quantity, for
// example Quincey and Brown, Metrologia 53 (2016) 998), while values stay in
// coherent SI with rad = cycle = 1. Only the factor 2π, written in the
// formula, turns a cycle into a radian.
//
// A Tag marks what exponents cannot: absolute temperatures (°C, °F), and
// active, apparent and reactive power (W, VA, var).
//
// Kind is comparable; the zero value is a plain quantity.
type Kind struct {
	Rad int8 // exponent of the radian
	Cyc int8 // exponent of the cycle (revolution)
	Tag Tag
}

// Tag is what a Kind says beyond its angle exponents.
type Tag uint8

// The tags.
const (
	NoTag Tag = iota
	// TagAbsTemp marks a temperature on a scale with an offset zero (°C,
	// °F); its SI value is the thermodynamic temperature in K.
	TagAbsTemp
	// TagActive marks active power (W), TagApparent apparent power (VA)
	// and TagReactive reactive power (var), after IEC 60050-131.
	TagActive
	TagApparent
	TagReactive
)

// The kinds sheaf names.
var (
	// Plain quantities carry no meaning beyond their dimension.
	Plain = Kind{}
	// Angle quantities are measured in radians: rad, deg, rad/s.
	Angle = Kind{Rad: 1}
	// Cycle quantities count whole cycles or revolutions: Hz, rpm, r/s, rev
	// (ISO 80000-3 frequency and rotational frequency).
	Cycle = Kind{Cyc: 1}
	// PerRadian quantities are something per radian: torque in N·m (an
	// energy per radian), a back-EMF constant in V·s/rad, a torque
	// constant in N·m/A.
	PerRadian = Kind{Rad: -1}
	// PerCycle quantities are something per revolution: V/rpm, V/krpm.
	PerCycle = Kind{Cyc: -1}
	// AbsTemp quantities are temperatures in °C or °F.
	AbsTemp = Kind{Tag: TagAbsTemp}
	// Active, Apparent and Reactive are the kinds of W, VA and var.
	Active   = Kind{Tag: TagActive}
	Apparent = Kind{Tag: TagApparent}
	Reactive = Kind{Tag: TagReactive}
)

// IsPlain reports whether the kind says nothing beyond the dimension.
func (k Kind) IsPlain() bool { return k == Plain }

// IsAbsTemp reports whether the kind is an absolute temperature.
func (k Kind) IsAbsTemp() bool { return k.Tag == TagAbsTemp }

// Mixed reports whether the kind holds both radians and cycles: a 2π that
// no formula put in, or one too many.
func (k Kind) Mixed() bool { return k.Rad != 0 && k.Cyc != 0 }

// Angular reports whether the kind has any radian or cycle exponent.
func (k Kind) Angular() bool { return k.Rad != 0 || k.Cyc != 0 }

// IsPower reports whether the kind carries a power tag.
func (k Kind) IsPower() bool {
	return k.Tag == TagActive || k.Tag == TagApparent || k.Tag == TagReactive
}

// Exponents returns the kind without its tag.
func (k Kind) Exponents() Kind { return Kind{Rad: k.Rad, Cyc: k.Cyc} }

// Mul returns the kind of a product: the exponents add, and tags, which
// belong to a quantity alone, are dropped.
func (k Kind) Mul(o Kind) Kind { return Kind{Rad: k.Rad + o.Rad, Cyc: k.Cyc + o.Cyc} }

// Div returns the kind of a quotient.
func (k Kind) Div(o Kind) Kind { return Kind{Rad: k.Rad - o.Rad, Cyc: k.Cyc - o.Cyc} }

// Pow returns the kind raised to an integer power; the first power is the
// kind itself, its tag (an active, reactive or apparent power) kept.
func (k Kind) Pow(n int) Kind {
	if n == 1 {
		return k // W^1 is still an active power: only a true power loses the tag
	}
	return Kind{Rad: k.Rad * int8(n), Cyc: k.Cyc * int8(n)}
}

// Root returns the n-th root of the kind and whether its exponents divide
// evenly.
func (k Kind) Root(n int) (Kind, bool) {
	if n == 0 || int(k.Rad)%n != 0 || int(k.Cyc)%n != 0 {
		return Plain, false
	}
	return Kind{Rad: k.Rad / int8(n), Cyc: k.Cyc / int8(n)}, true
}

// Turn multiplies the kind by (rad/cycle)^n: what a factor (2π)^n does to
// a quantity in a formula, turning n cycles into n radians.
func (k Kind) Turn(n int) Kind {
	return Kind{Rad: k.Rad + int8(n), Cyc: k.Cyc - int8(n), Tag: k.Tag}
}

// kindFits reports whether a product (sign 1) or quotient (sign -1) of two
// kinds keeps its exponents small.
func kindFits(a, b Kind, sign int) bool {
	r, c := int(a.Rad)+sign*int(b.Rad), int(a.Cyc)+sign*int(b.Cyc)
	return r <= maxUnitExp && r >= -maxUnitExp && c <= maxUnitExp && c >= -maxUnitExp
}

// KindFits reports whether the kinds of a product (sign 1) or quotient
// (sign -1) keep their exponents within ±99, as unit exponents are.
func KindFits(a, b Kind, sign int) bool { return kindFits(a, b, sign) }

// KindPowFits reports whether raising k to the power n keeps its exponents
// within ±99.
func KindPowFits(k Kind, n int) bool {
	r, c := int(k.Rad)*n, int(k.Cyc)*n
	return r <= maxUnitExp && r >= -maxUnitExp && c <= maxUnitExp && c >= -maxUnitExp
}

// String names the kind for messages and JSON: "angle", "cycles",
// "per radian", "per cycle", "absolute temperature", "active power",
// "apparent power", "reactive power", or the exponents as "rad^2 cycle^-1";
// "plain" for the zero kind.
func (k Kind) String() string {
	switch k {
	case Plain:
		return "plain"
	case Angle:
		return "angle"
	case Cycle:
		return "cycles"
	case PerRadian:
		return "per radian"
	case PerCycle:
		return "per cycle"
	}
	var parts []string
	if k.Rad != 0 {
		parts = append(parts, "rad^"+strconv.Itoa(int(k.Rad)))
	}
	if k.Cyc != 0 {
		parts = append(parts, "cycle^"+strconv.Itoa(int(k.Cyc)))
	}
	switch k.Tag {
	case TagAbsTemp:
		parts = append(parts, "absolute temperature")
	case TagActive:
		parts = append(parts, "active power")
	case TagApparent:
		parts = append(parts, "apparent power")
	case TagReactive:
		parts = append(parts, "reactive power")
	}
	return strings.Join(parts, " ")
}

// Noun says what a quantity of this kind and dimension is, for messages:
// "a rotational frequency (cycles)", "a torque (energy per radian)".
// It returns "" for kinds that need no word.
func (k Kind) Noun(d Dim) string {
	perTime := Dim{Time: -1}
	switch {
	case k == Cycle && d == perTime:
		return "a rotational frequency or frequency (cycles per time: Hz, rpm)"
	case k == Angle && d == perTime:
		return "an angular velocity (radians per time: rad/s)"
	case k == Angle && d.IsDimensionless():
		return "an angle (rad, °)"
	case k == Cycle && d.IsDimensionless():
		return "a number of revolutions or cycles"
	case k == PerRadian && d == dimEnergy:
		return "a torque (an energy per radian, N·m)"
	case k == PerRadian:
		return "a quantity per radian"
	case k == PerCycle:
		return "a quantity per revolution"
	case k.Tag == TagAbsTemp:
		return "an absolute temperature (°C, °F)"
	case k.Tag == TagActive:
		return "an active power (W)"
	case k.Tag == TagApparent:
		return "an apparent power (VA)"
	case k.Tag == TagReactive:
		return "a reactive power (var)"
	case k.Rad > 0 && k.Cyc == 0:
		return "a quantity in radians"
	case k.Cyc > 0 && k.Rad == 0:
		return "a quantity in cycles"
	}
	if k.Angular() {
		return "a quantity of kind " + k.String()
	}
	return ""
}

var (
	dimEnergy = Dim{Mass: 1, Length: 2, Time: -2}
	dimPower  = Dim{Mass: 1, Length: 2, Time: -3}
	dimForce  = Dim{Mass: 1, Length: 1, Time: -2}
)

// IsEnergyOrPower reports whether d is the dimension of energy or power,
// whose units (J, Wh, W) refuse a quantity per radian (a torque).
func IsEnergyOrPower(d Dim) bool { return d == dimEnergy || d == dimPower }
