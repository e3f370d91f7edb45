package layered

import "math"

// balanceRounds is the number of passes that pull vertices towards their
// neighbours.
const balanceRounds = 8

// item is an entry of a column in vertical placement: a vertex in no
// cluster (v >= 0), or a cluster's band (c >= 0), which has the same top
// and height in every column it spans.
type item struct{ v, c int }

// placeY gives every vertex its top: first stacked as high as the order
// allows, then pulled towards the mean height of its neighbours, a run
// of free vertices at a time (isotonic regression, which keeps the order
// and the spacing), and each cluster's band as a whole.
func (l *lay) placeY() {
	l.y = make([]float64, len(l.kind))
	items := l.columnItems()
	l.indexClusters(items)
	l.bandHeights()
	l.stack(items)
	want := make([]float64, len(l.kind))
	for round := 0; round < balanceRounds; round++ {
		for i := 0; i < l.ranks; i++ {
			r := i
			if round%2 == 1 {
				r = l.ranks - 1 - i
			}
			l.wanted(want, l.layers[r])
			l.balanceColumn(r, items[r], want)
		}
		l.wanted(want, nil)
		l.moveBands(items, want)
	}
}

// columnItems groups each column into items, top to bottom.
func (l *lay) columnItems() [][]item {
	items := make([][]item, l.ranks)
	for r, layer := range l.layers {
		for _, v := range layer {
			c := l.cluster[v] - 1
			switch {
			case c < 0:
				items[r] = append(items[r], item{v: v, c: -1})
			case len(items[r]) == 0 || items[r][len(items[r])-1].c != c:
				items[r] = append(items[r], item{v: -1, c: c})
			}
		}
	}
	return items
}

// gap is the space a vertex wants above and below it.
func (l *lay) gap(v int) float64 {
	switch l.kind[v] {
	case kindNode:
		return l.opt.NodeSep
	case kindWaypoint:
		return l.opt.EdgeSep
	}
	return 0
}

// sep is the space between two neighbouring items of a column.
func (l *lay) sep(a, b item) float64 {
	if a.c >= 0 || b.c >= 0 {
		return l.opt.NodeSep
	}
	return (l.gap(a.v) + l.gap(b.v)) / 2
}

func (l *lay) top(it item) float64 {
	if it.c >= 0 {
		return l.bandTop[it.c]
	}
	return l.y[it.v]
}

func (l *lay) height(it item) float64 {
	if it.c >= 0 {
		return l.bandH[it.c]
	}
	return l.h[it.v]
}

// members returns the vertices of cluster c in column r.
func (l *lay) members(c, r int) []int { return l.memb[c][r-l.spanLo[c]] }

// indexClusters records, for each cluster and column of its span, its
// vertices there and its place among the column's items, so that placing
// costs no search through the columns.
func (l *lay) indexClusters(items [][]item) {
	k := len(l.g.Clusters)
	l.memb, l.itemAt = make([][][]int, k), make([][]int, k)
	for c := 0; c < k; c++ {
		if l.spanLo[c] >= 0 {
			l.memb[c] = make([][]int, l.spanHi[c]-l.spanLo[c]+1)
			l.itemAt[c] = make([]int, l.spanHi[c]-l.spanLo[c]+1)
		}
	}
	for r, layer := range l.layers {
		for i := 0; i < len(layer); {
			c := l.cluster[layer[i]] - 1
			j := i + 1
			for c >= 0 && j < len(layer) && l.cluster[layer[j]] == c+1 {
				j++
			}
			if c >= 0 {
				l.memb[c][r-l.spanLo[c]] = layer[i:j]
			}
			i = j
		}
		for i, it := range items[r] {
			if it.c >= 0 {
				l.itemAt[it.c][r-l.spanLo[it.c]] = i
			}
		}
	}
}

// stackHeight is the height of vertices stacked with their gaps.
func (l *lay) stackHeight(vs []int) float64 {
	h := 0.0
	for i, v := range vs {
		if i > 0 {
			h += (l.gap(vs[i-1]) + l.gap(v)) / 2
		}
		h += l.h[v]
	}
	return h
}

