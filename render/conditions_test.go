package render_test

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
	"github.com/sheaf-calc/sheaf/units"
)

// conditionsSheet is the exciter field coil of the Tarnwick Weir
// generator fed from its supply (invented values): the coil's current
// against its continuous rating as written (75 °C), cold at 20 °C (copper
// at (234.5 + 20)/(234.5 + 75) of its hot resistance, IEC 60034-1's
// conversion, from memory) and at a low supply, over the supply's range,
// and under the supply's and the coil's tolerances.
const conditionsSheet = "---\ntitle: Exciter field coil under its conditions\n---\n\n```sheaf\n" +
	"U_s = 110 V ± 5 % normal ; exciter supply voltage ; source: invented, Tarnwick Weir design basis\n" +
	"R_f = 2.42 ohm in 2.35 ohm .. 2.52 ohm ; field coil resistance at 75 °C ; source: invented, coil data sheet\n" +
	"I_f = U_s / R_f ; field current\n" +
	"I_fmax = 49 A ; continuous rating of the field coil ; source: invented, coil data sheet\n" +
	"check I_f <= I_fmax ; the coil carries its current\n" +
	"case cold: R_f = 1.99 ohm ; the coil at 20 °C, just switched on\n" +
	"case low: U_s = 99 V ; the supply at −10 %\n" +
	"sweep su: U_s over 99 V .. 121 V by 1 V show I_f ; the supply's range\n" +
	"sample 20000 times, seed 4\n" +
	"```\n"

// conditionsPackage builds a one-sheet package and fails on any error.
func conditionsPackage(t *testing.T, sheet string) (*project.Package, *project.Sheet) {
	t.Helper()
	pkg := project.FromFiles("pkg", map[string][]byte{"f.md": []byte(sheet)})
	if len(pkg.Diags) != 0 {
		t.Fatalf("sheet errors: %v", pkg.Diags)
	}
	s := pkg.Sheets[0]
	if s.Conditions == nil {
		t.Fatal("the sheet has no conditions report")
	}
	return pkg, s
}

// text is a page with its tags taken out and its spaces made plain, as a
// reader reads it.
func text(page string) string {
	page = regexp.MustCompile(`(?s)<svg.*?</svg>`).ReplaceAllString(page, "")
	page = regexp.MustCompile(`<[^>]*>`).ReplaceAllString(page, "")
	page = strings.NewReplacer("\u202f", " ", "&#39;", "'", "&amp;", "&", "&lt;", "<", "&gt;", ">").Replace(page)
	return page
}

// anchorOf is a sheet's own statement's id on its page (render/anchor.go).
func anchorOf(st *engine.Statement) string { return "L" + strconv.Itoa(st.Pos.Line) }

func stmt(t *testing.T, s *project.Sheet, text string) *engine.Statement {
	t.Helper()
	for _, st := range s.Calc.Statements {
		if st.Name == text || st.Formula == text {
			return st
		}
	}
	t.Fatalf("no statement %q", text)
	return nil
}

// The check names where it governs: cold, 110 V over 1.99 Ω is
// 55.28 A against 49 A (Ohm's law), worse than the sweep's worst,
// 121 V / 2.42 Ω = 50 A; it is worked out as written, in two cases and
// at 23 points, and fails cold and at 119, 120 and 121 V.
func TestCheckShowsItsGoverningCondition(t *testing.T) {
	pkg, s := conditionsPackage(t, conditionsSheet)
	page := text(pages(t, pkg)[s.Page])
	want := "governs: case cold · worked out in 26 conditions · fails in: case cold, sweep su (3 of 23 points)"
	if !strings.Contains(page, want) {
		t.Errorf("the page lacks %q", want)
	}
	chk := stmt(t, s, "I_f <= I_fmax")
	if r := s.Calc.Result(chk); math.Abs(r.Left-110/1.99) > 1e-9 {
		t.Errorf("the check shows %g A, want the cold case's %g A", r.Left, 110/1.99)
	}
	var term bytes.Buffer
	render.Terminal(pkg, render.Options{}, &term, &bytes.Buffer{})
	if !strings.Contains(term.String(), "FAIL  I_f <= I_fmax  (55.28 A ≤ 49.00 A, utilisation 113 %) — governs: case cold") {
		t.Errorf("the terminal line does not name the governing case:\n%s", term.String())
	}
}

