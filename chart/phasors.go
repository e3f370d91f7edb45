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

// paintPhasors draws the diagram: the origin, every tip and every label
// inside the figure, at one scale both ways.
func paintPhasors(c draw.Canvas, spec PhasorSpec) {
	w, h := c.Max.X-c.Min.X, c.Max.Y-c.Min.Y
	c.SetColor(paper)
	c.Fill(c.Rectangle.Path())
	labels := placeLabels(spec)
	lo, hi := spec.extent()
	scale := fitScale(labels, lo, hi, float64(w)-16, float64(h)-28)
	// Centre what is drawn, labels included.
	x0, x1, y0, y1 := bounds(labels, lo, hi, scale)
	dx, dy := (float64(w)-(x1-x0))/2-x0, (float64(h)-(y1-y0))/2-y0+6
	at := func(z complex128) vg.Point {
		return vg.Point{X: vg.Length(scale*real(z) + dx), Y: vg.Length(scale*imag(z) + dy)}
	}
	drawAxes(&c, at(0), w, h)
	for i, a := range spec.Arrows {
		col := curveColours[i%len(curveColours)]
		drawArrow(&c, at(a.Tail), at(a.Tail+a.Value), col, a.Result)
		if l := labels[i]; l.text != "" {
			l.sty.Color = col
			p := at(l.anchor)
			c.FillText(l.sty, vg.Point{X: p.X + vg.Length(l.off[0]), Y: p.Y + vg.Length(l.off[1])}, l.text)
		}
	}
	drawScaleBar(&c, (real(hi)-real(lo))/4, scale, spec.Unit)
}

// label is a tip's label: anchored at a point of the diagram, offset in
// points, its box in points about the anchor.
type label struct {
	text   string
	sty    text.Style
	anchor complex128
	off    [2]float64
	box    [4]float64 // left, right, bottom, top, relative to the anchor
}

// placeLabels puts each label beyond its tip, on the side the phasor
// points to; a tip that an earlier label holds already (the sum closing
// a chain) has its label beside the middle of its shaft instead.
func placeLabels(spec PhasorSpec) []label {
	lo, hi := spec.extent()
	close := 0.03 * cmplx.Abs(hi-lo)
	out := make([]label, len(spec.Arrows))
	for i, a := range spec.Arrows {
		tip, dir, gap := a.Tail+a.Value, a.Value, 4.0
		for _, b := range spec.Arrows[:i] {
			if cmplx.Abs(b.Tail+b.Value-tip) < close {
				tip, dir, gap = a.Tail+a.Value/2, a.Value*1i, 6
				break
			}
		}
		out[i] = newLabel(a.Label, tip, dir, gap)
	}
	return out
}

func newLabel(txt string, anchor, dir complex128, gap float64) label {
	l := label{text: txt, sty: textStyle(8, ink), anchor: anchor}
	if txt == "" {
		return l
	}
	ang := cmplx.Phase(dir)
	ux, uy := math.Cos(ang), math.Sin(ang)
	tw, th := float64(l.sty.Width(txt)), float64(l.sty.Height(txt))
	l.off = [2]float64{gap * ux, gap * uy}
	var left, bottom float64
	switch {
	case ux > 0.3:
		l.sty.XAlign, left = text.XLeft, 0
	case ux < -0.3:
		l.sty.XAlign, left = text.XRight, -tw
	default:
		l.sty.XAlign, left = text.XCenter, -tw/2
	}
	switch {
	case uy > 0.3:
		l.sty.YAlign, bottom = text.YBottom, 0
	case uy < -0.3:
		l.sty.YAlign, bottom = text.YTop, -th
	default:
		l.sty.YAlign, bottom = text.YCenter, -th/2
	}
	l.box = [4]float64{l.off[0] + left, l.off[0] + left + tw, l.off[1] + bottom, l.off[1] + bottom + th}
	return l
}

// bounds is the extent in points, at the given scale, of the box lo..hi
// and of every label.
func bounds(labels []label, lo, hi complex128, scale float64) (x0, x1, y0, y1 float64) {
	x0, x1 = scale*real(lo), scale*real(hi)
	y0, y1 = scale*imag(lo), scale*imag(hi)
	for _, l := range labels {
		if l.text == "" {
			continue
		}
		ax, ay := scale*real(l.anchor), scale*imag(l.anchor)
		x0, x1 = math.Min(x0, ax+l.box[0]), math.Max(x1, ax+l.box[1])
		y0, y1 = math.Min(y0, ay+l.box[2]), math.Max(y1, ay+l.box[3])
	}
	return x0, x1, y0, y1
}

// fitScale is the largest scale, in points per unit, at which the
// diagram and its labels fit w by h. The width needed grows with the
// scale (a maximum of lines in it), so halving the interval finds it.
func fitScale(labels []label, lo, hi complex128, w, h float64) float64 {
	fits := func(s float64) bool {
		x0, x1, y0, y1 := bounds(labels, lo, hi, s)
		return x1-x0 <= w && y1-y0 <= h
	}
	top := math.Min(w/(real(hi)-real(lo)), h/(imag(hi)-imag(lo)))
	bottom := top / 1e3
	if !fits(bottom) {
		return bottom // labels wider than the figure: draw small rather than not at all
	}
	for range 40 {
		mid := (bottom + top) / 2
		if fits(mid) {
			bottom = mid
		} else {
			top = mid
		}
	}
	return bottom
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
				return specError("phasor %d (%s) is not a finite number within ±1e300", i+1, a.Label)
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
