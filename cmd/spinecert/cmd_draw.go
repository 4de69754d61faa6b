package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

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

	window   string
	vertices string
	around   string
	radius   int
	leaving  string
	win      *draw.Window // parsed --window
}

// validate checks the flags before any input is read.
func (o *drawOptions) validate() error {
	if o.output == "" {
		return fmt.Errorf("missing -o FILE.svg")
	}
	if o.json && o.output == "-" {
		return fmt.Errorf("--json prints the report on stdout: write the drawing with -o FILE.svg")
	}
	if o.kuratowski && o.kuratowskiCert != "" {
		return errors.New("--kuratowski and --kuratowski-cert cannot be used together")
	}
	if o.window != "" {
		from, to, ok := strings.Cut(o.window, ":")
		a, errA := strconv.Atoi(from)
		b, errB := strconv.Atoi(to)
		if !ok || errA != nil || errB != nil || a < 1 || b < a {
			return fmt.Errorf("--window %q: expected FROM:TO, spine positions with 1 <= FROM <= TO", o.window)
		}
		o.win = &draw.Window{From: a, To: b}
	}
	if o.vertices != "" && o.around != "" {
		return errors.New("--vertices and --around cannot be used together")
	}
	if o.radius < 0 {
		return fmt.Errorf("--radius %d: expected a distance >= 0", o.radius)
	}
	if o.leaving != "stub" && o.leaving != "omit" {
		return fmt.Errorf("--leaving %q: expected stub or omit", o.leaving)
	}
	return nil
}

func newDrawCmd() *cobra.Command {
	var o drawOptions
	cmd := &cobra.Command{
		Use:   "draw GRAPH LAYOUT -o FILE.svg [--kuratowski | --kuratowski-cert CERT] [--window FROM:TO] [--vertices FILE | --around V]",
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

A large layout is drawn in part: --window FROM:TO keeps the vertices at
spine positions FROM..TO (1-based), --vertices FILE the vertices whose
labels FILE lists (whitespace-separated, # starts a comment), --around V
the vertices within --radius R edges of vertex V (default 1); a window and
a vertex set together keep the vertices in both. The drawn vertices stay
in spine order, so their arcs cross and nest as in the whole layout. Edges
with both ends drawn are drawn in full; edges leaving the drawn part are
dotted stubs ending in the gap of the spine where the other end lies, or
left out with --leaving omit. The SVG says what part is drawn, with the
counts of what is drawn and left out.

Exit status 0 means drawn; 1 that the certificate given with
--kuratowski-cert is rejected by the checker (nothing is drawn); 2 bad
usage, unreadable input, a layout that does not fit, or a planar graph or
planar certificate with --kuratowski or --kuratowski-cert (no Kuratowski
subgraph to highlight); 3 that the subdivision found did not pass the
checker.`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg, o.layout = args[0], args[1]
			if err := o.validate(); err != nil {
				return usageErr(err)
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
	cmd.Flags().StringVar(&o.window, "window", "", "draw only spine positions `FROM:TO` (1-based)")
	cmd.Flags().StringVar(&o.vertices, "vertices", "", "draw only the vertices whose labels `FILE` lists")
	cmd.Flags().StringVar(&o.around, "around", "", "draw only the vertices within --radius of vertex `V`")
	cmd.Flags().IntVar(&o.radius, "radius", 1, "distance in edges for --around")
	cmd.Flags().StringVar(&o.leaving, "leaving", "stub", "edges leaving the drawn part: stub or omit")
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
	if o.win != nil && o.win.To > g.N() {
		return usageErr(fmt.Errorf("--window %s: the spine has %d positions", o.window, g.N()))
	}
	opts := draw.Options{Title: title, Window: o.win, OmitLeaving: o.leaving == "omit"}
	if err := drawPart(g, o, &opts); err != nil {
		return err
	}
	kind := ""
	if k != nil {
		kind = k.Kind.String()
		opts.HighlightVertices = k.Branch
		opts.HighlightEdges = drawPathEdges(g, k)
		opts.HighlightLabel = fmt.Sprintf("%s subdivision, checked", k.Kind)
	}
	var drawn draw.Drawn
	err = writeFileAtomic(o.output, cmd.OutOrStdout(), func(w io.Writer) error {
		var err error
		drawn, err = draw.SVGPart(w, g, l, opts)
		return err
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
			// Part says what part is drawn, when not all of it.
			Part *draw.Drawn `json:"part,omitempty"`
		}
		var part *draw.Drawn
		if drawn.Text != "" {
			part = &drawn
		}
		return writeJSON(cmd.OutOrStdout(), result{g.ID(), o.layout, o.output, l.Kind.String(), l.Pages(), conflicts, kind, part})
	}
	stderr := cmd.ErrOrStderr()
	if conflicts > 0 {
		fmt.Fprintf(stderr, "spinecert: note: the layout has %d problem(s) on its pages (drawn as they are; see spinecert check)\n", conflicts)
	}
	if o.output != "-" {
		fmt.Fprintf(stderr, "drew %s layout on %d page(s) to %s\n", l.Kind, l.Pages(), o.output)
	}
	if drawn.Text != "" {
		fmt.Fprintf(stderr, "%s\n", drawn.Text)
	} else if g.M() > bigDrawing {
		fmt.Fprintf(stderr, "spinecert: note: all %d edges drawn; --window FROM:TO, --vertices FILE or --around V draw a part\n", g.M())
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

// bigDrawing is the number of edges above which draw suggests drawing a part.
const bigDrawing = 5000

// drawPart sets the vertex set of --vertices or --around in opts.
func drawPart(g *graph.Graph, o *drawOptions, opts *draw.Options) error {
	switch {
	case o.around != "":
		v, ok := g.Index(o.around)
		if !ok {
			return usageErr(fmt.Errorf("--around %q: no such vertex in %s", o.around, o.graphArg))
		}
		opts.Vertices = draw.Around(g, v, o.radius)
		opts.VerticesLabel = fmt.Sprintf("vertices within %d of %s", o.radius, o.around)
	case o.vertices != "":
		data, err := os.ReadFile(o.vertices)
		if err != nil {
			return usageErr(err)
		}
		opts.Vertices = []int32{}
		for i, line := range strings.Split(string(data), "\n") {
			line, _, _ = strings.Cut(line, "#")
			for _, f := range strings.Fields(line) {
				v, ok := g.Index(f)
				if !ok {
					return usageErr(fmt.Errorf("%s:%d: no vertex %q in %s", o.vertices, i+1, f, o.graphArg))
				}
				opts.Vertices = append(opts.Vertices, v)
			}
		}
		opts.VerticesLabel = "the vertices listed in " + o.vertices
	}
	return nil
}
