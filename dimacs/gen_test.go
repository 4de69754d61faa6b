package dimacs

import (
	"math/rand/v2"

	"spinecert.dev/graph"
)

// triangulation is a maximal planar graph with its faces, each oriented
// counter-clockwise.
type triangulation struct {
	n     int
	faces [][3]int
}

// randomTriangulation grows a triangulation on n >= 3 vertices by putting
// each new vertex into a random face, then applies random edge flips
// (keeping the graph simple) so that it is not just a stacked one.
func randomTriangulation(r *rand.Rand, n, flips int) *triangulation {
	tr := &triangulation{n: n, faces: [][3]int{{0, 1, 2}, {0, 2, 1}}}
	for v := 3; v < n; v++ {
		i := r.IntN(len(tr.faces))
		a, b, c := tr.faces[i][0], tr.faces[i][1], tr.faces[i][2]
		tr.faces[i] = [3]int{a, b, v}
		tr.faces = append(tr.faces, [3]int{b, c, v}, [3]int{c, a, v})
	}
	for k := 0; k < flips; k++ {
		tr.flip(r)
	}
	return tr
}

// flip replaces a random edge ab, with faces (a,b,c) and (b,a,d), by cd
// when c and d are not yet adjacent.
func (tr *triangulation) flip(r *rand.Rand) {
	type dir struct{ u, v int }
	faceOf := map[dir]int{}
	adj := map[[2]int]bool{}
	for i, f := range tr.faces {
		for k := 0; k < 3; k++ {
			u, v := f[k], f[(k+1)%3]
			faceOf[dir{u, v}] = i
			adj[[2]int{min(u, v), max(u, v)}] = true
		}
	}
	i := r.IntN(len(tr.faces))
	k := r.IntN(3)
	f := tr.faces[i]
	a, b, c := f[k], f[(k+1)%3], f[(k+2)%3]
	j := faceOf[dir{b, a}]
	g := tr.faces[j]
	d := -1
	for _, x := range g {
		if x != a && x != b {
			d = x
		}
	}
	if adj[[2]int{min(c, d), max(c, d)}] {
		return
	}
	tr.faces[i] = [3]int{a, d, c}
	tr.faces[j] = [3]int{d, b, c}
}

func (tr *triangulation) graph() *graph.Graph {
	seen := map[[2]int]bool{}
	var es [][2]int
	for _, f := range tr.faces {
		for k := 0; k < 3; k++ {
			u, v := f[k], f[(k+1)%3]
			e := [2]int{min(u, v), max(u, v)}
			if !seen[e] {
				seen[e] = true
				es = append(es, e)
			}
		}
	}
	return mustGraph(tr.n, es)
}

// kleetope adds a vertex in every face joined to its three corners.
func (tr *triangulation) kleetope() *graph.Graph {
	g := tr.graph()
	var es [][2]int
	for _, e := range g.Edges() {
		es = append(es, [2]int{int(e.U), int(e.V)})
	}
	for i, f := range tr.faces {
		v := tr.n + i
		es = append(es, [2]int{f[0], v}, [2]int{f[1], v}, [2]int{f[2], v})
	}
	return mustGraph(tr.n+len(tr.faces), es)
}
