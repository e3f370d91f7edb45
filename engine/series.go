package engine

import (
	"fmt"
	"math"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Sampled series. series(y, x) pairs two lists of one length, each with
// its own unit: flux linkage against rotor angle, current against time.
// A series is a list of its y values (so indexing, element-wise
// arithmetic with single values and the reductions work on y), with its x
// values placed right after them in the frame. x must rise strictly: a
// repeated or falling x is refused, at check time when x is known then
// (a range, a table column, a list of literals), else when the sheet runs.

// MinSeriesSamples is the fewest samples a series may have: a derivative
// of second order needs three, and fewer than four describe no shape.
const MinSeriesSamples = 4

// IsSeries reports whether a node holds a sampled series.
func (t *Type) IsSeries() bool { return t.Shape == Series }

// axisIn returns a series statement's x values in v.
func (st *Statement) axisIn(v []float64) []float64 {
	at, n := listAt(st.Expr)
	return v[at+n : at+2*n]
}

// axisAt is where a series node's x values lie in a frame's values.
func axisAt(e Expr) int {
	at, n := listAt(e)
	return at + n
}

func init() {
	for _, f := range []*Function{
		{Name: "series", MinArgs: 2, MaxArgs: 2, Usage: "series(y, x)", check: inferSeries, build: compileSeries, explain: explainSeries,
			Doc: "a sampled series y(x) from two lists of one length, each with its own unit; x must rise strictly"},
		ofSeries("deriv", "derivative dy/dx of a series, a series over the same x (second-order differences)", inferDeriv, compileDeriv),
		ofSeries("integral", "integral of y over the span of x (trapezoidal); the unit of y times the unit of x", inferIntegral, compileSpan(integralOf)),
		ofSeries("peak", "largest magnitude of y over the span", inferLikeY, compileSpan(peakOf)),
		{Name: "valueat", MinArgs: 2, MaxArgs: 2, Usage: "valueat(s, x)", check: inferValueAt, build: compileValueAt, explain: explainValueAt,
			Doc: "y of a series at x, on straight lines between samples; refuses an x outside the span"},
	} {
		functions[f.Name] = f
	}
}

func ofSeries(name, doc string, check func(*Call) *diag.Diagnostic, build func(*Call) evalFn) *Function {
	return &Function{Name: name, MinArgs: 1, MaxArgs: 1, Usage: name + "(s)", Doc: doc, check: check, build: build}
}

// inferSeries checks series(y, x): two real lists of one length, at
// least MinSeriesSamples long, and an x that rises strictly when known.
func inferSeries(n *Call) *diag.Diagnostic {
	y, x := n.Args[0].Type(), n.Args[1].Type()
	for _, a := range n.Args {
		t := a.Type()
		if t.Shape != List || t.IsComplex() {
			return errAt(a.Pos(), "give y and x as lists, as series(lambda, theta) with theta = 0 deg .. 360 deg by 5 deg",
				"series takes two lists of real values; this is %s", shapeText(t))
		}
	}
	if y.Len != x.Len {
		return errAt(n.Pos(), "give y and x the same number of samples",
			"y has %d samples but x has %d", y.Len, x.Len)
	}
	if y.Len < MinSeriesSamples {
		return errAt(n.Pos(), fmt.Sprintf("give at least %d samples", MinSeriesSamples),
			"a series of %d samples is too short to describe a shape", y.Len)
	}
	if x.Kind.IsAbsTemp() {
		return errAt(n.Args[1].Pos(), "give x as temperature differences in K", "a series over absolute temperatures (°C or °F) is not supported")
	}
	if xs, ok := knownValues(n.Args[1]); ok {
		if i := notRising(xs); i > 0 {
			return notRisingError(n, i, xs)
		}
	}
	*n.Type() = Type{Shape: Series, Len: y.Len, Dim: y.Dim, Kind: y.Kind, XDim: x.Dim, XKind: x.Kind}
	return nil
}

// knownValues returns a list's values in SI when the checker knows them.
func knownValues(e Expr) ([]float64, bool) {
	switch e := e.(type) {
	case *Range:
		return e.Values, true
	case *Ref:
		if e.Column != nil {
			return e.Column.Values, true
		}
		if e.Target != nil && e.Target.Expr != nil {
			return knownValues(e.Target.Expr)
		}
	case *ListLit:
		vals := make([]float64, len(e.Elems))
		for i, x := range e.Elems {
			c, ok := constOf(x)
			if !ok {
				return nil, false
			}
			vals[i] = c
		}
		return vals, true
	}
	return nil, false
}

// notRising returns the first i with xs[i] <= xs[i-1], or 0.
func notRising(xs []float64) int {
	for i := 1; i < len(xs); i++ {
		if !(xs[i] > xs[i-1]) {
			return i
		}
	}
	return 0
}

// notRisingError places the error at the sample itself when x is a list
// literal, else at x.
func notRisingError(n *Call, i int, xs []float64) *diag.Diagnostic {
	at := n.Args[1].Pos()
	if l, ok := n.Args[1].(*ListLit); ok {
		at = l.Elems[i].Pos()
	}
	if xs[i] == xs[i-1] {
		return errAt(at, "remove the repeated sample, or correct its x",
			"x of sample %d repeats x of sample %d; the x of a series must rise strictly", i+1, i)
	}
	return errAt(at, "sort the samples by x", "x of sample %d is below x of sample %d; the x of a series must rise strictly", i+1, i)
}

// compileSeries copies y and x to the series' places; an x that does not
// rise makes y's first value NaN, which explainSeries turns into words.
func compileSeries(n *Call) evalFn {
	at, l := listAt(n)
	fy, fx := fnOf(n.Args[0]), fnOf(n.Args[1])
	ya, xa := int(n.Args[0].base().at), int(n.Args[1].base().at)
	return func(v []float64) float64 {
		fy(v)
		fx(v)
		copy(v[at:at+l], v[ya:ya+l])
		copy(v[at+l:at+2*l], v[xa:xa+l])
		if notRising(v[at+l:at+2*l]) > 0 {
			v[at] = math.NaN()
		}
		return 0
	}
}

func explainSeries(n *Call, v []float64) *diag.Diagnostic {
	xa, l := int(n.Args[1].base().at), n.Type().Len
	xs := v[xa : xa+l]
	if i := notRising(xs); i > 0 {
		return notRisingError(n, i, xs)
	}
	return nil
}

// seriesArg checks that the first argument of a function of a series is one.
func seriesArg(n *Call) (*Type, *diag.Diagnostic) {
	s := n.Args[0].Type()
	if !s.IsSeries() {
		return nil, errAt(n.Args[0].Pos(), "make a series first, as s = series(y, x)",
			"%s works on a sampled series; this is %s", n.Name, shapeText(s))
	}
	return s, nil
}

func inferDeriv(n *Call) *diag.Diagnostic {
	s, err := seriesArg(n)
	if err != nil {
		return err
	}
	*n.Type() = Type{Shape: Series, Len: s.Len, Dim: s.Dim.Div(s.XDim), Kind: s.Kind.Div(s.XKind), XDim: s.XDim, XKind: s.XKind}
	return nil
}

func inferIntegral(n *Call) *diag.Diagnostic {
	s, err := seriesArg(n)
	if err != nil {
		return err
	}
	if s.Kind.IsAbsTemp() {
		return errAt(n.Args[0].Pos(), "integrate temperature differences in K", "cannot integrate absolute temperatures (°C or °F)")
	}
	*n.Type() = Type{Dim: s.Dim.Mul(s.XDim), Kind: s.Kind.Exponents().Mul(s.XKind)}
	return nil
}

func inferLikeY(n *Call) *diag.Diagnostic {
	s, err := seriesArg(n)
	if err != nil {
		return err
	}
	*n.Type() = Type{Dim: s.Dim, Kind: s.Kind}
	return nil
}

func inferValueAt(n *Call) *diag.Diagnostic {
	s, err := seriesArg(n)
	if err != nil {
		return err
	}
	x := n.Args[1].Type()
	if x.IsList() || x.IsComplex() || x.Dim != s.XDim {
		return errAt(n.Args[1].Pos(), "give one x in the unit of the series' x",
			"x must be one value of %s, as the series' x is; this is %s", units.Describe(s.XDim), units.Describe(x.Dim))
	}
	*n.Type() = Type{Dim: s.Dim, Kind: s.Kind}
	return nil
}

// seriesIn returns the y and x values of the series node e in v.
func seriesIn(e Expr, v []float64) (ys, xs []float64) {
	at, n := listAt(e)
	return v[at : at+n], v[at+n : at+2*n]
}

// compileDeriv writes dy/dx at every sample: the three-point formula for
// uneven steps inside, its one-sided form at the ends (both second order).
func compileDeriv(n *Call) evalFn {
	fs, s := fnOf(n.Args[0]), n.Args[0]
	at, l := listAt(n)
	return func(v []float64) float64 {
		fs(v)
		ys, xs := seriesIn(s, v)
		derivInto(v[at:at+l], ys, xs)
		copy(v[at+l:at+2*l], xs)
		return 0
	}
}

func derivInto(o, y, x []float64) {
	n := len(y)
	for i := 1; i < n-1; i++ {
		h1, h2 := x[i]-x[i-1], x[i+1]-x[i]
		o[i] = -h2/(h1*(h1+h2))*y[i-1] + (h2-h1)/(h1*h2)*y[i] + h1/(h2*(h1+h2))*y[i+1]
	}
	h1, h2 := x[1]-x[0], x[2]-x[1]
	o[0] = -(2*h1+h2)/(h1*(h1+h2))*y[0] + (h1+h2)/(h1*h2)*y[1] - h1/(h2*(h1+h2))*y[2]
	h1, h2 = x[n-2]-x[n-3], x[n-1]-x[n-2]
	o[n-1] = h2/(h1*(h1+h2))*y[n-3] - (h1+h2)/(h1*h2)*y[n-2] + (h1+2*h2)/(h2*(h1+h2))*y[n-1]
}

// compileSpan builds a function of a series' y and x to one value.
func compileSpan(f func(y, x []float64) float64) func(*Call) evalFn {
	return func(n *Call) evalFn {
		fs, s := fnOf(n.Args[0]), n.Args[0]
		return func(v []float64) float64 {
			fs(v)
			return f(seriesIn(s, v))
		}
	}
}

// integralOf is the trapezoidal integral of y over x.
func integralOf(y, x []float64) float64 {
	s := 0.0
	for i := 1; i < len(y); i++ {
		s += (x[i] - x[i-1]) * (y[i] + y[i-1])
	}
	return s / 2
}

func peakOf(y, _ []float64) float64 { return math.Abs(largest(y)) }

// spanMeanOf is the mean over the span, ∫y dx / span: for samples that
// are even and cover a period with both ends, the mean of one period.
func spanMeanOf(y, x []float64) float64 { return integralOf(y, x) / (x[len(x)-1] - x[0]) }

// spanRMSOf is the root mean square over the span, scaled by the peak so
// that squares of large values do not overflow.
func spanRMSOf(y, x []float64) float64 {
	scale := peakOf(y, x)
	if scale == 0 || math.IsInf(scale, 0) || math.IsNaN(scale) {
		return scale
	}
	s := 0.0
	for i := 1; i < len(y); i++ {
		a, b := y[i-1]/scale, y[i]/scale
		s += (x[i] - x[i-1]) * (a*a + b*b)
	}
	return scale * math.Sqrt(s/2/(x[len(x)-1]-x[0]))
}

// compileValueAt reads y at x on straight lines between samples; an x
// outside the span gives NaN, which explainValueAt puts in words.
func compileValueAt(n *Call) evalFn {
	fs, fx, s := fnOf(n.Args[0]), fnOf(n.Args[1]), n.Args[0]
	return func(v []float64) float64 {
		fs(v)
		return valueAt(seriesIn(s, v))(fx(v))
	}
}

func valueAt(y, x []float64) func(float64) float64 {
	return func(at float64) float64 {
		n := len(x)
		if !(at >= x[0] && at <= x[n-1]) {
			return math.NaN()
		}
		lo, hi := 0, n-1
		for hi-lo > 1 {
			m := (lo + hi) / 2
			if x[m] <= at {
				lo = m
			} else {
				hi = m
			}
		}
		t := (at - x[lo]) / (x[hi] - x[lo])
		return y[lo] + t*(y[hi]-y[lo])
	}
}

func explainValueAt(n *Call, v []float64) *diag.Diagnostic {
	_, xs := seriesIn(n.Args[0], v)
	at := fnOf(n.Args[1])(v)
	if at >= xs[0] && at <= xs[len(xs)-1] {
		return nil
	}
	u := units.AutoUnit(math.Max(math.Abs(xs[0]), math.Abs(xs[len(xs)-1])), n.Args[0].Type().XDim, n.Args[0].Type().XKind)
	show := func(si float64) string {
		if units.SpaceBefore(u.Symbol) {
			return units.FormatNumber(u.FromSI(si), 4) + " " + u.Symbol
		}
		return units.FormatNumber(u.FromSI(si), 4) + u.Symbol
	}
	return errAt(n.Args[1].Pos(), "give an x within the series' span",
		"x = %s is outside the series' span, %s to %s", show(at), show(xs[0]), show(xs[len(xs)-1]))
}

// inferSeriesOperands sets the shape of an operation with a series: a
// series and a single value give a series over the same x.
func inferSeriesOperands(n *Binary) *diag.Diagnostic {
	x, y := n.X.Type(), n.Y.Type()
	if !x.IsSeries() && !y.IsSeries() {
		return nil
	}
	if x.IsList() && y.IsList() {
		return errAt(n.Pos(), "combine a series with single values; for two series, build a new series(y, x) from their y lists over one x",
			"an operation on a series takes a single value on its other side; here both sides are lists or series")
	}
	s := x
	if !x.IsSeries() {
		s = y
	}
	t := n.Type()
	t.Shape, t.XDim, t.XKind = Series, s.XDim, s.XKind
	return nil
}

// withAxis makes fn, which writes the y values of the series node e,
// copy the x values of its operand that is a series too.
func withAxis(e Expr, fn evalFn) evalFn {
	if !e.Type().IsSeries() {
		return fn
	}
	var src Expr
	for _, c := range e.children() {
		if c.Type().IsSeries() {
			src = c
		}
	}
	at, l := listAt(e)
	from := axisAt(src)
	return func(v []float64) float64 {
		fn(v)
		copy(v[at+l:at+2*l], v[from:from+l])
		return 0
	}
}

// spanReduction holds the reductions that a series takes over its span
// rather than over its samples: mean and rms weigh each sample by its
// share of x.
var spanReduction = map[string]func(y, x []float64) float64{
	"mean": spanMeanOf,
	"rms":  spanRMSOf,
}

// axisUnit picks the unit a series' x shows in: degrees for an angle, as
// drawings give rotor positions, else the unit that suits its largest end.
func axisUnit(t Type, xs []float64) units.Unit {
	if t.XKind == units.Angle {
		if u, ok := units.Lookup("deg"); ok {
			return u
		}
	}
	return units.AutoUnit(math.Max(math.Abs(xs[0]), math.Abs(xs[len(xs)-1])), t.XDim, t.XKind)
}
