package planar

import (
	"fmt"

	"spinecert.dev/graph"
	"spinecert.dev/planar/planarcert"
)

// Result is the outcome of Decide: the verdict and its certificate.
type Result struct {
	Planar bool
	Cert   *planarcert.Cert
}

// lrOf returns the compact form of g that the planarity test runs on. The
// vertices are renumbered in breadth-first order (perm[new] = old) and the
// edges sorted by their lower new end, which keeps the test's memory accesses
// local on large graphs whatever the input numbering.
func lrOf(g *graph.Graph) (*lrGraph, []int32) {
	n := g.N()
	perm := make([]int32, 0, n)
	rank := make([]int32, n)
	for i := range rank {
		rank[i] = -1
	}
	for s := int32(0); int(s) < n; s++ {
		if rank[s] >= 0 {
			continue
		}
		rank[s] = int32(len(perm))
		perm = append(perm, s)
		for h := len(perm) - 1; h < len(perm); h++ {
			for _, w := range g.Neighbors(perm[h]) {
				if rank[w] < 0 {
					rank[w] = int32(len(perm))
					perm = append(perm, w)
				}
			}
		}
	}
	edges := g.Edges()
	count := make([]int32, n+1)
	for _, e := range edges {
		count[min(rank[e.U], rank[e.V])+1]++
	}
	for i := 1; i <= n; i++ {
		count[i] += count[i-1]
	}
	eu := make([]int32, len(edges))
	ev := make([]int32, len(edges))
	for _, e := range edges {
		a, b := rank[e.U], rank[e.V]
		if a > b {
			a, b = b, a
		}
		k := count[a]
		count[a]++
		eu[k], ev[k] = a, b
	}
	return &lrGraph{n: n, eu: eu, ev: ev}, perm
}

// IsPlanar reports whether g is planar, in O(n + m) time.
func IsPlanar(g *graph.Graph) bool {
	lg, _ := lrOf(g)
	return lrTest(lg, false).planar
}

// Embed returns a planar embedding of g, or false when g is not planar.
func Embed(g *graph.Graph) (*planarcert.Embedding, bool) {
	lg, perm := lrOf(g)
	r := lrTest(lg, true)
	if !r.planar {
		return nil, false
	}
	return embeddingFromLR(lg, perm, r), true
}

// embeddingFromLR reads the rotation system off the test's result, in the
// vertex numbers of the graph (perm maps the test's numbers back).
func embeddingFromLR(lg *lrGraph, perm []int32, r lrResult) *planarcert.Embedding {
	n := lg.n
	rot := make([][]int32, n)
	deg := make([]int32, n)
	for e := range lg.eu {
		deg[lg.eu[e]]++
		deg[lg.ev[e]]++
	}
	flat := make([]int32, 2*len(lg.eu))
	pos := 0
	for v := 0; v < n; v++ {
		list := flat[pos : pos : pos+int(deg[v])]
		pos += int(deg[v])
		if h := r.first[v]; h != lrNone {
			for x := h; ; {
				e := x / 2
				list = append(list, perm[lg.eu[e]^lg.ev[e]^int32(v)])
				x = r.next[x]
				if x == h {
					break
				}
			}
		}
		rot[perm[v]] = list
	}
	return &planarcert.Embedding{Rotation: rot}
}

// IsMaximal reports whether g is maximal planar: planar with no edge
// that can be added keeping it planar. For n >= 3 that is m = 3n − 6 and
// planar; the graphs on one or two vertices are maximal planar when complete.
func IsMaximal(g *graph.Graph) bool {
	n, m := g.N(), g.M()
	if n < 3 {
		return m == n*(n-1)/2
	}
	return m == 3*n-6 && IsPlanar(g)
}

// Decide decides whether g is planar and returns the certificate: a planar
// embedding, or a subdivision of K5 or K3,3. The certificate is not checked
// here; planarcert.Check does that independently of this code.
func Decide(g *graph.Graph) (*Result, error) {
	lg, perm := lrOf(g)
	r := lrTest(lg, true)
	if r.planar {
		emb := embeddingFromLR(lg, perm, r)
		return &Result{Planar: true, Cert: &planarcert.Cert{Planar: true, Embedding: emb}}, nil
	}
	fail := r.fail
	if fail >= 0 {
		fail = perm[fail]
	}
	k, err := kuratowskiFrom(g, fail)
	if err != nil {
		return nil, err
	}
	return &Result{Planar: false, Cert: &planarcert.Cert{Kuratowski: k}}, nil
}

// DecideChecked is Decide followed by the independent checker: the
// certificate is returned only after planarcert.Check accepted it. A
// certificate that the checker rejects (a bug in the finder) returns an
// error wrapping planarcert.ErrRejected, never a verdict. Every verdict that
// rests on planarity goes through here.
func DecideChecked(g *graph.Graph) (*Result, error) {
	res, err := Decide(g)
	if err != nil {
		return nil, err
	}
	if err := planarcert.Check(g, res.Cert); err != nil {
		return nil, fmt.Errorf("planar: the certificate found does not pass the checker: %w", err)
	}
	return res, nil
}
