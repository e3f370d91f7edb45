package render_test

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// A table read from a CSV file shows on its sheet's page as read, in the
// units of its header, under a line that names the file and links to the
// package's copy of it, which the package pages bring; the JSON names the
// file.
func TestCSVTableOnThePage(t *testing.T) {
	csv := "H [A/m],B [T]\n0,0\n250,0.40\n400,0.70\n"
	sheet := "# Pole\n\nTable BH from ../data/plate.csv: DC curve of the pole plate\n\n```sheaf\nH = 300 A/m ; field ; source: demo\nB [T] = interp(BH.B, BH.H, H)\n```\n"
	pkg := project.FromFiles("pkg", map[string][]byte{"calc/a.md": []byte(sheet), "data/plate.csv": []byte(csv)})
	if len(pkg.Diags) != 0 {
		t.Fatal(pkg.Diags)
	}
	files, err := render.HTML(pkg, render.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	byPath := map[string][]byte{}
	for _, f := range files {
		byPath[f.Path] = f.Data
	}
	if !bytes.Equal(byPath["sources/data/plate.csv"], []byte(csv)) {
		t.Errorf("the package's copy of the file: %q", byPath["sources/data/plate.csv"])
	}
	page := string(byPath["sheets/calc/a.html"])
	for _, want := range []string{
		`Read from <a href="../../sources/data/plate.csv"><code>data/plate.csv</code></a>, 3 rows.`,
		"<th>H [A/m]</th><th>B [T]</th>",
		`<tr><td class="num">250</td><td class="num">0.40</td></tr>`,
	} {
		if !strings.Contains(page, want) {
			t.Errorf("the page lacks %s", want)
		}
	}
	js, err := render.JSON(pkg, render.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	var doc render.JSONDoc
	if err := json.Unmarshal(js, &doc); err != nil {
		t.Fatal(err)
	}
	if tb := doc.Sheets[0].Tables[0]; tb.File != "data/plate.csv" || len(tb.Columns) != 2 {
		t.Errorf("JSON table %+v", tb)
	}
}
