package proof

import (
	"errors"
	"math"
)

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

// Limits of the database: clause numbers are held in int32 (LRAT hints name
// clause d of a RAT group as -(d+1)) and arena offsets in uint32.
const (
	maxClauses = math.MaxInt32 - 1
	maxArena   = min(math.MaxUint32, math.MaxInt)
)

// dratDB holds every per-clause and per-watch datum in flat arrays of
// 32-bit words, so that memory is a few words per clause and per literal
// and the garbage collector has no pointers to follow in them.
type dratDB struct {
	arena []uint32 // literals; clause c is arena[off[c]:off[c+1]]
	off   []uint32 // per clause, plus one entry: len(arena)
	next  []int32  // per clause: hash chain
	hash  []uint32 // per clause: clauseHash, low 32 bits
	flags []uint8  // per clause
	nOrig int      // clauses 0..nOrig-1 are the formula's, the others lemmas
	pivot []uint32 // per lemma c-nOrig: first literal as written (RAT pivot)

	vals     []int8    // per literal: 1 true, -1 false, 0 unassigned
	reason   []int32   // per variable: clause that implied it, noClause for none
	pos      []int32   // per variable: index in trail
	asm      []bool    // per variable: belongs to the clause being checked
	seen     []bool    // per variable: scratch for conflict analysis
	used     []bool    // per variable: an assumption the analysis reached (with noteUsed)
	usedVars []uint32  // the variables flagged in used
	noteUsed bool      // analyze notes the assumptions it reaches (for trimming)
	mark     []bool    // per literal: scratch for deduplication and matching
	watches  [][]watch // per literal: non-core clauses watching it
	cwatches [][]watch // per literal: core clauses watching it
	trail    []uint32
	head     int     // next trail literal for all clauses
	headCore int     // next trail literal for core clauses
	units    []int32 // clauses of one literal (they are watched on it alone)

	buckets []int32 // hash heads, length a power of two
	live    int     // clauses in the hash index
	wasted  int     // arena words of clauses removed for good (forward mode)

	// Variables 1..dense are their own index; a larger one (inputs may name
	// any variable up to 2^31-1) gets the next index after dense, so memory
	// follows the variables used, not their numbers.
	dense  int
	extVar []int32       // extVar[i] is the variable of index dense+1+i
	intern map[int32]int // variable -> index, beyond dense

	conflict     int
	propagations uint64
}

// newDratDB makes a database whose variables up to dense are kept in place,
// with room for a formula of clauses clauses and lits literals and lemmas of
// an eighth of its size: the arrays are made once at their size instead of
// growing (and leaving copies to collect) while the formula is loaded.
func newDratDB(dense, clauses, lits int) *dratDB {
	d := &dratDB{conflict: noClause, dense: dense, intern: map[int32]int{}}
	nc := min(clauses+clauses/8+1024, maxClauses)
	d.arena = make([]uint32, 0, min(lits+lits/8+4096, maxArena))
	d.off = make([]uint32, 1, nc+1)
	d.next = make([]int32, 0, nc)
	d.hash = make([]uint32, 0, nc)
	d.flags = make([]uint8, 0, nc)
	// room for the variables up to dense, or as many as the formula can use
	nv := min(dense, lits) + 1
	d.reason = make([]int32, 0, nv)
	d.pos = make([]int32, 0, nv)
	d.asm = make([]bool, 0, nv)
	d.seen = make([]bool, 0, nv)
	d.used = make([]bool, 0, nv)
	d.vals = make([]int8, 0, 2*nv)
	d.mark = make([]bool, 0, 2*nv)
	d.watches = make([][]watch, 0, 2*nv)
	d.cwatches = make([][]watch, 0, 2*nv)
	d.buckets = make([]int32, 1024)
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
		d.used = append(d.used, false)
		d.vals = append(d.vals, 0, 0)
		d.mark = append(d.mark, false, false)
		d.watches = append(d.watches, nil, nil)
		d.cwatches = append(d.cwatches, nil, nil)
	}
}

func (d *dratDB) lits(c int) []uint32 {
	return d.arena[d.off[c]:d.off[c+1]]
}

// size is the number of (distinct) literals of clause c.
func (d *dratDB) size(c int) int {
	return int(d.off[c+1] - d.off[c])
}

