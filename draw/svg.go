package draw

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// Options control a drawing. The zero value is usable.
type Options struct {
	// Title is printed above the legend.
	Title string
	// HighlightEdges are edge indices (into Graph.Edges) drawn emphasised.
	HighlightEdges []int
	// HighlightVertices are vertices drawn emphasised.
	HighlightVertices []int32
	// HighlightLabel names the highlight set in the legend, after
	// "highlighted: "; empty gives the legend entry "highlighted".
	HighlightLabel string

	// Window, when set, draws only the vertices at spine positions
	// Window.From..Window.To (1-based, inclusive).
	Window *Window
	// Vertices, when not nil, draws only these vertices (within Window,
	// when both are set), kept in spine order with the others left out.
	Vertices []int32
	// VerticesLabel says in the legend what Vertices are ("within 2 of
	// v17"); empty gives "a chosen vertex set".
	VerticesLabel string
	// OmitLeaving leaves out the edges with one end drawn and one end not;
	// by default they are drawn as stubs that end in the gap of the spine
	// where the other end lies. Either way the legend counts them.
	OmitLeaving bool
}

// geometry of one drawing, in SVG user units (pixels).
type geometry struct {
	n          int
	dx         float64 // distance of neighbouring vertices on the spine
	margin     float64
	font       float64
	rotate     bool    // labels vertical
	band       float64 // height of the spine band
	above      float64 // height reserved for arcs above the spine
	below      float64 // height reserved for arcs below
	legendH    float64
	width      float64
	spineTop   float64 // y of the top edge of the spine band
	flattenAt  float64 // arcs wider than this get flatter
	legendRows int
}

func (g *geometry) x(at float64) float64 { return g.margin + at*g.dx }

// height returns the vertical extent of an arc of half-width rx: circular
// up to flattenAt, then growing at a quarter of the rate, so nested arcs
// stay nested and long arcs do not make the picture tall.
func (g *geometry) height(rx float64) float64 {
	if rx <= g.flattenAt {
		return rx
	}
	return g.flattenAt + (rx-g.flattenAt)/4
}

// Legend entries per column, and the width of a column.
const (
	legendRowsMax = 8
	legendColW    = 290.0
)

func num(f float64) string { return strconv.FormatFloat(math.Round(f*10)/10, 'f', -1, 64) }

// Drawn counts what a drawing shows of its layout.
type Drawn struct {
	// Vertices is the number of vertices drawn on the spine.
	Vertices int `json:"vertices"`
	// Full, Stubs, Leaving and Outside count the edges drawn in full, drawn
	// as stubs, leaving the drawn part and not drawn (OmitLeaving), and
	// with both ends outside it (not drawn); they add up to the edges.
	Full    int `json:"full"`
	Stubs   int `json:"stubs"`
	Leaving int `json:"leaving_not_drawn"`
	Outside int `json:"outside"`
	// Text says what part is drawn, as the SVG does; empty when all is.
	Text string `json:"text"`
}

// SVG writes an arc diagram of layout l of g to w.
func SVG(w io.Writer, g *graph.Graph, l *cert.Layout, opts Options) error {
	_, err := SVGPart(w, g, l, opts)
	return err
}

// SVGPart is [SVG] that also returns what the drawing shows.
func SVGPart(w io.Writer, g *graph.Graph, l *cert.Layout, opts Options) (Drawn, error) {
	n, m := g.N(), g.M()
	if len(l.Order) != n || len(l.Page) != m {
		return Drawn{}, fmt.Errorf("%w: %d spine vertices and %d edge pages for a graph with %d vertices and %d edges", ErrShape, len(l.Order), len(l.Page), n, m)
	}
	pos := l.Positions(n)
	for v, p := range pos {
		if p < 0 {
			return Drawn{}, fmt.Errorf("%w: vertex %q is not on the spine", ErrShape, g.Label(int32(v)))
		}
	}
	k := l.Pages()
	for e, p := range l.Page {
		if p < 1 || int(p) > k {
			return Drawn{}, fmt.Errorf("%w: edge %d is on page %d, outside 1..%d", ErrShape, e, p, k)
		}
	}
	hiE := make(map[int]bool, len(opts.HighlightEdges))
	for _, e := range opts.HighlightEdges {
		if e < 0 || e >= m {
			return Drawn{}, fmt.Errorf("draw: highlighted edge %d out of range 0..%d", e, m-1)
		}
		hiE[e] = true
	}
	hiV := make(map[int32]bool, len(opts.HighlightVertices))
	for _, v := range opts.HighlightVertices {
		if v < 0 || int(v) >= n {
			return Drawn{}, fmt.Errorf("draw: highlighted vertex %d out of range 0..%d", v, n-1)
		}
		hiV[v] = true
	}
	vw, err := makeView(g, l.Order, pos, l.Page, k, opts)
	if err != nil {
		return Drawn{}, err
	}
	geo := layoutGeometry(g, l, vw)
	bw := bufio.NewWriter(w)
	writeSVG(bw, g, l, vw, geo, opts, hiE, hiV)
	d := Drawn{Vertices: len(vw.order), Full: vw.full, Stubs: vw.stubs, Leaving: vw.leaving, Outside: vw.outside, Text: vw.what}
	return d, bw.Flush()
}

