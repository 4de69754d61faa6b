package heuristic

import (
	"math"
	"math/rand/v2"
	"time"

	"spinecert.dev/graph"
)

// stackPages assigns stack pages for a fixed spine order: the better of a
// first-fit sweep by left end and a first fit by decreasing length, then
// rounds of iterated first fit and moves that try to empty the highest
// page, until a round gains nothing or the deadline passes.
//
// A candidate whose sweep needs more than twice the pages of the best so far
// (bestK > 0) is dropped: the result then has nil pages.
func stackPages(g *graph.Graph, order []int32, deadline time.Time, rng *rand.Rand, bestK int32) ([]int32, int32) {
	n := g.N()
	ls, rs := spans(g, order)
	limit := int32(math.MaxInt32)
	if bestK > 0 {
		limit = 2 * bestK
	}
	page, k := sweepStack(ls, rs, n, limit)
	if k <= 1 || page == nil {
		return page, k
	}
	// The improvement passes below cost O(m·k·log n) each; their number is
	// bounded by a fixed amount of work so that large graphs spend their
	// time on the sweep, and results stay independent of the clock.
	passes := improveWork / (int64(len(ls)) * int64(k))
	if passes < 1 {
		return page, k
	}
	if p2, k2 := firstFit(ls, rs, n, byLength(ls, rs, n), k-1, deadline); k2 < k {
		page, k = p2, k2
	}
	for stale := 0; stale < 3 && k > 1 && passes > 0 && !past(deadline); passes-- {
		p2, k2 := firstFit(ls, rs, n, byClass(page, k, ls, rs, n, rng), k, deadline)
		if p2 == nil {
			break
		}
		if k2 < k {
			page, k, stale = p2, k2, 0
			continue
		}
		page = p2
		pt := newPlacement(g, order, ls, rs, page, k)
		if pt.emptyTop() {
			k--
			stale = 0
			continue
		}
		stale++
	}
	return page, k
}

// improveWork bounds the edge-page probes of the improvement passes per
// spine candidate (a fraction of a second of work).
const improveWork = 20_000_000

func past(deadline time.Time) bool { return !deadline.IsZero() && time.Now().After(deadline) }

// byClass orders the edges page by page, the pages in random order, so that
// first fit over this order uses no more pages than the given assignment
// (each page is a set of pairwise non-crossing edges; J. Culberson and F.
// Luo, "Exploring the k-colorable landscape with iterated greedy", DIMACS
// Series 26, 1996). Within a page, edges keep their order by decreasing
// length.
func byClass(page []int32, k int32, ls, rs []int32, n int, rng *rand.Rand) []int32 {
	perm := rng.Perm(int(k))
	rank := make([]int32, k+1)
	for i, p := range perm {
		rank[p+1] = int32(i)
	}
	count := make([]int32, k+1)
	length := byLength(ls, rs, n)
	for _, p := range page {
		count[rank[p]+1]++
	}
	for i := int32(0); i < k; i++ {
		count[i+1] += count[i]
	}
	out := make([]int32, len(page))
	for _, e := range length {
		r := rank[page[e]]
		out[count[r]] = e
		count[r]++
	}
	return out
}

// byLength returns the edges by decreasing spine length (a counting sort).
func byLength(ls, rs []int32, n int) []int32 {
	count := make([]int32, n+1)
	for e := range ls {
		count[n-1-int(rs[e]-ls[e])+1]++
	}
	for i := 0; i < n; i++ {
		count[i+1] += count[i]
	}
	sorted := make([]int32, len(ls))
	for e := range ls {
		d := n - 1 - int(rs[e]-ls[e])
		sorted[count[d]] = int32(e)
		count[d]++
	}
	return sorted
}

