package render

import (
	"strconv"
	"strings"

	"github.com/sheaf-calc/sheaf/engine"
)

// writeTemplateNotes writes, under a use statement, what the checker must
// weigh beside the instance's results: the parts of the template left out
// for an optional input not set, the template's limits of validity and
// its sources, and the template defaults kept that checks rest on. All
// show in both views: each can change what the results mean.
func writeTemplateNotes(w sink, calc *engine.Calc, use *engine.Statement) {
	p := use.Parts
	top := use.Instance == ""
	var kept []engine.KeptDefault
	if top {
		kept = calc.KeptDefaultsOf(use)
	}
	if p == nil || len(p.Validity) == 0 && len(p.Sources) == 0 && (!top || len(p.LeftOut) == 0) && len(kept) == 0 {
		return
	}
	w.WriteString("<div class=\"tplnotes\">\n")
	if top {
		for _, lo := range p.LeftOut {
			writeLeftOut(w, lo)
		}
	}
	writeTextList(w, "validity", "Limits of validity of the template", p.Validity)
	writeTextList(w, "tsources", "Sources of the template", p.Sources)
	if len(kept) > 0 {
		w.WriteString("<div class=\"kept\"><strong>Template defaults kept that checks rest on</strong> (the use statement does not set them):<ul>\n")
		for _, k := range kept {
			d := k.Default
			w.WriteString(`<li><a href="#` + anchor(d) + `">` + symbolHTML(d.Name) + "</a> = <code>" + esc(exprText(d.Expr)) + "</code>")
			if d.Source != "" {
				w.WriteString("; source: " + esc(d.Source))
			} else {
				w.WriteString("; no source given")
			}
			w.WriteString(`; under <a href="#` + anchor(k.First) + `">` + esc(checkName(k.First)) + "</a>")
			if k.Checks > 1 {
				w.WriteString(" and " + strconv.Itoa(k.Checks-1) + " other check" + plural(k.Checks-1))
			}
			w.WriteString("</li>\n")
		}
		w.WriteString("</ul></div>\n")
	}
	w.WriteString("</div>\n")
}

// writeLeftOut says which part of an instance was not evaluated, and
// which inputs would enable it.
func writeLeftOut(w sink, lo engine.LeftOut) {
	params := strings.Join(lo.Params, ", ")
	verb := "is"
	if len(lo.Params) > 1 {
		verb = "are"
	}
	var what []string
	if n := lo.Checks(); n > 0 {
		what = append(what, strconv.Itoa(n)+" check"+plural(n))
	}
	if n := len(lo.Statements) - lo.Checks(); n > 0 {
		what = append(what, strconv.Itoa(n)+" result"+plural(n))
	}
	w.WriteString("<p class=\"leftout\"><strong>Not evaluated: " + esc(strings.Join(what, " and ")) + "</strong>, because " +
		esc(params) + " " + verb + " not set (neither passed nor failed): ")
	for i, st := range lo.Statements {
		if i > 0 {
			w.WriteString("; ")
		}
		if st.Kind == engine.Check {
			w.WriteString("check <code>" + esc(st.Formula) + "</code>")
		} else {
			w.WriteString(symbolHTML(st.Name))
		}
	}
	w.WriteString(". Set " + esc(params) + " in the use statement to evaluate them.</p>\n")
}

// writeTextList writes a titled list of short texts, nothing when empty.
func writeTextList(w sink, class, title string, items []string) {
	if len(items) == 0 {
		return
	}
	w.WriteString(`<div class="` + class + `"><strong>` + esc(title) + "</strong><ul>\n")
	for _, it := range items {
		w.WriteString("<li>" + esc(it) + "</li>\n")
	}
	w.WriteString("</ul></div>\n")
}

// checkName names a check as the register does: "ins: check m_PD >= EF".
func checkName(st *engine.Statement) string {
	name := "check " + st.Formula
	if st.Instance != "" {
		name = st.Instance + ": " + name
	}
	return name
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}
