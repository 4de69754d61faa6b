package planar

// treeFirst is the first round of the search, on the whole graph, with the
// candidates in the order that reorder uses later: the edges of a
// depth-first spanning forest T first, then the other edges F by the
// breadth-first rank of their later end, the search starting at center. As
// T alone is planar, the shortest non-planar prefix is T ∪ F[:j] for the
// smallest such j; F[j-1] becomes required and the work graph is T ∪ F[:j],
// which reduce cuts down to at most 3j super-edges or so, however large T is.
//
// Every prefix test is cheap: the planarity of T ∪ F[:j] is that of the
// union of F[:j] and the smallest subtree of T spanning their ends, which
// after suppressing its path vertices has fewer than 4j vertices. It takes
// two passes over T in preorder and a test on that small graph.
func (ks *kurSearch) treeFirst(center int32) {
	g := ks.g
	n := g.N()
	if n == 0 || g.M() == 0 {
		return
	}
	// Depth-first forest: pre lists the vertices in preorder, at[v] is the
	// place of v in it, par[i] the place of the parent of pre[i] (or -1),
	// top[i] the place of the root of its tree.
	pre := make([]int32, 0, n)
	at := make([]int32, n)
	for i := range at {
		at[i] = -1
	}
	par := make([]int32, n)
	top := make([]int32, n)
	isTree := make([]bool, g.M())
	pe := make([]int32, n) // the tree edge from a place to its parent
	iter := make([]int32, n)
	var stack []int32
	for i := int32(-1); int(i) < n; i++ {
		r := i
		if i < 0 {
			r = center
		}
		if at[r] >= 0 {
			continue
		}
		root := int32(len(pre))
		at[r] = root
		par[root], top[root] = -1, root
		pre = append(pre, r)
		stack = append(stack[:0], r)
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			inc := g.IncidentEdges(v)
			if int(iter[v]) == len(inc) {
				stack = stack[:len(stack)-1]
				continue
			}
			e := inc[iter[v]]
			iter[v]++
			w := ks.ea[e] ^ ks.eb[e] ^ v
			if at[w] >= 0 {
				continue
			}
			k := int32(len(pre))
			at[w] = k
			par[k], top[k] = at[v], root
			pre = append(pre, w)
			isTree[e] = true
			pe[k] = e
			stack = append(stack, w)
		}
	}
	iter = nil
	var far []int32
	for _, e := range bfsEdgeOrder(g, center) {
		if !isTree[e] {
			far = append(far, e)
		}
	}
	isTree = nil
	if len(far) == 0 {
		// A forest (never for a non-planar g): leave every edge a candidate.
		for e := range g.M() {
			ks.work = append(ks.work, int32(e))
		}
		return
	}

	cnt := make([]int32, n)  // ends of F[:j] in the subtree of a place
	hits := make([]int32, n) // children of a place whose subtree holds an end
	term := make([]bool, n)  // the place is an end of F[:j]
	key := make([]int32, n)  // nearest key place above, or -1
	lid := make([]int32, n)  // number of a key place in the test graph, or -1
	lg := &lrGraph{}
	planarWith := func(j int) bool {
		ks.tests++
		clear(cnt)
		clear(hits)
		clear(term)
		for _, e := range far[:j] {
			a, b := at[ks.ea[e]], at[ks.eb[e]]
			cnt[a]++
			cnt[b]++
			term[a], term[b] = true, true
		}
		for i := n - 1; i > 0; i-- {
			if p := par[i]; p >= 0 && cnt[i] > 0 {
				cnt[p] += cnt[i]
				hits[p]++
			}
		}
		// A place is key when it is an end or two of its subtrees hold ends;
		// the key places and the paths between them make up the subtree.
		lg.n = 0
		lg.eu, lg.ev = lg.eu[:0], lg.ev[:0]
		for i := 0; i < n; i++ {
			key[i], lid[i] = -1, -1
			if p := par[i]; p >= 0 {
				if lid[p] >= 0 {
					key[i] = p
				} else {
					key[i] = key[p]
				}
			}
			if !term[i] && hits[i] < 2 {
				continue
			}
			lid[i] = int32(lg.n)
			lg.n++
			q := key[i]
			if cnt[i] == cnt[top[i]] || q < 0 {
				continue // the top of the subtree
			}
			// The path from i up to q, kept as one or two edges so that no
			// edge of F[:j] runs parallel to it.
			if par[i] != q {
				lg.eu = append(lg.eu, lid[i], int32(lg.n))
				lg.ev = append(lg.ev, int32(lg.n), lid[q])
				lg.n++
			} else {
				lg.eu = append(lg.eu, lid[i])
				lg.ev = append(lg.ev, lid[q])
			}
		}
		for _, e := range far[:j] {
			lg.eu = append(lg.eu, lid[at[ks.ea[e]]])
			lg.ev = append(lg.ev, lid[at[ks.eb[e]]])
		}
		return lrTest(lg, false).planar
	}
	j := smallestNonPlanar(len(far), planarWith)
	// The work graph: F[:j] and the subtree of T spanning its ends, which is
	// what is left of T ∪ F[:j] after pruning the hanging parts of T.
	planarWith(j)
	var work []int32
	for i := 1; i < n; i++ {
		if par[i] >= 0 && cnt[i] > 0 && cnt[i] < cnt[top[i]] {
			work = append(work, pe[i])
		}
	}
	f := far[j-1]
	ks.req[f] = true
	ks.required = append(ks.required[:0], f)
	ks.work = append(work, far[:j-1]...)
	ks.reduce()
}

// smallestNonPlanar returns the smallest k in 1..total for which planar(k)
// is false, by doubling and binary search; planar(total) must be false.
func smallestNonPlanar(total int, planar func(k int) bool) int {
	hi := 1
	for hi < total && planar(hi) {
		hi *= 2
	}
	hi = min(hi, total)
	lo := hi / 2 // planar(lo) holds (or lo is 0)
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if planar(mid) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return hi
}
