package layered

// vertex kinds: the graph's own nodes, the waypoints of long edges, and
// the fillers that hold a cluster's place in a column it spans but has no
// vertex in.
const (
	kindNode = iota
	kindWaypoint
	kindFiller
)

// lay is one layout in progress. Vertices 0..n-1 are the graph's nodes;
// waypoints and fillers follow.
type lay struct {
	g   Graph
	opt Options
	n   int

	kind    []uint8
	rank    []int
	cluster []int // 0 for none, else 1 + cluster index
	w, h    []float64
	succ    [][]int // vertices in the next column
	pred    [][]int // vertices in the previous column

	flip  []bool  // per edge: drawn against the columns (it closes a cycle)
	chain [][]int // per edge: its vertices from the left end to the right end
	ranks int

	layers [][]int // per column: vertices from top to bottom
	pos    []int   // index of each vertex in its column

	y              []float64 // top of each vertex
	bandTop, bandH []float64 // per cluster
	spanLo, spanHi []int     // per cluster: first and last column
	memb           [][][]int // per cluster and column of its span: its vertices
	itemAt         [][]int   // per cluster and column of its span: its item's index
	colX, colW     []float64 // per column
	drawW, drawH   float64
}

func newLay(g Graph, opt Options) *lay {
	n := len(g.Nodes)
	l := &lay{g: g, opt: opt, n: n}
	l.kind = make([]uint8, n)
	l.rank = make([]int, n)
	l.cluster = make([]int, n)
	l.w = make([]float64, n)
	l.h = make([]float64, n)
	for i, nd := range g.Nodes {
		l.cluster[i], l.w[i], l.h[i] = nd.Cluster, nd.W, nd.H
	}
	l.flip = make([]bool, len(g.Edges))
	return l
}

// ends returns an edge's ends in the direction it is drawn: left to right.
func (l *lay) ends(e int) (int, int) {
	a, b := l.g.Edges[e].From, l.g.Edges[e].To
	if l.flip[e] {
		return b, a
	}
	return a, b
}

// rankNodes gives every node a column: the edges that close a cycle are
// turned round, each node goes one column right of its furthest
// predecessor, and a node that uses nothing moves up to just left of its
// first user, so that inputs sit beside what they feed.
func (l *lay) rankNodes() {
	l.breakCycles()
	out := make([][]int, l.n)
	indeg := make([]int, l.n)
	for e := range l.g.Edges {
		a, b := l.ends(e)
		if a != b {
			out[a] = append(out[a], b)
			indeg[b]++
		}
	}
	hasPred := make([]bool, l.n)
	queue := make([]int, 0, l.n)
	for v := 0; v < l.n; v++ {
		if indeg[v] == 0 {
			queue = append(queue, v)
		}
	}
	for i := 0; i < len(queue); i++ {
		v := queue[i]
		for _, s := range out[v] {
			hasPred[s] = true
			l.rank[s] = max(l.rank[s], l.rank[v]+1)
			if indeg[s]--; indeg[s] == 0 {
				queue = append(queue, s)
			}
		}
	}
	for v := 0; v < l.n; v++ {
		if !hasPred[v] && len(out[v]) > 0 {
			r := l.rank[out[v][0]]
			for _, s := range out[v] {
				r = min(r, l.rank[s])
			}
			l.rank[v] = r - 1
		}
	}
	l.normaliseRanks()
}

// breakCycles turns round every edge that a depth-first search from the
// nodes in order finds pointing back to a node still being searched.
func (l *lay) breakCycles() {
	out := make([][]int, l.n) // edge indices
	for e, ed := range l.g.Edges {
		out[ed.From] = append(out[ed.From], e)
	}
	const (
		unseen = iota
		open
		done
	)
	state := make([]uint8, l.n)
	type frame struct{ v, next int }
	var stack []frame
	for root := 0; root < l.n; root++ {
		if state[root] != unseen {
			continue
		}
		state[root] = open
		stack = append(stack[:0], frame{root, 0})
		for len(stack) > 0 {
			top := &stack[len(stack)-1]
			if top.next == len(out[top.v]) {
				state[top.v] = done
				stack = stack[:len(stack)-1]
				continue
			}
			e := out[top.v][top.next]
			top.next++
			switch to := l.g.Edges[e].To; state[to] {
			case open:
				l.flip[e] = to != top.v
			case unseen:
				state[to] = open
				stack = append(stack, frame{to, 0})
			}
		}
	}
}

