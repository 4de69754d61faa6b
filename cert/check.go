package cert

import (
	"fmt"
	"slices"

	"spinecert.dev/graph"
)

// Validate checks a resolved layout of g: the spine must be a permutation of
// the vertices, every edge must have a page in 1..l.Pages(), and no page may
// hold two conflicting edges (a crossing on a stack page, a nesting on a queue
// page). It runs in O(n + m) time after the input is read and reports every
// kind of problem with a witness (up to MaxWitnesses of each kind).
func Validate(g *graph.Graph, l *Layout) *Report {
	r := &Report{}
	validateInto(g, l, 0, true, r, nil)
	return r
}

// validateInto is Validate with an optional page limit (0 = none), adding to r.
// Without coverage, vertices missing from the spine and edges without a page
// are taken as already reported (by Resolve) and skipped. pos, when not nil,
// holds the spine position of every vertex as l.Order gives it (-1 for the
// vertices not on it), and l.Order is known to be a list of distinct vertices
// of g; otherwise both are worked out here.
func validateInto(g *graph.Graph, l *Layout, limit int, coverage bool, r *Report, pos []int32) {
	r.Pages, r.Kind = l.Pages(), l.Kind
	n, m := g.N(), g.M()
	if pos == nil {
		pos = make([]int32, n)
		for i := range pos {
			pos[i] = -1
		}
		for i, v := range l.Order {
			switch {
			case v < 0 || int(v) >= n:
				r.add(Problem{Kind: UnknownVertex, Msg: fmt.Sprintf("spine position %d holds vertex index %d, not in the graph", i, v)})
			case pos[v] >= 0:
				r.add(Problem{Kind: DuplicateVertex, Vertex: g.Labels()[v], Msg: fmt.Sprintf("vertex %q is on the spine twice (positions %d and %d)", g.Labels()[v], pos[v], i)})
			default:
				pos[v] = int32(i)
			}
		}
	}
	if coverage {
		for v := range pos {
			if pos[v] < 0 {
				r.add(Problem{Kind: MissingVertex, Vertex: g.Labels()[v], Msg: fmt.Sprintf("vertex %q is not on the spine", g.Labels()[v])})
			}
		}
	}
	if len(l.Page) != m {
		r.add(Problem{Kind: MissingEdge, Msg: fmt.Sprintf("layout gives pages for %d edges, the graph has %d", len(l.Page), m)})
		return
	}
	k := int32(l.Pages())
	r.PerPage = make([]int, k)
	// start[p+1] counts the edges of page p whose two ends are on the
	// spine: the edges the conflict scans look at
	start := make([]int32, k+2)
	ge := g.Edges()
	for e, p := range l.Page {
		switch {
		case p == 0:
			if !coverage {
				continue
			}
			r.add(Problem{Kind: MissingEdge, Edges: []WitnessEdge{r.witness(g, pos, e, 0)}, Msg: fmt.Sprintf("edge %s has no page", edgeName(g, e))})
		case p < 1 || p > k:
			r.add(Problem{Kind: BadPage, Page: int(p), Edges: []WitnessEdge{r.witness(g, pos, e, p)}, Msg: fmt.Sprintf("edge %s is on page %d, outside 1..%d", edgeName(g, e), p, k)})
		default:
			r.PerPage[p-1]++
			if pos[ge[e].U] >= 0 && pos[ge[e].V] >= 0 {
				start[p+1]++
			}
			if limit > 0 && int(p) > limit {
				r.add(Problem{Kind: PageLimit, Page: int(p), Edges: []WitnessEdge{r.witness(g, pos, e, p)}, Msg: fmt.Sprintf("edge %s is on page %d, above the limit of %d pages", edgeName(g, e), p, limit)})
			}
		}
	}
	for p := len(r.PerPage); p > 0; p-- {
		if r.PerPage[p-1] > 0 {
			r.Used = p
			break
		}
	}
	if increasing(l.Order) && !sweepFinds(g, l, pos, start) {
		return
	}
	scanConflicts(g, l, pos, start, r)
}

