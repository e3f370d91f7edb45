package render

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/internal/layered"
	"github.com/sheaf-calc/sheaf/project"
)

// The look of the dependency graph: one line of 10-pixel sans-serif text
// per box.
const (
	graphFont     = 10.0
	graphBoxH     = 22.0
	graphPadX     = 8.0  // text to a box's side
	graphHexInset = 10.0 // how far a check's hexagon narrows to its points
	graphArrow    = 6.0  // length of an arrowhead
	graphEdge     = "#8a969e"
)

// nodeStyle is how a statement's box is drawn.
type nodeStyle struct {
	fill, stroke string
	hexagon      bool
	dashed       bool
}

// styleOf draws a node in the pages' own colours (render/style.go): a
// check that holds in blue-black, one not met and an error in vermilion,
// an input on the band colour.
func styleOf(st *engine.Statement, r engine.Result) nodeStyle {
	switch {
	case r.Status == engine.Errored || r.Status == engine.Blocked:
		return nodeStyle{fill: "#fdecea", stroke: "#b3261e", dashed: true}
	case st.Kind == engine.Check && r.Status == engine.Pass:
		return nodeStyle{fill: "#eceffa", stroke: "#23306e", hexagon: true}
	case st.Kind == engine.Check:
		return nodeStyle{fill: "#fdecea", stroke: "#b3261e", hexagon: true}
	case st.IsInput():
		return nodeStyle{fill: "#f4efe3", stroke: "#1b1d2a"}
	}
	return nodeStyle{fill: "#fffdf8", stroke: "#5e5a52"}
}

// depGraph is a sheet's dependency graph ready to lay out: one node per
// statement (use statements aside), an edge from each statement to every
// statement that uses it, and a cluster per template instance.
type depGraph struct {
	stmts    []*engine.Statement
	labels   []string
	styles   []nodeStyle
	clusters []string // instance names
	graph    layered.Graph
}

func newDepGraph(s *project.Sheet, digits int) *depGraph {
	g := &depGraph{}
	index := map[*engine.Statement]int{}
	clusterOf := map[string]int{}
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Use {
			continue
		}
		c := 0
		if st.Instance != "" {
			if c = clusterOf[st.Instance]; c == 0 {
				g.clusters = append(g.clusters, st.Instance)
				c = len(g.clusters)
				clusterOf[st.Instance] = c
				g.graph.Clusters = append(g.graph.Clusters, layered.Cluster{LabelW: textWidth(clusterLabel(st.Instance))})
			}
		}
		r := s.Calc.Result(st)
		label := graphLabel(st, r, digits)
		sty := styleOf(st, r)
		if fixed, _ := s.Fixed(st); fixed {
			// Neither a pass nor a failure: the colours of a hold point.
			label = "fixed  " + st.Formula
			sty = nodeStyle{fill: "#fbf3df", stroke: "#7a5200", hexagon: true, dashed: true}
		}
		w := textWidth(label) + 2*graphPadX
		if sty.hexagon {
			w += 2 * graphHexInset
		}
		index[st] = len(g.stmts)
		g.stmts = append(g.stmts, st)
		g.labels = append(g.labels, label)
		g.styles = append(g.styles, sty)
		g.graph.Nodes = append(g.graph.Nodes, layered.Node{W: math.Ceil(w), H: graphBoxH, Cluster: c})
	}
	for _, st := range g.stmts {
		for _, d := range st.Deps {
			if from, ok := index[d]; ok {
				g.graph.Edges = append(g.graph.Edges, layered.Edge{From: from, To: index[st]})
			}
		}
	}
	return g
}

func clusterLabel(instance string) string { return instance + " (template)" }

// graphSVG lays out a sheet's dependency graph and draws it as an <svg>
// element to embed in the page. Inputs are on the left, results to the
// right; every box links to its statement and names its place in a
// tooltip. A graph too large to draw gives a note instead.
func graphSVG(s *project.Sheet, digits int) ([]byte, error) {
	g := newDepGraph(s, digits)
	opt := layered.DefaultOptions()
	lay, err := layered.Lay(g.graph, opt)
	if errors.Is(err, layered.ErrTooLarge) {
		return []byte(fmt.Sprintf("<p>The graph of this sheet's %d statements is too large to draw (%s).</p>\n", len(g.stmts), esc(err.Error()))), nil
	}
	if err != nil {
		return nil, fmt.Errorf("dependency graph: %w", err)
	}
	var b strings.Builder
	fmt.Fprintf(&b, "<svg xmlns=\"http://www.w3.org/2000/svg\" xmlns:xlink=\"http://www.w3.org/1999/xlink\" width=\"%s\" height=\"%s\" viewBox=\"0 0 %[1]s %[2]s\" font-family=\"sans-serif\" font-size=\"%s\" role=\"img\" aria-label=\"Dependency graph\">\n",
		num(lay.W), num(lay.H), num(graphFont))
	for c, box := range lay.Clusters {
		fmt.Fprintf(&b, "<g class=\"cluster\"><rect x=\"%s\" y=\"%s\" width=\"%s\" height=\"%s\" rx=\"6\" fill=\"none\" stroke=\"%s\" stroke-dasharray=\"5,2\"/><text x=\"%s\" y=\"%s\" fill=\"#5d6870\">%s</text></g>\n",
			num(box.X), num(box.Y), num(box.W), num(box.H), graphEdge, num(box.X+opt.ClusterPad), num(box.Y+opt.ClusterPad+opt.LabelH-4), xmlText(clusterLabel(g.clusters[c])))
	}
	// Edges first, so that the boxes are drawn over their ends.
	for _, pts := range lay.Edges {
		if pts != nil {
			writeEdge(&b, pts)
		}
	}
	for i, st := range g.stmts {
		writeNode(&b, st, g.labels[i], g.styles[i], lay.Nodes[i])
	}
	b.WriteString("</svg>\n")
	return []byte(b.String()), nil
}

