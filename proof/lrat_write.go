package proof

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
)

// lratLog writes the checked proof in LRAT text (Cruz-Filipe, Heule, Hunt,
// Kaufmann, Schneider-Kamp, "Efficient certified RAT verification", CADE
// 2017). Clauses of the formula keep their numbers 1..m; lemmas are numbered
// from m+1 in proof order. A step is "id lits 0 hints 0", the pivot first; a
// RUP lemma's hints are the clauses that become unit under the negated lemma
// in the order propagation used them, the falsified clause last. A RAT
// lemma's hints are, for each clause j containing the negated pivot, -j
// followed by the hints that refute the resolvent with j. Deletions are
// "id d ids 0", id being the last clause added.
//
// In backward mode the hints are kept per lemma and the file is written at
// the end with the core lemmas only; in forward mode every lemma is written
// as it is checked.
type lratLog struct {
	w       *bufio.Writer
	forward bool
	nOrig   int
	// backward mode: the hints of lemma i (clause index - nOrig) are
	// hintLen[i] numbers from hintAt[i]&0xffffffff in blocks[hintAt[i]>>32].
	// Blocks are filled in turn and never grown, so the hints, which
	// can take more memory than the proof, are never copied.
	hintAt  []uint64
	hintLen []int32
	blocks  [][]int32
	final   []int32
	line    []byte
	lastID  int64
}

func newLRATLog(w io.Writer, forward bool, nOrig int) *lratLog {
	return &lratLog{w: bufio.NewWriterSize(w, 1<<16), forward: forward, nOrig: nOrig, lastID: int64(nOrig)}
}

// setHints keeps the hints of lemma c (backward mode; forward mode writes
// them at once through forwardAdd).
func (g *lratLog) setHints(c int, hints []int32) {
	if g.forward || c < g.nOrig {
		return
	}
	i := c - g.nOrig
	for len(g.hintAt) <= i {
		g.hintAt = append(g.hintAt, 0)
		g.hintLen = append(g.hintLen, 0)
	}
	last := len(g.blocks) - 1
	if last < 0 || cap(g.blocks[last])-len(g.blocks[last]) < len(hints) {
		size := hintBlockMin
		if last >= 0 {
			size = min(2*cap(g.blocks[last]), hintBlockMax)
		}
		g.blocks = append(g.blocks, make([]int32, 0, max(size, len(hints))))
		last++
	}
	g.hintAt[i] = uint64(last)<<32 | uint64(len(g.blocks[last]))
	g.hintLen[i] = int32(len(hints))
	g.blocks[last] = append(g.blocks[last], hints...)
}

// The blocks of hints start at hintBlockMin numbers and double up to
// hintBlockMax (4 MiB); a longer list of hints gets a block of its own.
const (
	hintBlockMin = 1 << 12
	hintBlockMax = 1 << 20
)

// hintsOf returns the hints kept for lemma i (backward mode).
func (g *lratLog) hintsOf(i int) []int32 {
	if i >= len(g.hintAt) || g.hintLen[i] == 0 {
		return nil
	}
	at := g.hintAt[i]
	off := int(at & 0xffffffff)
	return g.blocks[at>>32][off : off+int(g.hintLen[i])]
}

func (g *lratLog) appendLits(k *dratChecker, c int) {
	ls := k.lits(c)
	if len(ls) > 0 {
		p := k.pivotOf(c)
		g.line = strconv.AppendInt(g.line, int64(k.extLit(p)), 10)
		g.line = append(g.line, ' ')
		for _, l := range ls {
			if l != p {
				g.line = strconv.AppendInt(g.line, int64(k.extLit(l)), 10)
				g.line = append(g.line, ' ')
			}
		}
	}
	g.line = append(g.line, '0')
}

// appendHints writes hints, mapping clause indexes to LRAT ids with id;
// a RAT group whose clause has no id (a lemma left out) is dropped whole.
func (g *lratLog) appendHints(hints []int32, id func(int) int64) {
	skip := false
	for _, h := range hints {
		if h < 0 {
			j := id(int(-h - 1))
			skip = j == 0
			if !skip {
				g.line = append(g.line, ' ', '-')
				g.line = strconv.AppendInt(g.line, j, 10)
			}
			continue
		}
		if skip {
			continue
		}
		g.line = append(g.line, ' ')
		g.line = strconv.AppendInt(g.line, id(int(h)), 10)
	}
	g.line = append(g.line, " 0\n"...)
}

func (g *lratLog) flushLine() error {
	_, err := g.w.Write(g.line)
	g.line = g.line[:0]
	if err != nil {
		return fmt.Errorf("proof: writing lrat: %w", err)
	}
	return nil
}

func sameID(c int) int64 { return int64(c) + 1 }

// forwardAdd writes lemma c, whose hints are in k.hints.
func (g *lratLog) forwardAdd(k *dratChecker, c int) error {
	g.lastID = int64(c) + 1
	g.line = strconv.AppendInt(g.line[:0], g.lastID, 10)
	g.line = append(g.line, ' ')
	g.appendLits(k, c)
	hints := k.hints
	if k.flags[c]&flagTaut != 0 {
		hints = nil
	}
	g.appendHints(hints, sameID)
	return g.flushLine()
}

func (g *lratLog) forwardDelete(c int) error {
	g.line = strconv.AppendInt(g.line[:0], g.lastID, 10)
	g.line = append(g.line, " d "...)
	g.line = strconv.AppendInt(g.line, int64(c)+1, 10)
	g.line = append(g.line, " 0\n"...)
	return g.flushLine()
}

// finish writes the empty clause with the hints of the final conflict.
func (g *lratLog) finish(id func(int) int64) error {
	g.line = strconv.AppendInt(g.line[:0], g.lastID+1, 10)
	g.line = append(g.line, " 0"...)
	g.appendHints(g.final, id)
	if err := g.flushLine(); err != nil {
		return err
	}
	if err := g.w.Flush(); err != nil {
		return fmt.Errorf("proof: writing lrat: %w", err)
	}
	return nil
}

// writeBackward writes the core lemmas of steps[:conflictStep] in proof
// order, the deletions that concern clauses present in the output, and the
// empty clause.
func (g *lratLog) writeBackward(k *dratChecker, conflictStep int64) error {
	ids := make([]int64, len(k.flags)-g.nOrig)
	id := func(c int) int64 {
		if c < g.nOrig {
			return int64(c) + 1
		}
		return ids[c-g.nOrig]
	}
	for _, s := range k.steps[:conflictStep] {
		switch s.kind {
		case stepAdd:
			c := int(s.c)
			if k.flags[c]&flagCore == 0 || k.size(c) == 0 {
				continue
			}
			g.lastID++
			ids[c-g.nOrig] = g.lastID
			g.line = strconv.AppendInt(g.line[:0], g.lastID, 10)
			g.line = append(g.line, ' ')
			g.appendLits(k, c)
			g.appendHints(g.hintsOf(c-g.nOrig), id)
		case stepDelete:
			j := id(int(s.c))
			if j == 0 {
				continue
			}
			g.line = strconv.AppendInt(g.line[:0], g.lastID, 10)
			g.line = append(g.line, " d "...)
			g.line = strconv.AppendInt(g.line, j, 10)
			g.line = append(g.line, " 0\n"...)
		default:
			continue
		}
		if err := g.flushLine(); err != nil {
			return err
		}
	}
	return g.finish(id)
}
