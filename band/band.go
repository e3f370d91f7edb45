// Package band pairs the two checks of a tolerance band: a sheet that
// checks both x >= lo and x <= hi on the same quantity x states one band,
// and a checker wants to know where in the band x sits, not two
// utilisations near 100 %.
package band

import (
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
)

// Band is a two-sided tolerance on one quantity, from two checks.
type Band struct {
	// Low checks x against the lower limit, High against the upper.
	Low, High *engine.Statement
	// Value, Lo and Hi are in SI, from the checks' sides.
	Value, Lo, Hi float64
}

// Position is where the value sits in the band: 0 at the lower limit, 1
// at the upper, outside 0–1 when it lies outside the band.
func (b Band) Position() float64 { return (b.Value - b.Lo) / (b.Hi - b.Lo) }

// side is one limit found on a check: the quantity checked, which side of
// the check it is on, and whether the limit is a lower one.
type side struct {
	st    *engine.Statement
	key   string
	left  bool // the quantity is the check's left side
	lower bool // the check states a lower limit on the quantity
}

// Find pairs the checks of a sheet into bands: for each quantity, the
// first check that bounds it from below and the first that bounds it
// from above, in the same template instance, both evaluated, with the
// lower limit below the upper. result gives each check's outcome.
func Find(statements []*engine.Statement, result func(*engine.Statement) engine.Result) map[*engine.Statement]Band {
	type pair struct{ lo, hi *side }
	byKey := map[string]*pair{}
	var keys []string
	for _, st := range statements {
		if st.Kind != engine.Check {
			continue
		}
		if r := result(st); r.Status != engine.Pass && r.Status != engine.Fail {
			continue
		}
		cmp := st.Compare()
		if cmp == nil || cmp.Op == "==" {
			continue
		}
		// x >= lo and lo <= x bound x from below; either side may be x.
		below := cmp.Op == ">" || cmp.Op == ">="
		for _, s := range []side{{st, key(cmp.X), true, below}, {st, key(cmp.Y), false, !below}} {
			if s.key == "" {
				continue
			}
			k := st.Instance + "\x00" + s.key
			p := byKey[k]
			if p == nil {
				p = &pair{}
				byKey[k] = p
				keys = append(keys, k)
			}
			s := s
			if s.lower && p.lo == nil {
				p.lo = &s
			} else if !s.lower && p.hi == nil {
				p.hi = &s
			}
		}
	}
	out := map[*engine.Statement]Band{}
	for _, k := range keys {
		p := byKey[k]
		if p.lo == nil || p.hi == nil || p.lo.st == p.hi.st {
			continue
		}
		if _, taken := out[p.lo.st]; taken {
			continue
		}
		if _, taken := out[p.hi.st]; taken {
			continue
		}
		x, lo := sides(p.lo, result(p.lo.st))
		_, hi := sides(p.hi, result(p.hi.st))
		if !(lo < hi) {
			continue // not a band: the limits cross
		}
		b := Band{Low: p.lo.st, High: p.hi.st, Value: x, Lo: lo, Hi: hi}
		out[b.Low], out[b.High] = b, b
	}
	return out
}

// sides returns the checked quantity and the limit of a check, in SI.
func sides(s *side, r engine.Result) (x, limit float64) {
	if s.left {
		return r.Left, r.Right
	}
	return r.Right, r.Left
}

// key writes a check side so that two sides with the same formula get the
// same key; a bare literal gets none (a limit, not a quantity).
func key(e engine.Expr) string {
	if _, _, ok := engine.LiteralText(e); ok {
		return ""
	}
	var b strings.Builder
	write(&b, e)
	return b.String()
}

func write(b *strings.Builder, e engine.Expr) {
	switch n := e.(type) {
	case *engine.Number:
		b.WriteString(strconv.FormatFloat(n.Value, 'g', -1, 64))
	case *engine.Quantity:
		b.WriteString(strconv.FormatFloat(n.SI, 'g', -1, 64) + "[" + n.Unit.Symbol + "]")
	case *engine.Ref:
		b.WriteString(n.Name)
	case *engine.Unary:
		b.WriteString("(" + n.Op)
		write(b, n.X)
		b.WriteString(")")
	case *engine.Binary:
		b.WriteString("(")
		write(b, n.X)
		b.WriteString(n.Op)
		write(b, n.Y)
		b.WriteString(")")
	case *engine.Call:
		b.WriteString(n.Name + "(")
		for i, a := range n.Args {
			if i > 0 {
				b.WriteString(",")
			}
			write(b, a)
		}
		b.WriteString(")")
	default:
		b.WriteString("?")
	}
}
