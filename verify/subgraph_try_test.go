package verify

import (
	"context"
	"math/rand/v2"
	"os"
	"strconv"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
)

func TestTrySubgraph(t *testing.T) {
	tv, _ := strconv.Atoi(os.Getenv("TRY_T"))
	if tv == 0 {
		t.Skip()
	}
	g := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(1, 2)), tv, 0).Kleetope()
	cad, err := ByName("cadical", ChildCommand{})
	if err != nil {
		t.Fatal(err)
	}
	for _, start := range []int32{0, 1, 2, 3} {
		for radius := 1; radius <= 4; radius++ {
			// BFS ball
			dist := make([]int, g.N())
			for i := range dist {
				dist[i] = -1
			}
			dist[start] = 0
			q := []int32{start}
			for h := 0; h < len(q); h++ {
				u := q[h]
				if dist[u] == radius {
					continue
				}
				for _, w := range g.Neighbors(u) {
					if dist[w] < 0 {
						dist[w] = dist[u] + 1
						q = append(q, w)
					}
				}
			}
			h, _ := g.Induced(q)
			e, err := dimacs.Encode(h, dimacs.Options{Kind: cert.Stack, Pages: 2})
			if err != nil {
				t.Fatal(err)
			}
			st := time.Now()
			res, err := cad.Solve(context.Background(), e.CNF(), time.Minute, "")
			if err != nil {
				t.Fatal(err)
			}
			t.Logf("start %d radius %d: H n=%d m=%d clauses %d: %v in %v", start, radius, h.N(), h.M(), len(e.CNF().Clauses), res.Answer, time.Since(st).Round(time.Millisecond))
			if res.Answer == Unsat {
				break
			}
		}
	}
}
