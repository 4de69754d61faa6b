package planar

// The left-right planarity test of de Fraysseix and Rosenstiehl, in the form
// given by U. Brandes, "The Left-Right Decide Test" (manuscript, 2009):
// a DFS orients the graph and computes lowpoints and nesting depths, a second
// DFS in nesting order keeps conflict pairs of return-edge intervals on a
// stack and fails as soon as two intervals must lie on the same side, and a
// third DFS turns the left/right sides into a rotation system. All three
// passes are iterative (explicit stacks), so deep DFS trees cannot overflow
// the goroutine stack, and every pass is O(n + m).

// lrGraph is a compact multigraph-free graph on vertices 0..n-1 given by its
// edge endpoints; it is what the test runs on, so that subgraphs can be tested
// without building a graph.Graph.
type lrGraph struct {
	n      int
	eu, ev []int32
}

// lrResult is the outcome of the test; rot is set when planar and asked for.
type lrResult struct {
	planar bool
	// fail is the vertex whose edge could not be placed (when not planar by
	// a conflict), or -1.
	fail int32
	// first[v] is a half-edge at v (or -1), next[h] the clockwise successor of
	// half-edge h around its vertex. Half-edge 2e lies at eu[e], 2e+1 at ev[e].
	first []int32
	next  []int32
}

const lrNone = int32(-1)

// lrInterval is a range of return edges [low .. high] linked by ref.
type lrInterval struct{ low, high int32 }

func (i lrInterval) empty() bool { return i.low == lrNone && i.high == lrNone }

type lrPair struct{ l, r lrInterval }

type lrState struct {
	g                   *lrGraph
	m                   int
	off, inc            []int32 // incident edges of v: inc[off[v]:off[v+1]]
	height, parentEdge  []int32
	src                 []int32 // source of each oriented edge, -1 before
	lowpt, lowpt2, nest []int32
	roots               []int32
	outOff, outE        []int32 // out-edges of v in nesting order
	ref, lowptEdge      []int32
	side                []int8
	stackBottom         []int32
	s                   []lrPair
}

func (st *lrState) target(e int32) int32 { return st.g.eu[e] ^ st.g.ev[e] ^ st.src[e] }

// lrTest runs the left-right planarity test on g, computing a rotation system
// when embed is true and g is planar.
func lrTest(g *lrGraph, embed bool) lrResult {
	n, m := g.n, len(g.eu)
	if n >= 3 && m > 3*n-6 {
		return lrResult{fail: lrNone}
	}
	if n < 3 && m > n*(n-1)/2 {
		return lrResult{fail: lrNone}
	}
	st := &lrState{g: g, m: m}
	st.buildIncidence()
	st.orient()
	st.sortOut(false)
	if fail := st.testAll(); fail != lrNone {
		return lrResult{fail: fail}
	}
	if !embed {
		return lrResult{planar: true, fail: lrNone}
	}
	return st.embed()
}

func (st *lrState) buildIncidence() {
	n, g := st.g.n, st.g
	off := make([]int32, n+1)
	for e := range g.eu {
		off[g.eu[e]+1]++
		off[g.ev[e]+1]++
	}
	for i := 0; i < n; i++ {
		off[i+1] += off[i]
	}
	inc := make([]int32, 2*st.m)
	fill := make([]int32, n)
	copy(fill, off[:n])
	for e := range g.eu {
		u, v := g.eu[e], g.ev[e]
		inc[fill[u]] = int32(e)
		fill[u]++
		inc[fill[v]] = int32(e)
		fill[v]++
	}
	st.off, st.inc = off, inc
}

