package pagenumber

import (
	"context"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/fixture/backends"
)

// tree is a complete binary tree on n vertices.
func tree(t testing.TB, n int) *graph.Graph {
	var es [][2]int
	for v := 1; v < n; v++ {
		es = append(es, [2]int{(v - 1) / 2, v})
	}
	return fixture.MustNumbered(t, n, es)
}

func pageNumberOK(t *testing.T, g *graph.Graph, kind cert.Kind, unsatLower bool) *Result {
	t.Helper()
	res, err := Compute(context.Background(), g, Options{Kind: kind, Solvers: backends.InProcess(t), Limit: 2 * time.Minute, UnsatLower: unsatLower})
	if err != nil {
		t.Fatalf("%v (result %+v)", err, res)
	}
	if rep := cert.Validate(g, res.Layout); !rep.OK() || res.Layout.Pages() != res.Upper.Pages {
		t.Fatalf("layout behind the upper bound: %v, %d pages for bound %d", rep.Err(), res.Layout.Pages(), res.Upper.Pages)
	}
	return res
}

// TestPageNumberKnown checks spinecert's page numbers against published values
// (see /work/shared/REFERENCES.md for the sources):
// K_n: ⌈n/2⌉ for n ≥ 4 (Bernhart & Kainen, JCTB 27, 1979); K_{3,3}, K_{4,4}: 3;
// Petersen: 3; Q3: 2, Q4: 3; grids: 2; trees and cycles: 1 (outerplanar,
// Bernhart & Kainen 1979); Goldner–Harary: 3 (maximal planar, not Hamiltonian).
func TestPageNumberKnown(t *testing.T) {
	tests := []struct {
		name string
		g    *graph.Graph
		want int
	}{
		{"K1", fixture.Complete(1), 0},
		{"K2", fixture.Complete(2), 1},
		{"K3", fixture.Complete(3), 1},
		{"K4", fixture.Complete(4), 2},
		{"K5", fixture.Complete(5), 3},
		{"K6", fixture.Complete(6), 3},
		{"K7", fixture.Complete(7), 4},
		{"K8", fixture.Complete(8), 4},
		{"K9", fixture.Complete(9), 5},
		{"K3,3", fixture.CompleteBipartite(3, 3), 3},
		{"K4,4", fixture.CompleteBipartite(4, 4), 3},
		{"Petersen", fixture.Petersen(), 3},
		{"Q3", fixture.Hypercube(3), 2},
		{"Q4", fixture.Hypercube(4), 3},
		{"grid 3x3", fixture.Grid(3, 3), 2},
		{"grid 4x5", fixture.Grid(4, 5), 2},
		{"tree", tree(t, 15), 1},
		{"cycle", cycle(t, 9), 1},
		{"Goldner-Harary", fixture.GoldnerHarary(), 3},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res := pageNumberOK(t, tt.g, cert.Stack, false)
			if res.PageNumber != tt.want || res.Lower.Pages != tt.want {
				t.Fatalf("page number %d (lower %+v, upper %+v), want %d", res.PageNumber, res.Lower, res.Upper, tt.want)
			}
			t.Logf("lower by %s, upper by %s, %d SAT steps", res.Lower.Source, res.Upper.Source, len(res.Steps))
		})
	}
}

// TestPageNumberUnsatLower proves lower bounds by checked UNSAT steps
// instead of counting arguments, for values from Bernhart & Kainen 1979.
func TestPageNumberUnsatLower(t *testing.T) {
	tests := []struct {
		name string
		g    *graph.Graph
		want int
	}{
		{"K5", fixture.Complete(5), 3},
		{"K6", fixture.Complete(6), 3},
		{"K3,3", fixture.CompleteBipartite(3, 3), 3},
		{"Q3", fixture.Hypercube(3), 2},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res := pageNumberOK(t, tt.g, cert.Stack, true)
			if res.PageNumber != tt.want || res.Lower.Source != SourceUnsat {
				t.Fatalf("page number %d lower %+v, want %d by unsat", res.PageNumber, res.Lower, tt.want)
			}
		})
	}
}

// TestQueueNumberKnown: the queue number of K_n is ⌊n/2⌋ (Heath and
// Rosenberg, "Laying out graphs using queues", SIAM J. Comput. 21, 1992;
// from memory) and that of a tree is 1 (Heath, Leighton, Rosenberg 1992).
func TestQueueNumberKnown(t *testing.T) {
	tests := []struct {
		name string
		g    *graph.Graph
		want int
	}{
		{"K4", fixture.Complete(4), 2},
		{"K5", fixture.Complete(5), 2},
		{"K6", fixture.Complete(6), 3},
		{"K7", fixture.Complete(7), 3},
		{"tree", tree(t, 15), 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res := pageNumberOK(t, tt.g, cert.Queue, false)
			if res.PageNumber != tt.want {
				t.Fatalf("queue number %d (lower %+v, upper %+v), want %d", res.PageNumber, res.Lower, res.Upper, tt.want)
			}
		})
	}
}

// TestPageNumberK9Unsat proves bt(K_9) > 4 by a checked UNSAT step
// (Bernhart & Kainen 1979: bt(K_9) = 5) with the in-process backends; the
// encoder's twin rule makes this a fraction of a second.
func TestPageNumberK9Unsat(t *testing.T) {
	res := pageNumberOK(t, fixture.Complete(9), cert.Stack, true)
	if res.PageNumber != 5 || res.Lower.Source != SourceUnsat {
		t.Fatalf("%+v", res)
	}
}
