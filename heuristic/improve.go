package heuristic

import (
	"math"

	"spinecert.dev/graph"
)

// placement is a stack page assignment under repair: a segment tree for each
// page below the highest, kept in step with page.
type placement struct {
	g      *graph.Graph
	order  []int32
	ls, rs []int32
	page   []int32
	k      int32
	trees  []*segTree // trees[p-1] for pages 1..k-1
}

func newPlacement(g *graph.Graph, order, ls, rs, page []int32, k int32) *placement {
	n := g.N()
	pt := &placement{g: g, order: order, ls: ls, rs: rs, page: page, k: k}
	pt.trees = make([]*segTree, k-1)
	for p := range pt.trees {
		pt.trees[p] = newSegTree(n)
	}
	// Fill leaves first, then build the inner nodes once.
	for e, p := range page {
		if p < k {
			t := pt.trees[p-1]
			l, r := ls[e]+int32(n), rs[e]+int32(n)
			t.mn[l], t.mx[l] = min(t.mn[l], rs[e]), max(t.mx[l], rs[e])
			t.mn[r], t.mx[r] = min(t.mn[r], ls[e]), max(t.mx[r], ls[e])
		}
	}
	for _, t := range pt.trees {
		for i := n - 1; i >= 1; i-- {
			t.mn[i] = min(t.mn[2*i], t.mn[2*i+1])
			t.mx[i] = max(t.mx[2*i], t.mx[2*i+1])
		}
	}
	return pt
}

// refresh recomputes the leaf of spine position x on page p from the edges there.
func (pt *placement) refresh(x int32, p int32) {
	lo, hi := int32(math.MaxInt32), int32(-1)
	for _, e := range pt.g.IncidentEdges(pt.order[x]) {
		if pt.page[e] != p {
			continue
		}
		y := pt.ls[e]
		if y == x {
			y = pt.rs[e]
		}
		lo, hi = min(lo, y), max(hi, y)
	}
	pt.trees[p-1].set(x, lo, hi)
}

func (pt *placement) put(e int32, p int32) {
	pt.page[e] = p
	t := pt.trees[p-1]
	t.add(pt.ls[e], pt.rs[e])
	t.add(pt.rs[e], pt.ls[e])
}

func (pt *placement) take(e int32) {
	p := pt.page[e]
	pt.page[e] = 0
	pt.refresh(pt.ls[e], p)
	pt.refresh(pt.rs[e], p)
}

// blocking returns an edge of page p that crosses e, given a blocker position.
func (pt *placement) blocking(e int32, p int32, x int32) int32 {
	l, r := pt.ls[e], pt.rs[e]
	for _, f := range pt.g.IncidentEdges(pt.order[x]) {
		if pt.page[f] != p {
			continue
		}
		y := pt.ls[f]
		if y == x {
			y = pt.rs[f]
		}
		if y < l || y > r {
			return f
		}
	}
	return -1
}

// fit returns the lowest page below k (other than skip) that edge e does not cross, or 0.
func (pt *placement) fit(e int32, skip int32) int32 {
	for p := int32(1); p < pt.k; p++ {
		if p != skip && !pt.trees[p-1].crosses(pt.ls[e], pt.rs[e]) {
			return p
		}
	}
	return 0
}

// emptyTop moves every edge of the highest page k to a lower page, either
// directly or by moving the one edge that blocks it to a third page. It
// reports whether page k is now empty; the assignment stays valid either way.
func (pt *placement) emptyTop() bool {
	var top []int32
	for e, p := range pt.page {
		if p == pt.k {
			top = append(top, int32(e))
		}
	}
	for _, e := range top {
		if p := pt.fit(e, 0); p != 0 {
			pt.put(e, p)
			continue
		}
		if !pt.displace(e) {
			return false
		}
	}
	return true
}

// displace puts e on some page p below k whose only edge crossing e can move
// to another page below k.
func (pt *placement) displace(e int32) bool {
	for p := int32(1); p < pt.k; p++ {
		x := pt.trees[p-1].blocker(pt.ls[e], pt.rs[e])
		if x < 0 {
			pt.put(e, p)
			return true
		}
		f := pt.blocking(e, p, x)
		if f < 0 {
			continue
		}
		pt.take(f)
		if !pt.trees[p-1].crosses(pt.ls[e], pt.rs[e]) {
			if q := pt.fit(f, p); q != 0 {
				pt.put(f, q)
				pt.put(e, p)
				return true
			}
		}
		pt.put(f, p)
	}
	return false
}
