// Package fixity finds the checks of a sheet that cannot fail: checks whose
// outcome does not depend on the inputs they rest on, such as an identity
// (both sides the same algebra) or a fixed ratio (4.44 against √2·π). It
// re-runs the sheet's compiled program with every input varied and looks
// at how each check's sides move; a check whose sides keep their ratio, or
// their difference, under every variation is fixed. A fixed check proves
// nothing about the design, so the pages show it apart from the passes.
package fixity

import (
	"math"

	"github.com/sheaf-calc/sheaf/engine"
)

// factors are the multipliers each input is varied by, one at a time and
// all together: spread wide, so that a step function (round, floor, a
// table row) is moved too, and irrational-looking, so that no two inputs
// move in step by chance.
var factors = []float64{0.61803, 0.87267, 1.17721, 1.41421, 1.93185}

// joint are the seeds of the runs that vary every input at once.
const joint = 3

// tolerance is the relative change below which a ratio or a difference
// has not moved: looser than a solve's convergence, far tighter than any
// real dependence on a 13 % change of an input.
const tolerance = 1e-7

// Outcome says what the variation showed about one check.
type Outcome struct {
	// Fixed is set when the check's outcome cannot depend on its inputs.
	Fixed bool
	// Holds is the outcome it always has.
	Holds bool
}

// Find varies the inputs of a compiled, evaluated sheet and returns the
// fixed checks among its passing and failing ones. It must run before the
// sheet's Release. It is deterministic: the same sheet gives the same
// answer.
func Find(calc *engine.Calc) map[*engine.Statement]Outcome {
	p := calc.Program()
	base := p.NewFrame()
	p.Run(base, nil)
	checks := probes(calc, base)
	if len(checks) == 0 {
		return nil
	}
	slots := inputSlots(calc, base)
	varyEach(p, base, slots, checks)
	varyTogether(p, base, slots, checks)
	out := map[*engine.Statement]Outcome{}
	for _, c := range checks {
		// A check is fixed only when every input it rests on was varied in
		// a run that evaluated it, and neither its ratio nor its
		// difference ever moved.
		if len(c.need) == 0 && (c.ratio || c.diff) {
			out[c.st] = Outcome{Fixed: true, Holds: c.holds}
		}
	}
	return out
}

// probes readies every check that came to a verdict in base, with the
// inputs it rests on.
func probes(calc *engine.Calc, base *engine.Frame) []*probe {
	var checks []*probe
	for _, st := range calc.Statements {
		s := base.Status[st.Index]
		if st.Kind != engine.Check || (s != engine.Pass && s != engine.Fail) {
			continue
		}
		ins, _ := calc.RestsOn(st)
		c := &probe{st: st, l: base.Left[st.Index], r: base.Right[st.Index], holds: s == engine.Pass,
			need: map[int]bool{}, ratio: true, diff: true}
		for _, in := range ins {
			c.need[in.Index] = true
		}
		checks = append(checks, c)
	}
	return checks
}

// varyEach varies each input alone by every factor. An input is varied
// only when a check rests on it, and only those checks are read: a sheet
// of many inputs and many checks costs the sum of their dependencies, not
// their product.
func varyEach(p *engine.Program, base *engine.Frame, slots []int, checks []*probe) {
	users := map[int][]*probe{}
	for _, c := range checks {
		for slot := range c.need {
			users[slot] = append(users[slot], c)
		}
	}
	one := make([]engine.Set, 1) // reused: a run does not keep it
	for _, slot := range slots {
		if len(users[slot]) == 0 {
			continue
		}
		orig := base.Values[slot]
		for _, f := range factors {
			one[0] = engine.Set{Slot: slot, SI: varied(orig, f)}
			p.Run(base, one)
			for _, c := range users[slot] {
				if c.observe(base) {
					delete(c.need, slot) // varied in a run that evaluated
				}
			}
			one[0] = engine.Set{Slot: slot, SI: orig}
			p.Run(base, one)
		}
	}
}

// varyTogether varies every input at once, by seeded pseudo-random
// factors, to catch sides that move only when two inputs move together.
func varyTogether(p *engine.Program, base *engine.Frame, slots []int, checks []*probe) {
	rng := uint64(0x5eaf)
	sets, restore := make([]engine.Set, len(slots)), make([]engine.Set, len(slots))
	for range joint {
		for i, slot := range slots {
			rng = rng*6364136223846793005 + 1442695040888963407 // Knuth's MMIX generator
			f := 0.6 + 1.3*float64(rng>>11)/(1<<53)
			sets[i] = engine.Set{Slot: slot, SI: varied(base.Values[slot], f)}
			restore[i] = engine.Set{Slot: slot, SI: base.Values[slot]}
		}
		p.Run(base, sets)
		for _, c := range checks {
			c.observe(base)
		}
		p.Run(base, restore)
	}
}

// probe is one check under variation.
type probe struct {
	st          *engine.Statement
	l, r        float64
	holds       bool
	need        map[int]bool // inputs not yet varied in a run that evaluated
	ratio, diff bool         // whether the ratio, the difference, has kept still
}

// observe compares the check's sides in f with its own; it reports
// whether the run evaluated the check.
func (c *probe) observe(f *engine.Frame) bool {
	i := c.st.Index
	if s := f.Status[i]; s != engine.Pass && s != engine.Fail {
		return false // the varied inputs left the model's range: no evidence
	}
	l, r := f.Left[i], f.Right[i]
	if c.ratio && !sameRatio(c.l, c.r, l, r) {
		c.ratio = false
	}
	if c.diff && !same(c.l-c.r, l-r, scale(c.l, c.r, l, r)) {
		c.diff = false
	}
	return true
}

func sameRatio(l0, r0, l, r float64) bool {
	if r0 == 0 || r == 0 {
		return l0 == 0 && l == 0 && r0 == 0 && r == 0
	}
	a, b := l0/r0, l/r
	return same(a, b, math.Max(math.Abs(a), math.Abs(b)))
}

func same(a, b, scale float64) bool {
	return a == b || math.Abs(a-b) <= tolerance*scale
}

func scale(v ...float64) float64 {
	m := 0.0
	for _, x := range v {
		m = math.Max(m, math.Abs(x))
	}
	return m
}

// varied is an input's value times f; a zero, which no factor moves, is
// moved off zero by f−1 in its SI unit.
func varied(v, f float64) float64 {
	if v == 0 {
		return f - 1
	}
	return v * f
}

// inputSlots lists the slots of the sheet's inputs and taken results that
// evaluated, in the order written: the values a variation may move.
func inputSlots(calc *engine.Calc, f *engine.Frame) []int {
	var out []int
	p := calc.Program()
	for _, st := range calc.Statements {
		if f.Status[st.Index] != engine.OK {
			continue
		}
		if st.IsInput() {
			if slot, ok := p.Input(st.Name); ok && slot == st.Index {
				out = append(out, slot)
			}
		} else if st.Kind == engine.Take {
			out = append(out, st.Index) // a take's slot is its index, as an input's is
		}
	}
	return out
}