// sweepStack is the one-pass first fit: edges by left end ascending and
// right end descending; each page is a stack of the right ends of its open
// arcs, and an edge fits a page when, after closed arcs are popped, the top
// arc contains it. It gives up (nil, limit+1) when more than limit pages
// would be needed.
func sweepStack(ls, rs []int32, n int, limit int32) ([]int32, int32) {
	sorted := sortByLeft(ls, rs, n, true)
	page := make([]int32, len(ls))
	var stacks [][]int32
	for _, e := range sorted {
		l, r := ls[e], rs[e]
		p := 0
		for ; p < len(stacks); p++ {
			st := stacks[p]
			for len(st) > 0 && st[len(st)-1] <= l {
				st = st[:len(st)-1]
			}
			stacks[p] = st
			if len(st) == 0 || st[len(st)-1] >= r {
				break
			}
		}
		if p == len(stacks) {
			if int32(p) == limit {
				return nil, limit + 1
			}
			stacks = append(stacks, nil)
		}
		stacks[p] = append(stacks[p], r)
		page[e] = int32(p + 1)
	}
	return page, int32(len(stacks))
}

// firstFit puts the edges, in the given order, each on the lowest page it
// does not cross; each page is a segment tree answering whether an edge
// would cross the page. It gives up (nil, limit+1) when more than limit
// pages would be needed or the deadline passes.
func firstFit(ls, rs []int32, n int, sorted []int32, limit int32, deadline time.Time) ([]int32, int32) {
	m := len(ls)
	page := make([]int32, m)
	var trees []*segTree
	for i, e := range sorted {
		if i&(1<<14-1) == 1<<14-1 && past(deadline) {
			return nil, limit + 1
		}
		l, r := ls[e], rs[e]
		p := 0
		for ; p < len(trees); p++ {
			if !trees[p].crosses(l, r) {
				break
			}
		}
		if p == len(trees) {
			if int32(p) == limit {
				return nil, limit + 1
			}
			trees = append(trees, newSegTree(n))
		}
		trees[p].add(l, r)
		trees[p].add(r, l)
		page[e] = int32(p + 1)
	}
	return page, int32(len(trees))
}

// segTree holds, for every spine position x, the least and greatest other
// end of the page's edges at x. An edge (l, r) crosses an edge of the page
// exactly when some x strictly between l and r has an other end < l or > r.
type segTree struct {
	n      int
	mn, mx []int32
}

func newSegTree(n int) *segTree {
	t := &segTree{n: n, mn: make([]int32, 2*n), mx: make([]int32, 2*n)}
	for i := range t.mn {
		t.mn[i] = math.MaxInt32
		t.mx[i] = -1
	}
	return t
}

// add records an edge end at x whose other end is y.
func (t *segTree) add(x, y int32) {
	i := int(x) + t.n
	t.mn[i] = min(t.mn[i], y)
	t.mx[i] = max(t.mx[i], y)
	t.fix(i)
}

// set replaces the leaf of x.
func (t *segTree) set(x, lo, hi int32) {
	i := int(x) + t.n
	t.mn[i], t.mx[i] = lo, hi
	t.fix(i)
}

func (t *segTree) fix(i int) {
	for i >>= 1; i >= 1; i >>= 1 {
		mn := min(t.mn[2*i], t.mn[2*i+1])
		mx := max(t.mx[2*i], t.mx[2*i+1])
		if t.mn[i] == mn && t.mx[i] == mx {
			return
		}
		t.mn[i], t.mx[i] = mn, mx
	}
}

func (t *segTree) bad(i int, l, r int32) bool { return t.mn[i] < l || t.mx[i] > r }

// crosses reports whether (l, r) crosses an edge of the page.
func (t *segTree) crosses(l, r int32) bool { return t.blocker(l, r) >= 0 }

// blocker returns a position strictly between l and r holding an edge end
// that crosses (l, r), or -1.
func (t *segTree) blocker(l, r int32) int32 {
	lo, hi := int(l)+1+t.n, int(r)+t.n
	for lo < hi {
		if lo&1 == 1 {
			if t.bad(lo, l, r) {
				return t.descend(lo, l, r)
			}
			lo++
		}
		if hi&1 == 1 {
			hi--
			if t.bad(hi, l, r) {
				return t.descend(hi, l, r)
			}
		}
		lo >>= 1
		hi >>= 1
	}
	return -1
}

func (t *segTree) descend(i int, l, r int32) int32 {
	for i < t.n {
		if t.bad(2*i, l, r) {
			i = 2 * i
		} else {
			i = 2*i + 1
		}
	}
	return int32(i - t.n)
}
