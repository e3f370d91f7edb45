package project_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// A small template of the package's own: a coil's flux linkage.
const coilTemplate = "---\ntitle: Coil\ntemplate: true\n---\n```sheaf\n" +
	"param N [1] ; turns\n" +
	"Phi = 1 mWb ; flux per turn ; source: template default\n" +
	"lambda [Wb] = N * Phi ; flux linkage\n" +
	"check lambda <= 1 Wb ; below the limit\n```\n"

func build(t *testing.T, files map[string]string) *project.Package {
	t.Helper()
	in := map[string][]byte{}
	for k, v := range files {
		in[k] = []byte(v)
	}
	return project.FromFiles("pkg", in)
}

func sheet(t *testing.T, pkg *project.Package, path string) *project.Sheet {
	t.Helper()
	for _, s := range pkg.Sheets {
		if s.Path() == path {
			return s
		}
	}
	t.Fatalf("no sheet %s", path)
	return nil
}

func TestThreeInstancesOfOneTemplate(t *testing.T) {
	pkg := build(t, map[string]string{
		"_templates/coil.md": coilTemplate,
		"job.md": "```sheaf\nN_f = 120 ; turns ; source: drawing\n" +
			"use a = _templates/coil with N = N_f\n" +
			"use b = _templates/coil with N = 80, Phi = 2 mWb\n" +
			"use c = _templates/coil with N = 50,\n    Phi = 12 mWb\n" + // continued on an indented line
			"total [Wb] = a.lambda + b.lambda + c.lambda\n```\n",
	})
	if len(pkg.Diags) != 0 {
		t.Fatalf("diagnostics: %v", pkg.Diags)
	}
	if len(pkg.Sheets) != 1 || len(pkg.Templates) != 1 {
		t.Fatalf("the template must not be a page: %d sheets, %d templates", len(pkg.Sheets), len(pkg.Templates))
	}
	calc := sheet(t, pkg, "job.md").Calc
	for name, want := range map[string]float64{"a.lambda": 0.120, "b.lambda": 0.160, "c.lambda": 0.600, "total": 0.880} {
		r := calc.Result(calc.Lookup(name))
		if r.Status != engine.OK || math.Abs(r.Value-want) > 1e-12 {
			t.Errorf("%s = %+v, want %g Wb", name, r, want)
		}
	}
	// What the user set is marked, with the template's own value kept.
	b := calc.Lookup("b.Phi")
	if !b.Overridden || b.Default == nil || b.Instance != "b" {
		t.Errorf("b.Phi should be marked as set by the sheet: %+v", b)
	}
	if a := calc.Lookup("a.Phi"); a.Overridden {
		t.Error("a.Phi keeps the template's default and must not be marked as set")
	}
	// Each instance has its own check.
	checks := 0
	for _, st := range calc.Statements {
		if st.Kind == engine.Check && calc.Result(st).Status == engine.Pass {
			checks++
		}
	}
	if checks != 3 {
		t.Errorf("%d instance checks passed, want 3", checks)
	}
}

func TestReuseErrors(t *testing.T) {
	cases := []struct {
		name, use, pos, message string
	}{
		{"missing required parameter", "use a = _templates/coil", "job.md:2:9", "_templates/coil needs N [1] (turns)"},
		{"wrong-dimension override", "use a = _templates/coil with N = 3 A", "job.md:2:34", "a.N must be a pure number, but the value set is current (A)"},
		{"override of a wrong dimension on a default", "use a = _templates/coil with N = 2, Phi = 3 V", "job.md:2:43", "a.Phi must be magnetic flux (Wb), but the value set is voltage (V)"},
		{"an input the template does not have", "use a = _templates/coil with N = 2, M = 1", "job.md:2:37", "template _templates/coil has no input M; its inputs are N, Phi"},
		{"a result is not an input", "use a = _templates/coil with N = 2, lambda = 1 Wb", "job.md:2:37", "has no input lambda"},
		{"a path that leaves the folder", "use a = ../outside with N = 2", "job.md:2:9", "template ../outside leaves the package folder"},
		{"an absolute path", "use a = /etc/passwd with N = 2", "job.md:2:9", "must be a path inside the package folder"},
		{"a template that does not exist", "use a = _templates/coli with N = 2", "job.md:2:9", "no sheet _templates/coli.md in the package"},
		{"an unknown library template", "use a = lib/no-such-template with N = 2", "job.md:2:9", "no built-in template lib/no-such-template"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			pkg := build(t, map[string]string{
				"_templates/coil.md": coilTemplate,
				"job.md":             "```sheaf\n" + c.use + "\nx = 2 m ; independent ; source: s\n```\n",
			})
			if len(pkg.Diags) != 1 {
				t.Fatalf("want one diagnostic, got %v", pkg.Diags)
			}
			d := pkg.Diags[0]
			if d.Pos.String() != c.pos || !strings.Contains(d.Message+"; "+d.Hint, c.message) {
				t.Errorf("got %s: %s; want %s: ...%s...", d.Pos, d.Message, c.pos, c.message)
			}
			if x := sheet(t, pkg, "job.md").Calc.Lookup("x"); sheet(t, pkg, "job.md").Calc.Result(x).Status != engine.OK {
				t.Error("a bad use must leave the statements that do not depend on it alone")
			}
		})
	}
}

func TestTemplateCycle(t *testing.T) {
	pkg := build(t, map[string]string{
		"_t/a.md": "---\ntemplate: true\n---\n```sheaf\nuse inner = b\nk = 1 ; one ; source: s\n```\n",
		"_t/b.md": "---\ntemplate: true\n---\n```sheaf\nuse inner = a\nm = 2 ; two ; source: s\n```\n",
		"job.md":  "```sheaf\nuse x = _t/a\n```\n",
	})
	if len(pkg.Diags) != 1 || !strings.Contains(pkg.Diags[0].Message, "template cycle: ") ||
		!strings.Contains(pkg.Diags[0].Message, "_t/a.md → _t/b.md → _t/a.md") {
		t.Fatalf("diagnostics: %v", pkg.Diags)
	}
}

func TestTemplatesNestAndRelativePaths(t *testing.T) {
	pkg := build(t, map[string]string{
		"_t/coil.md": coilTemplate,
		"_t/pair.md": "---\ntemplate: true\n---\n```sheaf\nparam N [1] ; turns of each coil\n" +
			"use left = coil with N = N\nuse right = coil with N = N, Phi = 3 mWb\n" +
			"lambda [Wb] = left.lambda + right.lambda ; the pair's linkage\n```\n",
		"job.md": "```sheaf\nuse p = _t/pair with N = 100\n```\n",
	})
	if len(pkg.Diags) != 0 {
		t.Fatalf("diagnostics: %v", pkg.Diags)
	}
	calc := sheet(t, pkg, "job.md").Calc
	if st := calc.Lookup("p.lambda"); st == nil || math.Abs(calc.Result(st).Value-0.4) > 1e-12 {
		t.Fatalf("p.lambda = %+v, want 0.4 Wb", st)
	}
	if st := calc.Lookup("p.right.Phi"); st == nil || !st.Overridden || st.Instance != "p.right" {
		t.Errorf("p.right.Phi: %+v", st)
	}
}

func TestASheetBuiltOnItsOwnReportsItsParameters(t *testing.T) {
	pkg := build(t, map[string]string{"coil.md": strings.Replace(coilTemplate, "template: true\n", "", 1)})
	if len(pkg.Diags) != 1 || !strings.Contains(pkg.Diags[0].Message, "N is a template parameter and has no value here") {
		t.Fatalf("diagnostics: %v", pkg.Diags)
	}
}
