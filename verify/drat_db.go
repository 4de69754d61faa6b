package verify

// The clause database of the DRAT checker: clauses stored in one arena,
// two watched literals per clause, a top-level trail with reasons, and a hash
// index for matching deletions. Literals are encoded as 2*v+sign (sign 1 for
// negative) so that l^1 is the negation of l.

const (
	flagActive = 1 << iota // clause is in the current formula (and watched)
	flagCore               // clause is needed for the refutation
	flagLemma              // clause was added by the proof
	flagTaut               // clause contains a literal and its negation
)

const noClause = -1

type clause struct {
	off   int    // first literal in db.arena
	n     int32  // number of (distinct) literals
	pivot uint32 // first literal as written in the proof (RAT pivot)
	flags uint8
	next  int // hash chain
	hash  uint64
}

type dratDB struct {
	arena    []uint32
	cls      []clause
	vals     []int8    // per literal: 1 true, -1 false, 0 unassigned
	reason   []int     // per variable: clause that implied it, noClause for none
	pos      []int32   // per variable: index in trail
	asm      []bool    // per variable: belongs to the clause being checked
	seen     []bool    // per variable: scratch for conflict analysis
	mark     []bool    // per literal: scratch for deduplication and matching
	watches  [][]watch // per literal: non-core clauses watching it
	cwatches [][]watch // per literal: core clauses watching it
	trail    []uint32
	head     int   // next trail literal for all clauses
	headCore int   // next trail literal for core clauses
	units    []int // clauses of one literal (they are watched on it alone)

	buckets []int // hash heads, length a power of two
	live    int   // clauses in the hash index
	wasted  int   // arena words of clauses removed for good (forward mode)

	// Variables 1..dense are their own index; a larger one (inputs may name
	// any variable up to 2^31-1) gets the next index after dense, so memory
	// follows the variables used, not their numbers.
	dense  int
	extVar []int32       // extVar[i] is the variable of index dense+1+i
	intern map[int32]int // variable -> index, beyond dense

	conflict     int
	propagations uint64
}

// newDratDB makes a database whose variables up to dense are kept in place.
func newDratDB(dense int) *dratDB {
	d := &dratDB{conflict: noClause, dense: dense, intern: map[int32]int{}}
	d.buckets = make([]int, 1024)
	for i := range d.buckets {
		d.buckets[i] = noClause
	}
	return d
}

// lit encodes the literal x of the input (|x| <= 2^31-1).
func (d *dratDB) lit(x int32) uint32 {
	v := int(x)
	if x < 0 {
		v = -v
	}
	if v > d.dense {
		i, ok := d.intern[int32(v)]
		if !ok {
			d.extVar = append(d.extVar, int32(v))
			i = d.dense + len(d.extVar)
			d.intern[int32(v)] = i
		}
		v = i
	}
	d.ensureVar(v)
	if x < 0 {
		return uint32(v)<<1 | 1
	}
	return uint32(v) << 1
}

// extLit decodes l to the literal of the input.
func (d *dratDB) extLit(l uint32) int32 {
	v := int32(l >> 1)
	if int(v) > d.dense {
		v = d.extVar[int(v)-d.dense-1]
	}
	if l&1 == 1 {
		return -v
	}
	return v
}

func (d *dratDB) ensureVar(v int) {
	for len(d.reason) <= v {
		d.reason = append(d.reason, noClause)
		d.pos = append(d.pos, 0)
		d.asm = append(d.asm, false)
		d.seen = append(d.seen, false)
		d.vals = append(d.vals, 0, 0)
		d.mark = append(d.mark, false, false)
		d.watches = append(d.watches, nil, nil)
		d.cwatches = append(d.cwatches, nil, nil)
	}
}

func (d *dratDB) lits(c int) []uint32 {
	cl := &d.cls[c]
	return d.arena[cl.off : cl.off+int(cl.n)]
}

func mix(x uint64) uint64 {
	x += 0x9e3779b97f4a7c15
	x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9
	x = (x ^ (x >> 27)) * 0x94d049bb133111eb
	return x ^ (x >> 31)
}

