package heuristic

import (
	"math/rand/v2"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// peelOrder gives a spine: every vertex once, on connected and disconnected
// planar graphs, and the sweep's layout on it passes the checker.
func TestPeelOrderIsSpine(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	graphs := []*graph.Graph{
		fixture.Octahedron(),
		fixture.Icosahedron(),
		fixture.GoldnerHarary(),
		fixture.Grid(7, 9),
		fixture.RandomTree(rng, 50),
		fixture.Numbered(7, [][2]int{{0, 1}, {1, 2}, {2, 0}, {4, 5}}), // isolated vertices and two parts
	}
	for range 30 {
		tr := fixture.RandomFlippedTriangulation(rng, 4+rng.IntN(200), 100).Graph()
		graphs = append(graphs, tr, fixture.RandomFourConnected(rng, 6+rng.IntN(200), 200).Graph())
	}
	for _, g := range graphs {
		r := planarEmbedding(g)
		if r == nil {
			t.Fatalf("%v: no embedding of a planar graph", g)
		}
		for _, root := range []int32{0, int32(g.N() - 1)} {
			order := r.peelOrder(root)
			seen := make([]bool, g.N())
			for _, v := range order {
				if seen[v] {
					t.Fatalf("%v: vertex %d twice in the peel order", g, v)
				}
				seen[v] = true
			}
			if len(order) != g.N() || order[0] != root {
				t.Fatalf("%v: peel order from %d has %d vertices and starts at %d", g, root, len(order), order[0])
			}
			page, k := stackPages(g, order, time.Time{}, rand.New(rand.NewPCG(1, 2)), 0)
			checkFast(t, g, newLayout(cert.Stack, order, page, k))
		}
	}
}

// A regression guard for the reason the peel order is a candidate: on a
// random 4-connected triangulation with 3·10^4 edges (seeded, so the
// figures are fixed) the sweep on it uses fewer pages than on the
// Warnsdorff DFS, candidate 0 (measured when it was added: 10 against 67).
func TestPeelOrderBeatsDFSOnTriangulations(t *testing.T) {
	g := fixture.RandomFourConnected(rand.New(rand.NewPCG(23, 24)), 10_002, 10_002).Graph()
	sp := newSpines(g, cert.Stack, 1)
	_, dfs := stackPages(g, sp.candidate(0), time.Time{}, rand.New(rand.NewPCG(1, 2)), 0)
	_, peel := stackPages(g, sp.candidate(2), time.Time{}, rand.New(rand.NewPCG(1, 2)), 0)
	t.Logf("pages: peel order %d, Warnsdorff DFS %d", peel, dfs)
	if peel >= dfs {
		t.Errorf("peel order %d pages, Warnsdorff DFS %d: the peel order should need fewer", peel, dfs)
	}
}

// A layer of more than 2^20 vertices around a vertex of that degree: the
// sort keys of peelOrder once packed the index within the layer and the
// rotation position into 20 bits each, and lost vertices past that.
func TestPeelOrderWideLayer(t *testing.T) {
	if testing.Short() {
		t.Skip("builds a star with 2^20+3 leaves")
	}
	const leaves = 1<<20 + 3
	edges := make([][2]int, leaves)
	for i := range edges {
		edges[i] = [2]int{0, i + 1}
	}
	g := fixture.Numbered(leaves+1, edges)
	r := planarEmbedding(g)
	if r == nil {
		t.Fatal("no embedding of a star")
	}
	order := r.peelOrder(0)
	seen := make([]bool, g.N())
	for _, v := range order {
		if seen[v] {
			t.Fatalf("vertex %d twice in the peel order", v)
		}
		seen[v] = true
	}
	if len(order) != g.N() {
		t.Fatalf("peel order has %d of %d vertices", len(order), g.N())
	}
}
