package render

import (
	"cmp"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/chart"
	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// writeSweepPlot draws the results a sweep gathers against its input, one
// figure per unit they are shown in: a check's limit as a horizontal line
// where the check compares a drawn result with a limit that does not move
// with the input, and each check's worst point marked.
func writeSweepPlot(w sink, s *project.Sheet, sw *conditions.SweepRun, digits int) {
	marked := map[*engine.Statement]bool{}
	// A sweep over a list in no order is drawn in the order of its input.
	order := make([]int, len(sw.X))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(sw.X[a], sw.X[b]) })
	for gi, group := range curveGroups(sw) {
		spec := chart.LineSpec{X: chart.Axis{Quantity: SymbolText(sw.Input.Name), Unit: sw.XShown.Symbol}}
		var names []string
		for _, cv := range group {
			c := chart.Curve{Name: SymbolText(cv.Stmt.Name)}
			for _, i := range order {
				if y := cv.Y[i]; !math.IsNaN(y) {
					c.X = append(c.X, sw.XShown.FromSI(sw.X[i]))
					c.Y = append(c.Y, cv.Shown.FromSI(y))
				}
			}
			if len(c.X) >= 2 {
				spec.Curves = append(spec.Curves, c)
				names = append(names, c.Name)
			}
		}
		if len(spec.Curves) == 0 {
			continue
		}
		u := group[0].Shown
		spec.Y = chart.Axis{Unit: u.Symbol}
		if len(spec.Curves) == 1 {
			spec.Y.Quantity = spec.Curves[0].Name
		}
		spec.Title = sw.Stmt.Cond.Word() + " " + sw.Stmt.Name + ": " + strings.Join(names, ", ") + " against " + SymbolText(sw.Input.Name)
		spec.Marks = append(spec.Marks, operatingPoints(s, sw, group, digits)...)
		for _, chk := range sw.Checks {
			cv, limit := drawnSide(chk, group)
			if cv != nil && limit != nil {
				spec.YLimits = appendLimit(spec.YLimits, chart.Limit{Value: u.FromSI(limit[0]), Label: limitLabel(chk.Stmt, cv, limit[0], u, digits)})
			}
			if chk.Worst < 0 || marked[chk.Stmt] {
				continue
			}
			on := cv
			if on == nil && gi == 0 && !drawnInAny(chk, sw) {
				on = group[0] // a check on no drawn result: its worst x on the first curve
			}
			if on != nil && !math.IsNaN(on.Y[chk.Worst]) {
				spec.Marks = append(spec.Marks, chart.Mark{X: sw.XShown.FromSI(sw.X[chk.Worst]), Y: u.FromSI(on.Y[chk.Worst]),
					Label: "worst, line " + strconv.Itoa(chk.Stmt.Pos.Line)})
				marked[chk.Stmt] = true
			}
		}
		svg, err := chart.Line(spec)
		if err != nil {
			w.WriteString("<p class=\"condnote\">The plot could not be drawn: " + esc(err.Error()) + "</p>\n")
			continue
		}
		w.WriteString("<figure class=\"sweepplot\">\n")
		w.Write(svg)
		w.WriteString("\n<figcaption>" + esc(spec.Title) + plotKey(spec) + "</figcaption>\n</figure>\n")
	}
}

// operatingPoints marks, on each curve of a sweep run as written, the
// point the sheet works at: the input's value as written and the result
// there, when it lies within the sweep's span.
func operatingPoints(s *project.Sheet, sw *conditions.SweepRun, group []*conditions.Curve, digits int) []chart.Mark {
	if sw.Stmt.Cond.In != nil {
		return nil // the sheet's own point is not on a curve run in a case
	}
	x := s.Calc.Result(sw.Input)
	if x.Status != engine.OK || x.Value < slices.Min(sw.X) || x.Value > slices.Max(sw.X) {
		return nil
	}
	var marks []chart.Mark
	for _, cv := range group {
		if y := s.Calc.Result(cv.Stmt); y.Status == engine.OK {
			label := ""
			if len(marks) == 0 { // one label for the point; the curves share its x
				label = "as written, " + ValueText(x.Value, sw.XShown, digits)
			}
			marks = append(marks, chart.Mark{X: sw.XShown.FromSI(x.Value), Y: cv.Shown.FromSI(y.Value), Label: label})
		}
	}
	return marks
}

