package render_test

import (
	"encoding/json"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// pdTemplate is an invented template with an optional part, limits of
// validity and sources in its front matter, and a default that a check
// rests on.
const pdTemplate = "---\ntitle: Inception margin\ntemplate: true\nvalidity:\n  - \"sinusoidal supply: peak is √2 times RMS\"\nsources:\n  - \"A handbook, 2nd ed., table 4 (from memory)\"\n---\n" +
	"```sheaf\nparam U [kV] ; working voltage, RMS\nparam V_i [kV] optional ; inception voltage, peak\n" +
	"k = 1.25 ; margin ; source: common practice (from memory)\nU_pk = sqrt(2) * U ; peak\nm = V_i / U_pk ; inception margin\n" +
	"check m >= k ; inception above the peak with margin\ncheck U_pk <= 10 kV ; within the model's range ; accept check-literal: the range of the model\n```\n"

// The page of a sheet that uses a template shows, under the use, the
// parts left out and the input that would enable them, the template's
// limits of validity and sources, and the defaults kept that checks rest
// on, in both views; the JSON carries the same.
func TestPageShowsTemplateNotes(t *testing.T) {
	pkg := project.FromFiles("pkg", map[string][]byte{
		"_t/pd.md": []byte(pdTemplate),
		"job.md":   []byte("```sheaf\nuse a = _t/pd with U = 2 kV\nuse b = _t/pd with U = 2 kV, V_i = 5 kV\n```\n"),
	})
	files, err := render.HTML(pkg, render.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	page := pageFor(files, "sheets/job.html")
	useA, useB, ok := strings.Cut(page, `id="L3"`)
	if !ok {
		t.Fatal("no row for the second use")
	}
	useB, _, _ = strings.Cut(useB, `<div class="instance">`) // the notes, not the instance or the registers
	for _, want := range []string{
		"Not evaluated: 1 check and 1 result</strong>, because V_i is not set (neither passed nor failed): a:<var>m</var>; check <code>m &gt;= k</code>. Set V_i in the use statement",
		"<strong>Limits of validity of the template</strong><ul>\n<li>sinusoidal supply: peak is √2 times RMS</li>",
		"<strong>Sources of the template</strong><ul>\n<li>A handbook, 2nd ed., table 4 (from memory)</li>",
	} {
		if !strings.Contains(useA, want) {
			t.Errorf("the first use should show %q", want)
		}
	}
	// k rests only under the check left out of a: it is listed under b.
	if strings.Contains(useA, `class="kept"`) {
		t.Error("instance a keeps no default that an evaluated check rests on")
	}
	if strings.Contains(useB, "Not evaluated") {
		t.Error("instance b sets V_i: nothing is left out")
	}
	wantKept := `a:<var>k</var>`
	if i := strings.Index(useB, `class="kept"`); i < 0 || !strings.Contains(useB[i:], `b:<var>k</var></a> = <code>1.25</code>; source: common practice (from memory); under <a href="#I-b-L15">b: check m &gt;= k</a>`) || strings.Contains(useB, wantKept) {
		t.Errorf("instance b should list its default k under its check: %s", useB)
	}
	// The notes are not hidden in the designer's view.
	for _, class := range []string{`class="tplnotes ck"`, `class="leftout ck"`, `class="kept ck"`} {
		if strings.Contains(page, class) {
			t.Errorf("%s: the notes show in both views", class)
		}
	}

	data, err := render.JSON(pkg, render.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Sheets []struct {
			Statements []render.JSONStatement `json:"statements"`
		} `json:"sheets"`
	}
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	uses := map[string]render.JSONStatement{}
	for _, sh := range doc.Sheets {
		for _, st := range sh.Statements {
			if st.Kind == "use" {
				uses[st.Name] = st
			}
			if st.Name == "a.m" || st.Text == "check m >= k" && st.Instance == "a" {
				t.Errorf("%s is left out, yet in the JSON", st.Text)
			}
		}
	}
	a, b := uses["a"], uses["b"]
	if len(a.LeftOut) != 1 || strings.Join(a.LeftOut[0].Params, ",") != "V_i" || len(a.LeftOut[0].Statements) != 2 ||
		a.LeftOut[0].Statements[0].Name != "a.m" || a.LeftOut[0].Statements[1].Kind != "check" {
		t.Errorf("a's left-out part: %+v", a.LeftOut)
	}
	if len(a.Validity) != 1 || len(a.TemplateSources) != 1 || len(a.DefaultsKept) != 0 {
		t.Errorf("a: validity %q, sources %q, defaults kept %+v", a.Validity, a.TemplateSources, a.DefaultsKept)
	}
	if len(b.LeftOut) != 0 || len(b.DefaultsKept) != 1 || b.DefaultsKept[0] != (render.JSONKeptDefault{Name: "b.k", Value: "1.25",
		Source: "common practice (from memory)", FirstCheck: "b: check m >= k", Checks: 1}) {
		t.Errorf("b: left out %+v, defaults kept %+v", b.LeftOut, b.DefaultsKept)
	}
}

// The terminal report says under a use what was left out.
func TestTerminalShowsLeftOut(t *testing.T) {
	pkg := project.FromFiles("pkg", map[string][]byte{
		"_t/pd.md": []byte(pdTemplate),
		"job.md":   []byte("```sheaf\nuse a = _t/pd with U = 2 kV\nuse b = _t/pd with U = 2 kV, V_i = 5 kV\n```\n"),
	})
	var out, errs strings.Builder
	render.Terminal(pkg, render.Options{Digits: 4}, &out, &errs)
	text := out.String()
	want := "     2  use a = _t/pd with U = 2 kV\n          not evaluated, V_i not set: a.m, check m >= k\n"
	if !strings.Contains(text, want) || strings.Count(text, "not evaluated,") != 1 || errs.Len() != 0 {
		t.Errorf("want %q once in:\n%s%s", want, text, errs.String())
	}
}
