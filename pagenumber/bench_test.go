package pagenumber

import (
	"context"
	"fmt"
	"math/rand/v2"
	"os"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/fixture/backends"
	"spinecert.dev/internal/testtools"
	"spinecert.dev/verify"
)

// benchLimit is the time limit per solver run in the K_9 benchmarks
// (SPINECERT_BENCH_LIMIT, a Go duration; default 10m).
func benchLimit(b *testing.B) time.Duration {
	if s := os.Getenv("SPINECERT_BENCH_LIMIT"); s != "" {
		d, err := time.ParseDuration(s)
		if err != nil {
			b.Fatal(err)
		}
		return d
	}
	return 10 * time.Minute
}

// BenchmarkPageNumberK9 measures spinecert's page number of K_9 (5, Bernhart &
// Kainen 1979): with the solver-free bounds (the edge count gives 5), and
// with the lower bound proved by a checked UNSAT for 4 pages using cadical
// and minisat as the two backends (cadical's proof is checked).
func BenchmarkPageNumberK9(b *testing.B) {
	g := fixture.Complete(9)
	b.Run("bounds", func(b *testing.B) {
		for b.Loop() {
			res, err := Compute(context.Background(), g, Options{Kind: cert.Stack, Solvers: []verify.Solver{verify.Gini{}}})
			if err != nil || res.PageNumber != 5 {
				b.Fatalf("%v %+v", err, res)
			}
		}
	})
	b.Run("unsat-lower", func(b *testing.B) {
		solvers := []verify.Solver{externalForBench(b, "cadical"), externalForBench(b, "minisat")}
		for b.Loop() {
			res, err := Compute(context.Background(), g, Options{Kind: cert.Stack, Solvers: solvers, UnsatLower: true, Limit: benchLimit(b)})
			if err != nil || res.PageNumber != 5 || res.Lower.Source != SourceUnsat {
				b.Fatalf("%v %+v", err, res)
			}
		}
	})
}

func externalForBench(b *testing.B, name string) verify.Solver {
	testtools.Require(b, name, name)
	s, err := verify.ByName(name, verify.ChildCommand{})
	if err != nil {
		b.Fatal(err)
	}
	return s
}

// BenchmarkK9FourPages measures each backend alone on "K_9 has a 4-page
// stack layout" (unsatisfiable, Bernhart & Kainen 1979), in the default
// encoding and in the published baseline formulation. A run that hits the
// time limit fails the benchmark with the limit in its message.
func BenchmarkK9FourPages(b *testing.B) {
	g := fixture.Complete(9)
	for _, enc := range []struct {
		name string
		opt  dimacs.Options
	}{
		{"default", dimacs.Options{Kind: cert.Stack, Pages: 4}},
		{"baseline", dimacs.Options{Kind: cert.Stack, Pages: 4, Baseline: true}},
	} {
		e, err := dimacs.Encode(g, enc.opt)
		if err != nil {
			b.Fatal(err)
		}
		cnf := e.CNF()
		for _, name := range []string{"gophersat", "gini", "cadical", "minisat"} {
			b.Run(enc.name+"/"+name, func(b *testing.B) {
				var s verify.Solver
				switch name {
				case "gophersat":
					s = backends.Gophersat(b)
				case "gini":
					s = verify.Gini{}
				default:
					s = externalForBench(b, name)
				}
				var cpu time.Duration
				for b.Loop() {
					r, err := s.Solve(context.Background(), cnf, benchLimit(b), "")
					if err != nil {
						b.Fatal(err)
					}
					cpu += r.CPU
					if r.Answer != verify.Unsat {
						b.Fatalf("%s: %s after %v (%s)", name, r.Answer, r.Elapsed, r.Detail)
					}
				}
				if cpu > 0 {
					b.ReportMetric(cpu.Seconds()/float64(b.N), "cpu-s/op")
				}
			})
		}
	}
}

// BenchmarkToughness measures the toughness bound on Kleetopes of random
// triangulations (3n − 4 vertices for n original ones): the search alone,
// and the whole solver-free lower bound (planarity test and its check, the
// search, toughcert.Check). The bound must be 3 (REFERENCES: a Kleetope of
// a triangulation on n >= 5 vertices is not 1-tough, with Chvátal 1973).
func BenchmarkToughness(b *testing.B) {
	for _, n := range []int{20, 335, 1335} {
		g := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(1, uint64(n))), n, 3*n).Kleetope()
		b.Run(fmt.Sprintf("search-%d", g.N()), func(b *testing.B) {
			for b.Loop() {
				if s := findToughSet(g); len(s) != n {
					b.Fatalf("|S| = %d, want the %d old vertices", len(s), n)
				}
			}
		})
		b.Run(fmt.Sprintf("bound-%d", g.N()), func(b *testing.B) {
			for b.Loop() {
				if lb := stackLowerBounds(g); lb.Pages != 3 || lb.Source != SourceToughness {
					b.Fatalf("%+v", lb)
				}
			}
		})
	}
}
