package render

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"html"
	"io"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
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
		r := pkg.Sheets[0].Calc.Result(checks[i])
		if r.Status != w.status || math.Abs(r.Utilisation-w.util) > 1e-12 {
			t.Errorf("check %d: %v at %g, want %v at %g", i, r.Status, r.Utilisation, w.status, w.util)
		}
		if !strings.Contains(page, "demand "+w.text+" of capacity") {
			t.Errorf("page lacks utilisation %s", w.text)
		}
	}
}

// graphSheets hold a statement of every look the graph gives: an input, a
// result, a template instance, a check that passes and one that fails, a
// statement in error and one that it blocks.
var graphSheets = map[string]string{
	"_t/coil.md": "---\ntitle: coil\ntemplate: true\n---\n```sheaf\nparam N [1] ; turns\nPhi = 1 mWb ; flux ; source: s\nlambda [Wb] = N * Phi ; linkage\ncheck lambda <= 1 Wb ; limit\n```\n",
	"job.md": "```sheaf\nN_f = 120 ; turns ; source: drawing\nuse c1 = _t/coil with N = N_f\n" +
		"L = 2 * c1.lambda ; twice\ncheck L < 0.1 Wb ; too small on purpose\ny = nowhere * 2 ; an error\nz = y + 1 ; blocked\n```\n",
}

// graphNode returns the one line of a graph that draws the node of st.
func graphNode(t *testing.T, svg string, st *engine.Statement) string {
	t.Helper()
	start := strings.Index(svg, `<g id="g-`+anchor(st)+`" class="node">`)
	if start < 0 {
		t.Fatalf("no node for %s (line %d)", st.Text, st.Pos.Line)
	}
	return svg[start : start+strings.IndexByte(svg[start:], '\n')]
}

// Every box links to its statement, names its place in a tooltip, and is
// coloured by what the statement is and how it went; a template instance
// is boxed with its name; text is escaped.
func TestGraphShowsStatusTemplatesAndLinks(t *testing.T) {
	pkg, pages := build(t, graphSheets)
	var s *project.Sheet
	for _, sh := range pkg.Sheets {
		if sh.Path() == "job.md" {
			s = sh
		}
	}
	page := pages[s.Page]
	svg := page[strings.Index(page, "<svg") : strings.Index(page, "</svg>")+len("</svg>")]
	want := map[engine.Status]string{engine.OK: "", engine.Pass: `fill="#eceffa" stroke="#23306e"`,
		engine.Fail: `fill="#fdecea" stroke="#b3261e" points=`, engine.Errored: `stroke-dasharray="4,2"`, engine.Blocked: `stroke-dasharray="4,2"`}
	seen := map[engine.Status]bool{}
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Use {
			continue
		}
		line := graphNode(t, svg, st)
		r := s.Calc.Result(st)
		link := `<a xlink:href="#` + anchor(st) + `"><title>` + esc(st.Pos.String()) + `</title>`
		if !strings.Contains(line, link) {
			t.Errorf("node of line %d lacks %s: %s", st.Pos.Line, link, line)
		}
		seen[r.Status] = true
		if w := want[r.Status]; w != "" && !strings.Contains(line, w) {
			t.Errorf("node of %s (%v) lacks %s: %s", st.Text, r.Status, w, line)
		}
		if st.IsInput() && r.Status == engine.OK && st.Instance == "" && !strings.Contains(line, `fill="#f4efe3"`) {
			t.Errorf("input %s is not drawn as an input: %s", st.Text, line)
		}
	}
	for status := range want {
		if !seen[status] {
			t.Errorf("the test sheet has no statement that is %v", status)
		}
	}
	if !strings.Contains(svg, `<g class="cluster">`) || !strings.Contains(svg, ">c1 (template)</text>") {
		t.Error("the template instance c1 is not boxed and named")
	}
	if !strings.Contains(svg, "not met \u00a0L &lt; 0.1 Wb") || strings.Contains(svg, "L < 0.1") {
		t.Error("the failing check's text is not escaped")
	}
}

