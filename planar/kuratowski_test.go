package planar

import (
	"errors"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar/planarcert"
)

func plNonPlanarCert(t *testing.T, g *graph.Graph) *planarcert.Kuratowski {
	t.Helper()
	res, err := Decide(g)
	if err != nil {
		t.Fatal(err)
	}
	if res.Planar {
		t.Fatalf("%v found planar", g)
	}
	if err := planarcert.Check(g, res.Cert); err != nil {
		t.Fatalf("%v: %v", g, err)
	}
	return res.Cert.Kuratowski
}

// K5 and K3,3 are not planar and are their own Kuratowski subgraphs
// (K. Kuratowski, "Sur le problème des courbes gauches en topologie",
// Fund. Math. 15, 1930).
func TestKuratowskiSelf(t *testing.T) {
	for _, c := range []struct {
		g    *graph.Graph
		kind planarcert.KuratowskiKind
	}{{fixture.Complete(5), planarcert.K5}, {fixture.CompleteBipartite(3, 3), planarcert.K33}} {
		k := plNonPlanarCert(t, c.g)
		if k.Kind != c.kind {
			t.Fatalf("%v: kind %s, want %s", c.g, k.Kind, c.kind)
		}
		used := 0
		for _, p := range k.Paths {
			if len(p) != 2 {
				t.Fatalf("%v: path %v is not a single edge", c.g, p)
			}
			used++
		}
		if used != c.g.M() {
			t.Fatalf("%v: %d paths for %d edges", c.g, used, c.g.M())
		}
		if c.kind == planarcert.K33 {
			// The sides of K3,3 as built: {0,1,2} and {3,4,5}.
			a := slices.Sorted(slices.Values(k.Branch[:3]))
			b := slices.Sorted(slices.Values(k.Branch[3:]))
			if !(slices.Equal(a, []int32{0, 1, 2}) && slices.Equal(b, []int32{3, 4, 5}) ||
				slices.Equal(b, []int32{0, 1, 2}) && slices.Equal(a, []int32{3, 4, 5})) {
				t.Fatalf("K3,3 sides %v %v", a, b)
			}
		}
	}
}

// The Petersen graph is not planar; it contains a subdivision of K3,3 and,
// being cubic, none of K5 (common knowledge, no source).
func TestKuratowskiPetersen(t *testing.T) {
	k := plNonPlanarCert(t, fixture.Petersen())
	if k.Kind != planarcert.K33 {
		t.Fatalf("Petersen: %s subdivision", k.Kind)
	}
}

// Larger non-planar graphs: K_n, K_{3,n}, random graphs, planar graphs with
// one extra edge far away.
func TestKuratowskiVarious(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 7))
	gs := []*graph.Graph{fixture.Complete(6), fixture.Complete(9), fixture.CompleteBipartite(3, 7), fixture.CompleteBipartite(4, 4)}
	for i := 0; i < 40; i++ {
		gs = append(gs, fixture.RandomGraph(rng, 50+rng.IntN(300), 400+rng.IntN(400)))
	}
	for _, g := range gs {
		plNonPlanarCert(t, g)
	}
	if _, err := FindKuratowski(fixture.Grid(5, 5)); !errors.Is(err, ErrPlanar) {
		t.Fatalf("grid: %v, want ErrPlanar", err)
	}
}

func TestKuratowskiMutations(t *testing.T) {
	g := fixture.Petersen()
	k := plNonPlanarCert(t, g)
	clone := func() *planarcert.Kuratowski {
		c := &planarcert.Kuratowski{Kind: k.Kind, Branch: slices.Clone(k.Branch)}
		for _, p := range k.Paths {
			c.Paths = append(c.Paths, slices.Clone(p))
		}
		return c
	}
	long := 0
	for i, p := range k.Paths {
		if len(p) > len(k.Paths[long]) {
			long = i
		}
	}
	if len(k.Paths[long]) < 3 {
		t.Fatal("Petersen subdivision with no subdivided path")
	}
	cases := map[string]func(c *planarcert.Kuratowski){
		"break a path": func(c *planarcert.Kuratowski) {
			p := c.Paths[long]
			c.Paths[long] = append(p[:1:1], p[2:]...)
		},
		"drop a path":     func(c *planarcert.Kuratowski) { c.Paths = c.Paths[1:] },
		"wrong kind":      func(c *planarcert.Kuratowski) { c.Kind = planarcert.K5 },
		"swap sides":      func(c *planarcert.Kuratowski) { c.Branch[0], c.Branch[3] = c.Branch[3], c.Branch[0] },
		"repeat a path":   func(c *planarcert.Kuratowski) { c.Paths[1] = slices.Clone(c.Paths[0]) },
		"branch repeated": func(c *planarcert.Kuratowski) { c.Branch[1] = c.Branch[0] },
	}
	for name, mutate := range cases {
		c := clone()
		mutate(c)
		if err := planarcert.CheckKuratowski(g, c); !errors.Is(err, planarcert.ErrRejected) {
			t.Errorf("%s: accepted (%v)", name, err)
		}
	}
	// Two paths sharing an inner vertex: K3,3 with an extra vertex x on the
	// paths 0–3 and 1–4 (both through x, which is adjacent to 0, 1, 3, 4).
	h := fixture.Numbered(7, [][2]int{{0, 3}, {0, 4}, {0, 5}, {1, 3}, {1, 4}, {1, 5}, {2, 3}, {2, 4}, {2, 5}, {0, 6}, {1, 6}, {3, 6}, {4, 6}})
	bad := &planarcert.Kuratowski{Kind: planarcert.K33, Branch: []int32{0, 1, 2, 3, 4, 5}, Paths: [][]int32{
		{0, 6, 3}, {0, 4}, {0, 5}, {1, 3}, {1, 6, 4}, {1, 5}, {2, 3}, {2, 4}, {2, 5}}}
	if err := planarcert.CheckKuratowski(h, bad); err == nil || !strings.Contains(err.Error(), "share") {
		t.Fatalf("shared inner vertex: %v", err)
	}
	bad.Paths[4] = []int32{1, 4}
	if err := planarcert.CheckKuratowski(h, bad); err != nil {
		t.Fatalf("repaired certificate: %v", err)
	}
}

