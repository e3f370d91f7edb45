// Package chart draws a calculation's values as small, deterministic SVG
// figures: curves y(x) with the limits a check sets and the points that
// matter marked, a harmonic spectrum, and a phasor diagram.
//
// Values come in display units, already converted; an axis names its
// quantity and unit as ISO 80000-1 writes a column head, "I_f / A". The
// figures use the page's own palette (ink on warm paper, vermilion for a
// limit, ochre for a marked point) and embed no fonts: text names a
// system font whose metrics match the ones the layout was measured with.
// The same spec gives the same bytes: there are no timestamps, ids or
// random numbers in the output.
package chart

import (
	"bytes"
	"errors"
	"fmt"
	"html"
	"image/color"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Default size of a figure, in points: it fits the text column of a
// printed A4 page and scales down with the page on a narrow screen.
const (
	DefaultWidth  = 324
	DefaultHeight = 190
)

// MaxPoints is the most values a figure takes in all, so that no input
// makes a page without bound.
const MaxPoints = 100_000

// The render package's palette (render/style.go): ink on warm paper,
// blue-black and vermilion for holds and not met, ochre for assumptions.
var (
	paper  = rgb(0xff, 0xfd, 0xf8)
	ink    = rgb(0x1b, 0x1d, 0x2a)
	muted  = rgb(0x5e, 0x5a, 0x52)
	rule   = rgb(0xcf, 0xc7, 0xb6)
	band   = rgb(0xf4, 0xef, 0xe3)
	accent = rgb(0x32, 0x40, 0x8f)
	short  = rgb(0xb3, 0x26, 0x1e)
	ochre  = rgb(0x7a, 0x52, 0x00)
)

// curveColours and curveDashes tell curves apart, in colour on screen and
// by their dashes on a black-and-white print.
var (
	curveColours = []color.Color{ink, accent, ochre, muted}
	curveDashes  = [][]vg.Length{nil, {vg.Points(5), vg.Points(2.5)}, {vg.Points(1.5), vg.Points(1.5)}, {vg.Points(6), vg.Points(2), vg.Points(1.5), vg.Points(2)}}
)

func rgb(r, g, b uint8) color.Color { return color.RGBA{R: r, G: g, B: b, A: 0xff} }

// Axis names one axis: the quantity's symbol and its unit.
type Axis struct {
	Quantity string // the symbol as the page shows it, "I_f"
	Unit     string // the unit symbol, "A"; "" or "1" for a pure number
}

// Label is the axis label, quantity / unit; a compound unit goes in
// parentheses, "v / (m/s)", so the division reads once.
func (a Axis) Label() string {
	u := strings.TrimSpace(a.Unit)
	if u == "" || u == "1" {
		return a.Quantity
	}
	if strings.ContainsAny(u, "/· *") {
		u = "(" + u + ")"
	}
	if a.Quantity == "" {
		return u
	}
	return a.Quantity + " / " + u
}

// ErrSpec wraps every problem with a spec (errors.Is), so callers can
// tell a bad input from a failure to draw.
var ErrSpec = errors.New("chart")

func specError(format string, args ...any) error {
	return fmt.Errorf("%w: %s", ErrSpec, fmt.Sprintf(format, args...))
}

// MaxMagnitude is the largest value a figure draws: spans of values
// beyond it overflow float64, and the axes with them.
const MaxMagnitude = 1e300

// firstNotFinite reports the first value that is NaN, infinite or beyond
// MaxMagnitude, or -1.
func firstNotFinite(vs []float64) int {
	for i, v := range vs {
		if !finite(v) {
			return i
		}
	}
	return -1
}

// finite reports whether v is a number a figure can draw.
func finite(v float64) bool { return !math.IsNaN(v) && math.Abs(v) <= MaxMagnitude }

// size returns the figure's size in points, the defaults for zeros.
func size(w, h float64) (vg.Length, vg.Length, error) {
	if w == 0 {
		w = DefaultWidth
	}
	if h == 0 {
		h = DefaultHeight
	}
	if !finite(w) || !finite(h) || w < 72 || h < 72 || w > 2000 || h > 2000 {
		return 0, 0, specError("a figure is 72 pt to 2000 pt on each side, not %g pt by %g pt", w, h)
	}
	return vg.Points(w), vg.Points(h), nil
}

// sans is the face of every text of a figure.
func sans(size float64) font.Font {
	return font.Font{Typeface: "Liberation", Variant: "Sans", Size: vg.Points(size)}
}

func textStyle(size float64, c color.Color) text.Style {
	return text.Style{Color: c, Font: sans(size), Handler: plot.DefaultTextHandler}
}

// newPlot is a plot in the page's look: paper ground, ink axes, sans text.
func newPlot(x, y string) *plot.Plot {
	p := plot.New()
	p.BackgroundColor = paper
	for _, ax := range []*plot.Axis{&p.X, &p.Y} {
		ax.Label.TextStyle = textStyle(9, ink)
		ax.Tick.Label.Font = sans(8) // keeps gonum's alignment of tick labels
		ax.Tick.Label.Color = ink
		ax.Color = ink
		ax.Tick.Color = ink
		ax.LineStyle.Width = vg.Points(0.6)
		ax.Tick.LineStyle.Width = vg.Points(0.6)
	}
	p.X.Label.Text, p.Y.Label.Text = x, y
	p.Legend.TextStyle = textStyle(8, ink)
	p.Legend.Top = true
	p.Legend.ThumbnailWidth = vg.Points(18)
	return p
}

// grid is a faint grid at the major ticks, in the page's band colour.
func grid() *gridLines {
	return &gridLines{sty: draw.LineStyle{Color: band, Width: vg.Points(0.5)}}
}

// figure is a drawing of a given size, ready to paint on any canvas.
type figure struct {
	w, h  vg.Length
	paint func(draw.Canvas)
}

// svgOf paints the figure on an SVG canvas and returns the element.
func svgOf(f figure, title string) ([]byte, error) {
	c := vgsvg.NewWith(vgsvg.UseWH(f.w, f.h))
	f.paint(draw.New(c))
	return finish(c, title)
}

// finish writes the canvas as an element to put inline in a page: no XML
// prelude or generator comment, a class and an accessible name, and a
// font list that falls back to the metric-compatible system fonts.
func finish(c *vgsvg.Canvas, title string) ([]byte, error) {
	var b bytes.Buffer
	if _, err := c.WriteTo(&b); err != nil {
		return nil, fmt.Errorf("chart: %w", err)
	}
	s := b.String()
	if i := strings.Index(s, "<svg"); i >= 0 {
		s = s[i:]
	}
	t := html.EscapeString(title)
	s = strings.Replace(s, "<svg ", `<svg class="plot" role="img" aria-label="`+t+`" `, 1)
	if i := strings.Index(s, ">\n"); i >= 0 {
		s = s[:i+2] + "<title>" + t + "</title>\n" + s[i+2:]
	}
	s = strings.ReplaceAll(s, "font-family:Liberation Sans;", "font-family:Liberation Sans,Arial,Helvetica,sans-serif;")
	s = strings.ReplaceAll(s, ";font-variant:normal;font-weight:normal;font-style:normal", "") // the defaults
	return []byte(s), nil
}
