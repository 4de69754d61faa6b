package verify

import (
	"context"
	"errors"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// benchDirEnv names a directory shared with scripts/backends.sh: the test
// below writes the benchmark graphs there, and the benchmark reads the CNFs
// the script encoded from them ("spinecert encode") when they are there.
const benchDirEnv = "SPINECERT_BENCH_DIR"

// benchLimitEnv overrides the time limit of each benchmark solver run.
const benchLimitEnv = "SPINECERT_BENCH_LIMIT"

// kleetopeSizes are the triangulation sizes n of the benchmark graphs: the
// Kleetope of a triangulation on n vertices has n + (2n-4) = 3n-4 vertices,
// so these give 56, 116 and 206 vertices.
var kleetopeSizes = []int{20, 40, 70}

// benchKleetope is the Kleetope of a random stacked triangulation on n
// vertices, the same graph for the same n on every run.
func benchKleetope(n int) *graph.Graph {
	rng := rand.New(rand.NewPCG(uint64(n), 2))
	return fixture.RandomFlippedTriangulation(rng, n, 0).Kleetope()
}

// benchName is the file name stem of the benchmark graph for n.
func benchName(n int) string { return fmt.Sprintf("kleetope-%d", 3*n-4) }

// TestWriteBenchKleetopes writes the benchmark graphs as edge lists into
// $SPINECERT_BENCH_DIR for scripts/backends.sh; without it there is
// nothing to do.
func TestWriteBenchKleetopes(t *testing.T) {
	dir := os.Getenv(benchDirEnv)
	if dir == "" {
		t.Skipf("%s not set: no benchmark graphs to write", benchDirEnv)
	}
	for _, n := range kleetopeSizes {
		g := benchKleetope(n)
		// Euler's formula: a triangulation on v vertices has 3v-6 edges,
		// and the Kleetope of one is again a triangulation (common practice, no source).
		if v := 3*n - 4; g.N() != v || g.M() != 3*v-6 {
			t.Fatalf("Kleetope for n=%d: %d vertices, %d edges, want %d and %d", n, g.N(), g.M(), v, 3*v-6)
		}
		f, err := os.Create(filepath.Join(dir, benchName(n)+".edges"))
		if err != nil {
			t.Fatal(err)
		}
		if err := graph.WriteEdgeList(f, g); err != nil {
			t.Fatal(err)
		}
		if err := f.Close(); err != nil {
			t.Fatal(err)
		}
	}
}

// benchCNF is the 2-page stack claim for the Kleetope on n: the CNF
// scripts/backends.sh encoded when there is one, else encoded here with the
// default options (those of "spinecert encode --pages 2").
func benchCNF(b *testing.B, n int) *dimacs.CNF {
	b.Helper()
	if dir := os.Getenv(benchDirEnv); dir != "" {
		path := filepath.Join(dir, benchName(n)+".cnf")
		if _, err := os.Stat(path); err == nil {
			cnf, err := dimacs.ReadCNFFile(path, dimacs.ReadOptions{})
			if err != nil {
				b.Fatal(err)
			}
			return cnf
		}
	}
	enc, err := dimacs.Encode(benchKleetope(n), dimacs.Options{Kind: cert.Stack, Pages: 2})
	if err != nil {
		b.Fatal(err)
	}
	return enc.CNF()
}

// BenchmarkBackendsKleetope times every backend on PATH (and the in-process
// ones) on "the Kleetope has a 2-page stack layout". Each is UNSAT: the
// Kleetope of a triangulation on n >= 5 vertices is maximal planar and not
// Hamiltonian (removing the n old vertices leaves 2n-4 > n components, so
// it is not 1-tough: Chvátal, Discrete Math. 5 (1973)), and a maximal
// planar graph has a 2-page layout only if it is Hamiltonian (Bernhart &
// Kainen, JCTB 27 (1979)). Select one with -bench 'BackendsKleetope/v=116/cadical$'.
func BenchmarkBackendsKleetope(b *testing.B) {
	limit := 10 * time.Minute
	if s := os.Getenv(benchLimitEnv); s != "" {
		d, err := time.ParseDuration(s)
		if err != nil {
			b.Fatalf("%s: %v", benchLimitEnv, err)
		}
		limit = d
	}
	child, err := SelfChild(GophersatChild)
	if err != nil {
		b.Fatal(err)
	}
	for _, n := range kleetopeSizes {
		b.Run(fmt.Sprintf("v=%d", 3*n-4), func(b *testing.B) {
			cnf := benchCNF(b, n)
			for _, name := range KnownSolvers() {
				b.Run(name, func(b *testing.B) {
					s, err := ByName(name, child)
					if errors.Is(err, ErrNoSolver) {
						b.Skip(err)
					} else if err != nil {
						b.Fatal(err)
					}
					for b.Loop() {
						res, err := s.Solve(context.Background(), cnf, limit, "")
						if err != nil {
							b.Fatal(err)
						}
						switch res.Answer {
						case Unsat:
						case Sat:
							b.Fatalf("%s found a model of a claim that has none", name)
						default:
							b.Skipf("%s gave no answer: %s", name, res.Detail)
						}
					}
				})
			}
		})
	}
}
