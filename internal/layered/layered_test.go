package layered

import (
	"errors"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"
)

const eps = 1e-6

// randomGraph makes a graph of n nodes with edges from lower to higher
// numbers (so no cycle unless back > 0 edges are added the other way),
// and runs of consecutive nodes in clusters, as a sheet's template
// instances are.
func randomGraph(seed uint64, n, edges, clusters, back int) Graph {
	rng := rand.New(rand.NewPCG(seed, 1))
	g := Graph{}
	for c := 0; c < clusters; c++ {
		g.Clusters = append(g.Clusters, Cluster{LabelW: 20 + rng.Float64()*100})
	}
	for i := 0; i < n; i++ {
		g.Nodes = append(g.Nodes, Node{W: 20 + rng.Float64()*150, H: 16 + rng.Float64()*10})
	}
	if clusters > 0 && n > 0 {
		for c := 0; c < clusters; c++ {
			start := rng.IntN(n)
			for i := start; i < min(n, start+1+rng.IntN(8)); i++ {
				g.Nodes[i].Cluster = c + 1
			}
		}
	}
	for e := 0; e < edges && n > 1; e++ {
		a, b := rng.IntN(n), rng.IntN(n)
		if a > b {
			a, b = b, a
		}
		if a != b {
			g.Edges = append(g.Edges, Edge{a, b})
		}
	}
	for e := 0; e < back && n > 1; e++ {
		a, b := rng.IntN(n), rng.IntN(n)
		g.Edges = append(g.Edges, Edge{max(a, b), min(a, b)})
	}
	return g
}

func overlap(a, b Rect) bool {
	return a.X < b.X+b.W-eps && b.X < a.X+a.W-eps && a.Y < b.Y+b.H-eps && b.Y < a.Y+a.H-eps
}

func inside(in, out Rect) bool {
	return in.X >= out.X-eps && in.Y >= out.Y-eps && in.X+in.W <= out.X+out.W+eps && in.Y+in.H <= out.Y+out.H+eps
}

func finite(fs ...float64) bool {
	for _, f := range fs {
		if math.IsNaN(f) || math.IsInf(f, 0) {
			return false
		}
	}
	return true
}

// checkLayout asserts what every layout must hold: each node placed with
// its size, inside the drawing; no two boxes overlap; each cluster's box
// holds its nodes and no other; cluster boxes do not overlap; each edge
// runs from its source's side to its target's, and through no other box.
func checkLayout(t *testing.T, g Graph, lay *Layout) {
	t.Helper()
	if len(lay.Nodes) != len(g.Nodes) || len(lay.Edges) != len(g.Edges) || len(lay.Clusters) != len(g.Clusters) {
		t.Fatalf("layout has %d nodes, %d edges, %d clusters; graph %d, %d, %d",
			len(lay.Nodes), len(lay.Edges), len(lay.Clusters), len(g.Nodes), len(g.Edges), len(g.Clusters))
	}
	frame := Rect{0, 0, lay.W, lay.H}
	for i, r := range lay.Nodes {
		if !finite(r.X, r.Y) || r.W != g.Nodes[i].W || r.H != g.Nodes[i].H || !inside(r, frame) {
			t.Fatalf("node %d placed at %+v, size %gx%g, drawing %gx%g", i, r, g.Nodes[i].W, g.Nodes[i].H, lay.W, lay.H)
		}
		for j := 0; j < i; j++ {
			if overlap(r, lay.Nodes[j]) {
				t.Fatalf("nodes %d %+v and %d %+v overlap", i, r, j, lay.Nodes[j])
			}
		}
		for c, box := range lay.Clusters {
			if g.Nodes[i].Cluster == c+1 && !inside(r, box) {
				t.Fatalf("node %d %+v is outside its cluster's box %+v", i, r, box)
			}
			if g.Nodes[i].Cluster != c+1 && box.W > 0 && overlap(r, box) {
				t.Fatalf("node %d %+v (cluster %d) overlaps the box of cluster %d %+v", i, r, g.Nodes[i].Cluster, c+1, box)
			}
		}
	}
	for c, box := range lay.Clusters {
		if box.W > 0 && (!inside(box, frame) || box.W < g.Clusters[c].LabelW-eps) {
			t.Fatalf("cluster %d box %+v: drawing %gx%g, label %g wide", c, box, lay.W, lay.H, g.Clusters[c].LabelW)
		}
		for d := 0; d < c; d++ {
			if box.W > 0 && lay.Clusters[d].W > 0 && overlap(box, lay.Clusters[d]) {
				t.Fatalf("cluster boxes %d %+v and %d %+v overlap", c, box, d, lay.Clusters[d])
			}
		}
	}
	for e, pts := range lay.Edges {
		checkEdge(t, g, lay, e, pts)
	}
}

