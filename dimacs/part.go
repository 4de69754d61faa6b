package dimacs

import (
	"fmt"

	"spinecert.dev/cert"
)

// part is one separately encoded piece of the graph: a block, or the whole
// graph less the dropped vertices. Local vertex i is verts[i]; local edge j
// is edges[j] with local ends eu[j] < ev[j].
type part struct {
	verts  []int32
	edges  []int32
	eu, ev []int32
	n      int
	ord    []int32   // literal "u before v" for local u < v, see triIndex
	page   [][]int32 // page[j][p]: literal "edge j is on page p+1" (litFalse if not allowed)
}

// triIndex numbers the pairs u < v of n vertices lexicographically.
func triIndex(n, u, v int) int { return u*(2*n-u-1)/2 + (v - u - 1) }

// before returns the literal "local u is before local v on the spine".
func (p *part) before(u, v int32) int32 {
	if u < v {
		return p.ord[triIndex(p.n, int(u), int(v))]
	}
	return -p.ord[triIndex(p.n, int(v), int(u))]
}

// between describes "local c lies strictly between the ends of local edge
// j": either one literal (lit != 0) or the exclusive or of x and y.
type between struct {
	lit, x, y int32
}

// auxBetween is a betweenness variable with the directions of its
// definition that the conflict clauses need.
type auxBetween struct {
	v, x, y  int32
	up, down bool // up: x xor y implies v; down: v implies x xor y
}

// partEncoder holds the state of encoding one part.
type partEncoder struct {
	e       *Encoding
	p       *part
	kinds   []cert.Kind
	memo    []int32 // c*m + j -> 1 + index into aux, 0 if none
	aux     []auxBetween
	isAux   map[int32]int // variable -> index into aux
	scratch [][]int32
	buf     []int32
}

// addPart encodes the part on the sorted vertices vs with the sorted edges es.
func (e *Encoding) addPart(vs, es []int32) {
	g, o, f := e.g, &e.opt, &e.f
	p := &part{verts: vs, edges: es, n: len(vs)}
	local := make(map[int32]int32, len(vs))
	for i, v := range vs {
		local[v] = int32(i)
	}
	for _, ei := range es {
		ed := g.Edges()[ei]
		p.eu = append(p.eu, local[ed.U])
		p.ev = append(p.ev, local[ed.V])
	}
	e.parts = append(e.parts, p)
	n := p.n
	if int64(n)*int64(n-1)/2+int64(len(es))*int64(len(e.kinds)) > maxVar || int64(n)*int64(len(es)) > 1<<31 {
		f.err = fmt.Errorf("%w: a part with %d vertices and %d edges", ErrTooLarge, n, len(es))
		return
	}
	stack := allStack(e.kinds)
	rotation := stack && !o.NoRotation
	fix := newOrderFix(p, rotation, !o.NoReflection, !o.NoTwins)
	// Order variables, lexicographic in (u, v).
	p.ord = make([]int32, n*(n-1)/2)
	for u := 0; u < n; u++ {
		for v := u + 1; v < n; v++ {
			l := litTrue
			if !fix.fixed(int32(u), int32(v)) {
				l = f.newVar(FamOrder)
			}
			p.ord[triIndex(n, u, v)] = l
		}
	}
	// Page variables, edge-major.
	p.page = make([][]int32, len(es))
	for j := range es {
		row := make([]int32, len(e.kinds))
		allowed := 0
		for pg := range e.kinds {
			row[pg] = litFalse
			if o.NoPageSymmetry || rankInKind(e.kinds, pg) <= j {
				row[pg] = 0
				allowed++
			}
		}
		for pg := range row {
			if row[pg] == 0 {
				if allowed == 1 {
					row[pg] = litTrue
				} else {
					row[pg] = f.newVar(FamPage)
				}
			}
		}
		p.page[j] = row
	}
	// Transitivity: no cyclic triple.
	for u := int32(0); int(u) < n; u++ {
		for v := u + 1; int(v) < n; v++ {
			uv := p.before(u, v)
			for w := v + 1; int(w) < n; w++ {
				vw, uw := p.before(v, w), p.before(u, w)
				f.add(FamOrder, -uv, -vw, uw)
				f.add(FamOrder, uv, vw, -uw)
			}
		}
	}
	// Every edge on some allowed page.
	for j := range es {
		f.add(FamPage, p.page[j]...)
	}
	pe := &partEncoder{e: e, p: p, kinds: e.kinds, memo: make([]int32, n*len(es)), isAux: map[int32]int{}}
	for j := range es {
		for k := j + 1; k < len(es); k++ {
			if p.eu[j] == p.eu[k] || p.eu[j] == p.ev[k] || p.ev[j] == p.eu[k] || p.ev[j] == p.ev[k] {
				continue // edges with a common end neither cross nor nest
			}
			pe.pair(j, k, rotation)
		}
	}
	pe.defineBetween()
}

// rankInKind returns how many pages before pg have the same kind.
func rankInKind(kinds []cert.Kind, pg int) int {
	r := 0
	for i := 0; i < pg; i++ {
		if kinds[i] == kinds[pg] {
			r++
		}
	}
	return r
}

