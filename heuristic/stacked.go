package heuristic

import (
	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// Stacking is the construction history of a planar 3-tree (a stacked
// triangulation, an Apollonian network): a root triangle and, for every
// other vertex in the order it was added, the face it was stacked into.
//
// Root holds the three root vertices. For a stacked vertex v, Corners[v]
// are the corners of the face v went into, in the roles (x, y, z) that
// the three-page construction gives them, Child[v] are the vertices
// stacked into v's three new faces {z, x, v}, {y, z, v} and {x, y, v} (-1
// where none was), and Side[0], Side[1] are the vertices stacked into the
// two faces of the root triangle (-1 where none was).
type Stacking struct {
	Root    [3]int32
	Side    [2]int32
	Corners [][3]int32 // by vertex; unused for the root vertices
	Child   [][3]int32 // by vertex; -1 for an empty face
	Order   []int32    // the stacked vertices in the order they were added
}

// RecognizeStacked reports whether g is a planar 3-tree and, if it is,
// returns its stacking. A planar 3-tree on n ≥ 3 vertices is built from a
// triangle by repeatedly adding a vertex inside a face, joined to the
// face's three corners, so it has 3n − 6 edges; the test peels vertices of
// degree 3 whose neighbours form a triangle (in a 3-tree with more than
// four vertices every vertex of degree 3 is such a vertex, and removing it
// leaves a 3-tree; common practice, no source) and then replays the
// stacking in reverse, checking that every vertex goes into a face of the
// graph built so far: a triangle that is not such a face would make the
// graph non-planar. Time O(n + m log Δ).
func RecognizeStacked(g *graph.Graph) (*Stacking, bool) {
	n := g.N()
	if n < 3 || int64(g.M()) != 3*int64(n)-6 {
		return nil, false
	}
	deg := make([]int32, n)
	var queue []int32
	for v := range deg {
		deg[v] = int32(g.Degree(int32(v)))
		if deg[v] == 3 {
			queue = append(queue, int32(v))
		}
	}
	removed := make([]bool, n)
	peel := make([]int32, 0, n)
	nbr := make([][3]int32, n)
	for left := n; left > 3; {
		if len(queue) == 0 {
			return nil, false
		}
		v := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		if removed[v] || deg[v] != 3 {
			continue
		}
		k := 0
		for _, w := range g.Neighbors(v) {
			if !removed[w] {
				nbr[v][k] = w
				k++
			}
		}
		a, b, c := nbr[v][0], nbr[v][1], nbr[v][2]
		if !g.HasEdge(a, b) || !g.HasEdge(b, c) || !g.HasEdge(a, c) {
			return nil, false
		}
		removed[v] = true
		left--
		peel = append(peel, v)
		for _, w := range nbr[v] {
			deg[w]--
			if deg[w] == 3 {
				queue = append(queue, w)
			}
		}
	}
	st := &Stacking{Side: [2]int32{-1, -1}, Corners: make([][3]int32, n), Child: make([][3]int32, n)}
	k := 0
	for v := int32(0); int(v) < n; v++ {
		if !removed[v] {
			st.Root[k] = v
			k++
		}
	}
	r := st.Root
	if !g.HasEdge(r[0], r[1]) || !g.HasEdge(r[1], r[2]) || !g.HasEdge(r[0], r[2]) {
		return nil, false
	}
	// Replay: rank[v] is the time v was added (root vertices 0).
	rank := make([]int32, n)
	for i := range peel {
		v := peel[len(peel)-1-i]
		rank[v] = int32(i + 1)
		st.Order = append(st.Order, v)
	}
	for v := range st.Child {
		st.Child[v] = [3]int32{-1, -1, -1}
	}
	for _, v := range st.Order {
		t := nbr[v]
		// w, the corner added last, made the face v went into.
		w := t[0]
		for _, u := range t[1:] {
			if rank[u] > rank[w] {
				w = u
			}
		}
		if rank[w] == 0 {
			// A face of the root triangle: side 0 has the roles (A, B, C),
			// side 1 the roles (B, C, A).
			switch {
			case st.Side[0] < 0:
				st.Side[0] = v
				st.Corners[v] = [3]int32{r[0], r[1], r[2]}
			case st.Side[1] < 0:
				st.Side[1] = v
				st.Corners[v] = [3]int32{r[1], r[2], r[0]}
			default:
				return nil, false
			}
			continue
		}
		x, y, z := st.Corners[w][0], st.Corners[w][1], st.Corners[w][2]
		faces := [3][3]int32{{x, w, z}, {w, z, y}, {w, y, x}}
		slot := -1
		for i, f := range faces {
			if sameTriple(f, t) {
				slot = i
			}
		}
		if slot < 0 || st.Child[w][slot] >= 0 {
			return nil, false
		}
		st.Child[w][slot] = v
		st.Corners[v] = faces[slot]
	}
	return st, true
}

func sameTriple(a, b [3]int32) bool {
	for _, x := range a {
		if x != b[0] && x != b[1] && x != b[2] {
			return false
		}
	}
	return true
}

// pageTriple packs the pages (a, b, c) of a face's three corner roles.
type pageTriple [3]int8

// StackedThreePage returns the 3-page stack layout of the planar 3-tree
// whose stacking is st, as a layout of g (the graph st was recognised
// from), or nil if some edge of g is not an edge of the stacking.
//
// Planar 3-trees have book thickness at most 3 (L. S. Heath, "Embedding
// planar graphs in seven pages", FOCS 1984; from memory). The construction
// here is our own and works on the stacking tree. Every face F = (x, y, z)
// with a stacked vertex gets a page triple (a, b, c), a permutation of the
// three pages, and the invariant: all vertices inside F lie in one run of
// the spine directly after x, on the way from x to y that avoids z (the
// spine read as a circle), and an edge from inside F to x on page a or b,
// to y on page b, or to z on page c crosses no edge outside F. The vertex v
// stacked into F gets its edges to x, y and z on pages a, b and c, and the
// inside of F is laid out as
//
//	inside(x, v, z; b, a, c)  inside(v, z, y; a, c, b)  v  inside(v, y, x; c, b, a)
//
// (each child face with its roles and pages). A check of every pair of
// edge families (the three edges at v, and each child's edges to its
// corners) shows that no two on one page cross, and each child face
// satisfies the invariant again; the root triangle A B C goes on page 1
// with one face's inside directly after A (roles A, B, C, pages 1, 2, 3)
// and the other's directly after B (roles B, C, A, pages 1, 3, 2). The
// layout is checked (cert.Validate) by the callers before it is reported;
// nothing here is trusted.
func StackedThreePage(g *graph.Graph, st *Stacking) *cert.Layout {
	n := g.N()
	typ := make([]pageTriple, n)
	dir := make([]bool, n) // true: the face's inside is read from x to the right
	order := make([]int32, 0, n)
	// Iterative in-order walk of the stacking tree: 2v means "lay out the
	// face whose stacked vertex is v", 2v+1 means "emit v".
	var todo []int32
	walk := func(v int32, t pageTriple) {
		if v < 0 {
			return
		}
		typ[v] = t
		dir[v] = true
		todo = append(todo[:0], 2*v)
		for len(todo) > 0 {
			u := todo[len(todo)-1]
			todo = todo[:len(todo)-1]
			if u%2 == 1 {
				order = append(order, u/2)
				continue
			}
			u /= 2
			a, b, c := typ[u][0], typ[u][1], typ[u][2]
			ch := st.Child[u]
			for i, ct := range [3]pageTriple{{b, a, c}, {a, c, b}, {c, b, a}} {
				if ch[i] >= 0 {
					typ[ch[i]] = ct
				}
			}
			// A face read from x to the right is laid out as child 0, child
			// 1 (read to the left, from v), u, child 2; a face read to the
			// left is the mirror image. Pushed in reverse.
			d := dir[u]
			for i, cd := range [3]bool{d, !d, d} {
				if ch[i] >= 0 {
					dir[ch[i]] = cd
				}
			}
			// -1 in seq stands for u itself; -2 for an empty face.
			for i := range ch {
				if ch[i] < 0 {
					ch[i] = -2
				}
			}
			seq := [4]int32{ch[0], ch[1], -1, ch[2]}
			if !d {
				seq = [4]int32{ch[2], -1, ch[1], ch[0]}
			}
			for i := 3; i >= 0; i-- {
				switch {
				case seq[i] == -1:
					todo = append(todo, 2*u+1)
				case seq[i] >= 0:
					todo = append(todo, 2*seq[i])
				}
			}
		}
	}
	r := st.Root
	order = append(order, r[0])
	walk(st.Side[0], pageTriple{1, 2, 3})
	order = append(order, r[1])
	walk(st.Side[1], pageTriple{1, 3, 2})
	order = append(order, r[2])
	if len(order) != n {
		return nil
	}
	page := make([]int32, g.M())
	for i := range page {
		page[i] = 1 // the root triangle; every other edge is set below
	}
	for _, v := range st.Order {
		for k, c := range st.Corners[v] {
			e := g.EdgeIndex(v, c)
			if e < 0 {
				return nil
			}
			page[e] = int32(typ[v][k])
		}
	}
	return newLayout(cert.Stack, order, page, 3)
}
