package chart

import (
	"math"
	"slices"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Curve is one named curve y(x), in display units.
type Curve struct {
	Name string // shown in the legend when a figure has several curves
	X, Y []float64
}

// Limit is a check's limit drawn across the figure: at y = Value for a
// limit on the y quantity, at x = Value for one on x. Label says what it
// is, "B_knee 1.50 T".
type Limit struct {
	Value float64
	Label string
}

// Mark is a point that matters, drawn and labelled: an operating point,
// the worst point of a sweep.
type Mark struct {
	X, Y  float64
	Label string
}

// LineSpec is a figure of curves y(x), with the limits of checks and the
// points that matter.
type LineSpec struct {
	Title  string // the figure's accessible name
	X, Y   Axis
	Curves []Curve
	// YLimits are horizontal lines, limits on the y quantity; XLimits are
	// vertical lines, limits on x.
	YLimits, XLimits []Limit
	Marks            []Mark
	// Width and Height are the figure's size in points; zero takes the
	// defaults.
	Width, Height float64
}

// Line draws curves y(x) with their limits and marks, as SVG.
func Line(spec LineSpec) ([]byte, error) {
	f, err := lineFigure(spec)
	if err != nil {
		return nil, err
	}
	return svgOf(f, spec.Title)
}

func lineFigure(spec LineSpec) (figure, error) {
	w, h, err := size(spec.Width, spec.Height)
	if err != nil {
		return figure{}, err
	}
	if err := spec.validate(); err != nil {
		return figure{}, err
	}
	p := newPlot(spec.X.Label(), spec.Y.Label())
	p.Add(grid())
	x0, x1, y0, y1 := spec.extent()
	for i, cv := range spec.Curves {
		l, err := plotter.NewLine(thin(xys(cv.X, cv.Y)))
		if err != nil {
			return figure{}, specError("curve %d: %v", i+1, err)
		}
		l.Color = curveColours[i%len(curveColours)]
		l.Dashes = curveDashes[i%len(curveDashes)]
		l.Width = vg.Points(1.2)
		p.Add(l)
		if len(spec.Curves) > 1 {
			p.Legend.Add(cv.Name, l)
		}
	}
	for _, lim := range spec.YLimits {
		addLimit(p, [2]float64{x0, lim.Value}, [2]float64{x1, lim.Value}, lim.Label)
	}
	for _, lim := range spec.XLimits {
		addLimit(p, [2]float64{lim.Value, y0}, [2]float64{lim.Value, y1}, lim.Label)
	}
	if err := addMarks(p, spec.Marks); err != nil {
		return figure{}, err
	}
	if y1 > y0 {
		p.Y.Max = y1 + 0.08*(y1-y0) // headroom for the labels above the top curve
	}
	return figure{w, h, p.Draw}, nil
}

func (spec LineSpec) validate() error {
	if len(spec.Curves) == 0 {
		return specError("give at least one curve")
	}
	n := 0
	for i, cv := range spec.Curves {
		switch {
		case len(cv.X) != len(cv.Y):
			return specError("curve %d has %d x values and %d y values; give one y for each x", i+1, len(cv.X), len(cv.Y))
		case len(cv.X) < 2:
			return specError("curve %d has %d points; a curve needs at least 2", i+1, len(cv.X))
		case firstNotFinite(cv.X) >= 0:
			return specError("curve %d: x value %d is not a finite number within ±1e300", i+1, firstNotFinite(cv.X)+1)
		case firstNotFinite(cv.Y) >= 0:
			return specError("curve %d: y value %d is not a finite number within ±1e300", i+1, firstNotFinite(cv.Y)+1)
		}
		n += len(cv.X)
	}
	if n += len(spec.YLimits) + len(spec.XLimits) + len(spec.Marks); n > MaxPoints {
		return specError("the figure has %d values, more than the %d one figure takes", n, MaxPoints)
	}
	for _, l := range append(append([]Limit(nil), spec.YLimits...), spec.XLimits...) {
		if !finite(l.Value) {
			return specError("limit %q is not a finite number within ±1e300", l.Label)
		}
	}
	for _, m := range spec.Marks {
		if !finite(m.X) || !finite(m.Y) {
			return specError("mark %q is not at a finite point within ±1e300", m.Label)
		}
	}
	return nil
}

// extent is the span of the curves, the limits and the marks, so that a
// limit line crosses the whole figure.
func (spec LineSpec) extent() (x0, x1, y0, y1 float64) {
	x0, y0 = math.Inf(1), math.Inf(1)
	x1, y1 = math.Inf(-1), math.Inf(-1)
	grow := func(x, y float64) {
		x0, x1 = math.Min(x0, x), math.Max(x1, x)
		y0, y1 = math.Min(y0, y), math.Max(y1, y)
	}
	for _, cv := range spec.Curves {
		for i := range cv.X {
			grow(cv.X[i], cv.Y[i])
		}
	}
	for _, m := range spec.Marks {
		grow(m.X, m.Y)
	}
	for _, l := range spec.YLimits {
		y0, y1 = math.Min(y0, l.Value), math.Max(y1, l.Value)
	}
	for _, l := range spec.XLimits {
		x0, x1 = math.Min(x0, l.Value), math.Max(x1, l.Value)
	}
	return x0, x1, y0, y1
}

// thinFrom is the most points a curve is drawn with as given; a longer
// one keeps, in each of thinBuckets runs of points, the first, the lowest,
// the highest and the last, so that its peaks stay where they are and the
// figure stays small.
const (
	thinFrom    = 1500
	thinBuckets = 400
)

func thin(pts plotter.XYs) plotter.XYs {
	if len(pts) <= thinFrom {
		return pts
	}
	out := make(plotter.XYs, 0, 4*thinBuckets)
	for b := range thinBuckets {
		lo, hi := b*len(pts)/thinBuckets, (b+1)*len(pts)/thinBuckets
		keep := []int{lo, hi - 1}
		mn, mx := lo, lo
		for i := lo; i < hi; i++ {
			if pts[i].Y < pts[mn].Y {
				mn = i
			}
			if pts[i].Y > pts[mx].Y {
				mx = i
			}
		}
		keep = append(keep, min(mn, mx), max(mn, mx))
		slices.Sort(keep)
		for i, k := range keep {
			if i == 0 || k != keep[i-1] {
				out = append(out, pts[k])
			}
		}
	}
	return out
}

func xys(x, y []float64) plotter.XYs {
	out := make(plotter.XYs, len(x))
	for i := range x {
		out[i] = plotter.XY{X: x[i], Y: y[i]}
	}
	return out
}

// addLimit draws a limit as a dashed vermilion line from a to b, its
// label inside the figure: at the right end of a horizontal one, at the
// foot of a vertical one, on the left of the line.
func addLimit(p *plot.Plot, a, b [2]float64, label string) {
	l, _ := plotter.NewLine(plotter.XYs{{X: a[0], Y: a[1]}, {X: b[0], Y: b[1]}})
	l.Color = short
	l.Width = vg.Points(1)
	l.Dashes = []vg.Length{vg.Points(4), vg.Points(2)}
	p.Add(l)
	if label == "" {
		return
	}
	at := b
	if a[0] == b[0] {
		at = a // a vertical limit: its label at the foot, clear of the curves' ends
	}
	lb, _ := plotter.NewLabels(plotter.XYLabels{XYs: plotter.XYs{{X: at[0], Y: at[1]}}, Labels: []string{label}})
	sty := textStyle(8, short)
	sty.XAlign, sty.YAlign = text.XRight, text.YBottom
	lb.TextStyle = []text.Style{sty}
	lb.Offset = vg.Point{X: -vg.Points(2), Y: vg.Points(1.5)}
	p.Add(lb)
}

// addMarks draws the marked points as ochre rings with their labels.
func addMarks(p *plot.Plot, marks []Mark) error {
	if len(marks) == 0 {
		return nil
	}
	pts := make(plotter.XYs, len(marks))
	labels := make([]string, len(marks))
	for i, m := range marks {
		pts[i], labels[i] = plotter.XY{X: m.X, Y: m.Y}, m.Label
	}
	sc, err := plotter.NewScatter(pts)
	if err != nil {
		return specError("marks: %v", err)
	}
	sc.GlyphStyle = draw.GlyphStyle{Color: ochre, Radius: vg.Points(3), Shape: draw.CircleGlyph{}}
	p.Add(sc)
	lb, err := plotter.NewLabels(plotter.XYLabels{XYs: pts, Labels: labels})
	if err != nil {
		return specError("marks: %v", err)
	}
	sty := textStyle(8, ochre)
	sty.YAlign = text.YBottom
	for i := range lb.TextStyle {
		lb.TextStyle[i] = sty
	}
	lb.Offset = vg.Point{X: vg.Points(4), Y: vg.Points(3)}
	p.Add(lb)
	return nil
}