// increasing reports whether the spine lists vertices in increasing order.
func increasing(order []int32) bool {
	for i := 1; i < len(order); i++ {
		if order[i] <= order[i-1] {
			return false
		}
	}
	return true
}

// sweepFinds reports whether some page of a layout whose spine lists the
// vertices in increasing order has a conflict; count is validateInto's
// start before its sums. Such a spine puts the graph's edges, sorted by
// (U, V), in order of their left ends; taken with each group of a left end
// in reverse, they reach every page in the order its scan in scanConflicts
// takes them, so all pages are scanned in one pass with a stack (of right
// ends) or a running maximum per page, without bucketing the edges. The
// left end of a stack's top never exceeds the current one, and equals it
// only for a longer edge, so only right ends need keeping. The findings are
// not reported: when there is one, scanConflicts scans again page by page,
// the order the report lists them in.
func sweepFinds(g *graph.Graph, l *Layout, pos, count []int32) bool {
	k := int32(l.Pages())
	// The stack of page p+1 is stack[bottom[p]:top[p]]: it never holds more
	// than the count[p+2] edges of the page.
	bottom, top := make([]int32, k), make([]int32, k)
	sum := int32(0)
	for p := range bottom {
		bottom[p], top[p] = sum, sum
		sum += count[p+2]
	}
	sw := &sweep{g: g, l: l, pos: pos, bottom: bottom, top: top, stack: make([]int32, sum)}
	for _, kind := range l.PageKinds {
		if kind == Queue {
			sw.left, sw.groupMax, sw.best = make([]int32, k), make([]int32, k), make([]int32, k)
			for p := range sw.left {
				sw.left[p], sw.groupMax[p], sw.best[p] = -1, -1, -1
			}
			break
		}
	}
	// Large layouts are swept in two halves of the pages at once.
	cut := int32(0)
	for cut < k && bottom[cut] < sum/2 {
		cut++
	}
	if int(sum) < parallelMin || cut == 0 || cut == k {
		return sw.finds(0, k)
	}
	second := make(chan bool)
	go func() { second <- sw.finds(cut, k) }()
	first := sw.finds(0, cut)
	return <-second || first
}

// sweep is the state of sweepFinds: per page a stack or, on queue pages,
// the left end of the group of edges being read, the largest right end in
// that group, and in the groups before it.
type sweep struct {
	g                    *graph.Graph
	l                    *Layout
	pos                  []int32
	bottom, top, stack   []int32
	left, groupMax, best []int32
}

// finds sweeps the pages from+1..to and reports whether one has a conflict.
func (sw *sweep) finds(from, to int32) bool {
	ge, page, kinds, pos := sw.g.Edges(), sw.l.Page, sw.l.PageKinds, sw.pos
	bottom, top, stack := sw.bottom, sw.top, sw.stack
	left, groupMax, best := sw.left, sw.groupMax, sw.best
	for i := 0; i < len(ge); {
		u := ge[i].U
		j := i + 1
		for j < len(ge) && ge[j].U == u {
			j++
		}
		a := pos[u]
		for h := j - 1; h >= i && a >= 0; h-- { // longest first
			p, b := page[h]-1, pos[ge[h].V]
			if p < from || p >= to || b < 0 {
				continue
			}
			if kinds[p] == Queue {
				if left[p] != a {
					left[p], best[p], groupMax[p] = a, max(best[p], groupMax[p]), -1
				}
				if best[p] > b {
					return true
				}
				groupMax[p] = max(groupMax[p], b)
				continue
			}
			t := top[p]
			for t > bottom[p] && stack[t-1] <= a {
				t--
			}
			if t > bottom[p] && stack[t-1] < b {
				return true
			}
			stack[t] = b
			top[p] = t + 1
		}
		i = j
	}
	return false
}

func edgeName(g *graph.Graph, e int) string {
	ed := g.Edges()[e]
	return fmt.Sprintf("%s–%s", g.Labels()[ed.U], g.Labels()[ed.V])
}

