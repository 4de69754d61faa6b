package planar

import (
	"fmt"

	"spinecert.dev/graph"
	"spinecert.dev/planar/planarcert"
)

// FindKuratowski returns a subdivision of K5 or K3,3 in g, found by edge
// deletion guided by the planarity test:
//
// The work graph consists of "required" edges, which every non-planar
// subgraph of the work graph contains, and candidate edges in an order.
// Each round finds, by doubling and binary search over prefixes, the shortest
// prefix of the candidates that together with the required edges is not
// planar; its last edge becomes required and the rest of the candidates are
// dropped. Between rounds the work graph is reduced without changing its
// planarity: vertices of degree one are pruned, vertices of degree two are
// suppressed (their two edges merge into one edge standing for a path), and
// parallel edges are merged. When the required edges alone are not planar
// they form an edge-minimal non-planar subgraph, which by Kuratowski's
// theorem is a subdivision of K5 or K3,3.
//
// Every round orders the candidates with the edges of a depth-first spanning
// forest first and the other edges after them by breadth-first distance (see
// reorder); the first round runs on all of g, starting both searches at the
// vertex where the planarity test found its conflict (vertex 0 when the edge
// count alone decided), and tests each prefix on the part of the forest that
// spans the ends of the non-tree edges in it (see treeFirst), so that it
// costs little even on large graphs.
func FindKuratowski(g *graph.Graph) (*planarcert.Kuratowski, error) {
	lg, perm := lrOf(g)
	r := lrTest(lg, false)
	if r.planar {
		return nil, fmt.Errorf("%w: no Kuratowski subgraph", ErrPlanar)
	}
	fail := r.fail
	if fail >= 0 {
		fail = perm[fail]
	}
	return kuratowskiFrom(g, fail)
}

// kuratowskiFrom runs the search on the non-planar g, starting the first
// round's searches at fail (or at vertex 0 when fail is -1).
func kuratowskiFrom(g *graph.Graph, fail int32) (*planarcert.Kuratowski, error) {
	ks := newKurSearch(g)
	ks.treeFirst(max(fail, 0))
	ks.run()
	return ks.readOff()
}

// kurSearch holds the work graph. Super-edges 0..m-1 are the edges of g;
// later ones stand for the concatenation of two earlier ones (kids).
type kurSearch struct {
	g        *graph.Graph
	ea, eb   []int32    // ends of each super-edge (vertices of g)
	kids     [][2]int32 // for super-edge m+i: the two it merges
	into     []int32    // what a dead super-edge became: another id, or -1 if deleted
	alive    []bool
	req      []bool
	required []int32
	work     []int32

	vmap, vstamp  []int32 // local vertex numbers of this epoch (see localize)
	epoch         int32
	tests, rounds int

	slotA, slotB []int32 // reduce: slot of each super-edge at its ends
	cur          []int32 // reduce: scratch list
	mark         []int32 // reduce: super-edges listed in this epoch
	markEpoch    int32
}

func newKurSearch(g *graph.Graph) *kurSearch {
	m := g.M()
	ks := &kurSearch{g: g, ea: make([]int32, m), eb: make([]int32, m), into: make([]int32, m),
		alive: make([]bool, m), req: make([]bool, m), slotA: make([]int32, m), slotB: make([]int32, m),
		vmap: make([]int32, g.N()), vstamp: make([]int32, g.N())}
	for i, e := range g.Edges() {
		ks.ea[i], ks.eb[i] = e.U, e.V
		ks.alive[i] = true
		ks.into[i] = -1
	}
	return ks
}

// bfsEdgeOrder lists the edges of g by the later breadth-first rank of their
// ends, the search starting at center (the vertex where the planarity test
// found its conflict) and then at the other components.
func bfsEdgeOrder(g *graph.Graph, center int32) []int32 {
	n := g.N()
	rank := make([]int32, n)
	for i := range rank {
		rank[i] = -1
	}
	next := int32(0)
	queue := make([]int32, 0, n)
	for i := int32(-1); int(i) < n; i++ {
		s := i
		if i < 0 {
			s = center
		}
		if n == 0 || rank[s] >= 0 {
			continue
		}
		rank[s] = next
		next++
		queue = append(queue[:0], s)
		for h := 0; h < len(queue); h++ {
			for _, w := range g.Neighbors(queue[h]) {
				if rank[w] < 0 {
					rank[w] = next
					next++
					queue = append(queue, w)
				}
			}
		}
	}
	edges := g.Edges()
	count := make([]int32, n+1)
	for _, e := range edges {
		count[max(rank[e.U], rank[e.V])+1]++
	}
	for i := 1; i <= n; i++ {
		count[i] += count[i-1]
	}
	order := make([]int32, len(edges))
	for i, e := range edges {
		k := max(rank[e.U], rank[e.V])
		order[count[k]] = int32(i)
		count[k]++
	}
	return order
}

