package heuristic

import (
	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// FourConnectedTwoPage returns a 2-page stack layout of a triangulation
// without separating triangles, or nil and the reason it does not apply.
func FourConnectedTwoPage(g *graph.Graph, seed int64) (*cert.Layout, string) {
	return nil, "not implemented"
}
