package main

import (
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/heuristic"
)

type layoutOptions struct {
	graph      graphFlags
	kind       string
	parsedKind cert.Kind // from kind, by validate
	output     string
	seed       int64
	timeLimit  time.Duration
	candidates int
	method     string
	parsedMeth heuristic.Method // from method, by validate
	json       bool
	host       string
	graphArg   string
}

func newLayoutCmd() *cobra.Command {
	var o layoutOptions
	cmd := &cobra.Command{
		Use:   "layout GRAPH",
		Short: "Find a stack or queue layout quickly, without a solver",
		Long: `Find a stack or queue layout of a graph quickly, without a solver, and
write it as layout JSON (to -o FILE, or to stdout).

Several spine orders are tried (depth-first orders for stack layouts,
breadth-first orders for queue layouts, and the input order), and for each
the edges are put on pages by a sweep along the spine; the layout with the
fewest pages is kept. The page count is an upper bound only: it shows that
this many pages suffice, not that fewer would not. Before writing, the
layout is validated with the same checker as spinecert check; a layout that
fails is not written.

For stack layouts, --method auto (the default) first tries the
constructions that guarantee a bound for a class of graphs, in this order,
and otherwise the sweep:

  complete            K_n on ceil(n/2) pages (Bernhart and Kainen 1979)
  planar-3-tree       planar 3-trees (stacked triangulations) on 3 pages
                      (Heath 1984), recognised by peeling vertices of degree 3
  4-connected         triangulations without separating triangles on 2 pages:
                      a Hamiltonian cycle (Tutte 1956) as the spine
                      (Bernhart and Kainen 1979)
  hamiltonian-search  a bounded search for a Hamiltonian cycle of a planar
                      graph, tried after the sweep when it needs 3+ pages
  sweep               spine candidates and the page sweep

--method NAME forces one; a forced construction that does not apply is a
usage error. --host FILE gives a supergraph of GRAPH (the same vertex
labels, at least its edges): the method runs on it and its layout is
restricted to GRAPH, so the host's class bound holds for GRAPH as well (a
subgraph of a planar 3-tree gets at most 3 pages); a GRAPH with a vertex
or an edge the host lacks is a usage error. The report names the method and the theorem behind its bound;
the bound is a claim about the class, the layout is what was checked.

The search is deterministic for a given --seed unless --time-limit stops it
early.`,
		Args:    cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error { return o.validate() },
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg = args[0]
			return runLayout(cmd, &o)
		},
	}
	o.graph.add(cmd)
	cmd.Flags().StringVar(&o.kind, "kind", "stack", "layout kind: stack or queue")
	cmd.Flags().StringVarP(&o.output, "output", "o", "-", "write the layout JSON to `FILE` (- for stdout)")
	cmd.Flags().Int64Var(&o.seed, "seed", 1, "seed for the randomised spine orders")
	cmd.Flags().DurationVar(&o.timeLimit, "time-limit", heuristic.DefaultTimeLimit, "stop trying further spine orders, and the Hamiltonian cycle search of the 4-connected and hamiltonian-search methods, after this long (0 = no limit)")
	cmd.Flags().IntVar(&o.candidates, "candidates", 8, "number of spine orders to try")
	cmd.Flags().StringVar(&o.method, "method", "auto", "construction: auto, complete, planar-3-tree, 4-connected, hamiltonian-search or sweep")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	cmd.Flags().StringVar(&o.host, "host", "", "find the layout of the supergraph in `FILE` and restrict it to GRAPH")
	return cmd
}

// validate checks the flags before any work starts.
func (o *layoutOptions) validate() error {
	if o.json && o.output == "-" {
		return usageErr(fmt.Errorf("--json prints the report on stdout: write the layout with -o FILE"))
	}
	if o.timeLimit < 0 || o.candidates < 1 {
		return usageErr(fmt.Errorf("--time-limit must not be negative and --candidates must be at least 1"))
	}
	kind, err := cert.ParseKind(o.kind)
	if err != nil || kind == cert.Mixed {
		return usageErr(fmt.Errorf("--kind %q: expected stack or queue", o.kind))
	}
	o.parsedKind = kind
	m, err := heuristic.ParseMethod(o.method)
	if err != nil {
		return usageErr(fmt.Errorf("--method %q: expected auto, complete, planar-3-tree, 4-connected, hamiltonian-search or sweep", o.method))
	}
	if kind == cert.Queue && m != heuristic.MethodAuto && m != heuristic.MethodSweep {
		return usageErr(fmt.Errorf("--method %s builds stack layouts only", m))
	}
	o.parsedMeth = m
	return nil
}

