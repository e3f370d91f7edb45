package project_test

import (
	"bytes"
	"slices"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// updateFiles is a small package of the Tarnwick Weir scenario in which
// each way a sheet can depend on another appears once: a.md uses a
// template, b.md takes from a.md, d.md takes from b.md (so from a.md at
// one remove), and c.md stands alone.
func updateFiles() map[string][]byte {
	return map[string][]byte{
		"_templates/coil.md": []byte(coilTemplate),
		"a.md": []byte("---\ntitle: Field coil\n---\n```sheaf\nN_f = 120 ; turns ; source: drawing TW-E-101\n" +
			"use g1 = _templates/coil with N = N_f\nPhi_a [mWb] = g1.Phi ; flux per turn\n```\n"),
		"b.md": []byte("---\ntitle: Coil EMF\n---\n```sheaf\ntake Phi_a from a\nf = 50 Hz ; supply frequency ; source: site survey\n" +
			"E [V] = 4.44 * f * 120 * Phi_a ; EMF per coil\n```\n"),
		"c.md": []byte("---\ntitle: Pump motor\n---\n```sheaf\nU = 400 V ; supply ; source: single-line diagram\n```\n"),
		"d.md": []byte("---\ntitle: Insulation\n---\n```sheaf\ntake E from b\nU_t [kV] = 2 * E + 1 kV ; test voltage\n```\n"),
	}
}

// edited is files with old replaced by new in one file.
func edited(t *testing.T, files map[string][]byte, file, old, new string) map[string][]byte {
	t.Helper()
	out := map[string][]byte{}
	for k, v := range files {
		out[k] = v
	}
	if !bytes.Contains(out[file], []byte(old)) {
		t.Fatalf("%s lacks %q", file, old)
	}
	out[file] = bytes.Replace(out[file], []byte(old), []byte(new), 1)
	return out
}

// samePages fails unless two packages render to the same pages and JSON,
// byte for byte.
func samePages(t *testing.T, got, want *project.Package) {
	t.Helper()
	opt := render.Options{Version: "test"}
	g, err := render.HTML(got, opt)
	if err != nil {
		t.Fatal(err)
	}
	w, err := render.HTML(want, opt)
	if err != nil {
		t.Fatal(err)
	}
	if len(g) != len(w) {
		t.Fatalf("%d pages, a full load gives %d", len(g), len(w))
	}
	for i := range g {
		if g[i].Path != w[i].Path || !bytes.Equal(g[i].Data, w[i].Data) {
			t.Errorf("page %s differs from %s of a full load", g[i].Path, w[i].Path)
		}
	}
	var gj, wj bytes.Buffer
	if err := render.WriteJSON(got, opt, &gj); err != nil {
		t.Fatal(err)
	}
	if err := render.WriteJSON(want, opt, &wj); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(gj.Bytes(), wj.Bytes()) {
		t.Error("the JSON differs from a full load's")
	}
}

func paths(ss []*project.Sheet) []string {
	var out []string
	for _, s := range ss {
		out = append(out, s.Path())
	}
	return out
}

// An update evaluates again the edited sheet and what takes from it,
// keeps the other sheets as they were, and gives what a full load gives.
func TestUpdateRedoesWhatAnEditTouches(t *testing.T) {
	base := updateFiles()
	for _, tc := range []struct {
		name, file, old, new string
		redo                 []string
	}{
		{"an input of a taken sheet", "a.md", "N_f = 120", "N_f = 140", []string{"a.md", "b.md", "d.md"}},
		{"a sheet at the end of the takes", "d.md", "2 * E", "2.5 * E", []string{"d.md"}},
		{"a sheet nobody takes from", "c.md", "400 V", "690 V", []string{"c.md"}},
		{"a template", "_templates/coil.md", "Phi = 1 mWb", "Phi = 1.2 mWb", []string{"a.md", "b.md", "d.md"}},
		{"a take that makes a cycle", "a.md", "N_f = 120", "take E from b\nN_f = 120", []string{"a.md", "b.md", "d.md"}},
		{"a half-typed formula", "b.md", "4.44 * f", "4.44 * f *", []string{"b.md", "d.md"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			prev := project.FromFiles("pkg", base)
			files := edited(t, base, tc.file, tc.old, tc.new)
			pkg, redone := prev.Update(files)
			if got := paths(redone); !slices.Equal(got, tc.redo) {
				t.Errorf("evaluated again %v, want %v", got, tc.redo)
			}
			for _, s := range prev.Sheets {
				if slices.Contains(tc.redo, s.Path()) == (sheet(t, pkg, s.Path()) == s) {
					t.Errorf("%s: kept %v, and it is to be evaluated again: %v", s.Path(), sheet(t, pkg, s.Path()) == s, slices.Contains(tc.redo, s.Path()))
				}
			}
			samePages(t, pkg, project.FromFiles("pkg", files))
		})
	}
}

// A file added, deleted or turned template rebuilds every sheet; no
// change rebuilds none.
func TestUpdateWholeOrNothing(t *testing.T) {
	base := updateFiles()
	prev := project.FromFiles("pkg", base)
	if pkg, redone := prev.Update(base); pkg != prev || len(redone) != 0 {
		t.Errorf("unchanged sources: a new package %v, %d sheets evaluated again", pkg != prev, len(redone))
	}
	added := edited(t, base, "c.md", "", "")
	added["e.md"] = []byte("```sheaf\nx = 1 m ; a length ; source: drawing\n```\n")
	deleted := edited(t, base, "c.md", "", "")
	delete(deleted, "c.md")
	turned := edited(t, base, "c.md", "title: Pump motor", "title: Pump motor\ntemplate: true")
	for name, files := range map[string]map[string][]byte{"added": added, "deleted": deleted, "turned template": turned} {
		pkg, redone := prev.Update(files)
		if len(redone) != len(pkg.Sheets) || slices.ContainsFunc(prev.Sheets, func(s *project.Sheet) bool { return slices.Contains(pkg.Sheets, s) }) {
			t.Errorf("%s: %d of %d sheets evaluated again, want all, none kept", name, len(redone), len(pkg.Sheets))
		}
		samePages(t, pkg, project.FromFiles("pkg", files))
	}
}

// A sheet's page rests on the sheet, the templates it uses and what the
// sheets it takes from rest on; its stamp changes with any of them, and
// with nothing else.
func TestSheetRestsOn(t *testing.T) {
	base := updateFiles()
	pkg := project.FromFiles("pkg", base)
	for file, want := range map[string][]string{
		"a.md": {"_templates/coil.md", "a.md"},
		"b.md": {"_templates/coil.md", "a.md", "b.md"},
		"c.md": {"c.md"},
		"d.md": {"_templates/coil.md", "a.md", "b.md", "d.md"},
	} {
		var got []string
		for _, f := range pkg.RestsOn(sheet(t, pkg, file)) {
			if f.SHA256 == "" {
				t.Errorf("%s rests on %s, which has no hash", file, f.Path)
			}
			got = append(got, f.Path)
		}
		if !slices.Equal(got, want) {
			t.Errorf("%s rests on %v, want %v", file, got, want)
		}
	}
	stamps := func(p *project.Package) map[string]string {
		out := map[string]string{}
		for _, s := range p.Sheets {
			out[s.Path()] = p.SheetStamp(s, "test")
		}
		return out
	}
	before := stamps(pkg)
	after := stamps(project.FromFiles("pkg", edited(t, base, "b.md", "50 Hz", "60 Hz")))
	for file, changes := range map[string]bool{"a.md": false, "b.md": true, "c.md": false, "d.md": true} {
		if (before[file] != after[file]) != changes {
			t.Errorf("an edit of b.md: the stamp of %s changed %v, want %v", file, before[file] != after[file], changes)
		}
	}
	// A take of a sheet the package lacks names it, so that its arrival
	// changes the stamp.
	lone := project.FromFiles("pkg", map[string][]byte{"x.md": []byte("```sheaf\ntake y from z/w\n```\n")})
	if r := lone.RestsOn(lone.Sheets[0]); len(r) != 2 || r[1].Path != "z/w.md" || r[1].SHA256 != "" {
		t.Errorf("a take of a missing sheet: rests on %+v", r)
	}
	if !strings.HasPrefix(before["c.md"], "sha256:") {
		t.Errorf("a sheet stamp %q is not a SHA-256", before["c.md"])
	}
}

// A sheet that takes from a sheet on a cycle, and is not on it, compiles
// after it: it reads the value every time, never "not ready", and rests
// on what that sheet rests on. (Before, it could compile beside that sheet;
// the race did not show in the runs here, so this guards the outcome.)
func TestTakeFromASheetOnACycle(t *testing.T) {
	files := map[string][]byte{
		"c.md": []byte("# C\n```sheaf\ntake x from d\ny = 2 ; a ; source: s\n```\n"),
		"d.md": []byte("# D\n```sheaf\ntake y from c\nx = 3 ; b ; source: s\n```\n"),
		"e.md": []byte("# E\n```sheaf\ntake x from d\nz = 2 * x ; twice\n```\n"),
	}
	for range 20 {
		pkg := project.FromFiles("p", files)
		e := sheet(t, pkg, "e.md")
		if r := e.Calc.Result(e.Calc.Lookup("z")); r.Status != engine.OK || r.Value != 6 {
			t.Fatalf("z = %+v, want 6; diagnostics %v", r, pkg.Diags)
		}
		var rests []string
		for _, f := range pkg.RestsOn(e) {
			rests = append(rests, f.Path)
		}
		if !slices.Equal(rests, []string{"c.md", "d.md", "e.md"}) {
			t.Fatalf("e.md rests on %v", rests)
		}
	}
}