// Beside each statement the cases move, a table gives its value as written
// and in each case, in the statement's unit; the check's gives its sides,
// utilisation and verdict, the governing case marked.
func TestCaseTableShowsEveryCase(t *testing.T) {
	pkg, s := conditionsPackage(t, conditionsSheet)
	html := pages(t, pkg)[s.Page]
	row := func(id string) string {
		i := strings.Index(html, `id="`+id+`"`)
		j := strings.Index(html[i:], `<div class="note">`)
		return html[i : i+j]
	}
	digits := s.Digits(0)
	cell := func(v float64, unit string) string {
		return units.FormatNumber(v, digits) + " " + unit
	}
	// I_f as written, cold and low: 110/2.42, 110/1.99, 99/2.42 A.
	def := text(row(anchorOf(stmt(t, s, "I_f"))))
	for _, v := range []float64{110 / 2.42, 110 / 1.99, 99 / 2.42} {
		if !strings.Contains(def, cell(v, "A")) {
			t.Errorf("the case table of I_f lacks %s:\n%s", cell(v, "A"), def)
		}
	}
	for _, head := range []string{"as written", "case cold", "case low"} {
		if !strings.Contains(def, head) {
			t.Errorf("the case table of I_f lacks the column %q", head)
		}
	}
	chk := row(anchorOf(stmt(t, s, "I_f <= I_fmax")))
	if !regexp.MustCompile(`<th class="gov">case cold <span class="govmark">governs</span></th>`).MatchString(chk) {
		t.Errorf("the check's case table does not mark case cold as governing:\n%s", chk)
	}
	plain := text(chk)
	for _, want := range []string{render.UtilisationText(110 / 1.99 / 49), render.UtilisationText(110 / 2.42 / 49), "not met", "holds"} {
		if !strings.Contains(plain, want) {
			t.Errorf("the check's case table lacks %q", want)
		}
	}
	// I_fmax is the same in every case: no table.
	if strings.Contains(row(anchorOf(stmt(t, s, "I_fmax"))), `class="cases"`) {
		t.Error("a statement no case moves has a case table")
	}
}

// A case row says what it sets; a sample row its count and seed.
func TestCaseAndSampleRows(t *testing.T) {
	pkg, s := conditionsPackage(t, conditionsSheet)
	page := text(pages(t, pkg)[s.Page])
	for _, want := range []string{"case cold sets", "the coil at 20 °C, just switched on", "Monte Carlo: 20 000 samples, seed 4",
		"sweep su: Us from 99.00 V to 121.0 V, 23 points; gathers If"} {
		if !strings.Contains(page, want) {
			t.Errorf("the page lacks %q", want)
		}
	}
	if strings.Contains(page, "NaN") {
		t.Error("the page shows NaN")
	}
}

// An input shows its tolerance as written with its distribution, and in
// the checker view its limits in its own unit: 110 V ± 5 % normal is
// 104.5–115.5 V, σ = 5.5 V / 3.
func TestToleranceShownOnTheInput(t *testing.T) {
	pkg, s := conditionsPackage(t, conditionsSheet)
	html := pages(t, pkg)[s.Page]
	u := stmt(t, s, "U_s")
	i := strings.Index(html, `id="`+anchorOf(u)+`"`)
	row := html[i : i+strings.Index(html[i:], `<div class="note">`)]
	if !strings.Contains(row, "<mo>±</mo><mn>5</mn><mspace width=\"0.2em\"></mspace><mtext>%</mtext><mspace width=\"0.4em\"></mspace><mtext>normal</mtext>") {
		t.Errorf("the input does not show ± 5 %% normal:\n%s", row)
	}
	want := "limits 104.5 V … 115.5 V (mean ∓ 3σ); normal, σ = " + units.FormatNumber(5.5/3, s.Digits(0)) + " V"
	if !strings.Contains(text(row), want) {
		t.Errorf("the checker view lacks %q:\n%s", want, text(row))
	}
	if !strings.Contains(row, `class="tollimits ck"`) {
		t.Error("the limits are not in the checker view")
	}
}

// toleranceSheet has one toleranced input, uniform, so that the share of
// failures has a closed form: I_f > 47 A while U_s > 47 A × 2.42 Ω =
// 113.74 V, which a supply uniform over 104.5–115.5 V exceeds with
// probability (115.5 − 113.74)/11 = 0.16 (the uniform distribution's
// CDF).
const toleranceSheet = "```sheaf\n" +
	"U_s = 110 V ± 5 % uniform ; exciter supply voltage ; source: invented\n" +
	"R_f = 2.42 ohm ; field coil resistance at 75 °C ; source: invented\n" +
	"I_f = U_s / R_f ; field current\n" +
	"I_fmax = 47 A ; continuous rating ; source: invented\n" +
	"check I_f <= I_fmax\n" +
	"```\n"