// writeNode draws one statement's box, its label and its link.
func writeNode(b *strings.Builder, st *engine.Statement, label string, sty nodeStyle, r layered.Rect) {
	id := anchor(st)
	fmt.Fprintf(b, "<g id=\"g-%s\" class=\"node\"><a xlink:href=\"#%[1]s\"><title>%s</title>", xmlText(id), xmlText(st.Pos.String()))
	dash := ""
	if sty.dashed {
		dash = ` stroke-dasharray="4,2"`
	}
	if sty.hexagon {
		cy, in := r.Y+r.H/2, graphHexInset
		fmt.Fprintf(b, "<polygon fill=\"%s\" stroke=\"%s\"%s points=\"%s,%s %s,%s %s,%s %s,%s %s,%s %s,%s\"/>",
			sty.fill, sty.stroke, dash, num(r.X), num(cy), num(r.X+in), num(r.Y), num(r.X+r.W-in), num(r.Y),
			num(r.X+r.W), num(cy), num(r.X+r.W-in), num(r.Y+r.H), num(r.X+in), num(r.Y+r.H))
	} else {
		fmt.Fprintf(b, "<rect x=\"%s\" y=\"%s\" width=\"%s\" height=\"%s\" rx=\"4\" fill=\"%s\" stroke=\"%s\"%s/>",
			num(r.X), num(r.Y), num(r.W), num(r.H), sty.fill, sty.stroke, dash)
	}
	fmt.Fprintf(b, "<text x=\"%s\" y=\"%s\" text-anchor=\"middle\" fill=\"#1d2327\">%s</text></a></g>\n",
		num(r.X+r.W/2), num(r.Y+r.H/2+graphFont*0.35), xmlText(keepSpaces(label)))
}

// writeEdge draws an edge along its polyline: level runs as lines, the
// crossings between columns as curves that leave and arrive level, and an
// arrowhead at the end.
func writeEdge(b *strings.Builder, pts []layered.Point) {
	tip := pts[len(pts)-1]
	dir := 1.0
	if tip.X < pts[len(pts)-2].X {
		dir = -1
	}
	end := layered.Point{X: tip.X - dir*graphArrow, Y: tip.Y}
	// Level points within an arrowhead's length of the tip are under it.
	body := pts[:len(pts)-1]
	for len(body) > 1 && body[len(body)-1].Y == tip.Y && (body[len(body)-1].X-end.X)*dir >= 0 {
		body = body[:len(body)-1]
	}
	body = append(body[:len(body):len(body)], end)
	fmt.Fprintf(b, "<g class=\"edge\"><path fill=\"none\" stroke=\"%s\" d=\"M%s,%s", graphEdge, num(body[0].X), num(body[0].Y))
	for i := 1; i < len(body); i++ {
		p, q := body[i-1], body[i]
		if p.Y == q.Y {
			fmt.Fprintf(b, " L%s,%s", num(q.X), num(q.Y))
			continue
		}
		mx := (p.X + q.X) / 2
		fmt.Fprintf(b, " C%s,%s %s,%s %s,%s", num(mx), num(p.Y), num(mx), num(q.Y), num(q.X), num(q.Y))
	}
	fmt.Fprintf(b, "\"/><polygon fill=\"%s\" stroke=\"%[1]s\" points=\"%s,%s %s,%s %s,%s\"/></g>\n", graphEdge,
		num(tip.X), num(tip.Y), num(end.X), num(end.Y-2.5), num(end.X), num(end.Y+2.5))
}

// num writes a coordinate with at most two decimals.
func num(v float64) string {
	return strconv.FormatFloat(math.Round(v*100)/100, 'f', -1, 64)
}

// keepSpaces turns the second and later spaces of a run into no-break
// spaces, which SVG text does not collapse.
func keepSpaces(s string) string {
	return strings.ReplaceAll(s, "  ", " \u00a0")
}

// xmlText escapes text for an SVG element or attribute, and replaces the
// characters that XML cannot hold at all.
func xmlText(s string) string {
	return esc(strings.Map(func(r rune) rune {
		if r == '\t' || r == '\n' || r == '\r' || (r >= 0x20 && r < 0xd800) || (r >= 0xe000 && r < 0xfffe) || (r >= 0x10000 && r <= 0x10ffff) {
			return r
		}
		return utf8.RuneError
	}, s))
}

// graphLabel is the text of a statement's node: its name and value, or a
// check's verdict and comparison.
func graphLabel(st *engine.Statement, r engine.Result, digits int) string {
	if line, ok := conditionLine(st, r); ok {
		return line
	}
	switch r.Status {
	case engine.OK:
		if st.IsInput() {
			return TerminalLine(st, r, digits)
		}
		return SymbolText(st.Name) + " = " + ValueText(r.Value, r.Shown, digits)
	case engine.Pass:
		return "holds  " + st.Formula
	case engine.Fail:
		return "not met  " + st.Formula
	}
	if st.Kind == engine.Check {
		return "check (error)"
	}
	return SymbolText(st.Name) + " (error)"
}
