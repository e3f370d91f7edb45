// Package standards reads the clauses a statement names as applied: an
// annotation `; clause: IEC 60034-1:2017, 9.2` after a check says which
// standard, edition and clause the check applies, so that a checker can
// open the clause beside it and the package can list every standard it
// rests on.
package standards

import "strings"

// Key is the annotation's key, as written after a statement's `;`.
const Key = "clause"

// Clause is one clause a statement applies.
type Clause struct {
	// Text is the annotation as written: "IEC 60034-1:2017, 9.2 (from memory)".
	Text string
	// Standard is the part before the first comma, the standard and its
	// edition ("IEC 60034-1:2017"); Ref the rest, the clause, table or
	// figure ("9.2 (from memory)"), empty when the annotation names none.
	Standard, Ref string
}

// Split takes the clause annotations out of a statement's description,
// where the engine leaves every annotation it does not know, joined with
// "; ". It returns the description without them and the clauses, in the
// order written.
func Split(description string) (rest string, clauses []Clause) {
	if !strings.Contains(strings.ToLower(description), Key) {
		return description, nil // the common case, without allocating
	}
	var kept []string
	for _, part := range parts(description) {
		head, val, ok := strings.Cut(part, ":")
		if !ok || !strings.EqualFold(strings.TrimSpace(head), Key) {
			kept = append(kept, part)
			continue
		}
		val = strings.TrimSpace(val)
		if val == "" {
			continue
		}
		c := Clause{Text: val, Standard: val}
		if std, ref, found := strings.Cut(val, ","); found {
			c.Standard, c.Ref = strings.TrimSpace(std), strings.TrimSpace(ref)
		}
		clauses = append(clauses, c)
	}
	return strings.Join(kept, "; "), clauses
}

// parts splits a description at the "; " that join its annotations, but
// not inside parentheses, where a note keeps its own ("from memory; check
// the current edition").
func parts(s string) []string {
	var out []string
	depth, start := 0, 0
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '(':
			depth++
		case ')':
			if depth > 0 {
				depth--
			}
		case ';':
			if depth == 0 && i+1 < len(s) && s[i+1] == ' ' {
				out = append(out, s[start:i])
				start = i + 2
				i++
			}
		}
	}
	return append(out, s[start:])
}
