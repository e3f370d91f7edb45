package render

import (
	"html"
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/units"
)

// Lists as the pages show them: a short list inline, [1.20, 1.50, 1.90]
// mWb; a long one by its ends inline and in full in a compact table
// below the formula, ten values a row, all in one unit.

// listInline is the most elements a list shows inline.
const listInline = 8

// listRow is the number of values in a row of a long list's table, and
// listShown the most values the table shows: the first and the last
// halves, with the count of those left out between (the JSON has all).
const (
	listRow   = 10
	listShown = 200
)

// resultMathML writes a result's value: a number in its unit, or a list.
func resultMathML(res engine.Result, digits int) string {
	if res.List == nil {
		return valueMathML(res.Value, res.Shown, res.Digits(digits))
	}
	var b strings.Builder
	b.WriteString(`<mrow><mo fence="true">[</mo>`)
	for i, x := range listInlineValues(res.List) {
		if i > 0 {
			b.WriteString("<mo>,</mo>")
		}
		if x == nil {
			b.WriteString("<mo>…</mo>")
			continue
		}
		b.WriteString(numberMathML(units.FormatNumber(res.Shown.FromSI(*x), elementDigits(res, *x, digits))))
		if res.Phasors != nil {
			b.WriteString("<mo>∠</mo>" + numberMathML(elementAngle(res, x, digits)) + "<mo>°</mo>")
		}
	}
	b.WriteString(`<mo fence="true">]</mo>` + unitMathML(res.Shown.Symbol))
	switch {
	case res.Over != nil:
		b.WriteString(`<mspace width="0.4em"></mspace><mtext>` + html.EscapeString(seriesSpan(res, digits)) + "</mtext>")
	case len(res.List) > listInline:
		b.WriteString(`<mspace width="0.4em"></mspace><mtext>(` + strconv.Itoa(len(res.List)) + " values)</mtext>")
	}
	b.WriteString("</mrow>")
	return b.String()
}

// listInlineValues gives the elements shown inline; nil stands for the
// ones left out.
func listInlineValues(l []float64) []*float64 {
	var out []*float64
	if len(l) <= listInline {
		for i := range l {
			out = append(out, &l[i])
		}
		return out
	}
	return []*float64{&l[0], &l[1], &l[2], nil, &l[len(l)-1]}
}

// elementAngle is the angle in degrees of the element of a list of
// phasors whose magnitude x points to.
func elementAngle(res engine.Result, x *float64, digits int) string {
	return units.FormatNumber(phasorDegrees(res.Phasors[elementIndex(res.List, x)]), digits)
}

// elementIndex is the place in l of the element x points to.
func elementIndex(l []float64, x *float64) int {
	for i := range l {
		if &l[i] == x {
			return i
		}
	}
	return 0
}

// elementText is one element of a list as text, in the list's unit
// (which follows the list): a phasor as its magnitude ∠ its angle.
func elementText(res engine.Result, i, digits int) string {
	x := res.List[i]
	s := units.FormatNumber(res.Shown.FromSI(x), elementDigits(res, x, digits))
	if res.Phasors != nil {
		s += " ∠ " + units.FormatNumber(phasorDegrees(res.Phasors[i]), digits) + "°"
	}
	return s
}

// elementDigits is the significant figures of one element: a list of
// whole-number counts shows them without decimals, as a count does.
func elementDigits(res engine.Result, si float64, digits int) int {
	one := res
	one.Value, one.List = si, nil
	return one.Digits(digits)
}

// ListText is a list as the terminal shows it.
func ListText(res engine.Result, digits int) string {
	var parts []string
	for _, x := range listInlineValues(res.List) {
		if x == nil {
			parts = append(parts, "…")
			continue
		}
		parts = append(parts, elementText(res, elementIndex(res.List, x), digits))
	}
	s := "[" + strings.Join(parts, ", ") + "]"
	if u := res.Shown.Symbol; u != "" && u != "1" {
		if units.SpaceBefore(u) {
			s += " "
		}
		s += u
	}
	switch {
	case res.Over != nil:
		s += " " + seriesSpan(res, digits)
	case len(res.List) > listInline:
		s += " (" + strconv.Itoa(len(res.List)) + " values)"
	}
	return s
}