// Long obstructions: a grid with one diagonal across many columns, and
// stacked triangulations with one extra edge, so that the tube found by
// shrink is thin or wide; planarcert checks every certificate.
func TestKuratowskiLong(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for _, c := range []int{40, 300} {
		r := 10
		e := fixture.EdgePairs(fixture.Grid(r, c))
		g := fixture.Numbered(r*c, append(e, [2]int{(r/2)*c + c/5, (r/2+1)*c + 4*c/5}))
		plNonPlanarCert(t, g)
	}
	for i := 0; i < 20; i++ {
		n := 20 + rng.IntN(2000)
		e := fixture.RandomTriangulationEdges(rng, n)
		for {
			a, b := rng.IntN(n), rng.IntN(n)
			if a != b && !plHasPair(e, a, b) {
				plNonPlanarCert(t, fixture.Numbered(n, append(e, [2]int{a, b})))
				break
			}
		}
	}
}

// plMinimal checks that the edges of k's paths form a non-planar graph that
// every single edge deletion makes planar (edge-minimal), by brute force with
// the planarity test on the subgraph alone.
func plMinimal(t *testing.T, g *graph.Graph, k *planarcert.Kuratowski) {
	t.Helper()
	num := map[int32]int{}
	id := func(v int32) int {
		if i, ok := num[v]; ok {
			return i
		}
		num[v] = len(num)
		return len(num) - 1
	}
	var e [][2]int
	for _, p := range k.Paths {
		for i := 1; i < len(p); i++ {
			e = append(e, [2]int{id(p[i-1]), id(p[i])})
		}
	}
	if IsPlanar(fixture.Numbered(len(num), e)) {
		t.Fatalf("%v: the subdivision found is planar", g)
	}
	for i := range e {
		rest := append(slices.Clone(e[:i]), e[i+1:]...)
		if !IsPlanar(fixture.Numbered(len(num), rest)) {
			t.Fatalf("%v: the subdivision found stays non-planar without edge %v", g, e[i])
		}
	}
}

// plPlant adds to the planar edge list e on n vertices a subdivision of K5
// (k5) or K3,3 whose branch vertices are random old vertices and whose paths
// run through 0..3 new vertices each.
func plPlant(rng *rand.Rand, n int, e [][2]int, k5 bool) (int, [][2]int) {
	var pairs [][2]int
	var branch []int
	if k5 {
		branch = rng.Perm(n)[:5]
		for i := 0; i < 5; i++ {
			for j := i + 1; j < 5; j++ {
				pairs = append(pairs, [2]int{branch[i], branch[j]})
			}
		}
	} else {
		branch = rng.Perm(n)[:6]
		for i := 0; i < 3; i++ {
			for j := 3; j < 6; j++ {
				pairs = append(pairs, [2]int{branch[i], branch[j]})
			}
		}
	}
	for _, p := range pairs {
		prev := p[0]
		for range rng.IntN(4) {
			e = append(e, [2]int{prev, n})
			prev = n
			n++
		}
		if prev == p[0] && plHasPair(e, p[0], p[1]) {
			// The base graph has this edge already; route through a new vertex.
			e = append(e, [2]int{prev, n})
			prev = n
			n++
		}
		e = append(e, [2]int{prev, p[1]})
	}
	return n, e
}

