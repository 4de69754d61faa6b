package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/evidence"
	"spinecert.dev/graph"
)

type bundleOptions struct {
	graph      graphFlags
	solver     solveSolverFlags
	atMost     int
	atLeast    int
	exact      string
	findExact  bool // --exact auto
	layout     string
	kind       string
	pageKinds  string
	includeCNF bool
	planarity  bool
	planar     bool
	fromCNF    string
	fromProof  string
	output     string
	name       string
	created    string
	json       bool
	graphArg   string
	claim      archive.Claim // filled from the flags by bundleClaim
}

func newBundleCmd() *cobra.Command {
	var o bundleOptions
	cmd := &cobra.Command{
		Use:   "bundle GRAPH (--at-most K | --at-least K | --exact K | --exact auto)",
		Short: "Make an evidence bundle for a claim about GRAPH",
		Long: `Make an evidence bundle, NAME.spinecert.tar.zst, for a claim about the page
number of GRAPH, running what is needed and checking everything it stores.

  --at-most K   a layout on K pages: given with --layout FILE (checked
                directly) or found by the solvers (decoded and checked)
  --at-least K  no layout on K-1 pages: the solvers refute the encoding of
                K-1 pages and spinecert's DRAT checker and LRAT re-check accept
                the proof; or a proof made elsewhere, --from-proof PROOF,
                for spinecert's encoding or for --from-cnf CNF (if that CNF is
                not spinecert's encoding the bundle says it is foreign)
  --exact K     both
  --exact auto  find the page number K with the solvers and claim exact K:
                a layout on K pages (checked directly) and a checked
                refutation of K-1 pages, walking down from a heuristic
                layout (stack or queue; no --layout or --from-proof)

The bundle is a tar stream compressed with zstd ("tar --zstd -xf" opens
it): manifest.json, the graph as given and in canonical form, the layout,
the proof, SHA256SUMS for "sha256sum -c", and the CNF with --include-cnf.
The same evidence always gives the same bytes: no time is recorded unless
--created or SOURCE_DATE_EPOCH gives one (solver run times are recorded as
measured). The file is written atomically; nothing is left on error or
interrupt. Re-check a bundle with "spinecert verify".`,
		Args:    cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error { return bundleClaim(cmd, &o) },
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg = args[0]
			return runBundle(cmd, &o)
		},
	}
	fl := cmd.Flags()
	o.graph.add(cmd)
	o.solver.add(cmd)
	fl.IntVar(&o.atMost, "at-most", 0, "claim: a layout on K pages exists")
	fl.IntVar(&o.atLeast, "at-least", 0, "claim: no layout on K-1 pages exists")
	fl.StringVar(&o.exact, "exact", "", "claim: both, the page number is exactly K; auto finds K")
	fl.StringVar(&o.layout, "layout", "", "the layout for --at-most/--exact (spinecert layout JSON) instead of solving")
	fl.StringVar(&o.kind, "kind", "stack", "layout kind: stack, queue or mixed")
	fl.StringVar(&o.pageKinds, "page-kinds", "", "for --kind mixed: the kind of every page (K for --at-most, K-1 for --at-least)")
	fl.BoolVar(&o.includeCNF, "include-cnf", false, "store the CNF in the bundle too")
	fl.BoolVar(&o.planarity, "planarity", true, "store a checked planarity certificate (an embedding or a Kuratowski subgraph)")
	fl.BoolVar(&o.planar, "planar", false, "the claim is about a planar graph: fail (exit 1) unless the checked planarity verdict says planar; implies --planarity")
	fl.StringVar(&o.fromCNF, "from-cnf", "", "the CNF a --from-proof proof refutes, if not spinecert's encoding")
	fl.StringVar(&o.fromProof, "from-proof", "", "a proof made elsewhere (DRAT text or binary, or LRAT) refuting K-1 pages")
	fl.StringVarP(&o.output, "output", "o", "", "bundle file (default NAME"+archive.Suffix+" after the graph file)")
	fl.StringVar(&o.name, "name", "", "short name of the graph in the claim (default the graph file's base name)")
	fl.StringVar(&o.created, "created", "", "record this creation time (RFC 3339); default SOURCE_DATE_EPOCH if set, else none")
	fl.BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

