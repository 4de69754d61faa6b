package main

import (
	"errors"
	"fmt"
	"runtime"

	"github.com/spf13/cobra"

	"spinecert.dev/archive"
	"spinecert.dev/cubejob"
)

type gatherOptions struct {
	solver solveSolverFlags
	out    string
	jobs   int
	name   string
	dir    string
	json   bool
}

// gatherJSON is the --json output of gather.
type gatherJSON struct {
	Bundle   string `json:"bundle"`
	Claim    string `json:"claim"`
	Cubes    int    `json:"cubes"`
	Coverage string `json:"coverage"`
}

func newGatherCmd() *cobra.Command {
	var o gatherOptions
	cmd := &cobra.Command{
		Use:   "gather DIR -o NAME" + archive.Suffix,
		Short: "Check a conquered work directory and write one bundle of its evidence",
		Long: `Check a work directory whose cubes are all refuted and write one evidence
bundle that "spinecert verify" re-checks. Before anything is written:
every cube has a result of this job for this cube, with its proof's SHA-256
as recorded and UNSAT from two independent backends; coverage holds (the
cubes are the leaves of a complete binary decision tree, or, for cubes made
elsewhere, a solver refutes the formula of the negated cubes and spinecert's
checkers accept the proof); and every cube's proof passes spinecert's DRAT
checker and the LRAT re-check against the CNF with the cube's literals as
units (--jobs at a time). The bundle claims that the page number is at
least K+1 and holds the graph, the cubes, each cube's proof (trimmed to the
lemmas its check used, when that is smaller) and the coverage evidence.`,
		Args: cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error {
			if o.out == "" {
				return usageErr(fmt.Errorf("-o NAME%s is required", archive.Suffix))
			}
			if o.jobs < 0 {
				return usageErr(fmt.Errorf("--jobs must not be negative, got %d", o.jobs))
			}
			_, err := o.solver.build()
			return err
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.dir = args[0]
			return runGather(cmd, &o)
		},
	}
	o.solver.add(cmd)
	cmd.Flags().StringVarP(&o.out, "output", "o", "", "the bundle to write")
	cmd.Flags().IntVar(&o.jobs, "jobs", 0, "proofs checked at the same time (0 = one per CPU)")
	cmd.Flags().StringVar(&o.name, "name", "", "a label of the graph for people (recorded, not checked; default: the job's)")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

func runGather(cmd *cobra.Command, o *gatherOptions) error {
	ctx := cmd.Context()
	w, err := cubejob.Open(o.dir)
	if err != nil {
		return usageErr(err)
	}
	solvers, err := o.solver.build()
	if err != nil {
		return err
	}
	jobs := o.jobs
	if jobs == 0 {
		jobs = runtime.NumCPU()
	}
	m, err := w.Bundle(ctx, o.out, cubejob.GatherOptions{Solvers: solvers, Limit: o.solver.timeLimit, Jobs: jobs, Name: o.name}, version)
	if ierr := interruption(ctx); ierr != nil {
		return ierr
	}
	switch {
	case errors.Is(err, cubejob.ErrRefuted):
		return refuted(err)
	case errors.Is(err, cubejob.ErrIncomplete):
		return undecided(err)
	case errors.Is(err, archive.ErrRejected):
		return refuted(err)
	case err != nil:
		return err
	}
	cs := m.Refutation.Cubes
	if o.json {
		return writeJSON(cmd.OutOrStdout(), gatherJSON{Bundle: o.out, Claim: archive.ClaimText(m), Cubes: cs.Count, Coverage: cs.Coverage.Method})
	}
	fmt.Fprintf(cmd.OutOrStdout(), "wrote %s: %s\nevidence: %d cubes, each refuted with a checked proof; coverage: %s\n",
		o.out, archive.ClaimText(m), cs.Count, cs.Coverage.Method)
	return nil
}
