package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"time"

	"github.com/spf13/cobra"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/pagenumber"
	"spinecert.dev/verify"
)

type pageNumberOptions struct {
	graph      graphFlags
	solver     solveSolverFlags
	kind       string
	parsedKind cert.Kind       // from kind, by validate
	solvers    []verify.Solver // from solver, by validate
	json       bool
	output     string
	proofOut   string
	unsatLower bool
	planar     bool
	enc        dimacs.Options
	graphArg   string
}

func newPageNumberCmd() *cobra.Command {
	var o pageNumberOptions
	cmd := &cobra.Command{
		Use:   "pagenumber GRAPH",
		Short: "Find the exact page number (or queue number) of GRAPH, with evidence",
		Long: `Find the exact page number (book thickness, --kind stack) or queue number
(--kind queue) of GRAPH, with evidence for both bounds.

The upper bound is always a layout that passed the direct check: first one
found by the layout heuristic, then smaller ones from SAT models. The lower
bound comes from an argument that needs no solver where one applies (no
edges; too many edges for fewer pages, since k stack pages hold at most
(k+1)n-3k edges; a checked Kuratowski subgraph, since two stack pages need
a planar graph; a checked Kuratowski subgraph of the graph plus an apex,
since one stack page needs an outerplanar graph; for a maximal planar
graph, a checked set of vertices whose removal leaves more components than
its size, since such a graph is not Hamiltonian and two stack pages would
make it so; the same bounds on each block), or else from a "no layout"
verdict for one page fewer, decided as "spinecert solve" decides it (two
backends, a proof checked by spinecert). --unsat-lower always proves the
lower bound with that verdict.

When the bounds without a solver meet the heuristic layout, no solver
runs; otherwise solver steps go down one page at a time from the best
layout, and stop at the first "no layout".

The exit status is 0 when the bounds meet, 3 when a solver step ends
without a verdict (the bounds found so far are reported).`,
		Args:    cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error { return o.validate() },
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg = args[0]
			return runPageNumber(cmd, &o)
		},
	}
	o.graph.add(cmd)
	o.solver.add(cmd)
	fl := cmd.Flags()
	fl.StringVar(&o.kind, "kind", "stack", "stack (page number) or queue (queue number)")
	fl.BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	fl.StringVarP(&o.output, "output", "o", "", "write the layout behind the upper bound (JSON) to FILE")
	fl.StringVar(&o.proofOut, "proof-out", "", "keep the proofs of every solver step in DIR/pages-K")
	fl.BoolVar(&o.planar, "planar", false, "require a planar graph: fail (exit 1) when the checked planarity verdict says it is not")
	fl.BoolVar(&o.unsatLower, "unsat-lower", false, "prove the lower bound by a checked UNSAT step even when a theorem (edge count, planarity, toughness) gives it")
	fl.BoolVar(&o.enc.Baseline, "baseline", false, "solver steps use the published formulation without reductions")
	fl.BoolVar(&o.enc.NoRotation, "no-rotation", false, "solver steps: stack: do not fix the first vertex on the spine")
	fl.BoolVar(&o.enc.NoReflection, "no-reflection", false, "solver steps: do not fix the order of one pair of vertices")
	fl.BoolVar(&o.enc.NoPageSymmetry, "no-page-symmetry", false, "solver steps: do not break the symmetry of pages")
	fl.BoolVar(&o.enc.NoTwins, "no-twins", false, "solver steps: do not order twin vertices on the spine")
	return cmd
}

// validate checks the flags and builds the solver list before any work starts.
func (o *pageNumberOptions) validate() error {
	kind, err := cert.ParseKind(o.kind)
	if err != nil {
		return usageErr(err)
	}
	if kind == cert.Mixed {
		return usageErr(fmt.Errorf("--kind mixed has no single page number: use stack or queue"))
	}
	if o.json && o.output == "-" {
		return usageErr(fmt.Errorf("--json prints the report on stdout: give the layout a file with -o FILE"))
	}
	o.parsedKind = kind
	o.solvers, err = o.solver.build()
	return err
}

