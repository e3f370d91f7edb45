package render_test

import (
	"encoding/json"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// checksSheet holds a fixed check (an identity), a tolerance band (the
// ratio of rated-load to no-load field current, 1.9 in a band of 1.7–2.2,
// which puts it at 40 % of the band), a check that names the clause it
// applies, and an ordinary check. The values are invented.
const checksSheet = "---\ntitle: Checks\nrevision: A\nchecked by: C. Hecker\n---\n\n```sheaf\n" +
	"I_f0 = 24 A ; no-load field current ; source: open-circuit test OC-1\n" +
	"I_fr = 45.6 A ; rated-load field current ; source: heat run HR-2\n" +
	"r_lo = 1.7 ; lowest ratio expected ; source: design basis DB-1, clause 3\n" +
	"r_hi = 2.2 ; highest ratio expected ; source: design basis DB-1, clause 3\n" +
	"r_f = I_fr / I_f0 ; field current ratio\n" +
	"r_g = I_fr / I_f0 ; the same ratio, written again\n" +
	"check r_f >= r_lo ; within the expected band\n" +
	"check r_f <= r_hi ; within the expected band\n" +
	"check r_f == r_g ; the two agree\n" +
	"U_N = 6.6 kV ; rated voltage ; source: rating plate\n" +
	"U_t = 14.2 kV ; test voltage applied ; source: test report TR-3\n" +
	"U_min [kV] = 2 * U_N + 1 kV ; least test voltage\n" +
	"check U_t >= U_min ; the test voltage is enough ; clause: IEC 60034-1:2017, 9.2 (from memory)\n" +
	"```\n"

func checksPackage(t *testing.T) *project.Package {
	t.Helper()
	pkg := project.FromFiles("pkg", map[string][]byte{"c.md": []byte(checksSheet)})
	if len(pkg.Diags) != 0 {
		t.Fatalf("sheet errors: %v", pkg.Diags)
	}
	return pkg
}

func pages(t *testing.T, pkg *project.Package) map[string]string {
	t.Helper()
	files, err := render.HTML(pkg, render.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	out := map[string]string{}
	for _, f := range files {
		out[f.Path] = string(f.Data)
	}
	return out
}

func TestFixedCheckShownApart(t *testing.T) {
	pkg := checksPackage(t)
	c := pkg.Counts()
	if c.Pass != 3 || c.Fixed != 1 || c.Fail != 0 {
		t.Fatalf("counts %+v: want 3 pass, 1 fixed", c)
	}
	p := pages(t, pkg)
	sheet, index := p["sheets/c.html"], p["index.html"]
	for _, want := range []string{
		`<span class="stamp">fixed</span>`,
		"3 pass, 0 fail, 1 fixed (not counted)",
		"<h3>Fixed checks: not counted</h3>",
		"holds whatever its inputs are",
	} {
		if !strings.Contains(sheet, want) {
			t.Errorf("the sheet page lacks %q", want)
		}
	}
	if !strings.Contains(sheet, ">fixed \u00a0r_f == r_g</text>") {
		t.Errorf("the dependency graph does not mark the fixed check")
	}
	if !strings.Contains(index, "4 checks</strong>: 3 pass, 0 fail, 1 fixed (not counted)") {
		t.Errorf("the index does not count the fixed check apart")
	}
	if s := render.Summary(pkg); !strings.Contains(s, "4 checks: 3 pass, 0 fail, 1 fixed (not counted)") {
		t.Errorf("summary %q", s)
	}
}

func TestBandLine(t *testing.T) {
	p := pages(t, checksPackage(t))["sheets/c.html"]
	if n := strings.Count(p, `<span class="band">at 40 % of the band 1.700–2.200</span>`); n != 1 {
		t.Errorf("the band line appears %d times on the sheet, want once", n)
	}
	// The table of checks gives both sides the band, not a utilisation.
	if n := strings.Count(p, "<td class=\"num\">at 40 % of the band 1.700–2.200</td>"); n != 2 {
		t.Errorf("the checks table shows the band %d times, want 2", n)
	}
}

func TestStandardsRegister(t *testing.T) {
	p := pages(t, checksPackage(t))
	reg := p["standards.html"]
	if !strings.Contains(reg, "<td>IEC 60034-1:2017</td><td>9.2 (from memory)</td>") || !strings.Contains(reg, "check U_t &gt;= U_min") {
		t.Errorf("the standards register does not list the clause with its check:\n%s", reg)
	}
	sheet := p["sheets/c.html"]
	if !strings.Contains(sheet, `<span class="clause">applies IEC 60034-1:2017, 9.2 (from memory)</span>`) {
		t.Errorf("the sheet does not show the clause beside the check")
	}
	if strings.Contains(sheet, `<span class="desc">the test voltage is enough; clause:`) {
		t.Errorf("the clause is left in the description")
	}
}

func TestJSONFixedBandAndClauses(t *testing.T) {
	data := withAudit(t, checksPackage(t))
	if err := compileSchema(t).Validate(decode(t, data)); err != nil {
		t.Fatalf("the document does not validate: %v", err)
	}
	var doc render.JSONDoc
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Summary.Fixed != 1 || doc.Summary.Pass != 3 {
		t.Errorf("summary %+v", doc.Summary)
	}
	seen := map[string]bool{}
	for _, st := range doc.Sheets[0].Statements {
		switch {
		case st.Check == nil:
		case st.Check.Fixed:
			seen["fixed "+st.Text] = true
		case st.Check.Band != nil:
			if b := st.Check.Band; b.Position < 0.3999 || b.Position > 0.4001 || b.LowSI != 1.7 || b.HighSI != 2.2 {
				t.Errorf("band %+v", b)
			}
			seen["band"] = true
		case len(st.Clauses) == 1 && st.Clauses[0] == "IEC 60034-1:2017, 9.2 (from memory)" && st.Description == "the test voltage is enough":
			seen["clause"] = true
		}
	}
	if len(seen) != 3 {
		t.Errorf("the JSON shows %v; want the fixed check, the band and the clause", seen)
	}
}
