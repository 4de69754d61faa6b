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

func TestTryRefine(t *testing.T) {
	tv, _ := strconv.Atoi(os.Getenv("TRY_T"))
	if tv == 0 {
		t.Skip()
	}
	g := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(1, 2)), tv, 0).Kleetope()
	f, err := dimacs.NewOnDemand(g, dimacs.Options{Kind: cert.Stack, Pages: 2})
	if err != nil {
		t.Fatal(err)
	}
	res, err := Refine(context.Background(), f, RefineOptions{Limit: 90 * time.Second, Progress: func(r RefineRound) {
		if r.Round%10 == 0 || r.Round < 10 {
			t.Logf("round %d: %d clauses %d vars +%d triples +%d conflicts %v", r.Round, r.Clauses, r.Vars, r.Triples, r.Conflicts, r.Elapsed.Round(time.Millisecond))
		}
	}})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("n=%d m=%d: rounds %d unsat %v layout %v stopped %q clauses %d vars %d in %v; full F %d", g.N(), g.M(), res.Rounds, res.Unsat, res.Layout != nil, res.Stopped, len(res.Sub.CNF.Clauses), len(res.Sub.Vars), res.Elapsed, 0)
}
