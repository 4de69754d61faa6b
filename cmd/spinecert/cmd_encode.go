package main

import (
	"bufio"
	"fmt"
	"io"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
)

// encodeClaimFlags are the flags that choose the claim and the encoding;
// decode takes the same ones so that it rebuilds the same variable map.
type encodeClaimFlags struct {
	pages     int
	kind      string
	pageKinds string
	opt       dimacs.Options
}

func (f *encodeClaimFlags) add(cmd *cobra.Command) {
	fl := cmd.Flags()
	fl.IntVar(&f.pages, "pages", 0, "number of pages K of the claim (required)")
	fl.StringVar(&f.kind, "kind", "stack", "layout kind: stack, queue or mixed")
	fl.StringVar(&f.pageKinds, "page-kinds", "", "kind of every page for --kind mixed, e.g. stack,queue")
	fl.BoolVar(&f.opt.Baseline, "baseline", false, "use the published formulation (Bekos, Kaufmann, Zielke 2015) without reductions")
	fl.BoolVar(&f.opt.NoRotation, "no-rotation", false, "stack: do not fix the first vertex on the spine")
	fl.BoolVar(&f.opt.NoReflection, "no-reflection", false, "do not fix the order of one pair of vertices")
	fl.BoolVar(&f.opt.NoPageSymmetry, "no-page-symmetry", false, "do not restrict edge i to the first i+1 pages of each kind")
	fl.BoolVar(&f.opt.NoBlocks, "no-blocks", false, "stack: do not encode biconnected components separately")
	fl.BoolVar(&f.opt.NoLeaves, "no-leaves", false, "stack without blocks: keep degree-one vertices")
	fl.BoolVar(&f.opt.NoIsolated, "no-isolated", false, "keep isolated vertices in the encoding")
	fl.BoolVar(&f.opt.NoBetweenness, "no-betweenness", false, "expand conflicts over order variables instead of betweenness variables")
	fl.BoolVar(&f.opt.NoDirect, "no-direct", false, "always use same-page variables")
	fl.BoolVar(&f.opt.NoTwins, "no-twins", false, "do not put twin vertices (same neighbours) in a fixed order on the spine")
}

// options checks the claim flags and returns the encoder options.
func (f *encodeClaimFlags) options(cmd *cobra.Command) (dimacs.Options, error) {
	o := f.opt
	if !cmd.Flags().Changed("pages") {
		return o, usageErr(fmt.Errorf("--pages K is required"))
	}
	if f.pages < 1 {
		return o, usageErr(fmt.Errorf("--pages must be at least 1, got %d", f.pages))
	}
	kind, err := cert.ParseKind(f.kind)
	if err != nil {
		return o, usageErr(err)
	}
	o.Kind, o.Pages = kind, f.pages
	if f.pageKinds != "" {
		for _, s := range strings.Split(f.pageKinds, ",") {
			k, err := cert.ParseKind(strings.TrimSpace(s))
			if err != nil || k == cert.Mixed {
				return o, usageErr(fmt.Errorf("--page-kinds: %q is not stack or queue", s))
			}
			o.PageKinds = append(o.PageKinds, k)
		}
		if kind != cert.Mixed {
			return o, usageErr(fmt.Errorf("--page-kinds needs --kind mixed"))
		}
	}
	if _, err := o.Describe(); err != nil {
		return o, usageErr(err)
	}
	return o, nil
}

type encodeOptions struct {
	graph    graphFlags
	claim    encodeClaimFlags
	opt      dimacs.Options // from claim, by validate
	version  string
	output   string
	stats    bool
	json     bool
	graphArg string
}

func newEncodeCmd() *cobra.Command {
	var o encodeOptions
	cmd := &cobra.Command{
		Use:   "encode GRAPH --pages K",
		Short: "Write the CNF that is satisfiable iff GRAPH has a K-page layout",
		Long: `Write a DIMACS CNF that is satisfiable if and only if GRAPH has a layout of
the given kind on K pages (stack: no two edges of a page cross; queue: no
two edges of a page nest; mixed: a kind per page).

The output is deterministic: the same graph and options give the same bytes
whatever the input format or edge order. Comment lines at the top record
the encoder version, the graph identity, the claim and the options. By
default sound reductions and symmetry breaking are on (see --no-* flags);
--baseline writes the published formulation instead. A model of the CNF is
turned back into a layout with "spinecert decode" and the same options.

--encoder-version writes the CNF as an earlier encoder version did (for
re-deriving a CNF recorded by an older spinecert); the versions known are
listed in the flag's help.

--stats prints the number of variables, clauses and literals, split by
constraint family, instead of writing the CNF.`,
		Args:    cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error { return o.validate(cmd) },
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg = args[0]
			return runEncode(cmd, &o)
		},
	}
	o.graph.add(cmd)
	o.claim.add(cmd)
	addEncoderVersionFlag(cmd, &o.version)
	cmd.Flags().StringVarP(&o.output, "output", "o", "-", "write the CNF to FILE (- for stdout)")
	cmd.Flags().BoolVar(&o.stats, "stats", false, "print the size of the encoding instead of writing it")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

