package heuristic

import "spinecert.dev/graph"

// queuePages assigns queue pages for a fixed spine order with the fewest
// pages possible for that order. Two edges nest when a < c < d < b; nesting
// is a partial order on the edges, and a queue page is a set of pairwise
// non-nesting edges, i.e. an antichain. By Mirsky's theorem (L. Mirsky, "A
// dual of Dilworth's decomposition theorem", Amer. Math. Monthly 78, 1971)
// the least number of antichains covering a partial order is the length of
// its longest chain, reached by giving every edge 1 + the highest page of an
// edge nesting over it. Edges are swept by left end; a Fenwick tree over
// right ends answers "highest page among edges with a < l and b > r".
func queuePages(g *graph.Graph, order []int32) ([]int32, int32) {
	n := g.N()
	ls, rs := spans(g, order)
	sorted := sortByLeft(ls, rs, n, false)
	page := make([]int32, len(ls))
	fen := make([]int32, n+1) // prefix max over key n-1-b, 1-based
	var k int32
	for i := 0; i < len(sorted); {
		j := i
		l := ls[sorted[i]]
		for j < len(sorted) && ls[sorted[j]] == l {
			e := sorted[j]
			// edges f with b_f > r have key < n-1-r: prefix of length n-1-r
			best := int32(0)
			for x := n - 1 - int(rs[e]); x > 0; x &= x - 1 {
				best = max(best, fen[x])
			}
			page[e] = best + 1
			k = max(k, best+1)
			j++
		}
		for ; i < j; i++ {
			e := sorted[i]
			p := page[e]
			for x := n - int(rs[e]); x <= n; x += x & -x {
				if fen[x] >= p {
					break
				}
				fen[x] = p
			}
		}
	}
	return page, k
}