// Subdivisions of K5 and K3,3 planted in grids and triangulations, grids and
// triangulations with one extra edge, and random dense graphs: the search
// returns a certificate that planarcert accepts and that is edge-minimal
// (checked edge by edge), whichever round finds it.
func TestKuratowskiPlantedMinimal(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 13))
	for i := 0; i < 60; i++ {
		var n int
		var e [][2]int
		switch i % 4 {
		case 0, 1:
			r, c := 2+rng.IntN(12), 2+rng.IntN(60)
			n, e = r*c, fixture.EdgePairs(fixture.Grid(r, c))
		default:
			n = 6 + rng.IntN(1500)
			e = fixture.RandomTriangulationEdges(rng, n)
		}
		switch {
		case i%3 == 2 && i%4 >= 2:
			for {
				a, b := rng.IntN(n), rng.IntN(n)
				if a != b && !plHasPair(e, a, b) {
					e = append(e, [2]int{a, b})
					break
				}
			}
		default:
			n, e = plPlant(rng, n, e, i%2 == 0)
		}
		perm := rng.Perm(n)
		for j := range e {
			e[j] = [2]int{perm[e[j][0]], perm[e[j][1]]}
		}
		g := fixture.Numbered(n, e)
		if IsPlanar(g) {
			continue // a triangulation plus an edge of a face's neighbour, say
		}
		plMinimal(t, g, plNonPlanarCert(t, g))
	}
	for i := 0; i < 30; i++ {
		n := 8 + rng.IntN(60)
		g := fixture.RandomGraph(rng, n, 3*n+rng.IntN(4*n))
		plMinimal(t, g, plNonPlanarCert(t, g))
	}
}

// On random graphs with 5 to 7 vertices the search agrees with brute force:
// it fails with ErrPlanar exactly when no edge subset is a subdivision of K5
// or K3,3, and what it returns is accepted and edge-minimal.
func TestKuratowskiSmallBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 19))
	found := map[bool]int{}
	defer func() {
		if found[true] == 0 || found[false] == 0 {
			t.Errorf("the sample has %d graphs with and %d without a Kuratowski subgraph", found[true], found[false])
		}
	}()
	for i := 0; i < 400; i++ {
		n := 5 + rng.IntN(3)
		var e [][2]int
		for a := 0; a < n; a++ {
			for b := a + 1; b < n; b++ {
				if rng.IntN(10) < 7 {
					e = append(e, [2]int{a, b})
				}
			}
		}
		g := fixture.Numbered(n, e)
		brute := plBruteKuratowski(n, e)
		found[brute]++
		k, err := FindKuratowski(g)
		if !brute {
			if !errors.Is(err, ErrPlanar) {
				t.Fatalf("%v %v: no Kuratowski subgraph by brute force, search gave %v", g, e, err)
			}
			continue
		}
		if err != nil {
			t.Fatalf("%v %v: %v", g, e, err)
		}
		if err := planarcert.CheckKuratowski(g, k); err != nil {
			t.Fatalf("%v %v: %v", g, e, err)
		}
		plMinimal(t, g, k)
	}
}

// plBruteKuratowski reports whether some edge subset of the graph is a
// subdivision of K5 or K3,3, trying every subset: a subset is one when its
// vertices have degree 0 or 2 except for five of degree 4 or six of degree
// 3, joined pairwise by distinct paths that use all its edges, the six
// forming K3,3.
func plBruteKuratowski(n int, e [][2]int) bool {
	m := len(e)
	for mask := 1; mask < 1<<m; mask++ {
		if plIsSubdivision(n, e, mask) {
			return true
		}
	}
	return false
}

func plIsSubdivision(n int, e [][2]int, mask int) bool {
	adj := make([][]int, n)
	for i, x := range e {
		if mask>>i&1 == 1 {
			adj[x[0]] = append(adj[x[0]], x[1])
			adj[x[1]] = append(adj[x[1]], x[0])
		}
	}
	var branch []int
	for v := range adj {
		switch len(adj[v]) {
		case 0, 2:
		case 3, 4:
			branch = append(branch, v)
		default:
			return false
		}
	}
	d := 0
	switch len(branch) {
	case 5:
		d = 4
	case 6:
		d = 3
	default:
		return false
	}
	isBranch := make([]bool, n)
	for _, b := range branch {
		if len(adj[b]) != d {
			return false
		}
		isBranch[b] = true
	}
	// Follow every path from a branch vertex to the next one.
	seen := map[[2]int]bool{}
	used := 0
	for _, b := range branch {
		for _, w := range adj[b] {
			prev, cur := b, w
			steps := 1
			for !isBranch[cur] {
				nx := adj[cur][0]
				if nx == prev {
					nx = adj[cur][1]
				}
				prev, cur = cur, nx
				steps++
			}
			if cur == b || seen[[2]int{b, cur}] {
				return false // a loop or a second path between the same pair
			}
			seen[[2]int{b, cur}] = true
			used += steps
		}
	}
	if used != 2*bits(mask) {
		return false // a cycle apart from the paths
	}
	if d == 3 {
		// K3,3 and not the prism, which is the other cubic graph on six
		// vertices: the branch graph is bipartite.
		color := map[int]int{branch[0]: 0}
		for changed := true; changed; {
			changed = false
			for p := range seen {
				c, ok := color[p[0]]
				if !ok {
					continue
				}
				if c2, ok := color[p[1]]; !ok {
					color[p[1]] = 1 - c
					changed = true
				} else if c2 == c {
					return false
				}
			}
		}
	}
	return true
}

func bits(x int) int {
	c := 0
	for ; x != 0; x &= x - 1 {
		c++
	}
	return c
}
