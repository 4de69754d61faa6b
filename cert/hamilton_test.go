package cert

import (
	"math/rand/v2"
	"testing"
)

// plCheckTwoPage validates a layout with the layout checker (Validate) and
// checks that the spine is the Hamiltonian cycle.
func plCheckTwoPage(t *testing.T, g *Graph, l *Layout) {
	t.Helper()
	if l.Kind != Stack || len(l.PageKinds) != 2 {
		t.Fatalf("%v: layout kind %v pages %d", g, l.Kind, len(l.PageKinds))
	}
	if r := Validate(g, l); !r.OK() {
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
	octahedron := plNumbered(6, [][2]int{{0, 1}, {0, 2}, {0, 3}, {0, 4}, {5, 1}, {5, 2}, {5, 3}, {5, 4}, {1, 2}, {2, 3}, {3, 4}, {4, 1}})
	gs := []*Graph{plGridGraph(4, 6), plGridGraph(10, 10), plNumbered(10, wheel), octahedron, plCompleteGraph(4), plCompleteBipartite(2, 2)}
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
		g := plRandomTriangulation(rng, 10+rng.IntN(40))
		emb, _ := PlanarEmbedding(g)
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
	gh := plNumbered(11, e)
	if gh.M() != 27 || !IsMaximalPlanar(gh) {
		t.Fatalf("Goldner–Harary graph: %d edges, maximal planar %v", gh.M(), IsMaximalPlanar(gh))
	}
	for _, g := range []*Graph{plGridGraph(3, 3), plCompleteBipartite(2, 3), plGridGraph(1, 5), plCompleteGraph(5), gh} {
		if _, ok := HamiltonianTwoPage(g, nil, 100_000); ok {
			t.Fatalf("%v: layout from a non-Hamiltonian graph", g)
		}
	}
}

func TestIsMaximalPlanarSmall(t *testing.T) {
	if !IsMaximalPlanar(plNumbered(2, [][2]int{{0, 1}})) || IsMaximalPlanar(plNumbered(2, nil)) {
		t.Fatal("two-vertex cases wrong")
	}
}

// A rotation system that is not an embedding of the graph gives no layout.
func TestHamiltonianTwoPageBadEmbedding(t *testing.T) {
	g := plGridGraph(4, 4)
	emb, _ := PlanarEmbedding(g)
	bad := &Embedding{Rotation: make([][]int32, g.N())}
	for v, r := range emb.Rotation {
		bad.Rotation[v] = append([]int32(nil), r...)
	}
	r := bad.Rotation[5]
	r[1] = r[0] // a repeated neighbour; one edge at vertex 5 is never placed
	if l, ok := HamiltonianTwoPage(g, bad, 100_000); ok {
		if rep := Validate(g, l); !rep.OK() {
			t.Fatalf("invalid layout returned: %+v", rep.Problems)
		}
	}
	if _, ok := HamiltonianTwoPage(g, &Embedding{}, 100_000); ok {
		t.Fatal("layout from an empty rotation system")
	}
}