func checkEdge(t *testing.T, g Graph, lay *Layout, e int, pts []Point) {
	t.Helper()
	ed := g.Edges[e]
	if ed.From == ed.To {
		if pts != nil {
			t.Fatalf("loop %d drawn", e)
		}
		return
	}
	if len(pts) < 2 {
		t.Fatalf("edge %d has %d points", e, len(pts))
	}
	from, to := lay.Nodes[ed.From], lay.Nodes[ed.To]
	first, last := pts[0], pts[len(pts)-1]
	onSide := func(p Point, r Rect) bool {
		return (math.Abs(p.X-r.X) < eps || math.Abs(p.X-r.X-r.W) < eps) && p.Y >= r.Y-eps && p.Y <= r.Y+r.H+eps
	}
	if !onSide(first, from) || !onSide(last, to) {
		t.Fatalf("edge %d %v runs from %+v to %+v, nodes %+v and %+v", e, ed, first, last, from, to)
	}
	for i := 1; i < len(pts); i++ {
		a, b := pts[i-1], pts[i]
		for n, r := range lay.Nodes {
			if n != ed.From && n != ed.To && segmentHits(a, b, r) {
				t.Fatalf("edge %d %v passes through node %d %+v between %+v and %+v", e, ed, n, r, a, b)
			}
		}
	}
}

// segmentHits says whether the segment ab passes through r's interior,
// by sampling it finely (the boxes are far larger than the step).
func segmentHits(a, b Point, r Rect) bool {
	inner := Rect{r.X + 0.5, r.Y + 0.5, r.W - 1, r.H - 1}
	for k := 0; k <= 64; k++ {
		f := float64(k) / 64
		x, y := a.X+(b.X-a.X)*f, a.Y+(b.Y-a.Y)*f
		if x > inner.X && x < inner.X+inner.W && y > inner.Y && y < inner.Y+inner.H {
			return true
		}
	}
	return false
}

// leftToRight asserts that every edge of an acyclic graph runs from left
// to right: its x never decreases, and it ends right of where it starts.
func leftToRight(t *testing.T, lay *Layout) {
	t.Helper()
	for e, pts := range lay.Edges {
		for i := 1; i < len(pts); i++ {
			if pts[i].X < pts[i-1].X-eps {
				t.Fatalf("edge %d turns left at point %d: %v", e, i, pts)
			}
		}
		if len(pts) > 0 && pts[len(pts)-1].X <= pts[0].X {
			t.Fatalf("edge %d does not point right: %v", e, pts)
		}
	}
}

