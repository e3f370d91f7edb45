package render

import (
	"math"
	"slices"
	"strconv"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// maxSweepRows is the most points a sweep's table shows; a longer sweep
// shows evenly chosen points with its first, its last and each check's
// worst, and the JSON holds them all.
const maxSweepRows = 25

// sweepRun is the run of a sweep statement, or nil.
func sweepRun(s *project.Sheet, st *engine.Statement) *conditions.SweepRun {
	if s.Conditions == nil {
		return nil
	}
	for i := range s.Conditions.Sweeps {
		if s.Conditions.Sweeps[i].Stmt == st {
			return &s.Conditions.Sweeps[i]
		}
	}
	return nil
}

// writeSweep draws a sweep: a sentence saying what it varies, how far and
// in which case, each check's worst point, a plot of the results it
// gathers and a table of its points.
func writeSweep(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	sw := sweepRun(s, st)
	w.WriteString(`<div class="row cond sweep" id="` + anchor(st) + "\">\n<p class=\"condhead\">" + sweepSentence(s, st, digits) + "</p>\n")
	if sw != nil {
		for _, chk := range sw.Checks {
			writeSweepCheckNote(w, s, sw, chk, digits)
		}
		writeSweepPlot(w, s, sw, digits)
		writeSweepTable(w, s, sw, digits)
	}
	writeNote(w, s.Calc, st)
	w.WriteString("</div>\n")
}

// sweepSentence is "sweep su: U from 18 V to 30 V, 13 points, in case
// high; gathers I".
func sweepSentence(s *project.Sheet, st *engine.Statement, digits int) string {
	c := st.Cond
	u := s.Calc.Result(c.Input).Shown
	n := len(c.Points)
	out := "<span class=\"kw\">" + st.Cond.Word() + "</span> <strong>" + esc(st.Name) + "</strong>: " + `<a href="#` + anchor(c.Input) + `">` + symbolHTML(c.Input.Name) + "</a> "
	if monotonic(c.Points) {
		out += "from " + esc(ValueText(c.Points[0], u, digits)) + " to " + esc(ValueText(c.Points[n-1], u, digits)) + ", " + strconv.Itoa(n) + " points"
	} else {
		out += "between " + esc(ValueText(slices.Min(c.Points), u, digits)) + " and " + esc(ValueText(slices.Max(c.Points), u, digits)) + ", " + strconv.Itoa(n) + " points in the order written"
	}
	if c.In != nil {
		out += `, in <a href="#` + anchor(c.In) + `">case ` + esc(c.In.Name) + "</a>"
	}
	if len(c.Show) > 0 {
		out += "; gathers "
		for i, r := range c.Show {
			if i > 0 {
				out += ", "
			}
			out += `<a href="#` + anchor(r) + `">` + symbolHTML(r.Name) + "</a>"
		}
	}
	return out
}

// monotonic reports whether points rise, or fall, all the way.
func monotonic(x []float64) bool {
	up, down := true, true
	for i := 1; i < len(x); i++ {
		up, down = up && x[i] > x[i-1], down && x[i] < x[i-1]
	}
	return up || down
}

// writeSweepCheckNote says where a check resting on the swept input comes
// out worst, and at how many points it fails.
func writeSweepCheckNote(w sink, s *project.Sheet, sw *conditions.SweepRun, chk conditions.SweepCheck, digits int) {
	w.WriteString(`<p class="condnote"><a href="#` + anchor(chk.Stmt) + `">` + esc(checkAt(chk.Stmt)) + "</a>")
	if chk.Worst >= 0 {
		w.WriteString(": worst at " + symbolHTML(sw.Input.Name) + " = " + esc(ValueText(sw.X[chk.Worst], sw.XShown, digits)))
		if u := pointUtilisation(s, chk, chk.Worst); u != "" {
			w.WriteString(" (demand " + esc(u) + " of capacity)")
		}
	}
	switch {
	case chk.Fails > 0:
		w.WriteString("; <span class=\"short\">fails at " + strconv.Itoa(chk.Fails) + " of " + strconv.Itoa(len(sw.X)) + " points</span>")
	case chk.Errors == 0:
		w.WriteString("; holds at every point")
	}
	if chk.Errors > 0 {
		w.WriteString("; <span class=\"short\">cannot be worked out at " + Count(chk.Errors, "point") + "</span>")
	}
	w.WriteString("</p>\n")
}

// pointUtilisation is a check's demand over capacity at a sweep's point,
// in the check's own unit, or "" where it has none.
func pointUtilisation(s *project.Sheet, chk conditions.SweepCheck, i int) string {
	l, r := chk.Left[i], chk.Right[i]
	if math.IsNaN(l) || math.IsNaN(r) {
		return ""
	}
	u := asWritten(s, chk.Stmt).Shown
	return UtilisationText(engine.Utilisation(chk.Stmt.Compare().Op, u.FromSI(l), u.FromSI(r)))
}

// sweepRows chooses the points a sweep's table shows: all of them up to
// maxSweepRows, else evenly spread ones with the first, the last and the
// points given (the checks' worst).
func sweepRows(n int, keep []int) []int {
	if n <= maxSweepRows {
		rows := make([]int, n)
		for i := range rows {
			rows[i] = i
		}
		return rows
	}
	var rows []int
	for k := 0; k < maxSweepRows; k++ {
		rows = append(rows, int(math.Round(float64(k)*float64(n-1)/float64(maxSweepRows-1))))
	}
	for _, i := range keep {
		if i >= 0 && i < n {
			rows = append(rows, i)
		}
	}
	slices.Sort(rows)
	return slices.Compact(rows)
}

// writeSweepTable writes a sweep's points: the input, each result it
// gathers in its unit, and each check's utilisation, the worst marked.
func writeSweepTable(w sink, s *project.Sheet, sw *conditions.SweepRun, digits int) {
	var worst []int
	for _, chk := range sw.Checks {
		worst = append(worst, chk.Worst)
	}
	rows := sweepRows(len(sw.X), worst)
	if len(rows) < len(sw.X) {
		w.WriteString("<p class=\"condnote\">The table shows " + strconv.Itoa(len(rows)) + " of the " + strconv.Itoa(len(sw.X)) +
			" points, evenly chosen, with the first, the last and each check's worst; the JSON holds every point.</p>\n")
	}
	w.WriteString("<div class=\"scroll sweeptable\"><table class=\"sweep\">\n<thead><tr><th>" + columnHead(sw.Input.Name, sw.XShown) + "</th>")
	for _, cv := range sw.Curves {
		w.WriteString("<th>" + columnHead(cv.Stmt.Name, cv.Shown) + "</th>")
	}
	for _, chk := range sw.Checks {
		w.WriteString(`<th>demand / capacity, <a href="#` + anchor(chk.Stmt) + `">` + esc(checkAt(chk.Stmt)) + "</a></th>")
	}
	w.WriteString("</tr></thead>\n<tbody>\n")
	for _, i := range rows {
		cls := ""
		if slices.Contains(worst, i) {
			cls = ` class="worst"`
		}
		w.WriteString("<tr" + cls + `><td class="num">` + esc(units.FormatNumber(sw.XShown.FromSI(sw.X[i]), digits)) + "</td>")
		for _, cv := range sw.Curves {
			w.WriteString(`<td class="num">` + esc(pointValue(cv.Y[i], cv.Shown, digits)) + "</td>")
		}
		for _, chk := range sw.Checks {
			text := pointUtilisation(s, chk, i)
			if text == "" {
				text = "—"
			}
			if chk.Worst == i {
				w.WriteString(`<td class="num worst">` + esc(text) + ` <span class="govmark">worst</span></td>`)
				continue
			}
			w.WriteString(`<td class="num">` + esc(text) + "</td>")
		}
		w.WriteString("</tr>\n")
	}
	w.WriteString("</tbody>\n</table></div>\n")
}

// columnHead heads a column as ISO 80000-1 does, quantity / unit: "U / V".
func columnHead(name string, u units.Unit) string {
	if u.Symbol == "" || u.Symbol == "1" {
		return symbolHTML(name)
	}
	return symbolHTML(name) + " / " + esc(u.Symbol)
}

// pointValue is a gathered result at a point, in its unit's numbers, or a
// dash where it has no value.
func pointValue(si float64, u units.Unit, digits int) string {
	if math.IsNaN(si) {
		return "—"
	}
	return units.FormatNumber(u.FromSI(si), digits)
}
