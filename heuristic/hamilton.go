package heuristic

import (
	"math/rand/v2"
	"slices"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

// HamiltonianCycle searches for a Hamiltonian cycle of g by backtracking:
// the path grows from a fixed start vertex, always trying first the
// unvisited neighbour with the fewest unvisited neighbours (Warnsdorff's
// rule, ties broken at random), and the search restarts with new tie-breaks
// when a restart's share of the budget is spent. budget bounds the total
// number of path extensions; the search gives up (false) when it is used up.
// The cycle is returned as the vertex order along it. The search is
// deterministic for a given graph and budget.
func HamiltonianCycle(g *graph.Graph, budget int) ([]int32, bool) {
	n := g.N()
	if n < 3 {
		return nil, false
	}
	for v := int32(0); int(v) < n; v++ {
		if g.Degree(v) < 2 {
			return nil, false
		}
	}
	if !connected(g) {
		return nil, false
	}
	start := int32(0)
	for v := int32(1); int(v) < n; v++ {
		if g.Degree(v) < g.Degree(start) {
			start = v
		}
	}
	rng := rand.New(rand.NewPCG(uint64(n), uint64(g.M())))
	const restarts = 8
	share := max(budget/restarts, n)
	for budget > 0 {
		cyc, ok, used := hamiltonRun(g, start, min(share, budget), rng)
		if ok {
			return cyc, true
		}
		if used < min(share, budget) {
			return nil, false // the search space is exhausted: no cycle
		}
		budget -= used
		share *= 2
	}
	return nil, false
}

func connected(g *graph.Graph) bool {
	n := g.N()
	seen := make([]bool, n)
	stack := []int32{0}
	seen[0] = true
	count := 1
	for len(stack) > 0 {
		v := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		for _, w := range g.Neighbors(v) {
			if !seen[w] {
				seen[w] = true
				count++
				stack = append(stack, w)
			}
		}
	}
	return count == n
}

// hamiltonRun is one backtracking search with at most budget extensions.
func hamiltonRun(g *graph.Graph, start int32, budget int, rng *rand.Rand) ([]int32, bool, int) {
	n := g.N()
	free := make([]int32, n) // unvisited neighbours of each vertex
	onPath := make([]bool, n)
	for v := range free {
		free[v] = int32(g.Degree(int32(v)))
	}
	visit := func(v int32) {
		onPath[v] = true
		for _, w := range g.Neighbors(v) {
			free[w]--
		}
	}
	leave := func(v int32) {
		onPath[v] = false
		for _, w := range g.Neighbors(v) {
			free[w]++
		}
	}
	path := []int32{start}
	visit(start)
	// cand holds, per depth, the neighbours still to try, best last.
	var cand []int32
	var candStart []int // candidates of depth d are cand[candStart[d]:...]
	push := func(v int32) {
		base := len(cand)
		candStart = append(candStart, base)
		for _, w := range g.Neighbors(v) {
			if !onPath[w] {
				cand = append(cand, w)
			}
		}
		c := cand[base:]
		rng.Shuffle(len(c), func(i, j int) { c[i], c[j] = c[j], c[i] })
		slices.SortStableFunc(c, func(a, b int32) int { return int(free[b]) - int(free[a]) })
	}
	push(start)
	// viable prunes the new end of the path: every unvisited neighbour of
	// the previous end still needs two ways in and out, and a neighbour of
	// the end with only one other way must come next.
	viable := func() bool {
		top := len(path) - 1
		v, u := path[top], path[top-1]
		exits := func(w int32) int32 {
			x := free[w]
			if g.HasEdge(w, start) {
				x++
			}
			return x
		}
		for _, w := range g.Neighbors(u) {
			if onPath[w] {
				continue
			}
			x := exits(w)
			if g.HasEdge(w, v) {
				x++
			}
			if x < 2 {
				return false
			}
		}
		lo := candStart[top]
		forced := int32(-1)
		for _, w := range cand[lo:] {
			if exits(w) <= 1 {
				if forced >= 0 {
					return false
				}
				forced = w
			}
		}
		if forced >= 0 {
			cand = append(cand[:lo], forced)
		}
		return true
	}
	used := 0
	for used < budget {
		top := len(path) - 1
		if len(path) == n && g.HasEdge(path[top], start) {
			return path, true, used
		}
		lo := candStart[top]
		if len(path) == n || len(cand) == lo {
			// Dead end: backtrack.
			if top == 0 {
				return nil, false, used
			}
			cand = cand[:lo]
			candStart = candStart[:top]
			leave(path[top])
			path = path[:top]
			continue
		}
		w := cand[len(cand)-1]
		cand = cand[:len(cand)-1]
		if onPath[w] {
			continue
		}
		used++
		path = append(path, w)
		visit(w)
		push(w)
		if len(path) < n-1 && !viable() {
			cand = cand[:candStart[len(path)-1]]
		}
	}
	return nil, false, used
}

// HamiltonianTwoPage looks for a Hamiltonian cycle of the planar graph g
// (with HamiltonianCycle and the given budget) and turns it into a 2-page
// stack layout, after F. Bernhart and P. C. Kainen, "The book thickness of a
// graph", JCTB 27 (1979): the cycle is the spine, and in a planar embedding
// the edges inside the cycle go on one page and those outside on the other;
// the cycle edges go on page 1. emb is a planar embedding of g, or nil to
// compute one. The layout is checked before it is returned; false means no
// cycle was found within the budget, g is not planar, or emb is not a planar
// embedding of g.
func HamiltonianTwoPage(g *graph.Graph, emb *planarcert.Embedding, budget int) (*cert.Layout, bool) {
	n := g.N()
	if n < 3 {
		order := make([]int32, n)
		for i := range order {
			order[i] = int32(i)
		}
		page := make([]int32, g.M())
		for i := range page {
			page[i] = 1
		}
		return &cert.Layout{Kind: cert.Stack, PageKinds: []cert.Kind{cert.Stack, cert.Stack}, Order: order, Page: page}, true
	}
	if emb == nil {
		var ok bool
		if emb, ok = planar.Embed(g); !ok {
			return nil, false
		}
	}
	if len(emb.Rotation) != n {
		return nil, false
	}
	cyc, ok := HamiltonianCycle(g, budget)
	if !ok {
		return nil, false
	}
	return cycleTwoPage(g, emb, cyc)
}

// cycleTwoPage turns the Hamiltonian cycle cyc of g and the planar
// embedding emb into a 2-page stack layout with cyc as the spine, and
// checks it for crossings; false if cyc is not a Hamiltonian cycle of g
// or emb not a planar embedding of g.
func cycleTwoPage(g *graph.Graph, emb *planarcert.Embedding, cyc []int32) (*cert.Layout, bool) {
	n := g.N()
	if len(cyc) != n || len(emb.Rotation) != n {
		return nil, false
	}
	pos := make([]int32, n)
	for i, v := range cyc {
		pos[v] = int32(i)
	}
	page := make([]int32, g.M())
	for u := int32(0); int(u) < n; u++ {
		rot := emb.Rotation[u]
		succ := cyc[(pos[u]+1)%int32(n)]
		pred := cyc[(pos[u]+int32(n)-1)%int32(n)]
		is := slices.Index(rot, succ)
		if is < 0 || len(rot) != g.Degree(u) {
			return nil, false
		}
		// Walk the rotation from succ: neighbours before pred are on one
		// side of the cycle, those after it on the other.
		side := int32(1)
		for k := 1; k < len(rot); k++ {
			w := rot[(is+k)%len(rot)]
			if w == pred {
				side = 2
				continue
			}
			e := g.EdgeIndex(u, w)
			if e < 0 {
				return nil, false
			}
			if u < w { // each edge is placed from its lower end
				page[e] = side
			}
		}
	}
	for i := 0; i < n; i++ {
		e := g.EdgeIndex(cyc[i], cyc[(i+1)%n])
		if e < 0 {
			return nil, false
		}
		page[e] = 1
	}
	l := &cert.Layout{Kind: cert.Stack, PageKinds: []cert.Kind{cert.Stack, cert.Stack}, Order: cyc, Page: page}
	if !twoPageValid(g, pos, page) {
		return nil, false
	}
	return l, true
}

// twoPageValid checks that no two edges on the same page cross, by a stack
// scan of each page's edges sorted by left end and then longest first.
func twoPageValid(g *graph.Graph, pos []int32, page []int32) bool {
	for _, p := range page {
		if p != 1 && p != 2 {
			return false // an edge the rotation system did not place
		}
	}
	type span struct{ l, r int32 }
	for p := int32(1); p <= 2; p++ {
		var spans []span
		for e, x := range g.Edges() {
			if page[e] == p {
				a, b := pos[x.U], pos[x.V]
				spans = append(spans, span{min(a, b), max(a, b)})
			}
		}
		slices.SortFunc(spans, func(x, y span) int {
			if x.l != y.l {
				return int(x.l - y.l)
			}
			return int(y.r - x.r)
		})
		var open []span
		for _, s := range spans {
			for len(open) > 0 && open[len(open)-1].r <= s.l {
				open = open[:len(open)-1]
			}
			if len(open) > 0 && s.r > open[len(open)-1].r {
				return false
			}
			open = append(open, s)
		}
	}
	return true
}