// clauseHash does not depend on the order of the literals.
func clauseHash(ls []uint32) uint64 {
	var sum, xor uint64
	for _, l := range ls {
		m := mix(uint64(l))
		sum += m
		xor ^= m >> 7
	}
	return mix(sum ^ xor*0x2545f4914f6cdd1d)
}

// normalize removes repeated literals from ext (in place, keeping the first
// occurrence) and returns the encoded literals and whether the clause is a
// tautology. buf is reused.
func (d *dratDB) normalize(ext []int32, buf []uint32) ([]uint32, bool) {
	buf = buf[:0]
	taut := false
	for _, x := range ext {
		l := d.lit(x)
		if d.mark[l] {
			continue
		}
		if d.mark[l^1] {
			taut = true
		}
		d.mark[l] = true
		buf = append(buf, l)
	}
	for _, l := range buf {
		d.mark[l] = false
	}
	return buf, taut
}

// add stores a clause (already normalized) and indexes it; it is not watched yet.
func (d *dratDB) add(ls []uint32, taut, lemma bool) int {
	c := len(d.cls)
	cl := clause{off: len(d.arena), n: int32(len(ls)), next: noClause}
	if len(ls) > 0 {
		cl.pivot = ls[0]
	}
	if taut {
		cl.flags |= flagTaut
	}
	if lemma {
		cl.flags |= flagLemma
	}
	d.arena = append(d.arena, ls...)
	cl.hash = clauseHash(ls)
	d.cls = append(d.cls, cl)
	d.hashInsert(c)
	if len(ls) == 1 {
		d.units = append(d.units, c)
	}
	return c
}

func (d *dratDB) hashInsert(c int) {
	if d.live >= len(d.buckets) {
		old := d.buckets
		d.buckets = make([]int, 2*len(old))
		for i := range d.buckets {
			d.buckets[i] = noClause
		}
		for _, h := range old {
			for h != noClause {
				nx := d.cls[h].next
				b := d.cls[h].hash & uint64(len(d.buckets)-1)
				d.cls[h].next = d.buckets[b]
				d.buckets[b] = h
				h = nx
			}
		}
	}
	b := d.cls[c].hash & uint64(len(d.buckets)-1)
	d.cls[c].next = d.buckets[b]
	d.buckets[b] = c
	d.live++
}

// find returns the most recently added indexed clause with exactly the
// literals ls (normalized), or noClause.
func (d *dratDB) find(ls []uint32) int {
	h := clauseHash(ls)
	for _, l := range ls {
		d.mark[l] = true
	}
	found := noClause
	for c := d.buckets[h&uint64(len(d.buckets)-1)]; c != noClause; c = d.cls[c].next {
		cl := &d.cls[c]
		if cl.hash != h || int(cl.n) != len(ls) {
			continue
		}
		same := true
		for _, l := range d.lits(c) {
			if !d.mark[l] {
				same = false
				break
			}
		}
		if same {
			found = c
			break
		}
	}
	for _, l := range ls {
		d.mark[l] = false
	}
	return found
}

func (d *dratDB) hashRemove(c int) {
	b := d.cls[c].hash & uint64(len(d.buckets)-1)
	prev := noClause
	for h := d.buckets[b]; h != noClause; h = d.cls[h].next {
		if h == c {
			if prev == noClause {
				d.buckets[b] = d.cls[h].next
			} else {
				d.cls[prev].next = d.cls[h].next
			}
			d.cls[c].next = noClause
			d.live--
			return
		}
		prev = h
	}
}

func (d *dratDB) assign(l uint32, reason int) {
	d.vals[l] = 1
	d.vals[l^1] = -1
	v := l >> 1
	d.reason[v] = reason
	d.pos[v] = int32(len(d.trail))
	d.trail = append(d.trail, l)
}

