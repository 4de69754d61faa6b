package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
)

type proofOptions struct {
	format  string
	forward bool
	lrat    string
	json    bool
	quiet   bool
	cnf     string
	proof   string
}

func newProofCmd() *cobra.Command {
	o := &proofOptions{}
	cmd := &cobra.Command{
		Use:   "proof CNF PROOF",
		Short: "Check a DRAT or LRAT refutation of a CNF formula with spinecert's own checkers",
		Long: `proof checks that PROOF refutes the DIMACS CNF formula CNF.

PROOF is DRAT (text or binary) or LRAT (text), plain, gzip or zstd. With
--format auto (the default) the format is detected from the first bytes: binary
DRAT when one of the first 1024 bytes is neither printable ASCII nor white
space; LRAT when the first line that is not a comment starts with a step
number followed by "d", or by a clause and its hints each ended by 0; text
DRAT otherwise. --format names it instead: drat, drat-binary, rup (text
lemmas without deletions, all RUP) or lrat.

A DRAT proof is checked by spinecert's DRAT checker. Lemmas may be RUP or RAT on
their first literal. By default the proof is checked backward from the empty
clause, so only the lemmas the refutation needs are checked; --forward checks
every lemma in order and holds less in memory. Deletions of clauses that are
the reason of a unit at the time are ignored. A proof must add the empty
clause. On rejection the first failing step (1-based, deletions counted) is
named with its text and the reason.

--lrat FILE writes the checked DRAT proof as LRAT; it is written only when the
proof is accepted. An LRAT proof is checked by a second, separate and much
smaller checker.

Progress goes to stderr when it is a terminal (not with --quiet).`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.cnf, o.proof = args[0], args[1]
			return runProof(cmd, o)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.format, "format", proofAuto, "proof format: auto, drat, drat-binary, rup or lrat")
	fl.BoolVar(&o.forward, "forward", false, "check every lemma in proof order instead of backward from the empty clause")
	fl.StringVar(&o.lrat, "lrat", "", "write the checked proof as LRAT to `FILE`")
	fl.BoolVar(&o.json, "json", false, "print the result as one JSON object")
	fl.BoolVar(&o.quiet, "quiet", false, "no progress display on stderr")
	return cmd
}

// proofReport is the JSON output of spinecert proof.
type proofReport struct {
	CNF    string            `json:"cnf"`
	Proof  string            `json:"proof"`
	Kind   string            `json:"checker"` // "drat" or "lrat"
	Format string            `json:"format"`
	Auto   bool              `json:"format_detected"`
	LRAT   string            `json:"lrat_written,omitempty"`
	Result *proof.DRATResult `json:"drat,omitempty"`
	Check  *proof.LRATResult `json:"lrat,omitempty"`
	Error  string            `json:"error,omitempty"`
}

func runProof(cmd *cobra.Command, o *proofOptions) error {
	format, detected, err := proofFormat(o)
	if err != nil {
		return err
	}
	ctx := cmd.Context()
	if ctx == nil {
		ctx = context.Background()
	}
	cnf, err := dimacs.ReadCNFFile(o.cnf, dimacs.ReadOptions{})
	if err != nil {
		return usageErr(err)
	}
	f, err := os.Open(o.proof)
	if err != nil {
		return usageErr(err)
	}
	defer f.Close()
	rep := &proofReport{CNF: o.cnf, Proof: o.proof, Kind: "drat", Format: format, Auto: detected}
	var checkErr error
	if format == proofLRAT {
		rep.Kind = "lrat"
		rep.Check, checkErr = proof.CheckLRAT(ctx, cnf, f, o.proof)
	} else {
		bar := newProofBar(cmd.ErrOrStderr(), o.quiet)
		opt := proof.DRATOptions{Format: format, Forward: o.forward, Name: o.proof, Progress: bar.update}
		if o.lrat == "" {
			rep.Result, checkErr = proof.CheckDRAT(ctx, cnf, f, opt)
		} else {
			werr := writeFileAtomic(o.lrat, cmd.OutOrStdout(), func(w io.Writer) error {
				opt.LRAT = w
				rep.Result, checkErr = proof.CheckDRAT(ctx, cnf, f, opt)
				return checkErr
			})
			if checkErr == nil && werr != nil {
				return werr
			}
			if checkErr == nil {
				rep.LRAT = o.lrat
			}
		}
		bar.finish()
		if r := rep.Result; r != nil {
			rep.Format, rep.Auto = r.Format, r.Detected
		}
	}
	if err := interruption(ctx); err != nil {
		return err
	}
	rejected := errors.Is(checkErr, proof.ErrRejected)
	hint := ""
	if checkErr != nil && format != proofLRAT && !detected {
		if lrat, _ := looksLikeLRAT(o.proof); lrat {
			hint = fmt.Sprintf("%s looks like LRAT, not %s: check it with --format lrat or --format auto", o.proof, format)
		}
	}
	if checkErr != nil && !rejected {
		if hint != "" {
			return usageErr(fmt.Errorf("%w; %s", checkErr, hint))
		}
		return usageErr(checkErr)
	}
	if rejected {
		rep.Error = checkErr.Error()
		if hint != "" {
			rep.Error += "; " + hint
			fmt.Fprintf(cmd.ErrOrStderr(), "spinecert: note: %s\n", hint)
		}
	}
	out := cmd.OutOrStdout()
	if o.json {
		if err := writeJSON(out, rep); err != nil {
			return err
		}
	} else {
		printProofReport(out, rep)
	}
	if rejected {
		return refuted(checkErr)
	}
	return nil
}

