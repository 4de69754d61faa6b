package verify

import (
	"bufio"
	"context"
	"fmt"
	"os"
	"time"

	"spinecert.dev/dimacs"
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
// order: spinecert's DRAT checker (CheckDRAT, backward, writing LRAT), then the
// separate LRAT checker (CheckLRAT) on that LRAT output. Results without a
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

// checkOneProof runs both checkers on one result's proof.
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
	lf, err := os.Create(lratPath)
	if err != nil {
		c.Error = err.Error()
		return c
	}
	if !keepLRAT {
		defer os.Remove(lratPath)
	}
	lw := bufio.NewWriterSize(lf, 256<<10)
	res, err := CheckDRAT(ctx, cnf, f, DRATOptions{
		Format: r.ProofFormat,
		LRAT:   lw,
		Name:   r.Proof,
		Progress: func(p DRATProgress) {
			pr.send(Event{Kind: ProofProgress, Backend: r.Backend, Phase: p.Phase, Done: int64(p.Steps), Total: int64(p.Total), Elapsed: time.Since(start)})
		},
	})
	ferr := lw.Flush()
	if cerr := lf.Close(); ferr == nil {
		ferr = cerr
	}
	if res != nil {
		c.Format = res.Format
		c.Lemmas, c.Core = int64(res.Lemmas), int64(res.CoreLemmas)
	}
	if err != nil {
		c.Error = "DRAT check: " + err.Error()
		return c
	}
	if res == nil || !res.Accepted {
		c.Error = "DRAT check did not accept the proof"
		return c
	}
	c.DRAT = true
	if ferr != nil {
		c.Error = "writing LRAT: " + ferr.Error()
		return c
	}
	lin, err := os.Open(lratPath)
	if err != nil {
		c.Error = err.Error()
		return c
	}
	defer lin.Close()
	lres, err := CheckLRAT(ctx, cnf, lin, lratPath)
	if err != nil {
		c.Error = "LRAT re-check: " + err.Error()
		return c
	}
	if lres == nil || !lres.Accepted {
		c.Error = "LRAT re-check did not accept the proof"
		return c
	}
	c.LRAT = true
	return c
}
