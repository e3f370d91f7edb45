package chart

import (
	"math"
	"strconv"
	"testing"
)

// BenchmarkLine1000 draws one curve of 1,000 points with a limit and a
// mark: the figure a sweep of an input draws.
func BenchmarkLine1000(b *testing.B) {
	x := make([]float64, 1000)
	y := make([]float64, 1000)
	for i := range x {
		x[i] = float64(i) * 0.05
		y[i] = 1.9 * math.Tanh(x[i]/18)
	}
	spec := LineSpec{
		X: Axis{"I_f", "A"}, Y: Axis{"B_g", "T"},
		Curves:  []Curve{{Name: "B_g", X: x, Y: y}},
		YLimits: []Limit{{Value: 1.5, Label: "B_knee 1.50 T"}},
		Marks:   []Mark{{X: 24, Y: 1.9 * math.Tanh(24.0/18), Label: "rated load"}},
	}
	var n int
	for b.Loop() {
		out, err := Line(spec)
		if err != nil {
			b.Fatal(err)
		}
		n = len(out)
	}
	b.ReportMetric(float64(n), "bytes/svg")
}

func parse(s string) (float64, error) { return strconv.ParseFloat(s, 64) }
