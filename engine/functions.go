package engine

import (
	"fmt"
	"math"
	"math/cmplx"
	"slices"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// argRule says what a function needs of its arguments' dimensions.
type argRule uint8

const (
	anyDim        argRule = iota // sqrt, abs
	sameDim                      // min, max, hypot, atan2: all arguments alike
	dimensionless                // exp, ln, round: pure numbers (angles are)
	angleArg                     // sin, cos, tan: an angle in radians or a pure number, never cycles
)

// resultRule says what dimension and kind the result has.
type resultRule uint8

const (
	likeArg  resultRule = iota // abs, min, max, hypot
	halfArg                    // sqrt
	plainOne                   // exp, ln, sin, round
	angle                      // asin, acos, atan, atan2
	powLen                     // product: the dimension to the power of the list's length
)

// Function is one entry of the function table. Adding a function is adding
// an entry: its arity, its type check (what it asks of its arguments'
// shape, dimension and kind, and what it returns), and its arithmetic.
type Function struct {
	Name    string
	MinArgs int
	MaxArgs int // -1 for any number
	Usage   string
	Doc     string
	// check infers the call's type from its arguments', which are
	// inferred already, or says what is wrong with them.
	check  func(n *Call) *diag.Diagnostic
	args   argRule
	result resultRule
	// domain explains a non-finite result from finite arguments.
	domain string
	// table marks interp, spline and pick, which read table columns.
	table string
	// whole marks round, floor and ceil, whose results are whole numbers.
	whole bool
	f1    func(float64) float64
	f2    func(float64, float64) float64
	// reduce is the arithmetic of a reduction of a list (sum, mean, ...);
	// min and max have it beside f2, for one list or several values.
	reduce func([]float64) float64
	// phasor marks arg, Re, Im and conj, functions of a phasor; cx is
	// the arithmetic of those that give a real value (complex.go).
	phasor bool
	cx     func(complex128) float64
	// build compiles a function of a series (series.go), and explain
	// says why its result is not a number.
	build   func(n *Call) evalFn
	explain func(n *Call, v []float64) *diag.Diagnostic
}

func (f *Function) arity() string {
	switch {
	case f.MaxArgs < 0:
		return fmt.Sprintf("%d or more arguments", f.MinArgs)
	case f.MinArgs == f.MaxArgs && f.MinArgs == 1:
		return "one argument"
	case f.MinArgs == f.MaxArgs:
		return fmt.Sprintf("%d arguments", f.MinArgs)
	}
	return fmt.Sprintf("%d to %d arguments", f.MinArgs, f.MaxArgs)
}

func one(name, doc string, args argRule, result resultRule, domain string, f func(float64) float64) *Function {
	return &Function{Name: name, MinArgs: 1, MaxArgs: 1, Usage: name + "(x)", Doc: doc, check: inferCall, args: args, result: result, domain: domain, f1: f}
}

// whole marks a function whose results are whole numbers.
func whole(f *Function) *Function {
	f.whole = true
	return f
}

func two(name, doc string, args argRule, result resultRule, f func(float64, float64) float64) *Function {
	return &Function{Name: name, MinArgs: 2, MaxArgs: 2, Usage: name + "(x, y)", Doc: doc, check: inferCall, args: args, result: result, f2: f}
}

func many(name, doc string, f func(float64, float64) float64, reduce func([]float64) float64) *Function {
	return &Function{Name: name, MinArgs: 1, MaxArgs: -1, Usage: name + "(list) or " + name + "(x, y, ...)", Doc: doc, check: inferMinMax, args: sameDim, result: likeArg, f2: f, reduce: reduce}
}

// reduction is a function of one list that gives one value; its result
// follows the rule, with product's dimension the element's to the
// power of the list's length.
func reduction(name, doc string, result resultRule, f func([]float64) float64) *Function {
	return &Function{Name: name, MinArgs: 1, MaxArgs: 1, Usage: name + "(list)", Doc: doc, check: inferReduce, result: result, reduce: f}
}

// ofPhasor is a function of one phasor: cx gives its real result, or nil
// for conj, whose result is a phasor.
func ofPhasor(name, doc string, cx func(complex128) float64) *Function {
	return &Function{Name: name, MinArgs: 1, MaxArgs: 1, Usage: name + "(z)", Doc: doc, check: inferComplexCall, phasor: true, cx: cx}
}

// functions is the function table.
var functions = map[string]*Function{}

func init() {
	for _, f := range []*Function{
		one("sqrt", "square root; halves the exponents of the dimension", anyDim, halfArg, "square root of a negative number", math.Sqrt),
		one("abs", "absolute value; of a phasor, its magnitude", anyDim, likeArg, "", math.Abs),
		ofPhasor("arg", "angle of a phasor, in (-180°, 180°]; an angle", cmplx.Phase),
		ofPhasor("Re", "real part of a phasor, in its unit", func(z complex128) float64 { return real(z) }),
		ofPhasor("Im", "imaginary part of a phasor, in its unit", func(z complex128) float64 { return imag(z) }),
		ofPhasor("conj", "complex conjugate of a phasor: the angle negated", nil),
		many("min", "smallest element of a list, or smallest argument; all of one dimension", math.Min, minOf),
		many("max", "largest element of a list, or largest argument; all of one dimension", math.Max, maxOf),
		reduction("sum", "sum of the elements of a list", likeArg, sumOf),
		reduction("product", "product of the elements of a list; the dimension to the power of the length", powLen, productOf),
		reduction("mean", "arithmetic mean of the elements of a list", likeArg, meanOf),
		reduction("rms", "root mean square of the elements of a list", likeArg, rmsOf),
		reduction("count", "number of elements of a list", plainOne, countOf),
		one("exp", "e to the power x; x a pure number", dimensionless, plainOne, "", math.Exp),
		one("ln", "natural logarithm; x a pure number", dimensionless, plainOne, "logarithm of zero or a negative number", math.Log),
		one("log10", "common logarithm; x a pure number", dimensionless, plainOne, "logarithm of zero or a negative number", math.Log10),
		one("sin", "sine of an angle (rad, or deg converted); cycles need a 2π first", angleArg, plainOne, "", math.Sin),
		one("cos", "cosine of an angle; cycles need a 2π first", angleArg, plainOne, "", math.Cos),
		one("tan", "tangent of an angle; cycles need a 2π first", angleArg, plainOne, "tangent of an odd multiple of 90°", math.Tan),
		one("asin", "inverse sine; returns an angle", dimensionless, angle, "asin of a number outside -1 to 1", math.Asin),
		one("acos", "inverse cosine; returns an angle", dimensionless, angle, "acos of a number outside -1 to 1", math.Acos),
		one("atan", "inverse tangent; returns an angle", dimensionless, angle, "", math.Atan),
		two("atan2", "angle of the point (x, y) from atan2(y, x); y and x of one dimension", sameDim, angle, math.Atan2),
		two("hypot", "sqrt(x² + y²) without overflow; x and y of one dimension", sameDim, likeArg, math.Hypot),
		whole(one("floor", "largest whole number not above x; x a pure number", dimensionless, plainOne, "", math.Floor)),
		whole(one("ceil", "smallest whole number not below x; x a pure number", dimensionless, plainOne, "", math.Ceil)),
		whole(one("round", "nearest whole number, halves away from zero; x a pure number", dimensionless, plainOne, "", math.Round)),
		{Name: "interp", MinArgs: 3, MaxArgs: 4, check: inferTableCall, Usage: "interp(T.y, T.x, x) or interp(T.y, T.x, x, extrapolate)", table: "linear",
			Doc: "y read from table T at x, straight lines between rows; refuses an x outside the table unless told to extrapolate"},
		{Name: "spline", MinArgs: 3, MaxArgs: 4, check: inferTableCall, Usage: "spline(T.y, T.x, x) or spline(T.y, T.x, x, extrapolate)", table: "cubic",
			Doc: "y read from table T at x along a monotone cubic (Fritsch–Butland) through the rows; refuses an x outside the table unless told to extrapolate"},
		{Name: "solve", MinArgs: 3, MaxArgs: 3, check: inferSolveCall, Usage: "x = solve(left == right, lowest, highest)",
			Doc: "the x between lowest and highest for which the relation holds (Brent's method); the relation may use statements that use x"},
		{Name: "pick", MinArgs: 3, MaxArgs: 3, check: inferTableCall, Usage: "pick(T.y, T.x, x)", table: "exact",
			Doc: "y from the row of table T whose x equals the given x"},
	} {
		functions[f.Name] = f
	}
}

func functionNames() []string {
	var names []string
	for n := range functions {
		names = append(names, n)
	}
	slices.Sort(names)
	return names
}

func functionList() string { return strings.Join(functionNames(), ", ") }

// Functions lists the function table, sorted by name, for documentation.
func Functions() []*Function {
	var out []*Function
	for _, n := range functionNames() {
		out = append(out, functions[n])
	}
	return out
}

// closest returns the candidate nearest to name, or "" if none is close.
func closest(name string, candidates []string) string {
	best, bestD := "", 3
	if len([]rune(name)) <= 3 {
		bestD = 2
	}
	for _, c := range candidates {
		if d := units.Distance(name, c); d < bestD || (d == bestD && c < best && best != "") {
			if d < bestD {
				best, bestD = c, d
			}
		}
	}
	for _, c := range candidates {
		if strings.EqualFold(c, name) {
			return c
		}
	}
	return best
}
