package dimacs

import (
	"fmt"

	"spinecert.dev/cert"
)

// baseMap records the variable numbering of the baseline formulation.
type baseMap struct {
	n, k int
}

// orderVar is the baseline variable "u before v" for u != v.
func (b *baseMap) orderVar(u, v int32) int32 {
	w := v
	if v > u {
		w = v - 1
	}
	return u*int32(b.n-1) + w + 1
}

// pageVar is the baseline variable "edge e is on page pg" (pg 0-based).
func (b *baseMap) pageVar(e, pg int) int32 {
	return int32(b.n*(b.n-1) + e*b.k + pg + 1)
}

// patterns lists, for the four ends (0, 1) and (2, 3) of two disjoint edges,
// the spine orders of the ends under which the edges cross (stack) or nest
// (queue); each order is given as the positions' occupants left to right.
var patterns = func() (out [3][][4]int) {
	perm := [4]int{0, 1, 2, 3}
	var rec func(i int)
	rec = func(i int) {
		if i == 4 {
			pos := [4]int{}
			for at, x := range perm {
				pos[x] = at
			}
			a, b := min(pos[0], pos[1]), max(pos[0], pos[1])
			c, d := min(pos[2], pos[3]), max(pos[2], pos[3])
			switch {
			case a < c && c < b && b < d, c < a && a < d && d < b:
				out[cert.Stack] = append(out[cert.Stack], perm)
			case a < c && d < b, c < a && b < d:
				out[cert.Queue] = append(out[cert.Queue], perm)
			}
			return
		}
		for j := i; j < 4; j++ {
			perm[i], perm[j] = perm[j], perm[i]
			rec(i + 1)
			perm[i], perm[j] = perm[j], perm[i]
		}
	}
	rec(0)
	return out
}()

// encodeBaseline writes the formulation of Bekos, Kaufmann and Zielke
// (GD 2015) for the whole graph; see the package documentation.
func (e *Encoding) encodeBaseline() {
	g, f := e.g, &e.f
	n, m, k := g.N(), g.M(), len(e.kinds)
	b := &baseMap{n: n, k: k}
	e.base = b
	if int64(n)*int64(n-1)+int64(m)*int64(k)+int64(m)*int64(m) > maxVar {
		f.err = fmt.Errorf("%w: baseline for %d vertices and %d edges", ErrTooLarge, n, m)
		return
	}
	for i := 0; i < n*(n-1); i++ {
		f.newVar(FamOrder)
	}
	for i := 0; i < m*k; i++ {
		f.newVar(FamPage)
	}
	var present []cert.Kind
	for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
		for _, pk := range e.kinds {
			if pk == kind {
				present = append(present, kind)
				break
			}
		}
	}
	// Asymmetry and totality: exactly one of "u before v", "v before u".
	for u := int32(0); int(u) < n; u++ {
		for v := u + 1; int(v) < n; v++ {
			f.add(FamOrder, b.orderVar(u, v), b.orderVar(v, u))
			f.add(FamOrder, -b.orderVar(u, v), -b.orderVar(v, u))
		}
	}
	// Transitivity over all ordered triples of distinct vertices.
	for u := int32(0); int(u) < n; u++ {
		for v := int32(0); int(v) < n; v++ {
			if v == u {
				continue
			}
			for w := int32(0); int(w) < n; w++ {
				if w == u || w == v {
					continue
				}
				f.add(FamOrder, -b.orderVar(u, v), -b.orderVar(v, w), b.orderVar(u, w))
			}
		}
	}
	// Every edge on at least one page.
	row := make([]int32, k)
	for ei := 0; ei < m; ei++ {
		for pg := 0; pg < k; pg++ {
			row[pg] = b.pageVar(ei, pg)
		}
		f.add(FamPage, row...)
	}
	// Same-page variables for every pair of edges and every page kind,
	// with the forbidden orders for pairs of disjoint edges.
	edges := g.Edges()
	for i := 0; i < m; i++ {
		for j := i + 1; j < m; j++ {
			ei, ej := edges[i], edges[j]
			disjoint := ei.U != ej.U && ei.U != ej.V && ei.V != ej.U && ei.V != ej.V
			ends := [4]int32{ei.U, ei.V, ej.U, ej.V}
			for _, kind := range present {
				chi := f.newVar(FamSamePage)
				for pg, pk := range e.kinds {
					if pk == kind {
						f.add(FamSamePage, -b.pageVar(i, pg), -b.pageVar(j, pg), chi)
					}
				}
				if !disjoint {
					continue
				}
				for _, perm := range patterns[kind] {
					x := [4]int32{ends[perm[0]], ends[perm[1]], ends[perm[2]], ends[perm[3]]}
					f.add(FamConflict, -chi, -b.orderVar(x[0], x[1]), -b.orderVar(x[1], x[2]), -b.orderVar(x[2], x[3]))
				}
			}
		}
	}
}
