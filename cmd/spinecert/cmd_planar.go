package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"
	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

type planarOptions struct {
	graph    graphFlags
	out      string
	json     bool
	check    bool
	all      bool
	graphArg string
	certArg  string
}

func newPlanarCmd() *cobra.Command {
	var o planarOptions
	cmd := &cobra.Command{
		Use:   "planar GRAPH [-o CERT] | planar --check GRAPH CERT",
		Short: "Decide planarity with a checked certificate",
		Long: `Decide whether a graph is planar and back the answer with a certificate.

A planar graph gets a rotation system (the cyclic order of the neighbours
around every vertex); a non-planar one gets a subdivision of K5 or K3,3
(branch vertices and the paths between them). Before anything is reported
the certificate is checked by a checker that shares no code with the
planarity test: every edge must appear in both rotations and the traced
faces must satisfy Euler's formula V − E + F = 2C, or the paths must be
paths of the graph, internally disjoint, joining the branch vertices as K5
or K3,3 does. -o writes the certificate (JSON, format spinecert-planarity).

Exit status 0 means planar, 1 not planar.

With --check, GRAPH CERT checks a certificate made elsewhere: exit status 0
means it is valid (whatever it certifies, which is printed), 1 that it is
rejected.

With --all, every graph of a file with several graphs (graph6 or sparse6,
one per line) is decided and its certificate checked; one line per graph
and the counts are printed, and the exit status is 0 when every
certificate was checked.`,
		Args: func(cmd *cobra.Command, args []string) error {
			if o.check {
				return cobra.ExactArgs(2)(cmd, args)
			}
			return cobra.ExactArgs(1)(cmd, args)
		},
		PreRunE: func(cmd *cobra.Command, args []string) error {
			if o.check && o.out != "" {
				return usageErr(errors.New("-o cannot be used with --check"))
			}
			if o.json && o.out == "-" {
				return usageErr(errors.New("-o - and --json both want stdout"))
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg = args[0]
			if o.check {
				o.certArg = args[1]
				return runPlanarCheck(cmd, &o)
			}
			if o.all {
				return runPlanarAll(cmd, &o)
			}
			return runPlanar(cmd, &o)
		},
	}
	o.graph.add(cmd)
	cmd.Flags().StringVarP(&o.out, "output", "o", "", "write the certificate to `CERT` (\"-\" for stdout)")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	cmd.Flags().BoolVar(&o.check, "check", false, "check the certificate CERT for GRAPH instead of deciding")
	cmd.Flags().BoolVar(&o.all, "all", false, "decide every graph of a multi-graph file and print the counts")
	return cmd
}

// planarReport is the --json output of spinecert planar.
type planarReport struct {
	Graph       string   `json:"graph"`
	Vertices    int      `json:"vertices"`
	Edges       int      `json:"edges"`
	Planar      bool     `json:"planar"`
	Checked     bool     `json:"checked"`
	Certificate string   `json:"certificate,omitempty"`
	Kuratowski  string   `json:"kuratowski,omitempty"`
	Branch      []string `json:"branch,omitempty"`
	Rejected    string   `json:"rejected,omitempty"`
}

func runPlanar(cmd *cobra.Command, o *planarOptions) error {
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	res, err := planar.DecideChecked(g)
	if err != nil {
		return undecided(fmt.Errorf("planarity: %w", err))
	}
	if o.out != "" {
		err := writeFileAtomic(o.out, cmd.OutOrStdout(), func(w io.Writer) error {
			return planarcert.Write(w, g, res.Cert)
		})
		if err != nil {
			return err
		}
	}
	rep := planarSummary(g, res.Cert)
	rep.Certificate = o.out
	if err := printPlanar(cmd, o, rep, o.out == "-"); err != nil {
		return err
	}
	if !res.Planar {
		return refuted(nil)
	}
	return nil
}

func planarSummary(g *graph.Graph, c *planarcert.Cert) planarReport {
	rep := planarReport{Graph: g.ID(), Vertices: g.N(), Edges: g.M(), Planar: c.Planar, Checked: true}
	if k := c.Kuratowski; k != nil {
		rep.Kuratowski = k.Kind.String()
		for _, b := range k.Branch {
			rep.Branch = append(rep.Branch, g.Label(b))
		}
	}
	return rep
}

func printPlanar(cmd *cobra.Command, o *planarOptions, rep planarReport, quiet bool) error {
	out := cmd.OutOrStdout()
	if o.json {
		return writeJSON(out, rep)
	}
	if quiet {
		out = cmd.ErrOrStderr()
	}
	what := fmt.Sprintf("%s (%d vertices, %d edges)", o.graphArg, rep.Vertices, rep.Edges)
	switch {
	case rep.Rejected != "":
		fmt.Fprintf(out, "certificate rejected for %s: %s\n", what, rep.Rejected)
	case rep.Planar:
		fmt.Fprintf(out, "planar: %s\n  certificate: rotation system, checked (every edge in both rotations, V − E + F = 2C)\n", what)
	default:
		fmt.Fprintf(out, "not planar: %s\n  certificate: subdivision of %s, checked; branch vertices %v\n", what, rep.Kuratowski, rep.Branch)
	}
	if rep.Certificate != "" && rep.Certificate != "-" {
		fmt.Fprintf(out, "  written to %s\n", rep.Certificate)
	}
	return nil
}

func runPlanarCheck(cmd *cobra.Command, o *planarOptions) error {
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	c, err := readPlanarCertFile(o.certArg, g)
	if err != nil {
		return err
	}
	rep := planarSummary(g, c)
	if err := planarcert.Check(g, c); err != nil {
		rep.Checked = false
		rep.Rejected = err.Error()
		if perr := printPlanar(cmd, o, rep, false); perr != nil {
			return perr
		}
		return refuted(nil)
	}
	return printPlanar(cmd, o, rep, false)
}
