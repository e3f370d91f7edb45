package engine

import (
	"fmt"
	"math"
	"slices"

	"github.com/sheaf-calc/sheaf/diag"
)

// Program is a sheet compiled for evaluation: the statements in evaluation
// order with their compiled code, and the table of input slots. It does not
// change once built, so many goroutines may run one Program, each with a
// Frame of its own: a load case, a sweep point, a Monte Carlo sample.
type Program struct {
	stmts   []*Statement // by slot
	steps   []step
	initial []Status // each statement's status before any run
	inputs  map[string]int
	// after lists, for each statement's slot, the steps that depend on it,
	// directly or not, in evaluation order.
	after [][]int32
	// stepOf maps a slot to its step, or -1 for a statement that is not
	// evaluated (an error, a use, a parameter).
	stepOf []int32
	// lists is the number of list elements a frame holds after the
	// statements' slots.
	lists int
}

// step is one statement's compiled code.
type step struct {
	st        *Statement
	slot      int
	deps      []int // slots of the statements it uses
	fn, right evalFn
}

// Frame holds the results of one run of a Program: a value, a status and,
// for checks, both sides, by statement slot, all in coherent SI. Values
// goes on past the slots with the elements of the sheet's lists, each at
// a place fixed when the sheet was checked; a list statement's own slot
// holds its length.
type Frame struct {
	Values      []float64
	Status      []Status
	Left, Right []float64
	// Errs holds each failed or blocked statement's reason.
	Errs []*diag.Diagnostic

	ran   bool
	evals int    // steps evaluated, for tests
	bad   int    // statements not ok, pass or fail: while 0, no step checks its inputs
	dirty []bool // by step, during an incremental run
}

// Set is one input's value for a run, in coherent SI.
type Set struct {
	Slot int
	SI   float64
}

// buildProgram collects the compiled statements of a checked sheet.
func (s *Calc) buildProgram() *Program {
	n := len(s.Statements)
	p := &Program{stmts: s.Statements, initial: make([]Status, n), inputs: map[string]int{}, stepOf: make([]int32, n), after: make([][]int32, n), lists: s.lists.used}
	for i, st := range s.Statements {
		p.initial[i] = st.Verdict
		p.stepOf[i] = -1
		// A list input keeps its length: a run sets single values only.
		if st.Kind == Definition && st.Name != "" && st.IsInput() && st.compiled && !st.Type.IsList() && !st.Type.IsComplex() {
			p.inputs[st.Name] = i
		}
	}
	for _, st := range s.Order {
		if !st.compiled {
			continue
		}
		k := step{st: st, slot: st.slot, fn: st.fn, right: st.right}
		for _, d := range st.Deps {
			k.deps = append(k.deps, d.slot)
		}
		p.stepOf[st.slot] = int32(len(p.steps))
		p.steps = append(p.steps, k)
	}
	// A step depends on what its inputs depend on; steps come in
	// evaluation order, so one pass forwards gathers every slot's users.
	reach := make([][]int32, n) // slot -> slots it rests on, sorted
	for ki, k := range p.steps {
		var all []int32
		for _, d := range k.deps {
			all = append(all, int32(d))
			all = append(all, reach[d]...)
		}
		slices.Sort(all)
		all = slices.Compact(all)
		reach[k.slot] = all
		for _, d := range all {
			p.after[d] = append(p.after[d], int32(ki))
		}
	}
	return p
}

// Steps returns the number of statements a first run evaluates: the
// measure of one run's work.
func (p *Program) Steps() int { return len(p.steps) }

// Input returns the slot of the input with this name.
func (p *Program) Input(name string) (int, bool) {
	slot, ok := p.inputs[name]
	return slot, ok
}

// NewFrame returns a frame that has not run.
func (p *Program) NewFrame() *Frame {
	n := len(p.initial)
	f := &Frame{Values: make([]float64, n+p.lists), Status: slices.Clone(p.initial), Left: make([]float64, n), Right: make([]float64, n),
		Errs: make([]*diag.Diagnostic, n), dirty: make([]bool, len(p.steps))}
	for _, st := range f.Status {
		if !settled(st) {
			f.bad++
		}
	}
	return f
}

