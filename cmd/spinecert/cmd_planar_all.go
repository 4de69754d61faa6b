package main

import (
	"errors"
	"fmt"

	"github.com/spf13/cobra"
)

// planarAllReport is the --json output of spinecert planar --all.
type planarAllReport struct {
	File      string          `json:"file"`
	Graphs    int             `json:"graphs"`
	Planar    int             `json:"planar"`
	NotPlanar int             `json:"not_planar"`
	Results   []planarAllLine `json:"results"`
}

type planarAllLine struct {
	Index       int    `json:"index"`
	Graph       string `json:"graph"`
	Planar      bool   `json:"planar"`
	Certificate string `json:"certificate"`
	Checked     bool   `json:"checked"`
}

// runPlanarAll decides every graph of a multi-graph file (graph6 or sparse6,
// one per line), checking each certificate, and prints one line per graph
// and the counts. Exit 0 when every certificate was checked.
func runPlanarAll(cmd *cobra.Command, o *planarOptions) error {
	if o.out != "" || o.check {
		return usageErr(errors.New("--all cannot be used with -o or --check"))
	}
	if o.graph.index != 0 {
		return usageErr(errors.New("--all and --index exclude each other"))
	}
	graphs, err := o.graph.loadAll(cmd, o.graphArg)
	if err != nil {
		return err
	}
	rep := planarAllReport{File: o.graphArg, Graphs: len(graphs), Results: []planarAllLine{}}
	out := cmd.OutOrStdout()
	for i, g := range graphs {
		rec, err := checkedPlanarity(g)
		if err != nil {
			return fmt.Errorf("graph %d of %s: %w", i+1, o.graphArg, err)
		}
		if rec.Planar {
			rep.Planar++
		} else {
			rep.NotPlanar++
		}
		line := planarAllLine{Index: i + 1, Graph: g.ID(), Planar: rec.Planar, Certificate: rec.Certificate, Checked: rec.Checked}
		rep.Results = append(rep.Results, line)
		if !o.json {
			fmt.Fprintf(out, "%d: %s (n=%d, m=%d)\n", i+1, rec, g.N(), g.M())
		}
	}
	if o.json {
		return writeJSON(out, rep)
	}
	fmt.Fprintf(out, "%d graph(s): %d planar, %d not planar; every certificate checked\n", rep.Graphs, rep.Planar, rep.NotPlanar)
	return nil
}
