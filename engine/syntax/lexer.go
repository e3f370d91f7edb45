package syntax

import (
	"fmt"
	"unicode"
	"unicode/utf8"
)

// MaxNesting bounds parentheses and function calls inside one formula.
const MaxNesting = 100

type tokKind uint8

const (
	tokEOF tokKind = iota
	tokNumber
	tokQuantity
	tokName
	tokOp
	tokLParen
	tokRParen
	tokComma
	tokLBracket
	tokRBracket
)

type token struct {
	kind  tokKind
	start int
	end   int
	text  string    // the operator, normalised (≤ is <=, · is *); the name
	num   *Number   // tokNumber
	q     *Quantity // tokQuantity
}

// lexer turns r[from:to] into tokens. It checks parentheses as it goes,
// so that an unbalanced one is reported where it stands rather than where
// the parser gives up.
type lexer struct {
	r        []rune
	from, to int
	toks     []token
	opens    []int  // offsets of the open ( and [
	closes   []rune // the closing character each open one needs
}

func errAt(start, end int, hint, format string, args ...any) *Error {
	return &Error{Span: Span{start, end}, Msg: fmt.Sprintf(format, args...), Hint: hint}
}

// IsNameStart and IsNamePart tell the characters of a name.
func IsNameStart(c rune) bool { return unicode.IsLetter(c) || c == '_' }

// IsNamePart reports whether c may continue a name.
func IsNamePart(c rune) bool { return unicode.IsLetter(c) || unicode.IsDigit(c) || c == '_' }

// lex reads every token, or the first error.
func lex(r []rune, from, to int) ([]token, *Error) {
	l := &lexer{r: r, from: from, to: to}
	for i := from; i < to; {
		next, err := l.one(i)
		if err != nil {
			return nil, err
		}
		i = next
	}
	if len(l.opens) > 0 {
		at, want := l.opens[len(l.opens)-1], l.closes[len(l.closes)-1]
		if want == ']' {
			return nil, errAt(at, at+1, "add the missing ]", "unbalanced brackets: this [ is never closed")
		}
		return nil, errAt(at, at+1, "add the missing )", "unbalanced parentheses: this ( is never closed")
	}
	l.toks = append(l.toks, token{kind: tokEOF, start: to, end: to})
	return l.toks, nil
}

func (l *lexer) emit(k tokKind, start, end int, text string) {
	l.toks = append(l.toks, token{kind: k, start: start, end: end, text: text})
}

// one reads the token at r[i] and returns the offset after it.
func (l *lexer) one(i int) (int, *Error) {
	r, to := l.r, l.to
	c := r[i]
	switch {
	case unicode.IsSpace(c):
		return i + 1, nil
	case IsNameStart(c):
		return l.name(i)
	case c >= '0' && c <= '9' || c == '.' && i+1 < to && r[i+1] >= '0' && r[i+1] <= '9':
		return l.number(i)
	case c == '(' || c == '[':
		return l.open(i)
	case c == ')' || c == ']':
		return l.close(i)
	case c == '.' && i+1 < to && r[i+1] == '.':
		l.emit(tokOp, i, i+2, "..")
		return i + 2, nil
	case c == ',':
		l.emit(tokComma, i, i+1, ",")
		return i + 1, nil
	}
	if op, n := operator(r[i:to]); n > 0 {
		l.emit(tokOp, i, i+n, op)
		return i + n, nil
	}
	return i, l.refuse(i)
}

// open reads a ( or a [, which share one count of nesting.
func (l *lexer) open(i int) (int, *Error) {
	c := l.r[i]
	l.opens = append(l.opens, i)
	if len(l.opens) > MaxNesting {
		return i, errAt(i, i+1, "name the inner parts as separate statements", "parentheses and brackets nested more than %d deep", MaxNesting)
	}
	if c == '(' {
		l.closes = append(l.closes, ')')
		l.emit(tokLParen, i, i+1, "(")
	} else {
		l.closes = append(l.closes, ']')
		l.emit(tokLBracket, i, i+1, "[")
	}
	return i + 1, nil
}

