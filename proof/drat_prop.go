package proof

// Unit propagation of the DRAT checker: two watched literals per clause,
// core clauses propagated before the others, and re-examination after
// literals are taken back from the middle of the top-level trail.

// watch is a watch-list entry. For a clause of two literals, other is the
// literal not watched by this entry (always the other watch, since such a
// clause never moves its watches), so propagation need not load the clause;
// for other clauses it is 0. Eight bytes and no pointers.
type watch struct {
	c     int32
	other uint32
}

// newWatch is the entry of clause c in the list of its literal l.
func (d *dratDB) newWatch(c int, l uint32) watch {
	if d.size(c) == 2 {
		ls := d.lits(c)
		return watch{int32(c), ls[0] ^ ls[1] ^ l}
	}
	return watch{c: int32(c)}
}

// wl returns the watch lists that hold clause c.
func (d *dratDB) wl(c int) [][]watch {
	if d.flags[c]&flagCore != 0 {
		return d.cwatches
	}
	return d.watches
}

// markCore marks clause c core and moves its watches to the core lists.
func (d *dratDB) markCore(c int) {
	if d.flags[c]&flagCore != 0 {
		return
	}
	if d.flags[c]&flagActive != 0 {
		ls := d.lits(c)
		for i := 0; i < len(ls) && i < 2; i++ {
			d.watches[ls[i]] = removeWatch(d.watches[ls[i]], c)
			d.cwatches[ls[i]] = append(d.cwatches[ls[i]], d.newWatch(c, ls[i]))
		}
	}
	d.flags[c] |= flagCore
}

func removeWatch(ws []watch, c int) []watch {
	for i, w := range ws {
		if int(w.c) == c {
			ws[i] = ws[len(ws)-1]
			return ws[:len(ws)-1]
		}
	}
	return ws
}

// attach makes clause c active: it chooses watches among its non-false
// literals and assigns it when it is unit. It returns false (and sets
// d.conflict) when the clause is falsified.
func (d *dratDB) attach(c int) bool {
	d.flags[c] |= flagActive
	ls := d.lits(c)
	if len(ls) == 0 {
		d.conflict = c
		return false
	}
	// move up to two non-false literals to the front, true ones first
	k := 0
	for i := range ls {
		if d.vals[ls[i]] == 1 {
			ls[k], ls[i] = ls[i], ls[k]
			k++
			if k == 2 {
				break
			}
		}
	}
	for i := k; i < len(ls) && k < 2; i++ {
		if d.vals[ls[i]] == 0 {
			ls[k], ls[i] = ls[i], ls[k]
			k++
		}
	}
	w := d.wl(c)
	w[ls[0]] = append(w[ls[0]], d.newWatch(c, ls[0]))
	if len(ls) > 1 {
		w[ls[1]] = append(w[ls[1]], d.newWatch(c, ls[1]))
	}
	switch {
	case k == 0:
		d.conflict = c
		return false
	case k == 1 && d.vals[ls[0]] == 0:
		d.assign(ls[0], c)
	}
	return true
}

// detach removes clause c from the watch lists and the current formula.
func (d *dratDB) detach(c int) {
	d.flags[c] &^= flagActive
	ls := d.lits(c)
	w := d.wl(c)
	if len(ls) > 0 {
		w[ls[0]] = removeWatch(w[ls[0]], c)
	}
	if len(ls) > 1 {
		w[ls[1]] = removeWatch(w[ls[1]], c)
	}
}

// propagate runs unit propagation from d.head; on a conflict it sets
// d.conflict and returns false. Clauses already marked core are propagated
// first (drat-trim does the same): every other clause waits until the core
// ones are exhausted, which keeps the set of clauses a check uses, and so
// the core, small.
func (d *dratDB) propagate() bool {
	for {
		for d.headCore < len(d.trail) {
			f := d.trail[d.headCore] ^ 1
			d.headCore++
			if !d.propagateLit(f, true) {
				return false
			}
		}
		if d.head >= len(d.trail) {
			return true
		}
		f := d.trail[d.head] ^ 1
		d.head++
		d.propagations++
		if !d.propagateLit(f, false) {
			return false
		}
	}
}

