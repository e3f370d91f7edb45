package engine

import (
	"fmt"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/expr-lang/expr/ast"
	"github.com/expr-lang/expr/conf"
	"github.com/expr-lang/expr/file"
	"github.com/expr-lang/expr/parser"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// MaxNesting bounds parentheses and function calls inside one formula.
const MaxNesting = 100

// errAt builds a diagnostic.
func errAt(pos diag.Pos, hint, format string, args ...any) *diag.Diagnostic {
	return &diag.Diagnostic{Pos: pos, Message: fmt.Sprintf(format, args...), Hint: hint}
}

// parseStatement reads one statement: its head (name and display unit, or
// the check keyword), its formula, and its annotations.
func parseStatement(t *text) (*Statement, *diag.Diagnostic) {
	st := &Statement{Pos: t.pos(skipSpace(t.runes, 0)), Text: strings.TrimSpace(t.String())}
	if len(t.runes) > MaxStatementLength {
		// Deep nesting makes a line long; name that cause when it is the one.
		if at := tooDeep(t.runes); at >= 0 {
			return st, errAt(t.pos(at), "name the inner parts as separate statements", "parentheses nested more than %d deep", MaxNesting)
		}
		return st, errAt(st.Pos, "split it into named parts", "statement is %d characters long; the limit is %d", len(t.runes), MaxStatementLength)
	}
	r := t.runes
	// The formula ends at the first ';'; what follows are annotations.
	end := len(r)
	for i, c := range r {
		if c == ';' {
			end = i
			break
		}
	}
	if err := parseNotes(st, t, end); err != nil {
		return st, err
	}
	// A '#' in the formula part starts a comment.
	for i := 0; i < end; i++ {
		if r[i] == '#' {
			end = i
			break
		}
	}

	i := skipSpace(r, 0)
	switch w, j := word(r, i); {
	case (w == "param" || w == "use") && j < end && unicode.IsSpace(r[j]) && skipSpace(r, j) < end && r[skipSpace(r, j)] == '=':
		return st, errAt(t.pos(i), "choose another name", "%s is a reserved word", w)
	case w == "param" && j < end && unicode.IsSpace(r[j]):
		return st, parseParam(st, t, skipSpace(r, j), end)
	case w == "use" && j < end && unicode.IsSpace(r[j]):
		return st, parseUse(st, t, skipSpace(r, j), end)
	}
	if w, j := word(r, i); w == "check" && (j == end || r[j] == ' ' || r[j] == '\t' || r[j] == '[') {
		st.Kind = Check
		i = skipSpace(r, j)
		if i < end && r[i] == '=' && (i+1 >= end || r[i+1] != '=') {
			return st, errAt(t.pos(skipSpace(r, 0)), "choose another name", "check is a reserved word")
		}
		var err *diag.Diagnostic
		if i, err = parseDisplay(st, t, i, end); err != nil {
			return st, err
		}
		if skipSpace(r[:end], i) == end {
			return st, errAt(t.pos(i), "write for example: check B_g <= 1.6 T", "check has no comparison")
		}
		st.Formula = strings.TrimSpace(string(r[i:end]))
		e, err := parseFormula(t, i, end)
		if err != nil {
			return st, err
		}
		cmp, ok := e.(*Binary)
		if !ok || !isComparison(cmp.Op) {
			return st, errAt(e.Pos(), "write left <= right, left >= right, left < right, left > right or left == right",
				"a check needs one comparison")
		}
		st.Expr = cmp
		return st, nil
	}

	name, j := identifier(r, i)
	if name == "" {
		return st, errAt(t.pos(i), "write name = expression, or check left <= right",
			"a statement must start with a name or with check")
	}
	st.Kind = Definition
	st.Name, st.NamePos = name, t.pos(i)
	if err := validName(name, st.NamePos); err != nil {
		return st, err
	}
	i = skipSpace(r, j)
	var err *diag.Diagnostic
	if i, err = parseDisplay(st, t, i, end); err != nil {
		return st, err
	}
	if i >= end || r[i] != '=' || (i+1 < end && r[i+1] == '=') {
		at := min(i, end)
		if at < end && (r[at] == ':' && at+1 < end && r[at+1] == '=') {
			return st, errAt(t.pos(at), "sheaf defines with a plain =: write "+name+" = ...", "unexpected :=")
		}
		return st, errAt(t.pos(at), "write "+name+" = expression", "expected = after %s", name)
	}
	i++
	if skipSpace(r[:end], i) == end {
		return st, errAt(t.pos(i), "write the formula or value after =", "%s = has nothing on the right", name)
	}
	st.Formula = strings.TrimSpace(string(r[i:end]))
	e, err := parseFormula(t, i, end)
	if err != nil {
		return st, err
	}
	if b, ok := e.(*Binary); ok && isComparison(b.Op) {
		return st, errAt(b.Pos(), "write comparisons as checks: check left <= right", "a definition cannot hold a comparison")
	}
	st.Expr = e
	return st, nil
}

// tooDeep returns the offset of the first parenthesis nested more than
// MaxNesting deep in the formula part of r (before any ';' or '#'), or -1.
func tooDeep(r []rune) int {
	depth := 0
	for i, c := range r {
		switch c {
		case '(':
			if depth++; depth > MaxNesting {
				return i
			}
		case ')':
			depth--
		case ';', '#':
			return -1
		}
	}
	return -1
}

// parseDisplay reads an optional "[unit]" at r[i].
func parseDisplay(st *Statement, t *text, i, end int) (int, *diag.Diagnostic) {
	r := t.runes
	if i >= end || r[i] != '[' {
		return i, nil
	}
	close := -1
	for j := i + 1; j < end; j++ {
		if r[j] == ']' {
			close = j
			break
		}
	}
	if close < 0 {
		return i, errAt(t.pos(i), "close the display unit with ]", "display unit has no closing ]")
	}
	st.DisplayText = strings.TrimSpace(string(r[i+1 : close]))
	st.DisplayPos = t.pos(i + 1 + leadingSpace(r[i+1:close]))
	u, err := units.Parse(st.DisplayText)
	if err != nil {
		return i, unitError(err, st.DisplayPos, "display unit")
	}
	st.Display = &u
	return skipSpace(r, close+1), nil
}

// unitError turns a units.Error into a diagnostic at the right column.
func unitError(err error, at diag.Pos, what string) *diag.Diagnostic {
	if ue, ok := err.(*units.Error); ok {
		return errAt(at.Shift(ue.Col), ue.Hint, "%s: %s", what, ue.Msg)
	}
	return errAt(at, "", "%s: %v", what, err)
}

// parseNotes reads the annotations after the first ';'. An annotation is
// `key: value` for a key sheaf knows (source, assume, assumes, accept
// <code>, and example, a value that starter sheets give a template
// parameter); any other text is the statement's description.
func parseNotes(st *Statement, t *text, from int) *diag.Diagnostic {
	r := t.runes
	for i := from; i < len(r); {
		// A ; inside parentheses belongs to the note: "(from memory; check
		// the current edition)".
		j, depth := i+1, 0
		for j < len(r) && (r[j] != ';' || depth > 0) {
			switch r[j] {
			case '(':
				depth++
			case ')':
				if depth > 0 {
					depth--
				}
			}
			j++
		}
		raw := string(r[i+1 : j])
		val := strings.TrimSpace(strings.ReplaceAll(raw, "\n", " "))
		at := t.pos(i + 1 + leadingSpace(r[i+1:j]))
		i = j
		if val == "" {
			continue
		}
		if n, ok := noteOf(val, at); ok {
			switch n.Key {
			case "source":
				st.Source = joinNote(st.Source, n.Value)
			case "assume":
				st.Assumption = joinNote(st.Assumption, n.Value)
			case "assumes":
				for _, id := range strings.Split(n.Value, ",") {
					if id = strings.TrimSpace(id); id != "" {
						st.Assumes = append(st.Assumes, id)
					}
				}
			}
			st.Notes = append(st.Notes, n)
			continue
		}
		st.Description = joinNote(st.Description, val)
	}
	return nil
}

func joinNote(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}

// noteKeys are the annotation keys sheaf understands.
var noteKeys = map[string]bool{"source": true, "assume": true, "assumes": true, "accept": true, "example": true}

// noteOf reads "key: value" or "accept code: reason"; ok is false for text
// that is not an annotation sheaf knows.
func noteOf(val string, at diag.Pos) (Note, bool) {
	head, rest, found := strings.Cut(val, ":")
	if !found {
		return Note{}, false
	}
	fields := strings.Fields(strings.ToLower(head))
	if len(fields) == 0 || !noteKeys[fields[0]] {
		return Note{}, false
	}
	n := Note{Key: fields[0], Value: strings.TrimSpace(rest), Pos: at}
	switch {
	case n.Key == "accept" && len(fields) == 2:
		n.Arg = fields[1]
	case len(fields) != 1:
		return Note{}, false
	}
	return n, true
}

func skipSpace(r []rune, i int) int {
	for i < len(r) && unicode.IsSpace(r[i]) {
		i++
	}
	return i
}

func leadingSpace(r []rune) int { return skipSpace(r, 0) }

// word reads a run of letters at r[i].
func word(r []rune, i int) (string, int) {
	j := i
	for j < len(r) && unicode.IsLetter(r[j]) {
		j++
	}
	return string(r[i:j]), j
}

func isIdentStart(c rune) bool { return unicode.IsLetter(c) || c == '_' }
func isIdentPart(c rune) bool  { return unicode.IsLetter(c) || unicode.IsDigit(c) || c == '_' }

// identifier reads a name at r[i].
func identifier(r []rune, i int) (string, int) {
	if i >= len(r) || !isIdentStart(r[i]) {
		return "", i
	}
	j := i + 1
	for j < len(r) && isIdentPart(r[j]) {
		j++
	}
	return string(r[i:j]), j
}

// reserved are words the formula parser gives a meaning of its own.
var reserved = map[string]bool{
	"check": true, "use": true, "param": true, "with": true, "extrapolate": true, "in": true, "not": true, "and": true, "or": true, "let": true, "if": true, "else": true,
	"true": true, "false": true, "nil": true, "matches": true, "contains": true, "startsWith": true, "endsWith": true,
}

// validName checks a name that a statement defines.
func validName(name string, at diag.Pos) *diag.Diagnostic {
	switch {
	case strings.HasPrefix(name, "_"):
		return errAt(at, "start the name with a letter", "name %s starts with _", name)
	case strings.HasSuffix(name, "_"):
		return errAt(at, "remove the trailing _, or add the subscript after it", "name %s ends with _", name)
	case strings.Contains(name, "__"):
		return errAt(at, "use one _ between a symbol and its subscript", "name %s has a double _", name)
	case reserved[name]:
		return errAt(at, "choose another name", "%s is a reserved word", name)
	}
	if _, ok := functions[name]; ok {
		return errAt(at, "choose another name, for example "+name+"_1", "%s is the name of a built-in function", name)
	}
	if _, ok := units.ConstantByName(name); ok {
		return errAt(at, "use the built-in "+name+" directly, or choose another name", "%s is a built-in constant", name)
	}
	return nil
}

// scanned is a formula prepared for the expression parser.
type scanned struct {
	text     string
	origin   []int // origin[i] is the statement rune offset of text rune i
	literals map[string]*Quantity
}

// prescan replaces every "number unit" literal in t.runes[from:to] by a
// placeholder name, turns ≤ ≥ × · − into the parser's operators, and checks
// parentheses, so that the expression parser sees only what it knows.
func prescan(t *text, from, to int) (*scanned, *diag.Diagnostic) {
	r := t.runes
	s := &scanned{literals: map[string]*Quantity{}}
	var b strings.Builder
	emit := func(str string, origin int) {
		for _, c := range str {
			b.WriteRune(c)
			s.origin = append(s.origin, origin)
		}
	}
	var opens []int
	for i := from; i < to; {
		c := r[i]
		switch {
		case isIdentStart(c):
			j := i
			for j < to && isIdentPart(r[j]) {
				j++
			}
			if c == '_' {
				// No name may start with _ (validName), and _q0, _q1, ... are
				// the placeholders for literals below: refuse it here.
				return nil, errAt(t.pos(i), "names start with a letter", "name %s starts with _", string(r[i:j]))
			}
			// A qualified name reaches into a template instance or a
			// table: coil_a.lambda, BH.B.
			for j+1 < to && r[j] == '.' && isIdentStart(r[j+1]) && r[j+1] != '_' {
				j += 2
				for j < to && isIdentPart(r[j]) {
					j++
				}
			}
			for k := i; k < j; k++ {
				emit(string(r[k]), k)
			}
			i = j
			continue
		case c >= '0' && c <= '9' || (c == '.' && i+1 < to && r[i+1] >= '0' && r[i+1] <= '9'):
			q, j, err := scanLiteral(t, i, to)
			if err != nil {
				return nil, err
			}
			if q == nil {
				for k := i; k < j; k++ {
					emit(string(r[k]), k)
				}
			} else {
				name := "_q" + strconv.Itoa(len(s.literals))
				s.literals[name] = q
				emit(name, i)
			}
			i = j
			continue
		case c == '(':
			opens = append(opens, i)
			if len(opens) > MaxNesting {
				return nil, errAt(t.pos(i), "name the inner parts as separate statements", "parentheses nested more than %d deep", MaxNesting)
			}
		case c == ')':
			if len(opens) == 0 {
				return nil, errAt(t.pos(i), "remove it or add the matching (", "unbalanced parentheses: this ) has no matching (")
			}
			opens = opens[:len(opens)-1]
		case c == '≤':
			emit("<=", i)
			i++
			continue
		case c == '≥':
			emit(">=", i)
			i++
			continue
		case c == '×' || c == '·' || c == '⋅':
			emit("*", i)
			i++
			continue
		case c == '−':
			emit("-", i)
			i++
			continue
		case c == '%':
			return nil, errAt(t.pos(i), "write percent after a number, as 5 %", "%% must follow a number")
		case c == '"' || c == '\'' || c == '`':
			return nil, errAt(t.pos(i), "formulas hold numbers, units and names; put text after a ;", "text in quotes is not allowed in a formula")
		case c == '[' || c == ']' || c == '{' || c == '}':
			return nil, errAt(t.pos(i), "use ( ) for grouping", "%c is not allowed in a formula", c)
		case c == '|' || c == '&' || c == '?' || c == '$' || c == '~' || c == '!' || c == '@' || c == '\\':
			return nil, errAt(t.pos(i), "formulas use + - * / ^ and functions such as sqrt( )", "%c is not an operator sheaf knows", c)
		case c == '.':
			return nil, errAt(t.pos(i), "names cannot contain a dot; use _ for subscripts", "unexpected .")
		case c == utf8.RuneError:
			// The sheet reader put U+FFFD where the file had a byte that is not UTF-8.
			return nil, errAt(t.pos(i), "save the file as UTF-8, and retype this character", "the formula holds a byte that is not valid UTF-8")
		case c == ',' || c == '+' || c == '-' || c == '*' || c == '/' || c == '^' || c == '<' || c == '>' || c == '=' || unicode.IsSpace(c):
		default:
			return nil, errAt(t.pos(i), "formulas use names, numbers with units, + - * / ^ ( ) and functions", "unexpected character %q", c)
		}
		emit(string(c), i)
		i++
	}
	if len(opens) > 0 {
		return nil, errAt(t.pos(opens[len(opens)-1]), "add the missing )", "unbalanced parentheses: this ( is never closed")
	}
	s.text = b.String()
	s.origin = append(s.origin, to)
	return s, nil
}

// scanLiteral reads a number at r[i] and, if a unit follows (after at most
// spaces), the unit. It returns nil for a plain number and the offset after
// what it read.
func scanLiteral(t *text, i, to int) (*Quantity, int, *diag.Diagnostic) {
	r := t.runes
	start := i
	digits := func() int {
		n := 0
		for i < to && (r[i] >= '0' && r[i] <= '9' || (r[i] == '_' && n > 0 && i+1 < to && r[i+1] >= '0' && r[i+1] <= '9')) {
			i++
			n++
		}
		return n
	}
	digits()
	if i < to && r[i] == '.' {
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
	numText := string(r[start:i])
	if i < to && (r[i] == '.' || (r[i] >= '0' && r[i] <= '9')) {
		j := i
		for j < to && (r[j] == '.' || isIdentPart(r[j])) {
			j++
		}
		return nil, i, errAt(t.pos(start), "write a number as 12, 0.5 or 1.5e-3", "malformed number %q", string(r[start:j]))
	}
	val, err := strconv.ParseFloat(strings.ReplaceAll(numText, "_", ""), 64)
	if err != nil {
		if ne, ok := err.(*strconv.NumError); ok && ne.Err == strconv.ErrRange {
			return nil, i, errAt(t.pos(start), "use a unit with a larger prefix, or an exponent that fits a float64", "number %s is out of range", numText)
		}
		return nil, i, errAt(t.pos(start), "write a number as 12, 0.5 or 1.5e-3", "malformed number %q", numText)
	}
	j := i
	for j < to && (r[j] == ' ' || r[j] == '\t') {
		j++
	}
	rest := string(r[j:to])
	n := units.ScanCompact(rest)
	if n == 0 {
		if j == i && j < to && isIdentStart(r[j]) {
			// "2_x": an underscore glued to a number.
			return nil, i, errAt(t.pos(start), "write a number as 12, 0.5 or 1.5e-3; _ groups digits, as 3_000",
				"malformed number %q", numText+string(r[j]))
		}
		return nil, i, nil
	}
	unitText := rest[:n]
	unitRunes := len([]rune(unitText))
	unitPos := t.pos(j)
	u, uerr := units.ParseCompact(unitText)
	ue, _ := uerr.(*units.Error)
	unknown := uerr != nil && (ue != nil && strings.HasPrefix(ue.Msg, "unknown unit") || strings.ContainsRune(unitText, '_'))
	// A unit never holds _, so "m_x" is a name: guessing a unit for it
	// (mMx) would mislead.
	suggest := ""
	if unknown && !strings.ContainsRune(unitText, '_') {
		suggest = units.Suggest(unitText)
	}
	if unknown && j == i {
		// "2x" or "1e": letters glued to a number that are not a unit.
		d := errAt(t.pos(start), "put a space between a number and its unit, as 2 m, or * before a name, as "+numText+"*"+unitText,
			"malformed number %q", numText+unitText)
		if unitText[0] == 'e' || unitText[0] == 'E' {
			d.Hint = "an exponent needs digits, as 1e3 or 1.5e-3; " + d.Hint
		} else if suggest != "" {
			d.Hint = "did you mean " + numText + " " + suggest + "? " + d.Hint
		}
		return nil, i, d
	}
	if uerr != nil {
		d := unitError(uerr, unitPos, "in "+numText+" "+unitText)
		if unknown {
			d.Message = fmt.Sprintf("unknown unit %q after the number %s", unitText, numText)
			d.Hint = "to multiply a number by a name write " + numText + "*" + unitText
			if suggest != "" {
				d.Hint = "did you mean " + numText + " " + suggest + "? " + d.Hint
			}
		}
		return nil, i, d
	}
	end := j + unitRunes
	// "60 cm ^ 2" reads as (60 cm)², but its author almost always meant
	// 60 cm²: the unit ends at the space. Ask which.
	if k := skipBlanks(r, end, to); k > end && k < to && (r[k] == '^' || (r[k] == '*' && k+1 < to && r[k+1] == '*')) {
		return nil, i, errAt(t.pos(k), fmt.Sprintf("write %s %s^… for a power of the unit, or (%s %s)^… for a power of the quantity", numText, unitText, numText, unitText),
			"a power after a space is ambiguous after a quantity")
	}
	q := &Quantity{Text: numText, UnitText: unitText, Value: val, Unit: u, SI: u.ToSI(val)}
	q.setPos(t.pos(start))
	return q, end, nil
}

// skipBlanks skips spaces and tabs in r[i:to].
func skipBlanks(r []rune, i, to int) int {
	for i < to && (r[i] == ' ' || r[i] == '\t') {
		i++
	}
	return i
}

// parserConfig is built once: building it allocates the expression
// parser's table of built-ins, which would dominate the cost of parsing.
// The parser only reads it. Our own nesting limit applies, not its node
// budget.
var parserConfig = func() *conf.Config {
	c := conf.CreateNew()
	c.MaxNodes = 0
	return c
}()

// parseFormula reads the formula in t.runes[from:to].
func parseFormula(t *text, from, to int) (Expr, *diag.Diagnostic) {
	s, err := prescan(t, from, to)
	if err != nil {
		return nil, err
	}
	tree, perr := parser.ParseWithConfig(s.text, parserConfig)
	if perr != nil {
		return nil, s.parseError(t, perr)
	}
	c := converter{t: t, s: s}
	e := c.convert(tree.Node)
	if c.err != nil {
		return nil, c.err
	}
	return e, nil
}

// at maps a location in the scanned text back to a file position.
func (s *scanned) at(t *text, off int) diag.Pos {
	if off < 0 {
		off = 0
	}
	if off >= len(s.origin) {
		off = len(s.origin) - 1
	}
	return t.pos(s.origin[off])
}

// parseError rewrites the expression parser's messages in sheaf's words.
func (s *scanned) parseError(t *text, err error) *diag.Diagnostic {
	fe, ok := err.(*file.Error)
	if !ok {
		return errAt(t.pos(s.origin[0]), "", "cannot read formula: %v", err)
	}
	pos := s.at(t, fe.From)
	msg := fe.Message
	switch {
	case strings.HasPrefix(msg, "unexpected end"):
		return errAt(pos, "complete the formula", "formula ends too early")
	case strings.HasPrefix(msg, "unexpected token EOF"):
		// The parser places the end at the last token read: "1 +" points
		// at the +, which is where the formula stops short.
		hint := "complete the formula"
		if tok := s.tokenAt(fe.From); tok != "" && !strings.HasPrefix(tok, "_q") {
			hint += " after " + tok
		}
		return errAt(pos, hint, "formula ends too early")
	case strings.HasPrefix(msg, "unexpected token"):
		tok := s.tokenAt(fe.From)
		if tok == "" {
			return errAt(pos, "complete the formula", "formula ends too early")
		}
		if strings.HasPrefix(tok, "_q") {
			return errAt(pos, "put an operator such as * between the two", "a quantity follows another term without an operator")
		}
		return errAt(pos, "check for a missing operator or a stray symbol", "unexpected %s", tok)
	}
	return errAt(pos, "", "cannot read formula: %s", msg)
}

// tokenAt returns the token of the scanned text that starts at off.
func (s *scanned) tokenAt(off int) string {
	r := []rune(s.text)
	if off >= len(r) {
		return ""
	}
	j := off + 1
	if isIdentPart(r[off]) {
		for j < len(r) && isIdentPart(r[j]) {
			j++
		}
	}
	return string(r[off:j])
}

// converter turns the expression parser's tree into sheaf's.
type converter struct {
	t     *text
	s     *scanned
	err   *diag.Diagnostic
	depth int
}

func (c *converter) fail(n ast.Node, hint, format string, args ...any) Expr {
	if c.err == nil {
		c.err = errAt(c.s.at(c.t, n.Location().From), hint, format, args...)
	}
	return nil
}

func (c *converter) convert(n ast.Node) Expr {
	if c.err != nil || n == nil {
		return nil
	}
	c.depth++
	defer func() { c.depth-- }()
	if c.depth > 4*MaxNesting {
		// A long sum nests as deep as long parentheses do: say both.
		return c.fail(n, "split it into named parts, each a few terms long",
			"formula nested too deeply: more than %d operations or calls inside one another", 4*MaxNesting)
	}
	pos := c.s.at(c.t, n.Location().From)
	switch n := n.(type) {
	case *ast.IntegerNode:
		e := &Number{Text: c.source(n), Value: float64(n.Value)}
		e.setPos(pos)
		return e
	case *ast.FloatNode:
		e := &Number{Text: c.source(n), Value: n.Value}
		e.setPos(pos)
		return e
	case *ast.IdentifierNode:
		if q, ok := c.s.literals[n.Value]; ok {
			return q
		}
		e := &Ref{Name: n.Value}
		e.setPos(pos)
		return e
	case *ast.UnaryNode:
		if n.Operator != "-" && n.Operator != "+" {
			return c.fail(n, "formulas use + - * / ^", "operator %s is not supported", n.Operator)
		}
		x := c.convert(n.Node)
		e := &Unary{Op: n.Operator, X: x}
		e.setPos(pos)
		return e
	case *ast.BinaryNode:
		op := n.Operator
		switch op {
		case "**":
			op = "^"
		case "+", "-", "*", "/", "^", "<", "<=", ">", ">=", "==":
		case "&&":
			// The parser reads a < b < c as a < b && b < c; prescan refuses
			// a written &&, so this is always a chain.
			return c.fail(n, "write each comparison as its own check: check a < b, then check b < c",
				"a check holds one comparison; a < b < c chains two")
		case "and":
			return c.fail(n, "write each comparison as its own check", "a check holds one comparison; 'and' is not supported")
		default:
			return c.fail(n, "formulas use + - * / ^", "operator %s is not supported", op)
		}
		x, y := c.convertChain(n, n.Left), c.convert(n.Right)
		if isComparison(op) {
			for _, side := range []Expr{x, y} {
				if b, ok := side.(*Binary); ok && isComparison(b.Op) {
					return c.fail(n, "write each comparison as its own check", "a check holds one comparison")
				}
			}
		}
		e := &Binary{Op: op, X: x, Y: y}
		e.setPos(pos)
		return e
	case *ast.CallNode:
		id, ok := n.Callee.(*ast.IdentifierNode)
		if !ok {
			return c.fail(n, "", "only built-in functions can be called")
		}
		return c.call(n, id.Value, n.Arguments, pos)
	case *ast.BuiltinNode:
		return c.call(n, n.Name, n.Arguments, pos)
	case *ast.MemberNode:
		if name, ok := qualifiedName(n); ok {
			e := &Ref{Name: name}
			e.setPos(c.s.at(c.t, qualifiedStart(n)))
			return e
		}
		return c.fail(n, "names use _ for subscripts; a dot reaches into a template instance or a table, as in coil_a.lambda", "unexpected .")
	case *ast.ChainNode:
		return c.fail(n, "names use _ for subscripts; a dot reaches into a template instance or a table, as in coil_a.lambda", "unexpected .")
	case *ast.ConditionalNode:
		return c.fail(n, "", "conditional expressions are not supported")
	case *ast.StringNode, *ast.BytesNode:
		return c.fail(n, "put text after a ;", "text is not allowed in a formula")
	case *ast.BoolNode, *ast.NilNode:
		return c.fail(n, "choose another name", "%s is a reserved word", c.source(n))
	case *ast.SequenceNode:
		return c.fail(n, "", "one formula per statement")
	}
	return c.fail(n, "formulas use names, numbers with units, + - * / ^ ( ) and functions", "this is not a formula sheaf understands")
}

// convertChain converts the left operand of a binary operation. A flat
// sum or product (a + b + c, a * b / c) parses as a chain down the left:
// its length is not nesting, so a link of the same precedence does not
// count against the depth limit; only operands inside one another do.
func (c *converter) convertChain(n *ast.BinaryNode, left ast.Node) Expr {
	if l, ok := left.(*ast.BinaryNode); ok && sameLevel(n.Operator, l.Operator) {
		c.depth--
		defer func() { c.depth++ }()
	}
	return c.convert(left)
}

// sameLevel reports whether two operators chain left to right at one
// precedence: + and -, or * and /.
func sameLevel(a, b string) bool {
	level := func(op string) int {
		switch op {
		case "+", "-":
			return 1
		case "*", "/":
			return 2
		}
		return 0
	}
	return level(a) != 0 && level(a) == level(b)
}

func (c *converter) call(n ast.Node, name string, args []ast.Node, pos diag.Pos) Expr {
	f, ok := functions[name]
	if !ok {
		hint := "the functions are " + functionList()
		if s := closest(name, functionNames()); s != "" {
			hint = "did you mean " + s + "? " + hint
		}
		return c.fail(n, hint, "unknown function %s", name)
	}
	e := &Call{Name: name, Func: f}
	e.setPos(pos)
	for _, a := range args {
		if id, ok := a.(*ast.IdentifierNode); ok && id.Value == "extrapolate" {
			k := &Keyword{Word: id.Value}
			k.setPos(c.s.at(c.t, a.Location().From))
			e.Args = append(e.Args, k)
			continue
		}
		e.Args = append(e.Args, c.convert(a))
	}
	if len(e.Args) < f.MinArgs || (f.MaxArgs >= 0 && len(e.Args) > f.MaxArgs) {
		return c.fail(n, "write "+f.Usage, "%s takes %s", name, f.arity())
	}
	return e
}

// source returns the original text of a node, for numbers as written.
func (c *converter) source(n ast.Node) string {
	loc := n.Location()
	from, to := loc.From, loc.To
	if to <= from {
		to = from + 1
	}
	if from < 0 || to > len(c.s.origin)-1 {
		return ""
	}
	a, b := c.s.origin[from], c.s.origin[to-1]+1
	if b > len(c.t.runes) || a > b {
		return ""
	}
	return string(c.t.runes[a:b])
}

func isComparison(op string) bool {
	switch op {
	case "<", "<=", ">", ">=", "==":
		return true
	}
	return false
}

// qualifiedName flattens a.b.c, which the expression parser reads as
// member accesses, into one name.
func qualifiedName(n ast.Node) (string, bool) {
	switch n := n.(type) {
	case *ast.IdentifierNode:
		return n.Value, true
	case *ast.MemberNode:
		prop, ok := n.Property.(*ast.StringNode)
		if !ok || n.Optional || n.Method {
			return "", false
		}
		head, ok := qualifiedName(n.Node)
		return head + "." + prop.Value, ok
	}
	return "", false
}

// qualifiedStart is where a qualified name begins in the scanned text.
func qualifiedStart(n ast.Node) int {
	for {
		m, ok := n.(*ast.MemberNode)
		if !ok {
			return n.Location().From
		}
		n = m.Node
	}
}
