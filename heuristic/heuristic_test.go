package heuristic

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// checkLayout validates l against g by brute force over all pairs of edges on
// a page (the definitions of stack and queue pages in cert/layout.go); it
// also checks that the spine is a permutation and every edge has a page in
// 1..Pages(). It returns the number of pages used.
func checkLayout(t *testing.T, g *graph.Graph, l *cert.Layout) int {
	t.Helper()
	if err := bruteCheck(g, l); err != nil {
		t.Fatal(err)
	}
	if rep := cert.Validate(g, l); !rep.OK() {
		t.Fatalf("cert.Validate rejects what brute force accepts: %v", rep.Err())
	}
	return l.Pages()
}

func bruteCheck(g *graph.Graph, l *cert.Layout) error {
	n := g.N()
	if len(l.Order) != n {
		return fmt.Errorf("spine has %d vertices, graph %d", len(l.Order), n)
	}
	pos := make([]int32, n)
	for i := range pos {
		pos[i] = -1
	}
	for i, v := range l.Order {
		if v < 0 || int(v) >= n || pos[v] >= 0 {
			return fmt.Errorf("spine position %d: bad or repeated vertex %d", i, v)
		}
		pos[v] = int32(i)
	}
	if len(l.Page) != g.M() {
		return fmt.Errorf("%d pages for %d edges", len(l.Page), g.M())
	}
	k := l.Pages()
	byPage := make([][][2]int32, k+1)
	for e, p := range l.Page {
		if p < 1 || int(p) > k {
			return fmt.Errorf("edge %d on page %d of %d", e, p, k)
		}
		a, b := pos[g.Edges()[e].U], pos[g.Edges()[e].V]
		if a > b {
			a, b = b, a
		}
		byPage[p] = append(byPage[p], [2]int32{a, b})
	}
	for p := 1; p <= k; p++ {
		es := byPage[p]
		kind := l.PageKinds[p-1]
		for i := range es {
			for j := range es {
				a, b, c, d := es[i][0], es[i][1], es[j][0], es[j][1]
				if kind == cert.Stack && a < c && c < b && b < d {
					return fmt.Errorf("page %d: edges %v and %v cross", p, es[i], es[j])
				}
				if kind == cert.Queue && a < c && c < d && d < b {
					return fmt.Errorf("page %d: edges %v and %v nest", p, es[i], es[j])
				}
			}
		}
	}
	return nil
}

// checkFast is checkLayout for large layouts: the same conditions by a sweep
// (stack: a page's edges sorted by left end and right end descending must
// nest like brackets; queue: the right ends, in left-end order within
// groups of equal left end, never fall below an earlier edge's right end
// from a strictly smaller left end).
func checkFast(t *testing.T, g *graph.Graph, l *cert.Layout) int {
	t.Helper()
	if err := sweepCheck(g, l); err != nil {
		t.Fatal(err)
	}
	if rep := cert.Validate(g, l); !rep.OK() {
		t.Fatalf("cert.Validate rejects what the sweep accepts: %v", rep.Err())
	}
	return l.Pages()
}

func sweepCheck(g *graph.Graph, l *cert.Layout) error {
	n := g.N()
	pos := make([]int32, n)
	seen := make([]bool, n)
	if len(l.Order) != n || len(l.Page) != g.M() {
		return fmt.Errorf("layout sizes %d/%d for graph n=%d m=%d", len(l.Order), len(l.Page), n, g.M())
	}
	for i, v := range l.Order {
		if v < 0 || int(v) >= n || seen[v] {
			return fmt.Errorf("spine position %d: bad or repeated vertex %d", i, v)
		}
		seen[v] = true
		pos[v] = int32(i)
	}
	ls := make([]int32, g.M())
	rs := make([]int32, g.M())
	for e, ed := range g.Edges() {
		a, b := pos[ed.U], pos[ed.V]
		ls[e], rs[e] = min(a, b), max(a, b)
		if p := l.Page[e]; p < 1 || int(p) > l.Pages() {
			return fmt.Errorf("edge %d on page %d of %d", e, p, l.Pages())
		}
	}
	order := sortByLeft(ls, rs, n, l.Kind == cert.Stack)
	k := l.Pages()
	stacks := make([][]int32, k+1)
	maxR := make([]int32, k+1)
	pend := make([]int32, k+1)
	lastL := make([]int32, k+1)
	for i := range lastL {
		lastL[i], maxR[i], pend[i] = -1, -1, -1
	}
	for _, e := range order {
		p, a, b := l.Page[e], ls[e], rs[e]
		if l.Kind == cert.Stack {
			st := stacks[p]
			for len(st) > 0 && st[len(st)-1] <= a {
				st = st[:len(st)-1]
			}
			if len(st) > 0 && st[len(st)-1] < b {
				return fmt.Errorf("page %d: edge (%d,%d) crosses an edge ending at %d", p, a, b, st[len(st)-1])
			}
			stacks[p] = append(st, b)
			continue
		}
		if a != lastL[p] {
			maxR[p] = max(maxR[p], pend[p])
			lastL[p] = a
		}
		if maxR[p] > b {
			return fmt.Errorf("page %d: edge (%d,%d) nests under an edge ending at %d", p, a, b, maxR[p])
		}
		pend[p] = max(pend[p], b)
	}
	return nil
}

