package main

import (
	"fmt"
	"os"

	"github.com/spf13/cobra"

	"spinecert.dev/archive"
)

type extractOptions struct {
	json   bool
	bundle string
	dir    string
}

func newExtractCmd() *cobra.Command {
	var o extractOptions
	cmd := &cobra.Command{
		Use:   "extract BUNDLE DIR",
		Short: "Unpack an evidence bundle into DIR",
		Long: `Unpack an evidence bundle into DIR (created if missing), SHA256SUMS included,
so that "sha256sum -c SHA256SUMS" can be run there.

Nothing is written outside DIR and no existing file is replaced. The bundle
is checked while it is read (names, types, sizes, every SHA-256); if it is
bad, nothing is left in DIR. Extraction does not re-check the claim: use
"spinecert verify".`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.bundle, o.dir = args[0], args[1]
			return runExtract(cmd, &o)
		},
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

func runExtract(cmd *cobra.Command, o *extractOptions) error {
	f, err := os.Open(o.bundle)
	if err != nil {
		return usageErr(err)
	}
	defer f.Close()
	c, err := archive.Extract(cmd.Context(), f, o.bundle, o.dir, archive.DefaultLimits())
	if err != nil {
		return bundleErr(err)
	}
	names := []string{archive.SumsName}
	for _, m := range c.Members {
		names = append(names, m.Name)
	}
	if o.json {
		return writeJSON(cmd.OutOrStdout(), struct {
			Bundle  string   `json:"bundle"`
			Dir     string   `json:"dir"`
			Members []string `json:"members"`
		}{o.bundle, o.dir, names})
	}
	w := cmd.OutOrStdout()
	for _, n := range names {
		fmt.Fprintln(w, n)
	}
	fmt.Fprintf(w, "extracted %d files into %s\n", len(names), o.dir)
	return nil
}
