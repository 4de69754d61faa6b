package heuristic

import (
	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// completeStack returns the ⌈n/2⌉-page stack layout of a complete graph K_n
// (n ≥ 4), or nil when g is not complete.
//
// Construction (Bernhart and Kainen, "The book thickness of a graph", J.
// Combin. Theory Ser. B 27, 1979): for even n put the vertices on a circle
// as 0..n-1; the chords {u, v} with (u+v) mod n equal to 2i or 2i+1 form the
// zigzag path i, i+1, i-1, i+2, i-2, ... and do not cross, so page i+1 takes
// them. For odd n use the layout of K_{n+1} without its last vertex.
func completeStack(g *graph.Graph) *cert.Layout {
	n := g.N()
	if n < 4 || int64(g.M()) != int64(n)*int64(n-1)/2 {
		return nil
	}
	nn := n + n%2
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
	}
	page := make([]int32, g.M())
	for i, e := range g.Edges() {
		page[i] = int32((int(e.U)+int(e.V))%nn/2) + 1
	}
	return newLayout(cert.Stack, order, page, int32((n+1)/2))
}
