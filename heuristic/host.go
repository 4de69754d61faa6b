package heuristic

import (
	"fmt"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// FindReportHost finds a layout of g through a supergraph: it runs
// FindReport on host and restricts the layout to g (Restrict). A layout
// of a graph is one of each of its subgraphs after the missing vertices
// and edges are dropped (no page gains an edge, so none gains a crossing
// or a nesting; common practice, no source), so the class bound of the
// host's construction holds for g too: a subgraph of a planar 3-tree gets
// at most 3 pages, a subgraph of a triangulation without separating
// triangles 2. The report says so (OnHost). As with FindReport, the caller
// validates the layout.
func FindReportHost(g, host *graph.Graph, kind cert.Kind, opts Options) (*cert.Layout, Report, error) {
	hl, rep, err := FindReport(host, kind, opts)
	if err != nil {
		return nil, Report{}, err
	}
	l, err := Restrict(g, host, hl)
	if err != nil {
		return nil, Report{}, err
	}
	rep.OnHost = true
	return l, rep, nil
}

// Restrict returns the layout of g that the layout hl of host induces: g's
// vertices in the order hl puts them, every edge of g on the page of the
// same edge of host, pages left empty dropped (the others keep their
// order and kinds). Vertices are matched by label. An error wrapping
// ErrNotSubgraph names the first vertex or edge of g that host lacks.
func Restrict(g, host *graph.Graph, hl *cert.Layout) (*cert.Layout, error) {
	toHost := make([]int32, g.N())
	for v := range toHost {
		h, ok := host.Index(g.Label(int32(v)))
		if !ok {
			return nil, fmt.Errorf("%w: vertex %q is not in it", ErrNotSubgraph, g.Label(int32(v)))
		}
		toHost[v] = h
	}
	if len(hl.Page) != host.M() {
		return nil, fmt.Errorf("heuristic: the host layout has pages for %d edges, the host %d", len(hl.Page), host.M())
	}
	l := &cert.Layout{Kind: hl.Kind, PageKinds: hl.PageKinds, Page: make([]int32, g.M())}
	for i, e := range g.Edges() {
		he := host.EdgeIndex(toHost[e.U], toHost[e.V])
		if he < 0 {
			return nil, fmt.Errorf("%w: edge %s–%s is not in it", ErrNotSubgraph, g.Label(e.U), g.Label(e.V))
		}
		l.Page[i] = hl.Page[he]
	}
	compactPages(l)
	fromHost := make([]int32, host.N())
	for i := range fromHost {
		fromHost[i] = -1
	}
	for v, h := range toHost {
		fromHost[h] = int32(v)
	}
	l.Order = make([]int32, 0, g.N())
	for _, h := range hl.Order {
		if v := fromHost[h]; v >= 0 {
			l.Order = append(l.Order, v)
		}
	}
	return l, nil
}

// compactPages renumbers the pages of l so that none is empty.
func compactPages(l *cert.Layout) {
	used := make([]bool, len(l.PageKinds)+1)
	for _, p := range l.Page {
		used[p] = true
	}
	newNum := make([]int32, len(used))
	var kinds []cert.Kind
	for p := 1; p < len(used); p++ {
		if used[p] {
			kinds = append(kinds, l.PageKinds[p-1])
			newNum[p] = int32(len(kinds))
		}
	}
	for i, p := range l.Page {
		l.Page[i] = newNum[p]
	}
	if len(kinds) == 0 && len(l.PageKinds) > 0 {
		kinds = l.PageKinds[:1] // a graph without edges keeps one page
	}
	l.PageKinds = kinds
}
