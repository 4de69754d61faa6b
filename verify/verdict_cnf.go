package verify

import (
	"context"
	"time"

	"spinecert.dev/dimacs"
)

// DecideCNF decides one formula under the policy, as DecideLayout does
// once the claim is encoded: the solvers run on cnf, the proofs the policy
// needs are checked, and Decide draws the verdict. Only Solvers, Limit,
// ProofDir, Policy, StopOnModel, AllProofs and Progress of opt are used; a
// Satisfiable verdict carries the checked model, which the caller decodes.
// Package cubejob decides each cube this way (cnf ∧ cube).
func DecideCNF(ctx context.Context, cnf *dimacs.CNF, opt GraphOptions) (*GraphVerdict, error) {
	start := time.Now()
	gv := &GraphVerdict{CNF: cnf, Vars: cnf.Vars, Clauses: len(cnf.Clauses)}
	err := gv.runPolicy(ctx, cnf, opt)
	gv.Elapsed = time.Since(start)
	return gv, err
}
