package layered

import (
	"cmp"
	"math"
	"slices"
)

// placeX sets the columns: each as wide as its widest node, a cluster's
// columns widened where its label needs it, and the drawing moved so that
// everything starts at the margin.
func (l *lay) placeX() {
	l.colW = make([]float64, l.ranks)
	for v := 0; v < l.n; v++ {
		l.colW[l.rank[v]] = max(l.colW[l.rank[v]], l.w[v])
	}
	for c, cl := range l.g.Clusters {
		if l.spanLo[c] < 0 {
			continue
		}
		inner := float64(l.spanHi[c]-l.spanLo[c]) * l.opt.RankSep
		for r := l.spanLo[c]; r <= l.spanHi[c]; r++ {
			inner += l.colW[r]
		}
		if inner < cl.LabelW {
			l.colW[l.spanHi[c]] += cl.LabelW - inner
		}
	}
	l.colX = make([]float64, l.ranks)
	x := l.opt.Margin + l.opt.ClusterPad
	for r := range l.colX {
		l.colX[r] = x
		x += l.colW[r] + l.opt.RankSep
	}
	if l.ranks > 0 {
		l.drawW = l.colX[l.ranks-1] + l.colW[l.ranks-1] + l.opt.ClusterPad + l.opt.Margin
	}
	l.shiftY()
}

// shiftY moves everything so that the highest box starts at the margin,
// and measures the drawing's height.
func (l *lay) shiftY() {
	lo, hi := math.Inf(1), math.Inf(-1)
	for v := range l.kind {
		lo, hi = math.Min(lo, l.y[v]), math.Max(hi, l.y[v]+l.h[v])
	}
	for c := range l.bandTop {
		if l.spanLo[c] >= 0 {
			lo, hi = math.Min(lo, l.bandTop[c]), math.Max(hi, l.bandTop[c]+l.bandH[c])
		}
	}
	if len(l.kind) == 0 {
		lo, hi = 0, 0
	}
	d := l.opt.Margin - lo
	for v := range l.y {
		l.y[v] += d
	}
	for c := range l.bandTop {
		l.bandTop[c] += d
	}
	l.drawH = hi + d + l.opt.Margin
}

func (l *lay) nodeX(v int) float64 {
	return l.colX[l.rank[v]] + (l.colW[l.rank[v]]-l.w[v])/2
}

// ports spreads the edges that leave (or enter) each node over the
// middle of its side, in the order of the vertices at their other ends,
// so that they do not all meet in one point.
func (l *lay) ports() (out, in []float64) {
	out = make([]float64, len(l.chain))
	in = make([]float64, len(l.chain))
	leaving := make([][]int, l.n)
	entering := make([][]int, l.n)
	for e, ch := range l.chain {
		if ch != nil {
			leaving[ch[0]] = append(leaving[ch[0]], e)
			entering[ch[len(ch)-1]] = append(entering[ch[len(ch)-1]], e)
		}
	}
	spread := func(v int, es []int, at []float64, other func(e int) int) {
		slices.SortStableFunc(es, func(a, b int) int { return cmp.Compare(l.pos[other(a)], l.pos[other(b)]) })
		step := 0.0
		if len(es) > 1 {
			step = math.Min(5, 0.6*l.h[v]/float64(len(es)-1))
		}
		for i, e := range es {
			// The conversion rounds the product, so that no platform fuses
			// it with the sum and draws a different file.
			at[e] = l.centre(v) + float64((float64(i)-float64(len(es)-1)/2)*step)
		}
	}
	for v := 0; v < l.n; v++ {
		spread(v, leaving[v], out, func(e int) int { return l.chain[e][1] })
		spread(v, entering[v], in, func(e int) int { return l.chain[e][len(l.chain[e])-2] })
	}
	return out, in
}

// route draws an edge's polyline from its left end to its right end:
// out of the node's right side, level through every column it passes
// (where its waypoint has a slot of its own), into the left side of the
// node at the right end; an edge that closes a cycle is then reversed.
func (l *lay) route(e int, outY, inY float64) []Point {
	ch := l.chain[e]
	a, b := ch[0], ch[len(ch)-1]
	pts := []Point{{l.nodeX(a) + l.w[a], outY}}
	if right := l.colX[l.rank[a]] + l.colW[l.rank[a]]; right > pts[0].X {
		pts = append(pts, Point{right, outY})
	}
	for _, d := range ch[1 : len(ch)-1] {
		r := l.rank[d]
		pts = append(pts, Point{l.colX[r], l.y[d]}, Point{l.colX[r] + l.colW[r], l.y[d]})
	}
	if left := l.colX[l.rank[b]]; left < l.nodeX(b) {
		pts = append(pts, Point{left, inY})
	}
	pts = append(pts, Point{l.nodeX(b), inY})
	if l.flip[e] {
		slices.Reverse(pts)
	}
	return pts
}

func (l *lay) result() *Layout {
	out := &Layout{W: l.drawW, H: l.drawH}
	out.Nodes = make([]Rect, l.n)
	for v := range out.Nodes {
		out.Nodes[v] = Rect{l.nodeX(v), l.y[v], l.w[v], l.h[v]}
	}
	outY, inY := l.ports()
	out.Edges = make([][]Point, len(l.chain))
	for e, ch := range l.chain {
		if ch != nil {
			out.Edges[e] = l.route(e, outY[e], inY[e])
		}
	}
	out.Clusters = make([]Rect, len(l.g.Clusters))
	for c := range out.Clusters {
		if lo, hi := l.spanLo[c], l.spanHi[c]; lo >= 0 {
			x := l.colX[lo] - l.opt.ClusterPad
			out.Clusters[c] = Rect{x, l.bandTop[c], l.colX[hi] + l.colW[hi] + l.opt.ClusterPad - x, l.bandH[c]}
		}
	}
	return out
}
