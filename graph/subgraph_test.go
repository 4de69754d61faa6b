package graph_test

import (
	"errors"
	"math/rand/v2"
	"strings"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// TestCheckSubgraph compares CheckSubgraph with the definition (every vertex
// and edge of h, by label, is in g; common practice, no source) on random
// graphs: induced subgraphs and spanning subgraphs are accepted, and adding
// a vertex or an edge that g lacks is rejected, naming it.
func TestCheckSubgraph(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for trial := 0; trial < 300; trial++ {
		g := fixture.RandomGNP(r, 2+r.IntN(12), r.Float64())
		var keep []int32
		for v := int32(0); int(v) < g.N(); v++ {
			if r.IntN(3) > 0 {
				keep = append(keep, v)
			}
		}
		h, _ := g.Induced(keep)
		if err := graph.CheckSubgraph(h, g); err != nil {
			t.Fatalf("induced subgraph rejected: %v", err)
		}
		// Drop some edges: still a subgraph.
		var kept [][2]string
		for _, e := range h.Edges() {
			if r.IntN(2) == 0 {
				kept = append(kept, [2]string{h.Label(e.U), h.Label(e.V)})
			}
		}
		build := func(extraVertex string, extra ...[2]string) *graph.Graph {
			b := graph.NewBuilder()
			for _, l := range h.Labels() {
				b.Vertex(l)
			}
			if extraVertex != "" {
				b.Vertex(extraVertex)
			}
			for _, e := range append(append([][2]string(nil), kept...), extra...) {
				b.AddEdge(b.Vertex(e[0]), b.Vertex(e[1]))
			}
			out, _ := b.Build()
			return out
		}
		var missing [][2]string
		// Add a non-edge of g between kept vertices, if there is one.
		for i := 0; i < len(keep) && missing == nil; i++ {
			for j := i + 1; j < len(keep); j++ {
				if !g.HasEdge(keep[i], keep[j]) {
					missing = append(missing, [2]string{g.Label(keep[i]), g.Label(keep[j])})
					break
				}
			}
		}
		if err := graph.CheckSubgraph(build(""), g); err != nil {
			t.Fatalf("spanning subgraph rejected: %v", err)
		}
		if missing != nil {
			err := graph.CheckSubgraph(build("", missing[0]), g)
			if !errors.Is(err, graph.ErrNotSubgraph) || !strings.Contains(err.Error(), missing[0][0]) {
				t.Fatalf("edge %v not in g accepted or not named: %v", missing[0], err)
			}
		}
		if err := graph.CheckSubgraph(build("not-in-g"), g); !errors.Is(err, graph.ErrNotSubgraph) || !strings.Contains(err.Error(), `"not-in-g"`) {
			t.Fatalf("a vertex not in g accepted or not named: %v", err)
		}
	}
}
