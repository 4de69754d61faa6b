package heuristic

import (
	"math/rand/v2"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

// plCheckTwoPage validates a layout with the layout checker (cert.Validate) and
// checks that the spine is the Hamiltonian cycle.
func plCheckTwoPage(t *testing.T, g *graph.Graph, l *cert.Layout) {
	t.Helper()
	if l.Kind != cert.Stack || len(l.PageKinds) != 2 {
		t.Fatalf("%v: layout kind %v pages %d", g, l.Kind, len(l.PageKinds))
	}
	if r := cert.Validate(g, l); !r.OK() {
		t.Fatalf("%v: layout rejected: %+v", g, r.Problems)
	}
	n := len(l.Order)
	for i := 0; i < n && n >= 3; i++ {
		if !g.HasEdge(l.Order[i], l.Order[(i+1)%n]) {
			t.Fatalf("%v: spine is not a Hamiltonian cycle at position %d", g, i)
		}
	}
}

// Bernhart & Kainen, "The book thickness of a graph", JCTB 27 (1979): a
// planar graph with a Hamiltonian cycle has a 2-page book embedding with the
// cycle as spine. Grids with an even number of vertices, wheels, octahedron,
// and triangulations (which are often Hamiltonian) exercise it.
func TestHamiltonianTwoPage(t *testing.T) {
	var wheel [][2]int
	for i := 1; i <= 9; i++ {
		wheel = append(wheel, [2]int{0, i}, [2]int{i, i%9 + 1})
	}
	octahedron := fixture.Numbered(6, [][2]int{{0, 1}, {0, 2}, {0, 3}, {0, 4}, {5, 1}, {5, 2}, {5, 3}, {5, 4}, {1, 2}, {2, 3}, {3, 4}, {4, 1}})
	gs := []*graph.Graph{fixture.Grid(4, 6), fixture.Grid(10, 10), fixture.Numbered(10, wheel), octahedron, fixture.Complete(4), fixture.CompleteBipartite(2, 2)}
	for _, g := range gs {
		l, ok := HamiltonianTwoPage(g, nil, 1_000_000)
		if !ok {
			t.Fatalf("%v: no layout", g)
		}
		plCheckTwoPage(t, g, l)
	}
	rng := rand.New(rand.NewPCG(5, 5))
	found := 0
	for i := 0; i < 30; i++ {
		g := fixture.RandomTriangulation(rng, 10+rng.IntN(40))
		emb, _ := planar.Embed(g)
		if l, ok := HamiltonianTwoPage(g, emb, 200_000); ok {
			plCheckTwoPage(t, g, l)
			found++
		}
	}
	if found < 10 {
		t.Fatalf("only %d of 30 random triangulations got a layout", found)
	}
}

// Graphs with no Hamiltonian cycle give no layout: a grid with an odd number
// of vertices is bipartite with unequal sides (common practice, no source),
// K2,3 likewise, and the Goldner–Harary graph is a non-Hamiltonian maximal
// planar graph (Goldner & Harary 1975); a path has a vertex of degree one;
// K5 is not planar.
func TestHamiltonianTwoPageNone(t *testing.T) {
	// Goldner–Harary: the triangular bipyramid (triangle 0 1 2, apexes 3 and
	// 4) with a vertex stacked into each of its six faces; 11 vertices, 27
	// edges. A Hamiltonian cycle would have to separate the six stacked
	// vertices, which are pairwise non-adjacent, by the other five.
	e := [][2]int{{0, 1}, {1, 2}, {0, 2}, {3, 0}, {3, 1}, {3, 2}, {4, 0}, {4, 1}, {4, 2}}
	faces := [][3]int{{3, 0, 1}, {3, 1, 2}, {3, 2, 0}, {4, 0, 1}, {4, 1, 2}, {4, 2, 0}}
	for i, f := range faces {
		for _, x := range f {
			e = append(e, [2]int{5 + i, x})
		}
	}
	gh := fixture.Numbered(11, e)
	if gh.M() != 27 || !planar.IsMaximal(gh) {
		t.Fatalf("Goldner–Harary graph: %d edges, maximal planar %v", gh.M(), planar.IsMaximal(gh))
	}
	for _, g := range []*graph.Graph{fixture.Grid(3, 3), fixture.CompleteBipartite(2, 3), fixture.Grid(1, 5), fixture.Complete(5), gh} {
		if _, ok := HamiltonianTwoPage(g, nil, 100_000); ok {
			t.Fatalf("%v: layout from a non-Hamiltonian graph", g)
		}
	}
}

func TestIsMaximalPlanarSmall(t *testing.T) {
	if !planar.IsMaximal(fixture.Numbered(2, [][2]int{{0, 1}})) || planar.IsMaximal(fixture.Numbered(2, nil)) {
		t.Fatal("two-vertex cases wrong")
	}
}

// A rotation system that is not an embedding of the graph gives no layout.
func TestHamiltonianTwoPageBadEmbedding(t *testing.T) {
	g := fixture.Grid(4, 4)
	emb, _ := planar.Embed(g)
	bad := &planarcert.Embedding{Rotation: make([][]int32, g.N())}
	for v, r := range emb.Rotation {
		bad.Rotation[v] = append([]int32(nil), r...)
	}
	r := bad.Rotation[5]
	r[1] = r[0] // a repeated neighbour; one edge at vertex 5 is never placed
	if l, ok := HamiltonianTwoPage(g, bad, 100_000); ok {
		if rep := cert.Validate(g, l); !rep.OK() {
			t.Fatalf("invalid layout returned: %+v", rep.Problems)
		}
	}
	if _, ok := HamiltonianTwoPage(g, &planarcert.Embedding{}, 100_000); ok {
		t.Fatal("layout from an empty rotation system")
	}
}