// bundleBase returns the graph file's name without directory and extension.
func bundleBase(path string) string {
	if path == "-" {
		return "graph"
	}
	b := filepath.Base(path)
	if i := strings.IndexByte(b, '.'); i > 0 {
		b = b[:i]
	}
	return b
}

// bundleCreated returns the creation time to record, or "".
func bundleCreated(flag string) (string, error) {
	if flag != "" {
		t, err := time.Parse(time.RFC3339, flag)
		if err != nil {
			return "", usageErr(fmt.Errorf("--created: expected an RFC 3339 time such as 2024-05-01T12:00:00Z: %w", err))
		}
		return t.UTC().Format(time.RFC3339), nil
	}
	if s := os.Getenv("SOURCE_DATE_EPOCH"); s != "" {
		n, err := strconv.ParseInt(s, 10, 64)
		if err != nil {
			return "", usageErr(fmt.Errorf("SOURCE_DATE_EPOCH=%q is not a number of seconds", s))
		}
		return time.Unix(n, 0).UTC().Format(time.RFC3339), nil
	}
	return "", nil
}

// bundleErr maps an archive error to an exit status: a bad bundle or
// rejected evidence is 1, anything else (unreadable input) 2.
func bundleErr(err error) error {
	if err == nil {
		return nil
	}
	if archive.IsBadBundle(err) || errors.Is(err, archive.ErrRejected) {
		return refuted(err)
	}
	return usageErr(err)
}

// bundleClaim reads the claim from the flags and checks its rules with
// archive.Claim.Validate, before any work starts.
func bundleClaim(cmd *cobra.Command, o *bundleOptions) error {
	exact := 0
	if cmd.Flags().Changed("exact") {
		if o.exact == "auto" {
			o.findExact = true
		} else if n, err := strconv.Atoi(o.exact); err == nil {
			exact = n
		} else {
			return usageErr(fmt.Errorf("--exact %q: expected a number of pages or auto", o.exact))
		}
	}
	set := 0
	for _, c := range []struct {
		b string
		v int
		f string
	}{{archive.AtMost, o.atMost, "at-most"}, {archive.AtLeast, o.atLeast, "at-least"}, {archive.Exact, exact, "exact"}} {
		if cmd.Flags().Changed(c.f) {
			set++
			o.claim.Bound, o.claim.K = c.b, c.v
		}
	}
	if set != 1 {
		return usageErr(fmt.Errorf("give exactly one of --at-most K, --at-least K, --exact K"))
	}
	o.claim.Kind = o.kind
	if o.pageKinds != "" {
		for _, s := range strings.Split(o.pageKinds, ",") {
			o.claim.PageKinds = append(o.claim.PageKinds, strings.TrimSpace(s))
		}
	}
	if o.findExact && (o.layout != "" || o.fromProof != "" || o.fromCNF != "") {
		return usageErr(fmt.Errorf("--exact auto finds its own evidence: it takes no --layout, --from-proof or --from-cnf"))
	}
	req := evidence.Request{Claim: o.claim, FindExact: o.findExact}
	if err := req.Validate(); err != nil {
		return usageErr(err)
	}
	if o.layout != "" && o.claim.Bound == archive.AtLeast {
		return usageErr(fmt.Errorf("--layout is evidence for an upper bound: use it with --at-most or --exact"))
	}
	if (o.fromProof != "" || o.fromCNF != "") && o.claim.Bound == archive.AtMost {
		return usageErr(fmt.Errorf("--from-proof/--from-cnf are evidence for a lower bound: use them with --at-least or --exact"))
	}
	if o.fromCNF != "" && o.fromProof == "" {
		return usageErr(fmt.Errorf("--from-cnf needs --from-proof"))
	}
	var err error
	o.created, err = bundleCreated(o.created)
	return err
}

