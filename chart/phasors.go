package chart

import (
	"image/color"
	"math"
	"math/cmplx"
	"strconv"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Arrow is one phasor of a diagram, in display units: Value drawn from
// Tail, the origin for a phasor drawn on its own, another's tip for one
// drawn tip to tail.
type Arrow struct {
	Label string // written at the tip, "V 6.35 kV ∠0°"
	Tail  complex128
	Value complex128
	// Result marks the phasor that the others sum to: drawn heavier.
	Result bool
}

// PhasorSpec is a phasor diagram: arrows in one unit, at one scale on
// both axes, with a scale bar in that unit.
type PhasorSpec struct {
	Title         string // the figure's accessible name
	Unit          string // the unit of every arrow, "kV"
	Arrows        []Arrow
	Width, Height float64
}

// Phasors draws a phasor diagram as SVG: the real axis across, the
// imaginary axis up, equal scales, a label at each tip.
func Phasors(spec PhasorSpec) ([]byte, error) {
	f, err := phasorFigure(spec)
	if err != nil {
		return nil, err
	}
	return svgOf(f, spec.Title)
}

func phasorFigure(spec PhasorSpec) (figure, error) {
	w, h, err := size(spec.Width, spec.Height)
	if err != nil {
		return figure{}, err
	}
	if err := spec.validate(); err != nil {
		return figure{}, err
	}
	return figure{w, h, func(c draw.Canvas) { paintPhasors(c, spec) }}, nil
}

// paintPhasors draws the diagram: a box that holds the origin and every
// tip, at one scale both ways, with room for the labels at the tips.
func paintPhasors(c draw.Canvas, spec PhasorSpec) {
	w, h := c.Max.X-c.Min.X, c.Max.Y-c.Min.Y
	c.SetColor(paper)
	c.Fill(c.Rectangle.Path())
	lo, hi := spec.extent()
	margin := vg.Points(34)
	scale := math.Min(float64(w-2*margin)/(real(hi)-real(lo)), float64(h-2*margin)/(imag(hi)-imag(lo)))
	mid := (lo + hi) / 2
	at := func(z complex128) vg.Point {
		return vg.Point{X: w/2 + vg.Length(scale*real(z-mid)), Y: h/2 + vg.Length(scale*imag(z-mid))}
	}
	drawAxes(&c, at(0), w, h)
	var tips []vg.Point
	for i, a := range spec.Arrows {
		col := curveColours[i%len(curveColours)]
		tail, tip := at(a.Tail), at(a.Tail+a.Value)
		drawArrow(&c, tail, tip, col, a.Result)
		if near(tip, tips) {
			// A tip another label holds already (the sum closing a
			// chain): the label goes beside the middle of the shaft.
			drawTipLabel(&c, vg.Point{X: (tail.X + tip.X) / 2, Y: (tail.Y + tip.Y) / 2}, a.Value*1i, a.Label, col, vg.Points(6))
		} else {
			drawTipLabel(&c, tip, a.Value, a.Label, col, vg.Points(4))
		}
		tips = append(tips, tip)
	}
	drawScaleBar(&c, (real(hi)-real(lo))/4, scale, spec.Unit)
}

func (spec PhasorSpec) validate() error {
	if len(spec.Arrows) == 0 {
		return specError("give at least one phasor")
	}
	if len(spec.Arrows) > 100 {
		return specError("%d phasors; one diagram shows at most 100", len(spec.Arrows))
	}
	big := 0.0
	for i, a := range spec.Arrows {
		for _, v := range []float64{real(a.Tail), imag(a.Tail), real(a.Value), imag(a.Value)} {
			if !finite(v) {
				return specError("phasor %d (%s) is not a finite number", i+1, a.Label)
			}
		}
		big = math.Max(big, cmplx.Abs(a.Value))
	}
	if big == 0 {
		return specError("every phasor is zero; there is nothing to draw")
	}
	return nil
}

// extent is the box that holds the origin, every tail and every tip,
// made square so that the scale is the same both ways.
func (spec PhasorSpec) extent() (lo, hi complex128) {
	x0, x1, y0, y1 := 0.0, 0.0, 0.0, 0.0
	for _, a := range spec.Arrows {
		for _, z := range []complex128{a.Tail, a.Tail + a.Value} {
			x0, x1 = math.Min(x0, real(z)), math.Max(x1, real(z))
			y0, y1 = math.Min(y0, imag(z)), math.Max(y1, imag(z))
		}
	}
	// A diagram all along one axis still needs some height.
	span := math.Max(x1-x0, y1-y0)
	if x1-x0 < span/4 {
		x0, x1 = x0-span/8, x1+span/8
	}
	if y1-y0 < span/4 {
		y0, y1 = y0-span/8, y1+span/8
	}
	return complex(x0, y0), complex(x1, y1)
}

func drawAxes(c *draw.Canvas, o vg.Point, w, h vg.Length) {
	sty := draw.LineStyle{Color: rule, Width: vg.Points(0.6)}
	c.StrokeLine2(sty, vg.Points(6), o.Y, w-vg.Points(6), o.Y)
	c.StrokeLine2(sty, o.X, vg.Points(6), o.X, h-vg.Points(6))
	ts := textStyle(7, muted)
	ts.XAlign, ts.YAlign = text.XRight, text.YBottom
	c.FillText(ts, vg.Point{X: w - vg.Points(6), Y: o.Y + vg.Points(2)}, "Re")
	ts.XAlign, ts.YAlign = text.XLeft, text.YTop
	c.FillText(ts, vg.Point{X: o.X + vg.Points(3), Y: h - vg.Points(6)}, "Im")
}

// drawArrow draws a shaft from a to b and a filled head at b.
func drawArrow(c *draw.Canvas, a, b vg.Point, col color.Color, heavy bool) {
	width := vg.Points(1.1)
	if heavy {
		width = vg.Points(1.8)
	}
	d := b.Sub(a)
	n := math.Hypot(float64(d.X), float64(d.Y))
	if n < 1e-9 {
		return
	}
	ux, uy := float64(d.X)/n, float64(d.Y)/n
	head := math.Min(7, n/2)
	base := vg.Point{X: b.X - vg.Length(head*ux), Y: b.Y - vg.Length(head*uy)}
	c.StrokeLines(draw.LineStyle{Color: col, Width: width}, []vg.Point{a, base})
	side := vg.Point{X: vg.Length(-uy * head * 0.38), Y: vg.Length(ux * head * 0.38)}
	c.FillPolygon(col, []vg.Point{b, base.Add(side), base.Sub(side)})
}

// drawTipLabel writes the label just beyond the tip, on the side the
// phasor points to, so it clears its own arrow.
func drawTipLabel(c *draw.Canvas, tip vg.Point, v complex128, label string, col color.Color, gap vg.Length) {
	if label == "" {
		return
	}
	ts := textStyle(8, col)
	ang := cmplx.Phase(v)
	ux, uy := math.Cos(ang), math.Sin(ang)
	switch {
	case ux > 0.3:
		ts.XAlign = text.XLeft
	case ux < -0.3:
		ts.XAlign = text.XRight
	default:
		ts.XAlign = text.XCenter
	}
	switch {
	case uy > 0.3:
		ts.YAlign = text.YBottom
	case uy < -0.3:
		ts.YAlign = text.YTop
	default:
		ts.YAlign = text.YCenter
	}
	c.FillText(ts, vg.Point{X: tip.X + gap*vg.Length(ux), Y: tip.Y + gap*vg.Length(uy)}, label)
}

// drawScaleBar draws a bar of a round length near span at the foot of
// the diagram: equal scales need one, since there are no tick marks.
func drawScaleBar(c *draw.Canvas, span, scale float64, unit string) {
	step := roundDown(span)
	l := vg.Length(step * scale)
	x0, y := c.Min.X+vg.Points(8), c.Min.Y+vg.Points(8)
	sty := draw.LineStyle{Color: ink, Width: vg.Points(0.8)}
	c.StrokeLine2(sty, x0, y, x0+l, y)
	c.StrokeLine2(sty, x0, y-vg.Points(2), x0, y+vg.Points(2))
	c.StrokeLine2(sty, x0+l, y-vg.Points(2), x0+l, y+vg.Points(2))
	ts := textStyle(7, ink)
	ts.XAlign, ts.YAlign = text.XCenter, text.YBottom
	lab := strconv.FormatFloat(step, 'g', 3, 64)
	if unit != "" && unit != "1" {
		lab += " " + unit
	}
	c.FillText(ts, vg.Point{X: x0 + l/2, Y: y + vg.Points(2.5)}, lab)
}

// near reports whether p lies within a label's height of any of pts.
func near(p vg.Point, pts []vg.Point) bool {
	for _, q := range pts {
		if math.Hypot(float64(p.X-q.X), float64(p.Y-q.Y)) < 10 {
			return true
		}
	}
	return false
}

// roundDown is the largest 1, 2 or 5 times a power of ten not above v.
func roundDown(v float64) float64 {
	p := math.Pow(10, math.Floor(math.Log10(v)))
	for _, m := range []float64{5, 2, 1} {
		if m*p <= v {
			return m * p
		}
	}
	return p
}
