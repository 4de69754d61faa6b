package heuristic

import (
	"cmp"
	"slices"
)

// peelOrder returns a spine order for stack layouts of a plane graph
// (rotation r), from root. The layers are the BFS layers from root, which
// in a triangulation peel the embedding ring by ring around root. Every
// vertex of layer i+1 hangs below the layer-i neighbour that comes first on
// the order of layer i, and the vertices hanging below one vertex come in
// clockwise rotation order from the dart to its own parent; the order is
// the preorder of that tree, so every tree edge nests and the edges
// between two rings run mostly side by side. It is a spine candidate only:
// no page bound is claimed for it. O(n log n + m).
func (r *rotation) peelOrder(root int32) []int32 {
	n := len(r.off) - 1
	level := make([]int32, n)
	for i := range level {
		level[i] = -1
	}
	parent := make([]int32, n)
	up := make([]int32, n)   // slot of the dart to the parent, in v's rotation; -1 at a root
	rank := make([]int32, n) // position within its layer
	type placed struct {
		key uint64 // parent's rank, then rotation position around it: unique within a layer
		w   int32
	}
	var keys []placed
	order := make([]int32, 0, n) // the layers, one after the other
	for c := -1; c < n; c++ {
		v := root
		if c >= 0 {
			v = int32(c)
		}
		if level[v] >= 0 {
			continue
		}
		level[v], parent[v], up[v] = 0, -1, -1
		layer := len(order)
		order = append(order, v)
		for layer < len(order) {
			prev := order[layer:]
			end := len(order)
			for _, u := range prev {
				for i := r.off[u]; i < r.off[u+1]; i++ {
					if w := r.nb[i]; level[w] < 0 {
						level[w] = level[u] + 1
						order = append(order, w)
					}
				}
			}
			next := order[end:]
			keys = keys[:0]
			for _, w := range next {
				best, slot := int32(-1), int32(-1)
				for i := r.off[w]; i < r.off[w+1]; i++ {
					if u := r.nb[i]; level[u] == level[w]-1 && (best < 0 || rank[u] < rank[best]) {
						best, slot = u, i
					}
				}
				parent[w], up[w] = best, slot
				// clockwise position of w around best, from best's parent dart
				d := r.off[best+1] - r.off[best]
				base := int32(0)
				if up[best] >= 0 {
					base = up[best] - r.off[best]
				}
				k := (d - (r.twin[slot]-r.off[best]-base+d)%d) % d
				keys = append(keys, placed{uint64(rank[best])<<32 | uint64(k), w})
			}
			slices.SortFunc(keys, func(a, b placed) int { return cmp.Compare(a.key, b.key) })
			for i, p := range keys {
				next[i] = p.w
				rank[p.w] = int32(i)
			}
			layer = end
		}
	}
	// The layers are sorted by (parent's rank, rotation position), so the
	// children of each vertex are contiguous and in order within the next
	// layer: collect them, then walk the tree in preorder.
	first := make([]int32, n) // index in order of the first child, or -1
	count := make([]int32, n)
	for i := range first {
		first[i] = -1
	}
	for i, w := range order {
		if p := parent[w]; p >= 0 {
			if first[p] < 0 {
				first[p] = int32(i)
			}
			count[p]++
		}
	}
	out := make([]int32, 0, n)
	var stack []int32
	for _, v := range order {
		if parent[v] >= 0 {
			continue
		}
		stack = append(stack[:0], v)
		for len(stack) > 0 {
			u := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			out = append(out, u)
			for i := first[u] + count[u] - 1; count[u] > 0 && i >= first[u]; i-- {
				stack = append(stack, order[i])
			}
		}
	}
	return out
}