func (r *Report) witness(g *graph.Graph, pos []int32, e int, page int32) WitnessEdge {
	ed := g.Edges()[e]
	return WitnessEdge{U: g.Labels()[ed.U], V: g.Labels()[ed.V], PosU: int(pos[ed.U]), PosV: int(pos[ed.V]), Page: int(page)}
}

// scanConflicts finds crossings on stack pages and nestings on queue pages.
// start[p+1] is the number of edges on page p with both ends on the spine.
//
// Each such edge becomes a record left<<32 | right of its spine positions
// (left < right); the records are bucketed by page in one pass and each
// page is sorted by (left, right), which layouts that list the spine in the
// graph's vertex order already are. On a stack page the edges that share a
// left end are taken longest first, and a stack holds the open edges as a
// chain of nested intervals: before (l, r) is pushed, edges ending at or
// before l are popped; if the top then ends strictly inside (l, r) the two
// cross (top.l < l < top.r < r), and if no such top exists no placed edge
// crosses (l, r), since every open edge contains the top. On a queue page,
// an edge (l, r) nests inside an earlier one exactly when some edge with a
// strictly smaller left end has a right end beyond r; the scan keeps that
// maximum. A conflicting edge is reported and not kept, so later findings
// are genuine pairs as well.
func scanConflicts(g *graph.Graph, l *Layout, pos, start []int32, r *Report) {
	k := l.Pages()
	for p := 1; p < len(start); p++ {
		start[p] += start[p-1]
	}
	// start[p] is now where page p's records begin; fill advances it to the end
	recs := make([]uint64, start[len(start)-1])
	fill := start[1:]
	for e, ed := range g.Edges() {
		p := l.Page[e]
		a, b := pos[ed.U], pos[ed.V]
		if p < 1 || int(p) > k || a < 0 || b < 0 {
			continue
		}
		if a > b {
			a, b = b, a
		}
		recs[fill[p-1]] = uint64(a)<<32 | uint64(b)
		fill[p-1]++
	}
	// page p's records are recs[start[p-1]:start[p]]
	type span struct {
		p        int32
		from, to int32
	}
	var pages []span
	for p := int32(1); int(p) <= k; p++ {
		if start[p] > start[p-1] {
			pages = append(pages, span{p, start[p-1], start[p]})
		}
	}
	bits := 1 // positions are below 1<<bits
	for 1<<bits < len(l.Order) {
		bits++
	}
	// The pages are independent: scan them in two halves at once, each half
	// with its own report, merged in page order so the output is deterministic.
	scan := func(ps []span, rep *Report) {
		var stack, tmp []uint64
		for _, sp := range ps {
			page := recs[sp.from:sp.to]
			tmp = sortRecords(page, tmp, bits)
			if l.PageKinds[sp.p-1] == Queue {
				scanQueuePage(g, l, pos, sp.p, page, rep)
			} else {
				stack = scanStackPage(g, l, pos, sp.p, page, rep, stack[:0])
			}
		}
	}
	cut := 0
	for cut < len(pages) && int(pages[cut].to) <= len(recs)/2 {
		cut++
	}
	if len(recs) < parallelMin || cut == 0 || cut == len(pages) {
		scan(pages, r)
		return
	}
	var second Report
	done := make(chan struct{})
	go func() {
		scan(pages[cut:], &second)
		close(done)
	}()
	scan(pages[:cut], r)
	<-done
	r.merge(&second)
}

// parallelMin is the number of placed edges from which pages are scanned
// in two halves at once (a variable so tests can exercise both paths).
var parallelMin = 1 << 16

// radixMin is the number of records of a page from which it is sorted by
// radix rather than by comparisons (a variable so tests can exercise both).
var radixMin = 1 << 10