// close reads a ) or a ], which must match the last one opened.
func (l *lexer) close(i int) (int, *Error) {
	c := l.r[i]
	if len(l.opens) == 0 {
		if c == ']' {
			return i, errAt(i, i+1, "remove it or add the matching [", "unbalanced brackets: this ] has no matching [")
		}
		return i, errAt(i, i+1, "remove it or add the matching (", "unbalanced parentheses: this ) has no matching (")
	}
	if want := l.closes[len(l.closes)-1]; want != c {
		at := l.opens[len(l.opens)-1]
		return i, errAt(i, i+1, fmt.Sprintf("close the %c opened at column %d with %c first", l.r[at], at+1, want),
			"this %c closes a %c", c, l.r[at])
	}
	l.opens, l.closes = l.opens[:len(l.opens)-1], l.closes[:len(l.closes)-1]
	if c == ')' {
		l.emit(tokRParen, i, i+1, ")")
	} else {
		l.emit(tokRBracket, i, i+1, "]")
	}
	return i + 1, nil
}

// operator reads an operator at the start of r, normalised.
func operator(r []rune) (string, int) {
	two := ""
	if len(r) > 1 {
		two = string(r[:2])
	}
	switch two {
	case "<=", ">=", "==":
		return two, 2
	case "**":
		return "^", 2
	case "/_":
		return PolarOp, 2
	}
	switch r[0] {
	case '+', '-', '*', '/', '^', '<', '>', '=':
		return string(r[0]), 1
	case '≤':
		return "<=", 1
	case '≥':
		return ">=", 1
	case '×', '·', '⋅':
		return "*", 1
	case '−':
		return "-", 1
	case '∠':
		return PolarOp, 1
	}
	return "", 0
}

// refuse explains a character that starts no token.
func (l *lexer) refuse(i int) *Error {
	c := l.r[i]
	one := func(hint, format string, args ...any) *Error { return errAt(i, i+1, hint, format, args...) }
	switch {
	case c == '±':
		return one("a tolerance follows an input's value at the end of its definition: g = 4.0 mm ± 0.2 mm", "± belongs to an input's tolerance, not inside a formula")
	case c == '%':
		return one("write percent after a number, as 5 %", "%% must follow a number")
	case c == '"' || c == '\'' || c == '`':
		return one("formulas hold numbers, units and names; put text after a ;", "text in quotes is not allowed in a formula")
	case c == '{' || c == '}':
		return one("use ( ) for grouping", "%c is not allowed in a formula", c)
	case c == '|' || c == '&' || c == '?' || c == '$' || c == '~' || c == '!' || c == '@' || c == '\\':
		return one("formulas use + - * / ^ and functions such as sqrt( )", "%c is not an operator sheaf knows", c)
	case c == '.':
		return one("names cannot contain a dot; use _ for subscripts", "unexpected .")
	case c == utf8.RuneError:
		// The sheet reader put U+FFFD where the file had a byte that is not UTF-8.
		return one("save the file as UTF-8, and retype this character", "the formula holds a byte that is not valid UTF-8")
	}
	return one("formulas use names, numbers with units, + - * / ^ ( ) and functions", "unexpected character %q", c)
}

// name reads a name, qualified with dots: coil_a.lambda, BH.B.
func (l *lexer) name(i int) (int, *Error) {
	r, to := l.r, l.to
	j := i
	for j < to && IsNamePart(r[j]) {
		j++
	}
	if r[i] == '_' {
		return i, errAt(i, j, "names start with a letter", "name %s starts with _", string(r[i:j]))
	}
	for j+1 < to && r[j] == '.' && IsNameStart(r[j+1]) && r[j+1] != '_' {
		j += 2
		for j < to && IsNamePart(r[j]) {
			j++
		}
	}
	l.emit(tokName, i, j, string(r[i:j]))
	return j, nil
}

// number reads a number, and its unit if one follows.
func (l *lexer) number(i int) (int, *Error) {
	num, q, end, err := scanLiteral(l.r, i, l.to)
	if err != nil {
		return i, err
	}
	if q != nil {
		l.toks = append(l.toks, token{kind: tokQuantity, start: i, end: end, q: q})
		return end, nil
	}
	l.toks = append(l.toks, token{kind: tokNumber, start: i, end: end, num: num})
	if end < l.to && l.r[end] == 'π' {
		// 2π: the number times π.
		l.emit(tokOp, end, end, "*")
	}
	return end, nil
}
