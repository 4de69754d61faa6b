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
	ls := slices.Clone(k.lits(c))
	slices.SortFunc(ls, func(x, y uint32) int { return cmp.Compare(k.proofVar(x), k.proofVar(y)) })
	first := uint32(0)
	hasFirst := c >= k.nOrig && len(ls) > 0
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
