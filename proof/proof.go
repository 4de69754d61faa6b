package proof

import (
	"context"
	"errors"
	"fmt"
	"io"

	"spinecert.dev/dimacs"
)

// Progress reports how far a proof check has come.
type Progress struct {
	Phase   string // "reading" (forward pass) or "checking" (backward pass)
	Steps   uint64 // steps of the proof passed in this phase
	Total   uint64 // steps this phase will pass, 0 when not known yet
	Checked uint64 // lemmas checked so far
}

// DRATOptions configures CheckDRAT.
type DRATOptions struct {
	// Format is DRAT, DRATBinary or RUP; empty means detect
	// it (see DetectFormat). RUP is DRAT text without deletions,
	// whose lemmas must all be RUP.
	Format string
	// Forward checks every lemma in proof order instead of checking
	// backward from the empty clause only the lemmas it needs. It keeps no
	// record of the steps and frees deleted clauses, for proofs too large to
	// hold.
	Forward bool
	// LRAT, when non-nil, receives the checked proof in LRAT text.
	LRAT io.Writer
	// Trimmed, when non-nil, receives the accepted proof trimmed to what
	// the backward check used, as binary DRAT (see the package doc). It
	// needs backward mode.
	Trimmed io.Writer
	// Progress, when non-nil, is called from time to time.
	Progress func(Progress)
	// Name is the proof's name in messages.
	Name string
}

// DRATResult is the outcome of CheckDRAT.
type DRATResult struct {
	Accepted bool   `json:"accepted"`
	Format   string `json:"format"`
	Detected bool   `json:"format_detected"`
	Mode     string `json:"mode"` // "backward" or "forward"
	Steps    uint64 `json:"steps"`
	// Lemmas counts additions, Deletions deletions.
	Lemmas    uint64 `json:"lemmas"`
	Deletions uint64 `json:"deletions"`
	// CoreLemmas counts the lemmas checked: those needed for the empty
	// clause (backward) or all lemmas up to the refutation (forward).
	CoreLemmas uint64 `json:"checked_lemmas"`
	// RAT counts lemmas that were not RUP and were checked as RAT.
	RAT uint64 `json:"rat_lemmas"`
	// IgnoredDeletions counts deletions of clauses that were the reason of
	// a unit at the time; they are ignored. MissingDeletions counts
	// deletions naming no current clause; they are ignored too.
	IgnoredDeletions uint64 `json:"ignored_unit_deletions"`
	MissingDeletions uint64 `json:"missing_deletions"`
	Propagations     uint64 `json:"propagations"`
	// FailedLemma is the 1-based step number (additions and deletions
	// counted) of the first lemma in proof order that failed, 0 when the
	// proof failed as a whole (no empty clause) or was accepted. Backward
	// checking checks only the lemmas the refutation needs and goes on past
	// a failure; FailedLemmas counts the failures (forward checking stops at
	// the first). FailedPos is its line (text)
	// or byte offset (binary), FailedText its literals.
	FailedLemma  int64  `json:"failed_step,omitempty"`
	FailedLemmas uint64 `json:"failed_lemmas,omitempty"`
	FailedPos    string `json:"failed_at,omitempty"`
	FailedText   string `json:"failed_text,omitempty"`
	Reason       string `json:"reason,omitempty"`
}

// CheckDRAT checks that proof (DRAT text or binary, plain, gzip or zstd)
// refutes cnf. A rejected proof returns the result and an error wrapping
// ErrRejected; a proof that cannot be read returns an error wrapping a
// *textpos.Error or the I/O error.
func CheckDRAT(ctx context.Context, cnf *dimacs.CNF, proof io.Reader, opt DRATOptions) (*DRATResult, error) {
	name := opt.Name
	if name == "" {
		name = "proof"
	}
	dr, err := dimacs.Decompress(proof)
	if err != nil {
		return nil, fmt.Errorf("proof: %s: %w", name, err)
	}
	defer dr.Close()
	if opt.Trimmed != nil && opt.Forward {
		return nil, fmt.Errorf("proof: %s: a trimmed proof needs the backward check", name)
	}
	pr, detected, err := newProofReader(dr, name, opt.Format)
	if err != nil {
		return nil, err
	}
	opt.Format = pr.format
	res := &DRATResult{Format: pr.format, Detected: detected, Mode: "backward"}
	if opt.Forward {
		res.Mode = "forward"
	}
	// variables are kept in place up to a bound set by the size of the
	// formula, whatever its header says
	dense := min(cnf.Vars, 2*cnf.Literals()+1<<16)
	k := &dratChecker{dratDB: newDratDB(dense, len(cnf.Clauses), cnf.Literals()), opt: opt, res: res, pr: pr, ctx: ctx}
	if _, err := k.loadFormula(cnf.Clauses); err != nil {
		return nil, err
	}
	if opt.LRAT != nil {
		k.lrat = newLRATLog(opt.LRAT, opt.Forward, k.nOrig)
	}
	k.noteUsed = opt.Trimmed != nil
	defer func() { res.Propagations = k.propagations }()
	conflictStep, err := k.readSteps(opt.Forward)
	if err != nil {
		if errors.Is(err, ErrRejected) {
			return res, err
		}
		return nil, err
	}
	if opt.Forward {
		if k.lrat != nil {
			k.lrat.final = k.analyze(k.conflict, nil, true)
			if err := k.lrat.finish(sameID); err != nil {
				return nil, err
			}
		}
		res.Accepted = true
		return res, nil
	}
	if err := k.backward(conflictStep); err != nil {
		if errors.Is(err, ErrRejected) {
			return res, err
		}
		return nil, err
	}
	if k.lrat != nil {
		if err := k.lrat.writeBackward(k, conflictStep); err != nil {
			return nil, err
		}
	}
	if opt.Trimmed != nil {
		if err := k.writeTrimmed(opt.Trimmed, max(conflictStep, 0)); err != nil {
			return nil, err
		}
	}
	res.Accepted = true
	return res, nil
}

// WriteLRAT checks proof like CheckDRAT and writes the checked proof to w
// in LRAT text. Nothing useful is in w unless the error is nil.
func WriteLRAT(ctx context.Context, cnf *dimacs.CNF, proof io.Reader, w io.Writer, opt DRATOptions) (*DRATResult, error) {
	opt.LRAT = w
	return CheckDRAT(ctx, cnf, proof, opt)
}