// Under the tolerances a check shows its worst case, its margin against
// the RSS of the tolerances, its probability of failure with its 95 %
// interval, and the inputs that move it; a result shows its spread.
func TestToleranceBlockShowsProbabilityOfFailure(t *testing.T) {
	pkg, s := conditionsPackage(t, toleranceSheet)
	page := text(pages(t, pkg)[s.Page])
	m := regexp.MustCompile(`probability of failure ([0-9.]+) % \(95 %: ([0-9.]+)–([0-9.]+) %\) in 10 000 samples, seed 1`).FindStringSubmatch(page)
	if m == nil {
		t.Fatalf("the page lacks the probability of failure with the default samples:\n%s", page)
	}
	p, _ := strconv.ParseFloat(m[1], 64)
	lo, _ := strconv.ParseFloat(m[2], 64)
	hi, _ := strconv.ParseFloat(m[3], 64)
	exact := (115.5 - 47*2.42) / 11 * 100
	if !(lo <= exact && exact <= hi) || math.Abs(p-exact) > 1.5 {
		t.Errorf("P(fail) %g %% (%g–%g %%), the closed form gives %.3g %%", p, lo, hi, exact)
	}
	digits := s.Digits(0)
	// Worst case: 115.5 V / 2.42 Ω; margin as written 47 − 110/2.42 A;
	// RSS of the one input's effect, 5.5 V / 2.42 Ω.
	for _, want := range []string{
		"worst case (corners): " + units.FormatNumber(115.5/2.42, digits) + "A≤47.00A: not met",
		"margin as written " + units.FormatNumber(47-110/2.42, digits) + " A; RSS of the tolerances " + units.FormatNumber(5.5/2.42, digits) + " A: not met",
		"moved most by Us (100 %)",
		"Monte Carlo over the tolerances: 10 000 samples, seed 1, the defaults",
		"spread: " + units.FormatNumber(104.5/2.42, digits) + " A … " + units.FormatNumber(115.5/2.42, digits) + " A",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("the page lacks %q", want)
		}
	}
}

// A sweep shows a sentence, a plot with the check's limit and worst
// point, and a table of its points whose worst row is marked; a sweep of
// more points than a table shows keeps the first, the last and the
// worst, and says so.
func TestSweepTableAndPlot(t *testing.T) {
	pkg, s := conditionsPackage(t, conditionsSheet)
	html := pages(t, pkg)[s.Page]
	worst := regexp.MustCompile(`<tr class="worst"><td class="num">121.0</td><td class="num">50.00</td><td class="num worst">102 % <span class="govmark">worst</span></td></tr>`)
	if !worst.MatchString(html) {
		t.Errorf("the sweep table lacks the worst row at 121 V (121/2.42 = 50 A, 102 %% of 49 A)")
	}
	if got := strings.Count(html, `<tr><td class="num">`) + strings.Count(html, `<tr class="worst">`); got != 23 {
		t.Errorf("the sweep table has %d rows, want its 23 points", got)
	}
	svg := regexp.MustCompile(`(?s)<figure class="sweepplot">.*?</figure>`).FindString(html)
	for _, want := range []string{">I_fmax 49.00 A</text>", ">worst, line 10</text>", "U_s / V", "I_f / A"} {
		if !strings.Contains(svg, want) {
			t.Errorf("the sweep's plot lacks %q", want)
		}
	}

	// 30 points, the highest supply (the worst) at one that evenly
	// chosen rows miss.
	var pts []string
	for i := range 30 {
		v := 99 + 0.5*float64(i)
		if i == 14 {
			v = 125
		}
		pts = append(pts, strconv.FormatFloat(v, 'f', -1, 64)+" V")
	}
	long := strings.Replace(conditionsSheet, "99 V .. 121 V by 1 V", "["+strings.Join(pts, ", ")+"]", 1)
	pkg, s = conditionsPackage(t, long)
	html = pages(t, pkg)[s.Page]
	page := text(html)
	if !strings.Contains(page, "sweep su: Us between 99.00 V and 125.0 V, 30 points in the order written") {
		t.Error("the long sweep's sentence does not give its span")
	}
	if !strings.Contains(page, "The table shows 26 of the 30 points, evenly chosen, with the first, the last and each check's worst") {
		t.Errorf("the long sweep does not say which points it shows:\n%s", page)
	}
	for _, x := range []string{"99.00", "125.0", "113.5"} {
		if !strings.Contains(html, `<td class="num">`+x+"</td>") {
			t.Errorf("the long sweep's table lacks the point %s V", x)
		}
	}
	if !strings.Contains(html, `<tr class="worst"><td class="num">125.0</td>`) {
		t.Error("the long sweep's table does not mark its worst point, 125 V")
	}
}