// bandHeights makes each cluster's band tall enough for its fullest
// column, its padding and its label.
func (l *lay) bandHeights() {
	k := len(l.g.Clusters)
	l.bandTop, l.bandH = make([]float64, k), make([]float64, k)
	for c := 0; c < k; c++ {
		if l.spanLo[c] < 0 {
			continue
		}
		inner := 0.0
		for r := l.spanLo[c]; r <= l.spanHi[c]; r++ {
			inner = max(inner, l.stackHeight(l.members(c, r)))
		}
		l.bandH[c] = inner + 2*l.opt.ClusterPad + l.opt.LabelH
	}
}

// stack sets every item as high as the items above it in all its columns
// allow: a longest path through the "is above" relation, which has no
// cycle because the clusters are in the same order in every column.
func (l *lay) stack(items [][]item) {
	key := func(it item) int {
		if it.c >= 0 {
			return len(l.kind) + it.c
		}
		return it.v
	}
	nItems := len(l.kind) + len(l.g.Clusters)
	below := make([][]item, nItems)
	indeg := make([]int, nItems)
	var queue []item
	for _, col := range items {
		for i := 1; i < len(col); i++ {
			below[key(col[i-1])] = append(below[key(col[i-1])], col[i])
			indeg[key(col[i])]++
		}
	}
	seen := make([]bool, nItems)
	for _, col := range items {
		for _, it := range col {
			if indeg[key(it)] == 0 && !seen[key(it)] {
				seen[key(it)] = true
				queue = append(queue, it)
			}
		}
	}
	top := make([]float64, nItems)
	for i := 0; i < len(queue); i++ {
		a := queue[i]
		l.setTop(a, top[key(a)])
		for _, b := range below[key(a)] {
			top[key(b)] = max(top[key(b)], top[key(a)]+l.height(a)+l.sep(a, b))
			if indeg[key(b)]--; indeg[key(b)] == 0 {
				queue = append(queue, b)
			}
		}
	}
}

// setTop moves an item to a top; a cluster's members are stacked inside.
func (l *lay) setTop(it item, top float64) {
	if it.c < 0 {
		l.y[it.v] = top
		return
	}
	l.bandTop[it.c] = top
	for r := l.spanLo[it.c]; r <= l.spanHi[it.c]; r++ {
		y := l.innerTop(it.c)
		vs := l.members(it.c, r)
		for i, v := range vs {
			if i > 0 {
				y += (l.gap(vs[i-1]) + l.gap(v)) / 2
			}
			l.y[v] = y
			y += l.h[v]
		}
	}
}

func (l *lay) innerTop(c int) float64 { return l.bandTop[c] + l.opt.ClusterPad + l.opt.LabelH }

func (l *lay) innerBottom(c int) float64 { return l.bandTop[c] + l.bandH[c] - l.opt.ClusterPad }

func (l *lay) centre(v int) float64 { return l.y[v] + l.h[v]/2 }

// wanted sets want[v], for the vertices given (all when nil), to the top
// that would put v's centre at the mean centre of its neighbours.
func (l *lay) wanted(want []float64, vs []int) {
	one := func(v int) {
		n, sum := 0, 0.0
		for _, u := range l.pred[v] {
			sum += l.centre(u)
			n++
		}
		for _, u := range l.succ[v] {
			sum += l.centre(u)
			n++
		}
		want[v] = l.y[v]
		if n > 0 {
			want[v] = sum/float64(n) - l.h[v]/2
		}
	}
	if vs == nil {
		for v := range l.kind {
			one(v)
		}
		return
	}
	for _, v := range vs {
		one(v)
	}
}

