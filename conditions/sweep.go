package conditions

import (
	"math"
	"strconv"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/units"
)

// SweepRun is one sweep: the input's points and, at each, the results it
// gathers and the checks that rest on the input (none for a curve).
type SweepRun struct {
	Stmt  *engine.Statement
	Input *engine.Statement
	// X are the points in SI; XShown the unit the input is shown in.
	X      []float64
	XShown units.Unit
	Curves []Curve
	Checks []SweepCheck
}

// Curve is one gathered result over the points, in SI, NaN where it has
// no value; Shown is the unit the sheet shows it in.
type Curve struct {
	Stmt  *engine.Statement
	Y     []float64
	Shown units.Unit
	// Failed counts the points where it has no value.
	Failed int
}

// SweepCheck is a check over a sweep's points: its sides at each point
// in SI (NaN where it was not evaluated), the worst point, and how many
// points fail.
type SweepCheck struct {
	Stmt        *engine.Statement
	Left, Right []float64
	Worst       int
	Fails       int
	// Errors counts the points where the check could not be worked out.
	Errors int
}

// runSweep runs a sweep: the case it is in, then each point in turn, each
// run re-evaluating only what depends on the swept input. The frame and
// the one-input set are reused, so a point allocates nothing.
func runSweep(calc *engine.Calc, p *engine.Program, st *engine.Statement) SweepRun {
	c := st.Cond
	sw := SweepRun{Stmt: st, Input: c.Input, X: c.Points, XShown: calc.Result(c.Input).Shown}
	for _, s := range c.Show {
		sw.Curves = append(sw.Curves, Curve{Stmt: s, Y: make([]float64, len(c.Points)), Shown: calc.Result(s).Shown})
	}
	for _, chk := range calc.Statements {
		// A curve draws past the operating range on purpose: its points
		// say nothing about the checks.
		if c.Governs && chk.Kind == engine.Check && settled(calc.Result(chk).Status) && restsOn(calc, chk, c.Input) {
			sw.Checks = append(sw.Checks, SweepCheck{Stmt: chk, Left: make([]float64, len(c.Points)), Right: make([]float64, len(c.Points)), Worst: -1})
		}
	}
	f := p.NewFrame()
	var start []engine.Set
	if c.In != nil {
		start = caseSets(c.In)
	}
	p.Run(f, start)
	one := make([]engine.Set, 1)
	for i, x := range c.Points {
		one[0] = engine.Set{Slot: c.Input.Index, SI: x}
		p.Run(f, one)
		for k := range sw.Curves {
			sw.Curves[k].read(f, i)
		}
		for k := range sw.Checks {
			sw.Checks[k].read(f, i)
		}
	}
	return sw
}

func restsOn(calc *engine.Calc, st, input *engine.Statement) bool {
	ins, _ := calc.RestsOn(st)
	for _, in := range ins {
		if in == input {
			return true
		}
	}
	return false
}

func (c *Curve) read(f *engine.Frame, i int) {
	slot := c.Stmt.Index
	if f.Status[slot] != engine.OK {
		c.Y[i] = math.NaN()
		c.Failed++
		return
	}
	c.Y[i] = f.Values[slot]
}

func (c *SweepCheck) read(f *engine.Frame, i int) {
	slot := c.Stmt.Index
	s := f.Status[slot]
	if !settled(s) {
		c.Left[i], c.Right[i] = math.NaN(), math.NaN()
		c.Errors++
		if c.Worst < 0 || !math.IsNaN(c.Left[c.Worst]) {
			c.Worst = i // an error governs
		}
		return
	}
	c.Left[i], c.Right[i] = f.Left[slot], f.Right[slot]
	if s == engine.Fail {
		c.Fails++
	}
	op := c.Stmt.Compare().Op
	if c.Worst < 0 || !math.IsNaN(c.Left[c.Worst]) && shortfall(op, c.Left[i], c.Right[i]) > shortfall(op, c.Left[c.Worst], c.Right[c.Worst]) {
		c.Worst = i
	}
}

// considerSweep offers each check's worst point of a sweep as its
// governing condition, worked out again in a frame of its own so that the
// page shows it in the check's units. Only a sweep has checks: a curve
// gathers none.
func (r *Report) considerSweep(p *engine.Program, sw *SweepRun) {
	c := sw.Stmt.Cond
	at := map[int][]engine.Result{} // by point: checks often share their worst
	for _, chk := range sw.Checks {
		if _, ok := r.govern[chk.Stmt]; !ok || chk.Worst < 0 {
			continue
		}
		if at[chk.Worst] == nil {
			f := p.NewFrame()
			var sets []engine.Set
			if c.In != nil {
				sets = caseSets(c.In)
			}
			p.Run(f, append(sets, engine.Set{Slot: c.Input.Index, SI: sw.X[chk.Worst]}))
			at[chk.Worst] = p.Results(f)
		}
		res := at[chk.Worst][chk.Stmt.Index]
		g := Governing{Where: sw.PointName(chk.Worst), Sweep: sw, Point: chk.Worst, Result: res}
		cur := r.govern[chk.Stmt]
		cur.Evaluated += len(sw.X)
		if chk.Fails > 0 {
			cur.Failing = append(cur.Failing, "sweep "+sw.Stmt.Name+" ("+strconv.Itoa(chk.Fails)+" of "+strconv.Itoa(len(sw.X))+" points)")
		}
		if worse(chk.Stmt, res, cur.Result) {
			g.Evaluated, g.Failing, g.AsWritten = cur.Evaluated, cur.Failing, cur.AsWritten
			cur = g
		}
		r.govern[chk.Stmt] = cur
	}
}

// PointName names a point of the sweep: "sweep occ at I_f = 52 A".
func (sw *SweepRun) PointName(i int) string {
	where := sw.Stmt.Cond.Word() + " " + sw.Stmt.Name
	if in := sw.Stmt.Cond.In; in != nil {
		where += " in case " + in.Name
	}
	return where + " at " + sw.Input.Name + " = " + units.FormatNumber(sw.XShown.FromSI(sw.X[i]), 4) + " " + sw.XShown.Symbol
}

// shortfall measures how far a check's demand goes past its capacity,
// relative to the capacity: above zero fails, and larger is worse. For an
// equality it is the relative difference of the sides.
func shortfall(op string, l, r float64) float64 {
	switch op {
	case "<", "<=":
		return (l - r) / scale(r)
	case ">", ">=":
		return (r - l) / scale(l)
	}
	return math.Abs(l-r) / scale(math.Max(math.Abs(l), math.Abs(r)))
}

func scale(v float64) float64 {
	if v == 0 {
		return 1
	}
	return math.Abs(v)
}
