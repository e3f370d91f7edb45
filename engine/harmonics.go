package engine

import (
	"fmt"
	"math"
	"math/cmplx"
	"sync"

	"gonum.org/v1/gonum/dsp/fourier"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Harmonic analysis of a series that holds one period: its samples evenly
// spaced in x, and both ends of the period given (the last sample repeats
// the first, as 0 deg .. 360 deg does), so that the span is the period.
// The N = samples − 1 samples of the period go through gonum's real FFT;
// the k-th harmonic's amplitude is 2|c_k|/N and its phase arg(c_k),
// referred to x = 0, for y = Σ A_k·cos(k·2π·x/T + φ_k).

// MinPeriodSamples is the fewest samples per period for harmonics.
const MinPeriodSamples = 8

// Tolerances of the checks of one period: each step within this share of
// the mean step, and the ends within this share of the peak.
const (
	evenTolerance     = 1e-6
	periodicTolerance = 1e-6
)

func init() {
	for _, f := range []*Function{
		{Name: "harmonic", MinArgs: 2, MaxArgs: 2, Usage: "harmonic(s, k)", check: inferHarmonic, build: compileHarmonic(harmonicAmplitude), explain: explainHarmonic,
			Doc: "amplitude of the k-th harmonic of a series that holds one period, evenly sampled with both ends; in y's unit"},
		{Name: "harmonicphase", MinArgs: 2, MaxArgs: 2, Usage: "harmonicphase(s, k)", check: inferHarmonic, build: compileHarmonic(harmonicPhase), explain: explainHarmonic,
			Doc: "phase φ_k of the k-th harmonic, A_k·cos(k·2π·x/T + φ_k), referred to x = 0; an angle"},
		{Name: "thd", MinArgs: 1, MaxArgs: 1, Usage: "thd(s)", check: inferHarmonic, build: compileHarmonic(thdOf), explain: explainHarmonic,
			Doc: "total harmonic distortion: √(Σ A_k², k ≥ 2) / A_1, over the harmonics the sampling resolves; a pure number"},
	} {
		functions[f.Name] = f
	}
}

// inferHarmonic checks harmonic, harmonicphase and thd: a series of
// enough samples, a whole harmonic number that the sampling resolves,
// and even samples when the series' x is known.
func inferHarmonic(n *Call) *diag.Diagnostic {
	s, err := seriesArg(n)
	if err != nil {
		return err
	}
	per := s.Len - 1
	if per < MinPeriodSamples {
		return errAt(n.Args[0].Pos(), fmt.Sprintf("sample the period at least %d times, both ends given", MinPeriodSamples),
			"the sampling is too coarse for harmonics: the series has %d samples per period", per)
	}
	if xs, ok := knownAxis(n.Args[0]); ok {
		if i := unevenAt(xs); i > 0 {
			return unevenError(n, i)
		}
	}
	t := n.Type()
	switch n.Name {
	case "harmonic":
		*t = Type{Dim: s.Dim, Kind: s.Kind}
	case "harmonicphase":
		*t = Type{Dim: units.Dimensionless, Kind: units.Angle}
	default:
		*t = Type{Dim: units.Dimensionless, Kind: units.Plain}
		return nil
	}
	k := n.Args[1].Type()
	if k.IsList() || k.IsComplex() || !k.Dim.IsDimensionless() || k.Kind.Angular() {
		return errAt(n.Args[1].Pos(), "write the harmonic's number, as harmonic(s, 5)", "the harmonic's number is one pure whole number")
	}
	if k.Const {
		return harmonicNumberProblem(n, k.Val, per)
	}
	return nil
}

// harmonicNumberProblem refuses k that is not whole, below 1, or above
// what per samples per period resolve.
func harmonicNumberProblem(n *Call, k float64, per int) *diag.Diagnostic {
	top := (per - 1) / 2
	switch {
	case k != math.Trunc(k) || k < 1:
		return errAt(n.Args[1].Pos(), "write a whole number from 1", "harmonic %g is not a whole number from 1", k)
	case k > float64(top):
		return errAt(n.Args[1].Pos(), fmt.Sprintf("sample the period more than %d times, or ask for harmonic %d at most", int(2*k), top),
			"the sampling is too coarse for harmonic %g: %d samples per period resolve harmonics up to %d", k, per, top)
	}
	return nil
}

// knownAxis returns the x values of a series when the checker knows them.
func knownAxis(e Expr) ([]float64, bool) {
	switch e := e.(type) {
	case *Ref:
		if e.Target != nil && e.Target.Expr != nil {
			return knownAxis(e.Target.Expr)
		}
	case *Call:
		if e.Func.Name == "series" {
			return knownValues(e.Args[1])
		}
		if e.Func.Name == "deriv" {
			return knownAxis(e.Args[0])
		}
	case *Unary:
		return knownAxis(e.X)
	case *Binary:
		if e.X.Type().IsSeries() {
			return knownAxis(e.X)
		}
		return knownAxis(e.Y)
	}
	return nil, false
}

// unevenAt returns the first step that differs from the mean step by
// more than evenTolerance of it, or 0.
func unevenAt(xs []float64) int {
	h := (xs[len(xs)-1] - xs[0]) / float64(len(xs)-1)
	for i := 1; i < len(xs); i++ {
		if math.Abs(xs[i]-xs[i-1]-h) > evenTolerance*h {
			return i
		}
	}
	return 0
}

func unevenError(n *Call, i int) *diag.Diagnostic {
	return errAt(n.Args[0].Pos(), "sample the period evenly, as theta = 0 deg .. 360 deg by 1 deg",
		"the samples are uneven: the step from sample %d to sample %d differs from the mean step; harmonics need even samples", i, i+1)
}

// notPeriodic reports whether the last sample differs from the first by
// more than periodicTolerance of the peak.
func notPeriodic(ys []float64) bool {
	peak := math.Abs(largest(ys))
	return math.Abs(ys[len(ys)-1]-ys[0]) > periodicTolerance*peak
}

// spectrum holds one call's FFT and its coefficients; a pool keeps one per
// goroutine, since a Program is shared and the FFT keeps scratch space.
type spectrum struct {
	fft   *fourier.FFT
	coeff []complex128
}

// compileHarmonic builds harmonic, harmonicphase or thd; a series that
// is uneven or not periodic, or a k the sampling does not resolve, gives
// NaN, which explainHarmonic puts in words.
func compileHarmonic(f func(c []complex128, k, per int, x0, period float64) float64) func(*Call) evalFn {
	return func(n *Call) evalFn {
		fs, s := fnOf(n.Args[0]), n.Args[0]
		per := s.Type().Len - 1
		fk := constant(0)
		if len(n.Args) > 1 {
			fk = fnOf(n.Args[1])
		}
		pool := &sync.Pool{New: func() any {
			return &spectrum{fft: fourier.NewFFT(per), coeff: make([]complex128, per/2+1)}
		}}
		return func(v []float64) float64 {
			fs(v)
			ys, xs := seriesIn(s, v)
			k := fk(v)
			if unevenAt(xs) > 0 || notPeriodic(ys) || len(n.Args) > 1 && (k != math.Trunc(k) || k < 1 || k > float64((per-1)/2)) {
				return math.NaN()
			}
			sp := pool.Get().(*spectrum)
			defer pool.Put(sp)
			sp.fft.Coefficients(sp.coeff, ys[:per])
			return f(sp.coeff, int(k), per, xs[0], xs[per]-xs[0])
		}
	}
}

func harmonicAmplitude(c []complex128, k, per int, _, _ float64) float64 {
	return 2 * cmplx.Abs(c[k]) / float64(per)
}

func harmonicPhase(c []complex128, k, _ int, x0, period float64) float64 {
	return math.Remainder(cmplx.Phase(c[k])-2*math.Pi*float64(k)*x0/period, 2*math.Pi)
}

func thdOf(c []complex128, _, per int, _, _ float64) float64 {
	top := (per - 1) / 2 // the harmonics below the Nyquist bin
	scale := 0.0
	for _, z := range c[2 : top+1] {
		scale = math.Max(scale, cmplx.Abs(z))
	}
	if f := cmplx.Abs(c[1]); f <= 1e-9*scale || f == 0 {
		return math.NaN() // no fundamental: explainHarmonic says so
	}
	if scale == 0 {
		return 0
	}
	s := 0.0
	for _, z := range c[2 : top+1] {
		r := cmplx.Abs(z) / scale
		s += r * r
	}
	return scale * math.Sqrt(s) / cmplx.Abs(c[1])
}

func explainHarmonic(n *Call, v []float64) *diag.Diagnostic {
	ys, xs := seriesIn(n.Args[0], v)
	per := len(xs) - 1
	switch {
	case unevenAt(xs) > 0:
		return unevenError(n, unevenAt(xs))
	case notPeriodic(ys):
		return errAt(n.Args[0].Pos(), "give one whole period with both ends, as theta = 0 deg .. 360 deg, so the last sample repeats the first",
			"the series is not periodic over its span: its last sample differs from its first")
	case len(n.Args) > 1:
		if err := harmonicNumberProblem(n, fnOf(n.Args[1])(v), per); err != nil {
			return err
		}
	}
	if n.Name == "thd" {
		return errAt(n.Pos(), "check the series: THD is relative to the fundamental", "the series has no fundamental (its 1st harmonic is zero)")
	}
	return nil
}

// Harmonics returns the amplitudes A_1 … A_k of a series result's first
// k harmonics, in SI of its y, as harmonic(s, n) gives each: fewer when
// the sampling resolves fewer. It refuses a result that is not a series,
// is sampled too coarsely or unevenly, or does not hold one period.
func (r Result) Harmonics(k int) ([]float64, error) {
	per := len(r.Over) - 1
	switch {
	case r.Over == nil || len(r.List) != len(r.Over):
		return nil, errHarmonics("the value is not a series")
	case per < MinPeriodSamples:
		return nil, errHarmonics("the series has %d samples per period; harmonics need at least %d", per, MinPeriodSamples)
	case unevenAt(r.Over) > 0:
		return nil, errHarmonics("the samples are uneven; harmonics need even samples")
	case notPeriodic(r.List):
		return nil, errHarmonics("the series is not periodic over its span: its last sample differs from its first")
	case k < 1:
		return nil, errHarmonics("ask for at least the fundamental")
	}
	c := make([]complex128, per/2+1)
	fourier.NewFFT(per).Coefficients(c, r.List[:per])
	k = min(k, (per-1)/2)
	out := make([]float64, k)
	for i := range out {
		out[i] = harmonicAmplitude(c, i+1, per, 0, 0)
	}
	return out, nil
}

func errHarmonics(format string, args ...any) error {
	return fmt.Errorf("harmonics: "+format, args...)
}
