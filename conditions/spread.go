package conditions

import (
	"math"
	"slices"

	"github.com/sheaf-calc/sheaf/engine"
	"gonum.org/v1/gonum/stat/distuv"
)

// Spread is what the tolerances of a sheet's inputs give its checks and
// results: the worst case, a root-sum-square estimate, a seeded Monte
// Carlo estimate and the sensitivities. Every figure is in SI.
type Spread struct {
	// Inputs are the toleranced inputs, in the order written.
	Inputs []*engine.Statement
	// Samples and Seed are the Monte Carlo count and seed used; Default is
	// set when no sample statement gave them.
	Samples int
	Seed    uint64
	Default bool
	Checks  []CheckSpread
	Results []ResultSpread
	// Partial is set when the worst cases of some statements were found by
	// sensitivities, or some results left out, to keep within the sheet's
	// work limit.
	Partial bool
}

// CheckSpread is one check under the tolerances of the inputs it rests
// on. Margin is capacity minus demand in SI (the check holds while it is
// not negative): for x <= y it is y − x, for x >= y it is x − y.
type CheckSpread struct {
	Stmt *engine.Statement
	// Inputs are the toleranced inputs the check rests on, as indexes into
	// Spread.Inputs.
	Inputs []int
	// Margin is the margin as written.
	Margin float64
	// Worst is the check at its worst combination of the inputs' limits,
	// WorstAt those inputs' values there (by Inputs), and Method how it was
	// found: "corners", "corners and interior points" where an input's
	// effect turns within its band, or "sensitivities" for a check on
	// more inputs than the corners can be enumerated for.
	Worst   engine.Result
	WorstAt []float64
	Method  string
	// RSS is the root-sum-square of each input's effect across its
	// tolerance (a normal input's tolerance being 3σ): the margin as
	// written less RSS is the margin a tolerance stack expects.
	RSS float64
	// Fail is the share of Monte Carlo samples in which the check fails,
	// with the 95 % (Wilson) interval FailLo–FailHi. Errors counts samples
	// in which it could not be worked out, counted as failures.
	Fail, FailLo, FailHi float64
	Errors               int
	// Ranking lists the inputs by their share of the margin's variance,
	// largest first.
	Ranking []Sensitivity
}

// Sensitivity is one input's effect on a check's margin or a result.
type Sensitivity struct {
	Input *engine.Statement
	// Slope is the change of the margin (or the result) per unit of the
	// input, in SI, across the input's band.
	Slope float64
	// Effect is Slope times the input's tolerance; Share its part of the
	// root-sum-square, Effect² over RSS².
	Effect, Share float64
}

// ResultSpread is one result that rests on toleranced inputs.
type ResultSpread struct {
	Stmt *engine.Statement
	// Min and Max are the extremes over the corners of the inputs' limits
	// (or by sensitivities, as for checks).
	Min, Max float64
	// RSS is the root-sum-square of the inputs' effects.
	RSS float64
	// Mean and SD are the Monte Carlo mean and standard deviation.
	Mean, SD float64
	Ranking  []Sensitivity
}

// maxCorners bounds the inputs whose corners are enumerated for one
// statement, 2^10 runs, and maxCombinations the combinations tried with
// the interior points.
const (
	maxCorners      = 10
	maxCombinations = 4096
)

// combos counts the combinations of the candidates.
func combos(cands [][]float64) int {
	n := 1
	for _, c := range cands {
		if n *= len(c); n > maxCombinations {
			return n
		}
	}
	return n
}

// runSpread works out the tolerances' effects.
func runSpread(calc *engine.Calc, p *engine.Program, inputs []*engine.Statement, sampling *engine.Statement) *Spread {
	sp := &Spread{Inputs: inputs, Samples: engine.DefaultSamples, Seed: engine.DefaultSeed, Default: sampling == nil}
	if sampling != nil {
		sp.Samples, sp.Seed = sampling.Cond.Samples, sampling.Cond.Seed
	}
	index := map[*engine.Statement]int{}
	for i, in := range inputs {
		index[in] = i
	}
	ev := newEvaluator(p, inputs)
	ev.budget = (engine.MaxConditionWork - sp.Samples*p.Steps()) / max(1, p.Steps())
	for _, st := range calc.Statements {
		res := calc.Result(st)
		ins := tolerated(calc, st, index)
		if len(ins) == 0 {
			continue
		}
		switch {
		case st.Kind == engine.Check && settled(res.Status) && st.Compare().Op != "==":
			if ev.runs+2*len(ins)+2 > ev.budget {
				ev.partial = true
				continue
			}
			sp.Checks = append(sp.Checks, ev.check(st, ins))
		case st.Kind == engine.Definition && res.Status == engine.OK && !st.IsInput() && !st.Type.IsList() && !st.Type.IsComplex():
			if ev.runs+(2*len(ins)+2)*(interiorSteps+2) > ev.budget {
				ev.partial = true
				continue
			}
			sp.Results = append(sp.Results, ev.result(st, ins))
		}
	}
	sp.Partial = ev.partial
	sp.sample(p)
	return sp
}

