package heuristic

import (
	"fmt"
	"math/rand/v2"
	"runtime/debug"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// limitMemory guards a benchmark against runaway memory: past limit
// bytes the collector runs continuously and the run slows down instead of
// taking the machine down (runtime/debug.SetMemoryLimit).
func limitMemory(b *testing.B, limit int64) {
	old := debug.SetMemoryLimit(limit)
	b.Cleanup(func() { debug.SetMemoryLimit(old) })
}

// benchConstruct times build on graphs of about 10^4, 10^5 and 10^6 edges
// with the commands' time limit (DefaultTimeLimit) and checks every layout
// (cert.Validate, outside the timing) against the class bound.
func benchConstruct(b *testing.B, class string, bound int, gen func(rng *rand.Rand, n int) *graph.Graph) {
	limitMemory(b, 4<<30)
	for _, m := range []int{10_000, 100_000, 1_000_000} {
		name := class + map[int]string{10_000: "1e4", 100_000: "1e5", 1_000_000: "1e6"}[m]
		b.Run(name, func(b *testing.B) {
			g := benchGraph(b, name, func() *graph.Graph { return gen(rand.New(rand.NewPCG(5, uint64(m))), m/3+2) })
			var l *cert.Layout
			var rep Report
			for b.Loop() {
				var err error
				if l, rep, err = FindReport(g, cert.Stack, Options{Seed: 1, TimeLimit: DefaultTimeLimit}); err != nil {
					b.Fatal(err)
				}
			}
			b.StopTimer()
			if vr := cert.Validate(g, l); !vr.OK() {
				b.Fatalf("%s: layout by %s rejected: %v", name, rep.Method, vr.Err())
			}
			if l.Pages() > bound {
				// a heuristic construction (the disk growth) may miss
				b.Logf("%s: %d pages by method %s, above the class bound %d", name, l.Pages(), rep.Method, bound)
			}
			if testing.Verbose() {
				fmt.Printf("%s: n=%d m=%d pages=%d method=%s\n", name, g.N(), g.M(), l.Pages(), rep.Method)
			}
			b.ReportMetric(float64(l.Pages()), "pages")
			b.ReportMetric(float64(g.M()), "edges")
		})
	}
}

// BenchmarkStacked: random planar 3-trees (fixture.RandomStackedTriangulation),
// at most 3 pages (Heath 1984; from memory); target 10^6 edges in 5 s:
//
//	go test ./heuristic -run '^$' -bench 'Stacked' -benchtime 1x
func BenchmarkStacked(b *testing.B) {
	benchConstruct(b, "stacked", 3, func(rng *rand.Rand, n int) *graph.Graph {
		return fixture.RandomStackedTriangulation(rng, n).Graph()
	})
}

// BenchmarkFourConnected: random triangulations without separating
// triangles (fixture.RandomFourConnected), 2 pages when the disk growth or
// the rotation-extension search finds a Hamiltonian cycle (Whitney 1931; Bernhart and Kainen 1979):
//
//	go test ./heuristic -run '^$' -bench 'FourConnected' -benchtime 1x -v
func BenchmarkFourConnected(b *testing.B) {
	benchConstruct(b, "fourconn", 2, func(rng *rand.Rand, n int) *graph.Graph {
		return fixture.RandomFourConnected(rng, n, n).Graph()
	})
}
