package syntax

import (
	"fmt"
	"unicode"

	"github.com/sheaf-calc/sheaf/units"
)

// Binding powers of the infix operators; a prefix sign binds between the
// products and the power, so -x^2 is -(x²) and -x*y is (-x)*y.
const (
	bpRelation = 10
	bpRange    = 15
	bpSum      = 20
	bpPolar    = 25
	bpProduct  = 30
	bpSign     = 40
	bpPower    = 50
)

func infixPower(op string) int {
	switch op {
	case "+", "-":
		return bpSum
	case "*", "/":
		return bpProduct
	case "^":
		return bpPower
	case "..":
		return bpRange
	case PolarOp:
		return bpPolar
	}
	if IsRelation(op) {
		return bpRelation
	}
	return 0
}

// maxDepth bounds how deep signs, powers and parentheses nest, so that no
// formula can exhaust the stack of the stages that walk its tree.
const maxDepth = 4 * MaxNesting

// Parse reads the formula in r[from:to]. Offsets in the tree and in errors
// index r.
func Parse(r []rune, from, to int) (Node, *Error) {
	toks, err := lex(r, from, to)
	if err != nil {
		return nil, err
	}
	p := &parser{r: r, toks: toks}
	n := p.choice()
	if p.err == nil && p.peek().kind != tokEOF {
		p.unexpected(p.peek())
	}
	if p.err != nil {
		return nil, p.err
	}
	return n, nil
}

type parser struct {
	r     []rune
	toks  []token
	i     int
	depth int
	err   *Error
}

func (p *parser) peek() token { return p.toks[p.i] }

func (p *parser) next() token {
	t := p.toks[p.i]
	if t.kind != tokEOF {
		p.i++
	}
	return t
}

func (p *parser) fail(t token, hint, format string, args ...any) Node {
	if p.err == nil {
		end := max(t.end, t.start+1)
		p.err = &Error{Span: Span{t.start, end}, Msg: fmt.Sprintf(format, args...), Hint: hint}
	}
	return nil
}

// expr parses operators binding tighter than minBP.
func (p *parser) expr(minBP int) Node {
	if p.depth++; p.depth > maxDepth {
		return p.fail(p.peek(), "split it into named parts, each a few terms long",
			"formula nested too deeply: more than %d operations or calls inside one another", maxDepth)
	}
	defer func() { p.depth-- }()
	left := p.prefix()
	for p.err == nil {
		t := p.peek()
		if t.kind != tokOp {
			if t.kind == tokName && (t.text == StepWord || t.text == WhenWord || t.text == ElseWord) {
				return left // a range's step or a conditional's words: the caller reads them
			}
			if startsOperand(t) {
				return p.juxtaposed(t)
			}
			return left
		}
		bp := infixPower(t.text)
		if bp == 0 {
			return p.unexpected(t)
		}
		if bp <= minBP {
			if bp == bpRelation && minBP == bpRelation {
				return p.fail(t, "write each comparison as its own check: check a < b, then check b < c",
					"a check holds one comparison; a < b < c chains two")
			}
			return left
		}
		p.next()
		if t.text == ".." {
			left = p.rangeAfter(left, t)
			continue
		}
		if b, ok := left.(*Binary); ok && t.text == PolarOp && b.Op == PolarOp {
			return p.fail(t, "write one magnitude and one angle: magnitude ∠ angle", "a phasor has one ∠")
		}
		rbp := bp
		if t.text == "^" {
			rbp = bp - 1 // right-associative: 2^3^2 is 2^9
		}
		right := p.expr(rbp)
		if p.err != nil {
			return nil
		}
		left = &Binary{Pos: Span{left.Span().Start, right.Span().End}, OpAt: t.start, Op: t.text, X: left, Y: right}
	}
	return nil
}

// prefix parses what may stand at the start of an operand, with the
// indexes that follow it.
func (p *parser) prefix() Node {
	x := p.primary()
	for p.err == nil && p.peek().kind == tokLBracket && p.peek().start == p.toks[p.i-1].end {
		x = p.index(x)
	}
	return x
}

