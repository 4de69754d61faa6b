package heuristic

import (
	"math/rand/v2"
	"testing"

	"spinecert.dev/graph"
)

func mustGraph(tb testing.TB, n int, edges [][2]int) *graph.Graph {
	tb.Helper()
	g, err := graph.NewNumbered(n, 0, edges)
	if err != nil {
		tb.Fatal(err)
	}
	return g
}

func complete(tb testing.TB, n int) *graph.Graph {
	var e [][2]int
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			e = append(e, [2]int{i, j})
		}
	}
	return mustGraph(tb, n, e)
}

// grid is P_w x P_h with vertex y*w+x.
func grid(tb testing.TB, w, h int) *graph.Graph {
	e := make([][2]int, 0, 2*w*h)
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			v := y*w + x
			if x+1 < w {
				e = append(e, [2]int{v, v + 1})
			}
			if y+1 < h {
				e = append(e, [2]int{v, v + w})
			}
		}
	}
	return mustGraph(tb, w*h, e)
}

// randomTree attaches every vertex to a random earlier one, then relabels randomly.
func randomTree(tb testing.TB, rng *rand.Rand, n int) *graph.Graph {
	perm := rng.Perm(n)
	e := make([][2]int, 0, n)
	for v := 1; v < n; v++ {
		e = append(e, [2]int{perm[v], perm[rng.IntN(v)]})
	}
	return mustGraph(tb, n, e)
}

func randomGraph(tb testing.TB, rng *rand.Rand, n int, p float64) *graph.Graph {
	var e [][2]int
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			if rng.Float64() < p {
				e = append(e, [2]int{i, j})
			}
		}
	}
	return mustGraph(tb, n, e)
}

// randomPlanar returns a random maximal planar graph on n ≥ 4 vertices: a
// triangle, vertices inserted into random faces (joined to the three
// corners), then random edge flips that keep the graph simple and every
// degree at least 3; vertices are relabelled randomly. Every step keeps a
// planar triangulation, so m = 3n-6 (Euler's formula).
func randomPlanar(tb testing.TB, rng *rand.Rand, n, flips int) *graph.Graph {
	type face [3]int32
	faces := []face{{0, 1, 2}, {0, 2, 1}}
	key := func(a, b int32) uint64 {
		if a > b {
			a, b = b, a
		}
		return uint64(a)<<32 | uint64(b)
	}
	// edge -> the two faces holding it
	ef := map[uint64][]int{}
	deg := make([]int, n)
	link := func(f int) {
		t := faces[f]
		for i := 0; i < 3; i++ {
			k := key(t[i], t[(i+1)%3])
			ef[k] = append(ef[k], f)
		}
	}
	unlink := func(f int) {
		t := faces[f]
		for i := 0; i < 3; i++ {
			k := key(t[i], t[(i+1)%3])
			fs := ef[k]
			for j, g := range fs {
				if g == f {
					fs[j] = fs[len(fs)-1]
					fs = fs[:len(fs)-1]
					break
				}
			}
			if len(fs) == 0 {
				delete(ef, k)
			} else {
				ef[k] = fs
			}
		}
	}
	link(0)
	link(1)
	deg[0], deg[1], deg[2] = 2, 2, 2
	for v := int32(3); int(v) < n; v++ {
		f := rng.IntN(len(faces))
		t := faces[f]
		unlink(f)
		faces[f] = face{t[0], t[1], v}
		link(f)
		faces = append(faces, face{t[1], t[2], v})
		link(len(faces) - 1)
		faces = append(faces, face{t[2], t[0], v})
		link(len(faces) - 1)
		deg[t[0]]++
		deg[t[1]]++
		deg[t[2]]++
		deg[v] = 3
	}
	for i := 0; i < flips; i++ {
		f := rng.IntN(len(faces))
		t := faces[f]
		j := rng.IntN(3)
		a, b := t[j], t[(j+1)%3]
		c := t[(j+2)%3]
		fs := ef[key(a, b)]
		g := fs[0]
		if g == f {
			g = fs[1]
		}
		var d int32
		for _, x := range faces[g] {
			if x != a && x != b {
				d = x
			}
		}
		if _, ok := ef[key(c, d)]; ok || deg[a] <= 3 || deg[b] <= 3 {
			continue
		}
		unlink(f)
		unlink(g)
		// f = (a, b, c) in orientation, g holds (b, a, d): new faces (c, a, d) and (d, b, c)
		faces[f] = face{c, a, d}
		faces[g] = face{d, b, c}
		link(f)
		link(g)
		deg[a]--
		deg[b]--
		deg[c]++
		deg[d]++
	}
	perm := rng.Perm(n)
	e := make([][2]int, 0, len(ef))
	for k := range ef {
		e = append(e, [2]int{perm[k>>32], perm[k&0xffffffff]})
	}
	return mustGraph(tb, n, e)
}
