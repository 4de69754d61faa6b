package heuristic

import (
	"math/rand/v2"
	"time"

	"spinecert.dev/graph"
)

// posaCycle looks for a Hamiltonian cycle of g by rotation and extension
// (L. Pósa, "Hamiltonian circuits in random graphs", Discrete Math. 14,
// 1976): a path is extended at its end while the end has a neighbour off
// the path, the neighbour with the fewest neighbours off the path first
// (H. C. von Warnsdorff's rule for knight's tours, 1823), and otherwise
// rotated: for a neighbour x of the end e on the path, the part of the path
// after x is reversed, so that e follows x and the vertex that followed x
// is the new end. A Hamiltonian path is rotated the same way until its end
// is a neighbour of its start. Rotations whose new end can be extended (or
// closes the cycle) are preferred, the one reversing the fewest vertices
// first; otherwise a rotation is chosen at random. The search gives up
// (false) after maxRotations rotations or once deadline (when not zero)
// has passed. It is a heuristic: false says nothing about g.
func posaCycle(g *graph.Graph, start int32, rng *rand.Rand, maxRotations int, deadline time.Time) ([]int32, bool) {
	n := g.N()
	if n < 3 {
		return nil, false
	}
	path := make([]int32, 0, n)
	at := make([]int32, n)
	free := make([]int32, n) // neighbours off the path
	for v := range at {
		at[v] = -1
		free[v] = int32(g.Degree(int32(v)))
	}
	add := func(v int32) {
		at[v] = int32(len(path))
		path = append(path, v)
		for _, w := range g.Neighbors(v) {
			free[w]--
		}
	}
	reverse := func(i int) { // reverse path[i:]
		for a, b := i, len(path)-1; a < b; a, b = a+1, b-1 {
			path[a], path[b] = path[b], path[a]
			at[path[a]], at[path[b]] = int32(a), int32(b)
		}
		if i == len(path)-1 {
			at[path[i]] = int32(i)
		}
	}
	// good reports whether end e of a path can be extended or, on a
	// Hamiltonian path, closes the cycle.
	good := func(e int32) bool {
		if len(path) < n {
			return free[e] > 0
		}
		return g.HasEdge(e, path[0])
	}
	add(start)
	rotations := 0
	for {
		e := path[len(path)-1]
		if len(path) == n && g.HasEdge(e, path[0]) {
			return path, true
		}
		if len(path) < n && free[e] > 0 {
			best, bestFree, ties := int32(-1), int32(1<<30), 0
			for _, w := range g.Neighbors(e) {
				if at[w] >= 0 {
					continue
				}
				switch f := free[w]; {
				case f < bestFree:
					best, bestFree, ties = w, f, 1
				case f == bestFree:
					ties++
					if rng.IntN(ties) == 0 {
						best = w
					}
				}
			}
			add(best)
			continue
		}
		if rotations >= maxRotations {
			return nil, false
		}
		if rotations&255 == 0 && past(deadline) {
			return nil, false
		}
		rotations++
		last := len(path) - 1
		pick, fallback, seen := -1, -1, 0
		for _, x := range g.Neighbors(e) {
			i := int(at[x])
			if i < 0 || i >= last-1 {
				continue
			}
			seen++
			if rng.IntN(seen) == 0 {
				fallback = i
			}
			if good(path[i+1]) && i > pick {
				pick = i
			}
		}
		if pick < 0 {
			pick = fallback
		}
		if pick < 0 {
			// The end's only neighbour on the path is its predecessor:
			// work at the other end.
			reverse(0)
			continue
		}
		reverse(pick + 1)
	}
}
