package cube

import (
	"context"
	"fmt"
	"math/rand/v2"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
)

// benchCNF is the 2-page stack encoding of the Kleetope of the random
// stacked triangulation with 20 vertices that "kleetopegen -t 20 -seed 1"
// writes (56 vertices): maximal planar and not Hamiltonian, so it needs 3
// pages (Bernhart and Kainen, "The book thickness of a graph", 1979) and
// the formula is unsatisfiable, as the formulas split in practice are.
func benchCNF(b *testing.B) *dimacs.CNF {
	b.Helper()
	tr := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(1, 2)), 20, 0)
	enc, err := dimacs.Encode(tr.Kleetope(), dimacs.Options{Kind: cert.Stack, Pages: 2})
	if err != nil {
		b.Fatal(err)
	}
	return enc.CNF()
}

// BenchmarkSplit times Split for both rules at 16, 64 and 256 cubes, and
// reports the look-ahead propagations per split and the cubes unit
// propagation already refutes.
func BenchmarkSplit(b *testing.B) {
	cnf := benchCNF(b)
	for _, rule := range Rules {
		for _, n := range []int{16, 64, 256} {
			b.Run(fmt.Sprintf("%s/cubes=%d", rule, n), func(b *testing.B) {
				var stats *SplitStats
				for b.Loop() {
					cubes, s, err := Split(context.Background(), cnf, SplitOptions{Cubes: n, Rule: rule})
					if err != nil {
						b.Fatal(err)
					}
					if len(cubes) > n {
						b.Fatalf("%d cubes, asked for %d", len(cubes), n)
					}
					stats = s
				}
				b.ReportMetric(float64(stats.Probes), "probes/op")
				b.ReportMetric(float64(stats.Closed), "closed/op")
			})
		}
	}
}
