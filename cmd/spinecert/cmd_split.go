package main

import (
	"fmt"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"spinecert.dev/archive"
	"spinecert.dev/cube"
	"spinecert.dev/cubejob"
	"spinecert.dev/verify"
)

type splitOptions struct {
	graph    graphFlags
	claim    encodeClaimFlags
	solver   solveSolverFlags
	cubes    int
	depth    int
	rule     string
	cands    int
	cubeFile string
	out      string
	name     string
	input    string
	json     bool
}

// splitJSON is the --json output of split.
type splitJSON struct {
	Dir      string `json:"dir"`
	Job      string `json:"job"`
	GraphID  string `json:"graph_id"`
	Kind     string `json:"kind"`
	Pages    int    `json:"pages"`
	Cubes    int    `json:"cubes"`
	Rule     string `json:"rule"`
	Shape    string `json:"shape"`
	Vars     int    `json:"vars"`
	Clauses  int    `json:"clauses"`
	CNF      string `json:"cnf_sha256"`
	Subgraph *struct {
		Vertices int `json:"vertices"`
		Edges    int `json:"edges"`
	} `json:"subgraph,omitempty"`
	Closed int `json:"closed_by_propagation"`
}

func newSplitCmd() *cobra.Command {
	var o splitOptions
	cmd := &cobra.Command{
		Use:   "split GRAPH --pages K (--cubes N | --depth D | --cube-file FILE) -o DIR",
		Short: "Split a claim into cubes in a work directory, for conquer and gather",
		Long: `Split the claim "GRAPH has no K-page layout" into cubes and write a work
directory: the graph, the CNF (spinecert's encoding, as encode writes it),
the cubes (one "a LIT … 0" line each), and job.json, which records the
claim, the encoder and options, and the SHA-256 of every file.

The cubes are the leaves of a complete binary decision tree grown by a split
rule (--rule occurrence, the default: the most frequent free variable;
lookahead: the variable whose two branches propagate most), so they are
disjoint and cover every assignment by shape. --cube-file takes cubes made elsewhere; they must
be pairwise disjoint, and their coverage is proved at gather time.

With --subgraph (auto for graphs of more than 100 vertices) the claim is
first narrowed to a small subgraph with no layout (as solve does); the job
then refutes the subgraph, and so the graph.

Then run "spinecert conquer DIR" (on this machine or on Slurm) and
"spinecert gather DIR -o NAME" for one bundle that verify re-checks.`,
		Args: cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error {
			set := 0
			for _, f := range []string{"cubes", "depth", "cube-file"} {
				if cmd.Flags().Changed(f) {
					set++
				}
			}
			switch {
			case set != 1:
				return usageErr(fmt.Errorf("give exactly one of --cubes N, --depth D and --cube-file FILE"))
			case cmd.Flags().Changed("cubes") && (o.cubes < 1 || o.cubes > archive.MaxCubes):
				return usageErr(fmt.Errorf("--cubes must be between 1 and %d (the most one bundle holds), got %d", archive.MaxCubes, o.cubes))
			case cmd.Flags().Changed("depth") && (o.depth < 0 || 1<<o.depth > archive.MaxCubes):
				return usageErr(fmt.Errorf("--depth must be between 0 and 16 (2^16 cubes are the most one bundle holds), got %d", o.depth))
			case o.out == "":
				return usageErr(fmt.Errorf("-o DIR is required"))
			case o.rule != cube.RuleOccurrence && o.rule != cube.RuleLookahead:
				return usageErr(fmt.Errorf("--rule %q: expected %s", o.rule, strings.Join(cube.Rules, " or ")))
			case o.cands < 1:
				return usageErr(fmt.Errorf("--candidates must be at least 1"))
			}
			if _, err := o.claim.options(cmd); err != nil {
				return err
			}
			_, err := o.solver.build()
			return err
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.input = args[0]
			return runSplit(cmd, &o)
		},
	}
	o.graph.add(cmd)
	o.claim.add(cmd)
	o.solver.add(cmd)
	fl := cmd.Flags()
	fl.IntVar(&o.cubes, "cubes", 0, "number of cubes")
	fl.IntVar(&o.depth, "depth", 0, "depth of the decision tree: 2^D cubes")
	fl.StringVar(&o.rule, "rule", cube.RuleOccurrence, "split rule: "+strings.Join(cube.Rules, " or "))
	fl.IntVar(&o.cands, "candidates", 32, "lookahead: variables scored at each node")
	fl.StringVar(&o.cubeFile, "cube-file", "", `cubes made elsewhere ("a LIT … 0" per line) instead of a split`)
	fl.StringVarP(&o.out, "output", "o", "", "the work directory to create (must not exist, or be empty)")
	fl.StringVar(&o.name, "name", "", "a label of the graph for people (recorded, not checked)")
	fl.BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

func runSplit(cmd *cobra.Command, o *splitOptions) error {
	ctx := cmd.Context()
	g, err := o.graph.load(cmd, o.input)
	if err != nil {
		return err
	}
	opts, err := o.claim.options(cmd)
	if err != nil {
		return err
	}
	if opts.Kind.String() == "mixed" {
		return usageErr(fmt.Errorf("split: --kind mixed is not supported; split stack or queue claims"))
	}
	copt := cubejob.CreateOptions{Graph: g, Name: o.name, Encoding: opts, ToolVersion: version,
		Split: cube.SplitOptions{Cubes: o.cubes, Rule: o.rule, Candidates: o.cands}}
	if cmd.Flags().Changed("depth") {
		copt.Split.Cubes = 1 << o.depth
	}
	if o.cubeFile != "" {
		if copt.Cubes, err = cube.ReadFile(o.cubeFile, cube.ReadOptions{}); err != nil {
			return usageErr(err)
		}
	}
	solvers, err := o.solver.build()
	if err != nil {
		return err
	}
	if obs := o.solver.obstruction(g, solvers); obs != nil {
		ob, err := verify.FindObstruction(ctx, g, opts, *obs)
		if err != nil {
			if ierr := interruption(ctx); ierr != nil {
				return ierr
			}
			return err
		}
		if ob != nil && ob.Graph != nil && ob.Graph.N() < g.N() {
			copt.Subgraph = ob.Graph // cubejob.Create checks that it is one
		}
	}
	w, stats, err := cubejob.Create(ctx, o.out, copt)
	if err != nil {
		if ierr := interruption(ctx); ierr != nil {
			os.RemoveAll(o.out)
			return ierr
		}
		return usageErr(err)
	}
	out := cmd.OutOrStdout()
	if o.json {
		j := splitJSON{Dir: o.out, Job: w.ID, GraphID: g.ID(), Kind: opts.Kind.String(), Pages: opts.Pages, Cubes: len(w.Cubes),
			Rule: w.Job.Cubes.Rule, Shape: w.Job.Cubes.Shape, Vars: w.CNF.Vars, Clauses: len(w.CNF.Clauses), CNF: w.Job.CNF.SHA256}
		if w.Subgraph != nil {
			j.Subgraph = &struct {
				Vertices int `json:"vertices"`
				Edges    int `json:"edges"`
			}{w.Subgraph.N(), w.Subgraph.M()}
		}
		if stats != nil {
			j.Closed = stats.Closed
		}
		return writeJSON(out, j)
	}
	fmt.Fprintf(out, "work directory %s: %d cubes (%s, %s) of the claim: %s has no %d-page %s layout\n",
		o.out, len(w.Cubes), w.Job.Cubes.Rule, w.Job.Cubes.Shape, short(g.ID()), opts.Pages, opts.Kind)
	if w.Subgraph != nil {
		fmt.Fprintf(out, "the CNF encodes a subgraph with no layout found by the quick solver: n=%d, m=%d of n=%d, m=%d\n", w.Subgraph.N(), w.Subgraph.M(), g.N(), g.M())
	}
	fmt.Fprintf(out, "CNF: %d variables, %d clauses (SHA-256 %s)\n", w.CNF.Vars, len(w.CNF.Clauses), w.Job.CNF.SHA256)
	if stats != nil {
		fmt.Fprintf(out, "split: depth up to %d, %d cubes already refuted by unit propagation\n", stats.MaxDepth, stats.Closed)
	}
	fmt.Fprintf(out, "next: spinecert conquer %s\n", o.out)
	return nil
}
