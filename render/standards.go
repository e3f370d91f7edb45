package render

import (
	"sort"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/standards"
)

// writeCheckExtras writes, under a check's values, where its quantity sits
// in a tolerance band and the clauses it applies.
func writeCheckExtras(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	if b, ok := s.Band(st); ok {
		// One band line, under the later of its two checks; the earlier
		// points to it.
		other := b.High
		if other == st {
			other = b.Low
		}
		if st.Index > other.Index {
			w.WriteString("<div class=\"note\"><span class=\"band\">" + esc(BandText(s, st, digits)) + "</span></div>\n")
		} else {
			w.WriteString("<div class=\"note\"><span class=\"band\">one side of a tolerance band; where the value sits is under <a href=\"#" + anchor(other) + "\">the other side</a></span></div>\n")
		}
	}
	_, clauses := standards.Split(st.Description)
	for _, c := range clauses {
		w.WriteString("<div class=\"note\"><span class=\"clause\">applies " + esc(c.Text) + "</span></div>\n")
	}
}

// describe is a statement's description without its clause annotations,
// which are shown on their own.
func describe(st *engine.Statement) string {
	d, _ := standards.Split(st.Description)
	return d
}

// clauseTexts lists the clauses a statement applies, as written.
func clauseTexts(st *engine.Statement) []string {
	_, clauses := standards.Split(st.Description)
	var out []string
	for _, c := range clauses {
		out = append(out, c.Text)
	}
	return out
}

// standardsOf lists every clause the package's statements name, by
// standard and clause, then by sheet and line. A clause in a template is
// listed once per sheet that uses it.
func standardsOf(pkg *project.Package, ds []*Digest) []standardRow {
	type use struct {
		sheet string
		standardRow
	}
	var all []use
	for i, d := range ds {
		for _, r := range d.standards {
			all = append(all, use{pkg.Sheets[i].Path(), r})
		}
	}
	sort.SliceStable(all, func(i, j int) bool {
		a, b := all[i], all[j]
		if a.standard != b.standard {
			return a.standard < b.standard
		}
		if a.ref != b.ref {
			return a.ref < b.ref
		}
		if a.sheet != b.sheet {
			return a.sheet < b.sheet
		}
		return a.index < b.index
	})
	out := make([]standardRow, len(all))
	for i, u := range all {
		out[i] = u.standardRow
	}
	return out
}

// standardsPage is the package-wide standards register: every standard a
// check names, with the clause and the checks that apply it.
func standardsPage(pkg *project.Package, opt Options, ds []*Digest) []byte {
	p := packagePage(pkg, opt, "Standards register")
	p.f("<p>Every standard and clause that a statement of the package names as applied (<code>; clause: standard:edition, clause</code>), with the statements that apply it. A clause marked from memory must be read against the current edition before issue. The standards govern: these calculations support, and never replace, the judgment of a qualified engineer, local codes and licensed practice.</p>\n")
	uses := standardsOf(pkg, ds)
	if len(uses) == 0 {
		p.f("<p>No statement of the package names a clause.</p>\n")
		p.close(opt.Version, "Standards register.")
		return p.Bytes()
	}
	p.f("<table>\n<thead><tr><th>Standard</th><th>Clause</th><th>Sheet</th><th>Line</th><th>Statement</th><th>Outcome</th></tr></thead>\n<tbody>\n")
	for _, u := range uses {
		p.Write(opt.Digests.read(u.row))
	}
	p.f("</tbody>\n</table>\n")
	p.close(opt.Version, "Standards register.")
	return p.Bytes()
}

// standardLine is the row of the standards register for one clause that
// statement st of sheet s applies.
func standardLine(s *project.Sheet, st *engine.Statement, c standards.Clause) []byte {
	label := st.Name
	outcome := ""
	if st.Kind == engine.Check {
		label = "check " + st.Formula
		if r := s.Calc.Result(st); r.Status == engine.Pass || r.Status == engine.Fail {
			outcome, _ = verdictOf(s, st, r)
		} else {
			outcome = r.Status.String()
		}
	}
	p := &page{}
	p.f("<tr><td>%s</td><td>%s</td><td><a href=\"%s\">%s</a></td><td class=\"num\">%d</td><td><a href=\"%s#%s\"><code>%s</code></a></td><td>%s</td></tr>\n",
		esc(c.Standard), esc(c.Ref), pageHref(s.Page), esc(s.Title()), st.Pos.Line,
		pageHref(s.Page), anchor(st), esc(instancePrefix(st)+strings.TrimSpace(label)), esc(outcome))
	return p.Bytes()
}
