package verify

import (
	"context"
	"slices"
	"time"

	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
)

// ObstructionOptions controls FindObstruction.
type ObstructionOptions struct {
	// Oracle answers the trial questions "has this subgraph a layout?". Its
	// answers only steer the search; the subgraph found must still be refuted
	// with the full policy (DecideLayout).
	Oracle Solver
	// Starts is how many start vertices to try (0: 3, at most 5).
	Starts int
	// MaxClauses bounds the encoding of a trial subgraph (0: 1,000,000).
	MaxClauses int
	// CallLimit bounds one oracle call (0: 30 s); Limit the whole search (0: none).
	CallLimit, Limit time.Duration
}

// Obstruction is a subgraph of g that the oracle found to have no layout
// of the claim's kind on the claim's pages.
type Obstruction struct {
	Graph  *graph.Graph // labelled as in g (graph.CheckSubgraph holds)
	Calls  int          // oracle calls made
	Start  string       // the label of the vertex its breadth-first search started from
	Search time.Duration
}

// FindObstruction looks for a small subgraph H of g such that "H has a
// layout as opt describes" is unsatisfiable: every layout of g restricts
// to one of H, so refuting H refutes g. H is the subgraph induced by a
// prefix of a breadth-first order of g from a start vertex; prefixes are
// nested, so the smallest unsatisfiable prefix is found by doubling the
// length, then halving the interval. It returns nil when no prefix within
// the limits was found unsatisfiable.
func FindObstruction(ctx context.Context, g *graph.Graph, opt dimacs.Options, o ObstructionOptions) (*Obstruction, error) {
	start := time.Now()
	if o.Starts <= 0 {
		o.Starts = 3
	}
	if o.MaxClauses <= 0 {
		o.MaxClauses = 1_000_000
	}
	if o.CallLimit <= 0 {
		o.CallLimit = 30 * time.Second
	}
	ctx, cancel := withLimit(ctx, o.Limit)
	defer cancel()
	n := g.N()
	byDegree := make([]int32, n)
	for i := range byDegree {
		byDegree[i] = int32(i)
	}
	slices.SortStableFunc(byDegree, func(a, b int32) int { return g.Degree(b) - g.Degree(a) })
	// Start from vertices of median, upper-quartile and highest degree, then
	// evenly between: a vertex of very high degree makes a breadth-first
	// prefix mostly a fan around it, which has a layout whatever its size.
	var starts []int32
	for _, q := range []int{n / 2, n / 4, 0, n / 8, 3 * n / 4} {
		if n > 0 && !slices.Contains(starts, byDegree[q]) {
			starts = append(starts, byDegree[q])
		}
	}
	var best *Obstruction
	calls := 0
	// unsat reports whether the subgraph on the first l vertices of order
	// has no layout; ok is false when the oracle could not tell.
	unsat := func(order []int32, l int) (h *graph.Graph, no bool, ok bool) {
		// The order clauses of one part alone are 2·C(l,3): do not encode
		// what is sure to be too large.
		if big := int64(l); big*(big-1)*(big-2)/3 > int64(o.MaxClauses) && l > 3 {
			return nil, false, false
		}
		h, _ = g.Induced(order[:l])
		e, err := dimacs.Encode(h, opt)
		if err != nil || e.Stats().Clauses > o.MaxClauses {
			return nil, false, false
		}
		calls++
		res, err := o.Oracle.Solve(ctx, e.CNF(), o.CallLimit, "")
		if err != nil || res.Answer == Unknown {
			return nil, false, false
		}
		return h, res.Answer == Unsat, true
	}
	for _, s := range starts[:min(o.Starts, len(starts))] {
		if ctx.Err() != nil {
			break
		}
		order := bfsOrder(g, s)
		if best != nil && len(order) > best.Graph.N() {
			order = order[:best.Graph.N()] // look only for a smaller one
		}
		lo, hi := 0, 0 // lo: a prefix length with a layout; hi: one without
		var found *graph.Graph
		for l := min(16, len(order)); ; l = min(2*l, len(order)) {
			h, no, ok := unsat(order, l)
			if !ok {
				break
			}
			if no {
				hi, found = l, h
				break
			}
			lo = l
			if l == len(order) {
				break
			}
		}
		if found == nil {
			continue
		}
		for hi-lo > 1 {
			mid := (lo + hi) / 2
			h, no, ok := unsat(order, mid)
			if !ok {
				break
			}
			if no {
				hi, found = mid, h
			} else {
				lo = mid
			}
		}
		if best == nil || found.M() < best.Graph.M() {
			best = &Obstruction{Graph: found, Start: g.Label(s)}
		}
	}
	if best != nil {
		best.Calls, best.Search = calls, time.Since(start)
	}
	return best, nil
}

// bfsOrder is a breadth-first order of the component of s.
func bfsOrder(g *graph.Graph, s int32) []int32 {
	seen := make([]bool, g.N())
	seen[s] = true
	order := []int32{s}
	for h := 0; h < len(order); h++ {
		for _, w := range g.Neighbors(order[h]) {
			if !seen[w] {
				seen[w] = true
				order = append(order, w)
			}
		}
	}
	return order
}