func settled(s Status) bool { return s == OK || s == Pass || s == Fail }

// Run evaluates the program into f with the inputs given. A frame's first
// run evaluates everything; later runs keep the frame's values and
// evaluate only what depends on the inputs given, so that a sweep point or
// a preview edit costs only the statements it moves. Inputs set once stay
// set in the frame.
func (p *Program) Run(f *Frame, sets []Set) {
	for _, s := range sets {
		f.Values[s.Slot] = s.SI
		p.setStatus(f, s.Slot, OK)
		f.Errs[s.Slot] = nil
	}
	if !f.ran {
		f.ran = true
		for ki := range p.steps {
			if !isSet(sets, p.steps[ki].slot) {
				p.eval(f, ki)
			}
		}
		return
	}
	for _, s := range sets {
		for _, ki := range p.after[s.Slot] {
			f.dirty[ki] = true
		}
	}
	for ki := range p.steps {
		if f.dirty[ki] {
			f.dirty[ki] = false
			p.eval(f, ki)
		}
	}
}

func isSet(sets []Set, slot int) bool {
	for _, s := range sets {
		if s.Slot == slot {
			return true
		}
	}
	return false
}

func (p *Program) setStatus(f *Frame, slot int, s Status) {
	if settled(f.Status[slot]) != settled(s) {
		if settled(s) {
			f.bad--
		} else {
			f.bad++
		}
	}
	f.Status[slot] = s
}

// eval evaluates one step. A statement whose inputs failed is blocked; one
// whose result is not a finite number fails with the reason at the
// operation that produced it.
func (p *Program) eval(f *Frame, ki int) {
	k := &p.steps[ki]
	f.evals++
	if f.bad > 0 {
		for _, d := range k.deps {
			if f.Status[d] != OK {
				p.block(f, k, d)
				return
			}
		}
	}
	st := k.st
	switch {
	case st.Kind == Check:
		p.evalCheck(f, k)
	case st.solve != nil:
		root, d := p.solveRoot(f, st)
		if d != nil {
			p.fail(f, k.slot, d)
			return
		}
		f.Values[k.slot] = root
		p.setStatus(f, k.slot, OK)
		f.Errs[k.slot] = nil
	default:
		v := k.fn(f.Values)
		if !finite(v) {
			p.fail(f, k.slot, diagnose(st.Expr, f.Values))
			return
		}
		f.Values[k.slot] = v
		p.setStatus(f, k.slot, OK)
		f.Errs[k.slot] = nil
	}
}

func (p *Program) block(f *Frame, k *step, dep int) {
	p.setStatus(f, k.slot, Blocked)
	f.Errs[k.slot] = &diag.Diagnostic{Pos: k.st.Pos, Message: fmt.Sprintf("not evaluated: it uses %s, which has an error", p.stmts[dep].Name)}
}

func (p *Program) fail(f *Frame, slot int, d *diag.Diagnostic) {
	p.setStatus(f, slot, Errored)
	f.Errs[slot] = d
}

func (p *Program) evalCheck(f *Frame, k *step) {
	cmp := k.st.Compare()
	l, r := k.fn(f.Values), k.right(f.Values)
	if !finite(l) {
		p.fail(f, k.slot, diagnose(cmp.X, f.Values))
		return
	}
	if !finite(r) {
		p.fail(f, k.slot, diagnose(cmp.Y, f.Values))
		return
	}
	f.Left[k.slot], f.Right[k.slot] = l, r
	f.Errs[k.slot] = nil
	if holds(cmp.Op, l, r) {
		p.setStatus(f, k.slot, Pass)
	} else {
		p.setStatus(f, k.slot, Fail)
	}
}

// holds reports whether a check's relation holds between its sides.
func holds(op string, l, r float64) bool {
	switch op {
	case "<":
		return l < r
	case "<=":
		return l <= r
	case ">":
		return l > r
	case ">=":
		return l >= r
	case "==":
		return l == r || math.Abs(l-r) <= EqualTolerance*math.Max(math.Abs(l), math.Abs(r))
	}
	return false
}