func printProofReport(w io.Writer, rep *proofReport) {
	if rep.Check != nil {
		c := rep.Check
		fmt.Fprintf(w, "format: %s (%s)\n", rep.Format, map[bool]string{true: "detected", false: "forced"}[rep.Auto])
		if c.Accepted {
			fmt.Fprintf(w, "LRAT proof accepted: %s refutes %s (%d lemmas checked, %d RAT, %d deletions)\n", rep.Proof, rep.CNF, c.Added, c.RAT, c.Deleted)
		} else {
			fmt.Fprintf(w, "LRAT proof rejected at line %d: %s\n", c.FailedLine, c.Reason)
		}
		return
	}
	r := rep.Result
	how := "forced"
	if r.Detected {
		how = "detected"
	}
	fmt.Fprintf(w, "format: %s (%s)\n", r.Format, how)
	if !r.Accepted {
		if r.FailedLemma > 0 {
			fmt.Fprintf(w, "DRAT proof rejected: step %d (%s) %q: %s\n", r.FailedLemma, r.FailedPos, r.FailedText, r.Reason)
		} else {
			fmt.Fprintf(w, "DRAT proof rejected: %s\n", r.Reason)
		}
		return
	}
	fmt.Fprintf(w, "DRAT proof accepted: %s refutes %s (%s check: %d of %d lemmas checked, %d RAT; %d deletions, %d of them of unit reasons ignored)\n",
		rep.Proof, rep.CNF, r.Mode, r.CoreLemmas, r.Lemmas, r.RAT, r.Deletions, r.IgnoredDeletions)
	if rep.LRAT != "" {
		fmt.Fprintf(w, "LRAT written to %s\n", rep.LRAT)
	}
}

// proofBar draws the checker's progress on a terminal.
type proofBar struct {
	w     io.Writer
	bar   *progressbar.ProgressBar
	phase string
}

func newProofBar(w io.Writer, quiet bool) *proofBar {
	f, ok := w.(*os.File)
	if quiet || !ok || !term.IsTerminal(int(f.Fd())) {
		return nil
	}
	return &proofBar{w: w}
}

func (b *proofBar) update(p proof.Progress) {
	if b == nil {
		return
	}
	if b.bar == nil || p.Phase != b.phase {
		if b.bar != nil {
			b.bar.Finish()
		}
		b.phase = p.Phase
		total := int64(-1)
		if p.Total > 0 {
			total = int64(p.Total)
		}
		b.bar = progressbar.NewOptions64(total,
			progressbar.OptionSetWriter(b.w),
			progressbar.OptionSetDescription(p.Phase+" proof steps"),
			progressbar.OptionShowCount(),
			spineLook(),
			progressbar.OptionSetElapsedTime(true),
			progressbar.OptionClearOnFinish())
	}
	b.bar.Set64(int64(p.Steps))
	if p.Phase == "checking" {
		b.bar.Describe(fmt.Sprintf("checking proof steps (%d lemmas checked)", p.Checked))
	}
}

func (b *proofBar) finish() {
	if b != nil && b.bar != nil {
		b.bar.Finish()
	}
}
