package engine

import (
	"fmt"
	"math"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Kinds follow the algebra: the exponents of the radian and of the cycle
// add in products as the dimensions do (units.Kind). These are the rules
// that decide where a kind may change, and where a change means a slip.

// chain gathers the factors of a product or quotient such as k_e*2*pi*n,
// written in any order or grouping, so that its kind is decided once over
// all of them.
type chain struct {
	kind     units.Kind // exponents of every factor
	constRad int        // radians of constant angles among them (360 deg)
	c        float64    // product of the constant pure numbers and angles
	tag      units.Tag  // the power tag of the one tagged factor
	tagged   int        // factors with a power tag
	others   int        // non-constant factors without one
	dimmed   bool       // a factor with a dimension, no kind, and not a time
	mixAt    *Binary    // the operation that first put radians beside cycles
	mixL     units.Kind // the kinds it put together
	mixR     units.Kind
}

// chainKind decides the kind of the product or quotient n and refuses a
// mixture of radians and cycles that no 2π reconciles.
func chainKind(n *Binary) *diag.Diagnostic {
	ch := chain{c: 1}
	ch.walk(n, false)
	k := ch.kind
	// A constant factor (2π)^t turns t cycles into t radians (omega =
	// 2*pi*n, 360 deg * n), or back (f = omega/(2*pi)), where there is
	// something to turn; 2*pi*r stays a length.
	if turns := turnsOf(ch.c); turns != 0 {
		bare := k
		bare.Rad -= int8(ch.constRad)
		if turnable(bare, turns) {
			k = bare.Turn(turns)
		}
	}
	if k.Mixed() {
		at := n
		if ch.mixAt != nil {
			at = ch.mixAt
		}
		return mixError(at, ch.mixL, ch.mixR)
	}
	// Radians and cycles in the numerator vanish into a product with
	// another quantity, as the SI lets them and engineers rely on: ω·r is a
	// speed, 2π·f·N·Φ a voltage, π·D·n a surface speed. A time keeps them
	// (ω·t is an angle); a quantity per radian (a torque) keeps its kind.
	if ch.dimmed {
		k.Rad = min(k.Rad, 0)
		k.Cyc = min(k.Cyc, 0)
	}
	// Apparent and reactive power keep their kind through constant
	// factors; a product with another quantity (cos φ) is a plain power.
	if ch.tagged == 1 && ch.others == 0 {
		k.Tag = ch.tag
	}
	n.Type().Kind = k
	return nil
}

// walk visits the factors below e; inverse is set under a division. It
// returns the kind of e's factors without any 2π turned, to find where a
// mixture first arose.
func (ch *chain) walk(e Expr, inverse bool) units.Kind {
	if b, ok := e.(*Binary); ok && (b.Op == "*" || b.Op == "/") {
		l := ch.walk(b.X, inverse)
		r := ch.walk(b.Y, inverse != (b.Op == "/"))
		k := l.Mul(r)
		if k.Mixed() && !l.Mixed() && !r.Mixed() && ch.mixAt == nil {
			ch.mixAt, ch.mixL, ch.mixR = b, l, r
		}
		return k
	}
	t := e.Type()
	k := t.Kind.Exponents()
	if inverse {
		k = units.Plain.Div(k)
	}
	ch.kind = ch.kind.Mul(k)
	switch {
	case t.Const && t.Dim.IsDimensionless() && (k.Cyc == 0 && (k.Rad == 0 || k.Rad == 1 || k.Rad == -1)):
		v := t.Val
		if inverse {
			v = 1 / v
		}
		ch.c *= v
		ch.constRad += int(k.Rad)
		return k
	case t.Kind.IsPower() && !inverse:
		ch.tagged++
		ch.tag = t.Kind.Tag
	default:
		ch.others++
	}
	if !t.Kind.Angular() && !t.Dim.IsDimensionless() && !isTimePower(t.Dim) {
		ch.dimmed = true
	}
	return k
}

// isTimePower reports whether d is a power of time alone (s, s², 1/s).
func isTimePower(d units.Dim) bool {
	d[units.Time] = 0
	return d.IsDimensionless()
}

// turnsOf returns t when c is ±(2π)^t for t = ±1 or ±2, else 0.
func turnsOf(c float64) int {
	a := math.Abs(c)
	for _, t := range []int{1, -1, 2, -2} {
		if near(a, math.Pow(2*math.Pi, float64(t))) {
			return t
		}
	}
	return 0
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-12*math.Abs(b) }

// turnable reports whether a factor (2π)^t has something to turn in k:
// cycles to turn into radians (2π·n, 2π·T with T per radian), or radians to
// turn into cycles (ω/2π, k_E/2π with k_E per cycle).
func turnable(k units.Kind, t int) bool {
	if t > 0 {
		return k.Cyc > 0 || k.Rad < 0
	}
	return k.Rad > 0 || k.Cyc < 0
}

// mixError says where a product put radians beside cycles, and where the
// 2π goes.
func mixError(at *Binary, l, r units.Kind) *diag.Diagnostic {
	k := l.Mul(r)
	hint := "a factor 2π turns cycles into radians: write 2*pi*n for an angular velocity from a speed in rpm, " +
		"or use a constant per revolution (V/krpm) with a speed in rpm"
	if k.Rad > 0 && k.Cyc < 0 || k.Rad > 0 && k.Cyc > 0 && l.Rad > 0 {
		hint = "a factor 1/(2π) turns radians into cycles: write omega/(2*pi) for a frequency from an angular velocity, " +
			"or use a constant per radian (V·s/rad) with a speed in rad/s"
	}
	return errAt(at.Pos(), hint, "this %s mixes radians and cycles (%s with %s): a factor 2π is missing or one too many",
		map[string]string{"*": "product", "/": "quotient"}[at.Op], kindWords(l), kindWords(r))
}

// kindWords names a kind's angle part in a message.
func kindWords(k units.Kind) string {
	switch k.Exponents() {
	case units.Plain:
		return "a plain quantity"
	case units.Angle:
		return "radians"
	case units.Cycle:
		return "cycles"
	case units.PerRadian:
		return "per radian"
	case units.PerCycle:
		return "per cycle"
	}
	return k.Exponents().String()
}

// addKinds decides the kind of a sum, difference or comparison, and
// refuses mixtures that would hide a 2π, a temperature offset or a power
// factor.
func addKinds(op string, a, b units.Kind) (units.Kind, *diag.Diagnostic) {
	if a.IsAbsTemp() || b.IsAbsTemp() {
		return addTemperatures(op, a, b)
	}
	verb := "add"
	if isComparison(op) {
		verb = "compare"
	} else if op == "-" {
		verb = "subtract"
	}
	tag := a.Tag
	if a.IsPower() && b.IsPower() && a.Tag != b.Tag {
		return a, errAt(diag.Pos{}, "an active power is S*cos(phi) and a reactive power S*sin(phi); convert one side first",
			"cannot %s %s and %s", verb, a.Noun(units.Dimensionless), b.Noun(units.Dimensionless))
	} else if b.IsPower() {
		tag = b.Tag
	}
	ea, eb := a.Exponents(), b.Exponents()
	k := ea
	switch {
	case ea == eb || eb.IsPlain():
	case ea.IsPlain():
		k = eb
	case ea.Cyc != 0 && eb.Rad != 0 || ea.Rad != 0 && eb.Cyc != 0:
		return a, errAt(diag.Pos{}, "an angular velocity (rad/s) is 2π times a rotational frequency (rpm, Hz): multiply the frequency by 2*pi first",
			"cannot %s an angle-based quantity (rad) and a cycle-based one (Hz, rpm)", verb)
	default:
		return a, errAt(diag.Pos{}, "both sides must be the same kind of quantity; check the powers of rad or of the revolution",
			"cannot %s quantities of different kinds (%s and %s)", verb, ea, eb)
	}
	k.Tag = tag
	return k, nil
}

// addTemperatures is addKinds where a side is an absolute temperature.
func addTemperatures(op string, a, b units.Kind) (units.Kind, *diag.Diagnostic) {
	if a.IsAbsTemp() && b.IsAbsTemp() {
		switch op {
		case "-":
			return units.Plain, nil // the difference of two temperatures is a difference
		case "+":
			return a, errAt(diag.Pos{}, "add a temperature difference in K to a temperature in °C",
				"cannot add two absolute temperatures")
		}
		return a, nil
	}
	switch op {
	case "+":
		return units.AbsTemp, nil
	case "-":
		if a.IsAbsTemp() {
			return units.AbsTemp, nil
		}
		return a, errAt(diag.Pos{}, "subtract the temperatures the other way round, or write both in °C",
			"cannot subtract an absolute temperature from a temperature difference")
	}
	return a, errAt(diag.Pos{}, "compare absolute temperatures with absolute temperatures, and differences (K) with differences",
		"cannot compare an absolute temperature (°C or °F) with a temperature difference (K)")
}

// displayProblem says why a value of type t cannot be shown in unit u, or
// returns "" if it can. formula is a definition's right side as written,
// for the hint; "" for a check.
func displayProblem(name, formula string, t Type, u units.Unit) (msg, hint string) {
	if t.Dim != u.Dim {
		return fmt.Sprintf("display unit %s measures %s, but %s is %s", u.Symbol, units.Describe(u.Dim), name, units.Describe(t.Dim)),
			"choose a unit of the same kind, or check the formula"
	}
	v, w := t.Kind, u.Kind
	switch {
	case w.IsAbsTemp() && !v.IsAbsTemp() && t.Dim == dimTemperature:
		return fmt.Sprintf("%s is a temperature difference and cannot be shown in %s", name, u.Symbol), "show differences in K"
	case w.IsPower() && v.IsPower() && w.Tag != v.Tag:
		return fmt.Sprintf("%s is %s and cannot be shown in %s, %s", name, v.Noun(t.Dim), u.Symbol, w.Noun(t.Dim)), powerHint(v, w)
	}
	ve, we := v.Exponents(), w.Exponents()
	switch {
	case ve == we || ve.IsPlain():
		return "", ""
	case ve.Cyc != 0 && we.Rad != 0 || ve.Rad != 0 && we.Cyc != 0:
		return turnProblem(name, formula, t, u)
	case we.IsPlain() && ve.Rad < 0 && units.IsEnergyOrPower(u.Dim):
		return fmt.Sprintf("%s is %s and cannot be shown in %s", name, v.Noun(t.Dim), u.Symbol),
			"show a torque in N·m (or kN·m); an energy is a torque times an angle in radians"
	case we.IsPlain():
		return "", "" // radians and cycles may vanish where the SI lets them: ω·r is a speed
	}
	return fmt.Sprintf("%s is %s, but %s is %s", name, kindNoun(v, t.Dim), u.Symbol, kindNoun(w, u.Dim)),
		"check the formula: the powers of rad or of the revolution differ"
}

// kindNoun names a kind for a message, with a fallback for kinds that
// have no name.
func kindNoun(k units.Kind, d units.Dim) string {
	if s := k.Noun(d); s != "" {
		return s
	}
	return "a plain quantity"
}

// turnProblem explains a display unit that would add or drop a 2π, and
// shows the corrected formula.
func turnProblem(name, formula string, t Type, u units.Unit) (msg, hint string) {
	ve, we := t.Kind.Exponents(), u.Kind.Exponents()
	turns := int(we.Rad - ve.Rad)
	group := formula
	if _, end := identifier([]rune(formula), 0); end != len([]rune(formula)) {
		group = "(" + formula + ")"
	}
	what, verb, fix := "radians", "add", group+"/(2*pi)"
	if turns > 0 {
		what, verb, fix = "cycles", "drop", "2*pi*"+group
	}
	other := units.AutoUnit(1, t.Dim, t.Kind).Symbol
	noun := t.Kind.Noun(t.Dim)
	switch {
	case ve == units.Cycle && t.Dim == (units.Dim{units.Time: -1}):
		noun = "a rotational frequency (cycles)"
	case ve == units.Angle && t.Dim == (units.Dim{units.Time: -1}):
		noun = "an angular velocity (radians)"
	case noun == "":
		noun = "a quantity in " + what
	}
	msg = fmt.Sprintf("%s is %s, and showing it in %s would %s a factor 2π", name, noun, u.Symbol, verb)
	if formula == "" {
		if turns > 0 {
			return msg, "multiply the frequency by 2*pi"
		}
		return msg, "divide the angular velocity by 2*pi"
	}
	if turns != 1 && turns != -1 {
		return msg, "check the powers of rad and of the revolution in the formula and the unit"
	}
	return msg, "write " + name + " [" + u.Symbol + "] = " + fix + "; or show it in " + other
}

// powerHint says how to get from one kind of power to another.
func powerHint(from, to units.Kind) string {
	switch {
	case from.Tag == units.TagApparent && to.Tag == units.TagActive:
		return "an active power is the apparent power times the power factor: S*cos(phi)"
	case from.Tag == units.TagApparent && to.Tag == units.TagReactive:
		return "a reactive power is S*sin(phi)"
	case from.Tag == units.TagActive && to.Tag == units.TagApparent:
		return "an apparent power is the active power divided by the power factor: P/cos(phi)"
	}
	return "active, reactive and apparent power are different quantities: P = S*cos(phi), Q = S*sin(phi)"
}