// tolerated returns the toleranced inputs a statement rests on, as
// indexes in the order written.
func tolerated(calc *engine.Calc, st *engine.Statement, index map[*engine.Statement]int) []int {
	if st.Kind != engine.Check && st.Kind != engine.Definition {
		return nil
	}
	var out []int
	ins, _ := calc.RestsOn(st)
	for _, in := range ins {
		if i, ok := index[in]; ok && in != st {
			out = append(out, i)
		}
	}
	slices.Sort(out)
	return out
}

// evaluator runs the program at chosen values of the toleranced inputs,
// the others as written, in one frame.
type evaluator struct {
	p      *engine.Program
	f      *engine.Frame
	inputs []*engine.Statement
	nom    []float64
	sets   []engine.Set
	// runs counts the runs made, budget the runs allowed; partial is set
	// once a statement's worst case fell back to sensitivities for the
	// budget.
	runs, budget int
	partial      bool
}

func newEvaluator(p *engine.Program, inputs []*engine.Statement) *evaluator {
	ev := &evaluator{p: p, f: p.NewFrame(), inputs: inputs}
	p.Run(ev.f, nil)
	for _, in := range inputs {
		ev.nom = append(ev.nom, ev.f.Values[in.Index])
	}
	return ev
}

// at runs the program with the inputs ins at the values x, the rest as
// written, and returns a statement's value: a check's margin, or a
// result. ok is false where it has no value.
func (ev *evaluator) at(st *engine.Statement, ins []int, x []float64) (v float64, ok bool) {
	ev.sets = ev.sets[:0]
	for i := range ev.inputs {
		ev.sets = append(ev.sets, engine.Set{Slot: ev.inputs[i].Index, SI: ev.nom[i]})
	}
	for k, i := range ins {
		ev.sets[i].SI = x[k]
	}
	ev.runs++
	ev.p.Run(ev.f, ev.sets)
	return read(st, ev.f)
}

// read returns a check's margin or a definition's value from a frame.
func read(st *engine.Statement, f *engine.Frame) (float64, bool) {
	slot := st.Index
	switch f.Status[slot] {
	case engine.Pass, engine.Fail:
		return margin(st.Compare().Op, f.Left[slot], f.Right[slot]), true
	case engine.OK:
		return f.Values[slot], true
	}
	return math.NaN(), false
}

// margin is capacity less demand.
func margin(op string, l, r float64) float64 {
	if op == "<" || op == "<=" {
		return r - l
	}
	return l - r
}

// sensitivities works out each input's slope across its band, the other
// inputs as written, and the root-sum-square of their effects.
func (ev *evaluator) sensitivities(st *engine.Statement, ins []int) ([]Sensitivity, float64) {
	x := ev.nominal(ins)
	var out []Sensitivity
	var sum float64
	for k, i := range ins {
		tol := ev.inputs[i].Tol
		x[k] = tol.Hi
		hi, _ := ev.at(st, ins, x)
		x[k] = tol.Lo
		lo, _ := ev.at(st, ins, x)
		x[k] = ev.nom[i]
		s := (hi - lo) / (tol.Hi - tol.Lo)
		e := s * (tol.Hi - tol.Lo) / 2
		sum += e * e
		out = append(out, Sensitivity{Input: ev.inputs[i], Slope: s, Effect: e})
	}
	for k := range out {
		if sum > 0 {
			out[k].Share = out[k].Effect * out[k].Effect / sum
		}
	}
	slices.SortStableFunc(out, func(a, b Sensitivity) int {
		switch {
		case a.Share > b.Share:
			return -1
		case a.Share < b.Share:
			return 1
		}
		return 0
	})
	return out, math.Sqrt(sum)
}

func (ev *evaluator) nominal(ins []int) []float64 {
	x := make([]float64, len(ins))
	for k, i := range ins {
		x[k] = ev.nom[i]
	}
	return x
}

// check works out one check's worst case, RSS and ranking.
func (ev *evaluator) check(st *engine.Statement, ins []int) CheckSpread {
	c := CheckSpread{Stmt: st, Inputs: ins}
	c.Margin, _ = ev.at(st, ins, ev.nominal(ins))
	c.Ranking, c.RSS = ev.sensitivities(st, ins)
	worst, method := ev.extreme(st, ins, c.Ranking, -1)
	c.WorstAt, c.Method = worst, method
	ev.at(st, ins, worst)
	c.Worst = ev.p.Results(ev.f)[st.Index]
	return c
}