// edgeBound is the least k with m <= (k+1)n - 3k, the edge bound for k-page
// stack layouts (Bernhart and Kainen, "The book thickness of a graph", JCTB
// 27, 1979; from memory): a k-page book embedding is k outerplanar graphs on
// a common spine, each with at most 2n-3 edges of which the n-1 spine edges
// are shared.
func edgeBound(n, m int) int {
	if m == 0 {
		return 0
	}
	k := 1
	for n > 3 && m > (k+1)*n-3*k {
		k++
	}
	return k
}

// Complete graphs: bt(K_n) = ⌈n/2⌉ for n ≥ 4 (Bernhart and Kainen 1979).
func TestStackComplete(t *testing.T) {
	for n := 4; n <= 40; n++ {
		g := fixture.Complete(n)
		l := Stack(g, Options{})
		if k := checkLayout(t, g, l); k != (n+1)/2 {
			t.Errorf("K_%d: %d pages, want %d", n, k, (n+1)/2)
		}
	}
}

// Queue number of K_n is ⌊n/2⌋ (Heath and Rosenberg, "Laying out graphs
// using queues", SIAM J. Comput. 21(5), 1992; from memory). Every spine
// order of K_n has a rainbow of ⌊n/2⌋ nested edges, so the value is
// reached exactly by the fixed-order optimum.
func TestQueueComplete(t *testing.T) {
	for n := 2; n <= 30; n++ {
		g := fixture.Complete(n)
		l := Queue(g, Options{Candidates: 2})
		if k := checkLayout(t, g, l); k != n/2 {
			t.Errorf("K_%d: %d queues, want %d", n, k, n/2)
		}
	}
}

// Trees: 1 stack page with a DFS order (common practice, no source) and 1
// queue with a BFS order (Heath, Leighton and Rosenberg, "Comparing queues
// and stacks as mechanisms for laying out graphs", SIAM J. Discrete Math.
// 5(3), 1992).
func TestTrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 200; i++ {
		g := fixture.ShuffledRandomTree(rng, 2+rng.IntN(60))
		for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
			l, err := Find(g, kind, Options{Seed: int64(i), Candidates: 1})
			if err != nil {
				t.Fatal(err)
			}
			if k := checkLayout(t, g, l); k != 1 {
				t.Fatalf("tree %d (%v): %d %s pages, want 1", i, g, k, kind)
			}
		}
	}
}

// Grids P_w x P_h have page number at most 2 (planar of maximum degree 4:
// Bekos, Gronemann and Raftopoulou, STACS 2014). With row-major labels the
// input-order DFS walks the rows as a snake, on which 2 pages suffice
// (common practice, no source); row-major order itself is a 2-queue layout
// (horizontal edges on one queue, vertical on the other).
func TestGrids(t *testing.T) {
	for _, wh := range [][2]int{{3, 3}, {5, 4}, {10, 10}, {30, 7}} {
		g := fixture.Grid(wh[1], wh[0])
		if k := checkLayout(t, g, Stack(g, Options{})); k > 2 {
			t.Errorf("grid %v: %d pages, want at most 2", wh, k)
		}
		if k := checkLayout(t, g, Queue(g, Options{})); k > 2 {
			t.Errorf("grid %v: %d queues, want at most 2", wh, k)
		}
	}
}