// primary parses one operand.
func (p *parser) primary() Node {
	t := p.next()
	switch t.kind {
	case tokNumber:
		return t.num
	case tokQuantity:
		return t.q
	case tokName:
		if p.peek().kind == tokLParen {
			return p.call(t)
		}
		return &Name{Pos: Span{t.start, t.end}, Name: t.text}
	case tokLBracket:
		return p.list(t)
	case tokLParen:
		inner := p.choice()
		if p.err != nil {
			return nil
		}
		if c := p.next(); c.kind != tokRParen {
			return p.unexpected(c)
		}
		return inner
	case tokOp:
		if t.text == "-" || t.text == "+" {
			x := p.expr(bpSign)
			if p.err != nil {
				return nil
			}
			return &Unary{Pos: Span{t.start, x.Span().End}, Op: t.text, X: x}
		}
	case tokEOF:
		return p.endsEarly()
	}
	p.i--
	return p.unexpected(t)
}

// call parses the arguments of a function after its name.
func (p *parser) call(name token) Node {
	p.next() // (
	c := &Call{Name: name.text}
	if p.peek().kind == tokRParen {
		c.Pos = Span{name.start, p.next().end}
		return c
	}
	for {
		a := p.choice()
		if p.err != nil {
			return nil
		}
		c.Args = append(c.Args, a)
		switch t := p.next(); t.kind {
		case tokComma:
			continue
		case tokRParen:
			c.Pos = Span{name.start, t.end}
			return c
		default:
			return p.unexpected(t)
		}
	}
}

// choice parses a value that may hold a condition: value when condition
// else other, where other may hold a condition of its own.
func (p *parser) choice() Node {
	v := p.expr(0)
	if p.err != nil || p.peek().kind != tokName || p.peek().text != WhenWord {
		return v
	}
	if p.depth++; p.depth > maxDepth {
		return p.fail(p.peek(), "split it into named parts", "formula nested too deeply: more than %d conditions inside one another", maxDepth)
	}
	defer func() { p.depth-- }()
	when := p.next()
	cond := p.expr(0)
	if p.err != nil {
		return nil
	}
	if t := p.peek(); t.kind != tokName || t.text != ElseWord {
		return p.fail(t, "write value "+WhenWord+" condition "+ElseWord+" other value", "a condition needs %s and the value when it does not hold", ElseWord)
	}
	p.next()
	other := p.choice()
	if p.err != nil {
		return nil
	}
	return &Choice{Pos: Span{v.Span().Start, other.Span().End}, WhenAt: when.start, Value: v, Cond: cond, Other: other}
}

// rangeAfter parses the end of a range, and its step, after "..".
func (p *parser) rangeAfter(from Node, dots token) Node {
	if _, ok := from.(*Range); ok {
		return p.fail(dots, "write one range: from .. to by step", "a range has one ..")
	}
	to := p.expr(bpRange)
	if p.err != nil {
		return nil
	}
	r := &Range{Pos: Span{from.Span().Start, to.Span().End}, OpAt: dots.start, From: from, To: to}
	if t := p.peek(); t.kind == tokName && t.text == StepWord {
		p.next()
		step := p.expr(bpRange)
		if p.err != nil {
			return nil
		}
		r.Step, r.Pos.End = step, step.Span().End
	}
	return r
}

// list parses the elements of a list literal after its "[".
func (p *parser) list(open token) Node {
	l := &List{}
	if p.peek().kind == tokRBracket {
		return p.fail(p.peek(), "write the elements between [ and ], separated by commas", "a list needs at least one element")
	}
	for {
		e := p.choice()
		if p.err != nil {
			return nil
		}
		l.Elems = append(l.Elems, e)
		switch t := p.next(); t.kind {
		case tokComma:
			continue
		case tokRBracket:
			l.Pos = Span{open.start, t.end}
			return l
		default:
			return p.unexpected(t)
		}
	}
}

// index parses "[i]" after the list it picks from.
func (p *parser) index(x Node) Node {
	p.next() // [
	if p.peek().kind == tokRBracket {
		return p.fail(p.peek(), "write the element's number, as phi[1] for the first", "an index is missing between [ and ]")
	}
	i := p.choice()
	if p.err != nil {
		return nil
	}
	t := p.next()
	if t.kind != tokRBracket {
		if t.kind == tokComma {
			return p.fail(t, "a list has one index: write phi[2]", "an index holds one number")
		}
		return p.unexpected(t)
	}
	return &Index{Pos: Span{x.Span().Start, t.end}, X: x, I: i}
}

