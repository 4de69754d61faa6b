package heuristic

import (
	"math/rand/v2"
	"testing"
	"time"
)

func TestDebugStages(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for _, n := range []int{200, 1000, 3000} {
		g := randomPlanar(t, rng, n, n)
		sp := newSpines(g, 1, 1)
		for i := 0; i < 4; i++ {
			order := sp.candidate(i)
			// count DFS breaks: consecutive spine vertices not adjacent
			breaks := 0
			for j := 1; j < len(order); j++ {
				if !g.HasEdge(order[j-1], order[j]) {
					breaks++
				}
			}
			ls, rs := spans(g, order)
			_, k1 := sweepStack(ls, rs, n)
			_, k2 := firstFit(ls, rs, n, byLength(ls, rs, n), 1000)
			t0 := time.Now()
			_, k3 := stackPages(g, order, time.Time{}, sp.rng, 0)
			t.Logf("n=%d cand %d breaks=%d sweep=%d length=%d final=%d (%v)", n, i, breaks, k1, k2, k3, time.Since(t0))
		}
	}
}