// orient is the first DFS: orientation, heights, lowpoints, nesting depths.
func (st *lrState) orient() {
	n, m := st.g.n, st.m
	st.height = make([]int32, n)
	st.parentEdge = make([]int32, n)
	st.src = make([]int32, m)
	st.lowpt = make([]int32, m)
	st.lowpt2 = make([]int32, m)
	st.nest = make([]int32, m)
	for i := range st.height {
		st.height[i] = lrNone
		st.parentEdge[i] = lrNone
	}
	for i := range st.src {
		st.src[i] = lrNone
	}
	iter := make([]int32, n)
	copy(iter, st.off[:n])
	var stack []int32
	for r := int32(0); int(r) < n; r++ {
		if st.height[r] != lrNone {
			continue
		}
		st.roots = append(st.roots, r)
		st.height[r] = 0
		stack = append(stack[:0], r)
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			if iter[v] < st.off[v+1] {
				e := st.inc[iter[v]]
				iter[v]++
				if st.src[e] != lrNone {
					continue
				}
				st.src[e] = v
				w := st.target(e)
				st.lowpt[e] = st.height[v]
				st.lowpt2[e] = st.height[v]
				if st.height[w] == lrNone {
					st.parentEdge[w] = e
					st.height[w] = st.height[v] + 1
					stack = append(stack, w)
					continue
				}
				st.lowpt[e] = st.height[w]
				st.finishEdge(e, v)
				continue
			}
			stack = stack[:len(stack)-1]
			if pe := st.parentEdge[v]; pe != lrNone {
				st.finishEdge(pe, st.src[pe])
			}
		}
	}
}

// finishEdge sets the nesting depth of e = (v, w) and updates the lowpoints
// of the parent edge of v.
func (st *lrState) finishEdge(e, v int32) {
	st.nest[e] = 2 * st.lowpt[e]
	if st.lowpt2[e] < st.height[v] {
		st.nest[e]++ // chordal
	}
	pe := st.parentEdge[v]
	if pe == lrNone {
		return
	}
	switch {
	case st.lowpt[e] < st.lowpt[pe]:
		st.lowpt2[pe] = min(st.lowpt[pe], st.lowpt2[e])
		st.lowpt[pe] = st.lowpt[e]
	case st.lowpt[e] > st.lowpt[pe]:
		st.lowpt2[pe] = min(st.lowpt2[pe], st.lowpt[e])
	default:
		st.lowpt2[pe] = min(st.lowpt2[pe], st.lowpt2[e])
	}
}

// sortOut orders the out-edges of every vertex by nesting depth (signed when
// signed is true) with a counting sort.
func (st *lrState) sortOut(signed bool) {
	n, m := st.g.n, st.m
	if st.outOff == nil {
		st.outOff = make([]int32, n+1)
		for e := 0; e < m; e++ {
			st.outOff[st.src[e]+1]++
		}
		for i := 0; i < n; i++ {
			st.outOff[i+1] += st.outOff[i]
		}
		st.outE = make([]int32, m)
	}
	base := int32(0)
	if signed {
		base = int32(2*n + 2)
	}
	count := make([]int32, 4*n+6)
	for e := 0; e < m; e++ {
		count[st.nest[e]+base+1]++
	}
	for i := 1; i < len(count); i++ {
		count[i] += count[i-1]
	}
	byKey := make([]int32, m)
	for e := 0; e < m; e++ {
		k := st.nest[e] + base
		byKey[count[k]] = int32(e)
		count[k]++
	}
	fill := make([]int32, n)
	copy(fill, st.outOff[:n])
	for _, e := range byKey {
		s := st.src[e]
		st.outE[fill[s]] = e
		fill[s]++
	}
}

func (st *lrState) conflicting(i lrInterval, b int32) bool {
	return i.high != lrNone && st.lowpt[i.high] > st.lowpt[b]
}

func (st *lrState) lowest(p lrPair) int32 {
	if p.l.empty() {
		return st.lowpt[p.r.low]
	}
	if p.r.empty() {
		return st.lowpt[p.l.low]
	}
	return min(st.lowpt[p.l.low], st.lowpt[p.r.low])
}

