package graph

import (
	"fmt"
	"strings"
)

// CheckSubgraph checks that h is a subgraph of g with the same labels: every
// vertex label of h is a label of g, and every edge of h joins two vertices
// whose labels are adjacent in g. The vertices of h are distinct (h is a
// Graph), so the map by labels is an embedding of h in g. Every vertex or
// edge of h that g lacks is reported (up to ten, then a count) in an error
// wrapping ErrNotSubgraph.
//
// Why it matters: a layout of g restricts to a layout of every subgraph —
// keep the spine order of h's vertices and the page of each of h's edges;
// two edges of h cross or nest exactly when they do in g's layout, since
// that depends only on the relative order of their ends. So "h has no
// K-page layout" together with this check proves "g has no K-page layout".
func CheckSubgraph(h, g *Graph) error {
	var problems []string
	total := 0
	bad := func(format string, args ...any) {
		if total < 10 {
			problems = append(problems, fmt.Sprintf(format, args...))
		}
		total++
	}
	at := make([]int32, h.N())
	for v := int32(0); int(v) < h.N(); v++ {
		w, ok := g.Index(h.Label(v))
		if !ok {
			bad("vertex %q is not a vertex of the graph", h.Label(v))
			w = -1
		}
		at[v] = w
	}
	for _, e := range h.Edges() {
		u, w := at[e.U], at[e.V]
		if u >= 0 && w >= 0 && !g.HasEdge(u, w) {
			bad("edge %q–%q is not an edge of the graph", h.Label(e.U), h.Label(e.V))
		}
	}
	if total == 0 {
		return nil
	}
	msg := strings.Join(problems, "; ")
	if total > len(problems) {
		msg += fmt.Sprintf(" (and %d more)", total-len(problems))
	}
	return fmt.Errorf("%w: %s", ErrNotSubgraph, msg)
}
