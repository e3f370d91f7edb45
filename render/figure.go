package render

import (
	"html"
	"math/cmplx"
	"strconv"

	"github.com/sheaf-calc/sheaf/chart"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// Figures under a statement's result: every series gets a plot of its y
// against its x, in the units the result shows them in; a draw note adds
// a harmonic spectrum or a phasor diagram. The figures are inline SVG, so
// the page stays one file with no scripts. The checker has refused the
// draw notes it cannot honour; a figure the values of this run cannot
// give (a series that turns out not periodic) is a located note instead.

// spectrumOrders is the most harmonics a spectrum shows: enough for the
// belt and slot harmonics of a small machine, few enough to read.
const spectrumOrders = 25

// spectrumLabelFrom is the smallest share of the fundamental, in per
// cent, whose bar carries its value.
const spectrumLabelFrom = 0.5

func writeFigures(w sink, s *project.Sheet, st *engine.Statement, res engine.Result, digits int) {
	if res.Status != engine.OK {
		return
	}
	if res.Over != nil {
		f := seriesFigure(st, res)
		writeFigureOr(w, f.svg, SymbolText(st.Name)+" against "+SymbolText(axisName(st)), engine.Drawing{}, f.err)
	}
	for _, d := range s.Calc.Drawings(st) {
		switch d.Kind {
		case engine.DrawSpectrum:
			svg, caption, err := spectrumFigure(st, res, digits)
			writeFigureOr(w, svg, caption, d, err)
		case engine.DrawPhasors:
			svg, caption, err := phasorFigure(s.Calc, st, d, digits)
			writeFigureOr(w, svg, caption, d, err)
		}
	}
}

// figureResult is a drawn figure, or why it could not be drawn.
type figureResult struct {
	svg []byte
	err error
}

// writeFigureOr writes a figure with its caption, or in its place a note
// that says where it was asked for and why it is not drawn.
func writeFigureOr(w sink, svg []byte, caption string, d engine.Drawing, err error) {
	if err != nil {
		w.WriteString(`<p class="note fig-missing">`)
		if d.Pos.Line > 0 {
			w.WriteString(html.EscapeString(d.Pos.String()) + ": ")
		}
		w.WriteString("figure not drawn: " + html.EscapeString(err.Error()) + "</p>\n")
		return
	}
	w.WriteString(`<figure class="fig">`)
	w.Write(svg)
	w.WriteString("<figcaption>" + html.EscapeString(caption) + "</figcaption></figure>\n")
}

// axisName is the symbol of what a series is sampled over.
func axisName(st *engine.Statement) string {
	if n := engine.SeriesAxisName(st); n != "" {
		return n
	}
	return "x"
}

func seriesFigure(st *engine.Statement, res engine.Result) figureResult {
	xs := make([]float64, len(res.Over))
	ys := make([]float64, len(res.List))
	for i := range xs {
		xs[i] = res.OverShown.FromSI(res.Over[i])
	}
	for i := range ys {
		ys[i] = res.Shown.FromSI(res.List[i])
	}
	svg, err := chart.Line(chart.LineSpec{
		Title:  SymbolText(st.Name) + " against " + SymbolText(axisName(st)),
		X:      chart.Axis{Quantity: SymbolText(axisName(st)), Unit: res.OverShown.Symbol},
		Y:      chart.Axis{Quantity: SymbolText(st.Name), Unit: res.Shown.Symbol},
		Curves: []chart.Curve{{Name: SymbolText(st.Name), X: xs, Y: ys}},
	})
	return figureResult{svg, err}
}

// spectrumFigure draws the first harmonics as shares of the fundamental,
// the fundamental's amplitude in the caption.
func spectrumFigure(st *engine.Statement, res engine.Result, digits int) ([]byte, string, error) {
	amps, err := res.Harmonics(spectrumOrders)
	if err != nil {
		return nil, "", err
	}
	name := SymbolText(st.Name)
	spec := chart.BarSpec{Title: "Harmonics of " + name, Labels: true}
	for i, a := range amps {
		spec.Orders = append(spec.Orders, i+1)
		spec.Values = append(spec.Values, a)
	}
	caption := "Harmonics of " + name + " up to the " + ordinal(len(amps)) + ": "
	if amps[0] > 0 {
		for i := range spec.Values {
			spec.Values[i] *= 100 / amps[0]
		}
		spec.Y, spec.LabelFrom, spec.Digits = chart.Axis{Quantity: "A_k/A_1", Unit: "%"}, spectrumLabelFrom, 2
		caption += "amplitude A_k as a share of the fundamental's, A_1 = " + ValueText(amps[0], res.Shown, digits)
	} else {
		for i := range spec.Values {
			spec.Values[i] = res.Shown.FromSI(spec.Values[i])
		}
		spec.Y = chart.Axis{Quantity: "A_k", Unit: res.Shown.Symbol}
		caption += "amplitude A_k (the series has no fundamental)"
	}
	svg, err := chart.Bars(spec)
	return svg, caption, err
}

// phasorFigure draws the named phasors in the unit of the largest. When the
// last is the sum of the others (E = V + I·Z), the others go tip to tail
// from the origin and the last closes the polygon from the origin; else
// every phasor starts at the origin.
func phasorFigure(calc *engine.Calc, st *engine.Statement, d engine.Drawing, digits int) ([]byte, string, error) {
	var unit units.Unit
	var si []engine.Phasor
	var labels []string
	big := -1.0
	for _, name := range d.Names {
		r := calc.Result(calc.DrawnPhasor(st, name))
		if r.Status != engine.OK || r.Phasor == nil {
			return nil, "", errNotDrawn(name + " has no value in this run")
		}
		if r.Phasor.Abs() > big {
			unit, big = r.Shown, r.Phasor.Abs()
		}
		si = append(si, *r.Phasor)
		labels = append(labels, SymbolText(name)+" "+PhasorText(r, digits))
	}
	vals := make([]complex128, len(si))
	for i, p := range si {
		vals[i] = complex(p.Re/unit.Scale, p.Im/unit.Scale) // a phasor's unit has no offset
	}
	chain := closesChain(vals)
	spec := chart.PhasorSpec{Title: "Phasor diagram", Unit: unit.Symbol}
	var tail complex128
	for i, v := range vals {
		a := chart.Arrow{Label: labels[i], Value: v}
		switch {
		case chain && i == len(vals)-1:
			a.Result = true
		case chain:
			a.Tail, tail = tail, tail+v
		}
		spec.Arrows = append(spec.Arrows, a)
	}
	caption := "Phasors of " + joinSymbols(d.Names)
	if chain {
		caption += ", the last the sum of the others, drawn tip to tail"
	}
	svg, err := chart.Phasors(spec)
	return svg, caption, err
}

// closesChain reports whether the last of three or more phasors is the
// sum of the others, to a part in a million of the largest.
func closesChain(v []complex128) bool {
	if len(v) < 3 {
		return false
	}
	var sum complex128
	big := 0.0
	for _, z := range v {
		big = max(big, cmplx.Abs(z))
	}
	for _, z := range v[:len(v)-1] {
		sum += z
	}
	return cmplx.Abs(sum-v[len(v)-1]) <= 1e-6*big
}

func joinSymbols(names []string) string {
	out := ""
	for i, n := range names {
		switch {
		case i == 0:
		case i == len(names)-1:
			out += " and "
		default:
			out += ", "
		}
		out += SymbolText(n)
	}
	return out
}

// ordinal writes 7 as 7th, 1 as 1st, 22 as 22nd.
func ordinal(n int) string {
	suffix := "th"
	if n%100 < 11 || n%100 > 13 {
		switch n % 10 {
		case 1:
			suffix = "st"
		case 2:
			suffix = "nd"
		case 3:
			suffix = "rd"
		}
	}
	return strconv.Itoa(n) + suffix
}

type errNotDrawn string

func (e errNotDrawn) Error() string { return string(e) }
