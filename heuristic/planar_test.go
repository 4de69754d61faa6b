package heuristic

import (
	"math/rand/v2"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// newRotation pairs darts correctly and the embedding it flattens traces
// n - m + f = 2 faces on a connected planar graph (Euler's formula), faces
// traced by following, at the head of each dart, the next dart in rotation
// after the reverse dart.
func TestRotationFaces(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	for _, g := range []*graph.Graph{fixture.RandomFlippedTriangulation(rng, 500, 500).Graph(), fixture.Grid(9, 12)} {
		r := planarEmbedding(g)
		if r == nil {
			t.Fatalf("%v: no embedding", g)
		}
		for i := range r.nb {
			if j := r.twin[i]; r.twin[j] != int32(i) || r.nb[j] == r.nb[i] {
				t.Fatalf("dart %d: twin %d does not pair back", i, j)
			}
		}
		seen := make([]bool, len(r.nb))
		faces := 0
		for i := range r.nb {
			if seen[i] {
				continue
			}
			faces++
			for x := int32(i); !seen[x]; {
				seen[x] = true
				w := r.nb[x]
				x = r.twin[x] + 1
				if x == r.off[w+1] {
					x = r.off[w]
				}
			}
		}
		if got := g.N() - g.M() + faces; got != 2 {
			t.Errorf("%v: n-m+f = %d, want 2", g, got)
		}
	}
	if planarEmbedding(fixture.Complete(5)) != nil {
		t.Error("K5 got an embedding")
	}
}

// Grids are leveled planar (levels x+y, edges only between consecutive
// levels), and every leveled-planar graph has a 1-queue layout (Heath and
// Rosenberg, "Laying out graphs using queues", SIAM J. Comput. 21(5),
// 1992). The embedding-guided BFS from a corner reaches it; the row-major
// order used before needed 2 queues.
func TestGridOneQueue(t *testing.T) {
	for _, wh := range [][2]int{{3, 3}, {5, 4}, {10, 10}, {30, 7}, {1, 9}} {
		g := fixture.Grid(wh[1], wh[0])
		l := Queue(g, Options{Candidates: 2})
		if k := checkLayout(t, g, l); k != 1 {
			t.Errorf("grid %v: %d queues, want 1", wh, k)
		}
	}
}

// Random maximal planar graphs on up to 300 vertices: every layout passes
// cert.Validate and the brute-force check. The bounds are observed
// regression guards for this generator and seed, not outside truths: every
// planar graph has a 4-page stack layout (Yannakakis, "Embedding planar
// graphs in four pages", JCSS 38, 1989) and queue number at most 49
// (Dujmović, Joret, Micek, Morin, Ueckerdt and Wood, "Planar graphs have
// bounded queue-number", J. ACM 67(4), 2020), and the heuristic reaches
// neither guarantee.
func TestRandomPlanarGuard(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	worstS, worstQ := 0, 0
	for i := 0; i < 10; i++ {
		n := 20 + rng.IntN(280)
		g := fixture.RandomFlippedTriangulation(rng, n, n).Graph()
		s := checkLayout(t, g, Stack(g, Options{Seed: int64(i)}))
		q := checkLayout(t, g, Queue(g, Options{Seed: int64(i)}))
		worstS, worstQ = max(worstS, s), max(worstQ, q)
	}
	t.Logf("worst: %d stack pages, %d queues", worstS, worstQ)
	if worstS > 8 || worstQ > 16 {
		t.Errorf("worst %d stack pages / %d queues, guard 8 / 16", worstS, worstQ)
	}
}
