package engine

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// The conditions a design must survive: named load cases (sets of input
// values), sweeps of one input over a range, and tolerances on inputs.
// The engine reads and checks them; package conditions runs the sheet's
// Program over them.

// Limits of the conditions of one sheet. A sweep's points are bounded like
// a list; the sample count keeps a Monte Carlo run of a large sheet within
// seconds.
const (
	MaxCases       = 64
	MaxSweepPoints = MaxListLength
	MaxSamples     = 1_000_000
	// DefaultSamples and DefaultSeed apply to a sheet with tolerances and
	// no sample statement.
	DefaultSamples = 10_000
	DefaultSeed    = 1
	// MaxTolerances bounds the toleranced inputs of one sheet, and
	// MaxConditionWork the statements evaluated over all its cases, sweep
	// points and samples: about ten seconds of work.
	MaxTolerances    = 64
	MaxConditionWork = 500_000_000
)

// Condition is what a case, sweep or sample statement declares, once
// checked.
type Condition struct {
	// Sets are a case's inputs with their values, in the order written.
	Sets []CaseSet

	// Input is the input a sweep varies, Points its values in SI, In the
	// case it runs in (nil for the sheet as written), Show the results it
	// gathers.
	Input             *Statement
	InputName, InName string
	InputPos, InPos   diag.Pos
	Points            []float64
	In                *Statement
	Show              []*Statement
	// Governs is set for a sweep, whose checks must hold at every point,
	// and not for a curve, which only draws its results against the
	// input (a characteristic, such as the open-circuit one).
	Governs   bool
	showNames []string
	showPos   []diag.Pos
	points    Expr
	pointsPos diag.Pos

	// Samples and Seed are a sample statement's Monte Carlo count and seed.
	Samples int
	Seed    uint64
}

// Word is a sweep statement's keyword: sweep, or curve for one that
// governs no check.
func (c *Condition) Word() string {
	if c.Governs {
		return "sweep"
	}
	return "curve"
}

// IsCondition reports whether a statement declares a condition rather
// than a value: a case, a sweep or a sample statement.
func (s *Statement) IsCondition() bool {
	return s.Kind == Case || s.Kind == Sweep || s.Kind == Sampling
}

// CaseSet is one input a case sets: the input and its value in SI.
type CaseSet struct {
	Input *Statement
	SI    float64
	Text  string // the value as written
}

// Distribution is how a toleranced input spreads over its band.
type Distribution uint8

// The distributions. Band is a tolerance written without one: worst case
// and root-sum-square read its limits, and sampling spreads it evenly.
const (
	Band Distribution = iota
	Uniform
	Triangular
	Normal
)

func (d Distribution) String() string {
	return [...]string{"band", "uniform", "triangular", "normal"}[d]
}

// Tolerance is the spread of an input: its limits in SI and how it is
// distributed between them. A normal input's limits are its mean ∓ 3σ,
// where a tolerance stack reads a normal spread (common practice).
type Tolerance struct {
	Dist   Distribution
	Lo, Hi float64
	Sigma  float64 // SI, for a normal input
	Text   string  // as written: "± 0.2 mm", "± 5 %", "in 3.8 mm .. 4.3 mm", "± σ 0.05 mm"
	Pos    diag.Pos

	form     string // "±", "in" or "σ"
	a, b     Expr
	relative bool // ± written in % on an input that is not itself in %
}

// HalfWidth is the deviation from the nominal value to the limit on the
// side of dir (+1 up, −1 down).
func (t *Tolerance) HalfWidth(nominal float64, dir float64) float64 {
	if dir >= 0 {
		return t.Hi - nominal
	}
	return nominal - t.Lo
}

// caseName reads a case or sweep name: letters, digits, _ and -, from a
// letter.
func caseName(r []rune, i int) (string, int) {
	if i >= len(r) || !unicode.IsLetter(r[i]) {
		return "", i
	}
	j := i + 1
	for j < len(r) && (unicode.IsLetter(r[j]) || unicode.IsDigit(r[j]) || r[j] == '_' || r[j] == '-') {
		j++
	}
	return string(r[i:j]), j
}

// conditionHead reports whether r[i:end] starts a case or sweep statement:
// the word, a name and a colon.
func conditionHead(r []rune, i, end int) bool {
	w, j := word(r, i)
	if (w != "case" && w != "sweep" && w != "curve") || j >= end || !unicode.IsSpace(r[j]) {
		return false
	}
	_, k := caseName(r, skipSpace(r, j))
	k = skipSpace(r, k)
	return k < end && r[k] == ':'
}

