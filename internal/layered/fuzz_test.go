package layered

import "testing"

// graphFromBytes reads a small graph from fuzz input: a node count, a
// cluster count, a byte per node (its cluster and width), then pairs of
// bytes as edges (at most 150, which keeps each run quick).
func graphFromBytes(data []byte) Graph {
	next := func() int {
		if len(data) == 0 {
			return 0
		}
		b := int(data[0])
		data = data[1:]
		return b
	}
	n, k := next()%48, next()%6
	g := Graph{Clusters: make([]Cluster, k)}
	for c := range g.Clusters {
		g.Clusters[c].LabelW = float64(next())
	}
	for i := 0; i < n; i++ {
		b := next()
		g.Nodes = append(g.Nodes, Node{W: float64(10 + b), H: float64(12 + b%13), Cluster: b % (k + 1)})
	}
	for n > 0 && len(data) >= 2 && len(g.Edges) < 150 {
		g.Edges = append(g.Edges, Edge{next() % n, next() % n})
	}
	return g
}

func FuzzLay(f *testing.F) {
	f.Add([]byte{5, 1, 30, 0, 1, 2, 3, 4, 0, 1, 1, 2, 2, 3, 3, 4})
	f.Add([]byte{12, 3, 50, 10, 90, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 0, 5, 5, 0, 1, 11, 2, 9, 3, 3})
	f.Add([]byte{40, 5, 1, 2, 3, 4, 5, 255, 254, 253, 252, 251, 250, 249, 248, 247, 246, 245, 244, 243, 242, 241, 240,
		0, 39, 1, 38, 2, 37, 3, 36, 4, 35, 5, 34, 6, 33, 7, 32, 8, 31, 9, 30})
	f.Fuzz(func(t *testing.T, data []byte) {
		g := graphFromBytes(data)
		lay, err := Lay(g, DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		checkLayout(t, g, lay)
		acyclic := true
		for _, e := range g.Edges {
			acyclic = acyclic && e.From < e.To
		}
		if acyclic {
			leftToRight(t, lay)
		}
	})
}
