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
	validateInto(g, l, 0, true, r)
	return r
}

// validateInto is Validate with an optional page limit (0 = none), adding to r.
// Without coverage, vertices missing from the spine and edges without a page
// are taken as already reported (by Resolve) and skipped.
func validateInto(g *graph.Graph, l *Layout, limit int, coverage bool, r *Report) {
	r.Pages, r.Kind = l.Pages(), l.Kind
	n, m := g.N(), g.M()
	pos := make([]int32, n)
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
	for v := range pos {
		if pos[v] < 0 && coverage {
			r.add(Problem{Kind: MissingVertex, Vertex: g.Labels()[v], Msg: fmt.Sprintf("vertex %q is not on the spine", g.Labels()[v])})
		}
	}
	if len(l.Page) != m {
		r.add(Problem{Kind: MissingEdge, Msg: fmt.Sprintf("layout gives pages for %d edges, the graph has %d", len(l.Page), m)})
		return
	}
	k := int32(l.Pages())
	r.PerPage = make([]int, k)
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
			r.Used = max(r.Used, int(p))
			if limit > 0 && int(p) > limit {
				r.add(Problem{Kind: PageLimit, Page: int(p), Edges: []WitnessEdge{r.witness(g, pos, e, p)}, Msg: fmt.Sprintf("edge %s is on page %d, above the limit of %d pages", edgeName(g, e), p, limit)})
			}
		}
	}
	scanConflicts(g, l, pos, r)
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
//
// Edges are bucketed by (page, left end, right end descending) with three
// stable counting sorts. On a stack page, a stack holds the open edges as a
// chain of nested intervals: before (l, r) is pushed, edges ending at or
// before l are popped; if the top then ends strictly inside (l, r) the two
// cross (top.l < l < top.r < r), and if no such top exists no placed edge
// crosses (l, r), since every open edge contains the top. On a queue page,
// an edge (l, r) nests inside an earlier one exactly when some edge with a
// strictly smaller left end has a right end beyond r; the scan keeps that
// maximum. A conflicting edge is reported and not kept, so later findings
// are genuine pairs as well.
func scanConflicts(g *graph.Graph, l *Layout, pos []int32, r *Report) {
	n, m := g.N(), g.M()
	k := l.Pages()
	left := make([]int32, m)
	right := make([]int32, m)
	idx := make([]int32, 0, m)
	for e, ed := range g.Edges() {
		p := l.Page[e]
		a, b := pos[ed.U], pos[ed.V]
		if p < 1 || int(p) > k || a < 0 || b < 0 {
			continue
		}
		if a > b {
			a, b = b, a
		}
		left[e], right[e] = a, b
		idx = append(idx, int32(e))
	}
	// Two stable counting sorts: by left end, then by page. Edges of a page
	// that share a left end are put longest first where the page is scanned.
	tmp := make([]int32, len(idx))
	count := make([]int32, max(n, k)+1)
	countingSort(idx, tmp, count[:n+1], func(e int32) int32 { return left[e] })
	countingSort(tmp, idx, count[:k+1], func(e int32) int32 { return l.Page[e] - 1 })
	tmp = nil
	// The pages are independent: scan them in two halves at once, each half
	// with its own report, merged in page order so the output is deterministic.
	type span struct{ from, to int }
	var pages []span
	for i := 0; i < len(idx); {
		p := l.Page[idx[i]]
		j := i
		for j < len(idx) && l.Page[idx[j]] == p {
			j++
		}
		pages = append(pages, span{i, j})
		i = j
	}
	scan := func(ps []span, rep *Report) {
		var stack []int32
		for _, sp := range ps {
			page := idx[sp.from:sp.to]
			sortGroupsLongestFirst(page, left, right)
			p := l.Page[page[0]]
			if l.PageKinds[p-1] == Queue {
				scanQueuePage(g, pos, p, page, left, right, rep)
			} else {
				stack = scanStackPage(g, pos, p, page, left, right, rep, stack[:0])
			}
		}
	}
	cut := 0
	for cut < len(pages) && pages[cut].to <= len(idx)/2 {
		cut++
	}
	if len(idx) < parallelMin || cut == 0 || cut == len(pages) {
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

// sortGroupsLongestFirst orders each run of edges with the same left end
// by right end, descending. The edges of a run have different right ends
// (the graph is simple), so the sort need not be stable; pdqsort also takes
// the common case of a run in ascending order in linear time.
func sortGroupsLongestFirst(page, left, right []int32) {
	for i := 0; i < len(page); {
		j := i + 1
		for j < len(page) && left[page[j]] == left[page[i]] {
			j++
		}
		if j-i > 1 {
			slices.SortFunc(page[i:j], func(a, b int32) int { return int(right[b]) - int(right[a]) })
		}
		i = j
	}
}

// countingSort writes a, stably sorted by key, to out.
func countingSort(a, out, count []int32, key func(int32) int32) {
	clear(count)
	for _, e := range a {
		count[key(e)+1]++
	}
	for i := 1; i < len(count); i++ {
		count[i] += count[i-1]
	}
	for _, e := range a {
		k := key(e)
		out[count[k]] = e
		count[k]++
	}
}

func scanStackPage(g *graph.Graph, pos []int32, p int32, page, left, right []int32, r *Report, stack []int32) []int32 {
	for _, e := range page {
		le, re := left[e], right[e]
		for len(stack) > 0 && right[stack[len(stack)-1]] <= le {
			stack = stack[:len(stack)-1]
		}
		if len(stack) > 0 {
			t := stack[len(stack)-1]
			if right[t] < re && left[t] < le {
				r.add(Problem{Kind: Crossing, Page: int(p),
					Edges: []WitnessEdge{r.witness(g, pos, int(t), p), r.witness(g, pos, int(e), p)},
					Msg: fmt.Sprintf("page %d: edges %s (positions %d–%d) and %s (positions %d–%d) cross",
						p, edgeName(g, int(t)), left[t], right[t], edgeName(g, int(e)), le, re)})
				continue
			}
		}
		stack = append(stack, e)
	}
	return stack
}

func scanQueuePage(g *graph.Graph, pos []int32, p int32, page, left, right []int32, r *Report) {
	best := int32(-1) // edge with the largest right end among strictly smaller left ends
	for i := 0; i < len(page); {
		j := i
		for j < len(page) && left[page[j]] == left[page[i]] {
			e := page[j]
			if best >= 0 && right[best] > right[e] {
				r.add(Problem{Kind: Nesting, Page: int(p),
					Edges: []WitnessEdge{r.witness(g, pos, int(best), p), r.witness(g, pos, int(e), p)},
					Msg: fmt.Sprintf("page %d: edge %s (positions %d–%d) nests inside %s (positions %d–%d)",
						p, edgeName(g, int(e)), left[e], right[e], edgeName(g, int(best)), left[best], right[best])})
			}
			j++
		}
		// the group is sorted by right end descending: its first edge reaches furthest
		if e := page[i]; best < 0 || right[e] > right[best] {
			best = e
		}
		i = j
	}
}
