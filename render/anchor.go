package render

import (
	"strconv"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// anchorAt is the one rule for a statement's id on its page: L<line> for
// the sheet's own statements, I-<instance>-L<line> for those of a template
// instance, whose lines are the template's. Every link to a statement,
// from a page, a register, the audit or a graph, is made with it.
func anchorAt(instance string, line int) string {
	if instance != "" {
		return "I-" + instance + "-L" + strconv.Itoa(line)
	}
	return "L" + strconv.Itoa(line)
}

// anchor is a statement's id on its page.
func anchor(st *engine.Statement) string { return anchorAt(st.Instance, st.Pos.Line) }

// sheetsByPath finds a package's sheets by path, and the first sheet to
// show each template line, for links to positions.
type sheetsByPath struct {
	byPath map[string]*project.Sheet
	users  map[lineAt]templateUser
}

// templateUser is the first sheet, by path, whose page shows a template
// line, and the instance there.
type templateUser struct {
	sheet    *project.Sheet
	instance string
}

func indexSheets(pkg *project.Package, ds []*Digest) sheetsByPath {
	ix := sheetsByPath{byPath: make(map[string]*project.Sheet, len(pkg.Sheets)), users: map[lineAt]templateUser{}}
	for i, s := range pkg.Sheets {
		ix.byPath[s.Path()] = s
		for k, inst := range ds[i].instances {
			if u, ok := ix.users[k]; !ok || s.Path() < u.sheet.Path() {
				ix.users[k] = templateUser{s, inst}
			}
		}
	}
	return ix
}

// href links to a position: on the page of the sheet named, or else of
// the sheet the position is in, at the statement there. A position in a
// template goes to the first sheet that uses the template, at the
// instance's statement (instance names it when known). It is "" for a
// position no page shows.
func (ix sheetsByPath) href(sheet, instance string, pos diag.Pos) string {
	s := ix.byPath[sheet]
	if s == nil {
		s = ix.byPath[pos.File]
	}
	if s == nil || pos.File != s.Path() && instance == "" {
		u := ix.users[lineAt{pos.File, pos.Line}]
		s, instance = u.sheet, u.instance
	}
	if s == nil {
		return ""
	}
	return pageHref(s.Page) + "#" + anchorAt(instance, pos.Line)
}

// anchorOn is the id, on sheet s's own page, of the statement at pos: a
// position in a template is the instance's statement there.
func anchorOn(s *project.Sheet, pos diag.Pos) string {
	if pos.File != s.Path() {
		for _, st := range s.Calc.Statements {
			if st.Instance != "" && st.Pos.File == pos.File && st.Pos.Line == pos.Line {
				return anchor(st)
			}
		}
	}
	return anchorAt("", pos.Line)
}