// testAll is the second DFS; it returns -1 when the graph is planar, else
// the vertex at which a conflict was found.
func (st *lrState) testAll() int32 {
	n, m := st.g.n, st.m
	st.ref = make([]int32, m)
	st.lowptEdge = make([]int32, m)
	st.side = make([]int8, m)
	st.stackBottom = make([]int32, m)
	for i := range st.ref {
		st.ref[i] = lrNone
		st.lowptEdge[i] = lrNone
		st.side[i] = 1
	}
	idx := make([]int32, n)
	copy(idx, st.outOff[:n])
	var stack []int32
	for _, r := range st.roots {
		stack = append(stack[:0], r)
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			if idx[v] < st.outOff[v+1] {
				ei := st.outE[idx[v]]
				w := st.target(ei)
				st.stackBottom[ei] = int32(len(st.s))
				if ei == st.parentEdge[w] {
					stack = append(stack, w)
					continue
				}
				st.lowptEdge[ei] = ei
				st.s = append(st.s, lrPair{l: lrInterval{lrNone, lrNone}, r: lrInterval{ei, ei}})
				if !st.integrate(v, ei) {
					return v
				}
				idx[v]++
				continue
			}
			stack = stack[:len(stack)-1]
			e := st.parentEdge[v]
			if e == lrNone {
				continue
			}
			u := st.src[e]
			st.removeBackEdges(e)
			if !st.integrate(u, e) {
				return u
			}
			idx[u]++
		}
	}
	return lrNone
}

// integrate adds the return edges of the out-edge ei of v to the constraints.
func (st *lrState) integrate(v, ei int32) bool {
	if st.lowpt[ei] >= st.height[v] {
		return true
	}
	e := st.parentEdge[v]
	if ei == st.outE[st.outOff[v]] {
		if e != lrNone {
			st.lowptEdge[e] = st.lowptEdge[ei]
		}
		return true
	}
	return st.addConstraints(ei, e)
}

func (st *lrState) addConstraints(ei, e int32) bool {
	p := lrPair{l: lrInterval{lrNone, lrNone}, r: lrInterval{lrNone, lrNone}}
	for {
		q := st.s[len(st.s)-1]
		st.s = st.s[:len(st.s)-1]
		if !q.l.empty() {
			q.l, q.r = q.r, q.l
		}
		if !q.l.empty() {
			return false
		}
		if st.lowpt[q.r.low] > st.lowpt[e] {
			if p.r.empty() {
				p.r.high = q.r.high
			} else {
				st.ref[p.r.low] = q.r.high
			}
			p.r.low = q.r.low
		} else {
			st.ref[q.r.low] = st.lowptEdge[e]
		}
		if int32(len(st.s)) == st.stackBottom[ei] {
			break
		}
	}
	for len(st.s) > 0 {
		q := st.s[len(st.s)-1]
		if !st.conflicting(q.l, ei) && !st.conflicting(q.r, ei) {
			break
		}
		st.s = st.s[:len(st.s)-1]
		if st.conflicting(q.r, ei) {
			q.l, q.r = q.r, q.l
		}
		if st.conflicting(q.r, ei) {
			return false
		}
		if p.r.low != lrNone {
			st.ref[p.r.low] = q.r.high
		}
		if q.r.low != lrNone {
			p.r.low = q.r.low
		}
		if p.l.empty() {
			p.l.high = q.l.high
		} else {
			st.ref[p.l.low] = q.l.high
		}
		p.l.low = q.l.low
	}
	if !p.l.empty() || !p.r.empty() {
		st.s = append(st.s, p)
	}
	return true
}

