package verify

import (
	"context"
	"time"

	"github.com/go-air/gini"
	"github.com/go-air/gini/z"

	"spinecert.dev/dimacs"
)

// giniVersion is the gini release spinecert is built against (see go.mod).
const giniVersion = "v1.0.4"

// Gini is the in-process gini solver (github.com/go-air/gini). It writes
// no proofs. It runs in a goroutine that is stopped through gini's own
// asynchronous interface when the limit or the context ends.
type Gini struct{}

// Name returns "gini".
func (Gini) Name() string { return "gini" }

// pollEvery is how often a running in-process solve looks at its context.
const pollEvery = 20 * time.Millisecond

// Solve decides cnf with gini; proofPath is ignored.
func (g Gini) Solve(ctx context.Context, cnf *dimacs.CNF, limit time.Duration, proofPath string) (*Result, error) {
	start := time.Now()
	res := &Result{Backend: g.Name(), Version: giniVersion}
	s := gini.NewVc(cnf.Vars, len(cnf.Clauses))
	for _, cl := range cnf.Clauses {
		for _, l := range cl {
			s.Add(z.Dimacs2Lit(int(l)))
		}
		s.Add(z.LitNull)
	}
	// Make every declared variable known to gini, used or not, so that the
	// model covers them all.
	for s.MaxVar() < z.Var(cnf.Vars) {
		s.Lit()
	}
	rctx, cancel := withLimit(ctx, limit)
	defer cancel()
	run := s.GoSolve()
	tick := time.NewTicker(pollEvery)
	defer tick.Stop()
	var out int
	for done := false; !done; {
		select {
		case <-rctx.Done():
			out = run.Stop()
			if out == 0 {
				res.Detail = stopReason(rctx, limit)
			}
			done = true
		case <-tick.C:
			out, done = run.Test()
		}
	}
	res.Elapsed = time.Since(start)
	switch out {
	case 1:
		res.Answer = Sat
		res.Model = make([]bool, cnf.Vars)
		for v := 1; v <= cnf.Vars; v++ {
			res.Model[v-1] = s.Value(z.Var(v).Pos())
		}
	case -1:
		res.Answer = Unsat
	}
	return settle(cnf, res), nil
}
