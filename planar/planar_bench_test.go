package planar

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar/planarcert"
)

// Decide test with certificate (found and checked) on planar and
// non-planar graphs of 10^4, 10^5 and 10^6 vertices.
//
//	go test ./planar -run '^$' -bench Planarity -benchtime 1x
func BenchmarkPlanarity(b *testing.B) {
	sizes := []int{10_000, 100_000, 1_000_000}
	type gen struct {
		name string
		make func(rng *rand.Rand, n int) *graph.Graph
	}
	gens := []gen{
		{"triangulation", fixture.RandomTriangulation},
		{"grid", func(_ *rand.Rand, n int) *graph.Graph {
			r := 100
			return fixture.Grid(r, n/r)
		}},
		// A triangulation plus one edge between two random non-adjacent vertices.
		{"triangulation+edge", func(rng *rand.Rand, n int) *graph.Graph {
			e := fixture.RandomTriangulationEdges(rng, n)
			for {
				a, c := rng.IntN(n), rng.IntN(n)
				if a != c && !plHasPair(e, a, c) {
					return fixture.Numbered(n, append(e, [2]int{a, c}))
				}
			}
		}},
		// A 100-row grid with one diagonal between far corners of two cells.
		{"grid+edge", func(_ *rand.Rand, n int) *graph.Graph {
			r, c := 100, n/100
			g := fixture.Grid(r, c)
			e := fixture.EdgePairs(g)
			return fixture.Numbered(n, append(e, [2]int{(r/2)*c + c/3, (r/2+1)*c + 2*c/3}))
		}},
		// Random graph with 2n edges (not planar with high probability).
		{"random-2n", func(rng *rand.Rand, n int) *graph.Graph { return fixture.RandomGraph(rng, n, 2*n) }},
	}
	for _, gn := range gens {
		for _, n := range sizes {
			b.Run(fmt.Sprintf("%s/n=%d", gn.name, n), func(b *testing.B) {
				g := gn.make(rand.New(rand.NewPCG(uint64(n), 9)), n)
				b.ResetTimer()
				for b.Loop() {
					res, err := Decide(g)
					if err != nil {
						b.Fatal(err)
					}
					if err := planarcert.Check(g, res.Cert); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

func plHasPair(e [][2]int, a, c int) bool {
	for _, x := range e {
		if x[0] == a && x[1] == c || x[0] == c && x[1] == a {
			return true
		}
	}
	return false
}

// BenchmarkPlanarTest is the bare test (no certificate) on triangulations.
func BenchmarkPlanarTest(b *testing.B) {
	for _, n := range []int{10_000, 100_000, 1_000_000} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			g := fixture.RandomTriangulation(rand.New(rand.NewPCG(1, 2)), n)
			b.ResetTimer()
			for b.Loop() {
				if !IsPlanar(g) {
					b.Fatal("not planar")
				}
			}
		})
	}
}
