package proof

import (
	"bufio"
	"context"
	"errors"
	"fmt"
	"io"
	"os"

	"spinecert.dev/dimacs"
)

// RefutationOptions controls CheckRefutation.
type RefutationOptions struct {
	// Format is DRAT, DRATBinary, RUP or LRAT; "" detects the form of DRAT
	// (LRAT is only taken when named here or found by DetectFormat).
	Format string
	// Name names the proof in messages.
	Name string
	// LRATPath, when not empty, is where the LRAT translation of a DRAT proof
	// is written and kept. Otherwise it goes to a temporary file in TempDir
	// (the system's when empty) that is removed before CheckRefutation returns.
	LRATPath string
	TempDir  string
	// TrimmedPath, when not empty and the proof is DRAT, receives the
	// accepted proof trimmed to the lemmas the backward check used, as
	// binary DRAT (DRATOptions.Trimmed). It is not checked here: a caller
	// that keeps it checks it again with CheckRefutation.
	TrimmedPath string
	// Progress, when not nil, receives the DRAT checker's progress.
	Progress func(Progress)
}

// Outcome is the result of CheckRefutation.
type Outcome struct {
	Format string // the format checked
	// DRAT is set when the DRAT checker accepted the proof, or when the proof
	// is LRAT and so needs no DRAT step.
	DRAT bool
	// LRAT is set when the LRAT checker accepted the LRAT the DRAT checker
	// wrote, or the LRAT proof itself.
	LRAT   bool
	Lemmas int64 // proof lemmas (additions) read
	Core   int64 // lemmas the DRAT checker needed
	// Detail says, for people, why the proof was not accepted.
	Detail string
	// Err is set when the proof could not be read or checked at all, as
	// opposed to being read and found wrong.
	Err error
}

// OK reports whether both checkers accepted the proof.
func (o Outcome) OK() bool { return o.DRAT && o.LRAT && o.Err == nil }

// CheckRefutation checks that the proof read from r refutes cnf, end to end:
// a DRAT proof (text, binary or RUP) goes through CheckDRAT, which checks it
// backward and writes the lemmas it needed as LRAT, and that LRAT is then
// checked by the separate CheckLRAT; an LRAT proof goes to CheckLRAT
// directly. The proof is streamed, not held in memory. Every caller that
// accepts a refutation — solving, bundling, re-verifying — goes through here.
func CheckRefutation(ctx context.Context, cnf *dimacs.CNF, r io.Reader, opt RefutationOptions) Outcome {
	out := Outcome{Format: opt.Format}
	if opt.Format == LRAT {
		out.DRAT = true
		res, err := CheckLRAT(ctx, cnf, r, opt.Name)
		if res != nil {
			out.Lemmas = int64(res.Added)
		}
		return lratOutcome(out, res, err, "the LRAT checker")
	}
	var lf *os.File
	var err error
	if opt.LRATPath != "" {
		lf, err = os.Create(opt.LRATPath)
	} else {
		lf, err = os.CreateTemp(opt.TempDir, "spinecert-lrat-*")
		if err == nil {
			defer os.Remove(lf.Name())
		}
	}
	if err != nil {
		out.Err = fmt.Errorf("proof: %w", err)
		out.Detail = "the LRAT output could not be created: " + err.Error()
		return out
	}
	defer lf.Close()
	lw := bufio.NewWriterSize(lf, 256<<10)
	dopt := DRATOptions{Format: opt.Format, LRAT: lw, Name: opt.Name, Progress: opt.Progress}
	var tf *os.File
	if opt.TrimmedPath != "" {
		tf, err = os.Create(opt.TrimmedPath)
		if err != nil {
			out.Err = fmt.Errorf("proof: %w", err)
			out.Detail = "the trimmed proof could not be created: " + err.Error()
			return out
		}
		defer tf.Close()
		dopt.Trimmed = tf
	}
	res, err := CheckDRAT(ctx, cnf, r, dopt)
	if res != nil {
		out.Format = res.Format
		out.Lemmas, out.Core = int64(res.Lemmas), int64(res.CoreLemmas)
	}
	switch {
	case err != nil && errors.Is(err, ErrRejected):
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
	if tf != nil {
		if err := tf.Close(); err != nil {
			out.Err = fmt.Errorf("proof: writing the trimmed proof: %w", err)
			out.Detail = "the trimmed proof could not be written: " + err.Error()
			return out
		}
	}
	if err := lw.Flush(); err != nil {
		out.Err = fmt.Errorf("proof: writing lrat: %w", err)
		out.Detail = "the LRAT output could not be written: " + err.Error()
		return out
	}
	if _, err := lf.Seek(0, io.SeekStart); err != nil {
		out.Err = fmt.Errorf("proof: %w", err)
		out.Detail = "the LRAT output could not be read back: " + err.Error()
		return out
	}
	lres, err := CheckLRAT(ctx, cnf, bufio.NewReaderSize(lf, 256<<10), opt.Name+" (as LRAT)")
	return lratOutcome(out, lres, err, "the LRAT re-check")
}

func lratOutcome(out Outcome, res *LRATResult, err error, who string) Outcome {
	switch {
	case err != nil && errors.Is(err, ErrRejected):
		out.Detail = who + " rejected the proof: " + err.Error()
	case err != nil:
		out.Err = err
		out.Detail = "the LRAT proof could not be read: " + err.Error()
	case res == nil || !res.Accepted:
		out.Detail = who + " did not accept the proof"
	default:
		out.LRAT = true
	}
	return out
}
