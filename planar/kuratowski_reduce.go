package planar

// reduce prunes, suppresses and merges in the work graph (the required and
// candidate super-edges), then rewrites the two lists in terms of the
// surviving super-edges, keeping their order. None of the steps changes
// planarity: an edge at a vertex of degree one lies on no cycle, suppressing
// a vertex of degree two is undone by subdividing the new edge, and a loop or
// a parallel edge can be drawn beside its vertex or its twin. A merged
// super-edge is required when one of its parts is: deleting any part leaves
// the rest of the path hanging, and the prune that follows deletes the
// required part too.
//
// The work graph is held in flat arrays over a local numbering of its
// vertices: each super-edge has a slot in the incidence list of each end, a
// new super-edge takes over the slots of the two it merges at the far ends,
// so the lists never grow.
func (ks *kurSearch) reduce() {
	cur, nv, off := ks.incidences()
	lid := ks.vmap
	slot := make([]int32, off[nv])
	deg := make([]int32, nv)
	fill := make([]int32, nv)
	copy(fill, off[:nv])
	for _, s := range cur {
		a, b := lid[ks.ea[s]], lid[ks.eb[s]]
		ks.slotA[s], ks.slotB[s] = fill[a], fill[b]+int32(btoi(a == b))
		slot[ks.slotA[s]], slot[ks.slotB[s]] = s, s
		fill[a]++
		fill[b]++
		deg[a]++
		deg[b]++
	}
	queue := make([]int32, 0, nv)
	kill := func(s int32) {
		ks.alive[s] = false
		ks.into[s] = -1
		slot[ks.slotA[s]], slot[ks.slotB[s]] = -1, -1
		a, b := lid[ks.ea[s]], lid[ks.eb[s]]
		deg[a]--
		deg[b]--
		queue = append(queue, a, b)
	}
	other := func(s, v int32) int32 { return lid[ks.ea[s]] ^ lid[ks.eb[s]] ^ v }
	// Loops and parallel edges among the edges as given.
	mark := make([]int32, nv)
	markEdge := make([]int32, nv)
	for i := range mark {
		mark[i] = -1
	}
	for v := int32(0); int(v) < nv; v++ {
		for _, s := range slot[off[v]:off[v+1]] {
			if s < 0 {
				continue
			}
			w := other(s, v)
			switch {
			case w == v:
				kill(s)
			case mark[w] == v:
				if t := markEdge[w]; ks.req[s] && !ks.req[t] {
					kill(t)
					markEdge[w] = s
				} else {
					kill(s)
				}
			default:
				mark[w], markEdge[w] = v, s
			}
		}
	}
	for v := int32(0); int(v) < nv; v++ {
		queue = append(queue, v)
	}
	// find returns an alive edge between a and b other than not, or -1.
	find := func(a, b, not int32) int32 {
		if off[b+1]-off[b] < off[a+1]-off[a] {
			a, b = b, a
		}
		for _, t := range slot[off[a]:off[a+1]] {
			if t >= 0 && t != not && other(t, a) == b {
				return t
			}
		}
		return -1
	}
	var two [2]int32
	for len(queue) > 0 {
		v := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		if deg[v] != 1 && deg[v] != 2 {
			continue
		}
		k := 0
		for _, s := range slot[off[v]:off[v+1]] {
			if s >= 0 {
				two[k] = s
				k++
				if k == int(deg[v]) {
					break
				}
			}
		}
		if deg[v] == 1 {
			kill(two[0])
			continue
		}
		x, y := two[0], two[1]
		a, b := other(x, v), other(y, v)
		if a == b {
			// x and y are parallel; keep the required one.
			if ks.req[x] && !ks.req[y] {
				x = y
			}
			kill(x)
			continue
		}
		// Slots of x at a and of y at b, and at v.
		xa, xv := ks.slotA[x], ks.slotB[x]
		if lid[ks.ea[x]] != a {
			xa, xv = xv, xa
		}
		yb, yv := ks.slotA[y], ks.slotB[y]
		if lid[ks.ea[y]] != b {
			yb, yv = yv, yb
		}
		s := ks.newSuper(ks.g2(a, x), ks.g2(b, y), x, y)
		slot[xv], slot[yv] = -1, -1
		ks.slotA[s], ks.slotB[s] = xa, yb
		slot[xa], slot[yb] = s, s
		deg[v] = 0
		if t := find(a, b, s); t >= 0 {
			if ks.req[s] && !ks.req[t] {
				kill(t)
			} else {
				kill(s)
			}
		}
	}
	// Rewrite the lists by representatives, in the order of cur.
	ks.markEpoch++
	if len(ks.mark) < len(ks.ea) {
		ks.mark = append(ks.mark, make([]int32, len(ks.ea)-len(ks.mark))...)
	}
	var req, work []int32
	for _, s := range cur {
		r := ks.rep(s)
		if r < 0 || ks.mark[r] == ks.markEpoch {
			continue
		}
		ks.mark[r] = ks.markEpoch
		if ks.req[r] {
			req = append(req, r)
		} else {
			work = append(work, r)
		}
	}
	ks.required, ks.work = req, work
}

// g2 returns the end of super-edge s (a vertex of g) whose local number is a.
func (ks *kurSearch) g2(a, s int32) int32 {
	if ks.vmap[ks.ea[s]] == a {
		return ks.ea[s]
	}
	return ks.eb[s]
}

// rep returns the live super-edge that s became, or -1 when it was deleted,
// shortening the chains it followed.
func (ks *kurSearch) rep(s int32) int32 {
	r := s
	for r >= 0 && !ks.alive[r] {
		r = ks.into[r]
	}
	for s >= 0 && !ks.alive[s] {
		s, ks.into[s] = ks.into[s], r
	}
	return r
}

// localize numbers the ends of the super-edges in list 0, 1, … in ks.vmap
// (valid for this epoch) and returns how many there are.
func (ks *kurSearch) localize(list []int32) int {
	ks.epoch++
	if ks.epoch == 0 {
		clear(ks.vstamp)
		ks.epoch = 1
	}
	n := 0
	for _, s := range list {
		for _, v := range [2]int32{ks.ea[s], ks.eb[s]} {
			if ks.vstamp[v] != ks.epoch {
				ks.vstamp[v] = ks.epoch
				ks.vmap[v] = int32(n)
				n++
			}
		}
	}
	return n
}

// incidences gathers the required and the candidate super-edges into
// ks.cur, numbers their ends locally (ks.vmap, localize) and returns them,
// the number of local vertices and the offsets of one incidence list per
// local vertex: vertex v's are off[v]..off[v+1] (a loop counts twice).
func (ks *kurSearch) incidences() (cur []int32, nv int, off []int32) {
	cur = append(append(ks.cur[:0], ks.required...), ks.work...)
	ks.cur = cur
	nv = ks.localize(cur)
	lid := ks.vmap
	off = make([]int32, nv+1)
	for _, s := range cur {
		off[lid[ks.ea[s]]+1]++
		off[lid[ks.eb[s]]+1]++
	}
	for i := 0; i < nv; i++ {
		off[i+1] += off[i]
	}
	return cur, nv, off
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}