// parseCase reads `case name: input = value, input = value`.
func parseCase(st *Statement, t *text, i, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = Case
	_, j := word(r, i)
	j = skipSpace(r, j)
	st.Name, j = caseName(r, j)
	st.NamePos = t.pos(skipSpace(r, i+4))
	j = skipSpace(r, j) + 1 // past the colon
	st.Formula = strings.TrimSpace(string(r[j:end]))
	if st.Formula == "" {
		return errAt(t.pos(j), "write the inputs it sets: case "+st.Name+": I_f = 45.5 A, cos_phi = 0.8", "case %s sets no input", st.Name)
	}
	return parseOverrides(st, t, j, end)
}

// parseSweep reads `sweep name: input over points [in case] [show a, b]`,
// or the same with curve for a characteristic that governs no check.
func parseSweep(st *Statement, t *text, i, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = Sweep
	const example = "write for example: sweep occ: I_f over 0 A .. 80 A by 2 A show E_0, B_pb"
	_, j := word(r, i)
	j = skipSpace(r, j)
	st.NamePos = t.pos(j)
	st.Name, j = caseName(r, j)
	j = skipSpace(r, j) + 1
	st.Formula = strings.TrimSpace(string(r[j:end]))
	w, _ := word(r, i)
	c := &Condition{Governs: w == "sweep"}
	st.Cond = c
	j = skipSpace(r, j)
	c.InputPos = t.pos(j)
	c.InputName, j = qualified(r, j)
	if c.InputName == "" {
		return errAt(t.pos(j), example, "a sweep needs the input it varies")
	}
	j = skipSpace(r, j)
	if w, k := word(r, j); w != "over" {
		return errAt(t.pos(j), example, "expected over after the swept input %s", c.InputName)
	} else {
		j = k
	}
	inAt, showAt := topLevelWord(r, j, end, "in"), topLevelWord(r, j, end, "show")
	stop := min(inAt, showAt)
	if skipSpace(r[:stop], j) == stop {
		return errAt(t.pos(j), example, "the sweep has no points after over")
	}
	e, err := parseFormula(t, j, stop)
	if err != nil {
		return err
	}
	c.points, c.pointsPos = e, t.pos(skipSpace(r, j))
	if inAt < end {
		k := skipSpace(r, inAt+2)
		c.InPos = t.pos(k)
		c.InName, k = caseName(r, k)
		if c.InName == "" {
			return errAt(c.InPos, "name a case of the sheet after in", "expected a case after in")
		}
		if k = skipSpace(r, k); k < showAt {
			return errAt(t.pos(k), example, "unexpected text after the case")
		}
	}
	if showAt < end {
		return parseShow(c, t, showAt+4, end)
	}
	return nil
}

// parseShow reads the names a sweep gathers.
func parseShow(c *Condition, t *text, j, end int) *diag.Diagnostic {
	r := t.runes
	for j < end {
		j = skipSpace(r, j)
		n, k := qualified(r, j)
		if n == "" {
			return errAt(t.pos(j), "name the results to gather, separated by commas", "expected a result's name after show")
		}
		c.showNames, c.showPos = append(c.showNames, n), append(c.showPos, t.pos(j))
		k = skipSpace(r, k)
		if k < end && r[k] != ',' {
			return errAt(t.pos(k), "separate the results with commas", "unexpected text after %s", n)
		}
		j = k + 1
	}
	return nil
}

// topLevelWord returns the offset of the word w in r[from:end] outside
// parentheses and brackets, or end.
func topLevelWord(r []rune, from, end int, w string) int {
	return topLevel(r, from, end, func(k int) bool { return wordAt(r, k, end, w) })
}

// wordAt reports whether the word w stands at r[i], not inside a name.
func wordAt(r []rune, i, end int, w string) bool {
	n := len(w) // the words looked for are ASCII
	return i+n <= end && string(r[i:i+n]) == w && (i == 0 || !isIdentPart(r[i-1])) && (i+n == end || !isIdentPart(r[i+n]))
}