func runLayout(cmd *cobra.Command, o *layoutOptions) error {
	kind := o.parsedKind
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	var host *graph.Graph
	if o.host != "" {
		if host, err = loadGraphFormat(cmd.ErrOrStderr(), o.host, "auto", 0); err != nil {
			return err
		}
	}
	start := time.Now()
	opts := heuristic.Options{Seed: o.seed, Candidates: o.candidates, TimeLimit: o.timeLimit, Method: o.parsedMeth}
	var l *cert.Layout
	var hr heuristic.Report
	if host != nil {
		l, hr, err = heuristic.FindReportHost(g, host, kind, opts)
	} else {
		l, hr, err = heuristic.FindReport(g, kind, opts)
	}
	if err != nil {
		return usageErr(err)
	}
	hostNote := ""
	if hr.OnHost {
		hostNote = " on the host " + o.host
	}
	took := time.Since(start)
	rep := cert.Validate(g, l)
	perPage := make([]int, l.Pages())
	for _, p := range l.Page {
		perPage[p-1]++
	}
	stderr := cmd.ErrOrStderr()
	if !rep.OK() {
		// The heuristic's own output failed the checker: report, write nothing.
		if o.json {
			_ = writeJSON(cmd.OutOrStdout(), layoutResult{g.ID(), kind.String(), l.Pages(), perPage, false, "", took.Seconds(), g.N(), g.M(), string(hr.Method), hr.Bound, hr.Theorem, o.host})
		}
		return refuted(fmt.Errorf("the layout found by method %s failed validation, not written: %w", hr.Method, rep.Err()))
	}
	if err := writeFileAtomic(o.output, cmd.OutOrStdout(), func(w io.Writer) error { return cert.WriteLayoutJSON(w, g, l) }); err != nil {
		return err
	}
	if o.json {
		return writeJSON(cmd.OutOrStdout(), layoutResult{g.ID(), kind.String(), l.Pages(), perPage, true, o.output, took.Seconds(), g.N(), g.M(), string(hr.Method), hr.Bound, hr.Theorem, o.host})
	}
	dest := o.output
	if dest == "-" {
		dest = "stdout"
	}
	fmt.Fprintf(stderr, "%s layout of %s (n=%d, m=%d) on %d page(s), found by method %s%s in %s and validated; written to %s\n  edges per page: %s\n",
		kind, o.graphArg, g.N(), g.M(), l.Pages(), hr.Method, hostNote, took.Round(time.Millisecond), dest, layoutJoin(perPage))
	if hr.Theorem != "" {
		if hr.OnHost {
			fmt.Fprintf(stderr, "  class bound of the host, which every subgraph inherits: %d page(s): %s\n", hr.Bound, hr.Theorem)
		} else {
			fmt.Fprintf(stderr, "  method's class bound: %d page(s): %s\n", hr.Bound, hr.Theorem)
		}
	}
	return nil
}

// layoutResult is the --json report of spinecert layout.
type layoutResult struct {
	Graph    string  `json:"graph"`
	Kind     string  `json:"kind"`
	Pages    int     `json:"pages"`
	PerPage  []int   `json:"edges_per_page"`
	Passed   bool    `json:"passed"`
	Output   string  `json:"output,omitempty"`
	Seconds  float64 `json:"seconds"`
	Vertices int     `json:"vertices"`
	Edges    int     `json:"edges"`
	Method   string  `json:"method"`
	Bound    int     `json:"class_bound,omitempty"`
	Theorem  string  `json:"theorem,omitempty"`
	Host     string  `json:"host,omitempty"` // the supergraph the method ran on
}

func layoutJoin(a []int) string {
	s := make([]string, len(a))
	for i, x := range a {
		s[i] = fmt.Sprint(x)
	}
	return strings.Join(s, ", ")
}
