package units

import (
	"fmt"
	"math"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Error is a problem in a unit expression. Col is the character offset
// (from 0) into the expression, so that callers can point at it.
type Error struct {
	Col  int
	Msg  string
	Hint string
}

func (e *Error) Error() string {
	if e.Hint != "" {
		return e.Msg + "; " + e.Hint
	}
	return e.Msg
}

// MaxUnitLength bounds a unit expression, so that a runaway input is
// refused early instead of parsed.
const MaxUnitLength = 200

// Parse reads a unit expression such as "kg·m²/s³", "W/(m*K)", "A/m" or
// "1/s". Products are written with "*", "·" or a space; powers with "^2",
// "^-1" or superscript digits. As the SI Brochure (9th ed., 5.4.6) asks, a
// solidus may not be followed by another solidus or a product on the same
// level: "W/m/K" is refused in favour of "W/(m·K)".
func Parse(s string) (Unit, error) {
	return reg.parse(s, true)
}

// ParseCompact reads a unit expression that contains no spaces, as written
// right after a number in a formula.
func ParseCompact(s string) (Unit, error) {
	return reg.parse(s, false)
}

func (r *registry) parse(s string, spaces bool) (Unit, error) {
	if utf8.RuneCountInString(s) > MaxUnitLength {
		return Unit{}, &Error{Msg: fmt.Sprintf("unit expression longer than %d characters", MaxUnitLength)}
	}
	if !utf8.ValidString(s) {
		return Unit{}, &Error{Msg: "unit expression is not valid UTF-8"}
	}
	trimmed := strings.TrimSpace(s)
	if trimmed == "" {
		return Unit{}, &Error{Msg: "empty unit", Hint: "write a unit symbol such as m, V or T, or 1 for a pure number"}
	}
	// Whole-string spellings such as "r/min" come first.
	if d, ok := r.bySymbol[trimmed]; ok {
		return d.unit, nil
	}
	p := &parser{src: []rune(s), spaces: spaces, reg: r}
	p.skipSpace()
	f, err := p.product(0)
	if err != nil {
		return Unit{}, err
	}
	p.skipSpace()
	if p.pos < len(p.src) {
		if p.src[p.pos] == ')' {
			return Unit{}, p.errf(p.pos, "unbalanced parenthesis in unit", "remove the ')' or add a matching '('")
		}
		if r := p.src[p.pos]; r >= '0' && r <= '9' {
			head := string(p.src[:p.pos])
			return Unit{}, p.errf(p.pos, "a unit exponent needs a caret",
				fmt.Sprintf("write %s^%c", strings.TrimSpace(head), r))
		}
		return Unit{}, p.errf(p.pos, fmt.Sprintf("unexpected %q in unit", p.src[p.pos]), "")
	}
	return f.finish()
}

// factor is a unit expression under construction.
type factor struct {
	text    string
	dim     Dim
	scale   float64
	offset  float64
	kind    Kind
	atoms   int  // how many symbols it contains
	affine  bool // contains °C or °F
	affCol  int  // where the first °C or °F starts, for the error
	compose bool // text needs parentheses when raised to a power
	col     int
}

// maxUnitExp bounds the exponent of each base quantity in a parsed unit,
// as the parser bounds a written exponent; Dim holds int8, and m^99·m^99
// must be refused rather than wrap round to L⁻⁵⁸.
const maxUnitExp = 99

// expFits reports whether a.Mul(b) (sign 1) or a.Div(b) (sign -1) keeps
// every exponent within maxUnitExp.
func expFits(a, b Dim, sign int) bool {
	for i := range a {
		if v := int(a[i]) + sign*int(b[i]); v > maxUnitExp || v < -maxUnitExp {
			return false
		}
	}
	return true
}

func (f factor) finish() (Unit, error) {
	if f.scale == 0 || math.IsInf(f.scale, 0) || math.IsNaN(f.scale) {
		// "Qm^11" is 1e330 m¹¹: beyond float64, so no value could use it.
		return Unit{}, &Error{Col: f.col, Msg: "unit scale beyond the range of a number",
			Hint: "use a smaller prefix or a smaller exponent"}
	}
	if f.affine && (f.atoms > 1 || f.offset == 0) {
		return Unit{}, &Error{Col: f.affCol, Msg: "°C and °F measure absolute temperature and cannot be combined with other units",
			Hint: "use K for temperature differences and rates, for example K/s or W/K"}
	}
	return Unit{Symbol: f.text, Dim: f.dim, Scale: f.scale, Offset: f.offset, Kind: f.kind}, nil
}

type parser struct {
	reg    *registry
	src    []rune
	pos    int
	spaces bool
}

func (p *parser) errf(col int, msg, hint string) *Error {
	return &Error{Col: col, Msg: msg, Hint: hint}
}

func (p *parser) skipSpace() {
	for p.pos < len(p.src) && unicode.IsSpace(p.src[p.pos]) {
		p.pos++
	}
}

func (p *parser) peek() rune {
	if p.pos < len(p.src) {
		return p.src[p.pos]
	}
	return 0
}

func isMulSign(r rune) bool { return r == '*' || r == '·' || r == '⋅' || r == '×' }

// product reads power (op power)*. depth bounds parenthesis nesting.
func (p *parser) product(depth int) (factor, error) {
	if depth > 20 {
		return factor{}, p.errf(p.pos, "unit parentheses nested too deeply", "")
	}
	left, err := p.power(depth)
	if err != nil {
		return left, err
	}
	sawSolidus := false
	for {
		save := p.pos
		p.skipSpace()
		r := p.peek()
		var div bool
		switch {
		case isMulSign(r):
			p.pos++
		case r == '/':
			div = true
			p.pos++
		case p.spaces && p.pos > save && startsAtom(r):
			// A space between two symbols multiplies: "N m".
		default:
			p.pos = save
			return left, nil
		}
		if sawSolidus {
			return factor{}, p.errf(p.pos-1, "a solidus (/) may not be followed by another / or a product without parentheses",
				"write the denominator in parentheses, for example W/(m·K) (SI Brochure, 5.4.6)")
		}
		p.skipSpace()
		right, err := p.power(depth)
		if err != nil {
			return right, err
		}
		sign := 1
		if div {
			sign = -1
		}
		if !expFits(left.dim, right.dim, sign) || !kindFits(left.kind, right.kind, sign) {
			return factor{}, p.errf(right.col, "unit exponent too large",
				fmt.Sprintf("a unit may raise each base quantity to at most the power %d", maxUnitExp))
		}
		if div {
			sawSolidus = true
			left = combine(left, right, "/", -1)
		} else {
			left = combine(left, right, "·", 1)
		}
	}
}

func combine(a, b factor, op string, sign int) factor {
	at, bt := a.text, b.text
	if topLevelSolidus(at) {
		// "(A/m)·s" must not print as A/m·s, which reads as A/(m·s) and
		// which Parse refuses (SI Brochure 5.4.6).
		at = "(" + at + ")"
	}
	if op == "/" && b.compose {
		bt = "(" + bt + ")"
	}
	text := at + op + bt
	f := factor{text: text, scale: a.scale, atoms: a.atoms + b.atoms, affine: a.affine || b.affine, compose: true, col: a.col,
		affCol: a.affCol}
	if !a.affine {
		f.affCol = b.affCol
	}
	if sign > 0 {
		f.dim = a.dim.Mul(b.dim)
		f.scale *= b.scale
	} else {
		f.dim = a.dim.Div(b.dim)
		f.scale /= b.scale
	}
	f.kind = combineKinds(a, b, sign)
	return f
}

// topLevelSolidus reports whether a unit text has a / outside parentheses.
func topLevelSolidus(text string) bool {
	depth := 0
	for _, r := range text {
		switch r {
		case '(':
			depth++
		case ')':
			depth--
		case '/':
			if depth == 0 {
				return true
			}
		}
	}
	return false
}

// combineKinds works out the kind of a product (sign 1) or quotient (sign
// -1) of two unit factors: the radian and cycle exponents add, as the
// dimensions do. A force times a length (N·m, lbf·ft) is a torque, an
// energy per radian; the joule names the energy. A power tag (W, VA, var)
// stays only when the other factor is a pure number.
func combineKinds(a, b factor, sign int) Kind {
	k := a.kind.Mul(b.kind)
	if sign < 0 {
		k = a.kind.Div(b.kind)
	}
	switch {
	case a.kind.IsPower() && b.dim.IsDimensionless() && !b.kind.Angular():
		k.Tag = a.kind.Tag
	case b.kind.IsPower() && a.dim.IsDimensionless() && !a.kind.Angular() && sign > 0:
		k.Tag = b.kind.Tag
	}
	length := DimOf(Length)
	if sign > 0 && (a.dim == dimForce && b.dim == length || a.dim == length && b.dim == dimForce) {
		k.Rad--
	}
	return k
}

func startsAtom(r rune) bool {
	return r == '(' || isSymbolRune(r) || r == '1'
}

// isSymbolRune reports whether r can be part of a unit symbol.
func isSymbolRune(r rune) bool {
	switch r {
	case '°', '%', '‰', '′', '″', '\u03a9', '\u2126', '\u00b5', '\u03bc', 'Å', '℃', '℉':
		return true
	}
	return unicode.IsLetter(r)
}

// power reads atom [^exp | superscripts].
func (p *parser) power(depth int) (factor, error) {
	f, err := p.atom(depth)
	if err != nil {
		return f, err
	}
	n, has, err := p.exponent()
	if err != nil || !has {
		return f, err
	}
	if n == 0 {
		return factor{}, p.errf(p.pos-1, "unit raised to the power 0", "leave the unit out instead")
	}
	for i := range f.dim {
		if v := int(f.dim[i]) * n; v > maxUnitExp || v < -maxUnitExp {
			return factor{}, p.errf(f.col, "unit exponent too large",
				fmt.Sprintf("a unit may raise each base quantity to at most the power %d", maxUnitExp))
		}
	}
	text := f.text
	if f.compose {
		text = "(" + text + ")"
	}
	out := factor{text: text + superscript(n), dim: f.dim.Pow(n), scale: math.Pow(f.scale, float64(n)),
		atoms: f.atoms, affine: f.affine, affCol: f.affCol, col: f.col, compose: false}
	if !KindPowFits(f.kind, n) {
		return factor{}, p.errf(f.col, "unit exponent too large",
			fmt.Sprintf("a unit may raise each base quantity to at most the power %d", maxUnitExp))
	}
	out.kind = f.kind.Pow(n)
	if f.affine {
		out.offset = 0 // forces the "cannot be combined" error in finish
	}
	return out, nil
}

var superValues = map[rune]int{'⁰': 0, '¹': 1, '²': 2, '³': 3, '⁴': 4, '⁵': 5, '⁶': 6, '⁷': 7, '⁸': 8, '⁹': 9}

// exponent reads "^n", "^-n", "^(-n)" or superscript digits.
func (p *parser) exponent() (int, bool, error) {
	start := p.pos
	if r := p.peek(); r == '^' || (r == '*' && p.pos+1 < len(p.src) && p.src[p.pos+1] == '*') {
		if r == '*' {
			p.pos++
		}
		p.pos++
		paren := false
		if p.peek() == '(' {
			paren = true
			p.pos++
		}
		sign := 1
		if r := p.peek(); r == '-' || r == '−' || r == '+' {
			if r != '+' {
				sign = -1
			}
			p.pos++
		}
		digits := p.pos
		n := 0
		for p.pos < len(p.src) && p.src[p.pos] >= '0' && p.src[p.pos] <= '9' {
			n = n*10 + int(p.src[p.pos]-'0')
			p.pos++
			if n > 99 {
				return 0, false, p.errf(start, "unit exponent too large", "")
			}
		}
		if p.pos == digits {
			return 0, false, p.errf(start, "'^' in a unit must be followed by a whole number", "write for example m^2 or s^-1")
		}
		if paren {
			if p.peek() != ')' {
				return 0, false, p.errf(p.pos, "missing ')' after unit exponent", "")
			}
			p.pos++
		}
		return sign * n, true, nil
	}
	sign, n, seen := 1, 0, false
	if p.peek() == '⁻' {
		sign = -1
		p.pos++
	}
	for p.pos < len(p.src) {
		v, ok := superValues[p.src[p.pos]]
		if !ok {
			break
		}
		n = n*10 + v
		seen = true
		p.pos++
		if n > 99 {
			return 0, false, p.errf(start, "unit exponent too large", "")
		}
	}
	if !seen {
		if sign < 0 {
			return 0, false, p.errf(start, "superscript minus without digits in unit", "")
		}
		return 0, false, nil
	}
	return sign * n, true, nil
}

// atom reads a symbol, a parenthesised product, or the 1 of "1/s".
func (p *parser) atom(depth int) (factor, error) {
	start := p.pos
	r := p.peek()
	switch {
	case r == '(':
		p.pos++
		p.skipSpace()
		f, err := p.product(depth + 1)
		if err != nil {
			return f, err
		}
		p.skipSpace()
		if p.peek() != ')' {
			return factor{}, p.errf(start, "unbalanced parenthesis in unit", "add the missing ')'")
		}
		p.pos++
		f.compose = true
		f.col = start
		return f, nil
	case r == '1':
		p.pos++
		if p.pos < len(p.src) && p.src[p.pos] >= '0' && p.src[p.pos] <= '9' {
			return factor{}, p.errf(start, "numbers cannot appear inside a unit", "put the number in front of the unit")
		}
		return factor{text: "1", scale: 1, col: start}, nil
	case r >= '0' && r <= '9':
		return factor{}, p.errf(start, "numbers cannot appear inside a unit", "put the number in front of the unit, or write 1/s for a reciprocal")
	case isSymbolRune(r):
		for p.pos < len(p.src) && isSymbolRune(p.src[p.pos]) {
			p.pos++
		}
		sym := string(p.src[start:p.pos])
		// A superscript or "^" belongs to the exponent, not the symbol.
		u, ok := p.reg.lookup(sym)
		if !ok {
			return factor{}, p.unknown(start, sym)
		}
		affine := u.Offset != 0
		return factor{text: u.Symbol, dim: u.Dim, scale: u.Scale, offset: u.Offset, kind: u.Kind, atoms: 1, affine: affine, affCol: start, col: start}, nil
	case r == 0:
		return factor{}, p.errf(start, "unit expression ends too early", "")
	}
	return factor{}, p.errf(start, fmt.Sprintf("unexpected %q in unit", r), "")
}

func (p *parser) unknown(col int, sym string) *Error {
	hint := "run `sheaf units` to list the units sheaf knows"
	if s := p.reg.suggest(sym); s != "" {
		hint = fmt.Sprintf("did you mean %s? ", s) + hint
	}
	return p.errf(col, fmt.Sprintf("unknown unit %q", sym), hint)
}

// Suggest returns the known symbol closest to an unknown one, or "".
func Suggest(sym string) string { return reg.suggest(sym) }

func (r *registry) suggest(sym string) string {
	// The ordinal sign º and the ring ˚ are typed for the degree sign.
	if fixed := strings.NewReplacer("º", "°", "˚", "°").Replace(sym); fixed != sym {
		if _, err := r.parse(fixed, false); err == nil {
			return fixed
		}
	}
	// Case slips first: "kv" means kV far more often than anything else.
	fold, foldD := "", 1<<30
	for _, s := range r.allSpellings() {
		if strings.EqualFold(s, sym) && Distance(s, sym) < foldD {
			fold, foldD = s, Distance(s, sym)
		}
	}
	if fold != "" {
		return fold
	}
	// A unit's name written out: "tesla" for T.
	for i := range Table {
		if strings.EqualFold(Table[i].Name, sym) || strings.EqualFold(Table[i].Name+"s", sym) {
			return Table[i].Symbol
		}
	}
	limit := 1
	switch n := utf8.RuneCountInString(sym); {
	case n <= 1:
		return "" // one letter is too little to guess from
	case n > 3:
		limit = 2
	}
	best, bestD := "", limit+1
	for _, s := range r.allSpellings() {
		if d := Distance(sym, s); d < bestD {
			best, bestD = s, d
		}
	}
	return best
}

// allSpellings lists every plain and prefixed spelling, built on first use
// because only error messages need it.
func (r *registry) allSpellings() []string {
	r.once.Do(func() {
		out := append([]string(nil), r.spelled...)
		for _, p := range Prefixes {
			for _, s := range r.spelled {
				if r.bySymbol[s].Prefix {
					out = append(out, p.Symbol+s)
				}
			}
		}
		r.all = out
	})
	return r.all
}

// Distance is the Levenshtein edit distance between two strings, counted in
// characters; sheaf uses it for "did you mean" hints.
func Distance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
