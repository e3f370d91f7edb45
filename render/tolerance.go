package render

import (
	"html"
	"math"
	"strings"
	"unicode"

	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// toleranceMathML is an input's tolerance as written, after its value:
// "± 5 %", "in 2.9 Ω … 3.2 Ω", "± σ 0.05 mm", then the word of its
// distribution when one was written.
func toleranceMathML(t *engine.Tolerance) string {
	var b strings.Builder
	b.WriteString(`<mspace width="0.3em"></mspace>`)
	r := []rune(t.Text)
	for i := 0; i < len(r); {
		c := r[i]
		switch {
		case unicode.IsSpace(c):
			i++
		case c == '±':
			b.WriteString("<mo>±</mo>")
			i++
		case strings.HasPrefix(string(r[i:]), "+/-"):
			b.WriteString("<mo>±</mo>")
			i += 3
		case strings.HasPrefix(string(r[i:]), ".."):
			b.WriteString("<mo>…</mo>")
			i += 2
		case unicode.IsDigit(c) || c == '.' && i+1 < len(r) && unicode.IsDigit(r[i+1]):
			j := numberEnd(r, i)
			b.WriteString(numberMathML(string(r[i:j])))
			i = j
		case unicode.IsLetter(c) || c == '%' || c == '°' || c == 'µ':
			j := i
			for j < len(r) && !unicode.IsSpace(r[j]) && !strings.HasPrefix(string(r[j:]), "..") {
				j++
			}
			b.WriteString(toleranceWord(string(r[i:j])))
			i = j
		default:
			b.WriteString("<mo>" + html.EscapeString(string(c)) + "</mo>")
			i++
		}
	}
	if t.Dist != engine.Band {
		b.WriteString(`<mspace width="0.4em"></mspace><mtext>` + t.Dist.String() + "</mtext>")
	}
	return b.String()
}

// numberEnd is where a number written from r[i] ends: digits, a decimal
// point, an exponent.
func numberEnd(r []rune, i int) int {
	j := i
	for j < len(r) && (unicode.IsDigit(r[j]) || r[j] == '.' && !(j+1 < len(r) && r[j+1] == '.') || r[j] == '_') {
		j++
	}
	if j+1 < len(r) && (r[j] == 'e' || r[j] == 'E') && (unicode.IsDigit(r[j+1]) || (r[j+1] == '-' || r[j+1] == '+') && j+2 < len(r) && unicode.IsDigit(r[j+2])) {
		j += 2
		for j < len(r) && unicode.IsDigit(r[j]) {
			j++
		}
	}
	return j
}

// toleranceWord writes a word of a tolerance: the limits' "in", σ, a unit
// in the symbol sheaf prints for it; a distribution's name is written
// once, after the tolerance.
func toleranceWord(w string) string {
	switch w {
	case "in":
		return `<mspace width="0.2em"></mspace><mtext>in</mtext><mspace width="0.2em"></mspace>`
	case "σ", "sigma":
		return "<mi>σ</mi>"
	case "uniform", "triangular", "normal":
		return ""
	}
	if u, err := units.Parse(w); err == nil {
		return unitMathML(u.Symbol)
	}
	return unitMathML(w)
}

// writeSpreadNote writes, in the checker view, what a tolerance means for
// an input (its limits in its unit and how it spreads between them) or
// for a result (its extremes, RSS and Monte Carlo spread); and once, by
// the first toleranced input, the Monte Carlo defaults a sheet without a
// sample statement was sampled with.
func writeSpreadNote(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	sp := s.Conditions.SpreadOf()
	if sp == nil {
		return
	}
	if st.Tol != nil && st.IsInput() {
		writeLimits(w, s, st, digits)
		if d, ok := defaultSampling(s); ok && len(d.Inputs) > 0 && d.Inputs[0] == st {
			w.WriteString("<p class=\"condnote\">Monte Carlo over the tolerances: " + samplingText(d.Samples, d.Seed, "\u202f") +
				", the defaults; a sample statement sets others, as <code>sample 20000 times, seed 7</code></p>\n")
		}
		return
	}
	for i := range sp.Results {
		if r := &sp.Results[i]; r.Stmt == st {
			writeResultSpread(w, s, r, sp, digits)
		}
	}
}

// writeLimits writes an input's limits in its own unit and its spread.
func writeLimits(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	t := st.Tol
	u := s.Calc.Result(st).Shown
	w.WriteString("<p class=\"tollimits ck\">limits " + esc(ValueText(t.Lo, u, digits)) + " … " + esc(ValueText(t.Hi, u, digits)))
	switch t.Dist {
	case engine.Band:
		w.WriteString("; no distribution written: the worst case and RSS read the limits, and Monte Carlo draws evenly between them")
	case engine.Normal:
		w.WriteString(" (mean ∓ 3σ); normal, σ = " + esc(diffText(t.Sigma, u, digits)))
	default:
		w.WriteString("; " + t.Dist.String() + " between them")
	}
	w.WriteString("</p>\n")
}

// writeResultSpread writes a result's spread under the tolerances: "spread:
// 7.6–8.5 A over the corners; ± 0.25 A RSS; Monte Carlo 8.00 A ± 0.13 A
// (1σ)".
func writeResultSpread(w sink, s *project.Sheet, r *conditions.ResultSpread, sp *conditions.Spread, digits int) {
	u := s.Calc.Result(r.Stmt).Shown
	w.WriteString("<p class=\"spreadline ck\">spread: " + esc(ValueText(r.Min, u, digits)) + " … " + esc(ValueText(r.Max, u, digits)) +
		" over the tolerances' limits; ± " + esc(diffText(r.RSS, u, digits)) + " RSS")
	if finite(r.Mean) && finite(r.SD) {
		w.WriteString("; Monte Carlo " + esc(ValueText(r.Mean, u, digits)) + " ± " + esc(diffText(r.SD, u, digits)) + " (1σ) in " +
			samplingText(sp.Samples, sp.Seed, "\u202f"))
	}
	if top := topInputs(r.Ranking); top != "" {
		w.WriteString("; moved most by " + top)
	}
	w.WriteString("</p>\n")
}

// writeCheckSpread writes what the inputs' tolerances do to a check: its
// worst case, the RSS of the tolerances against its margin, its
// probability of failure and the inputs that move it most.
func writeCheckSpread(w sink, s *project.Sheet, st *engine.Statement, digits int) {
	sp := s.Conditions.SpreadOf()
	if sp == nil {
		return
	}
	var c *conditions.CheckSpread
	for i := range sp.Checks {
		if sp.Checks[i].Stmt == st {
			c = &sp.Checks[i]
		}
	}
	if c == nil {
		return
	}
	written := asWritten(s, st)
	u := written.Shown
	op := relations[st.Compare().Op]
	w.WriteString("<div class=\"spread\">\n<p class=\"spreadhead\">Under the inputs' tolerances (as written)</p>\n<ul>\n")
	w.WriteString("<li>worst case (" + esc(c.Method) + "): ")
	if settledResult(c.Worst) {
		w.WriteString("<math><mrow>" + valueMathML(c.Worst.Left, u, digits) + "<mo>" + esc(op) + "</mo>" + valueMathML(c.Worst.Right, u, digits) +
			"</mrow></math>: <strong class=\"" + verdictClass(c.Worst.Status) + "\">" + Verdict(c.Worst.Status) + "</strong>")
	} else {
		w.WriteString("<strong class=\"short\">cannot be worked out</strong> at the worst combination")
	}
	w.WriteString(worstAtText(sp, c, s, digits) + "</li>\n")
	rssVerdict := "holds"
	if c.Margin-c.RSS < 0 {
		rssVerdict = "not met"
	}
	w.WriteString("<li>margin as written " + esc(diffText(c.Margin, u, digits)) + "; RSS of the tolerances " + esc(diffText(c.RSS, u, digits)) +
		": <strong class=\"" + map[bool]string{true: "holds", false: "short"}[rssVerdict == "holds"] + "\">" + rssVerdict + "</strong></li>\n")
	w.WriteString("<li>probability of failure " + percentText(c.Fail) + " (95 %: " + units.FormatNumber(c.FailLo*100, 2) + "–" + percentText(c.FailHi) +
		") in " + samplingText(sp.Samples, sp.Seed, "\u202f"))
	if c.Errors > 0 {
		w.WriteString("; " + Count(c.Errors, "sample") + " could not be worked out and count as failures")
	}
	w.WriteString("</li>\n")
	if top := topInputs(c.Ranking); top != "" {
		w.WriteString("<li>moved most by " + top + "</li>\n")
	}
	w.WriteString("</ul>\n</div>\n")
}

// worstAtText names, in the checker view, the inputs' values at a check's
// worst case.
func worstAtText(sp *conditions.Spread, c *conditions.CheckSpread, s *project.Sheet, digits int) string {
	if len(c.WorstAt) != len(c.Inputs) || len(c.Inputs) == 0 {
		return ""
	}
	var b strings.Builder
	b.WriteString(` <span class="ck">at `)
	for k, i := range c.Inputs {
		in := sp.Inputs[i]
		if k > 0 {
			b.WriteString(", ")
		}
		b.WriteString(`<a href="#` + anchor(in) + `">` + symbolHTML(in.Name) + "</a> = " + esc(ValueText(c.WorstAt[k], s.Calc.Result(in).Shown, digits)))
	}
	b.WriteString("</span>")
	return b.String()
}

// topInputs names the (up to) three inputs with the largest shares of a
// spread, "U (71 %), R (29 %)".
func topInputs(rank []conditions.Sensitivity) string {
	var parts []string
	for _, sn := range rank {
		if len(parts) == 3 || !(sn.Share > 0) {
			break
		}
		parts = append(parts, `<a href="#`+anchor(sn.Input)+`">`+symbolHTML(sn.Input.Name)+"</a> ("+percentText(sn.Share)+")")
	}
	return strings.Join(parts, ", ")
}

func settledResult(r engine.Result) bool { return r.Status == engine.Pass || r.Status == engine.Fail }

// verdictClass is the class of a verdict's word: holds or short.
func verdictClass(s engine.Status) string {
	if s == engine.Fail {
		return "short"
	}
	return "holds"
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