func TestRandomAcyclicGraphs(t *testing.T) {
	for seed := uint64(0); seed < 60; seed++ {
		n := 1 + int(seed)*2
		g := randomGraph(seed, n, n*3/2, int(seed%5), 0)
		lay, err := Lay(g, DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		checkLayout(t, g, lay)
		leftToRight(t, lay)
	}
}

// A graph with cycles (a sheet whose statements use each other) is still
// laid out whole: every node placed, nothing overlapping.
func TestGraphsWithCycles(t *testing.T) {
	for seed := uint64(0); seed < 30; seed++ {
		n := 2 + int(seed)*2
		g := randomGraph(seed, n, n, int(seed%3), 1+int(seed%4))
		g.Edges = append(g.Edges, Edge{0, 0})
		lay, err := Lay(g, DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		checkLayout(t, g, lay)
	}
}

// The same graph gives the same layout, to the last bit.
func TestDeterministic(t *testing.T) {
	g := randomGraph(7, 80, 140, 4, 2)
	a, err := Lay(g, DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < 5; i++ {
		b, _ := Lay(g, DefaultOptions())
		if !reflect.DeepEqual(a, b) {
			t.Fatal("two layouts of one graph differ")
		}
	}
}

// Inputs sit just left of what uses them, not all in the first column;
// results follow the statements they use.
func TestRanks(t *testing.T) {
	// 0 -> 1 -> 2 -> 3, and 4 -> 3: node 4 belongs in the column before 3.
	g := Graph{Nodes: make([]Node, 5), Edges: []Edge{{0, 1}, {1, 2}, {2, 3}, {4, 3}}}
	for i := range g.Nodes {
		g.Nodes[i] = Node{W: 40, H: 20}
	}
	lay, err := Lay(g, DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	x := func(i int) float64 { return lay.Nodes[i].X }
	if !(x(0) < x(1) && x(1) < x(2) && x(2) < x(3)) || x(4) != x(2) {
		t.Errorf("columns: %v %v %v %v, input 4 at %v", x(0), x(1), x(2), x(3), x(4))
	}
}

// Barycentre sweeps undo crossings that the first order has: two chains
// whose second halves start in swapped order.
func TestCrossingsRemoved(t *testing.T) {
	g := Graph{Nodes: make([]Node, 6), Edges: []Edge{{0, 3}, {1, 2}, {2, 5}, {3, 4}}}
	for i := range g.Nodes {
		g.Nodes[i] = Node{W: 30, H: 20}
	}
	l := newLay(g, DefaultOptions())
	l.rankNodes()
	l.addVertices()
	l.order()
	if c := l.crossings(); c != 0 {
		t.Errorf("%d crossings left in %v", c, l.layers)
	}
	// The counter itself: a crossing that is there is counted.
	l.layers[1][0], l.layers[1][1] = l.layers[1][1], l.layers[1][0]
	l.pos[l.layers[1][0]], l.pos[l.layers[1][1]] = 0, 1
	if c := l.crossings(); c == 0 {
		t.Errorf("swapping a column left no crossing: %v", l.layers)
	}
}

func TestTooLarge(t *testing.T) {
	// A chain of 300 and one edge across it: 298 waypoints.
	g := Graph{Nodes: make([]Node, 300)}
	for i := 1; i < 300; i++ {
		g.Edges = append(g.Edges, Edge{i - 1, i})
	}
	g.Edges = append(g.Edges, Edge{0, 299})
	opt := DefaultOptions()
	opt.MaxVertices = 500
	if _, err := Lay(g, opt); !errors.Is(err, ErrTooLarge) {
		t.Fatalf("got %v, want ErrTooLarge", err)
	}
	opt.MaxVertices = 600
	if _, err := Lay(g, opt); err != nil {
		t.Fatal(err)
	}
}

func TestBadGraphs(t *testing.T) {
	bad := []Graph{
		{Nodes: []Node{{W: 1, H: 1}}, Edges: []Edge{{0, 1}}},
		{Nodes: []Node{{W: 1, H: 1, Cluster: 1}}},
		{Nodes: []Node{{W: math.NaN(), H: 1}}},
		{Nodes: []Node{{W: -1, H: 1}}},
	}
	for i, g := range bad {
		if _, err := Lay(g, DefaultOptions()); err == nil {
			t.Errorf("graph %d: no error", i)
		}
	}
	lay, err := Lay(Graph{}, DefaultOptions())
	if err != nil || len(lay.Nodes) != 0 {
		t.Errorf("empty graph: %v, %+v", err, lay)
	}
}