func runBundle(cmd *cobra.Command, o *bundleOptions) error {
	ctx := cmd.Context()
	input, err := bundleReadInput(o.graphArg)
	if err != nil {
		return err
	}
	gf, err := graph.ParseFormat(o.graph.format)
	if err != nil {
		return usageErr(err)
	}
	res, err := graph.Read(bytes.NewReader(input), o.graphArg, gf)
	if err != nil {
		return usageErr(err)
	}
	for _, w := range res.Warnings {
		fmt.Fprintf(cmd.ErrOrStderr(), "spinecert: warning: %s\n", w)
	}
	g, err := res.Pick(o.graphArg, o.graph.index)
	if err != nil {
		return usageErr(err)
	}
	if len(res.Graphs) > 1 {
		// The bundle stores the input as given: keep only the chosen graph.
		var b bytes.Buffer
		if err := graph.WriteEdgeList(&b, g); err != nil {
			return usageErr(err)
		}
		input, res.Format = b.Bytes(), graph.FormatEdgeList
	}
	c := o.claim
	c.GraphID, c.Vertices, c.Edges = g.ID(), g.N(), g.M()
	if c.Name = o.name; c.Name == "" {
		c.Name = bundleBase(o.graphArg)
	}
	req := &evidence.Request{Graph: g, Input: input, InputFormat: res.Format, Claim: c, FindExact: o.findExact,
		FromProof: o.fromProof, FromCNF: o.fromCNF, Planarity: o.planarity, RequirePlanar: o.planar,
		Limit: o.solver.timeLimit, ToolVersion: version, Tool: "spinecert bundle", Created: o.created, IncludeCNF: o.includeCNF}
	if o.layout != "" {
		if req.Layout, err = cert.ReadLayoutFile(o.layout); err != nil {
			return usageErr(err)
		}
	}
	if req.NeedsSolvers() {
		if req.Solvers, err = o.solver.build(); err != nil {
			return err
		}
		req.Obstruction = o.solver.obstruction(g, req.Solvers)
		req.OnDemand = o.solver.formula == "on-demand"
	}
	out := o.output
	if out == "" {
		out = c.Name + archive.Suffix
	}
	m, err := evidence.Make(ctx, req, out)
	if ierr := interruption(ctx); ierr != nil {
		return ierr
	}
	switch {
	case errors.Is(err, evidence.ErrClaimFalse), errors.Is(err, evidence.ErrNotPlanar), errors.Is(err, evidence.ErrLayoutRejected):
		return refuted(err)
	case errors.Is(err, evidence.ErrUndecided):
		return undecided(err)
	case errors.Is(err, evidence.ErrExactTooSmall):
		return usageErr(err)
	case err != nil:
		return bundleErr(err)
	}
	return printBundle(cmd, o, out, m)
}

// printBundle reports the bundle written.
func printBundle(cmd *cobra.Command, o *bundleOptions, out string, m *archive.Manifest) error {
	fi, _ := os.Stat(out)
	size := int64(0)
	if fi != nil {
		size = fi.Size()
	}
	if o.json {
		return writeJSON(cmd.OutOrStdout(), struct {
			Bundle   string            `json:"bundle"`
			Size     int64             `json:"size"`
			Claim    string            `json:"claim"`
			Label    string            `json:"label,omitempty"`
			Manifest *archive.Manifest `json:"manifest"`
		}{out, size, archive.ClaimText(m), m.Claim.Name, m})
	}
	w := cmd.OutOrStdout()
	fmt.Fprintf(w, "wrote %s (%d bytes)\n", out, size)
	fmt.Fprintf(w, "claim: %s\n", archive.ClaimText(m))
	if o.findExact {
		fmt.Fprintf(w, "page number: %d, found (--exact auto)\n", m.Claim.K)
	}
	if m.Claim.Name != "" {
		fmt.Fprintf(w, "label: %s\n", archive.LabelText(m.Claim.Name))
	}
	if m.Layout != nil {
		fmt.Fprintf(w, "layout: checked directly, %d pages\n", m.Layout.Pages)
	}
	if r := m.Refutation; r != nil {
		for _, p := range r.Proofs {
			fmt.Fprintf(w, "proof: %s (%s, %d bytes) %s by %s\n", p.Member, p.Format, p.Size, p.Result, p.Checker)
		}
		if r.CNF.Source == archive.CNFForeign {
			fmt.Fprintf(cmd.ErrOrStderr(), "spinecert: warning: the proof refutes a CNF that is not spinecert's encoding of the claim; the bundle records it as foreign and \"spinecert verify\" will not accept it without --resolve\n")
		}
	}
	return nil
}

// bundleReadInput reads the graph file as given, to store it unchanged.
func bundleReadInput(path string) ([]byte, error) {
	var r io.Reader = os.Stdin
	if path != "-" {
		f, err := os.Open(path)
		if err != nil {
			return nil, usageErr(err)
		}
		defer f.Close()
		r = f
	}
	b, err := io.ReadAll(r)
	if err != nil {
		return nil, usageErr(err)
	}
	return b, nil
}
