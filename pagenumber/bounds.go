package pagenumber

import (
	"fmt"
	"slices"

	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

// Bound is one side of a page-number interval with the reason it holds.
type Bound struct {
	Pages  int    `json:"pages"`
	Source string `json:"source"` // what establishes it (see the Source* constants)
	Detail string `json:"detail"` // the argument, for people
}

// Sources of bounds.
const (
	SourceTrivial    = "trivial"         // no edges: 0 pages; some edge: at least 1
	SourceEdgeCount  = "edge-count"      // too many edges for fewer pages
	SourceNonPlanar  = "kuratowski"      // a checked Kuratowski subgraph
	SourceNonOuter   = "kuratowski-apex" // a checked Kuratowski subgraph of G plus an apex
	SourceToughness  = "toughness"       // maximal planar and a checked set leaving more components than its size
	SourceUnsat      = "unsat"           // checked UNSAT for one page fewer
	SourceLayout     = "layout"          // a layout that passed cert.Validate
	SourceBlockUnsat = "unsat-block"     // checked UNSAT for one page fewer on a block of G
	SourceSubgraph   = "subgraph"        // inherited from a subgraph (a block)
)

// stackLowerBounds returns the best lower bound on the stack page number
// (book thickness) of g that needs no solver, with its argument.
//
//   - 0 pages iff there are no edges; otherwise at least 1.
//   - Every edge not joining spine neighbours or the two spine ends lies
//     on some page, and one page holds at most n−3 such edges without a
//     crossing (the diagonals of a convex n-gon), so k pages hold at most
//     n + k(n−3) = (k+1)n − 3k edges for n ≥ 3 (Bernhart and Kainen, "The
//     book thickness of a graph", JCTB 27, 1979; the count is derived here
//     as stated).
//   - Book thickness at most 2 means subhamiltonian planar and at most 1
//     means outerplanar (Bernhart and Kainen 1979), so a checked Kuratowski
//     subgraph of G gives 3, and one of G plus a vertex joined to all
//     vertices (planar iff G is outerplanar: common practice) gives 2.
//   - A maximal planar graph with a 2-page layout is Hamiltonian
//     (Bernhart and Kainen 1979), and a Hamiltonian graph is 1-tough
//     (Chvátal, Discrete Math. 5, 1973), so a checked planar embedding with
//     3n − 6 edges and a set S whose removal leaves more than |S|
//     components, accepted by toughcert.Check, gives 3 (see toughnessBound).
func stackLowerBounds(g *graph.Graph) Bound {
	n, m := g.N(), g.M()
	if m == 0 {
		return Bound{0, SourceTrivial, "no edges"}
	}
	best := Bound{1, SourceTrivial, "the graph has an edge"}
	if n >= 4 {
		// smallest k with m <= n + k(n-3)
		k := (m - n + (n - 3) - 1) / (n - 3)
		if k > best.Pages {
			best = Bound{k, SourceEdgeCount, fmt.Sprintf("%d edges on %d vertices: %d pages hold at most (k+1)n-3k = %d edges", m, n, k-1, k*n-3*(k-1))}
		}
	}
	if best.Pages < 3 {
		if res, err := planar.DecideChecked(g); err == nil {
			if !res.Planar {
				best = Bound{3, SourceNonPlanar, fmt.Sprintf("not planar: a %s subdivision (checked), and 2 pages need a planar graph", res.Cert.Kuratowski.Kind)}
			} else if b, ok := toughnessBound(g, res.Cert.Embedding); ok {
				best = b
			}
		}
	}
	if best.Pages < 2 {
		if h := withApex(g); h != nil {
			if k, err := checkedKuratowski(h); err == nil && k != nil {
				best = Bound{2, SourceNonOuter, fmt.Sprintf("not outerplanar: the graph plus a vertex joined to all has a %s subdivision (checked), and 1 page needs an outerplanar graph", k.Kind)}
			}
		}
	}
	return best
}

// trivialLowerBound is the trivial bound: 0 pages iff there are no edges.
func trivialLowerBound(g *graph.Graph) Bound {
	if g.M() == 0 {
		return Bound{0, SourceTrivial, "no edges"}
	}
	return Bound{1, SourceTrivial, "the graph has an edge"}
}

// checkedKuratowski returns a Kuratowski subgraph of g that passed
// planarcert.Check (through planar.DecideChecked), or nil when g is planar.
func checkedKuratowski(g *graph.Graph) (*planarcert.Kuratowski, error) {
	res, err := planar.DecideChecked(g)
	if err != nil || res.Planar {
		return nil, err
	}
	return res.Cert.Kuratowski, nil
}

// withApex returns g plus one new vertex adjacent to every vertex.
func withApex(g *graph.Graph) *graph.Graph {
	b := graph.NewBuilder()
	for _, l := range g.Labels() {
		b.Vertex(l)
	}
	apex := "apex"
	for i := 0; ; i++ {
		if _, used := g.Index(apex); !used {
			break
		}
		apex = fmt.Sprintf("apex%d", i)
	}
	a := b.Vertex(apex)
	for v := range g.N() {
		if b.AddEdge(a, int32(v)) != nil {
			return nil
		}
	}
	// Vertices keep their numbers: builder indices 0..n-1 are g's labels in
	// g's order; Build renumbers canonically, which only relabels.
	for _, e := range g.Edges() {
		if b.AddEdge(e.U, e.V) != nil {
			return nil
		}
	}
	h, _ := b.Build()
	return h
}

// blocks returns the vertex sets of the biconnected components of g that
// have at least one edge, largest first. Every layout of g restricts to a
// layout of each block, so a block's lower bound is one for g.
func blocks(g *graph.Graph) [][]int32 {
	var out [][]int32
	edges := g.Edges()
	for _, blk := range g.Blocks() {
		vs := make([]int32, 0, 2*len(blk))
		for _, e := range blk {
			vs = append(vs, edges[e].U, edges[e].V)
		}
		slices.Sort(vs)
		out = append(out, slices.Compact(vs))
	}
	slices.SortStableFunc(out, func(a, b []int32) int { return len(b) - len(a) })
	return out
}
