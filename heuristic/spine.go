package heuristic

import (
	"math/rand/v2"
	"slices"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// spines produces the candidate spine orders for one search.
type spines struct {
	g    *graph.Graph
	kind cert.Kind
	rng  *rand.Rand
	off  []int32 // CSR offsets of the adjacency (neighbours of v: adj[off[v]:off[v+1]])
	adj  []int32
	rot  *rotation // planar embedding, or nil
}

func newSpines(g *graph.Graph, kind cert.Kind, seed int64) *spines {
	n := g.N()
	off := make([]int32, n+1)
	for v := 0; v < n; v++ {
		off[v+1] = off[v] + int32(g.Degree(int32(v)))
	}
	adj := make([]int32, off[n])
	for v := 0; v < n; v++ {
		copy(adj[off[v]:], g.Neighbors(int32(v)))
	}
	return &spines{g: g, kind: kind, rng: rand.New(rand.NewPCG(uint64(seed), 0x9e3779b97f4a7c15)), off: off, adj: adj}
}

// candidate returns the i-th spine order. For stack layouts candidate 0 is
// a DFS that always steps to the unvisited neighbour with the fewest
// unvisited neighbours (Warnsdorff's rule, which tends to find long paths)
// from a vertex of least degree, 1 a DFS in input order from vertex 0, 2 the
// input order, and the rest Warnsdorff DFS from random roots with shuffled
// ties. For queue layouts 0 is a BFS in input order from vertex 0, 1 the
// input order, 2 a BFS with neighbours by ascending degree from a far
// vertex, and the rest BFS with shuffled neighbours from random roots. For
// planar graphs an order guided by the embedding is put in and the others
// move up by one: for queue layouts second, a BFS (leftBFS) from a vertex
// far from vertex 0; for stack layouts third, the ring-by-ring order of
// peelOrder from a vertex of least degree, and from then on every other
// candidate is a peelOrder from a random root.
func (s *spines) candidate(i int) []int32 {
	n := s.g.N()
	if n == 0 {
		return nil
	}
	at := 1 // where the embedding-guided order goes
	if s.kind == cert.Stack {
		at = 2
	}
	if i >= at {
		if i == at {
			s.rot = planarEmbedding(s.g)
		}
		if s.rot != nil {
			if i == at {
				if s.kind == cert.Queue {
					return s.planarQueue()
				}
				return s.rot.peelOrder(s.minDegree())
			}
			if s.kind == cert.Stack && (i-at)%2 == 1 {
				return s.rot.peelOrder(int32(s.rng.IntN(n)))
			}
			i--
		}
	}
	switch {
	case i == 1 && s.kind == cert.Stack:
		return s.traverse(0, false)
	case i == 2 && s.kind == cert.Stack || i == 1:
		order := make([]int32, n)
		for v := range order {
			order[v] = int32(v)
		}
		return order
	case i == 0 && s.kind == cert.Stack:
		return s.traverse(s.minDegree(), true)
	case i == 0:
		return s.traverse(0, false)
	case i == 2:
		s.sortByDegree()
		far := s.traverse(0, false)
		return s.traverse(far[len(far)-1], false)
	}
	s.shuffle()
	return s.traverse(int32(s.rng.IntN(n)), s.kind == cert.Stack)
}

// planarQueue returns the best of the embedding-guided BFS orders from a
// vertex far from vertex 0 (found by a first BFS), with the root's rotation
// starting at each of its first few slots.
func (s *spines) planarQueue() []int32 {
	far := s.rot.leftBFS(0, 0)
	root := far[s.componentEnd(far)]
	var best []int32
	bestK := int32(-1)
	for j := 0; j < min(planarStarts, s.g.Degree(root)); j++ {
		order := s.rot.leftBFS(root, int32(j))
		if _, k := queuePages(s.g, order); bestK < 0 || k < bestK {
			best, bestK = order, k
		}
	}
	if best == nil {
		best = far
	}
	return best
}

// planarStarts bounds the root slots planarQueue tries.
const planarStarts = 4

// componentEnd returns the index in a BFS order of the last vertex of the
// component of its first vertex.
func (s *spines) componentEnd(order []int32) int {
	seen := make([]bool, s.g.N())
	seen[order[0]] = true
	last := 0
	for i := 0; i < len(order) && seen[order[i]]; i++ {
		last = i
		for _, w := range s.adj[s.off[order[i]]:s.off[order[i]+1]] {
			seen[w] = true
		}
	}
	return last
}

func (s *spines) minDegree() int32 {
	root := int32(0)
	for v := 1; v < s.g.N(); v++ {
		if s.g.Degree(int32(v)) < s.g.Degree(root) {
			root = int32(v)
		}
	}
	return root
}

func (s *spines) sortByDegree() {
	g := s.g
	for v := 0; v < g.N(); v++ {
		nb := s.adj[s.off[v]:s.off[v+1]]
		slices.SortStableFunc(nb, func(a, b int32) int { return g.Degree(a) - g.Degree(b) })
	}
}

func (s *spines) shuffle() {
	for v := 0; v+1 < len(s.off); v++ {
		nb := s.adj[s.off[v]:s.off[v+1]]
		s.rng.Shuffle(len(nb), func(i, j int) { nb[i], nb[j] = nb[j], nb[i] })
	}
}

// warnsdorffMax is the largest degree at which the DFS looks at every
// neighbour for Warnsdorff's rule; higher-degree vertices take the next
// unvisited neighbour in adjacency order, which keeps the DFS near-linear.
const warnsdorffMax = 64

// traverse returns a DFS preorder (stack kind) or BFS order (queue kind)
// starting at root, then at every unvisited vertex in index order. With
// warnsdorff the DFS steps to the unvisited neighbour with the fewest
// unvisited neighbours (first in adjacency order on ties).
func (s *spines) traverse(root int32, warnsdorff bool) []int32 {
	n := s.g.N()
	order := make([]int32, 0, n)
	seen := make([]bool, n)
	if s.kind == cert.Queue {
		for r := -1; r < n; r++ {
			v := root
			if r >= 0 {
				v = int32(r)
			}
			if seen[v] {
				continue
			}
			seen[v] = true
			head := len(order)
			order = append(order, v)
			for ; head < len(order); head++ {
				u := order[head]
				for _, w := range s.adj[s.off[u]:s.off[u+1]] {
					if !seen[w] {
						seen[w] = true
						order = append(order, w)
					}
				}
			}
		}
		return order
	}
	next := make([]int32, n) // next neighbour to look at, as an offset into adj
	copy(next, s.off[:n])
	var free []int32 // unvisited neighbours of each vertex
	if warnsdorff {
		free = make([]int32, n)
		for v := range free {
			free[v] = s.off[v+1] - s.off[v]
		}
	}
	visit := func(w int32) {
		seen[w] = true
		order = append(order, w)
		if warnsdorff {
			for _, x := range s.adj[s.off[w]:s.off[w+1]] {
				free[x]--
			}
		}
	}
	var stack []int32
	for r := -1; r < n; r++ {
		v := root
		if r >= 0 {
			v = int32(r)
		}
		if seen[v] {
			continue
		}
		visit(v)
		stack = append(stack[:0], v)
		for len(stack) > 0 {
			u := stack[len(stack)-1]
			end := s.off[u+1]
			i := next[u]
			for i < end && seen[s.adj[i]] {
				i++
			}
			next[u] = i
			if i == end {
				stack = stack[:len(stack)-1]
				continue
			}
			w := s.adj[i]
			if warnsdorff && end-s.off[u] <= warnsdorffMax {
				for _, x := range s.adj[i+1 : end] {
					if !seen[x] && free[x] < free[w] {
						w = x
					}
				}
			}
			visit(w)
			stack = append(stack, w)
		}
	}
	return order
}