// parseSampling reads `sample N times` or `sample N times, seed S`.
func parseSampling(st *Statement, t *text, i, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = Sampling
	const example = "write for example: sample 20000 times, seed 7"
	st.Formula = strings.TrimSpace(string(r[i:end]))
	f := strings.Fields(strings.ReplaceAll(st.Formula, ",", " , "))
	if len(f) < 3 || f[2] != "times" || !(len(f) == 3 || len(f) == 6 && f[3] == "," && f[4] == "seed") {
		return errAt(st.Pos, example, "a sample statement gives the Monte Carlo count and, if wanted, the seed")
	}
	n, err := strconv.Atoi(strings.ReplaceAll(f[1], "_", ""))
	at := t.pos(skipSpace(r, i+6))
	if err != nil || n < 1 {
		return errAt(at, example, "%s is not a whole number of samples", f[1])
	}
	if n > MaxSamples {
		return errAt(at, "sample at most "+strconv.Itoa(MaxSamples)+" times; the probability of failure is then known to about 0.1 percentage point",
			"%d samples are more than the limit of %d for one sheet", n, MaxSamples)
	}
	c := &Condition{Samples: n, Seed: DefaultSeed}
	if len(f) == 6 {
		s, err := strconv.ParseUint(f[5], 10, 64)
		if err != nil {
			return errAt(st.Pos, example, "the seed %s is not a whole number", f[5])
		}
		c.Seed = s
	}
	st.Cond = c
	return nil
}

// splitTolerance finds where a definition's tolerance starts in r[i:end]:
// at ± (or +/-) or the word in, outside parentheses; end when there is
// none.
func splitTolerance(r []rune, i, end int) int {
	return topLevel(r, i, end, func(k int) bool {
		return r[k] == '±' || k+2 < end && string(r[k:k+3]) == "+/-" || wordAt(r, k, end, "in")
	})
}

const toleranceExample = "write for example: g = 4.0 mm ± 0.2 mm, mu_r = 1300 ± 15 %, g = 4.0 mm in 3.8 mm .. 4.3 mm, or E = 200 GPa ± σ 5 GPa"

// parseTolerance reads the tolerance of an input from r[k:end]: ± a
// deviation, with uniform, triangular or normal after it (a normal ± is
// 3σ), ± σ and the standard deviation, or in lower .. upper.
func parseTolerance(st *Statement, t *text, k, end int) *diag.Diagnostic {
	r := t.runes
	tol := &Tolerance{Text: strings.TrimSpace(string(r[k:end])), Pos: t.pos(k)}
	st.Tol = tol
	if r[k] == 'i' {
		return parseLimits(tol, t, k+2, end)
	}
	tol.form = "±"
	from := k + 1
	if r[k] == '+' {
		from = k + 3
	}
	from = skipSpace(r[:end], from)
	if w, j := word(r, from); w == "σ" || w == "sigma" {
		tol.form, tol.Dist, from = "σ", Normal, j
	}
	stop := end
	if tol.form == "±" {
		var err *diag.Diagnostic
		if stop, err = distributionWord(tol, t, from, end); err != nil {
			return err
		}
	}
	e, err := toleranceValue(t, from, stop)
	tol.a = e
	return err
}

// parseLimits reads `lower .. upper` from r[from:end].
func parseLimits(tol *Tolerance, t *text, from, end int) *diag.Diagnostic {
	r := t.runes
	tol.form = "in"
	dots := -1
	for j := from; j+1 < end; j++ {
		if r[j] == '.' && r[j+1] == '.' {
			dots = j
			break
		}
	}
	if dots < 0 {
		return errAt(tol.Pos, toleranceExample, "limits are written lower .. upper")
	}
	a, err := toleranceValue(t, from, dots)
	if err != nil {
		return err
	}
	stop, err := distributionWord(tol, t, dots+2, end)
	if err != nil {
		return err
	}
	b, err := toleranceValue(t, dots+2, stop)
	tol.a, tol.b = a, b
	return err
}

// distributionWord finds a distribution written after a tolerance's
// value in r[from:end], sets it, and returns where the value ends.
func distributionWord(tol *Tolerance, t *text, from, end int) (int, *diag.Diagnostic) {
	r := t.runes
	stop := end
	for _, d := range []Distribution{Uniform, Triangular, Normal} {
		if at := topLevelWord(r, from, end, d.String()); at < stop {
			stop, tol.Dist = at, d
			if skipSpace(r[:end], at+len(d.String())) != end {
				return stop, errAt(t.pos(at), toleranceExample, "unexpected text after %s", d)
			}
		}
	}
	return stop, nil
}