// The JSON validates against the schema and holds each statement's value
// in every case, the check's governing condition, the sweep's points, the
// tolerances' figures and the sheet's samples and seed.
func TestConditionsJSON(t *testing.T) {
	pkg, _ := conditionsPackage(t, conditionsSheet)
	data := withAudit(t, pkg)
	if err := compileSchema(t).Validate(decode(t, data)); err != nil {
		t.Fatalf("the document does not match the schema:\n%v", err)
	}
	var doc struct {
		Sheets []struct {
			Sampling   render.JSONSampling
			Statements []render.JSONStatement
		}
	}
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	sh := doc.Sheets[0]
	if sh.Sampling != (render.JSONSampling{Samples: 20000, Seed: 4}) {
		t.Errorf("sampling = %+v, want 20000 samples, seed 4, not the defaults", sh.Sampling)
	}
	find := func(kind, name string) render.JSONStatement {
		for _, st := range sh.Statements {
			if st.Kind == kind && (st.Name == name || strings.HasPrefix(st.Text, name)) {
				return st
			}
		}
		t.Fatalf("no %s %s in the document", kind, name)
		return render.JSONStatement{}
	}
	i := find("definition", "I_f")
	for c, want := range map[string]float64{"cold": 110 / 1.99, "low": 99 / 2.42} {
		if got := i.Cases[c]; got.SI == nil || math.Abs(got.SI.Value-want) > 1e-12*want {
			t.Errorf("I_f in case %s = %+v, want %g A", c, got.SI, want)
		}
	}
	if i.Spread == nil || i.Spread.MinSI == nil || math.Abs(*i.Spread.MinSI-104.5/2.52) > 1e-9 {
		t.Errorf("I_f's spread %+v, want its least value 104.5 V / 2.52 Ω", i.Spread)
	}
	chk := find("check", "check I_f")
	if g := chk.Governing; g == nil || g.Case != "cold" || g.Evaluated != 26 || g.AsWritten == nil || math.Abs(g.AsWritten.LeftSI-110/2.42) > 1e-12 {
		t.Errorf("governing = %+v, want case cold of 26 conditions, with 110/2.42 A as written", g)
	}
	if chk.Cases["cold"].Check == nil || chk.Cases["cold"].Check.Pass {
		t.Errorf("the check in case cold = %+v, want a failure", chk.Cases["cold"])
	}
	if sp := chk.Spread; sp == nil || sp.Fail == nil || sp.FailLo == nil || !(*sp.FailLo <= *sp.Fail && *sp.Fail <= *sp.FailHi) || len(sp.Ranking) != 2 {
		t.Errorf("the check's spread = %+v, want a share of failures inside its interval and two inputs ranked", sp)
	}
	sw := find("sweep", "su").Sweep
	if sw == nil || len(sw.Points.SI) != 23 || sw.Points.SI[22] != 121 || len(sw.Curves) != 1 || *sw.Curves[0].SI[22] != 121/2.42 ||
		len(sw.Checks) != 1 || sw.Checks[0].Worst != 22 || sw.Checks[0].Fails != 3 {
		t.Errorf("sweep = %+v, want 23 points to 121 V, I_f at each, the check worst at the last and failing at 3", sw)
	}
	u := find("definition", "U_s")
	if tol := u.Tolerance; tol == nil || tol.Distribution != "normal" || tol.LoSI != 104.5 || tol.HiSI != 115.5 || tol.SigmaSI == nil {
		t.Errorf("U_s's tolerance = %+v, want normal over 104.5–115.5 V with its σ", u.Tolerance)
	}
	c := find("case", "cold")
	if len(c.Sets) != 1 || c.Sets[0].Name != "R_f" || c.Sets[0].SI == nil || c.Sets[0].SI.Value != 1.99 {
		t.Errorf("case cold sets %+v, want R_f = 1.99 Ω", c.Sets)
	}
}