// backtrack unassigns trail[to:] (chronological: no rescan needed).
func (d *dratDB) backtrack(to int) {
	for _, l := range d.trail[to:] {
		d.vals[l], d.vals[l^1] = 0, 0
		d.reason[l>>1] = noClause
	}
	d.trail = d.trail[:to]
	d.head = min(d.head, to)
	d.headCore = min(d.headCore, to)
}

// isReason reports whether clause c is the reason of a current assignment.
func (d *dratDB) isReason(c int) bool {
	cl := &d.cls[c]
	if cl.n == 0 {
		return false
	}
	l := d.arena[cl.off]
	return d.vals[l] == 1 && d.reason[l>>1] == c
}

// watch is a watch-list entry. For a clause of two literals, other is the
// literal not watched by this entry (always the other watch, since such a
// clause never moves its watches), so propagation need not load the clause;
// for other clauses it is 0.
type watch struct {
	c     int
	other uint32
}

// newWatch is the entry of clause c in the list of its literal l.
func (d *dratDB) newWatch(c int, l uint32) watch {
	if d.cls[c].n == 2 {
		ls := d.lits(c)
		return watch{c, ls[0] ^ ls[1] ^ l}
	}
	return watch{c: c}
}

// wl returns the watch lists that hold clause c.
func (d *dratDB) wl(c int) [][]watch {
	if d.cls[c].flags&flagCore != 0 {
		return d.cwatches
	}
	return d.watches
}

// markCore marks clause c core and moves its watches to the core lists.
func (d *dratDB) markCore(c int) {
	cl := &d.cls[c]
	if cl.flags&flagCore != 0 {
		return
	}
	if cl.flags&flagActive != 0 {
		ls := d.lits(c)
		for i := 0; i < len(ls) && i < 2; i++ {
			d.watches[ls[i]] = removeWatch(d.watches[ls[i]], c)
			d.cwatches[ls[i]] = append(d.cwatches[ls[i]], d.newWatch(c, ls[i]))
		}
	}
	cl.flags |= flagCore
}

func removeWatch(ws []watch, c int) []watch {
	for i, w := range ws {
		if w.c == c {
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
	cl := &d.cls[c]
	cl.flags |= flagActive
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
	cl := &d.cls[c]
	cl.flags &^= flagActive
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
		c := e.c
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
		cl := &d.cls[c]
		ls := d.arena[cl.off : cl.off+int(cl.n)]
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
				wl[ls[1]] = append(wl[ls[1]], watch{c: c})
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
		c := e.c
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
				w[ls[1]] = append(w[ls[1]], watch{c: c})
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
		cl := &d.cls[c]
		if cl.flags&flagActive == 0 {
			continue
		}
		l := d.arena[cl.off]
		switch d.vals[l] {
		case 0:
			d.assign(l, c)
		case -1:
			d.conflict = c
			return false
		}
	}
	return d.propagate()
}

// analyze marks the clauses behind conflict clause confl as core and returns
// them in hints (when hints is non-nil) in the order propagation used them,
// the conflict clause last. Variables flagged asm are assumptions: their
// reasons are not followed.
func (d *dratDB) analyze(confl int, hints []int, wantHints bool) []int {
	d.markCore(confl)
	pending := 0
	for _, l := range d.lits(confl) {
		v := l >> 1
		if !d.asm[v] && !d.seen[v] {
			d.seen[v] = true
			pending++
		}
	}
	start := len(hints)
	for i := len(d.trail) - 1; i >= 0 && pending > 0; i-- {
		v := d.trail[i] >> 1
		if !d.seen[v] {
			continue
		}
		d.seen[v] = false
		pending--
		r := d.reason[v]
		if r == noClause {
			continue
		}
		d.markCore(r)
		if wantHints {
			hints = append(hints, r)
		}
		for _, l := range d.lits(r) {
			u := l >> 1
			if u != v && !d.asm[u] && !d.seen[u] {
				d.seen[u] = true
				pending++
			}
		}
	}
	if !wantHints {
		return hints
	}
	for i, j := start, len(hints)-1; i < j; i, j = i+1, j-1 {
		hints[i], hints[j] = hints[j], hints[i]
	}
	return append(hints, confl)
}
