package heuristic

import (
	"fmt"
	"math/rand/v2"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// benchGraphs are built once per process: the large ones take seconds.
var benchGraphs = map[string]*graph.Graph{}

func benchGraph(b *testing.B, name string, build func() *graph.Graph) *graph.Graph {
	if g, ok := benchGraphs[name]; ok {
		return g
	}
	g := build()
	benchGraphs[name] = g
	return g
}

func benchKind(b *testing.B, kind cert.Kind, candidates int) {
	rng := rand.New(rand.NewPCG(11, 12))
	cases := []struct {
		name  string
		build func() *graph.Graph
	}{
		{"K50", func() *graph.Graph { return fixture.Complete(50) }},
		{"K200", func() *graph.Graph { return fixture.Complete(200) }},
		{"grid100x100", func() *graph.Graph { return fixture.Grid(100, 100) }},
		{"grid1000x1000", func() *graph.Graph { return fixture.Grid(1000, 1000) }},
		{"planar1e4", func() *graph.Graph { return fixture.RandomFlippedTriangulation(rng, 10000/3+2, 10000/3).Graph() }},
		{"planar1e5", func() *graph.Graph { return fixture.RandomFlippedTriangulation(rng, 100000/3+2, 100000/3).Graph() }},
		{"planar1e6", func() *graph.Graph { return fixture.RandomFlippedTriangulation(rng, 1000000/3+2, 1000000/3).Graph() }},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			g := benchGraph(b, c.name, c.build)
			opts := Options{Seed: 1, TimeLimit: 10 * time.Second, Candidates: candidates}
			var l *cert.Layout
			for b.Loop() {
				l, _ = Find(g, kind, opts)
			}
			b.ReportMetric(float64(l.Pages()), "pages")
			b.ReportMetric(float64(g.M()), "edges")
			if testing.Verbose() {
				fmt.Printf("%s %s: n=%d m=%d pages=%d\n", kind, c.name, g.N(), g.M(), l.Pages())
			}
		})
	}
}

// BenchmarkStack reports the time and the pages reached (metric "pages")
// with the default spine candidates (8, fewer above 2·10^5 edges) and a
// 10 s limit, as the layout command uses by default:
//
//	go test ./heuristic -run '^$' -bench 'Stack$|Queue$' -benchtime 1x
func BenchmarkStack(b *testing.B) { benchKind(b, cert.Stack, 0) }

// BenchmarkStackOne is BenchmarkStack with a single spine candidate.
func BenchmarkStackOne(b *testing.B) { benchKind(b, cert.Stack, 1) }

// BenchmarkQueue reports the time and the queues reached (metric "pages").
func BenchmarkQueue(b *testing.B) { benchKind(b, cert.Queue, 0) }
