package cert

import (
	"math/rand/v2"
	"testing"
)

// Graph generators for the planarity tests and benchmarks.

func plMustNumbered(t testing.TB, n int, edges [][2]int) *Graph {
	t.Helper()
	g, err := NewNumbered(n, 0, edges)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func plNumbered(n int, edges [][2]int) *Graph {
	g, err := NewNumbered(n, 0, edges)
	if err != nil {
		panic(err)
	}
	return g
}

func plCompleteGraph(n int) *Graph {
	var e [][2]int
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			e = append(e, [2]int{i, j})
		}
	}
	return plNumbered(n, e)
}

func plCompleteBipartite(a, b int) *Graph {
	var e [][2]int
	for i := 0; i < a; i++ {
		for j := 0; j < b; j++ {
			e = append(e, [2]int{i, a + j})
		}
	}
	return plNumbered(a+b, e)
}

// petersen is the Petersen graph: outer 5-cycle 0..4, spokes i–i+5, inner pentagram.
func plPetersen() *Graph {
	var e [][2]int
	for i := 0; i < 5; i++ {
		e = append(e, [2]int{i, (i + 1) % 5}, [2]int{i, i + 5}, [2]int{5 + i, 5 + (i+2)%5})
	}
	return plNumbered(10, e)
}

func plGridGraph(r, c int) *Graph {
	var e [][2]int
	for i := 0; i < r; i++ {
		for j := 0; j < c; j++ {
			v := i*c + j
			if j+1 < c {
				e = append(e, [2]int{v, v + 1})
			}
			if i+1 < r {
				e = append(e, [2]int{v, v + c})
			}
		}
	}
	return plNumbered(r*c, e)
}

// randomTriangulationEdges builds a maximal planar graph on n >= 3 vertices by
// starting from a triangle and repeatedly either inserting a vertex into a
// random face or (for variety) keeping faces as they are; every insertion
// into a triangular face adds one vertex and three edges, so m = 3n − 6.
func plRandomTriangulationEdges(rng *rand.Rand, n int) [][2]int {
	e := [][2]int{{0, 1}, {1, 2}, {0, 2}}
	faces := [][3]int{{0, 1, 2}, {0, 2, 1}}
	for v := 3; v < n; v++ {
		i := rng.IntN(len(faces))
		f := faces[i]
		e = append(e, [2]int{f[0], v}, [2]int{f[1], v}, [2]int{f[2], v})
		faces[i] = [3]int{f[0], f[1], v}
		faces = append(faces, [3]int{f[1], f[2], v}, [3]int{f[2], f[0], v})
	}
	return e
}

// randomTriangulation relabels a random stacked triangulation at random.
func plRandomTriangulation(rng *rand.Rand, n int) *Graph {
	e := plRandomTriangulationEdges(rng, n)
	perm := rng.Perm(n)
	for i := range e {
		e[i] = [2]int{perm[e[i][0]], perm[e[i][1]]}
	}
	return plNumbered(n, e)
}

// randomPlanarPlus is a random spanning subgraph of a random triangulation
// (about two thirds of its edges) plus k random extra edges.
func plRandomPlanarPlus(rng *rand.Rand, n, k int) *Graph {
	var e [][2]int
	for _, x := range plRandomTriangulationEdges(rng, n) {
		if rng.IntN(3) != 0 {
			e = append(e, x)
		}
	}
	for i := 0; i < k; i++ {
		a, b := rng.IntN(n), rng.IntN(n)
		if a != b {
			e = append(e, [2]int{a, b})
		}
	}
	perm := rng.Perm(n)
	for i := range e {
		e[i] = [2]int{perm[e[i][0]], perm[e[i][1]]}
	}
	return plNumbered(n, e)
}

// randomGraph has n vertices and up to m random edges (repeats merged).
func plRandomGraph(rng *rand.Rand, n, m int) *Graph {
	var e [][2]int
	for len(e) < m {
		a, b := rng.IntN(n), rng.IntN(n)
		if a != b {
			e = append(e, [2]int{a, b})
		}
	}
	return plNumbered(n, e)
}
