package render

import (
	"regexp"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

func build(t *testing.T, files map[string]string) (*project.Package, map[string]string) {
	t.Helper()
	in := map[string][]byte{}
	for k, v := range files {
		in[k] = []byte(v)
	}
	pkg := project.FromFiles("pkg", in)
	out, err := HTML(pkg, Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	pages := map[string]string{}
	for _, f := range out {
		pages[f.Path] = string(f.Data)
	}
	return pkg, pages
}

const coil = `---
title: Coil <b>bold</b> & co
project: P & Q
job: J-1
revision: B
prepared by: A. Author
checked by: C. Checker
---

# Coil

Prose with <script>alert(1)</script> raw HTML and a [link](javascript:alert(1)).

` + "```sheaf" + `
N = 120                       ; turns <i>per</i> coil ; source: drawing "D-1" & <rev A>
Phi = 2.5 mWb                 ; flux per pole
lambda_f [Wb] = N * Phi       ; flux linkage
check lambda_f <= 0.5 Wb      ; linkage below the limit
check lambda_f <= 0.2 Wb      ; a failing check
bad = N + Phi
` + "```\n"

func TestSheetPageShowsFormulaValuesAndChecks(t *testing.T) {
	_, pages := build(t, map[string]string{"coil.md": coil})
	page := pages["sheets/coil.html"]
	if page == "" {
		t.Fatalf("no sheet page; have %v", pages)
	}
	for _, want := range []string{
		"<math class=\"f\">",
		// symbolic, substituted, result: λ_f = N·Φ = 120·2.5 mWb = 0.3000 Wb
		"<msub><mi>λ</mi><mi>f</mi></msub><mo>=</mo>",
		"<mn>120</mn><mo>⋅</mo><mn>2.5</mn><mspace width=\"0.2em\"></mspace><mtext>mWb</mtext>",
		"<mn>0.3000</mn><mspace width=\"0.2em\"></mspace><mtext>Wb</mtext>",
		"class=\"row check pass\"", "class=\"row check fail\"", ">holds<", ">not met<", "demand 60.0 % of capacity", "demand 150 % of capacity",
		"Inputs register", "flux per pole",
		"class=\"row error\"", "cannot add a pure number and magnetic flux (Wb)",
		"coil.md:20:9",
		"<dt>Revision</dt><dd>B</dd>", "<dt>Checked</dt><dd>C. Checker</dd>",
		"@media print", "Caution.",
	} {
		if !strings.Contains(page, want) {
			t.Errorf("sheet page lacks %q", want)
		}
	}
}

func TestUserTextIsEscapedAndNoRawHTMLPassesThrough(t *testing.T) {
	_, pages := build(t, map[string]string{"coil.md": coil})
	page := pages["sheets/coil.html"]
	for _, bad := range []string{"<script>", "<b>bold</b>", "<i>per</i>", "<rev A>", "javascript:"} {
		if strings.Contains(page, bad) {
			t.Errorf("page passes through %q", bad)
		}
	}
	for _, want := range []string{"Coil &lt;b&gt;bold&lt;/b&gt; &amp; co", "drawing &#34;D-1&#34; &amp; &lt;rev A&gt;", "<!-- raw HTML omitted -->"} {
		if !strings.Contains(page, want) {
			t.Errorf("page lacks escaped %q", want)
		}
	}
}

var external = regexp.MustCompile(`(?i)(src|href)\s*=\s*"(https?:)?//|<script|<link|@import|url\(`)

func TestPagesAreSelfContained(t *testing.T) {
	_, pages := build(t, map[string]string{"coil.md": coil, "sub/other.md": "# Other\n\n```sheaf\nx = 1 m\n```\n"})
	for name, page := range pages {
		if m := external.FindString(page); m != "" {
			t.Errorf("%s refers to something outside the page: %q", name, m)
		}
		if !strings.HasPrefix(page, "<!DOCTYPE html>") || !strings.Contains(page, "<meta charset=\"utf-8\">") {
			t.Errorf("%s is not a complete HTML document", name)
		}
		if !strings.Contains(page, "sheaf test") {
			t.Errorf("%s lacks the tool version", name)
		}
	}
	if !strings.Contains(pages["sheets/sub/other.html"], `href="../../index.html"`) {
		t.Errorf("a sheet in a subfolder does not link back to the index")
	}
}

func TestIndexListsSheetsCountsAndErrors(t *testing.T) {
	_, pages := build(t, map[string]string{"coil.md": coil, "b.md": "```sheaf\nx = 1 m\n```\n"})
	index := pages["index.html"]
	for _, want := range []string{
		`<a href="sheets/coil.html">Coil &lt;b&gt;bold&lt;/b&gt; &amp; co</a>`,
		`<a href="sheets/b.html">b</a>`,
		"2 checks</strong>: 1 pass, 1 fail",
		`href="sheets/coil.html#L20"`,
		`<p class="kicker">P &amp; Q</p>`,
	} {
		if !strings.Contains(index, want) {
			t.Errorf("index lacks %q", want)
		}
	}
}

func TestStatementsShowInTheOrderWrittenAndResultsAboveInputsWork(t *testing.T) {
	src := "```sheaf\nP [kW] = U * I ; power\nU = 400 V\nI = 10 A\n```\n"
	pkg, pages := build(t, map[string]string{"a.md": src})
	if n := len(pkg.Diags); n != 0 {
		t.Fatalf("unexpected diagnostics: %v", pkg.Diags)
	}
	page := pages["sheets/a.html"]
	p, u := strings.Index(page, "id=\"L2\""), strings.Index(page, "id=\"L3\"")
	if p < 0 || u < 0 || p > u {
		t.Errorf("statements not in written order (L2 at %d, L3 at %d)", p, u)
	}
	if !strings.Contains(page, "<mn>4.000</mn><mspace width=\"0.2em\"></mspace><mtext>kW</mtext>") {
		t.Errorf("P not evaluated from inputs written below it")
	}
}

// Two renders of the same package, graphs laid out afresh each time, give
// the same bytes.
func TestRenderIsDeterministic(t *testing.T) {
	files := map[string]string{"coil.md": coil, "sub/other.md": "# Other\n\n```sheaf\nx = 1 m\ny = 2 * x\n```\n"}
	_, first := build(t, files)
	_, second := build(t, files)
	if len(first) != 6 {
		t.Fatalf("expected the index, three registers and two sheet pages, got %d pages", len(first))
	}
	for name, page := range first {
		if page != second[name] {
			t.Errorf("%s differs between two renders", name)
		}
		if strings.HasPrefix(name, "sheets/") && !strings.Contains(page, "<svg") {
			t.Errorf("%s has no dependency graph", name)
		}
	}
}
