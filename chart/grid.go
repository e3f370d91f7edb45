package chart

import (
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// gridLines draws faint lines at the major ticks of both axes, under the
// data; gonum's own grid draws the minor ticks too, which crowds a small
// figure.
type gridLines struct{ sty draw.LineStyle }

// Plot implements plot.Plotter.
func (g *gridLines) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	for _, t := range p.X.Tick.Marker.Ticks(p.X.Min, p.X.Max) {
		if t.IsMinor() {
			continue
		}
		x := trX(t.Value)
		c.StrokeLines(g.sty, []vg.Point{{X: x, Y: c.Min.Y}, {X: x, Y: c.Max.Y}})
	}
	for _, t := range p.Y.Tick.Marker.Ticks(p.Y.Min, p.Y.Max) {
		if t.IsMinor() {
			continue
		}
		y := trY(t.Value)
		c.StrokeLines(g.sty, []vg.Point{{X: c.Min.X, Y: y}, {X: c.Max.X, Y: y}})
	}
}