func layoutGeometry(g *graph.Graph, l *cert.Layout, vw *view) *geometry {
	n := len(vw.order)
	geo := &geometry{n: n, margin: 24}
	switch {
	case n <= 30:
		geo.dx, geo.font = 36, 12
	case n <= 100:
		geo.dx, geo.font = 20, 10
	default:
		geo.dx, geo.font = 12, 8
	}
	longest := 0
	for _, v := range vw.order {
		longest = max(longest, len([]rune(g.Label(v))))
	}
	textW := float64(longest) * geo.font * 0.62
	geo.rotate = textW > geo.dx-4
	if geo.rotate {
		geo.band = textW + 10
	} else {
		geo.band = geo.font + 10
	}
	geo.width = 2*geo.margin + float64(max(n-1, 0))*geo.dx
	geo.flattenAt = math.Max(120, geo.width/8)
	edges := g.Edges()
	for e, p := range l.Page {
		if !vw.drawn[edges[e].U] && !vw.drawn[edges[e].V] {
			continue
		}
		rx := math.Abs(vw.at[edges[e].U]-vw.at[edges[e].V]) * geo.dx / 2
		if p%2 == 1 {
			geo.above = math.Max(geo.above, geo.height(rx))
		} else {
			geo.below = math.Max(geo.below, geo.height(rx))
		}
	}
	geo.above += 12
	geo.below += 12
	entries := l.Pages() + 1 // pages and the highlight entry
	geo.legendRows = min(entries, legendRowsMax)
	cols := (entries + legendRowsMax - 1) / legendRowsMax
	geo.legendH = float64(geo.legendRows)*16 + 20
	if vw.partial {
		// The line that says what is drawn, under the title.
		geo.legendH += 16
		geo.width = math.Max(geo.width, 2*geo.margin+float64(len([]rune(vw.what)))*6.5)
	}
	geo.width = math.Max(geo.width, math.Max(360, 2*geo.margin+float64(cols)*legendColW))
	geo.spineTop = geo.legendH + geo.above
	return geo
}

func writeSVG(w *bufio.Writer, g *graph.Graph, l *cert.Layout, vw *view, geo *geometry, opts Options, hiE map[int]bool, hiV map[int32]bool) {
	height := geo.spineTop + geo.band + geo.below + 8
	fmt.Fprintf(w, `<svg xmlns="http://www.w3.org/2000/svg" width="%s" height="%s" viewBox="0 0 %s %s" font-family="sans-serif">`+"\n",
		num(geo.width), num(height), num(geo.width), num(height))
	title := opts.Title
	if title == "" {
		title = fmt.Sprintf("%s layout, %d vertices, %d edges, %d pages", l.Kind, g.N(), g.M(), l.Pages())
	}
	fmt.Fprintf(w, "<title>%s</title>\n", esc(title))
	if vw.partial {
		fmt.Fprintf(w, "<desc data-part=\"1\">%s</desc>\n", esc(vw.what))
	}
	fmt.Fprintf(w, `<rect width="100%%" height="100%%" fill="%s"/>`+"\n", paper)
	writeLegend(w, l, vw, geo, title, len(hiE) > 0 || len(hiV) > 0, opts.HighlightLabel)

	// Arcs: page by page, highlighted edges last so they lie on top.
	edges := g.Edges()
	dim := len(hiE) > 0 || len(hiV) > 0
	w.WriteString(`<g fill="none" stroke-linecap="round">` + "\n")
	for pass := 0; pass < 2; pass++ {
		for p := 1; p <= l.Pages(); p++ {
			for e, pe := range l.Page {
				if int(pe) != p || hiE[e] != (pass == 1) {
					continue
				}
				u, v := edges[e].U, edges[e].V
				if !vw.drawn[u] && !vw.drawn[v] || vw.drawn[u] != vw.drawn[v] && opts.OmitLeaving {
					continue
				}
				a, b := vw.at[u], vw.at[v]
				if a > b {
					a, b = b, a
				}
				writeArc(w, geo, e, p, a, b, vw.drawn[u] != vw.drawn[v], pass == 1, dim)
			}
		}
	}
	w.WriteString("</g>\n")

	// The spine band and the vertices on it.
	bottom := geo.spineTop + geo.band
	fmt.Fprintf(w, `<rect x="%s" y="%s" width="%s" height="%s" rx="4" fill="%s" stroke="%s" stroke-width="0.8"/>`+"\n",
		num(geo.margin-geo.dx/2), num(geo.spineTop), num(float64(max(geo.n-1, 0))*geo.dx+geo.dx), num(geo.band), spineFill, spineStroke)
	fmt.Fprintf(w, `<g font-size="%s" text-anchor="middle" fill="%s">`+"\n", num(geo.font), ink)
	for i, v := range vw.order {
		x := geo.x(float64(i))
		r, fill := 1.8, ink
		if hiV[v] {
			r, fill = 3.2, highlight
		}
		fmt.Fprintf(w, `<circle cx="%s" cy="%s" r="%s" fill="%s"/><circle cx="%s" cy="%s" r="%s" fill="%s"/>`,
			num(x), num(geo.spineTop), num(r), fill, num(x), num(bottom), num(r), fill)
		weight := ""
		if vw.partial {
			weight = fmt.Sprintf(` data-pos="%d"`, vw.pos[v]+1)
		}
		if hiV[v] {
			weight += ` font-weight="bold" fill="` + highlight + `" data-highlight="1"`
		}
		cy := geo.spineTop + geo.band/2
		if geo.rotate {
			fmt.Fprintf(w, `<text x="%s" y="%s" dy="0.35em" transform="rotate(-90 %s %s)"%s>%s</text>`+"\n",
				num(x), num(cy), num(x), num(cy), weight, esc(g.Label(v)))
		} else {
			fmt.Fprintf(w, `<text x="%s" y="%s" dy="0.35em"%s>%s</text>`+"\n", num(x), num(cy), weight, esc(g.Label(v)))
		}
	}
	w.WriteString("</g>\n</svg>\n")
}

