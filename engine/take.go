package engine

import (
	"errors"
	"fmt"
	"strings"

	"github.com/sheaf-calc/sheaf/diag"
)

// A sheet takes a result of another sheet of the package with
//
//	take Phi_0 = pole0.Phi from 01-field-coil ; the no-load flux
//	take B_g from 01-field-coil
//
// The value is live: it is the other sheet's result in this build, so it
// cannot go stale as a number typed across can. The other sheet is
// compiled first; sheets that take from each other in a cycle are refused.

// parseTake reads `take name [unit] [= remote] from sheet`.
func parseTake(st *Statement, t *text, i, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = Take
	const example = "write for example: take Phi_0 = Phi from 01-field-coil"
	name, j := identifier(r, i)
	if name == "" {
		return errAt(t.pos(i), example, "take needs the name the result gets in this sheet")
	}
	st.Name, st.NamePos, st.Remote, st.RemotePos = name, t.pos(i), name, t.pos(i)
	if err := validName(name, st.NamePos); err != nil {
		return err
	}
	j = skipSpace(r, j)
	var err *diag.Diagnostic
	if j, err = parseDisplay(st, t, j, end); err != nil {
		return err
	}
	if j < end && r[j] == '=' {
		j = skipSpace(r, j+1)
		remote, k := qualified(r, j)
		if remote == "" {
			return errAt(t.pos(j), example, "expected the name of the result in the other sheet after =")
		}
		st.Remote, st.RemotePos, j = remote, t.pos(j), skipSpace(r, k)
	}
	if w, k := word(r, j); w != "from" || k >= end {
		return errAt(t.pos(j), example, "expected from and the sheet after take %s", name)
	} else {
		j = skipSpace(r, k)
	}
	ref := strings.TrimSpace(string(r[j:end]))
	if ref == "" || strings.ContainsAny(ref, " \t") {
		return errAt(t.pos(j), example+"; a sheet is named by its path in the package, without spaces", "take %s needs one sheet after from", name)
	}
	st.From = ref
	st.FromPos = t.pos(j)
	st.Formula = st.Remote + " from " + ref
	return nil
}

// qualified reads a name that may reach into an instance: pole0.Phi.
func qualified(r []rune, i int) (string, int) {
	name, j := identifier(r, i)
	for name != "" && j+1 < len(r) && r[j] == '.' && isIdentStart(r[j+1]) {
		part, k := identifier(r, j+1)
		name, j = name+"."+part, k
	}
	return name, j
}

// TakenSheets lists the sheets a sheet's take statements name, as written,
// with where each is written, so that a package can compile the sheets
// taken from first.
func TakenSheets(src SheetSource) []TakeRef {
	var out []TakeRef
	for _, b := range src.Blocks {
		for _, t := range splitStatements(b) {
			if w, j := word(t.runes, skipSpace(t.runes, 0)); w != "take" || j >= len(t.runes) || !isBlank(t.runes[j]) {
				continue
			}
			st, err := parseStatement(t)
			if err == nil && st.Kind == Take {
				out = append(out, TakeRef{Sheet: st.From, Pos: st.FromPos})
			}
		}
	}
	return out
}

// TakeRef is a sheet named by a take statement, and where.
type TakeRef struct {
	Sheet string
	Pos   diag.Pos
}

func isBlank(c rune) bool { return c == ' ' || c == '\t' }

// resolveTakes finds, for every take statement, the other sheet's result,
// and gives the statement its type.
func (s *Calc) resolveTakes(find func(ref, from string) (*Calc, string, error)) {
	for _, st := range s.Statements {
		if st.Kind != Take || st.Verdict == Errored {
			continue
		}
		if st.Instance != "" {
			s.fail(st, errAt(st.Pos, "take the result in the sheet that uses the template, and pass it in with use ... with", "a template cannot take from another sheet"))
			continue
		}
		if find == nil {
			s.fail(st, errAt(st.FromPos, "take reads the sheets of a package: check the package folder", "other sheets are not available here"))
			continue
		}
		other, path, err := find(st.From, s.Path)
		if err != nil {
			hint := "name a sheet of the package by its path, without .md, relative to this sheet"
			var te *TakeError
			if errors.As(err, &te) {
				hint = te.Hint
			}
			s.fail(st, errAt(st.FromPos, hint, "%v", err))
			continue
		}
		target := other.Lookup(st.Remote)
		if lo := other.leftOut[st.Remote]; target == nil && lo != nil {
			s.fail(st, errAt(st.RemotePos, fmt.Sprintf("set %s in the use statement of %s at %d:%d", strings.Join(lo.params, ", "), path, lo.use.Pos.Line, lo.use.Pos.Col),
				"%s leaves %s out: it rests on %s, which its use statement does not set", path, st.Remote, lo.inputs()))
			continue
		}
		if target == nil || target.Kind != Definition && target.Kind != Take {
			hint := "take a result that sheet defines"
			if c := closest(st.Remote, other.definedNames()); c != "" {
				hint = "did you mean " + c + "? " + hint
			}
			s.fail(st, errAt(st.RemotePos, hint, "%s defines no result %s", path, st.Remote))
			continue
		}
		r := other.Result(target)
		st.Taken, st.TakenPath, st.taken = target, path, &r
		st.Type = target.Type
	}
}

// TakeError is a take statement's problem found by the package, with the
// hint to give with it.
type TakeError struct{ Msg, Hint string }

func (e *TakeError) Error() string { return e.Msg }

// definedNames lists the names a sheet defines, for suggestions. It
// builds the list anew: sheets that take from one sheet may ask at once.
func (s *Calc) definedNames() []string {
	var out []string
	for n := range s.byName {
		out = append(out, n)
	}
	return out
}
