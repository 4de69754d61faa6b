package planarcert

import (
	"fmt"

	"spinecert.dev/graph"
)

// This file checks planarity certificates. It trusts nothing in the
// certificate and shares no code with the planarity test or the Kuratowski
// search: it uses only the graph.Graph accessors.

func badPlanar(format string, args ...any) error {
	return fmt.Errorf("%w: %s", ErrRejected, fmt.Sprintf(format, args...))
}

// Check checks a planarity certificate against g: an embedding must
// be a planar rotation system of g, a Kuratowski subgraph must be a
// subdivision of K5 or K3,3 in g. A nil error means the certificate proves
// what c.Planar says.
func Check(g *graph.Graph, c *Cert) error {
	switch {
	case c == nil:
		return badPlanar("no certificate")
	case c.Planar && c.Embedding != nil && c.Kuratowski == nil:
		return CheckEmbedding(g, c.Embedding)
	case !c.Planar && c.Kuratowski != nil && c.Embedding == nil:
		return CheckKuratowski(g, c.Kuratowski)
	}
	return badPlanar("a planar certificate needs an embedding only, a non-planar one a Kuratowski subgraph only")
}

// CheckEmbedding checks that emb is a planar rotation system of g: every
// vertex lists each of its neighbours exactly once (so every edge appears in
// both rotations once), and the faces traced component by component satisfy
// Euler's formula V − E + F = 2C, an isolated vertex counting one face.
// The faces are counted over all components at once: each component with
// V_i, E_i, F_i has V_i − E_i + F_i = 2 − 2γ_i ≤ 2 (γ_i the genus of the
// surface its rotation system defines), so the sum equals 2C exactly when
// every component is embedded in the plane.
func CheckEmbedding(g *graph.Graph, emb *Embedding) error {
	n, m := g.N(), g.M()
	if emb == nil || len(emb.Rotation) != n {
		return badPlanar("the rotation system must list all %d vertices", n)
	}
	// Darts: dart d = start[v]+i is v -> Rotation[v][i].
	start := make([]int, n+1)
	for v := 0; v < n; v++ {
		r := emb.Rotation[v]
		if len(r) != g.Degree(int32(v)) {
			return badPlanar("vertex %q has degree %d but its rotation lists %d neighbours", g.Label(int32(v)), g.Degree(int32(v)), len(r))
		}
		start[v+1] = start[v] + len(r)
	}
	// at[2e] is the dart of edge e at its lower end, at[2e+1] at its upper end.
	at := make([]int32, 2*m)
	for i := range at {
		at[i] = -1
	}
	head := make([]int32, 2*m)
	edgeOf := make([]int32, 2*m)
	for v := 0; v < n; v++ {
		for i, w := range emb.Rotation[v] {
			e := g.EdgeIndex(int32(v), w)
			if e < 0 {
				return badPlanar("rotation of %q names %s, which is not a neighbour", g.Label(int32(v)), checkLabel(g, w))
			}
			k := 2 * e
			if int32(v) > w {
				k++
			}
			if at[k] >= 0 {
				return badPlanar("rotation of %q names %q twice", g.Label(int32(v)), g.Label(w))
			}
			d := start[v] + i
			at[k] = int32(d)
			head[d] = w
			edgeOf[d] = int32(e)
		}
	}
	// Every edge has both darts, since each rotation lists degree-many
	// distinct neighbours; trace the faces: after arriving at w along v -> w,
	// leave w along the dart that follows w -> v in the rotation of w.
	twin := func(d int32, v int32) int32 {
		w, e := head[d], edgeOf[d]
		if v < w {
			return at[2*e+1]
		}
		return at[2*e]
	}
	tail := make([]int32, 2*m)
	for v := 0; v < n; v++ {
		for d := start[v]; d < start[v+1]; d++ {
			tail[d] = int32(v)
		}
	}
	seen := make([]bool, 2*m)
	faces := 0
	for d0 := range seen {
		if seen[d0] {
			continue
		}
		faces++
		for d := int32(d0); !seen[d]; {
			seen[d] = true
			t := twin(d, tail[d])
			w := tail[t]
			i := int(t) - start[w] + 1
			if i == start[w+1]-start[w] {
				i = 0
			}
			d = int32(start[w] + i)
		}
	}
	// Components, counted here by a breadth-first search of g.
	comp := 0
	isolated := 0
	mark := make([]bool, n)
	var queue []int32
	for s := 0; s < n; s++ {
		if mark[s] {
			continue
		}
		comp++
		if g.Degree(int32(s)) == 0 {
			isolated++
		}
		mark[s] = true
		queue = append(queue[:0], int32(s))
		for len(queue) > 0 {
			v := queue[len(queue)-1]
			queue = queue[:len(queue)-1]
			for _, w := range g.Neighbors(v) {
				if !mark[w] {
					mark[w] = true
					queue = append(queue, w)
				}
			}
		}
	}
	f := faces + isolated
	if n-m+f != 2*comp {
		return badPlanar("Euler's formula fails: V − E + F = %d − %d + %d = %d, but 2C = %d for C = %d components", n, m, f, n-m+f, 2*comp, comp)
	}
	return nil
}

