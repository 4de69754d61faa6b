package main

import (
	"errors"
	"fmt"
	"io"
	"os"

	"github.com/spf13/cobra"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
)

type decodeOptions struct {
	graph    graphFlags
	claim    encodeClaimFlags
	opt      dimacs.Options // from claim, by validate
	version  string
	output   string
	json     bool
	graphArg string
	modelArg string
}

func newDecodeCmd() *cobra.Command {
	var o decodeOptions
	cmd := &cobra.Command{
		Use:   "decode GRAPH MODEL --pages K",
		Short: "Turn a solver's model of an encoded claim into a checked layout",
		Long: `Turn a satisfying assignment of the CNF written by "spinecert encode" into a
layout of GRAPH, check that layout directly, and write it as JSON.

MODEL is a solver's answer in the SAT competition format ("s SATISFIABLE"
and "v" lines, as cadical prints them) or a MiniSat result file. Give the
same claim options (and --encoder-version) as to "spinecert encode": the
encoding is rebuilt to find the meaning of every variable. A layout is written only if it passes the
direct check; a model that does not describe a valid layout is rejected
(exit 1).`,
		Args:    cobra.ExactArgs(2),
		PreRunE: func(cmd *cobra.Command, args []string) error { return o.validate(cmd) },
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg, o.modelArg = args[0], args[1]
			return runDecode(cmd, &o)
		},
	}
	o.graph.add(cmd)
	o.claim.add(cmd)
	addEncoderVersionFlag(cmd, &o.version)
	cmd.Flags().StringVarP(&o.output, "output", "o", "-", "write the layout to FILE (- for stdout)")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

// validate checks the flags before any work starts.
func (o *decodeOptions) validate(cmd *cobra.Command) error {
	var err error
	if o.opt, err = o.claim.options(cmd); err != nil {
		return err
	}
	if err := checkEncoderVersion(o.version); err != nil {
		return err
	}
	if o.json && o.output == "-" {
		return usageErr(fmt.Errorf("--json prints a report on stdout: give the layout a file with -o FILE"))
	}
	return nil
}

func runDecode(cmd *cobra.Command, o *decodeOptions) error {
	opt := o.opt
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	status, model, err := readModelFile(o.modelArg)
	if err != nil {
		return usageErr(err)
	}
	if status != dimacs.StatusSat {
		return usageErr(fmt.Errorf("%s: the solver answered %s: there is no model to decode", o.modelArg, status))
	}
	enc, err := dimacs.EncodeVersion(g, opt, o.version)
	if err != nil {
		return usageErr(err)
	}
	l, err := enc.Decode(model)
	if err != nil {
		if errors.Is(err, dimacs.ErrInvalidModel) {
			if o.json {
				writeJSON(cmd.OutOrStdout(), decodeResult{Graph: g.ID(), Model: o.modelArg, Valid: false, Error: err.Error()})
			}
			return refuted(err)
		}
		return err
	}
	if err := writeFileAtomic(o.output, cmd.OutOrStdout(), func(w io.Writer) error {
		return cert.WriteLayoutJSON(w, g, l)
	}); err != nil {
		return err
	}
	if o.json {
		return writeJSON(cmd.OutOrStdout(), decodeResult{Graph: g.ID(), Model: o.modelArg, Valid: true, Kind: l.Kind.String(), Pages: l.Pages(), Used: l.UsedPages(), Output: o.output})
	}
	fmt.Fprintf(cmd.ErrOrStderr(), "spinecert: decoded a %s layout of %s on %d page(s); it passed the direct check\n", l.Kind, o.graphArg, l.UsedPages())
	return nil
}

type decodeResult struct {
	Graph  string `json:"graph"`
	Model  string `json:"model"`
	Valid  bool   `json:"valid"`
	Kind   string `json:"kind,omitempty"`
	Pages  int    `json:"pages,omitempty"`
	Used   int    `json:"pages_used,omitempty"`
	Output string `json:"output,omitempty"`
	Error  string `json:"error,omitempty"`
}

func readModelFile(path string) (string, []bool, error) {
	if path == "-" {
		return dimacs.ReadModel(os.Stdin, "<stdin>")
	}
	f, err := os.Open(path)
	if err != nil {
		return "", nil, err
	}
	defer f.Close()
	return dimacs.ReadModel(f, path)
}
