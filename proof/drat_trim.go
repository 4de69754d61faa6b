package proof

import (
	"bufio"
	"cmp"
	"fmt"
	"io"
	"slices"
)

// writeTrimmed writes, after a successful backward check, the proof trimmed
// to what the check used, as binary DRAT: the core lemmas of
// steps[:conflictStep] in proof order (each with its first literal as
// written, the RAT pivot, first, and the others in increasing order of
// their variables, which compresses better), the deletions that took
// effect of clauses still in the trimmed proof (formula clauses and core
// lemmas; a deletion the checker ignored is left out, so the clause stays
// as it stayed in the check), and the empty clause.
func (k *dratChecker) writeTrimmed(w io.Writer, conflictStep int64) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	var buf []byte
	kept := func(c int) bool { return c < k.nOrig || k.flags[c]&flagCore != 0 }
	for _, s := range k.steps[:conflictStep] {
		c := int(s.c)
		switch {
		case s.kind == stepAdd && k.flags[c]&(flagCore|flagTaut) == flagCore && k.size(c) > 0:
			buf = k.appendBinaryClause(append(buf[:0], 'a'), c)
		case s.kind == stepDelete && kept(c):
			buf = k.appendBinaryClause(append(buf[:0], 'd'), c)
		default:
			continue
		}
		if _, err := bw.Write(buf); err != nil {
			return fmt.Errorf("proof: writing the trimmed proof: %w", err)
		}
	}
	if _, err := bw.Write([]byte{'a', 0}); err != nil {
		return fmt.Errorf("proof: writing the trimmed proof: %w", err)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("proof: writing the trimmed proof: %w", err)
	}
	return nil
}

// appendBinaryClause appends the literals of clause c in binary DRAT (a
// lemma's pivot first, the others by variable) and the closing 0 byte.
func (k *dratChecker) appendBinaryClause(b []byte, c int) []byte {
	ls := slices.Clone(k.trimmedLits(c))
	slices.SortFunc(ls, func(x, y uint32) int { return cmp.Compare(k.proofVar(x), k.proofVar(y)) })
	first := uint32(0)
	hasFirst := c >= k.nOrig && len(ls) > 0 && slices.Contains(ls, k.pivotOf(c))
	if hasFirst {
		first = k.pivotOf(c)
		b = appendBinaryLit(b, k.extLit(first))
	}
	for _, l := range ls {
		if !hasFirst || l != first {
			b = appendBinaryLit(b, k.extLit(l))
		}
	}
	return append(b, 0)
}

// appendBinaryLit appends literal x as binary DRAT writes it: the unsigned
// number 2|x| + (x < 0) in 7-bit groups, least significant first, the high
// bit set on all but the last.
func appendBinaryLit(b []byte, x int32) []byte {
	u := 2 * uint64(x)
	if x < 0 {
		u = 2*uint64(-int64(x)) + 1
	}
	for u >= 0x80 {
		b = append(b, byte(u)|0x80)
		u >>= 7
	}
	return append(b, byte(u))
}

// proofVar returns the variable of internal literal l as the proof names it.
func (k *dratChecker) proofVar(l uint32) int64 {
	x := int64(k.extLit(l))
	return max(x, -x)
}

// keepShrunk notes, after lemma c passed its RUP check, the literals of c
// whose negations the conflict analysis reached (used), when they are
// fewer than all of them. Assigning the negations of just those literals
// propagates, clause by clause in trail order, every literal of the
// analysed implication graph and so the same conflict: the shrunk clause
// is RUP at the same point, and it subsumes c, so every later check that
// used c succeeds with it as well (unit propagation with a subset of a
// clause's literals propagates at least as much).
func (k *dratChecker) keepShrunk(c int) {
	defer k.clearUsed()
	if c < k.nOrig {
		return
	}
	ls := k.lits(c)
	n := 0
	for _, l := range ls {
		if k.used[l>>1] {
			n++
		}
	}
	if n == 0 || n == len(ls) {
		return
	}
	i := c - k.nOrig
	for len(k.shrunkAt) <= i {
		k.shrunkAt = append(k.shrunkAt, 0)
	}
	k.shrunkAt[i] = uint32(len(k.shrunkLits)) + 1
	k.shrunkLits = append(k.shrunkLits, uint32(n))
	for _, l := range ls {
		if k.used[l>>1] {
			k.shrunkLits = append(k.shrunkLits, l)
		}
	}
}

// trimmedLits returns the literals clause c has in the trimmed proof: the
// shrunk lemma when there is one and the proof has no RAT lemma (shrinking
// a clause can drop a resolvent literal that a RAT check relied on), else
// the clause as checked.
func (k *dratChecker) trimmedLits(c int) []uint32 {
	i := c - k.nOrig
	if k.res.RAT > 0 || i < 0 || i >= len(k.shrunkAt) || k.shrunkAt[i] == 0 {
		return k.lits(c)
	}
	at := k.shrunkAt[i] - 1
	n := k.shrunkLits[at]
	return k.shrunkLits[at+1 : at+1+n]
}
