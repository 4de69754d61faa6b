package planar

import "slices"

// shrink narrows a fresh search (no required edges yet) to a thin non-planar
// subgraph before the exact rounds run, so that those rounds test small
// graphs even when the obstruction is long:
//
//  1. The shortest non-planar prefix work[:k] of the breadth-first order is
//     found by doubling and binary search; e = work[k-1] lies in every
//     non-planar subgraph of it, because P = work[:k-1] is planar.
//  2. A shortest path Q in P joins the ends of e (it exists: an edge between
//     two components of a planar graph leaves it planar).
//  3. For d = 1, 2, 4, … the tube of P around Q — the edges of P whose ends
//     both lie within distance d of Q — is tested together with e; the first
//     non-planar tube becomes the work graph, with e required. The search
//     ends at the latest when the tube is all of P's component.
//
// Every planarity test here is linear, and there are O(log m) of them.
func (ks *kurSearch) shrink() {
	if len(ks.required) != 0 || len(ks.work) == 0 {
		return
	}
	hi := 1
	for hi < len(ks.work) && ks.planarWith(hi) {
		hi *= 2
	}
	hi = min(hi, len(ks.work))
	lo := hi / 2
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if ks.planarWith(mid) {
			lo = mid
		} else {
			hi = mid
		}
	}
	e := ks.work[hi-1]
	p := ks.work[:hi-1]
	n := ks.g.N()

	// Adjacency of P by edge index.
	off := make([]int32, n+1)
	for _, s := range p {
		off[ks.ea[s]+1]++
		off[ks.eb[s]+1]++
	}
	for i := 0; i < n; i++ {
		off[i+1] += off[i]
	}
	inc := make([]int32, 2*len(p))
	fill := slices.Clone(off[:n])
	for _, s := range p {
		inc[fill[ks.ea[s]]] = s
		fill[ks.ea[s]]++
		inc[fill[ks.eb[s]]] = s
		fill[ks.eb[s]]++
	}
	fill = nil

	// Q: breadth-first search in P from one end of e to the other.
	dist := make([]int32, n)
	from := make([]int32, n)
	for i := range dist {
		dist[i] = -1
	}
	u, v := ks.ea[e], ks.eb[e]
	queue := make([]int32, 0, 1024)
	queue = append(queue, u)
	dist[u] = 0
	for h := 0; h < len(queue) && dist[v] < 0; h++ {
		x := queue[h]
		for _, s := range inc[off[x]:off[x+1]] {
			y := ks.ea[s] ^ ks.eb[s] ^ x
			if dist[y] < 0 {
				dist[y], from[y] = dist[x]+1, x
				queue = append(queue, y)
			}
		}
	}
	if dist[v] < 0 {
		// Cannot happen for a planar P; keep the prefix as it is.
		ks.work = ks.work[:hi]
		return
	}
	// Distances from Q, by a breadth-first search from all of Q at once.
	for _, x := range queue {
		dist[x] = -1
	}
	queue = queue[:0]
	for x := v; ; x = from[x] {
		dist[x] = 0
		queue = append(queue, x)
		if x == u {
			break
		}
	}
	var tube []int32
	for d, h := int32(1), 0; ; d *= 2 {
		for ; h < len(queue) && dist[queue[h]] < d; h++ {
			x := queue[h]
			for _, s := range inc[off[x]:off[x+1]] {
				y := ks.ea[s] ^ ks.eb[s] ^ x
				if dist[y] < 0 {
					dist[y] = dist[x] + 1
					queue = append(queue, y)
				}
			}
		}
		tube = tube[:0]
		for _, s := range p {
			if a, b := dist[ks.ea[s]], dist[ks.eb[s]]; a >= 0 && b >= 0 {
				tube = append(tube, s)
			}
		}
		ks.required = append(ks.required[:0], e)
		ks.work = tube
		if h == len(queue) || !ks.planarWith(len(tube)) {
			break
		}
	}
	ks.req[e] = true
	// Candidates nearest to Q first.
	slices.SortStableFunc(tube, func(x, y int32) int {
		return int(max(dist[ks.ea[x]], dist[ks.eb[x]]) - max(dist[ks.ea[y]], dist[ks.eb[y]]))
	})
	ks.work = tube
	ks.reduce()
}
