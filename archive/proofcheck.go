package archive

import (
	"bufio"
	"context"
	"errors"
	"fmt"
	"io"
	"os"

	"spinecert.dev/dimacs"
	"spinecert.dev/verify"
)

// Checker names recorded in manifests for spinecert's own checkers.
const (
	CheckerDRAT = "spinecert drat + lrat re-check"
	CheckerLRAT = "spinecert lrat"
)

// ProofOutcome is the result of checking one proof.
type ProofOutcome struct {
	DRAT   bool   // spinecert's DRAT checker accepted the proof (or the format is LRAT)
	LRAT   bool   // the LRAT it produced (or the LRAT proof itself) passed the LRAT checker
	Format string // the format checked
	Lemmas uint64
	Detail string // why it failed, for people
	// Err is set when the proof could not be read or checked at all
	// (as opposed to being read and found wrong).
	Err error
}

// OK reports whether both checks passed.
func (o ProofOutcome) OK() bool { return o.DRAT && o.LRAT && o.Err == nil }

// CheckProof checks that proof (format drat, drat-binary or lrat) refutes
// cnf. A DRAT proof is checked by verify.CheckDRAT, which writes LRAT to a
// temporary file in tmpDir; that LRAT is then re-checked by the separate
// verify.CheckLRAT. The proof is streamed, not held in memory.
func CheckProof(ctx context.Context, cnf *dimacs.CNF, proof io.Reader, name, format, tmpDir string) ProofOutcome {
	out := ProofOutcome{Format: format}
	if format == "lrat" {
		res, err := verify.CheckLRAT(ctx, cnf, proof, name)
		return lratOutcome(out, res, err, true)
	}
	lf, err := os.CreateTemp(tmpDir, "spinecert-lrat-*")
	if err != nil {
		out.Err = fmt.Errorf("archive: %w", err)
		return out
	}
	defer os.Remove(lf.Name())
	defer lf.Close()
	lw := bufio.NewWriterSize(lf, 256<<10)
	res, err := verify.CheckDRAT(ctx, cnf, proof, verify.DRATOptions{Format: format, LRAT: lw, Name: name})
	if res != nil {
		out.Lemmas = res.Lemmas
	}
	switch {
	case err != nil && errors.Is(err, verify.ErrProofRejected):
		out.Detail = "spinecert's DRAT checker rejected the proof: " + err.Error()
		return out
	case err != nil:
		out.Err = err
		out.Detail = "the proof could not be read: " + err.Error()
		return out
	case res == nil || !res.Accepted:
		out.Detail = "spinecert's DRAT checker did not accept the proof"
		return out
	}
	out.DRAT = true
	if err := lw.Flush(); err != nil {
		out.Err = fmt.Errorf("archive: writing lrat: %w", err)
		return out
	}
	if _, err := lf.Seek(0, io.SeekStart); err != nil {
		out.Err = fmt.Errorf("archive: %w", err)
		return out
	}
	lres, err := verify.CheckLRAT(ctx, cnf, bufio.NewReaderSize(lf, 256<<10), name+" (as LRAT)")
	return lratOutcome(out, lres, err, false)
}

func lratOutcome(out ProofOutcome, res *verify.LRATResult, err error, direct bool) ProofOutcome {
	if direct {
		out.DRAT = true
	}
	switch {
	case err != nil && errors.Is(err, verify.ErrProofRejected):
		out.Detail = "the LRAT checker rejected the proof: " + err.Error()
	case err != nil:
		out.Err = err
		out.Detail = "the LRAT proof could not be read: " + err.Error()
	case res == nil || !res.Accepted:
		out.Detail = "the LRAT checker did not accept the proof"
	default:
		out.LRAT = true
	}
	return out
}
