package heuristic

import (
	"math/rand/v2"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/planar"
)

// FourConnectedTwoPage returns a 2-page stack layout of a triangulation
// without separating triangles (for n ≥ 5 the same as a 4-connected
// triangulation; common practice, no source), or nil and the reason it
// gives none.
//
// Such a graph is Hamiltonian (H. Whitney, "A theorem on graphs", Ann. of
// Math. 32, 1931; W. T. Tutte, "A theorem on planar graphs", Trans. AMS 82,
// 1956, for every 4-connected planar graph), and a Hamiltonian cycle of a
// planar graph is the spine of a 2-page layout (Bernhart and Kainen 1979).
// The cycle is found by growing a disk of faces (growHamiltonian) on small
// graphs, and by rotation and extension (posaCycle); both are heuristics
// without a guarantee of their own, so they may fail (nil) even though a
// cycle exists. The layout is built from the embedding
// as in HamiltonianTwoPage and checked there for crossings before it is
// returned; callers still validate it (cert.Validate). The search uses
// opts.Seed and stops, giving none, once opts.TimeLimit (when not zero)
// has passed: on large inputs the rotation search can take very long.
func FourConnectedTwoPage(g *graph.Graph, opts Options) (*cert.Layout, string) {
	deadline := opts.deadline(time.Now())
	seed := opts.Seed
	n := g.N()
	if n < 4 || int64(g.M()) != 3*int64(n)-6 {
		return nil, "not a triangulation on at least 4 vertices (3n-6 edges)"
	}
	emb, ok := planar.Embed(g)
	if !ok {
		return nil, "not planar"
	}
	if t := countTriangles(g); t != int64(2*n-4) {
		return nil, "the triangulation has a separating triangle"
	}
	r := newRotation(emb)
	rng := rand.New(rand.NewPCG(uint64(seed), uint64(n)))
	// The disk growth first, while it is cheap and usually succeeds; then
	// rotation and extension (posaCycle) from random start vertices.
	for try := 0; try < fourConnectedTries; try++ {
		var cyc []int32
		ok := false
		if try < diskTries && n <= diskMaxVertices {
			cyc, ok = r.growHamiltonian(int32(rng.IntN(n)))
		} else {
			cyc, ok = posaCycle(g, int32(rng.IntN(n)), rng, posaRotationsPerVertex*n, deadline)
		}
		if !ok {
			if past(deadline) {
				return nil, "no Hamiltonian cycle found within the time limit"
			}
			continue
		}
		if l, ok := cycleTwoPage(g, emb, cyc); ok {
			return l, ""
		}
		return nil, "the cycle found does not give a 2-page layout (a bug)"
	}
	return nil, "the disk growth and the rotation-extension search found no Hamiltonian cycle"
}

// The search budget of FourConnectedTwoPage: fourConnectedTries tries in
// all, the first diskTries by disk growth when there are at most
// diskMaxVertices vertices (above that it nearly always gets stuck: no
// success on random 4-connected triangulations of 1000 vertices), the
// others by rotation and extension with at most posaRotationsPerVertex·n
// rotations each.
const (
	fourConnectedTries     = 8
	diskTries              = 3
	diskMaxVertices        = 300
	posaRotationsPerVertex = 50
)

// countTriangles counts the triangles of g: every edge is directed from
// the end of lower (degree, index) to the higher, and each triangle is
// found once at its lowest corner (common practice, no source). In a
// triangulation on n ≥ 4 vertices the 2n − 4 faces are triangles, so there
// are exactly 2n − 4 triangles iff none is separating.
func countTriangles(g *graph.Graph) int64 {
	n := g.N()
	less := func(a, b int32) bool {
		da, db := g.Degree(a), g.Degree(b)
		return da < db || da == db && a < b
	}
	off := make([]int32, n+1)
	for v := int32(0); int(v) < n; v++ {
		for _, w := range g.Neighbors(v) {
			if less(v, w) {
				off[v+1]++
			}
		}
	}
	for v := 0; v < n; v++ {
		off[v+1] += off[v]
	}
	outs := make([]int32, off[n])
	fill := off[:n:n]
	fill = append([]int32(nil), fill...)
	for v := int32(0); int(v) < n; v++ {
		for _, w := range g.Neighbors(v) {
			if less(v, w) {
				outs[fill[v]] = w
				fill[v]++
			}
		}
	}
	mark := make([]int32, n)
	for i := range mark {
		mark[i] = -1
	}
	var t int64
	for v := int32(0); int(v) < n; v++ {
		for _, w := range outs[off[v]:off[v+1]] {
			mark[w] = v
		}
		for _, w := range outs[off[v]:off[v+1]] {
			for _, x := range outs[off[w]:off[w+1]] {
				if mark[x] == v {
					t++
				}
			}
		}
	}
	return t
}