// seriesSpan is what a series adds to its y values: the span of its x in
// the unit x shows in, and the number of samples, "over 0 … 360 deg (73
// samples)". A series shows no table of values; the JSON has them all.
func seriesSpan(res engine.Result, digits int) string {
	u := res.OverShown
	end := func(si float64) string { return units.FormatNumber(u.FromSI(si), digits) }
	s := "over " + end(res.Over[0]) + " … " + end(res.Over[len(res.Over)-1])
	if sym := u.Symbol; sym != "" && sym != "1" {
		if units.SpaceBefore(sym) {
			s += " "
		}
		s += sym
	}
	return s + " (" + strconv.Itoa(len(res.Over)) + " samples)"
}

// resultText is a result's value as the terminal shows it.
func resultText(res engine.Result, digits int) string {
	if res.List != nil {
		return ListText(res, digits)
	}
	return ValueText(res.Value, res.Shown, res.Digits(digits))
}

// writeListTable writes a long list in full below its formula: a row
// heading gives the number of the row's first element, counted from 1.
func writeListTable(w sink, st *engine.Statement, res engine.Result, digits int) {
	if len(res.List) <= listInline || res.Over != nil {
		return
	}
	unit := res.Shown.Symbol
	caption := html.EscapeString(SymbolText(st.Name))
	if unit != "" && unit != "1" {
		caption += " in " + html.EscapeString(unit)
	}
	w.WriteString(`<table class="list-values"><caption>` + caption + "</caption>\n")
	l := res.List
	skipFrom, skipTo := len(l), len(l)
	if len(l) > listShown {
		// The first and last rows; whole rows, so the numbering stays plain.
		half := listShown / 2 / listRow * listRow
		skipFrom, skipTo = half, (len(l)-half)/listRow*listRow
	}
	for row := 0; row < len(l); row += listRow {
		if row == skipFrom {
			w.WriteString(`<tr><th>…</th><td colspan="` + strconv.Itoa(listRow) + `">` + strconv.Itoa(skipTo-skipFrom) + " values not shown</td></tr>\n")
			row = skipTo - listRow
			continue
		}
		w.WriteString("<tr><th>" + strconv.Itoa(row+1) + "</th>")
		for i := row; i < min(row+listRow, len(l)); i++ {
			w.WriteString("<td>" + html.EscapeString(elementText(res, i, digits)) + "</td>")
		}
		w.WriteString("</tr>\n")
	}
	w.WriteString("</table>\n")
}

// listMathML writes a list literal, a range or an index as formulas show
// them: [a, b, c]; from … to, by step; x[k].
func (w *mathWriter) list(e engine.Expr) bool {
	switch n := e.(type) {
	case *engine.ListLit:
		w.b.WriteString(`<mrow><mo fence="true">[</mo>`)
		for i, x := range n.Elems {
			if i > 0 {
				w.op(",")
			}
			w.expr(x, 0)
		}
		w.b.WriteString(`<mo fence="true">]</mo></mrow>`)
	case *engine.Range:
		w.b.WriteString("<mrow>")
		w.expr(n.From, 0)
		w.op("…")
		w.expr(n.To, 0)
		if n.Step != nil {
			w.b.WriteString(`<mspace width="0.4em"></mspace><mtext>by</mtext><mspace width="0.4em"></mspace>`)
			w.expr(n.Step, 0)
		}
		w.b.WriteString("</mrow>")
	case *engine.Index:
		w.b.WriteString("<mrow>")
		w.paren(n.X, w.prec(n.X) < 5)
		w.b.WriteString(`<mo fence="true">[</mo>`)
		w.expr(n.I, 0)
		w.b.WriteString(`<mo fence="true">]</mo></mrow>`)
	default:
		return false
	}
	return true
}
