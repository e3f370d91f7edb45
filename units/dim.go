// Package units holds sheaf's dimensions, its table of units, the parser
// for unit expressions such as "kg·m²/s³" or "W/(m*K)", conversion to and
// from coherent SI, and the formatting of values with sensible prefixes.
//
// Units are a compile-time concern: a parsed Unit carries the scale and
// offset to coherent SI once, so that evaluation works on plain float64s.
package units

import (
	"strconv"
	"strings"
)

// Base indexes the seven SI base quantities in the order the SI Brochure
// (9th ed., 2019, section 2.3.3) writes dimensions: T L M I Θ N J.
type Base int

// The base quantities.
const (
	Time Base = iota
	Length
	Mass
	Current
	Temperature
	Amount
	Luminous
	numBase
)

// baseSymbols are the dimension symbols of the SI Brochure, table 3.
var baseSymbols = [numBase]string{"T", "L", "M", "I", "Θ", "N", "J"}

// baseUnits are the coherent SI base units, in the same order.
var baseUnits = [numBase]string{"s", "m", "kg", "A", "K", "mol", "cd"}

// Dim is a dimension: the exponent of each base quantity. The zero value is
// dimensionless. Dim is comparable and small enough to pass by value.
type Dim [numBase]int8

// Dimensionless is the dimension of pure numbers (and of the radian).
var Dimensionless Dim

// DimOf returns the dimension with exponent 1 for one base quantity.
func DimOf(b Base) Dim {
	var d Dim
	d[b] = 1
	return d
}

// Mul returns the dimension of a product.
func (d Dim) Mul(o Dim) Dim {
	for i := range d {
		d[i] += o[i]
	}
	return d
}

// Div returns the dimension of a quotient.
func (d Dim) Div(o Dim) Dim {
	for i := range d {
		d[i] -= o[i]
	}
	return d
}

// Pow returns the dimension raised to an integer power.
func (d Dim) Pow(n int) Dim {
	for i := range d {
		d[i] *= int8(n)
	}
	return d
}

// Root returns the n-th root of the dimension and whether every exponent
// divides evenly; sqrt(m²) is m, sqrt(m) has no dimension sheaf can hold.
func (d Dim) Root(n int) (Dim, bool) {
	if n == 0 {
		return d, false
	}
	for i := range d {
		if int(d[i])%n != 0 {
			return d, false
		}
		d[i] /= int8(n)
	}
	return d, true
}

// IsDimensionless reports whether every exponent is zero.
func (d Dim) IsDimensionless() bool { return d == Dimensionless }

// PowFits reports whether raising d to the power p keeps every exponent a
// small integer, and returns the result.
func (d Dim) PowFits(p float64) (Dim, bool) {
	var out Dim
	for i, e := range d {
		x := float64(e) * p
		if x != float64(int64(x)) || x > 127 || x < -127 {
			return d, false
		}
		out[i] = int8(x)
	}
	return out, true
}

// String writes the dimension with the SI Brochure's symbols, for example
// "T⁻³ L² M I⁻¹" for the volt; "1" when dimensionless.
func (d Dim) String() string {
	if d.IsDimensionless() {
		return "1"
	}
	var parts []string
	for i, e := range d {
		if e == 0 {
			continue
		}
		parts = append(parts, baseSymbols[i]+superscript(int(e)))
	}
	return strings.Join(parts, " ")
}

// ASCII writes the dimension for machines: "T^-3 L^2 M I^-1"; "1" when
// dimensionless. Θ stays Θ; JSON carries UTF-8.
func (d Dim) ASCII() string {
	if d.IsDimensionless() {
		return "1"
	}
	var parts []string
	for i, e := range d {
		if e == 0 {
			continue
		}
		s := baseSymbols[i]
		if e != 1 {
			s += "^" + strconv.Itoa(int(e))
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, " ")
}

// SIUnits writes the dimension as a product of coherent SI base units, for
// example "kg·m²·s⁻³·A⁻¹"; "1" when dimensionless.
func (d Dim) SIUnits() string {
	if d.IsDimensionless() {
		return "1"
	}
	// Mass first, then length, as the SI Brochure writes derived units.
	order := []Base{Mass, Length, Time, Current, Temperature, Amount, Luminous}
	var parts []string
	for _, b := range order {
		if e := d[b]; e != 0 {
			parts = append(parts, baseUnits[b]+superscript(int(e)))
		}
	}
	return strings.Join(parts, "·")
}

var superDigits = []rune("⁰¹²³⁴⁵⁶⁷⁸⁹")

// superscript writes an exponent in superscript digits; 1 writes nothing.
func superscript(e int) string {
	if e == 1 {
		return ""
	}
	var b strings.Builder
	if e < 0 {
		b.WriteRune('⁻')
		e = -e
	}
	for _, c := range strconv.Itoa(e) {
		b.WriteRune(superDigits[c-'0'])
	}
	return b.String()
}