// removeBackEdges trims the return edges ending at the source u of the tree
// edge e and fixes the reference edge of e.
func (st *lrState) removeBackEdges(e int32) {
	u := st.src[e]
	hu := st.height[u]
	for len(st.s) > 0 && st.lowest(st.s[len(st.s)-1]) == hu {
		p := st.s[len(st.s)-1]
		st.s = st.s[:len(st.s)-1]
		if p.l.low != lrNone {
			st.side[p.l.low] = -1
		}
	}
	if len(st.s) > 0 {
		p := &st.s[len(st.s)-1]
		for p.l.high != lrNone && st.target(p.l.high) == u {
			p.l.high = st.ref[p.l.high]
		}
		if p.l.high == lrNone && p.l.low != lrNone {
			st.ref[p.l.low] = p.r.low
			st.side[p.l.low] = -1
			p.l.low = lrNone
		}
		for p.r.high != lrNone && st.target(p.r.high) == u {
			p.r.high = st.ref[p.r.high]
		}
		if p.r.high == lrNone && p.r.low != lrNone {
			st.ref[p.r.low] = p.l.low
			st.side[p.r.low] = -1
			p.r.low = lrNone
		}
	}
	if st.lowpt[e] < st.height[u] && len(st.s) > 0 {
		top := st.s[len(st.s)-1]
		hl, hr := top.l.high, top.r.high
		if hl != lrNone && (hr == lrNone || st.lowpt[hl] > st.lowpt[hr]) {
			st.ref[e] = hl
		} else {
			st.ref[e] = hr
		}
	}
}

// resolveSides replaces every side by its product along the ref chain.
func (st *lrState) resolveSides() {
	var chain []int32
	for e := int32(0); int(e) < st.m; e++ {
		chain = chain[:0]
		x := e
		for st.ref[x] != lrNone {
			chain = append(chain, x)
			x = st.ref[x]
		}
		for i := len(chain) - 1; i >= 0; i-- {
			c := chain[i]
			st.side[c] *= st.side[st.ref[c]]
			st.ref[c] = lrNone
		}
	}
}

// embed is the third DFS: it builds the rotation system from the sides.
func (st *lrState) embed() lrResult {
	n, m := st.g.n, st.m
	st.resolveSides()
	for e := 0; e < m; e++ {
		st.nest[e] *= int32(st.side[e])
	}
	st.sortOut(true)
	half := func(e, x int32) int32 {
		if st.g.eu[e] == x {
			return 2 * e
		}
		return 2*e + 1
	}
	next := make([]int32, 2*m)
	prev := make([]int32, 2*m)
	first := make([]int32, n)
	for v := 0; v < n; v++ {
		first[v] = lrNone
		lo, hi := st.outOff[v], st.outOff[v+1]
		if lo == hi {
			continue
		}
		for i := lo; i < hi; i++ {
			h := half(st.outE[i], int32(v))
			nh := half(st.outE[lo+(i-lo+1)%(hi-lo)], int32(v))
			next[h] = nh
			prev[nh] = h
		}
		first[v] = half(st.outE[lo], int32(v))
	}
	insertAfter := func(h, ref int32) {
		nx := next[ref]
		next[ref], prev[h] = h, ref
		next[h], prev[nx] = nx, h
	}
	insertBefore := func(x, h, ref int32) {
		insertAfter(h, prev[ref])
		if first[x] == ref {
			first[x] = h
		}
	}
	leftRef := make([]int32, n)
	rightRef := make([]int32, n)
	idx := make([]int32, n)
	copy(idx, st.outOff[:n])
	var stack []int32
	for _, r := range st.roots {
		stack = append(stack[:0], r)
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			if idx[v] == st.outOff[v+1] {
				stack = stack[:len(stack)-1]
				continue
			}
			ei := st.outE[idx[v]]
			idx[v]++
			w := st.target(ei)
			hw := half(ei, w)
			if ei == st.parentEdge[w] {
				if first[w] == lrNone {
					next[hw], prev[hw] = hw, hw
					first[w] = hw
				} else {
					insertBefore(w, hw, first[w])
				}
				hv := half(ei, v)
				leftRef[v], rightRef[v] = hv, hv
				stack = append(stack, w)
				continue
			}
			if st.side[ei] == 1 {
				insertAfter(hw, rightRef[w])
			} else {
				insertBefore(w, hw, leftRef[w])
				leftRef[w] = hw
			}
		}
	}
	return lrResult{planar: true, fail: lrNone, first: first, next: next}
}