// writeArc draws edge e between places a < b on the drawn spine: odd pages
// above the spine band, even pages below. A stub (an edge with one end not
// drawn) is dotted and marked data-stub.
func writeArc(w *bufio.Writer, geo *geometry, e, p int, a, b float64, stub, hi, dim bool) {
	x1, x2 := geo.x(a), geo.x(b)
	rx := (x2 - x1) / 2
	ry := geo.height(rx)
	y, sweep := geo.spineTop, 1
	if p%2 == 0 {
		y, sweep = geo.spineTop+geo.band, 0
	}
	st := pageStyle(p)
	colour, width, opacity := st.colour, 1.1, 0.9
	if geo.n > 100 {
		width = 0.7
	}
	if dim {
		opacity = 0.35
	}
	if hi {
		colour, width, opacity = highlight, 2.4, 1
	}
	extra := ""
	switch {
	case stub:
		extra = ` stroke-dasharray="1 3" data-stub="1"`
	case st.dash != "" && !hi:
		extra = ` stroke-dasharray="` + st.dash + `"`
	}
	if hi {
		extra += ` data-highlight="1"`
	}
	fmt.Fprintf(w, `<path data-edge="%d" data-page="%d" d="M%s %s A%s %s 0 0 %d %s %s" stroke="%s" stroke-width="%s" stroke-opacity="%s"%s/>`+"\n",
		e, p, num(x1), num(y), num(rx), num(ry), sweep, num(x2), num(y), colour, num(width), num(opacity), extra)
}

func writeLegend(w *bufio.Writer, l *cert.Layout, vw *view, geo *geometry, title string, hasHighlight bool, label string) {
	x, y := geo.margin, 20.0
	fmt.Fprintf(w, `<g font-size="12" fill="%s">`+"\n", ink)
	fmt.Fprintf(w, `<text x="%s" y="%s" font-weight="bold">%s</text>`+"\n", num(x), num(y), esc(title))
	top := y
	if vw.partial {
		y += 16
		top = y
		fmt.Fprintf(w, `<text data-legend-part="1" x="%s" y="%s">%s</text>`+"\n", num(x), num(y), esc(vw.what))
	}
	row := 0
	next := func() {
		if row == legendRowsMax {
			row, x, y = 0, x+legendColW, top
		}
		row++
		y += 16
	}
	for p := 1; p <= l.Pages(); p++ {
		next()
		st := pageStyle(p)
		side := "above"
		if p%2 == 0 {
			side = "below"
		}
		dash := ""
		if st.dash != "" {
			dash = ` stroke-dasharray="` + st.dash + `"`
		}
		fmt.Fprintf(w, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="3"%s/>`, num(x), num(y-4), num(x+22), num(y-4), st.colour, dash)
		edges := fmt.Sprintf("%d edges", vw.pageTotal[p])
		if vw.partial {
			edges = fmt.Sprintf("%d of %d edges drawn", vw.pageDrawn[p], vw.pageTotal[p])
		}
		fmt.Fprintf(w, `<text data-legend-page="%d" x="%s" y="%s">page %d: %s, %s the spine, %s</text>`+"\n",
			p, num(x+30), num(y), p, l.PageKinds[p-1], side, edges)
	}
	if hasHighlight {
		next()
		fmt.Fprintf(w, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="3"/>`, num(x), num(y-4), num(x+22), num(y-4), highlight)
		text := "highlighted"
		if label != "" {
			text += ": " + label
		}
		fmt.Fprintf(w, `<text data-legend-highlight="1" x="%s" y="%s">%s</text>`+"\n", num(x+30), num(y), esc(text))
	}

	w.WriteString("</g>\n")
}

func esc(s string) string {
	var b strings.Builder
	_ = xml.EscapeText(&b, []byte(s))
	return b.String()
}
