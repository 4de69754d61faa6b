package dimacs

import (
	"encoding/binary"
	"slices"
)

// twinClasses groups the local vertices of a part into twin classes: u and
// v are twins when N(u)∖{v} = N(v)∖{u} in the part's graph, that is when
// their open neighbourhoods are equal (false twins, not adjacent) or their
// closed neighbourhoods are equal (true twins, adjacent). class[v] is the
// index of v's class (classes numbered by their smallest vertex) or -1 when
// v has no twin; members[c] lists class c's vertices in increasing order.
//
// Both relations are equivalences, and no vertex has a false twin u and a
// true twin w: w ∈ N(v) = N(u) would make u adjacent to w, so u ∈ N[w] =
// N[v], yet u is not adjacent to v. So the classes are disjoint.
func (p *part) twinClasses() (class []int32, members [][]int32) {
	n := p.n
	nb := make([][]int32, n)
	for j := range p.eu {
		u, v := p.eu[j], p.ev[j]
		nb[u] = append(nb[u], v)
		nb[v] = append(nb[v], u)
	}
	class = make([]int32, n)
	for v := range class {
		class[v] = -1
	}
	var buf []byte
	key := func(s []int32) string {
		buf = buf[:0]
		for _, x := range s {
			buf = binary.AppendUvarint(buf, uint64(x))
		}
		return string(buf)
	}
	groups := map[string][]int32{}
	var keys []string
	add := func(k string, v int32) {
		if _, ok := groups[k]; !ok {
			keys = append(keys, k)
		}
		groups[k] = append(groups[k], v)
	}
	for v := int32(0); int(v) < n; v++ {
		open := slices.Clone(nb[v])
		slices.Sort(open)
		add("o"+key(open), v)
		closed := append(open, v)
		slices.Sort(closed)
		add("c"+key(closed), v)
	}
	var found [][]int32
	for _, k := range keys {
		if g := groups[k]; len(g) >= 2 {
			found = append(found, g)
		}
	}
	// Vertices were added in increasing order, so each group is sorted.
	slices.SortFunc(found, func(a, b []int32) int { return int(a[0] - b[0]) })
	for _, g := range found {
		c := int32(len(members))
		for _, v := range g {
			class[v] = c
		}
		members = append(members, g)
	}
	return class, members
}

// orderFix decides which order literals of a part symmetry breaking fixes
// (see the package documentation for why together they are sound). Every
// fixed literal says that the smaller local vertex comes first.
type orderFix struct {
	rotation bool    // local vertex 0 first
	twins    bool    // twin classes sorted
	class    []int32 // twin class of each local vertex, -1 if none
	rank     []int32 // position of each vertex within its class
	rx, ry   int32   // reflection pair rx < ry, -1 if none
}

// newOrderFix chooses the symmetry breaking for part p.
func newOrderFix(p *part, rotation, reflection, twins bool) *orderFix {
	n := p.n
	s := &orderFix{rotation: rotation, twins: twins, rx: -1, ry: -1}
	if !twins {
		// The two smallest vertices not fixed by rotation.
		if reflection {
			switch {
			case rotation && n >= 3:
				s.rx, s.ry = 1, 2
			case !rotation && n >= 2:
				s.rx, s.ry = 0, 1
			}
		}
		return s
	}
	var members [][]int32
	s.class, members = p.twinClasses()
	s.rank = make([]int32, n)
	for _, m := range members {
		for i, v := range m {
			s.rank[v] = int32(i)
		}
	}
	if !reflection {
		return s
	}
	// Reflection pair: the two smallest self-mirrored vertices, those in the
	// middle of their (effective) class; a vertex without twins is one.
	first := int32(0)
	if rotation {
		first = 1
	}
	for v := first; int(v) < n; v++ {
		if !s.selfMirrored(v, members) {
			continue
		}
		if s.rx < 0 {
			s.rx = v
		} else {
			s.ry = v
			break
		}
	}
	if s.ry < 0 {
		s.rx = -1
	}
	return s
}

// selfMirrored reports whether v is the middle member of its effective
// class: its class, less vertex 0 when rotation fixes 0 first.
func (s *orderFix) selfMirrored(v int32, members [][]int32) bool {
	c := s.class[v]
	if c < 0 {
		return true
	}
	size, rank := int32(len(members[c])), s.rank[v]
	if s.rotation && members[c][0] == 0 {
		size, rank = size-1, rank-1
	}
	return 2*rank+1 == size
}

// sameClass reports whether u and v are distinct twins.
func (s *orderFix) sameClass(u, v int32) bool {
	return s.twins && s.class[u] >= 0 && s.class[u] == s.class[v]
}

// fixed reports whether "u before v" (u < v) holds in every layout the
// symmetry breaking keeps: the transitive closure of "0 first", "twins in
// increasing order" and "rx before ry".
func (s *orderFix) fixed(u, v int32) bool {
	switch {
	case s.rotation && u == 0:
		return true
	case s.sameClass(u, v):
		return true
	case s.rx < 0:
		return false
	}
	left := u == s.rx || (u < s.rx && s.sameClass(u, s.rx))
	right := v == s.ry || (v > s.ry && s.sameClass(v, s.ry))
	return left && right
}
