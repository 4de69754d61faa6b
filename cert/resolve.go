package cert

import (
	"fmt"
	"strconv"

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
	l, rep, pos := resolve(g, raw)
	validateInto(g, l, opt.MaxPages, false, rep, pos)
	return rep
}

// Resolve matches a raw layout's labels with g's vertices and edges and
// returns the layout over g's numbering with a report of what did not match:
// unknown, repeated and missing vertices; extra, repeated and missing edges;
// pages outside 1..raw.Pages. Edges that did not match are left out of the
// layout (their page is 0).
func Resolve(g *graph.Graph, raw *RawLayout) (*Layout, *Report) {
	l, rep, _ := resolve(g, raw)
	return l, rep
}

// resolve is Resolve; it also returns the spine position of every vertex in
// the layout (-1 for the vertices not on the spine).
func resolve(g *graph.Graph, raw *RawLayout) (l *Layout, rep *Report, pos []int32) {
	rep = &Report{Counts: map[string]int64{}, kept: map[ProblemKind]int{}}
	kinds, err := PageKinds(raw.Kind, raw.Pages, raw.PageKinds)
	if err != nil {
		kinds = make([]Kind, raw.Pages)
		for i := range kinds {
			kinds[i] = Stack
		}
	}
	n := g.N()
	var toGraph []int32
	if raw.labels == nil {
		toGraph = numberVertices(g, raw.base, raw.numbers)
	} else {
		toGraph = labelVertices(g, raw.labels)
	}
	l = &Layout{Kind: raw.Kind, PageKinds: kinds, Order: make([]int32, 0, n), Page: make([]int32, g.M())}
	pos = make([]int32, n)
	for i := range pos {
		pos[i] = -1
	}
	for i, li := range raw.Spine {
		v := toGraph[li]
		switch {
		case v < 0:
			rep.add(Problem{Kind: UnknownVertex, Vertex: raw.Label(li), Msg: fmt.Sprintf("spine position %d names %q, which is not a vertex of the graph", i, raw.Label(li))})
		case pos[v] >= 0:
			rep.add(Problem{Kind: DuplicateVertex, Vertex: raw.Label(li), Msg: fmt.Sprintf("vertex %q is on the spine twice (positions %d and %d)", raw.Label(li), pos[v], i)})
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
	// The edges are looked up a block at a time (in two halves at once for
	// large layouts) and then placed in order.
	ids := make([]int32, min(len(raw.Edges), edgeBlock))
	next := -1 // the edge after the one found last
	for from := 0; from < len(raw.Edges); from += len(ids) {
		block := raw.Edges[from:min(from+len(ids), len(raw.Edges))]
		next = edgeIndices(g, block, toGraph, ids, next, len(raw.Edges) >= parallelMin)
		for j, re := range block {
			e := int(ids[j])
			if e >= 0 && l.Page[e] == 0 && re.Page >= 1 && int(re.Page) <= raw.Pages {
				l.Page[e] = re.Page
				continue
			}
			placeOther(g, raw, l, toGraph, pos, e, re, rep)
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
	return l, rep, pos
}

// placeOther places the raw edge re, which names graph edge e (-1 for none),
// when it is not a first placement on a page in range, and reports why.
func placeOther(g *graph.Graph, raw *RawLayout, l *Layout, toGraph, pos []int32, e int, re RawEdge, rep *Report) {
	u, v := toGraph[re.U], toGraph[re.V]
	w := WitnessEdge{U: raw.Label(re.U), V: raw.Label(re.V), PosU: -1, PosV: -1, Page: int(re.Page)}
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

// labelVertices returns the vertex of g of each label, or -1.
//
// Layouts often list the labels k0, k0+1, k0+2, …: such a run is compared
// with the text of a counter, not parsed. When g has vertices v0 and
// v0+run-1 with the run's first and last label, vertex v0+j has label
// k0+j for every j in between: vertices are numbered in canonical label
// order, where decimal labels come first, by value, so the run-2 vertices
// between them have run-2 increasing decimal labels between k0 and
// k0+run-1.
func labelVertices(g *graph.Graph, labels []string) []int32 {
	out := make([]int32, len(labels))
	i := 0
	if len(labels) > 0 && len(labels[0]) <= 18 && graph.IsDecimal(labels[0]) {
		k0, _ := strconv.Atoi(labels[0]) // below 10^18
		c := []byte(labels[0])           // the text of k0+run, counting up
		run := 0
		for run < len(labels) && sameText(labels[run], c) {
			c = nextDecimal(c)
			run++
		}
		v0, ok0 := g.IndexNumber(k0)
		v1, ok1 := g.IndexNumber(k0 + run - 1)
		if ok0 && ok1 && int(v1)-int(v0) == run-1 {
			for j := range out[:run] {
				out[j] = v0 + int32(j)
			}
			i = run
		}
	}
	for ; i < len(labels); i++ {
		v, ok := g.Index(labels[i])
		if !ok {
			v = -1
		}
		out[i] = v
	}
	return out
}

// numberVertices returns the vertex of g of each label base, base+1, …,
// base+n-1, or -1. When the first and the last are vertices v0 and v0+n-1,
// label base+j is vertex v0+j (see labelVertices).
func numberVertices(g *graph.Graph, base, n int) []int32 {
	out := make([]int32, n)
	if n == 0 {
		return out
	}
	v0, ok0 := g.IndexNumber(base)
	v1, ok1 := g.IndexNumber(base + n - 1)
	fast := ok0 && ok1 && int(v1)-int(v0) == n-1
	for j := range out {
		v, ok := v0+int32(j), fast
		if !fast {
			v, ok = g.IndexNumber(base + j)
		}
		if !ok {
			v = -1
		}
		out[j] = v
	}
	return out
}

// sameText reports whether s holds the bytes of c.
func sameText(s string, c []byte) bool {
	if len(s) != len(c) {
		return false
	}
	for i := range c {
		if s[i] != c[i] {
			return false
		}
	}
	return true
}

// edgeBlock is the number of raw edges resolve looks up at a time.
const edgeBlock = 1 << 16

// edgeIndices sets out[i] to the index of the graph edge that edges[i]
// names, or -1, and returns the index after the last one found (-1 if the
// last was not found). Layouts often list edges in the graph's order, so
// the edge after the one found last (next at first) is tried before a
// search. With split, the two halves are looked up at once.
func edgeIndices(g *graph.Graph, edges []RawEdge, toGraph, out []int32, next int, split bool) int {
	ge := g.Edges()
	look := func(from, to, next int) int {
		for i := from; i < to; i++ {
			re := edges[i]
			u, v := toGraph[re.U], toGraph[re.V]
			out[i] = -1
			if u < 0 || v < 0 {
				next = -1
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
		return next
	}
	if !split || len(edges) < 2 {
		return look(0, len(edges), next)
	}
	half := len(edges) / 2
	done := make(chan int)
	go func() { done <- look(half, len(edges), -1) }()
	look(0, half, next)
	return <-done
}