// sortRecords sorts a page's records, each left<<32 | right with both
// halves below 1<<bits, unless they are sorted already. tmp is scratch
// space, returned for reuse.
func sortRecords(a, tmp []uint64, bits int) []uint64 {
	sorted := true
	for i := 1; i < len(a); i++ {
		if a[i] < a[i-1] {
			sorted = false
			break
		}
	}
	if sorted {
		return tmp
	}
	if len(a) < radixMin {
		slices.Sort(a)
		return tmp
	}
	// Least significant digit first on the packed key left<<bits | right,
	// in digits of up to 11 bits.
	mask := uint64(1)<<bits - 1
	for i, x := range a {
		a[i] = (x>>32)<<bits | x&mask
	}
	if cap(tmp) < len(a) {
		tmp = make([]uint64, len(a))
	}
	src, dst := a, tmp[:len(a)]
	passes := (2*bits + 10) / 11
	digit := (2*bits + passes - 1) / passes
	var count [1 << 11]int
	for shift := 0; shift < 2*bits; shift += digit {
		c := count[:1<<digit]
		clear(c)
		dmask := uint64(len(c) - 1)
		for _, x := range src {
			c[(x>>shift)&dmask]++
		}
		sum := 0
		for i, n := range c {
			c[i], sum = sum, sum+n
		}
		for _, x := range src {
			d := (x >> shift) & dmask
			dst[c[d]] = x
			c[d]++
		}
		src, dst = dst, src
	}
	for i, x := range src {
		a[i] = (x>>bits)<<32 | x&mask
	}
	return tmp
}

// recordEdge returns the index of the edge whose record is x.
func recordEdge(g *graph.Graph, l *Layout, x uint64) int {
	return g.EdgeIndex(l.Order[x>>32], l.Order[uint32(x)])
}

// groupEnd returns the end of the run of sorted records from page[i] that
// share its left end.
func groupEnd(page []uint64, i int) int {
	j := i + 1
	for j < len(page) && page[j]>>32 == page[i]>>32 {
		j++
	}
	return j
}

// scanStackPage scans the sorted records of stack page p.
func scanStackPage(g *graph.Graph, l *Layout, pos []int32, p int32, page []uint64, r *Report, stack []uint64) []uint64 {
	for i := 0; i < len(page); {
		le, j := page[i]>>32, groupEnd(page, i)
		for h := j - 1; h >= i; h-- { // longest first
			x := page[h]
			for len(stack) > 0 && uint32(stack[len(stack)-1]) <= uint32(le) {
				stack = stack[:len(stack)-1]
			}
			if len(stack) > 0 {
				t := stack[len(stack)-1]
				if uint32(t) < uint32(x) && t>>32 < le {
					te, e := recordEdge(g, l, t), recordEdge(g, l, x)
					r.add(Problem{Kind: Crossing, Page: int(p),
						Edges: []WitnessEdge{r.witness(g, pos, te, p), r.witness(g, pos, e, p)},
						Msg: fmt.Sprintf("page %d: edges %s (positions %d–%d) and %s (positions %d–%d) cross",
							p, edgeName(g, te), t>>32, uint32(t), edgeName(g, e), le, uint32(x))})
					continue
				}
			}
			stack = append(stack, x)
		}
		i = j
	}
	return stack
}

// scanQueuePage scans the sorted records of queue page p.
func scanQueuePage(g *graph.Graph, l *Layout, pos []int32, p int32, page []uint64, r *Report) {
	best, found := uint64(0), false // the record with the largest right end among strictly smaller left ends
	for i := 0; i < len(page); {
		le, j := page[i]>>32, groupEnd(page, i)
		for h := j - 1; h >= i; h-- { // longest first
			x := page[h]
			if found && uint32(best) > uint32(x) {
				be, e := recordEdge(g, l, best), recordEdge(g, l, x)
				r.add(Problem{Kind: Nesting, Page: int(p),
					Edges: []WitnessEdge{r.witness(g, pos, be, p), r.witness(g, pos, e, p)},
					Msg: fmt.Sprintf("page %d: edge %s (positions %d–%d) nests inside %s (positions %d–%d)",
						p, edgeName(g, e), le, uint32(x), edgeName(g, be), best>>32, uint32(best))})
			}
		}
		// the last record of the group reaches furthest
		if x := page[j-1]; !found || uint32(x) > uint32(best) {
			best, found = x, true
		}
		i = j
	}
}
