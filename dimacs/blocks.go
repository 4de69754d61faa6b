package dimacs

import (
	"slices"

	"spinecert.dev/graph"
)

// blockVertices returns the sorted vertices touched by the edges.
func blockVertices(g *graph.Graph, edges []int32) []int32 {
	vs := make([]int32, 0, 2*len(edges))
	for _, e := range edges {
		ed := g.Edges()[e]
		vs = append(vs, ed.U, ed.V)
	}
	slices.Sort(vs)
	return slices.Compact(vs)
}

// peelLeaves removes vertices of degree one repeatedly and returns them in
// removal order with the neighbour each had when it was removed, and a mask
// of the removed vertices.
func peelLeaves(g *graph.Graph) (leaves, anchors []int32, removed []bool) {
	n := g.N()
	deg := make([]int, n)
	removed = make([]bool, n)
	var queue []int32
	for v := int32(0); int(v) < n; v++ {
		deg[v] = g.Degree(v)
		if deg[v] == 1 {
			queue = append(queue, v)
		}
	}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		if removed[v] || deg[v] != 1 {
			continue
		}
		var u int32 = -1
		for _, w := range g.Neighbors(v) {
			if !removed[w] {
				u = w
				break
			}
		}
		removed[v] = true
		deg[v] = 0
		leaves = append(leaves, v)
		anchors = append(anchors, u)
		deg[u]--
		if deg[u] == 1 {
			queue = append(queue, u)
		}
	}
	return leaves, anchors, removed
}
