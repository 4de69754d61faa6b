package cert

import (
	"fmt"

	"spinecert.dev/graph"
)

// CheckOptions tune Check.
type CheckOptions struct {
	MaxPages int // when > 0, every edge must be on a page ≤ MaxPages
}

// Check matches a raw layout against g and validates it: every vertex once on
// the spine, every edge of g placed exactly once (no missing, extra or
// duplicated edges), pages in 1..raw.Pages (and ≤ opt.MaxPages), and no
// conflict on any page. The report lists every kind of problem found.
func Check(g *graph.Graph, raw *RawLayout, opt CheckOptions) *Report {
	l, rep := Resolve(g, raw)
	validateInto(g, l, opt.MaxPages, false, rep)
	return rep
}

// Resolve matches a raw layout's labels with g's vertices and edges and
// returns the layout over g's numbering with a report of what did not match:
// unknown, repeated and missing vertices; extra, repeated and missing edges;
// pages outside 1..raw.Pages. Edges that did not match are left out of the
// layout (their page is 0).
func Resolve(g *graph.Graph, raw *RawLayout) (*Layout, *Report) {
	rep := &Report{Counts: map[string]int64{}, kept: map[ProblemKind]int{}}
	kinds, err := PageKinds(raw.Kind, raw.Pages, raw.PageKinds)
	if err != nil {
		kinds = make([]Kind, raw.Pages)
		for i := range kinds {
			kinds[i] = Stack
		}
	}
	n := g.N()
	toGraph := make([]int32, len(raw.Labels))
	for i, lab := range raw.Labels {
		v, ok := g.Index(lab)
		if !ok {
			v = -1
		}
		toGraph[i] = v
	}
	l := &Layout{Kind: raw.Kind, PageKinds: kinds, Order: make([]int32, 0, n), Page: make([]int32, g.M())}
	pos := make([]int32, n)
	for i := range pos {
		pos[i] = -1
	}
	for i, li := range raw.Spine {
		v := toGraph[li]
		switch {
		case v < 0:
			rep.add(Problem{Kind: UnknownVertex, Vertex: raw.Labels[li], Msg: fmt.Sprintf("spine position %d names %q, which is not a vertex of the graph", i, raw.Labels[li])})
		case pos[v] >= 0:
			rep.add(Problem{Kind: DuplicateVertex, Vertex: raw.Labels[li], Msg: fmt.Sprintf("vertex %q is on the spine twice (positions %d and %d)", raw.Labels[li], pos[v], i)})
		default:
			pos[v] = int32(i)
			l.Order = append(l.Order, v)
		}
	}
	for v := range pos {
		if pos[v] < 0 {
			rep.add(Problem{Kind: MissingVertex, Vertex: g.Labels()[v], Msg: fmt.Sprintf("vertex %q is not on the spine", g.Labels()[v])})
		}
	}
	// positions in the resolved spine (unknown and repeated entries dropped)
	for i, v := range l.Order {
		pos[v] = int32(i)
	}
	eidx := edgeIndices(g, raw.Edges, toGraph)
	for i, re := range raw.Edges {
		e := int(eidx[i])
		if e >= 0 && l.Page[e] == 0 && re.Page >= 1 && int(re.Page) <= raw.Pages {
			l.Page[e] = re.Page
			continue
		}
		u, v := toGraph[re.U], toGraph[re.V]
		w := WitnessEdge{U: raw.Labels[re.U], V: raw.Labels[re.V], PosU: -1, PosV: -1, Page: int(re.Page)}
		if u >= 0 {
			w.PosU = int(pos[u])
		}
		if v >= 0 {
			w.PosV = int(pos[v])
		}
		switch {
		case e < 0:
			rep.add(Problem{Kind: ExtraEdge, Page: int(re.Page), Edges: []WitnessEdge{w}, Msg: fmt.Sprintf("layout places %s–%s on page %d, but it is not an edge of the graph", w.U, w.V, re.Page)})
		case l.Page[e] != 0:
			rep.add(Problem{Kind: DuplicateEdge, Page: int(re.Page), Edges: []WitnessEdge{w}, Msg: fmt.Sprintf("edge %s–%s is placed twice (pages %d and %d)", w.U, w.V, l.Page[e], re.Page)})
		case re.Page < 1 || int(re.Page) > raw.Pages:
			rep.add(Problem{Kind: BadPage, Page: int(re.Page), Edges: []WitnessEdge{w}, Msg: fmt.Sprintf("edge %s–%s is on page %d, outside 1..%d", w.U, w.V, re.Page, raw.Pages)})
			l.Page[e] = -1 // placed, but unusable
		default:
			l.Page[e] = re.Page
		}
	}
	for e, p := range l.Page {
		switch p {
		case 0:
			ed := g.Edges()[e]
			rep.add(Problem{Kind: MissingEdge, Edges: []WitnessEdge{{U: g.Labels()[ed.U], V: g.Labels()[ed.V], PosU: int(pos[ed.U]), PosV: int(pos[ed.V])}},
				Msg: fmt.Sprintf("edge %s has no page", edgeName(g, e))})
		case -1:
			l.Page[e] = 0
		}
	}
	return l, rep
}

// edgeIndices returns, for every raw edge, the index of the graph edge it
// names, or -1. Large layouts are looked up in two halves at once. Layouts
// often list edges in the graph's order, so the edge after the one found
// last is tried before a search.
func edgeIndices(g *graph.Graph, edges []RawEdge, toGraph []int32) []int32 {
	out := make([]int32, len(edges))
	ge := g.Edges()
	look := func(from, to int) {
		next := -1 // the edge after the one found last
		for i := from; i < to; i++ {
			re := edges[i]
			u, v := toGraph[re.U], toGraph[re.V]
			out[i] = -1
			if u < 0 || v < 0 {
				continue
			}
			if u > v {
				u, v = v, u
			}
			var e int
			if next >= 0 && next < len(ge) && ge[next] == (graph.Edge{U: u, V: v}) {
				e = next
			} else {
				e = g.EdgeIndex(u, v)
			}
			out[i] = int32(e)
			next = e + 1
			if e < 0 {
				next = -1
			}
		}
	}
	if len(edges) < parallelMin {
		look(0, len(edges))
		return out
	}
	half := len(edges) / 2
	done := make(chan struct{})
	go func() {
		look(half, len(edges))
		close(done)
	}()
	look(0, half)
	<-done
	return out
}
