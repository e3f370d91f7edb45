package syntax

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/units"
)

// scanLiteral reads a number at r[i] and, if a unit follows (after at most
// spaces), the unit: the quantity token. It returns the offset after what
// it read.
func scanLiteral(r []rune, i, to int) (*Number, *Quantity, int, *Error) {
	start := i
	i = numberEnd(r, i, to)
	numText := string(r[start:i])
	if i < to && (r[i] == '.' && !(i+1 < to && r[i+1] == '.') || (r[i] >= '0' && r[i] <= '9')) {
		j := i
		for j < to && (r[j] == '.' || IsNamePart(r[j])) {
			j++
		}
		return nil, nil, i, errAt(start, j, "write a number as 12, 0.5 or 1.5e-3", "malformed number %q", string(r[start:j]))
	}
	val, err := parseNumber(numText, start, i)
	if err != nil {
		return nil, nil, i, err
	}
	if i < to && r[i] == 'π' {
		return &Number{Pos: Span{start, i}, Text: numText, Value: val}, nil, i, nil // 2π
	}
	// 4j, 4j A: an imaginary part, j the imaginary unit of IEC 60027-1.
	imag := i < to && r[i] == ImagUnit && (i+1 == to || !IsNamePart(r[i+1]))
	if imag {
		i++
		numText += string(ImagUnit)
	}
	j := skipBlanks(r, i, to)
	rest := string(r[j:to])
	n := units.ScanCompact(rest)
	if j > i && (isWord(r, j, to, StepWord) || isWord(r, j, to, WhenWord) || isWord(r, j, to, ElseWord)) {
		n = 0 // "0 .. 10 by 2", "1 when ...": the words of the grammar, not units
	}
	if n == 0 {
		if j == i && j < to && IsNameStart(r[j]) {
			// "2_x": an underscore glued to a number.
			return nil, nil, i, errAt(start, j+1, "write a number as 12, 0.5 or 1.5e-3; _ groups digits, as 3_000",
				"malformed number %q", numText+string(r[j]))
		}
		return &Number{Pos: Span{start, i}, Text: numText, Value: val, Imag: imag}, nil, i, nil
	}
	unitText := rest[:n]
	end := j + len([]rune(unitText))
	u, uerr := units.ParseCompact(unitText)
	if uerr != nil {
		return nil, nil, i, unitProblem(uerr, numText, unitText, start, i, j)
	}
	// "60 cm ^ 2" reads as (60 cm)², but its author almost always meant
	// 60 cm²: the unit ends at the space. Ask which.
	if k := skipBlanks(r, end, to); k > end && k < to && (r[k] == '^' || (r[k] == '*' && k+1 < to && r[k+1] == '*')) {
		return nil, nil, i, errAt(k, k+1, fmt.Sprintf("write %s %s^… for a power of the unit, or (%s %s)^… for a power of the quantity", numText, unitText, numText, unitText),
			"a power after a space is ambiguous after a quantity")
	}
	if u.ToSI(val) == 0 && val != 0 {
		return nil, nil, i, errAt(start, end, "check the number and its unit: a value below about 1e-308 in SI cannot be held; write 0 if zero is meant",
			"%s %s is too small to hold in SI: it would be 0", numText, unitText)
	}
	return nil, &Quantity{Pos: Span{start, end}, Text: numText, UnitText: unitText, Value: val, UnitAt: j, Unit: u, SI: u.ToSI(val), Imag: imag}, end, nil
}

// isWord reports whether r[j:to] starts with the word w, standing alone.
func isWord(r []rune, j, to int, w string) bool {
	k := j + len([]rune(w))
	return k <= to && string(r[j:k]) == w && (k == to || !IsNamePart(r[k]))
}

