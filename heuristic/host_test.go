package heuristic

import (
	"errors"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// subgraphOf keeps each edge of h with probability keep and drops the
// vertices that lose all their edges (labels kept).
func subgraphOf(t *testing.T, rng *rand.Rand, h *graph.Graph, keep float64) *graph.Graph {
	t.Helper()
	b := graph.NewBuilder()
	for _, e := range h.Edges() {
		if rng.Float64() < keep {
			if err := b.AddEdge(b.Vertex(h.Label(e.U)), b.Vertex(h.Label(e.V))); err != nil {
				t.Fatal(err)
			}
		}
	}
	g, _ := b.Build()
	return g
}

// Subgraphs of random planar 3-trees get at most 3 pages through their
// host (Heath, FOCS 1984: planar 3-trees have book thickness at most 3;
// REFERENCES; a layout restricts to every subgraph: common practice, no
// source), checked directly, and within the bound the report names.
// Subgraphs of the icosahedron (a 4-connected
// triangulation, 2 pages: Whitney 1931, Bernhart and Kainen 1979) get 2.
func TestFindReportHost(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	type hostCase struct {
		host  *graph.Graph
		bound int
	}
	cases := []hostCase{{fixture.Icosahedron(), 2}}
	for _, n := range []int{8, 50, 400, 3000} {
		cases = append(cases, hostCase{fixture.RandomStackedTriangulation(rng, n).Graph(), 3})
	}
	for _, c := range cases {
		for _, keep := range []float64{1, 0.8, 0.5} {
			g := subgraphOf(t, rng, c.host, keep)
			l, rep, err := FindReportHost(g, c.host, cert.Stack, Options{Seed: 1})
			if err != nil {
				t.Fatalf("host n=%d keep=%v: %v", c.host.N(), keep, err)
			}
			if vr := cert.Validate(g, l); !vr.OK() {
				t.Fatalf("host n=%d keep=%v: layout rejected: %v", c.host.N(), keep, vr.Err())
			}
			// On small hosts the sweep may beat the construction (then
			// the report names no bound); the class bound holds either way.
			if !rep.OnHost || rep.Bound > c.bound || l.Pages() > c.bound || rep.Bound > 0 && l.Pages() > rep.Bound || rep.Bound == 0 && rep.Method != MethodSweep {
				t.Errorf("host n=%d keep=%v: %d pages by %s (bound %d, on host %v), want at most %d", c.host.N(), keep, l.Pages(), rep.Method, rep.Bound, rep.OnHost, c.bound)
			}
			if l.Pages() != l.UsedPages() {
				t.Errorf("host n=%d keep=%v: %d pages of which %d used: empty pages kept", c.host.N(), keep, l.Pages(), l.UsedPages())
			}
		}
	}
}

// A graph with a vertex or an edge the host lacks is refused, naming it.
func TestFindReportHostNotSubgraph(t *testing.T) {
	host := fixture.GoldnerHarary()
	extraEdge := fixture.EdgePairs(host)
	for a := 0; a < host.N(); a++ {
		for c := a + 1; c < host.N(); c++ {
			if !host.HasEdge(int32(a), int32(c)) {
				extraEdge = append(extraEdge, [2]int{a, c})
				a, c = host.N(), host.N()
			}
		}
	}
	extraVertex := append(fixture.EdgePairs(host), [2]int{0, host.N()})
	for name, g := range map[string]*graph.Graph{
		"edge":   fixture.Numbered(host.N(), extraEdge),
		"vertex": fixture.Numbered(host.N()+1, extraVertex),
	} {
		_, _, err := FindReportHost(g, host, cert.Stack, Options{Seed: 1})
		if !errors.Is(err, ErrNotSubgraph) {
			t.Errorf("extra %s: error %v, want ErrNotSubgraph", name, err)
		}
		if name == "vertex" && err != nil && !strings.Contains(err.Error(), strconv.Quote(strconv.Itoa(host.N()))) {
			t.Errorf("extra vertex: %v does not name vertex %d", err, host.N())
		}
	}
}