// The schema holds the conditions to their shape: a case with a value, a
// sweep without its points, an unknown distribution and a tolerance on a
// result each fail.
func TestSchemaRejectsBrokenConditions(t *testing.T) {
	sch := compileSchema(t)
	pkg, _ := conditionsPackage(t, conditionsSheet)
	data := withAudit(t, pkg)
	for _, c := range []struct {
		name    string
		breakIt func(sts []any)
	}{
		{"a case with a value", func(sts []any) {
			statementOf(sts, "case")["si"] = map[string]any{"value": json.Number("1"), "unit": "1"}
		}},
		{"a sweep without its points", func(sts []any) { delete(statementOf(sts, "sweep"), "sweep") }},
		{"an unknown distribution", func(sts []any) {
			statementOf(sts, "tolerance")["tolerance"].(map[string]any)["distribution"] = "lognormal"
		}},
		{"a tolerance on a check", func(sts []any) {
			statementOf(sts, "check")["tolerance"] = statementOf(sts, "tolerance")["tolerance"]
		}},
		{"a null in a sweep's points", func(sts []any) {
			statementOf(sts, "sweep")["sweep"].(map[string]any)["points"].(map[string]any)["si"].([]any)[0] = nil
		}},
	} {
		t.Run(c.name, func(t *testing.T) {
			doc := decode(t, data)
			c.breakIt(doc["sheets"].([]any)[0].(map[string]any)["statements"].([]any))
			if err := sch.Validate(doc); err == nil {
				t.Error("the schema accepts it")
			}
		})
	}
}

// statementOf finds the first statement of a kind, or the first with the
// member named.
func statementOf(sts []any, kindOrMember string) map[string]any {
	for _, st := range sts {
		m := st.(map[string]any)
		if _, has := m[kindOrMember]; has || m["kind"] == kindOrMember {
			return m
		}
	}
	panic(fmt.Sprintf("no statement %s", kindOrMember))
}

// The same sources give the same bytes: the page, the JSON and the
// terminal of a sheet with cases, a sweep and Monte Carlo, built twice.
func TestConditionsRenderDeterministically(t *testing.T) {
	build := func() (map[string]string, []byte, string) {
		pkg, _ := conditionsPackage(t, conditionsSheet)
		var term bytes.Buffer
		render.Terminal(pkg, render.Options{}, &term, &bytes.Buffer{})
		return pages(t, pkg), withAudit(t, pkg), term.String()
	}
	p1, j1, t1 := build()
	p2, j2, t2 := build()
	for path, page := range p1 {
		if p2[path] != page {
			t.Errorf("%s differs between two builds", path)
		}
	}
	if !bytes.Equal(j1, j2) || t1 != t2 {
		t.Error("the JSON or the terminal report differs between two builds")
	}
}

// A check that no case moves says nothing of conditions; one that a
// case moves but that governs as written says so.
func TestGoverningLineOnlyWhereConditionsMoveTheCheck(t *testing.T) {
	sheet := strings.Replace(conditionsSheet, "check I_f <= I_fmax ; the coil carries its current\n",
		"check I_f <= I_fmax ; the coil carries its current\ncheck I_fmax <= 60 A ; the rating is within the exciter's\n", 1)
	// Hot at 95 °C instead of cold: 2.42 Ω × (234.5 + 95)/(234.5 + 75) = 2.58 Ω.
	sheet = strings.Replace(sheet, "case cold: R_f = 1.99 ohm ; the coil at 20 °C, just switched on", "case hot: R_f = 2.58 ohm ; the coil at 95 °C, after a heat run", 1)
	pkg, s := conditionsPackage(t, sheet)
	html := pages(t, pkg)[s.Page]
	row := func(st *engine.Statement) string {
		i := strings.Index(html, `id="`+anchorOf(st)+`"`)
		return text(html[i : i+strings.Index(html[i:], `<div class="note">`)])
	}
	if r := row(stmt(t, s, "I_fmax <= 60 A")); strings.Contains(r, "governs") {
		t.Errorf("a check no condition moves has a governing line:\n%s", r)
	}
	// Hot, the coil draws less: the sweep's 121 V governs.
	if r := row(stmt(t, s, "I_f <= I_fmax")); !strings.Contains(r, "governs: sweep su at U_s = 121.0 V") {
		t.Errorf("the check does not say the sweep governs:\n%s", r)
	}
}

