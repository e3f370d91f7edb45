package engine

// Many formulas of a sheet are long products of names and constants, such
// as E = √2·π·f·N·k_w·Φ. A tree of closures pays one call per operator for
// them; this file compiles such a chain into one closure that walks a
// flat list instead, in exactly the order the tree has, so that every
// result is bit for bit what the tree gives.

// leaf is a slot read or a constant.
type leaf struct {
	slot int // -1 for a constant
	c    float64
}

func (l leaf) at(v []float64) float64 {
	if l.slot < 0 {
		return l.c
	}
	return v[l.slot]
}

// link is one operation of a chain: times or over a leaf.
type link struct {
	div bool
	x   leaf
}

// chain is a leaf times or over further leaves, left to right:
// ((a·b)/c)·d. When every further leaf is a slot that multiplies, as in
// √2·π·f·N·k_w·Φ, they are kept as slot numbers and the loop has no
// branch.
type flatChain struct {
	first leaf
	rest  []link
	muls  []int // the slots of rest, when rest only multiplies by slots
}

func (c *flatChain) at(v []float64) float64 {
	x := c.first.at(v)
	if c.muls != nil {
		for _, i := range c.muls {
			x *= v[i]
		}
		return x
	}
	for _, l := range c.rest {
		if l.div {
			x /= l.x.at(v)
		} else {
			x *= l.x.at(v)
		}
	}
	return x
}

// seal records the chain's slot multiplications as a list of slots when
// that is all its further leaves do.
func (c *flatChain) seal() {
	muls := make([]int, 0, len(c.rest))
	for _, l := range c.rest {
		if l.div || l.x.slot < 0 {
			return
		}
		muls = append(muls, l.x.slot)
	}
	if len(muls) > 0 {
		c.muls = muls
	}
}

// flatMin is the number of operators from which a flat closure beats the
// specialised closures of one operator each.
const flatMin = 3

// compileFlat compiles e as one closure if it is a chain of names and
// constants with at least flatMin operators; ok is false otherwise. Sums
// and nested quotients stay trees of specialised closures, which measured
// faster than walking lists of terms.
func compileFlat(e Expr) (fn evalFn, ok bool) {
	c, ops, ok := flatChainOf(e)
	if !ok || ops < flatMin {
		return nil, false
	}
	return c.at, true
}

// flatChainOf reads e as a leaf times or over further leaves.
func flatChainOf(e Expr) (flatChain, int, bool) {
	if l, ok := leafOf(e); ok {
		return flatChain{first: l}, 0, true
	}
	c, n, ok := linksOf(e)
	if ok {
		c.seal()
	}
	return c, n, ok
}

// linksOf reads e as a leaf times or over further leaves, unsealed.
func linksOf(e Expr) (flatChain, int, bool) {
	if l, ok := leafOf(e); ok {
		return flatChain{first: l}, 0, true
	}
	b, ok := e.(*Binary)
	if !ok || b.Op != "*" && b.Op != "/" {
		return flatChain{}, 0, false
	}
	c, n, ok := linksOf(b.X)
	if !ok {
		return flatChain{}, 0, false
	}
	l, ok := leafOf(b.Y)
	if !ok {
		return flatChain{}, 0, false
	}
	c.rest = append(c.rest, link{div: b.Op == "/", x: l})
	return c, n + 1, true
}

func leafOf(e Expr) (leaf, bool) {
	if c, ok := constOf(e); ok {
		return leaf{slot: -1, c: c}, true
	}
	if i, ok := slotOf(e); ok {
		return leaf{slot: i}, true
	}
	return leaf{}, false
}

// pair is a leaf times or over another: k_C·g, μ0·A_p. A single leaf is
// a pair with 1 as its second leaf (x·1 is x exactly, in IEEE arithmetic).
// It is small enough for the compiler to inline, so that a quotient of
// two pairs costs one call where the tree would pay three.
type pair struct {
	a, b leaf
	div  bool
}

func (p *pair) at(v []float64) float64 {
	x, y := p.a.at(v), p.b.at(v)
	if p.div {
		return x / y
	}
	return x * y
}

// pairOf reads e as a pair; two says whether it has two leaves.
func pairOf(e Expr) (p pair, two, ok bool) {
	if l, ok := leafOf(e); ok {
		return pair{a: l, b: leaf{slot: -1, c: 1}}, false, true
	}
	b, isBin := e.(*Binary)
	if !isBin || b.Op != "*" && b.Op != "/" {
		return pair{}, false, false
	}
	x, okx := leafOf(b.X)
	y, oky := leafOf(b.Y)
	return pair{a: x, b: y, div: b.Op == "/"}, true, okx && oky
}

// compilePairs compiles x op y as one closure when both sides are pairs
// and at least one has two leaves.
func compilePairs(op string, x, y Expr) (evalFn, bool) {
	p, twoP, okP := pairOf(x)
	q, twoQ, okQ := pairOf(y)
	if !okP || !okQ || !twoP && !twoQ {
		return nil, false
	}
	switch op {
	case "+":
		return func(v []float64) float64 { return p.at(v) + q.at(v) }, true
	case "-":
		return func(v []float64) float64 { return p.at(v) - q.at(v) }, true
	case "*":
		return func(v []float64) float64 { return p.at(v) * q.at(v) }, true
	case "/":
		return func(v []float64) float64 { return p.at(v) / q.at(v) }, true
	}
	return nil, false
}
