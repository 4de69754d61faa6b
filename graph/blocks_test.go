package graph_test

import (
	"math/rand/v2"
	"slices"
	"testing"

	"spinecert.dev/internal/fixture"
)

// TestBlocksAgainstCycles compares graph.Blocks with the definition: two edges are
// in the same block exactly when they lie on a common simple cycle, and a
// bridge is a block of its own (F. Harary, "Graph Theory", 1969, ch. 3; the
// edge relation "on a common cycle" is an equivalence whose classes are the
// blocks). The reference enumerates every simple cycle of small graphs.
func TestBlocksAgainstCycles(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 12))
	for trial := 0; trial < 300; trial++ {
		g := fixture.RandomGNP(r, 1+r.IntN(7), r.Float64())
		m := g.M()
		parent := make([]int, m)
		for i := range parent {
			parent[i] = i
		}
		find := func(x int) int {
			for parent[x] != x {
				x = parent[x]
			}
			return x
		}
		// every simple cycle, as the edges it uses, found by DFS from its smallest vertex
		var path []int32
		onPath := make([]bool, g.N())
		var dfs func(start, v int32)
		dfs = func(start, v int32) {
			for i, w := range g.Neighbors(v) {
				e := int(g.IncidentEdges(v)[i])
				switch {
				case w == start && len(path) >= 2:
					cycle := append(slices.Clone(path), int32(e))
					for _, f := range cycle[1:] {
						parent[find(int(f))] = find(int(cycle[0]))
					}
				case w > start && !onPath[w]:
					onPath[w] = true
					path = append(path, int32(e))
					dfs(start, w)
					path = path[:len(path)-1]
					onPath[w] = false
				}
			}
		}
		for s := int32(0); int(s) < g.N(); s++ {
			onPath[s] = true
			dfs(s, s)
			onPath[s] = false
		}
		blocks := g.Blocks()
		seen := make([]int, m)
		for i := range seen {
			seen[i] = -1
		}
		for b, blk := range blocks {
			for _, e := range blk {
				if seen[e] >= 0 {
					t.Fatalf("edge %d in two blocks", e)
				}
				seen[e] = b
			}
		}
		for e := 0; e < m; e++ {
			if seen[e] < 0 {
				t.Fatalf("trial %d: edge %d in no block", trial, e)
			}
			for f := 0; f < m; f++ {
				if (seen[e] == seen[f]) != (find(e) == find(f)) {
					t.Fatalf("trial %d: edges %d and %d: same block %v, common cycle %v", trial, e, f, seen[e] == seen[f], find(e) == find(f))
				}
			}
		}
	}
}