// A template's cases come with its instance, named for it: the page's
// table heads and the JSON's keys carry the instance's name, and the
// document still validates (a 220 V supply with a 242 V boost, over
// 11 Ω: 22 A against 21 A).
func TestCasesOfATemplate(t *testing.T) {
	pkg := project.FromFiles("pkg", map[string][]byte{
		"a.md":                 []byte("# Load\n\n```sheaf\nuse dc = _templates/supply\nR = 11 ohm ; load ; source: invented\nI = dc.U / R ; load current\nI_max = 21 A ; rating ; source: invented\ncheck I <= I_max\n```\n"),
		"_templates/supply.md": []byte("---\ntitle: Station supply\n---\n\n```sheaf\nU = 220 V ; supply ; source: invented\ncase low-battery: U = 187 V ; end of discharge\ncase boost: U = 242 V ; boost charge\n```\n"),
	})
	if len(pkg.Diags) != 0 {
		t.Fatalf("sheet errors: %v", pkg.Diags)
	}
	s := pkg.Sheets[0]
	page := text(pages(t, pkg)[s.Page])
	if !strings.Contains(page, "governs: case dc.boost") || !strings.Contains(page, "case dc.boost") {
		t.Errorf("the page does not name the template's case dc.boost:\n%s", page)
	}
	data := withAudit(t, pkg)
	if err := compileSchema(t).Validate(decode(t, data)); err != nil {
		t.Fatalf("the document does not match the schema:\n%v", err)
	}
	var doc render.JSONDoc
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	for _, st := range doc.Sheets[0].Statements {
		if st.Name == "I" {
			if c := st.Cases["dc.boost"]; c.SI == nil || math.Abs(c.SI.Value-22) > 1e-12 {
				t.Errorf("I in case dc.boost = %+v, want 22 A", c.SI)
			}
			return
		}
	}
	t.Error("no statement I")
}

// A sweep run in a case says so, and the point that governs names the
// case too: at the low supply the sweep of the coil's resistance from
// 1.9 Ω to 2.6 Ω draws 99 V / 1.9 Ω = 52.1 A at its worst.
func TestSweepInACase(t *testing.T) {
	sheet := strings.Replace(conditionsSheet, "sweep su: U_s over 99 V .. 121 V by 1 V show I_f", "sweep sr: R_f over 1.9 ohm .. 2.6 ohm by 0.1 ohm in low show I_f", 1)
	sheet = strings.Replace(sheet, "case cold: R_f = 1.99 ohm ; the coil at 20 °C, just switched on\n", "", 1)
	pkg, s := conditionsPackage(t, sheet)
	page := text(pages(t, pkg)[s.Page])
	for _, want := range []string{
		"sweep sr: Rf from 1.900 Ω to 2.600 Ω, 8 points, in case low; gathers If",
		"governs: sweep sr in case low at R_f = 1.900 Ω",
		"limits 2.350 Ω … 2.520 Ω; no distribution written",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("the page lacks %q:\n%s", want, page)
		}
	}
	if got := s.Calc.Result(stmt(t, s, "I_f <= I_fmax")).Left; math.Abs(got-99/1.9) > 1e-9 {
		t.Errorf("the governing point gives %g A, want 99 V / 1.9 Ω = %g A", got, 99/1.9)
	}
}

// A curve draws its results with the point the sheet works at marked,
// and names no check: its points run past the operating range on purpose.
func TestCurveShowsItsOperatingPointAndNoChecks(t *testing.T) {
	sheet := strings.Replace(conditionsSheet, "sweep su: U_s over 99 V .. 121 V by 1 V show I_f ; the supply's range",
		"curve vi: U_s over 0 V .. 200 V by 10 V show I_f ; the coil's characteristic", 1)
	pkg, s := conditionsPackage(t, sheet)
	html := pages(t, pkg)[s.Page]
	page := text(html)
	if !strings.Contains(page, "curve vi: Us from 0 V to 200.0 V, 21 points") {
		t.Errorf("the curve's sentence is missing:\n%s", page)
	}
	if strings.Contains(html, "demand / capacity, <a") || strings.Contains(page, "worst at") {
		t.Error("a curve lists checks")
	}
	svg := regexp.MustCompile(`(?s)<figure class="sweepplot">.*?</figure>`).FindString(html)
	if !strings.Contains(svg, ">as written, 110.0 V</text>") || strings.Contains(svg, ">worst") {
		t.Error("the curve's plot does not mark the point as written (110 V), or marks a worst point")
	}
	// The check governs in case cold (110 V / 1.99 Ω = 55 A), not at the
	// curve's 200 V.
	if g, _ := s.Conditions.Governing(stmt(t, s, "I_f <= I_fmax")); g.Where != "case cold" {
		t.Errorf("the check governs at %q, want case cold", g.Where)
	}
}
