package verify

import (
	"context"
	"fmt"
	"os"
	"time"

	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
)

// ProofCheckOptions controls CheckProofs.
type ProofCheckOptions struct {
	// Enough stops checking once this many proofs have passed (0 = check all).
	Enough int
	// KeepLRAT keeps the LRAT file written beside each proof (PROOF.lrat);
	// otherwise it is removed after the re-check.
	KeepLRAT bool
	Progress func(Event) // may be nil
}

// CheckProofs checks the proof of every UNSAT result that has one, in
// order: spinecert's DRAT checker (proof.CheckDRAT, backward, writing LRAT), then the
// separate LRAT checker (proof.CheckLRAT) on that LRAT output. Results without a
// proof get no entry; the result of a proof check that could not run at
// all carries the reason in Error.
func CheckProofs(ctx context.Context, cnf *dimacs.CNF, results []*Result, opt ProofCheckOptions) []ProofCheck {
	pr := &progress{f: opt.Progress}
	var out []ProofCheck
	passed := 0
	for _, r := range results {
		if r.Answer != Unsat || r.Proof == "" {
			continue
		}
		if opt.Enough > 0 && passed >= opt.Enough {
			out = append(out, ProofCheck{Backend: r.Backend, Format: r.ProofFormat, Skipped: fmt.Sprintf("%d proof(s) already passed", passed)})
			continue
		}
		c := checkOneProof(ctx, cnf, r, opt.KeepLRAT, pr)
		if c.DRAT && c.LRAT {
			passed++
		}
		pr.send(Event{Kind: ProofFinished, Backend: r.Backend, Check: &c, Elapsed: c.Elapsed})
		out = append(out, c)
	}
	return out
}

// checkOneProof runs both checkers on one result's proof, through
// proof.CheckRefutation; the LRAT it writes goes beside the proof.
func checkOneProof(ctx context.Context, cnf *dimacs.CNF, r *Result, keepLRAT bool, pr *progress) (c ProofCheck) {
	start := time.Now()
	c = ProofCheck{Backend: r.Backend, Format: r.ProofFormat}
	defer func() { c.Elapsed = time.Since(start) }()
	f, err := os.Open(r.Proof)
	if err != nil {
		c.Error = err.Error()
		return c
	}
	defer f.Close()
	lratPath := r.Proof + ".lrat"
	if !keepLRAT {
		defer os.Remove(lratPath)
	}
	out := proof.CheckRefutation(ctx, cnf, f, proof.RefutationOptions{
		Format: r.ProofFormat, Name: r.Proof, LRATPath: lratPath,
		Progress: func(p proof.Progress) {
			pr.send(Event{Kind: ProofProgress, Backend: r.Backend, Phase: p.Phase, Done: int64(p.Steps), Total: int64(p.Total), Elapsed: time.Since(start)})
		},
	})
	if out.Format != "" {
		c.Format = out.Format
	}
	c.Lemmas, c.Core = out.Lemmas, out.Core
	c.DRAT, c.LRAT = out.DRAT, out.LRAT
	if !out.OK() {
		c.Error = out.Detail
	}
	return c
}