// result works out one result's extremes, RSS and ranking.
func (ev *evaluator) result(st *engine.Statement, ins []int) ResultSpread {
	r := ResultSpread{Stmt: st}
	r.Ranking, r.RSS = ev.sensitivities(st, ins)
	lo, _ := ev.extreme(st, ins, r.Ranking, -1)
	hi, _ := ev.extreme(st, ins, r.Ranking, +1)
	r.Min, _ = ev.at(st, ins, lo)
	r.Max, _ = ev.at(st, ins, hi)
	return r
}

// extreme finds the inputs' values within their limits at which a
// statement's value is least (dir −1) or greatest (+1): over every corner
// of the limits, with each input's interior turning point where its
// effect is not monotonic; by the sensitivities' signs for a statement on
// more inputs than the corners can be enumerated for.
func (ev *evaluator) extreme(st *engine.Statement, ins []int, sens []Sensitivity, dir float64) ([]float64, string) {
	if len(ins) <= maxCorners && ev.runs+(1<<len(ins))+len(ins)*(interiorSteps+1) > ev.budget {
		ev.partial = true
	}
	if len(ins) > maxCorners || ev.partial {
		return ev.bySigns(ins, sens, dir), "sensitivities"
	}
	cands, interior := ev.candidates(st, ins, dir)
	if combos(cands) > maxCombinations {
		return ev.bySigns(ins, sens, dir), "sensitivities"
	}
	best, bestV := []float64(nil), math.Inf(-1)
	x := make([]float64, len(ins))
	var walk func(k int)
	walk = func(k int) {
		if k == len(ins) {
			v, ok := ev.at(st, ins, x)
			if !ok {
				v = math.Inf(1) // a combination with no value is worst
			} else {
				v *= dir
			}
			if best == nil || v > bestV {
				best, bestV = slices.Clone(x), v
			}
			return
		}
		for _, c := range cands[k] {
			x[k] = c
			walk(k + 1)
		}
	}
	walk(0)
	if interior {
		return best, "corners and interior points"
	}
	return best, "corners"
}

// interiorSteps are the points across an input's band at which its effect
// is probed for a turn.
const interiorSteps = 8

// candidates lists, for each input, the values the extreme search tries:
// its limits, and where its effect turns within the band (the other
// inputs as written), the probe point where the value is most extreme.
func (ev *evaluator) candidates(st *engine.Statement, ins []int, dir float64) ([][]float64, bool) {
	x := ev.nominal(ins)
	out := make([][]float64, len(ins))
	interior := false
	for k, i := range ins {
		tol := ev.inputs[i].Tol
		out[k] = []float64{tol.Lo, tol.Hi}
		var vals []float64
		for j := 0; j <= interiorSteps; j++ {
			x[k] = tol.Lo + (tol.Hi-tol.Lo)*float64(j)/interiorSteps
			v, _ := ev.at(st, ins, x)
			vals = append(vals, v)
		}
		x[k] = ev.nom[i]
		if at, turns := turning(vals, dir); turns {
			out[k] = append(out[k], tol.Lo+(tol.Hi-tol.Lo)*float64(at)/interiorSteps)
			interior = true
		}
	}
	return out, interior
}

// turning reports whether values along a band change direction, and the
// interior probe where they are most extreme in direction dir.
func turning(vals []float64, dir float64) (int, bool) {
	up, down := false, false
	for j := 1; j < len(vals); j++ {
		d := vals[j] - vals[j-1]
		up, down = up || d > 0, down || d < 0
	}
	if !(up && down) {
		return 0, false
	}
	at := 1
	for j := 1; j < len(vals)-1; j++ {
		if vals[j]*dir > vals[at]*dir {
			at = j
		}
	}
	return at, true
}

// quantile returns the inverse of an input's distribution: a uniform
// draw in (0, 1) gives a sample of the input.
func quantile(t *engine.Tolerance, nominal float64) func(u float64) float64 {
	switch t.Dist {
	case engine.Normal:
		return distuv.Normal{Mu: nominal, Sigma: t.Sigma}.Quantile
	case engine.Triangular:
		return distuv.NewTriangle(t.Lo, t.Hi, nominal, nil).Quantile
	}
	return distuv.Uniform{Min: t.Lo, Max: t.Hi}.Quantile
}

// bySigns puts each input at the limit its slope says moves the value in
// direction dir.
func (ev *evaluator) bySigns(ins []int, sens []Sensitivity, dir float64) []float64 {
	x := ev.nominal(ins)
	for k, i := range ins {
		for _, s := range sens {
			if s.Input != ev.inputs[i] {
				continue
			}
			if s.Slope*dir > 0 {
				x[k] = ev.inputs[i].Tol.Hi
			} else {
				x[k] = ev.inputs[i].Tol.Lo
			}
		}
	}
	return x
}
