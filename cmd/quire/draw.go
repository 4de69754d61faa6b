package main

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"quire/cert"
	"quire/draw"
)

func init() { register(newDrawCmd) }

type drawOptions struct {
	graph    graphFlags
	output   string
	title    string
	json     bool
	graphArg string
	layout   string
}

func newDrawCmd() *cobra.Command {
	var o drawOptions
	cmd := &cobra.Command{
		Use:   "draw GRAPH LAYOUT -o FILE.svg",
		Short: "Draw a layout as an SVG arc diagram",
		Long: `Draw a layout of a graph as an SVG arc diagram: the spine is a horizontal
band with the vertex labels in spine order, every edge an arc; odd pages
are drawn above the spine and even pages below, each page in its own
colour, named in the legend with its kind.

The layout must fit the graph (every vertex on the spine once, every edge
on exactly one page in range). Crossings or nestings do not stop the
drawing: they are counted on stderr and drawn as they are; quire check
gives the witnesses.`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg, o.layout = args[0], args[1]
			if o.output == "" {
				return usageErr(fmt.Errorf("missing -o FILE.svg"))
			}
			if o.json && o.output == "-" {
				return usageErr(fmt.Errorf("--json prints the report on stdout: write the drawing with -o FILE.svg"))
			}
			return runDraw(cmd, &o)
		},
	}
	o.graph.add(cmd)
	cmd.Flags().StringVarP(&o.output, "output", "o", "", "write the SVG to `FILE` (- for stdout)")
	cmd.Flags().StringVar(&o.title, "title", "", "title printed above the legend")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

func runDraw(cmd *cobra.Command, o *drawOptions) error {
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	raw, err := cert.ReadLayoutFile(o.layout)
	if err != nil {
		return usageErr(err)
	}
	l, rep := cert.Resolve(g, raw)
	if !rep.OK() {
		return usageErr(fmt.Errorf("%s does not fit %s, not drawn: %w", o.layout, o.graphArg, rep.Err()))
	}
	conflicts := int64(0)
	if v := cert.Validate(g, l); !v.OK() {
		conflicts = v.Total()
	}
	title := o.title
	if title == "" {
		title = fmt.Sprintf("%s: %s layout on %d page(s)", o.graphArg, l.Kind, l.Pages())
	}
	err = writeFileAtomic(o.output, cmd.OutOrStdout(), func(w io.Writer) error {
		return draw.SVG(w, g, l, draw.Options{Title: title})
	})
	if err != nil {
		return err
	}
	if o.json {
		type result struct {
			Graph     string `json:"graph"`
			Layout    string `json:"layout"`
			Output    string `json:"output"`
			Kind      string `json:"kind"`
			Pages     int    `json:"pages"`
			Conflicts int64  `json:"conflicts"`
		}
		return writeJSON(cmd.OutOrStdout(), result{g.ID(), o.layout, o.output, l.Kind.String(), l.Pages(), conflicts})
	}
	stderr := cmd.ErrOrStderr()
	if conflicts > 0 {
		fmt.Fprintf(stderr, "quire: note: the layout has %d problem(s) on its pages (drawn as they are; see quire check)\n", conflicts)
	}
	if o.output != "-" {
		fmt.Fprintf(stderr, "drew %s layout on %d page(s) to %s\n", l.Kind, l.Pages(), o.output)
	}
	return nil
}
