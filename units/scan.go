package units

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// ScanCompact finds how far a unit runs at the start of s, where s follows
// a number in a formula: "0.92 T" or "4.5 kV/mm * l". The unit ends at the
// first space, and it takes "*" or "/" only when a known unit symbol
// follows, so that "2 mm*N_t" reads as 2 mm times N_t. It returns the
// length in bytes; 0 means no unit starts here. The text it covers is what
// ParseCompact should then read.
func ScanCompact(s string) int {
	r, _ := utf8.DecodeRuneInString(s)
	if !isSymbolRune(r) {
		return 0
	}
	i := scanSymbol(s, 0)
	if i < len(s) {
		if r, _ := utf8.DecodeRuneInString(s[i:]); isIdentRune(r) {
			// "2 A_g" or "2 m2": a name or a misspelt unit; take it whole so
			// that the error can name it.
			for i < len(s) {
				r, n := utf8.DecodeRuneInString(s[i:])
				if !isIdentRune(r) && !isSymbolRune(r) {
					break
				}
				i += n
			}
			return i
		}
	}
	i = scanExponent(s, i)
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		if (!isMulSign(r) && r != '/') || strings.HasPrefix(s[i:], "**") {
			break
		}
		j := i + n
		if j < len(s) && s[j] == '(' {
			end, ok := scanGroup(s, j)
			if !ok {
				break
			}
			i = scanExponent(s, end)
			continue
		}
		if strings1(s[j:]) {
			// "1/s" style inside a compact unit is not supported; stop.
			break
		}
		k := scanSymbol(s, j)
		if k == j || !knownAtBoundary(s, j, k) {
			break
		}
		i = scanExponent(s, k)
	}
	return i
}

func strings1(s string) bool { return len(s) > 0 && s[0] == '1' }

// knownAtBoundary reports whether s[j:k] is a known unit that is not the
// start of a longer name.
func knownAtBoundary(s string, j, k int) bool {
	if k < len(s) {
		if r, _ := utf8.DecodeRuneInString(s[k:]); isIdentRune(r) {
			return false
		}
	}
	_, ok := Lookup(s[j:k])
	return ok
}

func isIdentRune(r rune) bool { return r == '_' || (r >= '0' && r <= '9') }

func scanSymbol(s string, i int) int {
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		if !isSymbolRune(r) {
			break
		}
		i += n
	}
	return i
}

func scanExponent(s string, i int) int {
	if i+1 < len(s) && s[i] == '*' && s[i+1] == '*' {
		// "m**2" is the same power as "m^2".
		if end := scanExponent(s[:i]+"^"+s[i+2:], i); end > i {
			return end + 1
		}
		return i
	}
	if i < len(s) && s[i] == '^' {
		j := i + 1
		paren := j < len(s) && s[j] == '('
		if paren {
			j++
		}
		if j < len(s) && (s[j] == '-' || s[j] == '+') {
			j++
		}
		d := j
		for j < len(s) && s[j] >= '0' && s[j] <= '9' {
			j++
		}
		if j == d {
			return i
		}
		if paren {
			if j >= len(s) || s[j] != ')' {
				return i
			}
			j++
		}
		return j
	}
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		if _, ok := superValues[r]; !ok && r != '⁻' {
			break
		}
		i += n
	}
	return i
}

// scanGroup finds the end of a parenthesised unit group starting at s[i]
// == '('; ok is false if it holds anything but unit characters.
func scanGroup(s string, i int) (int, bool) {
	depth := 0
	for i < len(s) {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == '(':
			depth++
		case r == ')':
			depth--
			if depth == 0 {
				return i + n, true
			}
		case isSymbolRune(r), isMulSign(r), r == '/', r == '^', r == '-', r >= '0' && r <= '9':
		case unicode.IsSpace(r):
			return i, false
		default:
			if _, ok := superValues[r]; !ok && r != '⁻' {
				return i, false
			}
		}
		i += n
	}
	return i, false
}