// propagateLit visits the clauses watching f (just made false) whose core
// flag equals core.
func (d *dratDB) propagateLit(f uint32, core bool) bool {
	wl := d.watches
	if core {
		wl = d.cwatches
	}
	ws := wl[f]
	i, j := 0, 0
	for i < len(ws) {
		e := ws[i]
		i++
		c := int(e.c)
		if e.other != 0 { // two literals: no need to load the clause
			ws[j] = e
			j++
			switch d.vals[e.other] {
			case 1:
				continue
			case 0:
				ls := d.lits(c)
				if ls[0] != e.other {
					ls[0], ls[1] = ls[1], ls[0]
				}
				d.assign(e.other, c)
				continue
			}
			d.conflict = c
			copy(ws[j:], ws[i:])
			wl[f] = ws[:j+len(ws)-i]
			return false
		}
		ls := d.arena[d.off[c]:d.off[c+1]]
		if len(ls) == 1 {
			ws[j] = e
			j++
			d.conflict = c
			copy(ws[j:], ws[i:])
			wl[f] = ws[:j+len(ws)-i]
			return false
		}
		if ls[0] == f {
			ls[0], ls[1] = ls[1], ls[0]
		}
		if d.vals[ls[0]] == 1 {
			ws[j] = e
			j++
			continue
		}
		moved := false
		for k := 2; k < len(ls); k++ {
			if d.vals[ls[k]] != -1 {
				ls[1], ls[k] = ls[k], ls[1]
				wl[ls[1]] = append(wl[ls[1]], watch{c: e.c})
				moved = true
				break
			}
		}
		if moved {
			continue
		}
		ws[j] = e
		j++
		if d.vals[ls[0]] == 0 {
			d.assign(ls[0], c)
			continue
		}
		d.conflict = c
		copy(ws[j:], ws[i:])
		wl[f] = ws[:j+len(ws)-i]
		return false
	}
	wl[f] = ws[:j]
	return true
}

// unassignFrom removes trail[k:] from the top level, which is not
// chronological backtracking: a clause whose other watch stays false may
// become unit again, so the watchers of every literal taken back are
// re-examined before propagation resumes.
func (d *dratDB) unassignFrom(k int) bool {
	back := append([]uint32(nil), d.trail[k:]...)
	d.backtrack(k)
	d.head, d.headCore = k, k
	for _, x := range back {
		if d.vals[x] == 0 {
			d.rescan(x, d.cwatches)
		}
		if d.vals[x] == 0 {
			d.rescan(x, d.watches)
		}
	}
	return d.propagate()
}

// rescan re-examines the clauses in w watching x, which was just
// unassigned: a clause whose other watch is false either gets a new watch or
// implies x again.
func (d *dratDB) rescan(x uint32, w [][]watch) {
	for _, e := range w[x] {
		c := int(e.c)
		ls := d.lits(c)
		if len(ls) == 1 {
			d.assign(x, c)
			return
		}
		if ls[1] == x {
			ls[0], ls[1] = ls[1], ls[0]
		}
		o := ls[1]
		if d.vals[o] != -1 {
			continue
		}
		moved := false
		for i := 2; i < len(ls); i++ {
			if d.vals[ls[i]] != -1 {
				w[o] = removeWatch(w[o], c)
				ls[1], ls[i] = ls[i], ls[1]
				w[ls[1]] = append(w[ls[1]], watch{c: e.c})
				moved = true
				break
			}
		}
		if !moved {
			d.assign(x, c)
			return
		}
	}
}

// resetTopLevel clears every assignment and propagates the active formula
// from scratch.
func (d *dratDB) resetTopLevel() bool {
	d.backtrack(0)
	d.head, d.headCore = 0, 0
	d.conflict = noClause
	for _, c := range d.units {
		if d.flags[c]&flagActive == 0 {
			continue
		}
		l := d.arena[d.off[c]]
		switch d.vals[l] {
		case 0:
			d.assign(l, int(c))
		case -1:
			d.conflict = int(c)
			return false
		}
	}
	return d.propagate()
}
