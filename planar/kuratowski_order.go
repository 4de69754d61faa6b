package planar

import (
	"cmp"
	"slices"
)

// reorder puts the candidates in the order for the next round: first the
// edges of a depth-first spanning forest of the work graph, grown from the
// ends of the required edges, in the order the search met them; then the
// other candidates by breadth-first distance from the ends of the required
// edges.
//
// With the forest first, the shortest non-planar prefix that the round finds
// is (part of) the forest plus the fewest non-tree edges that the order
// allows, and whatever the round keeps reduces to few super-edges: a forest
// plus j edges has no vertex of degree one or two left after pruning and
// suppressing but at most 2j branch vertices. A depth-first forest follows
// long paths, so a long thin obstruction (a subdivided K3,3 along a strip of
// a grid, say) tends to lie along its branches, with only its few rungs
// among the non-tree edges. The order affects only how fast the search is,
// never what it returns being edge-minimal.
func (ks *kurSearch) reorder() {
	if len(ks.required) == 0 || len(ks.work) == 0 {
		return
	}
	all, nv, off := ks.incidences()
	lid := ks.vmap
	adj := make([]int32, off[nv])
	iter := make([]int32, nv+1)
	copy(iter, off)
	for _, s := range all {
		a, b := lid[ks.ea[s]], lid[ks.eb[s]]
		adj[iter[a]] = s
		iter[a]++
		adj[iter[b]] = s
		iter[b]++
	}
	other := func(s, v int32) int32 { return lid[ks.ea[s]] ^ lid[ks.eb[s]] ^ v }

	ks.markEpoch++
	if len(ks.mark) < len(ks.ea) {
		ks.mark = append(ks.mark, make([]int32, len(ks.ea)-len(ks.mark))...)
	}
	copy(iter, off)
	seen := make([]bool, nv)
	order := make([]int32, 0, len(ks.work))
	var stack []int32
	dfs := func(r int32) {
		if seen[r] {
			return
		}
		seen[r] = true
		stack = append(stack[:0], r)
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			if iter[v] == off[v+1] {
				stack = stack[:len(stack)-1]
				continue
			}
			s := adj[iter[v]]
			iter[v]++
			if w := other(s, v); !seen[w] {
				seen[w] = true
				if !ks.req[s] {
					order = append(order, s)
					ks.mark[s] = ks.markEpoch
				}
				stack = append(stack, w)
			}
		}
	}
	for _, s := range ks.required {
		dfs(lid[ks.ea[s]])
	}
	for v := int32(0); int(v) < nv; v++ {
		dfs(v)
	}

	dist := make([]int32, nv)
	for i := range dist {
		dist[i] = -1
	}
	queue := stack[:0]
	for _, s := range ks.required {
		for _, v := range [2]int32{lid[ks.ea[s]], lid[ks.eb[s]]} {
			if dist[v] < 0 {
				dist[v] = 0
				queue = append(queue, v)
			}
		}
	}
	for h := 0; h < len(queue); h++ {
		v := queue[h]
		for _, s := range adj[off[v]:off[v+1]] {
			if w := other(s, v); dist[w] < 0 {
				dist[w] = dist[v] + 1
				queue = append(queue, w)
			}
		}
	}
	key := func(s int32) int32 {
		a, b := dist[lid[ks.ea[s]]], dist[lid[ks.eb[s]]]
		if a < 0 || b < 0 {
			return 1 << 30
		}
		return max(a, b)
	}
	rest := make([]int32, 0, len(ks.work)-len(order))
	for _, s := range ks.work {
		if ks.mark[s] != ks.markEpoch {
			rest = append(rest, s)
		}
	}
	slices.SortStableFunc(rest, func(x, y int32) int { return cmp.Compare(key(x), key(y)) })
	ks.work = append(order, rest...)
}