// planarWith tests the required edges together with the first k candidates.
func (ks *kurSearch) planarWith(k int) bool {
	ks.tests++
	ks.epoch++
	if ks.epoch == 0 {
		clear(ks.vstamp)
		ks.epoch = 1
	}
	total := len(ks.required) + k
	lg := &lrGraph{eu: make([]int32, 0, total), ev: make([]int32, 0, total)}
	id := func(v int32) int32 {
		if ks.vstamp[v] != ks.epoch {
			ks.vstamp[v] = ks.epoch
			ks.vmap[v] = int32(lg.n)
			lg.n++
		}
		return ks.vmap[v]
	}
	add := func(s int32) {
		lg.eu = append(lg.eu, id(ks.ea[s]))
		lg.ev = append(lg.ev, id(ks.eb[s]))
	}
	for _, s := range ks.required {
		add(s)
	}
	for _, s := range ks.work[:k] {
		add(s)
	}
	return lrTest(lg, false).planar
}

func (ks *kurSearch) run() {
	ks.reorder()
	for {
		if !ks.planarWith(0) || len(ks.work) == 0 {
			return // done, or (never for a non-planar g) nothing left to add
		}
		// Smallest k with required + work[:k] not planar; work[:len] is not.
		k := smallestNonPlanar(len(ks.work), ks.planarWith)
		s := ks.work[k-1]
		ks.req[s] = true
		ks.required = append(ks.required, s)
		ks.work = ks.work[:k-1]
		ks.reduce()
		ks.rounds++
		ks.reorder()
	}
}

func (ks *kurSearch) newSuper(a, b, x, y int32) int32 {
	s := int32(len(ks.ea))
	ks.ea = append(ks.ea, a)
	ks.eb = append(ks.eb, b)
	ks.kids = append(ks.kids, [2]int32{x, y})
	ks.into = append(ks.into, -1)
	ks.alive = append(ks.alive, true)
	ks.slotA = append(ks.slotA, -1)
	ks.slotB = append(ks.slotB, -1)
	ks.req = append(ks.req, ks.req[x] || ks.req[y])
	ks.into[x], ks.into[y] = s, s
	ks.alive[x], ks.alive[y] = false, false
	return s
}

// readOff expands the required super-edges and reads off the subdivision.
func (ks *kurSearch) readOff() (*planarcert.Kuratowski, error) {
	m := int32(ks.g.M())
	adj := make(map[int32][]int32)
	var stack []int32
	for _, s := range ks.required {
		stack = append(stack[:0], s)
		for len(stack) > 0 {
			x := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			if x >= m {
				k := ks.kids[x-m]
				stack = append(stack, k[0], k[1])
				continue
			}
			a, b := ks.ea[x], ks.eb[x]
			adj[a] = append(adj[a], b)
			adj[b] = append(adj[b], a)
		}
	}
	var branch []int32
	for v, nb := range adj {
		if len(nb) >= 3 {
			branch = append(branch, v)
		}
	}
	sortInt32(branch)
	isBranch := make(map[int32]int, len(branch))
	for i, b := range branch {
		isBranch[b] = i
	}
	var k planarcert.Kuratowski
	switch {
	case len(branch) == 5 && allDegree(adj, branch, 4):
		k.Kind = planarcert.K5
	case len(branch) == 6 && allDegree(adj, branch, 3):
		k.Kind = planarcert.K33
	default:
		return nil, fmt.Errorf("planar: internal error: minimal non-planar subgraph has %d branch vertices", len(branch))
	}
	link := make([][]int, len(branch))
	for i, b := range branch {
		for _, w := range adj[b] {
			path := []int32{b}
			prev, cur := b, w
			for {
				path = append(path, cur)
				if _, ok := isBranch[cur]; ok {
					break
				}
				nb := adj[cur]
				if len(nb) != 2 {
					return nil, fmt.Errorf("planar: internal error: path vertex of degree %d", len(nb))
				}
				nx := nb[0]
				if nx == prev {
					nx = nb[1]
				}
				prev, cur = cur, nx
			}
			j := isBranch[cur]
			link[i] = append(link[i], j)
			if i < j {
				k.Paths = append(k.Paths, path)
			}
		}
	}
	k.Branch = branch
	if k.Kind == planarcert.K33 {
		side := make([]int, len(branch))
		for i := range side {
			side[i] = -1
		}
		side[0] = 0
		for _, j := range link[0] {
			side[j] = 1
		}
		var a, b []int32
		for i, s := range side {
			if s == 1 {
				b = append(b, branch[i])
			} else {
				a = append(a, branch[i])
			}
		}
		k.Branch = append(a, b...)
	}
	return &k, nil
}

func allDegree(adj map[int32][]int32, vs []int32, d int) bool {
	for _, v := range vs {
		if len(adj[v]) != d {
			return false
		}
	}
	return true
}

func sortInt32(a []int32) {
	for i := 1; i < len(a); i++ {
		for j := i; j > 0 && a[j] < a[j-1]; j-- {
			a[j], a[j-1] = a[j-1], a[j]
		}
	}
}