func checkLabel(g *graph.Graph, v int32) string {
	if v < 0 || int(v) >= g.N() {
		return fmt.Sprintf("vertex #%d", v)
	}
	return fmt.Sprintf("%q", g.Label(v))
}

// CheckKuratowski checks that k is a subdivision of K5 or K3,3 in g: distinct
// branch vertices, one path per pair of branch vertices that K5 (all ten
// pairs) or K3,3 (the nine pairs across its sides) joins, every path a path of
// g whose inner vertices are not branch vertices and lie on no other path.
func CheckKuratowski(g *graph.Graph, k *Kuratowski) error {
	if k == nil {
		return badPlanar("no Kuratowski subgraph")
	}
	var want int
	switch k.Kind {
	case K5:
		want = 5
	case K33:
		want = 6
	default:
		return badPlanar("unknown Kuratowski graph %s", k.Kind)
	}
	if len(k.Branch) != want {
		return badPlanar("%s needs %d branch vertices, got %d", k.Kind, want, len(k.Branch))
	}
	n := g.N()
	slot := make(map[int32]int, want) // branch vertex -> position in Branch
	for i, b := range k.Branch {
		if b < 0 || int(b) >= n {
			return badPlanar("branch vertex %s is not in the graph", checkLabel(g, b))
		}
		if _, dup := slot[b]; dup {
			return badPlanar("branch vertex %q given twice", g.Label(b))
		}
		slot[b] = i
	}
	joined := func(i, j int) bool {
		if k.Kind == K5 {
			return i != j
		}
		return (i < 3) != (j < 3)
	}
	pairs := 10
	if k.Kind == K33 {
		pairs = 9
	}
	if len(k.Paths) != pairs {
		return badPlanar("%s needs %d paths, got %d", k.Kind, pairs, len(k.Paths))
	}
	done := make(map[[2]int]bool, pairs)
	inner := make(map[int32]int) // inner vertex -> path number
	for pi, p := range k.Paths {
		if len(p) < 2 {
			return badPlanar("path %d has fewer than two vertices", pi+1)
		}
		a, okA := slot[p[0]]
		b, okB := slot[p[len(p)-1]]
		if !okA || !okB {
			return badPlanar("path %d does not run between two branch vertices", pi+1)
		}
		if !joined(a, b) {
			return badPlanar("path %d joins %q and %q, which %s does not join", pi+1, g.Label(p[0]), g.Label(p[len(p)-1]), k.Kind)
		}
		key := [2]int{min(a, b), max(a, b)}
		if done[key] {
			return badPlanar("two paths join %q and %q", g.Label(p[0]), g.Label(p[len(p)-1]))
		}
		done[key] = true
		for i, v := range p {
			if v < 0 || int(v) >= n {
				return badPlanar("path %d names %s, which is not in the graph", pi+1, checkLabel(g, v))
			}
			if i > 0 && !g.HasEdge(p[i-1], v) {
				return badPlanar("path %d uses %q–%q, which is not an edge", pi+1, g.Label(p[i-1]), g.Label(v))
			}
			if i == 0 || i == len(p)-1 {
				continue
			}
			if _, isBranch := slot[v]; isBranch {
				return badPlanar("path %d passes through branch vertex %q", pi+1, g.Label(v))
			}
			if q, used := inner[v]; used {
				if q == pi {
					return badPlanar("path %d visits %q twice", pi+1, g.Label(v))
				}
				return badPlanar("paths %d and %d share the vertex %q", q+1, pi+1, g.Label(v))
			}
			inner[v] = pi
		}
	}
	return nil
}
