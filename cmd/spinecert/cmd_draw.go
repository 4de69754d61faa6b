package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"spinecert.dev/cert"
	"spinecert.dev/draw"
	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

type drawOptions struct {
	graph    graphFlags
	output   string
	title    string
	json     bool
	graphArg string
	layout   string

	kuratowski     bool
	kuratowskiCert string
}

func newDrawCmd() *cobra.Command {
	var o drawOptions
	cmd := &cobra.Command{
		Use:   "draw GRAPH LAYOUT -o FILE.svg [--kuratowski | --kuratowski-cert CERT]",
		Short: "Draw a layout as an SVG arc diagram",
		Long: `Draw a layout of a graph as an SVG arc diagram: the spine is a horizontal
band with the vertex labels in spine order, every edge an arc; odd pages
are drawn above the spine and even pages below, each page in its own
colour, named in the legend with its kind.

The layout must fit the graph (every vertex on the spine once, every edge
on exactly one page in range). Crossings or nestings do not stop the
drawing: they are counted on stderr and drawn as they are; spinecert check
gives the witnesses.

--kuratowski finds a subdivision of K5 or K3,3 in the (non-planar) graph,
checks it with the same checker as spinecert planar, and draws its branch
vertices and path edges highlighted over the dimmed rest; the legend names
K5 or K3,3. --kuratowski-cert CERT highlights the subdivision in a
planarity certificate (spinecert planar -o CERT), checked before drawing.

Exit status 0 means drawn; 1 that the certificate given with
--kuratowski-cert is rejected by the checker (nothing is drawn); 2 bad
usage, unreadable input, a layout that does not fit, or a planar graph or
planar certificate with --kuratowski or --kuratowski-cert (no Kuratowski
subgraph to highlight); 3 that the subdivision found did not pass the
checker.`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg, o.layout = args[0], args[1]
			if o.output == "" {
				return usageErr(fmt.Errorf("missing -o FILE.svg"))
			}
			if o.json && o.output == "-" {
				return usageErr(fmt.Errorf("--json prints the report on stdout: write the drawing with -o FILE.svg"))
			}
			if o.kuratowski && o.kuratowskiCert != "" {
				return usageErr(errors.New("--kuratowski and --kuratowski-cert cannot be used together"))
			}
			return runDraw(cmd, &o)
		},
	}
	o.graph.add(cmd)
	cmd.Flags().StringVarP(&o.output, "output", "o", "", "write the SVG to `FILE` (- for stdout)")
	cmd.Flags().StringVar(&o.title, "title", "", "title printed above the legend")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	cmd.Flags().BoolVar(&o.kuratowski, "kuratowski", false, "find, check and highlight a subdivision of K5 or K3,3")
	cmd.Flags().StringVar(&o.kuratowskiCert, "kuratowski-cert", "", "highlight the subdivision in the planarity certificate `CERT`, checked first")
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
	k, err := drawKuratowski(g, o)
	if err != nil {
		return err
	}
	title := o.title
	if title == "" {
		title = fmt.Sprintf("%s: %s layout on %d page(s)", o.graphArg, l.Kind, l.Pages())
	}
	opts := draw.Options{Title: title}
	kind := ""
	if k != nil {
		kind = k.Kind.String()
		opts.HighlightVertices = k.Branch
		opts.HighlightEdges = drawPathEdges(g, k)
		opts.HighlightLabel = fmt.Sprintf("%s subdivision, checked", k.Kind)
	}
	err = writeFileAtomic(o.output, cmd.OutOrStdout(), func(w io.Writer) error {
		return draw.SVG(w, g, l, opts)
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
			// Kuratowski is "K5" or "K3,3" when a checked subdivision is highlighted.
			Kuratowski string `json:"kuratowski,omitempty"`
		}
		return writeJSON(cmd.OutOrStdout(), result{g.ID(), o.layout, o.output, l.Kind.String(), l.Pages(), conflicts, kind})
	}
	stderr := cmd.ErrOrStderr()
	if conflicts > 0 {
		fmt.Fprintf(stderr, "spinecert: note: the layout has %d problem(s) on its pages (drawn as they are; see spinecert check)\n", conflicts)
	}
	if o.output != "-" {
		fmt.Fprintf(stderr, "drew %s layout on %d page(s) to %s\n", l.Kind, l.Pages(), o.output)
	}
	if k != nil {
		fmt.Fprintf(stderr, "highlighted a %s subdivision (checked): %d branch vertices, %d path edges\n", k.Kind, len(k.Branch), len(opts.HighlightEdges))
	}
	return nil
}

// drawKuratowski returns the Kuratowski subgraph to highlight, checked with
// planarcert.CheckKuratowski, or nil when none is asked for.
func drawKuratowski(g *graph.Graph, o *drawOptions) (*planarcert.Kuratowski, error) {
	switch {
	case o.kuratowski:
		k, err := planar.FindKuratowski(g)
		if errors.Is(err, planar.ErrPlanar) {
			return nil, usageErr(fmt.Errorf("%s: graph is planar: no Kuratowski subgraph", o.graphArg))
		}
		if err != nil {
			return nil, undecided(fmt.Errorf("kuratowski: %w", err))
		}
		if err := planarcert.CheckKuratowski(g, k); err != nil {
			return nil, undecided(fmt.Errorf("kuratowski: the subdivision found does not pass the checker, not drawn: %w", err))
		}
		return k, nil
	case o.kuratowskiCert != "":
		c, err := readPlanarCertFile(o.kuratowskiCert, g)
		if err != nil {
			return nil, err
		}
		if c.Planar {
			return nil, usageErr(fmt.Errorf("%s: certificate says planar: nothing to highlight", o.kuratowskiCert))
		}
		if err := planarcert.CheckKuratowski(g, c.Kuratowski); err != nil {
			return nil, refuted(fmt.Errorf("%s: certificate rejected, not drawn: %w", o.kuratowskiCert, err))
		}
		return c.Kuratowski, nil
	}
	return nil, nil
}

// drawPathEdges lists the edges on the paths of a checked subdivision.
func drawPathEdges(g *graph.Graph, k *planarcert.Kuratowski) []int {
	var out []int
	for _, p := range k.Paths {
		for i := 1; i < len(p); i++ {
			out = append(out, g.EdgeIndex(p[i-1], p[i]))
		}
	}
	return out
}
