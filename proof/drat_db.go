package proof

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
