package toughcert

import (
	"fmt"

	"spinecert.dev/graph"
	"spinecert.dev/planar/planarcert"
)

// This file checks toughness certificates. It trusts nothing in the
// certificate and shares no code with the search that finds them: it uses
// only the graph.Graph accessors and planarcert.CheckEmbedding.

// Cert claims that G is maximal planar (Embedding is a planar rotation
// system of G, which has 3n − 6 edges) and that removing the vertices
// Removed leaves more than len(Removed) components.
type Cert struct {
	Embedding *planarcert.Embedding
	Removed   []int32
}

func reject(format string, args ...any) error {
	return fmt.Errorf("%w: %s", ErrRejected, fmt.Sprintf(format, args...))
}

// Check checks c against g. On acceptance it returns the number of
// components of g minus c.Removed, which is more than len(c.Removed); g
// then has no layout on two stack pages (see the package documentation).
func Check(g *graph.Graph, c *Cert) (int, error) {
	if c == nil {
		return 0, reject("no certificate")
	}
	n, m := g.N(), g.M()
	if n < 3 || m != 3*n-6 {
		return 0, reject("not maximal planar: %d edges on %d vertices, expected n >= 3 and 3n-6 = %d", m, n, 3*n-6)
	}
	if err := planarcert.CheckEmbedding(g, c.Embedding); err != nil {
		return 0, fmt.Errorf("%w: not shown planar: %w", ErrRejected, err)
	}
	return CheckSet(g, c.Removed)
}

// CheckSet checks that removed is a non-empty set of distinct vertices of g
// whose removal leaves more than len(removed) components, and returns the
// number of components. It says nothing about planarity.
func CheckSet(g *graph.Graph, removed []int32) (int, error) {
	n := g.N()
	if len(removed) == 0 {
		return 0, reject("the removed set is empty")
	}
	gone := make([]bool, n)
	for _, v := range removed {
		if v < 0 || int(v) >= n {
			return 0, reject("vertex index %d out of range 0..%d", v, n-1)
		}
		if gone[v] {
			return 0, reject("vertex %q removed twice", g.Label(v))
		}
		gone[v] = true
	}
	// Union-find over the remaining vertices, joined along every edge with
	// both ends remaining.
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
	components := n - len(removed)
	for _, e := range g.Edges() {
		if gone[e.U] || gone[e.V] {
			continue
		}
		a, b := find(e.U), find(e.V)
		if a != b {
			parent[a] = b
			components--
		}
	}
	if components <= len(removed) {
		return components, reject("removing %d vertices leaves %d components, expected more than %d", len(removed), components, len(removed))
	}
	return components, nil
}
