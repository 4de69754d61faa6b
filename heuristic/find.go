package heuristic

import (
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/planar"
)

// Options tune the search. The zero value is usable.
type Options struct {
	// Seed drives the randomised spine orders.
	Seed int64
	// Candidates is the number of spine orders to try (default 8). At least
	// one is always tried, whatever the time limit.
	Candidates int
	// TimeLimit stops trying further candidates, and the Hamiltonian cycle
	// searches, once it has passed (0 = no limit). The best layout found so
	// far is returned. The command's default is DefaultTimeLimit. In the
	// automatic choice (FindReport) the constructions get half of it and
	// the sweep the rest, at least the other half.
	TimeLimit time.Duration
	// Method chooses the construction ("" or MethodAuto: the first that
	// applies; see FindReport).
	Method Method
}

// deadline is start plus the time limit, or the zero time (no limit).
func (o Options) deadline(start time.Time) time.Time {
	if o.TimeLimit <= 0 {
		return time.Time{}
	}
	return start.Add(o.TimeLimit)
}

// DefaultTimeLimit is the time limit of the layout search that the
// commands use unless told otherwise (layout --time-limit) and that
// package pagenumber puts in place of no limit.
const DefaultTimeLimit = 10 * time.Second

// candidates returns the spine orders to try: Candidates, or by default 8;
// for stack layouts of more than 2·10^5 edges fewer (at least 3), so that
// the default work grows about linearly with the size of the graph.
func (o Options) candidates(kind cert.Kind, m int) int {
	if o.Candidates > 0 {
		return o.Candidates
	}
	if kind == cert.Queue {
		return 8
	}
	return max(3, min(8, 8*200_000/max(m, 1)))
}

// Find returns a layout of kind cert.Stack or cert.Queue for g, by the
// method opts.Method (see FindReport).
func Find(g *graph.Graph, kind cert.Kind, opts Options) (*cert.Layout, error) {
	l, _, err := FindReport(g, kind, opts)
	return l, err
}

// Stack returns a stack layout (book embedding) of g.
func Stack(g *graph.Graph, opts Options) *cert.Layout {
	if l := completeStack(g); l != nil {
		return l
	}
	l := search(g, cert.Stack, opts)
	if l.Pages() > 2 && g.N() >= 3 && g.M() <= 3*g.N()-6 && g.M() <= hamiltonMaxEdges {
		// A planar graph with a Hamiltonian cycle has a 2-page layout with the
		// cycle as spine (Bernhart & Kainen 1979); try a bounded search.
		if emb, ok := planar.Embed(g); ok {
			if h, ok := HamiltonianTwoPage(g, emb, hamiltonBudget(g)); ok {
				return h
			}
		}
	}
	return l
}

// hamiltonMaxEdges bounds the graphs on which the Hamiltonian try is made:
// on larger ones the embedding and a search that rarely succeeds within its
// budget cost several times the sweep (measured: 4.5 s at 10^6 edges).
const hamiltonMaxEdges = 200_000

// hamiltonBudget bounds the Hamiltonian cycle search (in path extensions)
// so that it costs about as much as a few passes over the graph.
func hamiltonBudget(g *graph.Graph) int { return 20*g.M() + 100_000 }

// Queue returns a queue layout of g.
func Queue(g *graph.Graph, opts Options) *cert.Layout {
	return search(g, cert.Queue, opts)
}

// search tries spine candidates and keeps the layout with the fewest pages.
func search(g *graph.Graph, kind cert.Kind, opts Options) *cert.Layout {
	deadline := opts.deadline(time.Now())
	sp := newSpines(g, kind, opts.Seed)
	var best []int32
	var bestOrder []int32
	bestK := int32(-1)
	lower := int32(1)
	if g.M() == 0 {
		lower = 0
	}
	n := opts.candidates(kind, g.M())
	checked := false // whether g was tested for outerplanarity
	for i := 0; i < n; i++ {
		if i > 0 && past(deadline) {
			break
		}
		order := sp.candidate(i)
		var page []int32
		var k int32
		if kind == cert.Stack {
			page, k = stackPages(g, order, deadline, sp.rng, bestK)
		} else {
			page, k = queuePages(g, order)
		}
		if page != nil && (bestK < 0 || k < bestK) {
			best, bestOrder, bestK = page, order, k
		}
		if bestK <= lower {
			break
		}
		if bestK == 2 && lower == 1 && kind == cert.Stack && !checked {
			checked = true
			if !outerplanar(g) {
				break
			}
		}
	}
	return newLayout(kind, bestOrder, best, bestK)
}

// outerplanar reports whether g has a 1-page stack layout: whether g plus a
// vertex joined to every vertex is planar (G. Chartrand and F. Harary,
// "Planar permutation graphs", Ann. Inst. H. Poincaré B 3, 1967; a graph is
// outerplanar exactly when this apex graph is planar; from memory).
func outerplanar(g *graph.Graph) bool {
	n := g.N()
	if g.M() > 2*n-3 {
		return false
	}
	edges := make([][2]int, 0, g.M()+n)
	for _, e := range g.Edges() {
		edges = append(edges, [2]int{int(e.U), int(e.V)})
	}
	for v := 0; v < n; v++ {
		edges = append(edges, [2]int{v, n})
	}
	a, err := graph.NewNumbered(n+1, 0, edges)
	return err == nil && planar.IsPlanar(a)
}

func newLayout(kind cert.Kind, order, page []int32, k int32) *cert.Layout {
	kinds := make([]cert.Kind, k)
	for i := range kinds {
		kinds[i] = kind
	}
	return &cert.Layout{Kind: kind, PageKinds: kinds, Order: order, Page: page}
}

// spans returns the spine positions (l < r) of every edge under order.
func spans(g *graph.Graph, order []int32) (ls, rs []int32) {
	pos := make([]int32, g.N())
	for i, v := range order {
		pos[v] = int32(i)
	}
	edges := g.Edges()
	ls = make([]int32, len(edges))
	rs = make([]int32, len(edges))
	for i, e := range edges {
		a, b := pos[e.U], pos[e.V]
		if a > b {
			a, b = b, a
		}
		ls[i], rs[i] = a, b
	}
	return ls, rs
}

// sortByLeft returns the edge indices sorted by left end ascending, then
// right end descending (rDesc) or ascending, by two counting sorts.
func sortByLeft(ls, rs []int32, n int, rDesc bool) []int32 {
	m := len(ls)
	count := make([]int32, n+1)
	tmp := make([]int32, m)
	for _, r := range rs {
		count[r+1]++
	}
	for i := 0; i < n; i++ {
		count[i+1] += count[i]
	}
	for e, r := range rs {
		tmp[count[r]] = int32(e)
		count[r]++
	}
	if rDesc {
		for i, j := 0, m-1; i < j; i, j = i+1, j-1 {
			tmp[i], tmp[j] = tmp[j], tmp[i]
		}
	}
	clear(count)
	for _, l := range ls {
		count[l+1]++
	}
	for i := 0; i < n; i++ {
		count[i+1] += count[i]
	}
	out := make([]int32, m)
	for _, e := range tmp {
		l := ls[e]
		out[count[l]] = e
		count[l]++
	}
	return out
}