// numberEnd returns the offset after the digits, point and exponent of a
// number at r[i].
func numberEnd(r []rune, i, to int) int {
	digits := func() {
		n := 0
		for i < to && (r[i] >= '0' && r[i] <= '9' || (r[i] == '_' && n > 0 && i+1 < to && r[i+1] >= '0' && r[i+1] <= '9')) {
			i++
			n++
		}
	}
	digits()
	if i < to && r[i] == '.' && !(i+1 < to && r[i+1] == '.') {
		i++
		digits()
	}
	if i < to && (r[i] == 'e' || r[i] == 'E') {
		j := i + 1
		if j < to && (r[j] == '+' || r[j] == '-') {
			j++
		}
		if j < to && r[j] >= '0' && r[j] <= '9' {
			i = j
			digits()
		}
	}
	return i
}

// parseNumber converts a number as written, refusing one that overflows
// or that underflows to zero.
func parseNumber(text string, start, end int) (float64, *Error) {
	val, err := strconv.ParseFloat(strings.ReplaceAll(text, "_", ""), 64)
	if err != nil {
		if ne, ok := err.(*strconv.NumError); ok && ne.Err == strconv.ErrRange {
			if val == 0 {
				return 0, underflow(text, start, end)
			}
			return 0, errAt(start, end, "use a unit with a larger prefix, or an exponent that fits a float64", "number %s is out of range", text)
		}
		return 0, errAt(start, end, "write a number as 12, 0.5 or 1.5e-3", "malformed number %q", text)
	}
	if val == 0 && strings.ContainsAny(mantissa(text), "123456789") {
		return 0, underflow(text, start, end)
	}
	return val, nil
}

func underflow(text string, start, end int) *Error {
	return errAt(start, end, "check the exponent: a number below about 1e-308 cannot be held; write 0 if zero is meant",
		"number %s is too small to hold: it would be 0", text)
}

// mantissa is a number as written without its exponent.
func mantissa(num string) string {
	if i := strings.IndexAny(num, "eE"); i >= 0 {
		return num[:i]
	}
	return num
}

// unitProblem explains a unit after a number that does not parse. The
// number spans r[start:numEnd]; the unit starts at unitAt.
func unitProblem(err error, numText, unitText string, start, numEnd, unitAt int) *Error {
	ue, _ := err.(*units.Error)
	unknown := ue != nil && strings.HasPrefix(ue.Msg, "unknown unit") || strings.ContainsRune(unitText, '_')
	// A unit never holds _, so "m_x" is a name: guessing a unit for it
	// (mMx) would mislead.
	suggest := ""
	if unknown && !strings.ContainsRune(unitText, '_') {
		suggest = units.Suggest(unitText)
	}
	unitEnd := unitAt + len([]rune(unitText))
	if unknown && unitAt == numEnd {
		// "2x" or "1e": letters glued to a number that are not a unit.
		d := errAt(start, unitEnd, "put a space between a number and its unit, as 2 m, or * before a name, as "+numText+"*"+unitText,
			"malformed number %q", numText+unitText)
		if unitText[0] == 'e' || unitText[0] == 'E' {
			d.Hint = "an exponent needs digits, as 1e3 or 1.5e-3; " + d.Hint
		} else if suggest != "" {
			d.Hint = "did you mean " + numText + " " + suggest + "? " + d.Hint
		}
		return d
	}
	if unknown {
		hint := "to multiply a number by a name write " + numText + "*" + unitText
		if suggest != "" {
			hint = "did you mean " + numText + " " + suggest + "? " + hint
		}
		return errAt(unitAt, unitEnd, hint, "unknown unit %q after the number %s", unitText, numText)
	}
	if ue != nil {
		return errAt(unitAt+ue.Col, unitEnd, ue.Hint, "in %s %s: %s", numText, unitText, ue.Msg)
	}
	return errAt(unitAt, unitEnd, "", "in %s %s: %v", numText, unitText, err)
}

// skipBlanks skips spaces and tabs in r[i:to].
func skipBlanks(r []rune, i, to int) int {
	for i < to && (r[i] == ' ' || r[i] == '\t') {
		i++
	}
	return i
}
