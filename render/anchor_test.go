package render

import (
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/revdiff"
)

// A finding inside a template links to the statement of the instance on
// the page of the sheet that uses it, and that statement carries the id.
func TestAuditLinksIntoTemplateStatements(t *testing.T) {
	files := map[string][]byte{
		// Line 7 of the template: an input with no source.
		"_t/coil.md": []byte("---\ntitle: coil\ntemplate: true\n---\n```sheaf\nparam N [1] ; turns\nPhi = 1 mWb ; flux\nlambda [Wb] = N * Phi ; linkage\n```\n"),
		"a-job.md":   []byte("```sheaf\nN_f = 120 ; turns ; source: drawing\nuse c1 = _t/coil with N = N_f\nL = 2 * c1.lambda ; twice\n```\n"),
		"b-job.md":   []byte("```sheaf\nN_g = 80 ; turns ; source: drawing\nuse c2 = _t/coil with N = N_g\nM = 3 * c2.lambda ; thrice\n```\n"),
	}
	pkg := project.FromFiles("pkg", files)
	report := audit.Run(pkg)
	var found *audit.Finding
	for i, f := range report.Findings {
		if f.Code == "no-source" && f.Pos.File == "_t/coil.md" {
			found = &report.Findings[i]
		}
	}
	if found == nil || found.Sheet != "a-job.md" || found.Instance != "c1" || found.Pos.Line != 7 {
		t.Fatalf("the template's unsourced input should be one finding placed at a-job.md, instance c1: %+v", found)
	}
	out, err := HTML(pkg, Options{Version: "test", Audit: &report})
	if err != nil {
		t.Fatal(err)
	}
	pages := map[string]string{}
	for _, f := range out {
		pages[f.Path] = string(f.Data)
	}
	link := `href="sheets/a-job.html#I-c1-L7"`
	if !strings.Contains(pages["audit.html"], link) {
		t.Errorf("audit page lacks %s", link)
	}
	if !strings.Contains(pages["sheets/a-job.html"], `id="I-c1-L7"`) {
		t.Error("the instance's statement has no id I-c1-L7 on the using sheet's page")
	}
}

// The significant figures asked for hold on every page that shows a
// value: the sheet, the package index's checks, and the diff.
func TestDigitsHoldOnEveryPage(t *testing.T) {
	src := "```sheaf\nU_w = 10 kV ; withstand ; source: test\nU_a = 9.712345 kV ; stress ; source: study\n" +
		"U_b = 1.0000123 * U_a ; with a margin\ncheck U_b <= U_w ; stress below withstand\n```\n"
	pkg := project.FromFiles("pkg", map[string][]byte{"u.md": []byte(src)})
	report := audit.Run(pkg)
	out, err := HTML(pkg, Options{Version: "test", Digits: 6, Audit: &report})
	if err != nil {
		t.Fatal(err)
	}
	pages := map[string]string{}
	for _, f := range out {
		pages[f.Path] = string(f.Data)
	}
	// U_b = 9.71246 kV to six figures (9.712 kV to the default four).
	for _, page := range []string{"index.html", "sheets/u.html"} {
		if !strings.Contains(pages[page], "9.71246") {
			t.Errorf("%s does not show U_b to six figures", page)
		}
	}
	edited := project.FromFiles("pkg", map[string][]byte{"u.md": []byte(strings.Replace(src, "9.712345 kV", "9.812345 kV", 1))})
	diff := string(DiffHTML(revdiff.Compare(pkg, edited, 1e-4), pkg, edited, "a", "b", Options{Version: "test", Digits: 6}))
	if !strings.Contains(diff, "9.71246") || !strings.Contains(diff, "9.81247") {
		t.Error("the diff does not show the moved result to six figures")
	}
}

// A sheet rendered again gives the same bytes: goldmark's table renderer
// writes a cell's alignment onto the tree, and a second rendering (as the
// preview makes after an edit elsewhere) must not repeat it.
func TestRenderingTwiceGivesTheSameBytes(t *testing.T) {
	src := "Table BH: a steel\n\n| H [A/m] | B [T] |\n|---:|---:|\n| 0 | 0 |\n| 100 | 0.5 |\n\n```sheaf\nB_c = interp(BH.B, BH.H, 50 A/m) ; read\n```\n"
	pkg := project.FromFiles("pkg", map[string][]byte{"t.md": []byte(src)})
	page := func() string {
		out, err := HTML(pkg, Options{Version: "test"})
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range out {
			if f.Path == "sheets/t.html" {
				return string(f.Data)
			}
		}
		t.Fatal("no page for t.md")
		return ""
	}
	first, second := page(), page()
	if first != second {
		t.Error("the second rendering of the sheet differs from the first")
	}
	if strings.Contains(second, "text-align:right;text-align:right") {
		t.Error("the cells' alignment is written twice")
	}
}