func runPageNumber(cmd *cobra.Command, o *pageNumberOptions) error {
	kind, solvers := o.parsedKind, o.solvers
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	planarity, err := checkedPlanarity(g)
	if err != nil {
		return err
	}
	if o.planar {
		if err := requirePlanar(o.graphArg, planarity); err != nil {
			return err
		}
	}
	prog := newSolveProgress(cmd.ErrOrStderr(), o.solver.quiet, solvers)
	step := -1
	res, err := pagenumber.Compute(cmd.Context(), g, pagenumber.Options{
		Kind:        kind,
		Solvers:     solvers,
		Limit:       o.solver.timeLimit,
		ProofDir:    o.proofOut,
		Encoding:    o.enc,
		UnsatLower:  o.unsatLower,
		Obstruction: o.solver.obstruction(g, solvers),
		OnDemand:    o.solver.formula == "on-demand",
		Progress: func(k int, e verify.Event) {
			if k != step {
				step = k
				prog.setPrefix(fmt.Sprintf("%d pages: ", k))
			}
			prog.event(e)
		},
	})
	prog.finish()
	if err := interruption(cmd.Context()); err != nil {
		return err
	}
	if err != nil && !errors.Is(err, pagenumber.ErrUndecided) {
		return usageErr(err)
	}
	if res.Layout != nil && o.output != "" {
		if werr := writeFileAtomic(o.output, cmd.OutOrStdout(), func(w io.Writer) error {
			return cert.WriteLayoutJSON(w, g, res.Layout)
		}); werr != nil {
			return werr
		}
	}
	out := cmd.OutOrStdout()
	if o.json {
		if jerr := writePageNumberJSON(out, g, res, planarity); jerr != nil {
			return jerr
		}
	} else {
		printPageNumber(out, o.graphArg, res, err)
		fmt.Fprintf(out, "  %s\n", planarity)
	}
	if err != nil {
		return undecided(err)
	}
	return nil
}

func writePageNumberJSON(w io.Writer, g *graph.Graph, res *pagenumber.Result, planarity *planarityRecord) error {
	type evidence struct {
		Lower  pagenumber.Bound  `json:"lower"`
		Upper  pagenumber.Bound  `json:"upper"`
		Layout json.RawMessage   `json:"layout,omitempty"`
		Steps  []pagenumber.Step `json:"steps"`
	}
	type result struct {
		Graph      string           `json:"graph"`
		Kind       string           `json:"kind"`
		PageNumber *int             `json:"pagenumber"` // null when undecided
		Lower      int              `json:"lower"`
		Upper      int              `json:"upper"`
		Elapsed    time.Duration    `json:"elapsed_ns"`
		Planarity  *planarityRecord `json:"planarity"`
		Evidence   evidence         `json:"evidence"`
	}
	r := result{Graph: g.ID(), Kind: res.Kind, Lower: res.Lower.Pages, Upper: res.Upper.Pages, Elapsed: res.Elapsed, Planarity: planarity,
		Evidence: evidence{Lower: res.Lower, Upper: res.Upper, Steps: res.Steps}}
	if r.Evidence.Steps == nil {
		r.Evidence.Steps = []pagenumber.Step{}
	}
	if res.PageNumber >= 0 {
		pn := res.PageNumber
		r.PageNumber = &pn
	}
	if res.Layout != nil {
		var b bytes.Buffer
		if err := cert.WriteLayoutJSON(&b, g, res.Layout); err != nil {
			return err
		}
		r.Evidence.Layout = b.Bytes()
	}
	return writeJSON(w, r)
}

func printPageNumber(w io.Writer, name string, res *pagenumber.Result, err error) {
	what := "page number"
	if res.Kind == cert.Queue.String() {
		what = "queue number"
	}
	if err == nil {
		fmt.Fprintf(w, "%s of %s: %d (both bounds checked)\n", what, name, res.PageNumber)
	} else {
		fmt.Fprintf(w, "%s of %s: undecided, between %d and %d\n", what, name, res.Lower.Pages, res.Upper.Pages)
	}
	fmt.Fprintf(w, "  lower bound %d (%s): %s\n", res.Lower.Pages, res.Lower.Source, res.Lower.Detail)
	fmt.Fprintf(w, "  upper bound %d (%s): %s\n", res.Upper.Pages, res.Upper.Source, res.Upper.Detail)
	for _, s := range res.Steps {
		gv := s.Verdict
		line := fmt.Sprintf("  solver step, %d pages: %s", s.Pages, solveOutcome(s.Outcome))
		for _, r := range gv.Results {
			line += fmt.Sprintf("; %s %s in %s", r.Backend, r.Answer, r.Elapsed.Round(time.Millisecond))
		}
		for _, c := range gv.Checks {
			if c.Skipped == "" {
				line += fmt.Sprintf("; proof check %s in %s", c.Backend, c.Elapsed.Round(time.Millisecond))
			}
		}
		fmt.Fprintln(w, line)
		if gv.Verdict.Conflict != "" {
			fmt.Fprintf(w, "    conflict: %s\n", gv.Verdict.Conflict)
		}
		for _, m := range gv.Verdict.Missing {
			fmt.Fprintf(w, "    missing: %s\n", m)
		}
	}
	fmt.Fprintf(w, "  time: %s\n", res.Elapsed.Round(time.Millisecond))
}
