package pagenumber

import (
	"fmt"

	"spinecert.dev/graph"
	"spinecert.dev/planar/planarcert"
	"spinecert.dev/toughcert"
)

// toughnessBound returns the bound of 3 stack pages for a maximal planar
// graph g (n >= 3, m = 3n − 6, emb a checked planar embedding) when the
// search finds a set S whose removal leaves more than |S| components and
// toughcert.Check accepts it: such a graph is not Hamiltonian (Chvátal,
// "Tough graphs and Hamiltonian circuits", Discrete Math. 5, 1973), and a
// maximal planar graph with a 2-page layout is (Bernhart and Kainen 1979;
// the argument is in package toughcert). Nothing the search returns is used
// unless the checker accepts it.
func toughnessBound(g *graph.Graph, emb *planarcert.Embedding) (Bound, bool) {
	n, m := g.N(), g.M()
	if n < 3 || m != 3*n-6 {
		return Bound{}, false
	}
	s := testOnlyFindToughSet(g)
	if len(s) == 0 {
		return Bound{}, false
	}
	c, err := toughcert.Check(g, &toughcert.Cert{Embedding: emb, Removed: s})
	if err != nil {
		return Bound{}, false
	}
	return Bound{3, SourceToughness, fmt.Sprintf("maximal planar (%d = 3n-6 edges, planar embedding checked) and removing %d vertices leaves %d components (checked): not Hamiltonian, since Hamiltonian graphs are 1-tough (Chvátal 1973), and a maximal planar graph on 2 pages is Hamiltonian (Bernhart & Kainen 1979)", m, len(s), c)}, true
}

// testOnlyFindToughSet is the search that toughnessBound uses; tests replace
// it to feed the checker arbitrary sets.
var testOnlyFindToughSet = findToughSet

// findToughSet looks for a non-empty vertex set S of g whose removal leaves
// more than |S| components, in time O(m α(n)) per rule. Each rule takes an
// independent set I greedily from the vertices of degree at most d, lowest
// degree first, and lets S be the neighbours of I: every vertex of I is then
// a component of G − S on its own. The set is then pruned: a vertex of S
// whose remaining neighbours lie in at most one component is put back,
// which lowers |S| and loses no component. On a Kleetope the stacked
// vertices (degree 3, pairwise non-adjacent) become I and S the old
// vertices: an old vertex has degree at least 6 and a stacked one 3, so the
// rule for degree 3 takes all 2n − 4 stacked vertices, and every old vertex
// touches three of them and stays in S — a surplus of n − 4, found for
// every n >= 5. The rule with the largest surplus (components − |S|) wins;
// nil when none has a positive one with S non-empty (pruning can empty S,
// and the empty set proves nothing). The result is a proposal:
// toughcert.Check decides.
func findToughSet(g *graph.Graph) []int32 {
	n := g.N()
	if n < 3 {
		return nil
	}
	maxDeg := 0
	for v := range n {
		maxDeg = max(maxDeg, g.Degree(int32(v)))
	}
	// Vertices by degree, lowest first (counting sort).
	count := make([]int, maxDeg+2)
	for v := range n {
		count[g.Degree(int32(v))+1]++
	}
	for d := 1; d < len(count); d++ {
		count[d] += count[d-1]
	}
	byDeg := make([]int32, n)
	pos := append([]int(nil), count...)
	for v := range n {
		d := g.Degree(int32(v))
		byDeg[pos[d]] = int32(v)
		pos[d]++
	}
	var best []int32
	bestSurplus := 0
	for _, d := range []int{3, 4, 5, 6, maxDeg} {
		if d > maxDeg {
			d = maxDeg
		}
		s, c := toughSetRule(g, byDeg[:count[d+1]])
		if len(s) > 0 && c-len(s) > bestSurplus {
			best, bestSurplus = s, c-len(s)
		}
	}
	return best
}

// toughSetRule builds S from a greedy independent set of the candidates
// (in order) and prunes it; it returns S and the components of G − S.
func toughSetRule(g *graph.Graph, candidates []int32) ([]int32, int) {
	n := g.N()
	const (
		free = iota
		inI
		inS
	)
	mark := make([]uint8, n)
	for _, v := range candidates {
		if mark[v] != free {
			continue
		}
		mark[v] = inI
		for _, w := range g.Neighbors(v) {
			mark[w] = inS
		}
	}
	parent := make([]int32, n)
	for i := range parent {
		parent[i] = int32(i)
	}
	find := func(x int32) int32 {
		for parent[x] != x {
			parent[x] = parent[parent[x]]
			x = parent[x]
		}
		return x
	}
	size := 0
	comps := 0
	for v := range n {
		if mark[v] == inS {
			size++
			continue
		}
		comps++
	}
	for _, e := range g.Edges() {
		if mark[e.U] == inS || mark[e.V] == inS {
			continue
		}
		if a, b := find(e.U), find(e.V); a != b {
			parent[a] = b
			comps--
		}
	}
	// Prune: a vertex of S that touches at most one component goes back
	// into the graph. Putting a vertex back never merges two components, so
	// no vertex kept in a pass can be put back later: the second pass
	// changes nothing and ends the loop.
	for changed := true; changed; {
		changed = false
		for v := range n {
			if mark[v] != inS {
				continue
			}
			root, several := int32(-1), false
			for _, w := range g.Neighbors(int32(v)) {
				if mark[w] == inS {
					continue
				}
				r := find(w)
				if root < 0 {
					root = r
				} else if r != root {
					several = true
					break
				}
			}
			if several {
				continue
			}
			mark[v] = free
			size--
			changed = true
			if root < 0 {
				comps++
			} else {
				parent[v] = root
			}
		}
	}
	s := make([]int32, 0, size)
	for v := range n {
		if mark[v] == inS {
			s = append(s, int32(v))
		}
	}
	return s, comps
}
