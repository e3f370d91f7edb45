package render

import (
	"math"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// The conditions in the JSON document: every figure in coherent SI with
// its unit, a value that has none (a point where a result could not be
// worked out) as null.

// JSONCaseValue is a statement's outcome in one load case.
type JSONCaseValue struct {
	Status  string     `json:"status"`
	SI      *JSONValue `json:"si,omitempty"`
	Display *JSONValue `json:"display,omitempty"`
	Check   *JSONCheck `json:"check,omitempty"`
}

// JSONGoverning is where a check comes out worst over its sheet's cases
// and sweeps; the statement's own check is the check there.
type JSONGoverning struct {
	Where     string     `json:"where"`
	Case      string     `json:"case,omitempty"`
	Sweep     string     `json:"sweep,omitempty"`
	Point     *int       `json:"point,omitempty"`
	Evaluated int        `json:"evaluated"`
	Failing   []string   `json:"failing"`
	AsWritten *JSONCheck `json:"as_written,omitempty"`
}

// JSONTolerance is an input's tolerance: its limits in SI and how it
// spreads between them.
type JSONTolerance struct {
	Text         string   `json:"text"`
	Distribution string   `json:"distribution"`
	LoSI         float64  `json:"lo_si"`
	HiSI         float64  `json:"hi_si"`
	SigmaSI      *float64 `json:"sigma_si,omitempty"`
	Unit         string   `json:"unit"`
}

// JSONSpread is what the inputs' tolerances do to a check or a result.
type JSONSpread struct {
	Unit string `json:"unit"`
	// A check's: its margin as written, its worst case, the RSS of the
	// tolerances and the Monte Carlo share of failures.
	MarginSI *float64       `json:"margin_si,omitempty"`
	Worst    *JSONCaseValue `json:"worst,omitempty"`
	WorstAt  []JSONAt       `json:"worst_at,omitempty"`
	Method   string         `json:"method,omitempty"`
	Fail     *float64       `json:"fail,omitempty"`
	FailLo   *float64       `json:"fail_lo,omitempty"`
	FailHi   *float64       `json:"fail_hi,omitempty"`
	Errors   *int           `json:"errors,omitempty"`
	// A result's: its extremes and Monte Carlo mean and standard
	// deviation.
	MinSI  *float64 `json:"min_si,omitempty"`
	MaxSI  *float64 `json:"max_si,omitempty"`
	MeanSI *float64 `json:"mean_si,omitempty"`
	SDSI   *float64 `json:"sd_si,omitempty"`
	// Both: the root-sum-square of the inputs' effects and the inputs by
	// their share of it.
	RSSSI   *float64          `json:"rss_si,omitempty"`
	Ranking []JSONSensitivity `json:"ranking"`
}

// JSONAt is an input's value at a worst case.
type JSONAt struct {
	Name string  `json:"name"`
	SI   float64 `json:"si"`
}

// JSONSensitivity is one input's effect on a check's margin or a result.
type JSONSensitivity struct {
	Name     string   `json:"name"`
	SlopeSI  *float64 `json:"slope_si,omitempty"`
	EffectSI *float64 `json:"effect_si,omitempty"`
	Share    float64  `json:"share"`
}

// JSONSweep is a sweep's points and what it gathered at each.
type JSONSweep struct {
	// Governs is false for a curve, whose points govern no check.
	Governs bool             `json:"governs"`
	Input   string           `json:"input"`
	Case    string           `json:"case,omitempty"`
	Points  JSONAxis         `json:"points"`
	Curves  []JSONCurve      `json:"curves"`
	Checks  []JSONSweepCheck `json:"checks"`
}

// JSONCurve is a gathered result at each point, null where it has none.
type JSONCurve struct {
	Name        string     `json:"name"`
	SI          []*float64 `json:"si"`
	Unit        string     `json:"unit"`
	DisplayUnit string     `json:"display_unit"`
	Display     []*float64 `json:"display"`
	Failed      int        `json:"failed"`
}

// JSONSweepCheck is a check that rests on the swept input, at each point.
type JSONSweepCheck struct {
	Pos         diag.Pos   `json:"pos"`
	Formula     string     `json:"formula"`
	Unit        string     `json:"unit"`
	LeftSI      []*float64 `json:"left_si"`
	RightSI     []*float64 `json:"right_si"`
	Utilisation []*float64 `json:"utilisation"`
	Worst       int        `json:"worst"`
	Fails       int        `json:"fails"`
	Errors      int        `json:"errors"`
}

// JSONSampling is the Monte Carlo count and seed a sheet's tolerances
// were sampled with.
type JSONSampling struct {
	Samples int    `json:"samples"`
	Seed    uint64 `json:"seed"`
	Default bool   `json:"default"`
}

// number is a finite value, or nil.
func number(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

func numbers(vs []float64, conv func(float64) float64) []*float64 {
	out := make([]*float64, len(vs))
	for i, v := range vs {
		if !math.IsNaN(v) {
			out[i] = number(conv(v))
		}
	}
	return out
}

func identity(v float64) float64 { return v }

// jsonOutcome is a statement's result in a condition.
func jsonOutcome(st *engine.Statement, r engine.Result, shown units.Unit, digits int) JSONCaseValue {
	v := JSONCaseValue{Status: r.Status.String()}
	switch r.Status {
	case engine.OK:
		v.SI = &JSONValue{Value: r.Value, Unit: st.Type.Dim.SIUnits()}
		d := shown.FromSI(r.Value)
		v.Display = &JSONValue{Value: d, Unit: shown.Symbol, Text: units.FormatNumber(d, r.Digits(digits))}
	case engine.Pass, engine.Fail:
		v.Check = jsonCheckOf(st, r, shown, digits)
	}
	return v
}

// jsonCheckOf is a check's outcome in a condition, both sides in unit u.
func jsonCheckOf(st *engine.Statement, r engine.Result, u units.Unit, digits int) *JSONCheck {
	l, rt := u.FromSI(r.Left), u.FromSI(r.Right)
	c := &JSONCheck{Op: st.Compare().Op, Pass: r.Status == engine.Pass, LeftSI: r.Left, RightSI: r.Right,
		Left:  JSONValue{Value: l, Unit: u.Symbol, Text: units.FormatNumber(l, digits)},
		Right: JSONValue{Value: rt, Unit: u.Symbol, Text: units.FormatNumber(rt, digits)},
	}
	c.Utilisation = number(engine.Utilisation(c.Op, l, rt))
	return c
}

// addConditions adds to a statement's JSON its values in every case, its
// governing condition, its tolerance and its spread under the tolerances,
// or a sweep's points.
func addConditions(j *JSONStatement, s *project.Sheet, st *engine.Statement, digits int) {
	r := s.Conditions
	if r == nil {
		return
	}
	if st.Kind == engine.Sweep {
		if sw := sweepRun(s, st); sw != nil {
			j.Sweep = jsonSweep(s, sw)
		}
		return
	}
	if st.Kind != engine.Definition && st.Kind != engine.Check {
		return
	}
	written := asWritten(s, st)
	if len(r.Cases) > 0 && settledOrOK(written.Status) {
		j.Cases = map[string]JSONCaseValue{}
		for _, c := range r.Cases {
			if st.Index < len(c.Results) {
				j.Cases[c.Stmt.Name] = jsonOutcome(st, c.Results[st.Index], written.Shown, digits)
			}
		}
	}
	if g, ok := r.Governing(st); ok {
		jg := &JSONGoverning{Where: g.Where, Evaluated: g.Evaluated, Failing: append([]string{}, g.Failing...)}
		switch {
		case g.Case != nil:
			jg.Case = g.Case.Name
		case g.Sweep != nil:
			p := g.Point
			jg.Sweep, jg.Point = g.Sweep.Stmt.Name, &p
		}
		if settledResult(g.AsWritten) {
			jg.AsWritten = jsonCheckOf(st, g.AsWritten, g.AsWritten.Shown, digits)
		}
		j.Governing = jg
	}
	if st.Tol != nil && st.IsInput() && written.Status == engine.OK {
		t := st.Tol
		j.Tolerance = &JSONTolerance{Text: t.Text, Distribution: t.Dist.String(), LoSI: t.Lo, HiSI: t.Hi, Unit: st.Type.Dim.SIUnits()}
		if t.Dist == engine.Normal {
			j.Tolerance.SigmaSI = number(t.Sigma)
		}
	}
	j.Spread = jsonSpread(r.Spread, st, written.Shown, digits)
}

func settledOrOK(s engine.Status) bool { return s == engine.OK || s == engine.Pass || s == engine.Fail }

// jsonSpread is what the tolerances do to a check or a result, or nil.
func jsonSpread(sp *conditions.Spread, st *engine.Statement, shown units.Unit, digits int) *JSONSpread {
	if sp == nil {
		return nil
	}
	unit := st.Type.Dim.SIUnits()
	for _, c := range sp.Checks {
		if c.Stmt != st {
			continue
		}
		errs := c.Errors
		out := &JSONSpread{Unit: unit, MarginSI: number(c.Margin), RSSSI: number(c.RSS), Method: c.Method,
			Fail: number(c.Fail), FailLo: number(c.FailLo), FailHi: number(c.FailHi), Errors: &errs, Ranking: jsonRanking(c.Ranking)}
		w := jsonOutcome(st, c.Worst, shown, digits)
		out.Worst = &w
		for k, i := range c.Inputs {
			if k < len(c.WorstAt) {
				out.WorstAt = append(out.WorstAt, JSONAt{Name: sp.Inputs[i].Name, SI: c.WorstAt[k]})
			}
		}
		return out
	}
	for _, r := range sp.Results {
		if r.Stmt == st {
			return &JSONSpread{Unit: unit, MinSI: number(r.Min), MaxSI: number(r.Max), RSSSI: number(r.RSS),
				MeanSI: number(r.Mean), SDSI: number(r.SD), Ranking: jsonRanking(r.Ranking)}
		}
	}
	return nil
}

func jsonRanking(rank []conditions.Sensitivity) []JSONSensitivity {
	out := []JSONSensitivity{}
	for _, s := range rank {
		share := s.Share
		if math.IsNaN(share) {
			share = 0
		}
		out = append(out, JSONSensitivity{Name: s.Input.Name, SlopeSI: number(s.Slope), EffectSI: number(s.Effect), Share: share})
	}
	return out
}

// jsonSweep is a sweep's points, curves and checks.
func jsonSweep(s *project.Sheet, sw *conditions.SweepRun) *JSONSweep {
	j := &JSONSweep{Governs: sw.Stmt.Cond.Governs, Input: sw.Input.Name, Curves: []JSONCurve{}, Checks: []JSONSweepCheck{},
		Points: JSONAxis{SI: sw.X, Unit: sw.Input.Type.Dim.SIUnits(), DisplayUnit: sw.XShown.Symbol, Display: make([]float64, len(sw.X))}}
	if in := sw.Stmt.Cond.In; in != nil {
		j.Case = in.Name
	}
	for i, x := range sw.X {
		j.Points.Display[i] = sw.XShown.FromSI(x)
	}
	for _, cv := range sw.Curves {
		j.Curves = append(j.Curves, JSONCurve{Name: cv.Stmt.Name, SI: numbers(cv.Y, identity), Unit: cv.Stmt.Type.Dim.SIUnits(),
			DisplayUnit: cv.Shown.Symbol, Display: numbers(cv.Y, cv.Shown.FromSI), Failed: cv.Failed})
	}
	for _, chk := range sw.Checks {
		u := asWritten(s, chk.Stmt).Shown
		jc := JSONSweepCheck{Pos: chk.Stmt.Pos, Formula: chk.Stmt.Formula, Unit: chk.Stmt.Type.Dim.SIUnits(),
			LeftSI: numbers(chk.Left, identity), RightSI: numbers(chk.Right, identity), Utilisation: make([]*float64, len(sw.X)),
			Worst: chk.Worst, Fails: chk.Fails, Errors: chk.Errors}
		for i := range sw.X {
			if !math.IsNaN(chk.Left[i]) && !math.IsNaN(chk.Right[i]) {
				jc.Utilisation[i] = number(engine.Utilisation(chk.Stmt.Compare().Op, u.FromSI(chk.Left[i]), u.FromSI(chk.Right[i])))
			}
		}
		j.Checks = append(j.Checks, jc)
	}
	return j
}

// jsonSampling is the Monte Carlo count and seed of a sheet with
// tolerances, or nil.
func jsonSampling(s *project.Sheet) *JSONSampling {
	sp := s.Conditions.SpreadOf()
	if sp == nil {
		return nil
	}
	return &JSONSampling{Samples: sp.Samples, Seed: sp.Seed, Default: sp.Default}
}

// jsonConditionStatement fills in a case, sweep or sample statement.
func jsonConditionStatement(j *JSONStatement, st *engine.Statement) {
	switch st.Kind {
	case engine.Case:
		j.Kind = "case"
		for _, o := range st.Overrides {
			set := JSONSet{Name: o.Name, Formula: o.Formula}
			if st.Cond != nil {
				for _, cs := range st.Cond.Sets {
					if cs.Input.Name == o.Name {
						set.SI = &JSONValue{Value: cs.SI, Unit: cs.Input.Type.Dim.SIUnits()}
					}
				}
			}
			j.Sets = append(j.Sets, set)
		}
	case engine.Sweep:
		j.Kind = "sweep"
	case engine.Sampling:
		j.Kind = "sample"
	}
}
