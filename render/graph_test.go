package render

import (
	"encoding/xml"
	"io"
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// The dependency graph is SVG that a page embeds; parsed as XML, it holds
// a node for every statement of the sheet and an edge for every use.
func TestDependencyGraphIsSVGWithEveryStatement(t *testing.T) {
	pkg, pages := build(t, map[string]string{"coil.md": coil})
	s := pkg.Sheets[0]
	page := pages[s.Page]
	start, end := strings.Index(page, "<svg"), strings.Index(page, "</svg>")
	if start < 0 || end < 0 {
		t.Fatal("the sheet page embeds no SVG")
	}
	svg := page[start : end+len("</svg>")]

	ids := map[string]bool{}
	edges := 0
	dec := xml.NewDecoder(strings.NewReader(svg))
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("the graph is not well-formed XML: %v", err)
		}
		el, ok := tok.(xml.StartElement)
		if !ok || el.Name.Local != "g" {
			continue
		}
		for _, a := range el.Attr {
			if a.Name.Local == "id" {
				ids[a.Value] = true
			}
			if a.Name.Local == "class" && a.Value == "edge" {
				edges++
			}
		}
	}
	uses := 0
	for _, st := range s.Calc.Statements {
		if !ids["g-"+anchor(st)] {
			t.Errorf("statement at line %d (%s) is not in the graph", st.Pos.Line, st.Text)
		}
		uses += len(st.Deps)
	}
	if edges != uses {
		t.Errorf("%d edges in the graph, %d uses in the sheet", edges, uses)
	}
	if len(s.Calc.Statements) < 6 {
		t.Fatalf("the test sheet should have several statements, has %d", len(s.Calc.Statements))
	}
}

// Checks state how close they are: utilisation is demand over capacity.
func TestChecksShowUtilisationEitherSideOfOne(t *testing.T) {
	src := "```sheaf\nU_w = 10 kV ; withstand ; source: test\n" +
		"U_a = 9.7 kV ; stress A ; source: study\nU_b = 10.3 kV ; stress B ; source: study\n" +
		"check U_a <= U_w ; case A\ncheck U_b <= U_w ; case B\n" +
		"check U_w >= U_b ; case B written the other way round\n```\n"
	pkg, pages := build(t, map[string]string{"u.md": src})
	want := []struct {
		status engine.Status
		util   float64
		text   string
	}{{engine.Pass, 0.97, "97.0 %"}, {engine.Fail, 1.03, "103 %"}, {engine.Fail, 1.03, "103 %"}}
	var checks []*engine.Statement
	for _, st := range pkg.Sheets[0].Calc.Statements {
		if st.Kind == engine.Check {
			checks = append(checks, st)
		}
	}
	page := pages["sheets/u.html"]
	for i, w := range want {
		st := checks[i]
		if st.Status != w.status || math.Abs(st.Utilisation-w.util) > 1e-12 {
			t.Errorf("check %d: %v at %g, want %v at %g", i, st.Status, st.Utilisation, w.status, w.util)
		}
		if !strings.Contains(page, "utilisation "+w.text) {
			t.Errorf("page lacks utilisation %s", w.text)
		}
	}
}