// Every layout is valid and never uses fewer pages than the edge bound
// allows (a count below it would mean an invalid layout slipped through).
// Page counts on random maximal planar graphs are logged, not asserted: the
// heuristic has no guarantee to reach the 4 pages every planar graph admits
// (Yannakakis, "Embedding planar graphs in four pages", JCSS 38, 1989).
func TestRandomValidAndBound(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 60; i++ {
		n := 5 + rng.IntN(40)
		g := fixture.RandomGNP(rng, n, rng.Float64())
		for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
			l, _ := Find(g, kind, Options{Seed: int64(i), Candidates: 4})
			k := checkLayout(t, g, l)
			if kind == cert.Stack && k < edgeBound(n, g.M()) {
				t.Fatalf("%v: %d pages, below the edge bound %d", g, k, edgeBound(n, g.M()))
			}
		}
	}
	for i := 0; i < 20; i++ {
		n := 4 + rng.IntN(200)
		g := fixture.RandomFlippedTriangulation(rng, n, n).Graph()
		if g.M() != 3*n-6 {
			t.Fatalf("generator: n=%d m=%d, want 3n-6", n, g.M())
		}
		l := Stack(g, Options{Seed: int64(i)})
		k := checkLayout(t, g, l)
		if k < edgeBound(n, g.M()) {
			t.Fatalf("%v: %d pages, below the edge bound", g, k)
		}
		t.Logf("maximal planar n=%d: %d stack pages, %d queues", n, k, checkLayout(t, g, Queue(g, Options{Seed: int64(i)})))
	}
}

func TestDeterministic(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	g := fixture.RandomFlippedTriangulation(rng, 300, 300).Graph()
	a := Stack(g, Options{Seed: 7})
	b := Stack(g, Options{Seed: 7})
	if a.Pages() != b.Pages() || !slices.Equal(a.Order, b.Order) || !slices.Equal(a.Page, b.Page) {
		t.Fatal("same seed gave different layouts")
	}
}

func TestFindKind(t *testing.T) {
	if _, err := Find(fixture.Complete(4), cert.Mixed, Options{}); err == nil {
		t.Fatal("mixed kind accepted")
	}
}

func TestEmptyAndTiny(t *testing.T) {
	for _, g := range []*graph.Graph{fixture.MustNumbered(t, 0, nil), fixture.MustNumbered(t, 1, nil), fixture.MustNumbered(t, 3, nil), fixture.MustNumbered(t, 2, [][2]int{{0, 1}})} {
		for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
			l, _ := Find(g, kind, Options{})
			k := checkLayout(t, g, l)
			if want := min(g.M(), 1); k != want {
				t.Errorf("%v %s: %d pages, want %d", g, kind, k, want)
			}
		}
	}
}

// The fast checker used for large layouts agrees with the brute-force one
// on random layouts (valid or not).
func TestCheckFastAgrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 9))
	bad := 0
	for i := 0; i < 300; i++ {
		n := 3 + rng.IntN(12)
		g := fixture.RandomGNP(rng, n, 0.5)
		kind := cert.Stack
		if i%2 == 1 {
			kind = cert.Queue
		}
		k := 1 + rng.IntN(3)
		order := make([]int32, n)
		for j, v := range rng.Perm(n) {
			order[j] = int32(v)
		}
		page := make([]int32, g.M())
		for e := range page {
			page[e] = int32(1 + rng.IntN(k))
		}
		l := newLayout(kind, order, page, int32(k))
		slow, fast := bruteCheck(g, l), sweepCheck(g, l)
		if (slow == nil) != (fast == nil) {
			t.Fatalf("checkers disagree on layout %d: brute force: %v; sweep: %v", i, slow, fast)
		}
		if slow != nil {
			bad++
		}
	}
	if bad == 0 || bad == 300 {
		t.Fatalf("%d of 300 random layouts invalid: the comparison needs both outcomes", bad)
	}
}

// Larger graphs (checked by sweep and by cert.Validate): a random maximal
// planar graph with 3·10^4 edges and a 200x200 grid.
func TestLarge(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	g := fixture.RandomFlippedTriangulation(rng, 10002, 10000).Graph()
	for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
		l, _ := Find(g, kind, Options{Seed: 1, Candidates: 3})
		k := checkFast(t, g, l)
		if kind == cert.Stack && k < edgeBound(g.N(), g.M()) {
			t.Fatalf("%d pages, below the edge bound", k)
		}
		t.Logf("%v: %d %s pages", g, k, kind)
	}
	g = fixture.Grid(200, 200)
	if k := checkFast(t, g, Stack(g, Options{Candidates: 2})); k > 2 {
		t.Errorf("grid 200x200: %d pages, want at most 2", k)
	}
}