// balanceColumn places the runs of free vertices between the bands of a
// column, and each band's members inside it, as near their wanted tops as
// the order and spacing allow. Bands themselves stay put.
func (l *lay) balanceColumn(r int, col []item, want []float64) {
	start := 0
	lo := math.Inf(-1)
	for i := 0; i <= len(col); i++ {
		if i < len(col) && col[i].c < 0 {
			continue
		}
		hi := math.Inf(1)
		if i < len(col) {
			hi = l.bandTop[col[i].c] - l.opt.NodeSep
		}
		if i > start {
			run := make([]int, 0, i-start)
			for _, it := range col[start:i] {
				run = append(run, it.v)
			}
			l.fit(run, want, lo, hi)
		}
		if i < len(col) {
			c := col[i].c
			lo = l.bandTop[c] + l.bandH[c] + l.opt.NodeSep
			l.fit(l.members(c, r), want, l.innerTop(c), l.innerBottom(c))
		}
		start = i + 1
	}
}

// fit places a run of vertices, in order and with their gaps, between lo
// and hi, each as near its wanted top as can be (least squares): pool
// adjacent violators on the tops less each vertex's offset in the run,
// then clamp into the bounds.
func (l *lay) fit(run []int, want []float64, lo, hi float64) {
	if len(run) == 0 {
		return
	}
	offset := make([]float64, len(run))
	for i := 1; i < len(run); i++ {
		offset[i] = offset[i-1] + l.h[run[i-1]] + (l.gap(run[i-1])+l.gap(run[i]))/2
	}
	type pool struct {
		sum   float64
		count int
	}
	var pools []pool
	for i, v := range run {
		pools = append(pools, pool{want[v] - offset[i], 1})
		for len(pools) > 1 {
			a, b := pools[len(pools)-2], pools[len(pools)-1]
			if a.sum/float64(a.count) <= b.sum/float64(b.count) {
				break
			}
			pools = append(pools[:len(pools)-2], pool{a.sum + b.sum, a.count + b.count})
		}
	}
	last := len(run) - 1
	upper := hi - offset[last] - l.h[run[last]]
	i := 0
	for _, p := range pools {
		z := p.sum / float64(p.count)
		z = math.Max(math.Min(z, upper), lo)
		for k := 0; k < p.count; k++ {
			l.y[run[i]] = z + offset[i]
			i++
		}
	}
}

// moveBands shifts each cluster's band, members and all, by the mean of
// its members' wishes, as far as the items above and below it allow.
func (l *lay) moveBands(items [][]item, want []float64) {
	for c := range l.g.Clusters {
		if l.spanLo[c] < 0 {
			continue
		}
		n, sum := 0, 0.0
		for r := l.spanLo[c]; r <= l.spanHi[c]; r++ {
			for _, v := range l.members(c, r) {
				if l.kind[v] != kindFiller {
					sum += want[v] - l.y[v]
					n++
				}
			}
		}
		if n == 0 {
			continue
		}
		lo, hi := l.bandRoom(items, c)
		shift := math.Max(math.Min(sum/float64(n), hi), lo)
		l.bandTop[c] += shift
		for r := l.spanLo[c]; r <= l.spanHi[c]; r++ {
			for _, v := range l.members(c, r) {
				l.y[v] += shift
			}
		}
	}
}

// bandRoom is how far up (negative) and down cluster c's band may move.
func (l *lay) bandRoom(items [][]item, c int) (float64, float64) {
	lo, hi := math.Inf(-1), math.Inf(1)
	self := item{v: -1, c: c}
	for r := l.spanLo[c]; r <= l.spanHi[c]; r++ {
		col, i := items[r], l.itemAt[c][r-l.spanLo[c]]
		if i > 0 {
			a := col[i-1]
			lo = math.Max(lo, l.top(a)+l.height(a)+l.sep(a, self)-l.bandTop[c])
		}
		if i+1 < len(col) {
			b := col[i+1]
			hi = math.Min(hi, l.top(b)-l.sep(self, b)-l.bandH[c]-l.bandTop[c])
		}
	}
	return math.Min(lo, 0), math.Max(hi, 0)
}
