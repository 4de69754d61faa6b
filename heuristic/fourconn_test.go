package heuristic

import (
	"math/rand/v2"
	"strings"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

func fourConnected(t *testing.T, g *graph.Graph) {
	t.Helper()
	l, why := FourConnectedTwoPage(g, Options{Seed: 1})
	if l == nil {
		t.Fatalf("%v: %s", g, why)
	}
	if rep := cert.Validate(g, l); !rep.OK() || l.Pages() != 2 {
		t.Fatalf("%v: %d pages, %v", g, l.Pages(), rep.Err())
	}
}

// The octahedron (4-connected) and the icosahedron (5-connected) are
// triangulations without separating triangles, so Hamiltonian (Whitney
// 1931) and on 2 pages (Bernhart and Kainen 1979; REFERENCES); so is K4
// (its four triangles are its faces); and random triangulations without
// separating triangles (fixture.RandomFourConnected).
func TestFourConnectedTwoPage(t *testing.T) {
	fourConnected(t, fixture.Complete(4))
	fourConnected(t, fixture.Octahedron())
	fourConnected(t, fixture.Icosahedron())
	// The disk growth is a heuristic: on random inputs it must succeed
	// often, and whatever it returns must pass the checker.
	rng := rand.New(rand.NewPCG(7, 8))
	found, tried := 0, 0
	for n := 6; n < 80; n++ {
		for rep := 0; rep < 10; rep++ {
			g := fixture.RandomFourConnected(rng, n, rng.IntN(3*n)).Graph()
			tried++
			l, _ := FourConnectedTwoPage(g, Options{Seed: 1})
			if l == nil {
				continue
			}
			found++
			if rep := cert.Validate(g, l); !rep.OK() || l.Pages() != 2 {
				t.Fatalf("%v: %d pages, %v", g, l.Pages(), rep.Err())
			}
		}
	}
	if found < tried*9/10 {
		t.Errorf("the disk growth found 2-page layouts of %d of %d random 4-connected triangulations", found, tried)
	}
	t.Logf("2-page layouts of %d of %d random 4-connected triangulations on 6..79 vertices", found, tried)
}

// Triangulations with a separating triangle are refused: the
// Goldner–Harary graph and stacked triangulations on 5+ vertices (the
// corners of the first face stacked into, once a vertex is inside and one
// outside; the definition), and non-triangulations.
func TestFourConnectedRefuses(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for _, g := range []*graph.Graph{fixture.GoldnerHarary(), fixture.RandomStackedTriangulation(rng, 50).Graph(), fixture.Petersen(), fixture.Complete(5)} {
		if l, _ := FourConnectedTwoPage(g, Options{Seed: 1}); l != nil {
			t.Errorf("%v: a layout from the 4-connected method", g)
		}
	}
}

// TestFourConnectedLarge: random triangulations without separating
// triangles on 10^3 to 10^4 vertices are Hamiltonian (Whitney 1931), so on 2
// pages (Bernhart and Kainen 1979); the search must find such a layout, the
// checker must accept it, and its spine must be a Hamiltonian cycle of the
// graph (checked here edge by edge, the definition).
func TestFourConnectedLarge(t *testing.T) {
	sizes := []int{1000, 3000, 10000}
	if testing.Short() {
		sizes = sizes[:1]
	}
	for _, n := range sizes {
		rng := rand.New(rand.NewPCG(uint64(n), 11))
		g := fixture.RandomFourConnected(rng, n, 3*n).Graph()
		l, why := FourConnectedTwoPage(g, Options{Seed: 1})
		if l == nil {
			t.Fatalf("n=%d: no layout: %s", n, why)
		}
		if rep := cert.Validate(g, l); !rep.OK() || l.Pages() != 2 {
			t.Fatalf("n=%d: %d pages, %v", n, l.Pages(), rep.Err())
		}
		for i, v := range l.Order {
			if w := l.Order[(i+1)%n]; !g.HasEdge(v, w) {
				t.Fatalf("n=%d: spine neighbours %d and %d are not adjacent", n, v, w)
			}
		}
	}
}

// The time limit stops the search: with a limit of a microsecond a large
// 4-connected triangulation gets no layout, and the reason says why (the
// embedding alone takes longer than that, so the first check of the clock
// in the rotation search finds the limit passed).
func TestFourConnectedTimeLimit(t *testing.T) {
	g := fixture.RandomFourConnected(rand.New(rand.NewPCG(3, 4)), 20000, 20000).Graph()
	l, why := FourConnectedTwoPage(g, Options{Seed: 1, TimeLimit: time.Microsecond})
	if l != nil || !strings.Contains(why, "time limit") {
		t.Fatalf("layout %v, reason %q; want none, for the time limit", l != nil, why)
	}
}