// toleranceValue parses one value of a tolerance.
func toleranceValue(t *text, from, to int) (Expr, *diag.Diagnostic) {
	if skipSpace(t.runes[:to], from) == to {
		return nil, errAt(t.pos(min(from, len(t.runes)-1)), toleranceExample, "the tolerance has no value")
	}
	return parseFormula(t, from, to)
}

// constValue checks an expression that must be a fixed value: numbers,
// quantities, built-in constants and arithmetic over them.
func constValue(e Expr, what string) (*Type, *diag.Diagnostic) {
	var err *diag.Diagnostic
	walkAll(e, func(n Expr) {
		if r, ok := n.(*Ref); ok && err == nil {
			if c, ok := units.ConstantByName(r.Name); ok {
				r.Constant = &c
				return
			}
			err = errAt(r.Pos(), "write "+what+" as a number with its unit", "%s is a fixed value; %s is a name of the sheet", what, r.Name)
		}
	})
	if err != nil {
		return nil, err
	}
	if err := infer(e); err != nil {
		return nil, err
	}
	if t := e.Type(); !t.Const && !t.IsList() {
		return nil, errAt(e.Pos(), "write "+what+" as a number with its unit", "%s must be a fixed value", what)
	}
	return e.Type(), nil
}

// checkTolerance checks an input's tolerance against the input and works
// out its limits: a tolerance belongs on a value written down, in the
// input's dimension (or in % of it), and a sheet holds a bounded number.
func (s *Calc) checkTolerance(st *Statement) *diag.Diagnostic {
	tol := st.Tol
	if tol == nil {
		return nil
	}
	if s.tolerances++; s.tolerances > MaxTolerances {
		return errAt(tol.Pos, "give tolerances to the inputs that matter most, or split the sheet", "the sheet has more than %d toleranced inputs, the limit for one sheet", MaxTolerances)
	}
	if !st.IsInput() {
		return errAt(tol.Pos, "give the tolerances to the inputs "+st.Name+" is worked out from: its spread follows from theirs",
			"a tolerance on a computed value: %s is a result, not an input", st.Name)
	}
	if st.Type.IsList() || st.Type.IsComplex() {
		return errAt(tol.Pos, "give the tolerance to a single real input", "a tolerance on a list or a phasor is not supported")
	}
	nom := st.Type.Val
	a, err := toleranceSide(st, tol.a)
	if err != nil {
		return err
	}
	switch tol.form {
	case "±":
		if a <= 0 {
			return errAt(tol.a.Pos(), "write the tolerance as a deviation above zero, as ± 0.2 mm, or leave it out", "the tolerance is zero or negative")
		}
		tol.Lo, tol.Hi = nom-a, nom+a
		if tol.Dist == Normal {
			tol.Sigma = a / 3
		}
	case "σ":
		if a <= 0 {
			return errAt(tol.a.Pos(), "give σ, the standard deviation, as a positive value", "a normal distribution needs σ above zero; here it is %s", units.FormatNumber(a, 4))
		}
		tol.Sigma, tol.Lo, tol.Hi = a, nom-3*a, nom+3*a
	case "in":
		b, err := toleranceSide(st, tol.b)
		if err != nil {
			return err
		}
		if !(a <= nom && nom <= b) || a == b {
			return errAt(tol.a.Pos(), "write the limits lower .. upper, around the value written", "the limits do not enclose the input's value")
		}
		tol.Lo, tol.Hi = a, b
		if tol.Dist == Normal {
			tol.Sigma = (b - a) / 6 // the limits are ∓3σ about their middle
		}
	}
	return nil
}

// toleranceSide reads one value of a tolerance in SI: a deviation (or a
// limit) in the input's dimension, or for ± a share of the input in %.
func toleranceSide(st *Statement, e Expr) (float64, *diag.Diagnostic) {
	tt, err := constValue(e, "a tolerance")
	if err != nil {
		return 0, err
	}
	_, unit, _ := LiteralText(e)
	_, own, _ := LiteralText(st.Expr)
	if st.Tol.form == "±" && unit == "%" && own != "%" {
		st.Tol.relative = true
		return math.Abs(st.Type.Val) * tt.Val, nil
	}
	if tt.Dim != st.Type.Dim {
		return 0, errAt(e.Pos(), "give the tolerance in the input's unit, or in %",
			"the tolerance is %s, but %s is %s", units.Describe(tt.Dim), st.Name, units.Describe(st.Type.Dim))
	}
	if st.Tol.form != "in" && tt.Kind.IsAbsTemp() {
		return 0, errAt(e.Pos(), "write a deviation of temperature in K: ± 5 K", "a deviation of temperature is written in K, not as a temperature")
	}
	op := "+" // a deviation adds to the value; limits compare with it
	if st.Tol.form == "in" {
		op = "=="
	}
	if err := kindsAgree(op, st, tt, e.Pos()); err != nil {
		return 0, err
	}
	return tt.Val, nil
}

