package pagenumber

import (
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

func cycle(t testing.TB, n int) *graph.Graph {
	var es [][2]int
	for i := 0; i < n; i++ {
		es = append(es, [2]int{i, (i + 1) % n})
	}
	return fixture.MustNumbered(t, n, es)
}

// TestStackLowerBounds checks the solver-free lower bounds against known
// page numbers, which they must never exceed (values in the comments).
func TestStackLowerBounds(t *testing.T) {
	tests := []struct {
		name   string
		g      *graph.Graph
		pages  int
		source string
	}{
		{"empty", fixture.MustNumbered(t, 3, nil), 0, SourceTrivial},
		{"cycle", cycle(t, 6), 1, SourceTrivial},                     // outerplanar: 1 (Bernhart & Kainen 1979)
		{"K4", fixture.Complete(4), 2, SourceEdgeCount},              // bt(K4) = 2 (Bernhart & Kainen 1979)
		{"K5", fixture.Complete(5), 3, SourceEdgeCount},              // bt(K5) = 3
		{"K8", fixture.Complete(8), 4, SourceEdgeCount},              // bt(K_n) = ⌈n/2⌉
		{"K9", fixture.Complete(9), 5, SourceEdgeCount},              // bt(K_n) = ⌈n/2⌉
		{"K33", fixture.CompleteBipartite(3, 3), 3, SourceNonPlanar}, // bt(K3,3) = 3
		{"Petersen", fixture.Petersen(), 3, SourceNonPlanar},         // bt = 3
		{"K23", fixture.CompleteBipartite(2, 3), 2, SourceNonOuter},  // K2,3 is not outerplanar; bt = 2
		{"K1,5", fixture.CompleteBipartite(1, 5), 1, SourceTrivial},  // a tree: 1
		// Maximal planar graphs: 3n-6 edges allow 2 pages by the count; the
		// Goldner–Harary graph is not Hamiltonian, bt = 3 (REFERENCES), and
		// removing its 5 bipyramid vertices leaves 6 components; the
		// octahedron and icosahedron are Hamiltonian (Tutte 1956), bt = 2
		// (Bernhart & Kainen 1979), so no set exists.
		{"Goldner-Harary", fixture.GoldnerHarary(), 3, SourceToughness},
		{"octahedron", fixture.Octahedron(), 2, SourceEdgeCount},
		{"icosahedron", fixture.Icosahedron(), 2, SourceEdgeCount},
		{"two triangles", fixture.MustNumbered(t, 5, [][2]int{{0, 1}, {1, 2}, {0, 2}, {2, 3}, {3, 4}, {2, 4}}), 1, SourceTrivial},
	}
	for _, tt := range tests {
		b := stackLowerBounds(tt.g)
		if b.Pages != tt.pages || b.Source != tt.source {
			t.Errorf("%s: %+v, want %d from %s", tt.name, b, tt.pages, tt.source)
		}
	}
}

// TestBlocks: biconnected components (Hopcroft & Tarjan 1973).
func TestBlocks(t *testing.T) {
	// Two triangles sharing vertex 2, a pendant edge 4-5, an isolated vertex 6.
	g := fixture.MustNumbered(t, 7, [][2]int{{0, 1}, {1, 2}, {0, 2}, {2, 3}, {3, 4}, {2, 4}, {4, 5}})
	bs := blocks(g)
	if len(bs) != 3 || len(bs[0]) != 3 || len(bs[1]) != 3 || len(bs[2]) != 2 {
		t.Fatalf("blocks %v", bs)
	}
	if bs := blocks(fixture.Complete(6)); len(bs) != 1 || len(bs[0]) != 6 {
		t.Fatalf("K6 blocks %v", bs)
	}
	if bs := blocks(cycle(t, 5)); len(bs) != 1 || len(bs[0]) != 5 {
		t.Fatalf("C5 blocks %v", bs)
	}
}
