package chart

import (
	"math"
	"testing"
)

// Values at the edges of float64 draw or are refused, and never panic or
// hang: spans that would overflow are refused (an x span of ±MaxFloat64
// once hung gonum's axis), subnormal spans and repeated values draw.
func TestExtremeValues(t *testing.T) {
	for name, c := range map[string]struct {
		ys   []float64
		draw bool
	}{
		"overflowing span": {[]float64{-math.MaxFloat64, math.MaxFloat64}, false},
		"beyond 1e300":     {[]float64{1e300, 1e301}, false},
		"at ±1e300":        {[]float64{-1e300, 1e300}, true},
		"subnormal span":   {[]float64{5e-324, 1e-323}, true},
		"equal":            {[]float64{7, 7}, true},
	} {
		ys := c.ys
		errs := map[string]error{}
		_, errs["y"] = Line(LineSpec{Curves: []Curve{{X: []float64{0, 1}, Y: ys}}})
		_, errs["x"] = Line(LineSpec{Curves: []Curve{{X: ys, Y: []float64{0, 1}}}})
		_, errs["phasors"] = Phasors(PhasorSpec{Arrows: []Arrow{{Value: complex(ys[0], ys[1])}, {Value: complex(ys[1], 0)}}})
		_, errs["bars"] = Bars(BarSpec{Orders: []int{1, 2}, Values: []float64{math.Abs(ys[0]), math.Abs(ys[1])}})
		for fig, err := range errs {
			if name == "equal" && fig == "x" {
				continue // x of 7 and 7 does not rise, but draws: gonum widens the axis
			}
			if (err == nil) != c.draw {
				t.Errorf("%s, %s: error %v, want drawn %v", name, fig, err, c.draw)
			}
		}
	}
}

// FuzzFigures draws figures of any four values: a figure or a spec error,
// never a panic or a hang.
func FuzzFigures(f *testing.F) {
	f.Add(0.0, 1.0, 2.0, 3.0)
	f.Add(1e15, 1e15+0.125, -1e-300, 1e-300)
	f.Add(math.MaxFloat64, 1.0, math.NaN(), 0.0)
	f.Add(-1e300, 1e300, 5e-324, 1e-323)
	f.Fuzz(func(t *testing.T, a, b, c, d float64) {
		Line(LineSpec{Curves: []Curve{{X: []float64{a, b}, Y: []float64{c, d}}}, YLimits: []Limit{{Value: d}}, Marks: []Mark{{X: b, Y: a}}})
		Phasors(PhasorSpec{Arrows: []Arrow{{Value: complex(a, b)}, {Tail: complex(a, b), Value: complex(c, d)}}})
		Bars(BarSpec{Orders: []int{1, 2}, Values: []float64{math.Abs(a), math.Abs(c)}, Labels: true})
	})
}
