// Package layered lays out a directed graph in columns from left to right,
// in the manner Sugiyama, Tagawa and Toda described: nodes get a column
// (rank) so that every edge points right, long edges get a waypoint in
// every column they pass, the order within each column is improved by
// barycentre sweeps to reduce crossings, and the vertical positions pull
// each node towards its neighbours without letting boxes overlap. Nodes
// may belong to a cluster, which is kept together and boxed.
//
// It is plain Go: no files, no processes, no generated code, and the same
// graph always gives the same layout.
package layered

import (
	"errors"
	"fmt"
)

// Node is a box to place.
type Node struct {
	W, H float64
	// Cluster is 1 + the index of the node's cluster in Graph.Clusters,
	// or 0 for a node in no cluster.
	Cluster int
}

// Edge runs from node From to node To.
type Edge struct{ From, To int }

// Cluster is a group of nodes drawn inside one box with a label on top.
type Cluster struct {
	// LabelW is the width of the label; the box is at least this wide.
	LabelW float64
}

// Graph is what Lay lays out.
type Graph struct {
	Nodes    []Node
	Edges    []Edge
	Clusters []Cluster
}

// Options are the spacings of a layout, in the units of the node sizes.
type Options struct {
	RankSep    float64 // horizontal space between columns
	NodeSep    float64 // vertical space between boxes in a column
	EdgeSep    float64 // vertical space an edge takes where it passes a column
	ClusterPad float64 // space between a cluster's box and its nodes
	LabelH     float64 // height of a cluster's label line
	Margin     float64 // space around the drawing
	// MaxVertices bounds the nodes plus the waypoints of long edges; a
	// larger graph is refused with ErrTooLarge before any work is done.
	MaxVertices int
}

// DefaultOptions suit boxes of one line of 10-pixel text.
func DefaultOptions() Options {
	return Options{RankSep: 56, NodeSep: 12, EdgeSep: 6, ClusterPad: 10, LabelH: 14, Margin: 8, MaxVertices: 40000}
}

// Point is a position in the drawing; Y grows downwards.
type Point struct{ X, Y float64 }

// Rect is a box: its top-left corner and its size.
type Rect struct{ X, Y, W, H float64 }

// Layout is where everything goes.
type Layout struct {
	Nodes []Rect // one per node of the graph, in the same order
	// Edges holds one polyline per edge of the graph, from the side of
	// From to the side of To (the last point is where an arrowhead
	// points). Segments within a column are horizontal; the others cross
	// the free space between columns. A loop from a node to itself is nil.
	Edges    [][]Point
	Clusters []Rect // one per cluster, in the same order
	W, H     float64
}

// ErrTooLarge says a graph has more vertices than Options.MaxVertices.
var ErrTooLarge = errors.New("graph too large to lay out")

// Lay lays g out.
func Lay(g Graph, opt Options) (*Layout, error) {
	if err := validate(g); err != nil {
		return nil, err
	}
	l := newLay(g, opt)
	l.rankNodes()
	if n := l.vertexCount(); opt.MaxVertices > 0 && n > opt.MaxVertices {
		return nil, fmt.Errorf("%w: %d nodes and edge waypoints, at most %d", ErrTooLarge, n, opt.MaxVertices)
	}
	l.addVertices()
	l.order()
	l.placeY()
	l.placeX()
	return l.result(), nil
}

func validate(g Graph) error {
	for i, n := range g.Nodes {
		if n.Cluster < 0 || n.Cluster > len(g.Clusters) {
			return fmt.Errorf("node %d: cluster %d of %d", i, n.Cluster, len(g.Clusters))
		}
		if !(n.W >= 0 && n.H >= 0) || n.W > 1e6 || n.H > 1e6 {
			return fmt.Errorf("node %d: size %g × %g", i, n.W, n.H)
		}
	}
	for i, e := range g.Edges {
		if e.From < 0 || e.From >= len(g.Nodes) || e.To < 0 || e.To >= len(g.Nodes) {
			return fmt.Errorf("edge %d: %d -> %d, but %d nodes", i, e.From, e.To, len(g.Nodes))
		}
	}
	for i, c := range g.Clusters {
		if !(c.LabelW >= 0) || c.LabelW > 1e6 {
			return fmt.Errorf("cluster %d: label width %g", i, c.LabelW)
		}
	}
	return nil
}
