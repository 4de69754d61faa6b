package dimacs

import (
	"fmt"
	"slices"

	"spinecert.dev/cert"
)

// value returns the truth value of an encoder literal under model.
func value(model []bool, l int32) bool {
	switch l {
	case litTrue:
		return true
	case litFalse:
		return false
	}
	if l < 0 {
		return !model[-l]
	}
	return model[l]
}

// Decode turns a model (model[v] is the value of variable v; model[0] is
// ignored) into a layout of the whole original graph and checks it with
// cert.Validate. It never trusts the model: a model that does not satisfy
// the CNF either still gives a valid layout or yields ErrInvalidModel.
func (e *Encoding) Decode(model []bool) (*cert.Layout, error) {
	if len(model) < e.f.nvars+1 {
		return nil, fmt.Errorf("%w: the model gives %d variables, the encoding has %d", ErrInvalidModel, max(len(model)-1, 0), e.f.nvars)
	}
	var l *cert.Layout
	if e.base != nil {
		l = e.decodeBaseline(model)
	} else {
		l = e.decodeDefault(model)
	}
	if rep := cert.Validate(e.g, l); !rep.OK() {
		msg := "layout rejected"
		if len(rep.Problems) > 0 {
			msg = rep.Problems[0].Msg
		}
		return l, fmt.Errorf("%w: %s (%d problems)", ErrInvalidModel, msg, rep.Total())
	}
	return l, nil
}

// orderFrom sorts n items by the number of items before each under the
// relation before(u, v), ties broken by index; for a transitive relation
// this is its linear order.
func orderFrom(n int, before func(u, v int32) bool) []int32 {
	rank := make([]int, n)
	for u := int32(0); int(u) < n; u++ {
		for v := u + 1; int(v) < n; v++ {
			if before(u, v) {
				rank[v]++
			} else {
				rank[u]++
			}
		}
	}
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
	}
	slices.SortStableFunc(order, func(a, b int32) int { return rank[a] - rank[b] })
	return order
}

func (e *Encoding) newLayout() *cert.Layout {
	return &cert.Layout{Kind: e.opt.Kind, PageKinds: e.kinds, Page: make([]int32, e.g.M())}
}

func (e *Encoding) decodeBaseline(model []bool) *cert.Layout {
	b := e.base
	l := e.newLayout()
	l.Order = orderFrom(b.n, func(u, v int32) bool { return model[b.orderVar(u, v)] })
	for ei := range l.Page {
		for pg := 0; pg < b.k; pg++ {
			if model[b.pageVar(ei, pg)] {
				l.Page[ei] = int32(pg + 1)
				break
			}
		}
	}
	return l
}

// decodePart returns the part's spine order (as graph vertices) and sets
// the pages of its edges in l.
func (p *part) decode(model []bool, l *cert.Layout) []int32 {
	local := orderFrom(p.n, func(u, v int32) bool { return value(model, p.before(u, v)) })
	order := make([]int32, p.n)
	for i, u := range local {
		order[i] = p.verts[u]
	}
	for j, ei := range p.edges {
		for pg, lit := range p.page[j] {
			if value(model, lit) {
				l.Page[ei] = int32(pg + 1)
				break
			}
		}
	}
	return order
}

// spine is a doubly linked list of vertices supporting insertion after a vertex.
type spine struct {
	next, prev []int32
	on         []bool
	head, tail int32
}

func newSpine(n int) *spine {
	s := &spine{next: make([]int32, n), prev: make([]int32, n), on: make([]bool, n), head: -1, tail: -1}
	return s
}

func (s *spine) pushBack(v int32) {
	s.on[v] = true
	s.prev[v], s.next[v] = s.tail, -1
	if s.tail >= 0 {
		s.next[s.tail] = v
	} else {
		s.head = v
	}
	s.tail = v
}

func (s *spine) insertAfter(at, v int32) {
	s.on[v] = true
	nx := s.next[at]
	s.prev[v], s.next[v] = at, nx
	s.next[at] = v
	if nx >= 0 {
		s.prev[nx] = v
	} else {
		s.tail = v
	}
}

func (s *spine) list() []int32 {
	var out []int32
	for v := s.head; v >= 0; v = s.next[v] {
		out = append(out, v)
	}
	return out
}

func (e *Encoding) decodeDefault(model []bool) *cert.Layout {
	g := e.g
	l := e.newLayout()
	sp := newSpine(g.N())
	if !e.blocks {
		if len(e.parts) == 1 {
			for _, v := range e.parts[0].decode(model, l) {
				sp.pushBack(v)
			}
		}
		// Put peeled leaves back right after their neighbour, last removed first.
		for i := len(e.leaves) - 1; i >= 0; i-- {
			v, u := e.leaves[i], e.anchors[i]
			if !sp.on[u] {
				sp.pushBack(u) // only when u was left without edges
			}
			sp.insertAfter(u, v)
			l.Page[g.EdgeIndex(u, v)] = 1
		}
		for _, v := range e.isolated {
			if !sp.on[v] {
				sp.pushBack(v)
			}
		}
		l.Order = sp.list()
		return l
	}
	// Blocks: each block's order rotated to start at the vertex where it
	// hangs, inserted right after that vertex.
	type blk struct{ order []int32 }
	var all []blk
	byVertex := make([][]int, g.N())
	for _, p := range e.parts {
		all = append(all, blk{p.decode(model, l)})
	}
	for _, ei := range e.bridges {
		ed := g.Edges()[ei]
		all = append(all, blk{[]int32{ed.U, ed.V}})
		l.Page[ei] = 1
	}
	for i, b := range all {
		for _, v := range b.order {
			byVertex[v] = append(byVertex[v], i)
		}
	}
	placed := make([]bool, len(all))
	var queue []int32
	for root := int32(0); int(root) < g.N(); root++ {
		if sp.on[root] {
			continue
		}
		sp.pushBack(root)
		queue = append(queue[:0], root)
		for len(queue) > 0 {
			v := queue[0]
			queue = queue[1:]
			for _, bi := range byVertex[v] {
				if placed[bi] {
					continue
				}
				placed[bi] = true
				ord := all[bi].order
				at := slices.Index(ord, v)
				prev := v
				for i := 1; i < len(ord); i++ {
					w := ord[(at+i)%len(ord)]
					sp.insertAfter(prev, w)
					prev = w
					queue = append(queue, w)
				}
			}
		}
	}
	l.Order = sp.list()
	return l
}
