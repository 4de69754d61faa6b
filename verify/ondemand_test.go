package verify

import (
	"context"
	"math/rand/v2"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// refineAgrees runs Refine on the claim and checks its answer: a layout
// must pass the direct check, and an unsatisfiable sub-formula must pass
// the membership check and be unsatisfiable for cadical too (Debian's
// cadical, a second opinion that shares nothing with gini). It returns
// whether a layout was found.
func refineAgrees(t *testing.T, g *graph.Graph, o dimacs.Options, cad Solver) bool {
	t.Helper()
	f, err := dimacs.NewOnDemand(g, o)
	if err != nil {
		t.Fatal(err)
	}
	res, err := Refine(context.Background(), f, RefineOptions{Limit: time.Minute})
	if err != nil {
		t.Fatal(err)
	}
	switch {
	case res.Layout != nil:
		if rep := cert.Validate(g, res.Layout); !rep.OK() {
			t.Fatalf("%v: Refine's layout fails the direct check: %v", g.Edges(), rep.Err())
		}
		return true
	case res.Unsat:
		if err := dimacs.CheckMembership(f, res.Sub); err != nil {
			t.Fatalf("%v: Refine's sub-formula fails membership: %v", g.Edges(), err)
		}
		r, err := cad.Solve(context.Background(), res.Sub.CNF, time.Minute, "")
		if err != nil || r.Answer != Unsat {
			t.Fatalf("%v: gini's unsatisfiable sub-formula is %v for cadical (%v)", g.Edges(), r.Answer, err)
		}
		return false
	}
	t.Fatalf("%v: Refine stopped: %s", g.Edges(), res.Stopped)
	return false
}

// TestRefinePublished: bt(K_n) = ceil(n/2) for n >= 4 (Bernhart and
// Kainen, JCTB 27, 1979); the queue number of K_n is floor(n/2) (Heath and
// Rosenberg 1992, from memory); bt(Petersen) = 3 (REFERENCES).
func TestRefinePublished(t *testing.T) {
	cad := cadicalForTest(t)
	for n := 4; n <= 7; n++ {
		g := fixture.Complete(n)
		for _, c := range []struct {
			kind cert.Kind
			bt   int
		}{{cert.Stack, (n + 1) / 2}, {cert.Queue, n / 2}} {
			if !refineAgrees(t, g, dimacs.Options{Kind: c.kind, Pages: c.bt}, cad) {
				t.Fatalf("K%d: no %s layout on %d pages found", n, c.kind, c.bt)
			}
			if refineAgrees(t, g, dimacs.Options{Kind: c.kind, Pages: c.bt - 1}, cad) {
				t.Fatalf("K%d: a %s layout on %d pages found", n, c.kind, c.bt-1)
			}
		}
	}
	p := fixture.Petersen()
	if refineAgrees(t, p, dimacs.Options{Kind: cert.Stack, Pages: 2}, cad) || !refineAgrees(t, p, dimacs.Options{Kind: cert.Stack, Pages: 3}, cad) {
		t.Fatal("Petersen: page number is not 3")
	}
}

// TestRefineRandom compares Refine with the default formulation (itself
// cross-checked against brute force in package dimacs) decided by cadical,
// on random graphs, stack and queue, 1 to 3 pages.
func TestRefineRandom(t *testing.T) {
	cad := cadicalForTest(t)
	r := rand.New(rand.NewPCG(21, 22))
	sizes := 6 // 4 to 9 vertices
	if testing.Short() {
		sizes = 5 // up to 8: the race run (-short) took over a minute on a dense 9-vertex graph
	}
	for trial := 0; trial < 60; trial++ {
		g := fixture.RandomGNP(r, 4+r.IntN(sizes), 0.3+0.6*r.Float64())
		o := dimacs.Options{Kind: []cert.Kind{cert.Stack, cert.Queue}[r.IntN(2)], Pages: 1 + r.IntN(3)}
		e, err := dimacs.Encode(g, o)
		if err != nil {
			t.Fatal(err)
		}
		want, err := cad.Solve(context.Background(), e.CNF(), time.Minute, "")
		if err != nil {
			t.Fatal(err)
		}
		if got := refineAgrees(t, g, o, cad); got != (want.Answer == Sat) {
			t.Fatalf("%v %s %d pages: Refine found a layout: %v; the default formulation is %v", g.Edges(), o.Kind, o.Pages, got, want.Answer)
		}
	}
}

// BenchmarkRefineKleetope measures Refine (gini alone, no second solver or
// proof) on Kleetopes of random stacked triangulations, which need 3 pages
// (REFERENCES: maximal planar and not Hamiltonian), claim 2 pages.
func BenchmarkRefineKleetope(b *testing.B) {
	for _, tv := range []int{20, 40, 70} {
		g := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(1, 2)), tv, 0).Kleetope()
		b.Run(g.String(), func(b *testing.B) {
			for b.Loop() {
				f, err := dimacs.NewOnDemand(g, dimacs.Options{Kind: cert.Stack, Pages: 2})
				if err != nil {
					b.Fatal(err)
				}
				res, err := Refine(context.Background(), f, RefineOptions{Limit: 2 * time.Minute})
				if err != nil || !res.Unsat {
					b.Fatalf("not refuted: %v %+v", err, res)
				}
				b.ReportMetric(float64(len(res.Sub.CNF.Clauses)), "clauses")
				b.ReportMetric(float64(res.Rounds), "rounds")
				b.ReportMetric(float64(f.FullSize()), "full-clauses")
			}
		})
	}
}
