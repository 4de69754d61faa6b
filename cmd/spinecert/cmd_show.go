package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"spinecert.dev/archive"
)

type showOptions struct {
	json   bool
	bundle string
}

func newShowCmd() *cobra.Command {
	var o showOptions
	cmd := &cobra.Command{
		Use:   "show BUNDLE",
		Short: "Summarise an evidence bundle's manifest",
		Long: `Summarise an evidence bundle: the claim, the graph, the evidence and how it
was made. The bundle's integrity is checked on the way (every SHA-256 and
the manifest schema); the claim itself is not re-checked — "spinecert verify"
does that. --json prints the manifest itself.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.bundle = args[0]
			return runShow(cmd, &o)
		},
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "print the manifest as one JSON object on stdout")
	return cmd
}

// showRead reads a bundle's manifest, checking the bundle's integrity.
func showRead(path string, cmd *cobra.Command) (*archive.Manifest, *archive.Contents, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, nil, usageErr(err)
	}
	defer f.Close()
	var data []byte
	c, err := archive.Walk(cmd.Context(), f, path, archive.DefaultLimits(), func(m archive.Member, r io.Reader) error {
		if m.Name == archive.ManifestName {
			b, err := io.ReadAll(r)
			data = b
			return err
		}
		return nil
	})
	if err != nil {
		return nil, nil, bundleErr(err)
	}
	if data == nil {
		return nil, nil, refuted(fmt.Errorf("%s: no %s", path, archive.ManifestName))
	}
	m, err := archive.ReadManifest(data)
	if err != nil {
		return nil, nil, refuted(fmt.Errorf("%s: %w", path, err))
	}
	return m, c, nil
}

func runShow(cmd *cobra.Command, o *showOptions) error {
	m, c, err := showRead(o.bundle, cmd)
	if err != nil {
		return err
	}
	w := cmd.OutOrStdout()
	if o.json {
		return writeJSON(w, m)
	}
	fmt.Fprintf(w, "bundle:   %s (%d bytes, %d decompressed)\n", o.bundle, c.Packed, c.Total)
	fmt.Fprintf(w, "claim:    %s\n", archive.ClaimText(m))
	if m.Claim.Name != "" {
		fmt.Fprintf(w, "label:    %s\n", archive.LabelText(m.Claim.Name))
	}
	fmt.Fprintf(w, "graph:    identity %s, %s (as given, %s) and %s (canonical)\n", m.Claim.GraphID, m.Graph.Input, m.Graph.InputFormat, m.Graph.Canonical)
	if l := m.Layout; l != nil {
		fmt.Fprintf(w, "layout:   %s, %d pages, %s when bundled\n", l.Member, l.Pages, l.Check)
	}
	if r := m.Refutation; r != nil {
		fmt.Fprintf(w, "refuted:  %d pages (%s)\n", r.Pages, strings.Join(r.PageKinds, ","))
		var opts bytes.Buffer
		if json.Compact(&opts, r.Encoder.Options) != nil {
			opts.Reset()
			opts.Write(r.Encoder.Options)
		}
		fmt.Fprintf(w, "encoder:  %s, options %s\n", r.Encoder.Version, opts.String())
		cnf := "not stored (re-encoded on verify)"
		if r.CNF.Member != "" {
			cnf = "stored as " + r.CNF.Member
		}
		fmt.Fprintf(w, "cnf:      %s, %d variables, %d clauses, SHA-256 %s, %s\n", r.CNF.Source, r.CNF.Vars, r.CNF.Clauses, r.CNF.SHA256, cnf)
		for _, run := range r.Runs {
			v := run.Version
			if v == "" {
				v = "version unknown"
			}
			took := ""
			if run.Seconds > 0 {
				took = fmt.Sprintf(" in %.3f s", run.Seconds)
			}
			fmt.Fprintf(w, "run:      %s (%s): %s%s\n", run.Backend, v, run.Answer, took)
		}
		for _, p := range r.Proofs {
			conv := ""
			if p.ConvertedFrom != "" {
				conv = " (given as " + p.ConvertedFrom + " text)"
			}
			if t := p.TrimmedFrom; t != nil {
				conv += fmt.Sprintf(" (trimmed to %d core lemmas from a proof of %d lemmas, %d bytes, SHA-256 %s)", t.CoreLemmas, t.Lemmas, t.Size, t.SHA256)
			}
			fmt.Fprintf(w, "proof:    %s, %s%s, %d bytes, SHA-256 %s: %s by %s when bundled\n", p.Member, p.Format, conv, p.Size, p.SHA256, p.Result, p.Checker)
		}
		if cs := r.Cubes; cs != nil {
			var size int64
			verified := 0
			for _, e := range cs.Entries {
				size += e.Proof.Size
				if e.Proof.Result == archive.ResultVerified {
					verified++
				}
			}
			fmt.Fprintf(w, "cubes:    %d in %s (SHA-256 %s), coverage by %s\n", cs.Count, cs.Member, cs.SHA256, cs.Coverage.Method)
			fmt.Fprintf(w, "proofs:   one per cube under proofs/cube-NNNNNN, %d bytes in all; %d of %d recorded as verified when bundled\n", size, verified, len(cs.Entries))
		}
	}
	if p := m.Planarity; p != nil {
		fmt.Fprintf(w, "planar:   %v (certificate %s)\n", p.Planar, p.Member)
	}
	made := fmt.Sprintf("%s %s", m.Tool, m.ToolVersion)
	if m.Created != "" {
		made += " at " + m.Created
	}
	fmt.Fprintf(w, "made by:  %s; %s %s\n", made, m.Compression.Module, m.Compression.Version)
	fmt.Fprintf(w, "checked:  integrity only; run \"spinecert verify %s\" to re-check the claim\n", o.bundle)
	return nil
}