// pivotOf is the first literal of lemma c as the proof wrote it.
func (d *dratDB) pivotOf(c int) uint32 {
	return d.pivot[c-d.nOrig]
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

// errTooLarge is returned when the formula and proof need more clauses or
// literals at once than the database holds.
var errTooLarge = errors.New("proof: more clauses or literals at once than the checker holds (2^31-2 clauses, 2^32-1 literals)")

// add stores a clause (already normalized) and indexes it; it is not watched
// yet. A lemma's pivot is its first literal.
func (d *dratDB) add(ls []uint32, taut, lemma bool) (int, error) {
	c := len(d.flags)
	if c >= maxClauses || len(d.arena)+len(ls) > maxArena {
		return noClause, errTooLarge
	}
	var fl uint8
	if taut {
		fl |= flagTaut
	}
	if lemma {
		fl |= flagLemma
		var p uint32
		if len(ls) > 0 {
			p = ls[0]
		}
		d.pivot = append(d.pivot, p)
	}
	d.arena = append(d.arena, ls...)
	d.off = append(d.off, uint32(len(d.arena)))
	d.flags = append(d.flags, fl)
	d.hash = append(d.hash, uint32(clauseHash(ls)))
	d.next = append(d.next, noClause)
	d.hashInsert(c)
	if len(ls) == 1 {
		d.units = append(d.units, int32(c))
	}
	return c, nil
}

func (d *dratDB) hashInsert(c int) {
	if d.live >= len(d.buckets) {
		old := d.buckets
		d.buckets = make([]int32, 2*len(old))
		for i := range d.buckets {
			d.buckets[i] = noClause
		}
		mask := uint32(len(d.buckets) - 1)
		for _, h := range old {
			for h != noClause {
				nx := d.next[h]
				b := d.hash[h] & mask
				d.next[h] = d.buckets[b]
				d.buckets[b] = h
				h = nx
			}
		}
	}
	b := d.hash[c] & uint32(len(d.buckets)-1)
	d.next[c] = d.buckets[b]
	d.buckets[b] = int32(c)
	d.live++
}

// find returns the most recently added indexed clause with exactly the
// literals ls (normalized), or noClause.
func (d *dratDB) find(ls []uint32) int {
	h := uint32(clauseHash(ls))
	for _, l := range ls {
		d.mark[l] = true
	}
	found := noClause
	for c := d.buckets[h&uint32(len(d.buckets)-1)]; c != noClause; c = d.next[c] {
		if d.hash[c] != h || d.size(int(c)) != len(ls) {
			continue
		}
		same := true
		for _, l := range d.lits(int(c)) {
			if !d.mark[l] {
				same = false
				break
			}
		}
		if same {
			found = int(c)
			break
		}
	}
	for _, l := range ls {
		d.mark[l] = false
	}
	return found
}

func (d *dratDB) hashRemove(c int) {
	b := d.hash[c] & uint32(len(d.buckets)-1)
	prev := int32(noClause)
	for h := d.buckets[b]; h != noClause; h = d.next[h] {
		if int(h) == c {
			if prev == noClause {
				d.buckets[b] = d.next[h]
			} else {
				d.next[prev] = d.next[h]
			}
			d.next[c] = noClause
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
	d.reason[v] = int32(reason)
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
	if d.size(c) == 0 {
		return false
	}
	l := d.arena[d.off[c]]
	return d.vals[l] == 1 && int(d.reason[l>>1]) == c
}

// analyze marks the clauses behind conflict clause confl as core and returns
// them in hints (when hints is non-nil) in the order propagation used them,
// the conflict clause last. Variables flagged asm are assumptions: their
// reasons are not followed. With noteUsed, the assumptions reached are
// noted in used and usedVars (they never steer the analysis).
func (d *dratDB) analyze(confl int, hints []int32, wantHints bool) []int32 {
	d.markCore(confl)
	pending := 0
	for _, l := range d.lits(confl) {
		v := l >> 1
		if !d.asm[v] && !d.seen[v] {
			d.seen[v] = true
			pending++
		} else if d.asm[v] && d.noteUsed {
			d.noteAssumption(v)
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
		r := int(d.reason[v])
		if r == noClause {
			continue
		}
		d.markCore(r)
		if wantHints {
			hints = append(hints, int32(r))
		}
		for _, l := range d.lits(r) {
			u := l >> 1
			if u != v && !d.asm[u] && !d.seen[u] {
				d.seen[u] = true
				pending++
			} else if d.asm[u] && d.noteUsed {
				d.noteAssumption(u)
			}
		}
	}
	if !wantHints {
		return hints
	}
	for i, j := start, len(hints)-1; i < j; i, j = i+1, j-1 {
		hints[i], hints[j] = hints[j], hints[i]
	}
	return append(hints, int32(confl))
}

// noteAssumption flags assumption variable v as reached by the analysis.
func (d *dratDB) noteAssumption(v uint32) {
	if !d.used[v] {
		d.used[v] = true
		d.usedVars = append(d.usedVars, v)
	}
}

// clearUsed forgets the assumptions noted so far.
func (d *dratDB) clearUsed() {
	for _, v := range d.usedVars {
		d.used[v] = false
	}
	d.usedVars = d.usedVars[:0]
}