// validate checks the flags before any work starts.
func (o *encodeOptions) validate(cmd *cobra.Command) error {
	var err error
	if o.opt, err = o.claim.options(cmd); err != nil {
		return err
	}
	if err := checkEncoderVersion(o.version); err != nil {
		return err
	}
	if o.json && !o.stats && o.output == "-" {
		return usageErr(fmt.Errorf("--json prints a report on stdout: give the CNF a file with -o FILE, or use --stats"))
	}
	return nil
}

func runEncode(cmd *cobra.Command, o *encodeOptions) error {
	opt := o.opt
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	enc, err := dimacs.EncodeVersion(g, opt, o.version)
	if err != nil {
		return usageErr(err)
	}
	desc, _ := enc.Options().Describe()
	st := enc.Stats()
	out := cmd.OutOrStdout()
	var written int64
	if !o.stats {
		err := writeFileAtomic(o.output, out, func(w io.Writer) error {
			bw := bufio.NewWriterSize(w, 1<<20)
			n, err := enc.WriteTo(bw)
			written = n
			if err != nil {
				return err
			}
			return bw.Flush()
		})
		if err != nil {
			return err
		}
	}
	if o.json {
		type result struct {
			Graph   string       `json:"graph"`
			Encoder string       `json:"encoder"`
			Options string       `json:"options"`
			Output  string       `json:"output,omitempty"`
			Bytes   int64        `json:"bytes,omitempty"`
			Stats   dimacs.Stats `json:"stats"`
		}
		r := result{Graph: g.ID(), Encoder: enc.Version(), Options: desc, Stats: st}
		if !o.stats {
			r.Output, r.Bytes = o.output, written
		}
		return writeJSON(out, r)
	}
	if o.stats {
		printEncodeStats(out, enc, desc)
		return nil
	}
	if o.output != "-" {
		fmt.Fprintf(cmd.ErrOrStderr(), "spinecert: wrote %s: %d variables, %d clauses (%s)\n", o.output, st.Vars, st.Clauses, enc.Version())
	}
	return nil
}

func printEncodeStats(w io.Writer, enc *dimacs.Encoding, desc string) {
	st := enc.Stats()
	g := enc.Graph()
	fmt.Fprintf(w, "encoding of %s (n=%d, m=%d), %s\n", short(g.ID()), g.N(), g.M(), enc.Version())
	fmt.Fprintf(w, "  options: %s\n", desc)
	fmt.Fprintf(w, "  parts: %d\n", st.Parts)
	fmt.Fprintf(w, "  variables: %d\n  clauses: %d\n  literals: %d\n", st.Vars, st.Clauses, st.Literals)
	fmt.Fprintf(w, "  %-12s %10s %10s %10s\n", "family", "variables", "clauses", "literals")
	for _, f := range st.Families {
		fmt.Fprintf(w, "  %-12s %10d %10d %10d\n", f.Family, f.Vars, f.Clauses, f.Literals)
	}
}

// addEncoderVersionFlag registers --encoder-version (encode and decode).
func addEncoderVersionFlag(cmd *cobra.Command, v *string) {
	cmd.Flags().StringVar(v, "encoder-version", dimacs.EncoderVersion,
		"write the CNF as this encoder version did: "+strings.Join(dimacs.EncoderVersions(), ", "))
}

// checkEncoderVersion rejects a version this spinecert cannot write.
func checkEncoderVersion(v string) error {
	if !slices.Contains(dimacs.EncoderVersions(), v) {
		return usageErr(fmt.Errorf("--encoder-version: %q is not one of %s", v, strings.Join(dimacs.EncoderVersions(), ", ")))
	}
	return nil
}
