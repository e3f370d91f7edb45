package engine

import (
	"fmt"
	"strings"
	"unicode"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine/syntax"
	"github.com/sheaf-calc/sheaf/units"
)

// MaxNesting bounds parentheses and function calls inside one formula.
const MaxNesting = syntax.MaxNesting

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
	case (w == "param" || w == "use" || w == "take") && j < end && unicode.IsSpace(r[j]) && skipSpace(r, j) < end && r[skipSpace(r, j)] == '=':
		return st, errAt(t.pos(i), "choose another name", "%s is a reserved word", w)
	case w == "param" && j < end && unicode.IsSpace(r[j]):
		return st, parseParam(st, t, skipSpace(r, j), end)
	case w == "use" && j < end && unicode.IsSpace(r[j]):
		return st, parseUse(st, t, skipSpace(r, j), end)
	case w == "take" && j < end && unicode.IsSpace(r[j]) && skipSpace(r, j) < end && r[skipSpace(r, j)] != '=':
		return st, parseTake(st, t, skipSpace(r, j), end)
	}
	if conditionHead(r, i, end) {
		if w, _ := word(r, i); w == "case" {
			return st, parseCase(st, t, i, end)
		}
		return st, parseSweep(st, t, i, end)
	}
	if w, j := word(r, i); w == "sample" && j < end && unicode.IsSpace(r[j]) && skipSpace(r, j) < end && unicode.IsDigit(r[skipSpace(r, j)]) {
		return st, parseSampling(st, t, i, end)
	}
	if w, j := word(r, i); w == "check" && (j == end || r[j] == ' ' || r[j] == '\t' || r[j] == '[') {
		return st, parseCheck(st, t, j, end)
	}
	return st, parseDefinition(st, t, i, end)
}

// parseCheck reads `check [unit] left <op> right` from r[at:end], at the
// end of the word check.
func parseCheck(st *Statement, t *text, at, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = Check
	i := skipSpace(r, at)
	if i < end && r[i] == '=' && (i+1 >= end || r[i+1] != '=') {
		return errAt(t.pos(skipSpace(r, 0)), "choose another name", "check is a reserved word")
	}
	i, err := parseDisplay(st, t, i, end)
	if err != nil {
		return err
	}
	if skipSpace(r[:end], i) == end {
		return errAt(t.pos(i), "write for example: check B_g <= 1.6 T", "check has no comparison")
	}
	st.Formula = strings.TrimSpace(string(r[i:end]))
	if at := loneEquals(r, i, end); at >= 0 {
		return errAt(t.pos(at), "a check compares with ==, <=, >=, < or >: write check "+
			strings.TrimSpace(string(r[i:at]))+" == "+strings.TrimSpace(string(r[at+1:end])),
			"= defines a name; a check needs a comparison")
	}
	e, err := parseFormula(t, i, end)
	if err != nil {
		return err
	}
	cmp, ok := e.(*Binary)
	if !ok || !isComparison(cmp.Op) {
		return errAt(e.Pos(), "write left <= right, left >= right, left < right, left > right or left == right",
			"a check needs one comparison")
	}
	st.Expr = cmp
	return nil
}

// parseDefinition reads `name [unit] = formula` from r[i:end].
func parseDefinition(st *Statement, t *text, i, end int) *diag.Diagnostic {
	r := t.runes
	name, j := identifier(r, i)
	if name == "" {
		return errAt(t.pos(i), "write name = expression, or check left <= right",
			"a statement must start with a name or with check")
	}
	st.Kind = Definition
	st.Name, st.NamePos = name, t.pos(i)
	if err := validName(name, st.NamePos); err != nil {
		return err
	}
	if j < end && r[j] == '(' {
		return parseFunctionDef(st, t, j, end)
	}
	i, err := parseDisplay(st, t, skipSpace(r, j), end)
	if err != nil {
		return err
	}
	if i >= end || r[i] != '=' || (i+1 < end && r[i+1] == '=') {
		at := min(i, end)
		if at < end && (r[at] == ':' && at+1 < end && r[at+1] == '=') {
			return errAt(t.pos(at), "sheaf defines with a plain =: write "+name+" = ...", "unexpected :=")
		}
		return errAt(t.pos(at), "write "+name+" = expression", "expected = after %s", name)
	}
	i++
	if skipSpace(r[:end], i) == end {
		return errAt(t.pos(i), "write the formula or value after =", "%s = has nothing on the right", name)
	}
	if k := splitTolerance(r, i, end); k < end {
		if err := parseTolerance(st, t, k, end); err != nil {
			return err
		}
		end = k
	}
	st.Formula = strings.TrimSpace(string(r[i:end]))
	e, err := parseFormula(t, i, end)
	if err != nil {
		return err
	}
	if b, ok := e.(*Binary); ok && isComparison(b.Op) {
		return errAt(b.Pos(), "write comparisons as checks: check left <= right", "a definition cannot hold a comparison")
	}
	st.Expr = e
	return nil
}

// loneEquals returns the offset of the first = in r[from:to] that is not
// part of ==, <=, >= or !=, or -1.
func loneEquals(r []rune, from, to int) int {
	for i := from; i < to; i++ {
		if r[i] != '=' {
			continue
		}
		if i+1 < to && r[i+1] == '=' {
			i++
			continue
		}
		if i > from && strings.ContainsRune("<>=!", r[i-1]) {
			continue
		}
		return i
	}
	return -1
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
var noteKeys = map[string]bool{"source": true, "assume": true, "assumes": true, "accept": true, "example": true, "draw": true}

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
	"check": true, "use": true, "param": true, "take": true, "with": true, "by": true, "when": true, "extrapolate": true, "in": true, "not": true, "and": true, "or": true, "let": true, "if": true, "else": true,
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

func isComparison(op string) bool {
	switch op {
	case "<", "<=", ">", ">=", "==":
		return true
	}
	return false
}
