package units

import (
	"math"

	"gonum.org/v1/gonum/unit/constant"
)

// Constant is a named physical or mathematical constant that formulas may
// use. Constant names never take a letter that engineers use for a quantity:
// e, E, B, L, N, f, n, p and T stay free for the sheet.
type Constant struct {
	Name   string
	Symbol string // how it prints
	Value  float64
	Dim    Dim
	Source string
}

// mu0 is the magnetic constant from gonum's unit/constant package, which
// derives it from the CODATA 2018 fine-structure constant (2αh/(e²c)).
var mu0 = float64(constant.MagneticConstant)

// Constants are the built-in constants.
var Constants = []Constant{
	{Name: "pi", Symbol: "π", Value: math.Pi, Source: "mathematical constant"},
	{Name: "mu_0", Symbol: "μ₀", Value: mu0, Dim: dimOf("H/m"),
		Source: "CODATA 2018 magnetic constant, via gonum unit/constant"},
	{Name: "epsilon_0", Symbol: "ε₀", Value: 1 / (mu0 * float64(constant.LightSpeedInVacuum) * float64(constant.LightSpeedInVacuum)),
		Dim: dimOf("F/m"), Source: "CODATA 2018: ε₀ = 1/(μ₀c²)"},
	{Name: "c_0", Symbol: "c₀", Value: float64(constant.LightSpeedInVacuum), Dim: dimOf("m/s"),
		Source: "SI defining constant (exact), via gonum unit/constant"},
}

// ConstantByName finds a built-in constant by its name, or by its symbol
// where that is a name a formula can hold (π).
func ConstantByName(name string) (Constant, bool) {
	for _, c := range Constants {
		if c.Name == name || c.Symbol == name {
			return c, true
		}
	}
	return Constant{}, false
}