// The graph is drawn the same, byte for byte, every time.
func TestGraphIsDeterministic(t *testing.T) {
	demo, err := project.Load("../examples/tarnwick-weir")
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range demo.Sheets {
		a, err := graphSVG(s, 4)
		if err != nil {
			t.Fatal(err)
		}
		b, _ := graphSVG(s, 4)
		if !bytes.Equal(a, b) {
			t.Errorf("%s: two drawings of the graph differ", s.Path())
		}
	}
}

var (
	svgSize  = regexp.MustCompile(`^<svg [^>]*width="([\d.]+)" height="([\d.]+)"`)
	svgRect  = regexp.MustCompile(`<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"`)
	svgPoint = regexp.MustCompile(`points="([\d.]+),[\d.]+ [\d.]+,([\d.]+) ([\d.]+),[\d.]+ ([\d.]+),[\d.]+ [\d.]+,([\d.]+)`)
	svgText  = regexp.MustCompile(`<text x="([\d.]+)" y="[\d.]+" text-anchor="middle" fill="#1d2327">([^<]*)</text>`)
)

func atof(t *testing.T, s string) float64 {
	t.Helper()
	f, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// The demo's graphs, read back from the SVG: every box inside the
// drawing, no two boxes overlapping, each label centred in its box and
// no wider than it.
func TestDemoGraphsHaveNoOverlaps(t *testing.T) {
	demo, err := project.Load("../examples/tarnwick-weir")
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range demo.Sheets {
		out, err := graphSVG(s, s.Digits(0))
		if err != nil {
			t.Fatal(err)
		}
		svg := string(out)
		size := svgSize.FindStringSubmatch(svg)
		w, h := atof(t, size[1]), atof(t, size[2])
		var boxes [][4]float64 // x0, y0, x1, y1
		for _, line := range strings.Split(svg, "\n") {
			if !strings.Contains(line, `class="node"`) {
				continue
			}
			var b [4]float64
			if m := svgRect.FindStringSubmatch(line); m != nil {
				b = [4]float64{atof(t, m[1]), atof(t, m[2]), atof(t, m[1]) + atof(t, m[3]), atof(t, m[2]) + atof(t, m[4])}
			} else if m := svgPoint.FindStringSubmatch(line); m != nil {
				b = [4]float64{atof(t, m[1]), atof(t, m[2]), atof(t, m[4]), atof(t, m[5])}
			} else {
				t.Fatalf("%s: no box in %s", s.Path(), line)
			}
			m := svgText.FindStringSubmatch(line)
			label := html.UnescapeString(m[2])
			if cx := atof(t, m[1]); math.Abs(cx-(b[0]+b[2])/2) > 0.01 || textWidth(label) > b[2]-b[0] {
				t.Errorf("%s: label %q (%.1f wide) at %.1f is not inside its box %v", s.Path(), label, textWidth(label), cx, b)
			}
			if b[0] < 0 || b[1] < 0 || b[2] > w || b[3] > h {
				t.Errorf("%s: box %v outside the drawing %gx%g", s.Path(), b, w, h)
			}
			for _, o := range boxes {
				if b[0] < o[2] && o[0] < b[2] && b[1] < o[3] && o[1] < b[3] {
					t.Errorf("%s: boxes %v and %v overlap", s.Path(), b, o)
				}
			}
			boxes = append(boxes, b)
		}
		if len(boxes) < 10 {
			t.Errorf("%s: only %d boxes read back", s.Path(), len(boxes))
		}
	}
}

// A graph too large to draw (here: 300 statements that each use the
// first, whose edges would need 44,850 waypoints) gives a note in its
// place, quickly, and the rest of the page as usual.
func TestTooLargeGraphGivesNote(t *testing.T) {
	var b strings.Builder
	b.WriteString("```sheaf\nx_0 = 1 m ; first ; source: s\n")
	for i := 1; i < 300; i++ {
		fmt.Fprintf(&b, "x_%d = x_%d + x_0\n", i, i-1)
	}
	b.WriteString("```\n")
	_, pages := build(t, map[string]string{"long.md": b.String()})
	page := pages["sheets/long.html"]
	if !strings.Contains(page, "too large to draw") || strings.Contains(page, `class="node"`) {
		t.Error("the page does not say that its graph is too large to draw")
	}
	if !strings.Contains(page, "Inputs register") {
		t.Error("the rest of the page is missing")
	}
}