// kindsAgree checks that a value written for an input (a case's value, a
// sweep's points, a tolerance) is of the input's kind: 157 rad/s is not a
// speed in rpm, whatever their SI numbers.
func kindsAgree(op string, in *Statement, t *Type, at diag.Pos) *diag.Diagnostic {
	if _, err := addKinds(op, in.Type.Kind, t.Kind); err != nil {
		err.Pos = at
		err.Message = in.Name + ": " + err.Message
		if _, unit, ok := LiteralText(in.Expr); ok && unit != "" {
			err.Hint = "write it in " + unit + ", as " + in.Name + " is written, or in a unit of the same kind"
		}
		return err
	}
	return nil
}

// checkConditions checks the sheet's cases, sweeps and sample statement
// once every input is checked: a case sets inputs to fixed values of
// their dimensions, a sweep varies an input over points of its dimension.
func (s *Calc) checkConditions() {
	named := map[string]*Statement{}
	var sampling *Statement
	for _, st := range s.Statements {
		if st.Verdict == Errored || st.Instance != "" && st.Kind == Sampling {
			continue // a template's sample count is the using sheet's to set
		}
		switch st.Kind {
		case Case, Sweep:
			if first, dup := named[st.Name]; dup {
				s.fail(st, errAt(st.NamePos, "give each case and sweep its own name", "%s is already the name of the %s at %d:%d", st.Name, kindWord(first.Kind), first.NamePos.Line, first.NamePos.Col))
				continue
			}
			named[st.Name] = st
		case Sampling:
			if sampling != nil {
				s.fail(st, errAt(st.Pos, "keep one sample statement", "the sheet already gives its sample count at %d:%d", sampling.Pos.Line, sampling.Pos.Col))
				continue
			}
			sampling = st
		}
	}
	// Cases first, so that a sweep run in a case finds it checked.
	cases, work := 0, 0
	for _, kind := range []StmtKind{Case, Sweep} {
		for _, st := range s.Statements {
			if st.Verdict == Errored || st.Kind != kind {
				continue
			}
			var err *diag.Diagnostic
			if kind == Case {
				if cases++; cases > MaxCases {
					err = errAt(st.NamePos, "split the cases over several sheets", "the sheet has more than %d cases, the limit for one sheet", MaxCases)
				} else {
					err = s.checkCase(st)
				}
				work += len(s.Statements)
			} else if err = s.checkSweep(st, named); err == nil {
				work += len(st.Cond.Points) * len(s.Statements)
			}
			if err == nil && work > MaxConditionWork {
				err = errAt(st.NamePos, "use fewer points or cases, or split the sheet", "the sheet's cases and sweeps evaluate more than %d statements in all, the limit for one sheet", MaxConditionWork)
			}
			if err != nil {
				s.fail(st, err)
			} else {
				st.Verdict = OK
			}
		}
	}
	s.checkSampling(sampling)
}

// checkSampling bounds the Monte Carlo work of the sheet: its samples
// times its statements.
func (s *Calc) checkSampling(st *Statement) {
	if st == nil {
		return
	}
	if n := st.Cond.Samples; n*len(s.Statements) > MaxConditionWork {
		s.fail(st, errAt(st.Pos, fmt.Sprintf("sample at most %d times on a sheet of %d statements, or split the sheet", MaxConditionWork/len(s.Statements), len(s.Statements)),
			"%d samples of %d statements are more than %d evaluations, the limit for one sheet", n, len(s.Statements), MaxConditionWork))
		return
	}
	st.Verdict = OK
}

func kindWord(k StmtKind) string {
	if k == Sweep {
		return "sweep"
	}
	return "case"
}