// growHamiltonian grows a disk of faces from a face at start, one face at a
// time, each adding a new vertex to the disk's boundary: for a boundary
// edge a→b whose outside face (b, a, y) has y off the disk, the face is
// added and the boundary becomes a→y→b. The boundary stays a simple cycle
// through every vertex added, so if every vertex is added it is a
// Hamiltonian cycle.
//
// A boundary edge can only ever be replaced by adding the apex of its
// outside face, so a vertex once offered by a boundary edge stays offered
// until it is added; the growth fails only if some vertex is never
// offered. The one way to shut a vertex y in for good is to add the last
// neighbour of y off the disk while no boundary edge offers y (no boundary
// edge can appear opposite y afterwards). Such moves are put off until y is
// offered; other moves are taken last offered first. The growth can still
// get stuck (false); it takes O(Σ deg²) time.
// shutSearch bounds the search of growHamiltonian for vertices shut in.
const shutSearch = 64

func (r *rotation) growHamiltonian(start int32) ([]int32, bool) {
	n := int32(len(r.off) - 1)
	succ := func(v, i int32) int32 { // the slot after i in v's rotation
		if i+1 == r.off[v+1] {
			return r.off[v]
		}
		return i + 1
	}
	visited := make([]bool, n)
	offered := make([]bool, n)
	deferred := make([]bool, n)
	next := make([]int32, n)
	out := make([]int32, n) // slot of the dart a→next[a]
	free := make([]int32, n)
	for v := int32(0); v < n; v++ {
		free[v] = r.off[v+1] - r.off[v]
	}
	var stack []int32
	offer := func(a int32) int32 { return r.nb[succ(a, out[a])] }
	// mark records that a boundary edge offers y.
	mark := func(y int32) {
		if visited[y] {
			return
		}
		if !offered[y] {
			offered[y] = true
			if free[y] == 1 {
				// a move put off because it would shut y in is safe now
				for i := r.off[y]; i < r.off[y+1]; i++ {
					if z := r.nb[i]; !visited[z] && deferred[z] {
						deferred[z] = false
						stack = append(stack, z)
					}
				}
			}
		}
		stack = append(stack, y)
	}
	visit := func(v int32) {
		visited[v] = true
		for i := r.off[v]; i < r.off[v+1]; i++ {
			free[r.nb[i]]--
		}
	}
	// shutIn reports whether adding z would leave the vertices off the disk
	// reachable from y (not through z) without any offer: no boundary edge
	// can then appear opposite one of them. The search gives up (false)
	// after a bounded number of vertices.
	seen := make([]int32, n)
	gen := int32(0)
	var queue []int32
	shutIn := func(y, z, o1, o2 int32) bool {
		gen++
		seen[z] = gen
		seen[y] = gen
		queue = append(queue[:0], y)
		for h := 0; h < len(queue); h++ {
			v := queue[h]
			if offered[v] || v == o1 || v == o2 || h >= shutSearch {
				return false
			}
			for i := r.off[v]; i < r.off[v+1]; i++ {
				if w := r.nb[i]; !visited[w] && seen[w] != gen {
					seen[w] = gen
					queue = append(queue, w)
				}
			}
		}
		return true
	}
	// The first face: the face of the dart u→w.
	i0 := r.off[start]
	u, w := start, r.nb[i0]
	iw := succ(w, r.twin[i0])
	x := r.nb[iw]
	ix := succ(x, r.twin[iw])
	next[u], next[w], next[x] = w, x, u
	out[u], out[w], out[x] = i0, iw, ix
	visit(u)
	visit(w)
	visit(x)
	for _, v := range [3]int32{u, w, x} {
		mark(offer(v))
	}
	added := int32(3)
	lastRetry := int32(-1)
	var putOff []int32 // moves put off since the last retry
	for added < n {
		if len(stack) == 0 {
			// Retry the moves put off; stuck if none of them is safe now.
			if added != lastRetry {
				lastRetry = added
				for _, v := range putOff {
					if deferred[v] && !visited[v] {
						deferred[v] = false
						stack = append(stack, v)
					}
				}
				putOff = putOff[:0]
			}
			if len(stack) == 0 {
				return nil, false
			}
			continue
		}
		z := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		if visited[z] || deferred[z] {
			continue
		}
		// Find a boundary vertex a offering z.
		a := int32(-1)
		for i := r.off[z]; i < r.off[z+1]; i++ {
			if y := r.nb[i]; visited[y] && offer(y) == z {
				a = y
				break
			}
		}
		if a < 0 {
			return nil, false // an offer vanished: cannot happen
		}
		// The new boundary edges a→z and z→b offer o1 and o2.
		na := succ(a, out[a])
		nz := succ(z, r.twin[na])
		o1, o2 := r.nb[succ(a, na)], r.nb[succ(z, nz)]
		shuts := false
		for i := r.off[z]; i < r.off[z+1] && !shuts; i++ {
			if y := r.nb[i]; !visited[y] {
				shuts = shutIn(y, z, o1, o2)
			}
		}
		if shuts {
			deferred[z] = true
			putOff = append(putOff, z)
			continue
		}
		b := next[a]
		out[a], out[z] = na, nz
		next[a], next[z] = z, b
		visit(z)
		added++
		mark(o1)
		mark(o2)
	}
	cyc := make([]int32, 0, n)
	v := start
	for range n {
		cyc = append(cyc, v)
		v = next[v]
	}
	return cyc, v == start
}
