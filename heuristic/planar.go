package heuristic

import (
	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

// rotation is a planar embedding in flat form: the neighbours of v in cyclic
// order are nb[off[v]:off[v+1]], and twin[i] is the slot of the reverse
// dart (the slot of v in the rotation of nb[i]).
type rotation struct {
	off, nb, twin []int32
}

// newRotation flattens emb and pairs every dart with its reverse, in O(n+m).
func newRotation(emb *planarcert.Embedding) *rotation {
	n := len(emb.Rotation)
	off := make([]int32, n+1)
	for v, r := range emb.Rotation {
		off[v+1] = off[v] + int32(len(r))
	}
	nb := make([]int32, off[n])
	for v, r := range emb.Rotation {
		copy(nb[off[v]:], r)
	}
	// Bucket the darts by head: bucket of w holds the slots i with nb[i] = w,
	// in increasing order of tail.
	fill := make([]int32, n+1)
	copy(fill, off)
	into := make([]int32, off[n])
	for v := 0; v < n; v++ {
		for i := off[v]; i < off[v+1]; i++ {
			w := nb[i]
			into[fill[w]] = i
			fill[w]++
		}
	}
	// For vertex w, the darts into w come from each neighbour v once; the
	// reverse of slot i (v→w) is the slot of v in w's rotation.
	slot := make([]int32, n)
	twin := make([]int32, off[n])
	tail := make([]int32, off[n])
	for v := 0; v < n; v++ {
		for i := off[v]; i < off[v+1]; i++ {
			tail[i] = int32(v)
		}
	}
	for w := 0; w < n; w++ {
		for j := off[w]; j < off[w+1]; j++ {
			slot[nb[j]] = j
		}
		for _, i := range into[off[w]:off[w+1]] {
			twin[i] = slot[tail[i]]
		}
	}
	return &rotation{off: off, nb: nb, twin: twin}
}

// planarEmbedding returns the rotation of g when g is planar, else nil.
func planarEmbedding(g *graph.Graph) *rotation {
	if g.M() > 3*g.N() {
		return nil
	}
	emb, ok := planar.Embed(g)
	if !ok {
		return nil
	}
	return newRotation(emb)
}

// leftBFS returns a BFS order from root in which every vertex lists its
// unvisited neighbours in rotation order starting just after the dart from
// its BFS parent, so that each layer runs around the layer before it in the
// direction of the embedding; components not reached from root follow, each
// from its least vertex. For a layered order like this, edges between
// consecutive layers cross the layers without nesting when the layers are
// simple (L. S. Heath and A. L. Rosenberg, "Laying out graphs using queues",
// SIAM J. Comput. 21(5), 1992: leveled-planar graphs have 1-queue layouts).
//
// The root's neighbours start at slot first of its rotation: the layers
// then have their seam there, which is best placed on the outer face.
func (r *rotation) leftBFS(root, first int32) []int32 {
	n := len(r.off) - 1
	order := make([]int32, 0, n)
	seen := make([]bool, n)
	in := make([]int32, n) // slot of the dart to the parent, or -1
	for c := -1; c < n; c++ {
		v := root
		if c >= 0 {
			v = int32(c)
		}
		if seen[v] {
			continue
		}
		seen[v] = true
		in[v] = -1
		head := len(order)
		order = append(order, v)
		for ; head < len(order); head++ {
			u := order[head]
			d := r.off[u+1] - r.off[u]
			rel := first - 1
			if u != root {
				rel = -1
			}
			if in[u] >= 0 {
				rel = in[u] - r.off[u]
			}
			for k := int32(1); k <= d; k++ {
				i := r.off[u] + (rel+k)%d
				w := r.nb[i]
				if !seen[w] {
					seen[w] = true
					in[w] = r.twin[i]
					order = append(order, w)
				}
			}
		}
	}
	return order
}