// sweepable returns the input a case or sweep may set, or an error saying
// why the name is not one.
func (s *Calc) sweepable(name string, at diag.Pos, verb string) (*Statement, *diag.Diagnostic) {
	in := s.byName[name]
	switch {
	case in == nil:
		return nil, s.unknownName(&Ref{node: nodeAt(at), Name: name})
	case in.Kind != Definition || !in.IsInput():
		return nil, errAt(at, "a "+verb+" sets inputs, the names given a value; set the inputs "+name+" is worked out from",
			"%s is a result, not an input", name)
	case !in.compiled:
		return nil, errAt(at, "fix "+name+" first", "%s has an error", name)
	case in.Type.IsList() || in.Type.IsComplex():
		return nil, errAt(at, "a "+verb+" sets a single real input", "%s is a list or a phasor", name)
	}
	return in, nil
}

func nodeAt(p diag.Pos) node {
	var n node
	n.setPos(p)
	return n
}

// checkCase checks a case's inputs and values.
func (s *Calc) checkCase(st *Statement) *diag.Diagnostic {
	c := &Condition{}
	for _, o := range st.Overrides {
		in, err := s.sweepable(o.Name, o.NamePos, "case")
		if err != nil {
			return err
		}
		t, err := constValue(o.Expr, "a case's value")
		if err != nil {
			return err
		}
		if t.IsList() || t.IsComplex() {
			return errAt(o.Expr.Pos(), "give one real value", "a case sets %s to one value", o.Name)
		}
		if t.Dim != in.Type.Dim {
			return errAt(o.Expr.Pos(), "give "+o.Name+" a value in its own dimension",
				"%s is %s, but this value is %s", o.Name, units.Describe(in.Type.Dim), units.Describe(t.Dim))
		}
		if err := kindsAgree("==", in, t, o.Expr.Pos()); err != nil {
			return err
		}
		c.Sets = append(c.Sets, CaseSet{Input: in, SI: t.Val, Text: o.Formula})
	}
	st.Cond = c
	return nil
}

// checkSweep checks a sweep's input, points, case and gathered results.
func (s *Calc) checkSweep(st *Statement, named map[string]*Statement) *diag.Diagnostic {
	c := st.Cond
	in, err := s.sweepable(c.InputName, c.InputPos, "sweep")
	if err != nil {
		return err
	}
	c.Input = in
	t, err := constValue(c.points, "a sweep's points")
	if err != nil {
		return err
	}
	if t.Dim != in.Type.Dim || t.IsComplex() {
		return errAt(c.pointsPos, "give the points in "+c.InputName+"'s dimension",
			"%s is %s, but the points are %s", c.InputName, units.Describe(in.Type.Dim), units.Describe(t.Dim))
	}
	if err := kindsAgree("==", in, t, c.pointsPos); err != nil {
		return err
	}
	c.Points = constPoints(c.points)
	if len(c.Points) < 2 {
		return errAt(c.pointsPos, "sweep over two points or more, as 0 A .. 80 A by 2 A",
			"the sweep has %d point; a sweep needs two or more", len(c.Points))
	}
	if len(c.Points) > MaxSweepPoints {
		return errAt(c.pointsPos, "use fewer points", "the sweep has %d points; the limit is %d", len(c.Points), MaxSweepPoints)
	}
	if c.InName != "" {
		if c.In = named[c.InName]; c.In == nil || c.In.Kind != Case {
			return errAt(c.InPos, "name a case of this sheet", "%s is not a case of the sheet", c.InName)
		}
		if c.In.Verdict == Errored {
			return errAt(c.InPos, "fix the case first", "case %s has an error", c.InName)
		}
	}
	for i, n := range c.showNames {
		r := s.byName[n]
		if r == nil {
			return s.unknownName(&Ref{node: nodeAt(c.showPos[i]), Name: n})
		}
		if r.Kind != Definition || r.IsInput() || r.Type.IsComplex() || r.Type.IsList() {
			return errAt(c.showPos[i], "show results of single real value worked out from "+c.InputName, "%s is not a single result that a sweep can gather", n)
		}
		if ins, _ := s.RestsOn(r); !containsStmt(ins, in) {
			return errAt(c.showPos[i], "show a result worked out from "+c.InputName, "%s does not depend on %s: the sweep would draw a flat line", n, c.InputName)
		}
		c.Show = append(c.Show, r)
	}
	return nil
}

// constPoints returns the SI values of a sweep's points: a single value,
// a list literal or a range.
func constPoints(e Expr) []float64 {
	switch n := e.(type) {
	case *Range:
		return n.Values
	case *ListLit:
		out := make([]float64, len(n.Elems))
		for i, el := range n.Elems {
			out[i] = el.Type().Val
		}
		return out
	}
	return []float64{e.Type().Val}
}
