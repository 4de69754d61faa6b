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
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/verify"
)

func init() { register(newBundleCmd) }

type bundleOptions struct {
	graph      graphFlags
	solver     solveSolverFlags
	atMost     int
	atLeast    int
	exact      int
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
}

func newBundleCmd() *cobra.Command {
	var o bundleOptions
	cmd := &cobra.Command{
		Use:   "bundle GRAPH (--at-most K | --at-least K | --exact K)",
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

The bundle is a tar stream compressed with zstd ("tar --zstd -xf" opens
it): manifest.json, the graph as given and in canonical form, the layout,
the proof, SHA256SUMS for "sha256sum -c", and the CNF with --include-cnf.
The same evidence always gives the same bytes: no time is recorded unless
--created or SOURCE_DATE_EPOCH gives one (solver run times are recorded as
measured). The file is written atomically; nothing is left on error or
interrupt. Re-check a bundle with "spinecert verify".`,
		Args: cobra.ExactArgs(1),
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
	fl.IntVar(&o.exact, "exact", 0, "claim: both, the page number is exactly K")
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

func runBundle(cmd *cobra.Command, o *bundleOptions) error {
	ctx := cmd.Context()
	set := 0
	bound, k := "", 0
	for _, c := range []struct {
		b string
		v int
		f string
	}{{archive.AtMost, o.atMost, "at-most"}, {archive.AtLeast, o.atLeast, "at-least"}, {archive.Exact, o.exact, "exact"}} {
		if cmd.Flags().Changed(c.f) {
			set++
			bound, k = c.b, c.v
		}
	}
	if set != 1 {
		return usageErr(fmt.Errorf("give exactly one of --at-most K, --at-least K, --exact K"))
	}
	if k < 1 || (bound != archive.AtMost && k < 2) {
		return usageErr(fmt.Errorf("--%s %d: K must be at least %d", strings.ReplaceAll(bound, "_", "-"), k, map[bool]int{true: 1, false: 2}[bound == archive.AtMost]))
	}
	kind, err := cert.ParseKind(o.kind)
	if err != nil {
		return usageErr(err)
	}
	var pageKinds []cert.Kind
	if o.pageKinds != "" {
		if kind != cert.Mixed {
			return usageErr(fmt.Errorf("--page-kinds needs --kind mixed"))
		}
		for _, s := range strings.Split(o.pageKinds, ",") {
			pk, err := cert.ParseKind(strings.TrimSpace(s))
			if err != nil || pk == cert.Mixed {
				return usageErr(fmt.Errorf("--page-kinds: %q is not stack or queue", s))
			}
			pageKinds = append(pageKinds, pk)
		}
	}
	if kind == cert.Mixed {
		want := k
		if bound == archive.AtLeast {
			want = k - 1
		}
		if bound == archive.Exact {
			return usageErr(fmt.Errorf("--exact is not defined for mixed layouts: state --at-most or --at-least"))
		}
		if len(pageKinds) != want {
			return usageErr(fmt.Errorf("--kind mixed needs --page-kinds with %d kinds for this claim, got %d", want, len(pageKinds)))
		}
	}
	if o.layout != "" && bound == archive.AtLeast {
		return usageErr(fmt.Errorf("--layout is evidence for an upper bound: use it with --at-most or --exact"))
	}
	if (o.fromProof != "" || o.fromCNF != "") && bound == archive.AtMost {
		return usageErr(fmt.Errorf("--from-proof/--from-cnf are evidence for a lower bound: use them with --at-least or --exact"))
	}
	if o.fromCNF != "" && o.fromProof == "" {
		return usageErr(fmt.Errorf("--from-cnf needs --from-proof"))
	}
	created, err := bundleCreated(o.created)
	if err != nil {
		return err
	}
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
	idx := o.graph.index
	switch {
	case idx == 0 && len(res.Graphs) != 1:
		return usageErr(fmt.Errorf("%s holds %d graphs: choose one with --index 1..%d", o.graphArg, len(res.Graphs), len(res.Graphs)))
	case idx == 0:
		idx = 1
	case idx < 0 || idx > len(res.Graphs):
		return usageErr(fmt.Errorf("%s: --index %d out of range 1..%d", o.graphArg, idx, len(res.Graphs)))
	case len(res.Graphs) > 1:
		// The bundle stores the input as given: keep only the chosen graph.
		var b bytes.Buffer
		if err := graph.WriteEdgeList(&b, res.Graphs[idx-1]); err != nil {
			return usageErr(err)
		}
		input, res.Format = b.Bytes(), graph.FormatEdgeList
	}
	g := res.Graphs[idx-1]
	name := o.name
	if name == "" {
		name = bundleBase(o.graphArg)
	}
	var planarity *planarityRecord
	if o.planarity || o.planar {
		if planarity, err = checkedPlanarity(g); err != nil {
			return err
		}
		if o.planar {
			if err := requirePlanar(o.graphArg, planarity); err != nil {
				return err
			}
		}
	}
	out := o.output
	if out == "" {
		out = name + archive.Suffix
	}
	ev := &archive.Evidence{Graph: g, Name: name, Input: input, InputFormat: res.Format, Kind: kind, Bound: bound, K: k,
		ToolVersion: version, Tool: "spinecert bundle", Created: created, IncludeCNF: o.includeCNF}
	if kind == cert.Mixed {
		ev.PageKinds = pageKinds
	}
	tmp, err := os.MkdirTemp("", "spinecert-bundle-")
	if err != nil {
		return usageErr(err)
	}
	defer os.RemoveAll(tmp)
	var solvers []verify.Solver
	needSolve := (bound != archive.AtLeast && o.layout == "") || (bound != archive.AtMost && o.fromProof == "")
	if needSolve {
		if solvers, err = o.solver.build(); err != nil {
			return err
		}
	}
	stderr := cmd.ErrOrStderr()
	if bound != archive.AtLeast {
		if o.layout != "" {
			raw, err := cert.ReadLayoutFile(o.layout)
			if err != nil {
				return usageErr(err)
			}
			l, rep := cert.Resolve(g, raw)
			if !rep.OK() {
				return refuted(fmt.Errorf("%s: %w", o.layout, rep.Err()))
			}
			ev.Layout = l
		} else {
			gv, err := verify.DecideLayout(ctx, g, verify.GraphOptions{
				Encoding: dimacs.Options{Kind: kind, Pages: k, PageKinds: pageKinds}, Solvers: solvers,
				Limit: o.solver.timeLimit, ProofDir: filepath.Join(tmp, "upper"), StopOnModel: true,
			})
			if err != nil {
				return usageErr(err)
			}
			switch gv.Verdict.Outcome {
			case verify.Satisfiable:
				ev.Layout = gv.Layout
			case verify.Unsatisfiable:
				return refuted(fmt.Errorf("the claim is false: there is no %s layout of %s on %d pages (checked refutation)", kind, name, k))
			default:
				return undecided(fmt.Errorf("no %d-page layout found and none ruled out: %s", k, strings.Join(gv.Verdict.Missing, "; ")))
			}
		}
	}
	if bound != archive.AtMost {
		ropt := dimacs.Options{Kind: kind, Pages: k - 1, PageKinds: pageKinds}
		if kind != cert.Mixed {
			ropt.PageKinds = nil
		}
		ref := &archive.RefutationInput{Options: ropt, Proof: o.fromProof, ForeignCNF: o.fromCNF}
		if o.fromProof == "" {
			gv, err := verify.DecideLayout(ctx, g, verify.GraphOptions{
				Encoding: ropt, Solvers: solvers, Limit: o.solver.timeLimit, ProofDir: filepath.Join(tmp, "lower"),
			})
			if err != nil {
				return usageErr(err)
			}
			switch gv.Verdict.Outcome {
			case verify.Satisfiable:
				return refuted(fmt.Errorf("the claim is false: %s has a %s layout on %d pages", name, kind, k-1))
			case verify.Unsatisfiable:
			default:
				return undecided(fmt.Errorf("%d pages neither refuted nor found: %s", k-1, strings.Join(gv.Verdict.Missing, "; ")))
			}
			for _, r := range gv.Results {
				ref.Runs = append(ref.Runs, archive.Run{Backend: r.Backend, Version: r.Version, Answer: strings.ToLower(r.Answer.String()), Seconds: r.Elapsed.Seconds()})
			}
			for _, r := range gv.Results {
				if r.Answer != verify.Unsat || r.Proof == "" || ref.Proof != "" {
					continue
				}
				for _, c := range gv.Checks {
					if c.Backend == r.Backend && c.DRAT && c.LRAT {
						ref.Proof, ref.ProofFormat = r.Proof, r.ProofFormat
					}
				}
			}
			if ref.Proof == "" {
				return undecided(fmt.Errorf("no proof of the refutation passed the checkers"))
			}
		}
		ev.Refutation = ref
	}
	if planarity != nil {
		ev.Planarity = planarity.cert
	}
	m, srcs, err := archive.Build(ctx, ev, archive.CurrentEncoder{}, tmp)
	if err != nil {
		return bundleErr(err)
	}
	if err := archive.WriteFile(ctx, out, srcs); err != nil {
		return usageErr(err)
	}
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
			Manifest *archive.Manifest `json:"manifest"`
		}{out, size, archive.ClaimText(m), m})
	}
	w := cmd.OutOrStdout()
	fmt.Fprintf(w, "wrote %s (%d bytes)\n", out, size)
	fmt.Fprintf(w, "claim: %s\n", archive.ClaimText(m))
	if m.Layout != nil {
		fmt.Fprintf(w, "layout: checked directly, %d pages\n", m.Layout.Pages)
	}
	if r := m.Refutation; r != nil {
		for _, p := range r.Proofs {
			fmt.Fprintf(w, "proof: %s (%s, %d bytes) %s by %s\n", p.Member, p.Format, p.Size, p.Result, p.Checker)
		}
		if r.CNF.Source == archive.CNFForeign {
			fmt.Fprintf(stderr, "spinecert: warning: the proof refutes a CNF that is not spinecert's encoding of the claim; the bundle records it as foreign and \"spinecert verify\" will not accept it without --resolve\n")
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
