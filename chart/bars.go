package chart

import (
	"math"
	"strconv"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// BarSpec is a harmonic spectrum: one bar for each harmonic order k.
type BarSpec struct {
	Title  string // the figure's accessible name
	Y      Axis   // what the bars measure: an amplitude, or a share of the fundamental
	Orders []int  // the harmonic orders, 1 for the fundamental
	Values []float64
	// Labels writes each bar's value above it, for bars of at least
	// LabelFrom (in Y's unit); the fundamental's bar is then labelled too.
	Labels    bool
	LabelFrom float64
	// Digits is the significant figures of the bar labels; 0 takes 3.
	Digits        int
	Width, Height float64
}

// Bars draws a harmonic spectrum as SVG.
func Bars(spec BarSpec) ([]byte, error) {
	f, err := barFigure(spec)
	if err != nil {
		return nil, err
	}
	return svgOf(f, spec.Title)
}

func barFigure(spec BarSpec) (figure, error) {
	w, h, err := size(spec.Width, spec.Height)
	if err != nil {
		return figure{}, err
	}
	if err := spec.validate(); err != nil {
		return figure{}, err
	}
	p := newPlot("harmonic order k", spec.Y.Label())
	p.Add(grid())
	bars, err := plotter.NewBarChart(plotter.Values(spec.Values), barWidth(w, len(spec.Values)))
	if err != nil {
		return figure{}, specError("%v", err)
	}
	bars.Color = accent
	bars.LineStyle.Color = ink
	bars.LineStyle.Width = vg.Points(0.4)
	p.Add(bars)
	names := make([]string, len(spec.Orders))
	for i, k := range spec.Orders {
		names[i] = strconv.Itoa(k)
	}
	p.NominalX(names...)
	p.X.Min, p.X.Max = -0.5, float64(len(names))-0.5 // whole bars at both ends
	p.Y.Min = 0
	if spec.Labels {
		p.Add(barLabels(spec))
	}
	return figure{w, h, p.Draw}, nil
}

func (spec BarSpec) validate() error {
	switch {
	case len(spec.Values) == 0:
		return specError("give at least one harmonic")
	case len(spec.Orders) != len(spec.Values):
		return specError("%d orders and %d values; give one value for each order", len(spec.Orders), len(spec.Values))
	case len(spec.Values) > 1000:
		return specError("%d harmonics; one spectrum shows at most 1000", len(spec.Values))
	case firstNotFinite(spec.Values) >= 0:
		return specError("the value of harmonic %d is not a finite number within ±1e300", spec.Orders[firstNotFinite(spec.Values)])
	case !finite(spec.LabelFrom):
		return specError("the smallest labelled bar is not a finite number within ±1e300")
	}
	for i, k := range spec.Orders {
		if k < 1 || i > 0 && k <= spec.Orders[i-1] {
			return specError("harmonic orders run from 1 upwards, each above the one before; %d is out of order", k)
		}
		if spec.Values[i] < 0 {
			return specError("the value of harmonic %d is negative; an amplitude is at least 0", k)
		}
	}
	return nil
}

// barWidth leaves a gap of a third of a bar between bars.
func barWidth(w vg.Length, n int) vg.Length {
	return vg.Length(float64(w) * 0.8 / float64(n) * 0.7)
}

func barLabels(spec BarSpec) *plotter.Labels {
	digits := spec.Digits
	if digits <= 0 {
		digits = 3
	}
	var pts plotter.XYs
	var labels []string
	for i, v := range spec.Values {
		if v < spec.LabelFrom && i > 0 {
			continue
		}
		pts = append(pts, plotter.XY{X: float64(i), Y: v})
		labels = append(labels, sigText(v, digits))
	}
	lb, _ := plotter.NewLabels(plotter.XYLabels{XYs: pts, Labels: labels})
	sty := textStyle(7, ink)
	sty.XAlign, sty.YAlign = text.XCenter, text.YBottom
	for i := range lb.TextStyle {
		lb.TextStyle[i] = sty
	}
	lb.Offset.Y = vg.Points(1.5)
	return lb
}

// sigText writes v to d significant figures without an exponent: 100,
// not 1e+02.
func sigText(v float64, d int) string {
	if v == 0 {
		return "0"
	}
	p := math.Pow(10, float64(d-1)-math.Floor(math.Log10(math.Abs(v))))
	return strconv.FormatFloat(math.Round(v*p)/p, 'f', -1, 64)
}