func (l *lay) normaliseRanks() {
	l.spanLo = make([]int, len(l.g.Clusters))
	l.spanHi = make([]int, len(l.g.Clusters))
	for c := range l.spanLo {
		l.spanLo[c], l.spanHi[c] = -1, -1
	}
	if l.n == 0 {
		return
	}
	lo, hi := l.rank[0], l.rank[0]
	for _, r := range l.rank {
		lo, hi = min(lo, r), max(hi, r)
	}
	for v := range l.rank {
		l.rank[v] -= lo
	}
	l.ranks = hi - lo + 1
	for v := 0; v < l.n; v++ {
		if c := l.cluster[v] - 1; c >= 0 {
			if l.spanLo[c] < 0 || l.rank[v] < l.spanLo[c] {
				l.spanLo[c] = l.rank[v]
			}
			l.spanHi[c] = max(l.spanHi[c], l.rank[v])
		}
	}
}

// vertexCount is the number of vertices the layout will hold: nodes, a
// waypoint per column an edge passes, and at most one filler per column a
// cluster spans.
func (l *lay) vertexCount() int {
	count := l.n
	for e := range l.g.Edges {
		a, b := l.ends(e)
		if d := l.rank[b] - l.rank[a]; d > 1 {
			count += d - 1
		}
	}
	for c := range l.spanLo {
		if l.spanLo[c] >= 0 {
			count += l.spanHi[c] - l.spanLo[c] + 1
		}
	}
	return count
}

// addVertex appends a waypoint or filler and returns its number.
func (l *lay) addVertex(kind uint8, rank, cluster int) int {
	l.kind = append(l.kind, kind)
	l.rank = append(l.rank, rank)
	l.cluster = append(l.cluster, cluster)
	l.w = append(l.w, 0)
	l.h = append(l.h, 0)
	return len(l.kind) - 1
}

// addVertices splits every edge into one step per column, with a waypoint
// in each column between its ends, and fills the columns of each cluster's
// span that hold none of its vertices.
func (l *lay) addVertices() {
	l.chain = make([][]int, len(l.g.Edges))
	for e := range l.g.Edges {
		a, b := l.ends(e)
		if a == b {
			continue
		}
		c := 0
		if l.cluster[a] == l.cluster[b] {
			c = l.cluster[a]
		}
		ch := []int{a}
		for r := l.rank[a] + 1; r < l.rank[b]; r++ {
			ch = append(ch, l.addVertex(kindWaypoint, r, c))
		}
		l.chain[e] = append(ch, b)
	}
	l.succ = make([][]int, len(l.kind))
	l.pred = make([][]int, len(l.kind))
	for _, ch := range l.chain {
		for i := 1; i < len(ch); i++ {
			l.succ[ch[i-1]] = append(l.succ[ch[i-1]], ch[i])
			l.pred[ch[i]] = append(l.pred[ch[i]], ch[i-1])
		}
	}
	l.addFillers()
}

func (l *lay) addFillers() {
	has := make(map[[2]int]bool)
	for v := range l.kind {
		if l.cluster[v] > 0 {
			has[[2]int{l.cluster[v], l.rank[v]}] = true
		}
	}
	for c := range l.spanLo {
		if l.spanLo[c] < 0 {
			continue
		}
		for r := l.spanLo[c]; r <= l.spanHi[c]; r++ {
			if !has[[2]int{c + 1, r}] {
				l.addVertex(kindFiller, r, c+1)
				l.succ = append(l.succ, nil)
				l.pred = append(l.pred, nil)
			}
		}
	}
}
