package draw

import (
	"fmt"
	"slices"

	"spinecert.dev/graph"
)

// Window is a stretch of the spine: positions From..To, 1-based and
// inclusive, as people count them.
type Window struct{ From, To int }

// view is the part of a layout that is drawn: the drawn vertices in spine
// order, and for every vertex its place on the drawn spine. A drawn vertex
// sits at 0..len(order)-1; a vertex left out sits half a step before the
// first drawn vertex that follows it on the spine (or half a step after the
// last), so that an edge leaving the drawn part ends as a stub in the gap
// where its other end lies. Keeping the drawn vertices in spine order keeps
// every crossing and nesting among the drawn arcs as it is in the layout:
// whether two edges cross depends only on the order of their four ends.
type view struct {
	order   []int32
	pos     []int32 // spine position of every vertex, 0-based
	at      []float64
	drawn   []bool
	partial bool

	full, stubs, leaving, outside int // edges by how they are drawn
	pageDrawn, pageTotal          []int
	what                          string // what part is drawn, for the legend
}

// Around returns the vertices at distance at most radius from v (breadth-
// first search), in increasing order.
func Around(g *graph.Graph, v int32, radius int) []int32 {
	if v < 0 || int(v) >= g.N() {
		return nil
	}
	dist := make(map[int32]int, 64)
	dist[v] = 0
	queue := []int32{v}
	for len(queue) > 0 {
		u := queue[0]
		queue = queue[1:]
		if dist[u] == radius {
			continue
		}
		for _, w := range g.Neighbors(u) {
			if _, ok := dist[w]; !ok {
				dist[w] = dist[u] + 1
				queue = append(queue, w)
			}
		}
	}
	out := make([]int32, 0, len(dist))
	for u := range dist {
		out = append(out, u)
	}
	slices.Sort(out)
	return out
}

// makeView selects the drawn part from opts; order is the spine, pos its
// inverse and page the page of every edge (all already checked to fit g).
func makeView(g *graph.Graph, order, pos, page []int32, pages int, opts Options) (*view, error) {
	n := g.N()
	vw := &view{pos: pos, drawn: make([]bool, n), at: make([]float64, n), pageDrawn: make([]int, pages+1), pageTotal: make([]int, pages+1)}
	from, to := 0, n-1
	var parts []string
	if w := opts.Window; w != nil {
		if w.From < 1 || w.To > n || w.From > w.To {
			return nil, fmt.Errorf("draw: window %d:%d is not within spine positions 1:%d", w.From, w.To, n)
		}
		from, to = w.From-1, w.To-1
		vw.partial = true
		parts = append(parts, fmt.Sprintf("spine positions %d–%d of %d", w.From, w.To, n))
	}
	if opts.Vertices != nil {
		in := make([]bool, n)
		for _, v := range opts.Vertices {
			if v < 0 || int(v) >= n {
				return nil, fmt.Errorf("draw: vertex %d out of range 0..%d", v, n-1)
			}
			in[v] = true
		}
		for i := from; i <= to; i++ {
			vw.drawn[order[i]] = in[order[i]]
		}
		vw.partial = true
		label := opts.VerticesLabel
		if label == "" {
			label = "a chosen vertex set"
		}
		parts = append(parts, label)
	} else {
		for i := from; i <= to; i++ {
			vw.drawn[order[i]] = true
		}
	}
	// Places: walk the spine counting drawn vertices.
	k := 0
	for _, v := range order {
		if vw.drawn[v] {
			vw.at[v] = float64(k)
			vw.order = append(vw.order, v)
			k++
		} else {
			vw.at[v] = float64(k) - 0.5
		}
	}
	for e, ed := range g.Edges() {
		p := page[e]
		vw.pageTotal[p]++
		a, b := vw.drawn[ed.U], vw.drawn[ed.V]
		switch {
		case a && b:
			vw.full++
			vw.pageDrawn[p]++
		case a || b:
			if opts.OmitLeaving {
				vw.leaving++
			} else {
				vw.stubs++
				vw.pageDrawn[p]++
			}
		default:
			vw.outside++
		}
	}
	if vw.partial {
		what := "drawn: "
		for i, s := range parts {
			if i > 0 {
				what += " ∩ "
			}
			what += s
		}
		what += fmt.Sprintf("; %d of %d vertices, %d of %d edges in full", len(vw.order), n, vw.full, g.M())
		if vw.stubs > 0 {
			what += fmt.Sprintf(", %d leaving as stubs", vw.stubs)
		}
		if vw.leaving > 0 {
			what += fmt.Sprintf(", %d leaving not drawn", vw.leaving)
		}
		what += fmt.Sprintf(", %d outside not drawn", vw.outside)
		vw.what = what
	}
	return vw, nil
}