// plotKey says what the lines and rings of a figure are.
func plotKey(spec chart.LineSpec) string {
	var parts []string
	if len(spec.YLimits) > 0 {
		parts = append(parts, "dashed: a check's limit")
	}
	worst := slices.ContainsFunc(spec.Marks, func(m chart.Mark) bool { return strings.HasPrefix(m.Label, "worst") })
	written := slices.ContainsFunc(spec.Marks, func(m chart.Mark) bool { return strings.HasPrefix(m.Label, "as written") })
	if worst {
		parts = append(parts, "ring: a check's worst point")
	}
	if written {
		parts = append(parts, "ring marked as written: the point the sheet works at")
	}
	if len(parts) == 0 {
		return ""
	}
	return "; " + strings.Join(parts, "; ")
}

// curveGroups splits a sweep's curves by the unit they are shown in, in
// the order written, so that each figure has one y axis.
func curveGroups(sw *conditions.SweepRun) [][]*conditions.Curve {
	var groups [][]*conditions.Curve
	for i := range sw.Curves {
		cv := &sw.Curves[i]
		placed := false
		for g := range groups {
			if u := groups[g][0].Shown; u.Symbol == cv.Shown.Symbol && u.Dim == cv.Shown.Dim {
				groups[g] = append(groups[g], cv)
				placed = true
				break
			}
		}
		if !placed {
			groups = append(groups, []*conditions.Curve{cv})
		}
	}
	return groups
}

// drawnSide finds the curve of a group that one side of a check names,
// and the other side's value when it is the same at every point (a
// limit that does not move with the input), as a one-element slice.
func drawnSide(chk conditions.SweepCheck, group []*conditions.Curve) (*conditions.Curve, []float64) {
	cmp := chk.Stmt.Compare()
	for _, cv := range group {
		switch {
		case refersTo(cmp.X, cv.Stmt):
			return cv, constantSide(chk.Right)
		case refersTo(cmp.Y, cv.Stmt):
			return cv, constantSide(chk.Left)
		}
	}
	return nil, nil
}

// drawnInAny reports whether a check compares a result the sweep draws.
func drawnInAny(chk conditions.SweepCheck, sw *conditions.SweepRun) bool {
	cmp := chk.Stmt.Compare()
	for i := range sw.Curves {
		if refersTo(cmp.X, sw.Curves[i].Stmt) || refersTo(cmp.Y, sw.Curves[i].Stmt) {
			return true
		}
	}
	return false
}

func refersTo(e engine.Expr, st *engine.Statement) bool {
	r, ok := e.(*engine.Ref)
	return ok && r.Target == st
}

// constantSide returns a check's side when it has one value at every
// point, or nil.
func constantSide(v []float64) []float64 {
	if len(v) == 0 || math.IsNaN(v[0]) {
		return nil
	}
	for _, x := range v[1:] {
		if x != v[0] {
			return nil
		}
	}
	return v[:1]
}

// limitLabel names a limit line: the limit's name and value, "I_max 9.000 A".
func limitLabel(chk *engine.Statement, cv *conditions.Curve, si float64, u units.Unit, digits int) string {
	cmp := chk.Compare()
	other := cmp.Y
	if refersTo(cmp.Y, cv.Stmt) {
		other = cmp.X
	}
	name := "limit, line " + strconv.Itoa(chk.Pos.Line)
	if r, ok := other.(*engine.Ref); ok && r.Target != nil {
		name = SymbolText(r.Target.Name)
	}
	return name + " " + ValueText(si, u, digits)
}

// appendLimit adds a limit line unless the figure has one at that value.
func appendLimit(ls []chart.Limit, l chart.Limit) []chart.Limit {
	for _, have := range ls {
		if have.Value == l.Value {
			return ls
		}
	}
	return append(ls, l)
}
