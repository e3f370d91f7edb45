package layered

import (
	"cmp"
	"slices"
)

// sweeps is the number of down-and-up passes of barycentre ordering; the
// order with the fewest crossings seen is kept.
const sweeps = 12

// order sets the order of the vertices in each column: a depth-first
// order to start, then barycentre sweeps, keeping every cluster's
// vertices together in each column and the clusters in one order in all
// columns (so that their boxes can be stacked without overlapping).
func (l *lay) order() {
	l.initialOrder()
	best := l.crossings()
	saved := l.saveOrder()
	key := make([]float64, len(l.kind))
	for i := 0; i < sweeps && best > 0; i++ {
		clusters := l.clusterOrder()
		for r := 1; r < l.ranks; r++ {
			l.barycentres(key, l.layers[r], l.pred)
			l.sortLayer(r, key, clusters)
		}
		clusters = l.clusterOrder()
		for r := l.ranks - 2; r >= 0; r-- {
			l.barycentres(key, l.layers[r], l.succ)
			l.sortLayer(r, key, clusters)
		}
		if c := l.crossings(); c < best {
			best, saved = c, l.saveOrder()
		}
	}
	l.restoreOrder(saved)
	l.alignClusters()
}

// alignClusters puts the clusters in one order in every column: each
// sweep orders the columns by the cluster order of its start, so the
// columns of the kept order may disagree.
func (l *lay) alignClusters() {
	key := make([]float64, len(l.kind))
	for v := range key {
		key[v] = float64(l.pos[v])
	}
	order := l.clusterOrder()
	for r := range l.layers {
		l.sortLayer(r, key, order)
	}
}

func (l *lay) initialOrder() {
	l.layers = make([][]int, l.ranks)
	l.pos = make([]int, len(l.kind))
	seen := make([]bool, len(l.kind))
	var stack []int
	visit := func(root int) {
		stack = append(stack[:0], root)
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			if seen[v] {
				continue
			}
			seen[v] = true
			l.pos[v] = len(l.layers[l.rank[v]])
			l.layers[l.rank[v]] = append(l.layers[l.rank[v]], v)
			for i := len(l.succ[v]) - 1; i >= 0; i-- {
				stack = append(stack, l.succ[v][i])
			}
		}
	}
	for v := range l.kind {
		if !seen[v] {
			visit(v)
		}
	}
	l.alignClusters()
}

// barycentres sets key[v] for each v of a column to the mean position of
// its neighbours in the column before or after; a vertex without any
// keeps its own position.
func (l *lay) barycentres(key []float64, layer []int, nb [][]int) {
	for _, v := range layer {
		if len(nb[v]) == 0 {
			key[v] = float64(l.pos[v])
			continue
		}
		sum := 0.0
		for _, u := range nb[v] {
			sum += float64(l.pos[u])
		}
		key[v] = sum / float64(len(nb[v]))
	}
}

// clusterOrder ranks the clusters by their mean relative height in the
// columns they occupy, ties by number.
func (l *lay) clusterOrder() []int {
	k := len(l.g.Clusters)
	sum := make([]float64, k)
	count := make([]float64, k)
	for _, layer := range l.layers {
		for i, v := range layer {
			if c := l.cluster[v] - 1; c >= 0 {
				sum[c] += float64(i) / float64(len(layer))
				count[c]++
			}
		}
	}
	ids := make([]int, k)
	for c := range ids {
		ids[c] = c
	}
	mean := func(c int) float64 {
		if count[c] == 0 {
			return 0
		}
		return sum[c] / count[c]
	}
	slices.SortStableFunc(ids, func(a, b int) int { return cmp.Compare(mean(a), mean(b)) })
	rankOf := make([]int, k)
	for i, c := range ids {
		rankOf[c] = i
	}
	return rankOf
}

// block is a run of a column that moves as one: a vertex in no cluster,
// or all of one cluster's vertices in the column.
type block struct {
	cluster int // 0 for a lone vertex
	members []int
	key     float64
}

// sortLayer orders column r by key, the vertices of each cluster kept
// together and sorted among themselves, and the clusters' blocks put in
// the slots that clusters took in the global order clusterRank.
func (l *lay) sortLayer(r int, key []float64, clusterRank []int) {
	var blocks []*block
	byCluster := map[int]*block{}
	for _, v := range l.layers[r] {
		c := l.cluster[v]
		if c == 0 {
			blocks = append(blocks, &block{members: []int{v}, key: key[v]})
			continue
		}
		b := byCluster[c]
		if b == nil {
			b = &block{cluster: c}
			byCluster[c] = b
			blocks = append(blocks, b)
		}
		b.members = append(b.members, v)
		b.key += key[v]
	}
	for _, b := range blocks {
		if b.cluster != 0 {
			b.key /= float64(len(b.members))
			slices.SortStableFunc(b.members, func(x, y int) int { return cmp.Compare(key[x], key[y]) })
		}
	}
	slices.SortStableFunc(blocks, func(x, y *block) int { return cmp.Compare(x.key, y.key) })
	l.orderClusterSlots(blocks, clusterRank)
	layer := l.layers[r][:0]
	for _, b := range blocks {
		layer = append(layer, b.members...)
	}
	for i, v := range layer {
		l.pos[v] = i
	}
}

// orderClusterSlots refills the places that cluster blocks hold with the
// same blocks in the global cluster order.
func (l *lay) orderClusterSlots(blocks []*block, clusterRank []int) {
	var slots []int
	var cl []*block
	for i, b := range blocks {
		if b.cluster != 0 {
			slots = append(slots, i)
			cl = append(cl, b)
		}
	}
	slices.SortStableFunc(cl, func(x, y *block) int {
		return cmp.Compare(clusterRank[x.cluster-1], clusterRank[y.cluster-1])
	})
	for i, s := range slots {
		blocks[s] = cl[i]
	}
}

// crossings counts the pairs of edges that cross between neighbouring
// columns, by counting inversions with a Fenwick tree.
func (l *lay) crossings() int {
	total := 0
	var pairs [][2]int
	for r := 0; r+1 < l.ranks; r++ {
		pairs = pairs[:0]
		for _, u := range l.layers[r] {
			for _, v := range l.succ[u] {
				pairs = append(pairs, [2]int{l.pos[u], l.pos[v]})
			}
		}
		slices.SortFunc(pairs, func(a, b [2]int) int {
			if c := cmp.Compare(a[0], b[0]); c != 0 {
				return c
			}
			return cmp.Compare(a[1], b[1])
		})
		tree := make([]int, len(l.layers[r+1])+1)
		for i, p := range pairs {
			// Edges seen so far that end below this one's end cross it.
			total += i - prefix(tree, p[1]+1)
			for j := p[1] + 1; j < len(tree); j += j & -j {
				tree[j]++
			}
		}
	}
	return total
}

// prefix sums a Fenwick tree's counts of positions below n.
func prefix(tree []int, n int) int {
	s := 0
	for j := n; j > 0; j -= j & -j {
		s += tree[j]
	}
	return s
}

func (l *lay) saveOrder() [][]int {
	out := make([][]int, len(l.layers))
	for r, layer := range l.layers {
		out[r] = slices.Clone(layer)
	}
	return out
}

func (l *lay) restoreOrder(saved [][]int) {
	l.layers = saved
	for _, layer := range l.layers {
		for i, v := range layer {
			l.pos[v] = i
		}
	}
}