// between returns the betweenness of local vertex c and local edge j.
func (pe *partEncoder) between(c int32, j int) between {
	p := pe.p
	x, y := p.before(p.eu[j], c), p.before(p.ev[j], c)
	switch {
	case x == litTrue || x == litFalse:
		if x == litTrue {
			return between{lit: -y}
		}
		return between{lit: y}
	case y == litTrue || y == litFalse:
		if y == litTrue {
			return between{lit: -x}
		}
		return between{lit: x}
	}
	if pe.e.opt.NoBetweenness {
		return between{x: x, y: y}
	}
	key := int(c)*len(p.edges) + j
	if i := pe.memo[key]; i > 0 {
		return between{lit: pe.aux[i-1].v}
	}
	v := pe.e.f.newVar(FamBetween)
	pe.memo[key] = int32(len(pe.aux) + 1)
	pe.isAux[v] = len(pe.aux)
	pe.aux = append(pe.aux, auxBetween{v: v, x: x, y: y})
	return between{lit: v}
}

// term is "b has value val"; a conflict is a conjunction of terms.
type term struct {
	b   between
	val bool
}

// conflictClauses expands the forbidden conjunctions into clauses (each
// clause: not all terms of one conjunction hold).
func (pe *partEncoder) conflictClauses(conj [][2]term) [][]int32 {
	out := pe.scratch[:0]
	for _, c := range conj {
		alts0 := alternatives(c[0])
		alts1 := alternatives(c[1])
		for _, a := range alts0 {
			for _, b := range alts1 {
				cl := make([]int32, 0, 4)
				for _, l := range a {
					cl = append(cl, -l)
				}
				for _, l := range b {
					cl = append(cl, -l)
				}
				out = append(out, cl)
			}
		}
	}
	pe.scratch = out
	return out
}

// alternatives lists the ways a term can hold, each as literals that are all true.
func alternatives(t term) [][]int32 {
	b := t.b
	if b.lit != 0 {
		if t.val {
			return [][]int32{{b.lit}}
		}
		return [][]int32{{-b.lit}}
	}
	if t.val {
		return [][]int32{{b.x, -b.y}, {-b.x, b.y}}
	}
	return [][]int32{{b.x, b.y}, {-b.x, -b.y}}
}

// pair adds the conflict constraints for the disjoint local edges j < k.
func (pe *partEncoder) pair(j, k int, rotation bool) {
	p := pe.p
	var common [3][]int // pages of each kind both edges may use
	for pg, kind := range pe.kinds {
		if p.page[j][pg] != litFalse && p.page[k][pg] != litFalse {
			common[kind] = append(common[kind], pg)
		}
	}
	if len(common[cert.Stack]) > 0 {
		r, s := j, k // reference edge r, other edge s
		if rotation && p.eu[j] == 0 {
			r, s = k, j
		}
		bc, bd := pe.between(p.eu[s], r), pe.between(p.ev[s], r)
		cls := pe.conflictClauses([][2]term{
			{{bc, true}, {bd, false}},
			{{bc, false}, {bd, true}},
		})
		pe.emit(j, k, common[cert.Stack], cls)
	}
	if len(common[cert.Queue]) > 0 {
		cls := pe.conflictClauses([][2]term{
			{{pe.between(p.eu[k], j), true}, {pe.between(p.ev[k], j), true}},
			{{pe.between(p.eu[j], k), true}, {pe.between(p.ev[j], k), true}},
		})
		pe.emit(j, k, common[cert.Queue], cls)
	}
}

// emit adds "if j and k share a page in pages, every clause of cls holds",
// directly or through a same-page variable, whichever takes fewer clauses.
func (pe *partEncoder) emit(j, k int, pages []int, cls [][]int32) {
	p, f := pe.p, &pe.e.f
	live := cls[:0]
	for _, cl := range cls {
		if !satisfied(cl) {
			live = append(live, cl)
		}
	}
	if len(live) == 0 {
		return
	}
	for _, cl := range live {
		pe.mark(cl)
	}
	if pe.e.opt.NoDirect || len(pages)+len(live) < len(pages)*len(live) {
		s := f.newVar(FamSamePage)
		for _, pg := range pages {
			f.add(FamSamePage, -p.page[j][pg], -p.page[k][pg], s)
		}
		for _, cl := range live {
			pe.buf = append(append(pe.buf[:0], -s), cl...)
			f.add(FamConflict, pe.buf...)
		}
		return
	}
	for _, pg := range pages {
		for _, cl := range live {
			pe.buf = append(append(pe.buf[:0], -p.page[j][pg], -p.page[k][pg]), cl...)
			f.add(FamConflict, pe.buf...)
		}
	}
}

// satisfied reports whether a clause holds a true literal.
func satisfied(cl []int32) bool {
	for _, l := range cl {
		if l == litTrue {
			return true
		}
	}
	return false
}

// mark records which direction of each betweenness definition cl relies on.
func (pe *partEncoder) mark(cl []int32) {
	for _, l := range cl {
		v := max(l, -l)
		i, ok := pe.isAux[v]
		if !ok {
			continue
		}
		if l < 0 {
			pe.aux[i].up = true // clause has -v: needs "between implies v"
		} else {
			pe.aux[i].down = true // clause has v: needs "v implies between"
		}
	}
}

// defineBetween adds the needed directions of v <-> (x xor y).
func (pe *partEncoder) defineBetween() {
	f := &pe.e.f
	for _, a := range pe.aux {
		if a.up {
			f.add(FamBetween, -a.x, a.y, a.v)
			f.add(FamBetween, a.x, -a.y, a.v)
		}
		if a.down {
			f.add(FamBetween, -a.v, a.x, a.y)
			f.add(FamBetween, -a.v, -a.x, -a.y)
		}
	}
}