func startsOperand(t token) bool {
	switch t.kind {
	case tokNumber, tokQuantity, tokName, tokLParen, tokLBracket:
		return true
	}
	return false
}

// endsEarly reports a formula that stops where an operand should follow;
// it points at the last token read, where the formula stops short.
func (p *parser) endsEarly() Node {
	if p.i == 0 {
		return p.fail(p.peek(), "complete the formula", "formula ends too early")
	}
	last := p.toks[p.i-1]
	hint := "complete the formula"
	if last.kind == tokOp || last.kind == tokName {
		hint += " after " + last.text
	}
	return p.fail(last, hint, "formula ends too early")
}

// unexpected reports a token that cannot stand where it does.
func (p *parser) unexpected(t token) Node {
	switch {
	case t.kind == tokEOF:
		return p.endsEarly()
	case t.kind == tokName && (t.text == WhenWord || t.text == ElseWord):
		return p.fail(t, "write value "+WhenWord+" condition "+ElseWord+" other value, in parentheses inside a formula", "%s belongs to a conditional value: value %s condition %s other value", t.text, WhenWord, ElseWord)
	case t.kind == tokName && t.text == StepWord:
		return p.fail(t, "write a range with its step as from .. to by step", "%s gives the step of a range, and follows from .. to", StepWord)
	case t.kind == tokComma && p.decimalComma(t):
		return p.fail(t, "sheaf writes decimals with a point: 1.5, not 1,5; a comma separates the arguments of a function",
			"a comma inside a number")
	}
	return p.fail(t, "check for a missing operator or a stray symbol", "unexpected %s", p.text(t))
}

func (p *parser) text(t token) string { return string(p.r[t.start:t.end]) }

func (p *parser) decimalComma(t token) bool {
	o := t.start
	return o > 0 && o+1 < len(p.r) && unicode.IsDigit(p.r[o-1]) && unicode.IsDigit(p.r[o+1])
}

// juxtaposed reports an operand that follows another with no operator
// between, and recognises what engineers type out of habit: a unit product
// with a space (3 m s), a product without its sign (2(a + b)), and words
// for logic (and, or).
func (p *parser) juxtaposed(t token) Node {
	prev := p.toks[p.i-1]
	switch {
	case t.kind == tokQuantity:
		return p.fail(t, "put an operator such as * between the two", "a quantity follows another term without an operator")
	case t.kind == tokLBracket && (prev.kind == tokName || prev.kind == tokRParen || prev.kind == tokRBracket):
		return p.fail(t, "write the index right after the list, with no space: "+p.text(prev)+"[...]", "a [ follows %s after a space", p.text(prev))

	case t.kind == tokName && (t.text == "and" || t.text == "or"):
		return p.fail(t, "write each comparison as its own check", "a check holds one comparison; '%s' is not supported", t.text)
	case t.kind == tokName && prev.kind == tokQuantity:
		q := prev.q
		if _, err := units.ParseCompact(q.UnitText + "*" + t.text); err == nil {
			return p.fail(t, fmt.Sprintf("write %s %s*%s (or %s %s·%s) for a product of units; to multiply by a name %s write %s %s * %s",
				q.Text, q.UnitText, t.text, q.Text, q.UnitText, t.text, t.text, q.Text, q.UnitText, t.text),
				"a unit symbol follows a quantity after a space")
		}
	case t.kind == tokLParen && (prev.kind == tokNumber || prev.kind == tokQuantity || prev.kind == tokRParen):
		before := p.text(prev)
		return p.fail(t, "write "+before+"*"+p.group(t.start)+": a product needs its * sign",
			"a ( follows %s without an operator", before)
	}
	return p.fail(t, "check for a missing operator or a stray symbol", "unexpected %s", p.text(t))
}

// group returns the parenthesised text that opens at r[i].
func (p *parser) group(i int) string {
	depth := 0
	for j := i; j < len(p.r); j++ {
		switch p.r[j] {
		case '(':
			depth++
		case ')':
			if depth--; depth == 0 {
				return string(p.r[i : j+1])
			}
		}
	}
	return "( ... )"
}
