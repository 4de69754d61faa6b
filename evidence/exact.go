package evidence

import (
	"context"
	"errors"
	"fmt"
	"path/filepath"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/pagenumber"
	"spinecert.dev/verify"
)

// findExact finds the page number K of r.Graph (r.Claim.Kind stack or queue)
// with pagenumber.Compute, its lower bound made by a checked refutation
// (UnsatLower) rather than by a theorem, and fills ev with the claim exact K,
// the layout on K pages and the refutation of K-1 pages. Compute walks down
// from a checked layout one page at a time while the solvers find layouts,
// so its last step is the refutation of one page fewer than the layout.
func findExact(ctx context.Context, r *Request, kind cert.Kind, tmpDir string, ev *archive.Evidence) error {
	if kind != cert.Stack && kind != cert.Queue {
		return fmt.Errorf("evidence: the page number of kind %s: expected stack or queue", kind)
	}
	res, err := pagenumber.Compute(ctx, r.Graph, pagenumber.Options{Kind: kind, Solvers: r.Solvers, Limit: r.Limit,
		ProofDir: filepath.Join(tmpDir, "exact"), UnsatLower: true, Obstruction: r.Obstruction, OnDemand: r.OnDemand})
	if errors.Is(err, pagenumber.ErrUndecided) {
		return fmt.Errorf("%w: %w", ErrUndecided, err)
	}
	if err != nil {
		return fmt.Errorf("evidence: %w", err)
	}
	k := res.PageNumber
	if k < 2 {
		return fmt.Errorf("%w: the page number is %d (a %d-page layout passed the direct check); an exact claim needs at least 2, claim --at-most %d instead", ErrExactTooSmall, k, k, max(k, 1))
	}
	if len(res.Steps) == 0 {
		return fmt.Errorf("evidence: internal error: page number %d found without a refutation", k)
	}
	last := res.Steps[len(res.Steps)-1]
	if last.Pages != k-1 || last.Outcome != verify.Unsatisfiable {
		return fmt.Errorf("evidence: internal error: page number %d found, but the last step was %d pages, %s", k, last.Pages, last.Outcome)
	}
	ev.K = k
	ev.Layout = res.Layout
	ref := &archive.RefutationInput{Options: dimacs.Options{Kind: kind, Pages: k - 1}}
	if err := fromVerdict(ref, last.Verdict); err != nil {
		return err
	}
	ev.Refutation = ref
	return nil
}
