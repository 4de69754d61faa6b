package main

import (
	"fmt"
	"io"
	"sort"
	"strings"

	"github.com/spf13/cobra"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

type checkOptions struct {
	graph    graphFlags
	pages    int
	json     bool
	graphArg string
	layout   string
}

func newCheckCmd() *cobra.Command {
	var o checkOptions
	cmd := &cobra.Command{
		Use:   "check GRAPH LAYOUT",
		Short: "Check a claimed layout of a graph directly",
		Long: `Check a claimed layout of a graph directly, without any solver.

The layout must put every vertex of the graph on the spine exactly once,
place every edge of the graph on exactly one page (no missing, extra or
repeated edges), use pages 1..k (and at most --pages when given), and have
no conflict on any page: no two edges of a stack page cross, no two edges
of a queue page nest. Every kind of problem found is reported with a
witness: the two conflicting edges with their spine positions and page,
or the missing or extra edge.`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg, o.layout = args[0], args[1]
			// 0 is the default, "no limit"; given, the limit must be a page count.
			if cmd.Flags().Changed("pages") && o.pages < 1 {
				return usageErr(fmt.Errorf("--pages must be at least 1, found %d", o.pages))
			}
			return runCheck(cmd, &o)
		},
	}
	o.graph.add(cmd)
	cmd.Flags().IntVar(&o.pages, "pages", 0, "fail unless every edge is on a page ≤ K")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

func runCheck(cmd *cobra.Command, o *checkOptions) error {
	// Read the graph and the layout at the same time: both parsers stream.
	type rawResult struct {
		raw *cert.RawLayout
		err error
	}
	ch := make(chan rawResult, 1)
	go func() {
		raw, err := cert.ReadLayoutFile(o.layout)
		ch <- rawResult{raw, err}
	}()
	g, gerr := o.graph.load(cmd, o.graphArg)
	// The identity depends on the graph alone: it is hashed while the layout
	// is still being read, and then while it is checked.
	idc := make(chan string, 1)
	if gerr == nil {
		go func() { idc <- g.ID() }()
	}
	lr := <-ch
	if gerr != nil {
		return gerr
	}
	if lr.err != nil {
		return usageErr(lr.err)
	}
	raw := lr.raw
	rep := cert.Check(g, raw, cert.CheckOptions{MaxPages: o.pages})
	id := <-idc
	idNote := ""
	if raw.Graph != "" && raw.Graph != id {
		idNote = fmt.Sprintf("the layout names graph %s, but %s has identity %s", short(raw.Graph), o.graphArg, short(id))
	}
	out := cmd.OutOrStdout()
	if o.json {
		type result struct {
			Graph    string           `json:"graph"`
			Layout   string           `json:"layout"`
			Kind     string           `json:"kind"`
			Pages    int              `json:"pages"`
			Used     int              `json:"pages_used"`
			PerPage  []int            `json:"edges_per_page"`
			Passed   bool             `json:"passed"`
			Counts   map[string]int64 `json:"counts"`
			Problems []cert.Problem   `json:"problems"`
			Note     string           `json:"note,omitempty"`
		}
		probs := rep.Problems
		if probs == nil {
			probs = []cert.Problem{}
		}
		if err := writeJSON(out, result{id, o.layout, raw.Kind.String(), raw.Pages, rep.Used, rep.PerPage, rep.OK(), rep.Counts, probs, idNote}); err != nil {
			return err
		}
	} else {
		printCheckReport(out, g, id, raw, rep, o)
		if idNote != "" {
			fmt.Fprintf(cmd.ErrOrStderr(), "spinecert: note: %s\n", idNote)
		}
	}
	if !rep.OK() {
		return refuted(nil)
	}
	return nil
}

func printCheckReport(w io.Writer, g *graph.Graph, id string, raw *cert.RawLayout, rep *cert.Report, o *checkOptions) {
	if rep.OK() {
		fmt.Fprintf(w, "layout passed: %s layout of %s (n=%d, m=%d) on %d page(s)", raw.Kind, o.graphArg, g.N(), g.M(), rep.Used)
		if rep.Used != raw.Pages {
			fmt.Fprintf(w, " (%d declared)", raw.Pages)
		}
		fmt.Fprintf(w, "\n  edges per page: %s\n  graph identity: %s\n", perPage(rep.PerPage), id)
		return
	}
	fmt.Fprintf(w, "layout rejected: %d problem(s) in %s for %s\n", rep.Total(), o.layout, o.graphArg)
	for _, p := range rep.Problems {
		fmt.Fprintf(w, "  %s: %s\n", p.Kind, p.Msg)
	}
	kinds := make([]string, 0, len(rep.Counts))
	for kind := range rep.Counts {
		kinds = append(kinds, kind)
	}
	sort.Strings(kinds)
	for _, kind := range kinds {
		c := rep.Counts[kind]
		kept := 0
		for _, p := range rep.Problems {
			if p.Kind.String() == kind {
				kept++
			}
		}
		if int64(kept) < c {
			fmt.Fprintf(w, "  … and %d more %s problem(s)\n", c-int64(kept), kind)
		}
	}
}

// perPage lists edge counts per page, or summarises them for many pages.
func perPage(a []int) string {
	if len(a) <= 16 {
		return joinInts(a)
	}
	lo, hi := a[0], a[0]
	for _, x := range a {
		lo, hi = min(lo, x), max(hi, x)
	}
	return fmt.Sprintf("%d to %d on each of %d pages", lo, hi, len(a))
}

func joinInts(a []int) string {
	s := make([]string, len(a))
	for i, x := range a {
		s[i] = fmt.Sprint(x)
	}
	return strings.Join(s, ", ")
}

// short abbreviates a hex identity for messages.
func short(id string) string {
	if len(id) > 12 {
		return id[:12]
	}
	return id
}
