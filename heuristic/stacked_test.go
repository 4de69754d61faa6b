package heuristic

import (
	"math/rand/v2"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

func stackedLayout(t *testing.T, g *graph.Graph) *cert.Layout {
	t.Helper()
	st, ok := RecognizeStacked(g)
	if !ok {
		t.Fatalf("%v: not recognised as a planar 3-tree", g)
	}
	l := StackedThreePage(g, st)
	if l == nil {
		t.Fatalf("%v: no layout", g)
	}
	if rep := cert.Validate(g, l); !rep.OK() {
		t.Fatalf("%v: layout rejected: %v", g, rep.Err())
	}
	if l.Pages() > 3 {
		t.Fatalf("%v: %d pages", g, l.Pages())
	}
	return l
}

// Planar 3-trees have book thickness at most 3 (Heath, FOCS 1984; from
// memory): random ones, their Kleetopes (stacking into every face keeps a
// planar 3-tree: the definition), K4 and the Goldner–Harary graph (a
// planar 3-tree: REFERENCES, the Kleetope of the triangular bipyramid).
func TestStackedThreePage(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	stackedLayout(t, fixture.Complete(3))
	stackedLayout(t, fixture.Complete(4))
	stackedLayout(t, fixture.GoldnerHarary())
	for n := 3; n < 60; n++ {
		for rep := 0; rep < 20; rep++ {
			tr := fixture.RandomStackedTriangulation(rng, n)
			stackedLayout(t, tr.Graph())
			stackedLayout(t, tr.Kleetope())
		}
	}
	for _, n := range []int{1000, 20000} {
		stackedLayout(t, fixture.RandomStackedTriangulation(rng, n).Graph())
	}
}

// Graphs that are not planar 3-trees are rejected: the octahedron and
// icosahedron have no vertex of degree 3 (4- and 5-regular), K5 has too
// many edges, and a random flipped triangulation has degrees >= 3 but is
// not stacked in general (common practice, no source).
func TestRecognizeStackedRejects(t *testing.T) {
	for _, g := range []*graph.Graph{fixture.Octahedron(), fixture.Icosahedron(), fixture.Complete(5), fixture.Petersen()} {
		if _, ok := RecognizeStacked(g); ok {
			t.Errorf("%v recognised as a planar 3-tree", g)
		}
	}
	// K_{3,3} plus the triangle on one side: 3 + 9 = 12 edges = 3·6 − 6 and
	// it peels like a 3-tree (three vertices stacked onto one triangle), but
	// it is not planar (it contains K_{3,3}; Kuratowski 1930).
	e := [][2]int{{0, 1}, {1, 2}, {0, 2}}
	for v := 3; v < 6; v++ {
		e = append(e, [2]int{0, v}, [2]int{1, v}, [2]int{2, v})
	}
	if _, ok := RecognizeStacked(fixture.Numbered(6, e)); ok {
		t.Error("K_{3,3} plus a triangle recognised as a planar 3-tree")
	}
}
