package proof

import (
	"context"
	"errors"
	"fmt"
	"io"
)

// step kinds recorded for the backward pass
const (
	stepAdd     = iota
	stepDelete  // a deletion that took effect
	stepIgnored // a deletion of a reason clause or of no clause at all
)

type dratStep struct {
	pos  int64 // text line or binary byte offset
	c    int32 // clause index
	kind uint8
}

// dratChecker checks one proof against one formula.
type dratChecker struct {
	*dratDB
	opt   DRATOptions
	res   *DRATResult
	pr    *proofReader
	steps []dratStep // backward mode only
	buf   []uint32
	hints []int32 // LRAT hints: clause numbers, -(d+1) opening the RAT group of clause d
	lrat  *lratLog
	ctx   context.Context

	// shrunk lemmas, for the trimmed proof: lemma c-nOrig is, when
	// shrunkAt[c-nOrig] > 0, the shrunkLits[shrunkAt-1] literals after it
	shrunkAt   []uint32
	shrunkLits []uint32
}

// reject records the first failing step and returns ErrRejected.
func (k *dratChecker) reject(step int64, text, pos, why string) error {
	k.res.Accepted = false
	k.res.FailedLemma = step
	k.res.FailedText = text
	k.res.FailedPos = pos
	k.res.Reason = why
	if step > 0 {
		return fmt.Errorf("%w: step %d (%s) %q: %s", ErrRejected, step, pos, text, why)
	}
	return fmt.Errorf("%w: %s", ErrRejected, why)
}

func (k *dratChecker) clauseText(c int) string {
	ls := k.lits(c)
	ext := make([]int32, 0, len(ls))
	if k.flags[c]&flagLemma != 0 && len(ls) > 0 {
		p := k.pivotOf(c)
		ext = append(ext, k.extLit(p))
		for _, l := range ls {
			if l != p {
				ext = append(ext, k.extLit(l))
			}
		}
	} else {
		for _, l := range ls {
			ext = append(ext, k.extLit(l))
		}
	}
	return formatStep(false, ext)
}

// loadFormula adds the original clauses; it reports false when unit
// propagation already refutes them.
func (k *dratChecker) loadFormula(clauses [][]int32) (bool, error) {
	ok := true
	for _, ext := range clauses {
		ls, taut := k.normalize(ext, k.buf)
		k.buf = ls
		c, err := k.add(ls, taut, false)
		if err != nil {
			return false, err
		}
		if ok && !k.attach(c) {
			ok = false
		}
		if ok && !k.propagate() {
			ok = false
		}
	}
	k.nOrig = len(k.flags)
	return ok, nil
}

// checkLemma checks clause c (not active) against the active formula at
// the top level: RUP first, then RAT on its pivot. On success the clauses
// used are marked core and, with LRAT output, the hints are recorded. It
// returns "" or the reason of the failure.
func (k *dratChecker) checkLemma(c int) string {
	if k.flags[c]&flagTaut != 0 {
		k.record(c, nil)
		return ""
	}
	ls := k.lits(c)
	save := len(k.trail)
	for _, l := range ls {
		k.asm[l>>1] = true
	}
	defer func() {
		k.backtrack(save)
		k.head, k.headCore = save, save
		k.conflict = noClause
		for _, l := range k.lits(c) {
			k.asm[l>>1] = false
		}
	}()
	want := k.lrat != nil
	hints := k.hints[:0]
	confl := noClause
	for _, l := range ls {
		switch k.vals[l] {
		case 1:
			confl = int(k.reason[l>>1])
		case 0:
			k.assign(l^1, noClause)
		}
		if confl != noClause {
			break
		}
	}
	if confl == noClause && !k.propagate() {
		confl = k.conflict
	}
	if confl != noClause {
		hints = k.analyze(confl, hints, want)
		k.hints = hints
		k.record(c, hints)
		if k.noteUsed {
			k.keepShrunk(c)
		}
		return ""
	}
	if len(ls) == 0 {
		return "the empty clause is not implied by unit propagation"
	}
	if k.opt.Format == RUP {
		return "not implied by unit propagation (RUP), and a proof read as rup has no RAT lemmas"
	}
	// RAT on the pivot: every resolvent with an active clause containing
	// the pivot's negation must be RUP.
	p := k.pivotOf(c)
	k.res.RAT++
	for d := range len(k.flags) {
		if k.flags[d]&flagActive == 0 || d == c {
			continue
		}
		dl := k.lits(d)
		has := false
		for _, l := range dl {
			if l == p^1 {
				has = true
				break
			}
		}
		if !has {
			continue
		}
		if want {
			hints = append(hints, int32(-(d + 1)))
		}
		var ok bool
		hints, ok = k.checkResolvent(d, p, hints, want)
		if !ok {
			return fmt.Sprintf("not implied by unit propagation (RUP), and not RAT on its first literal %d: the resolvent with clause %s is not implied by unit propagation", k.extLit(p), k.describe(d))
		}
	}
	k.hints = hints
	k.record(c, hints)
	return ""
}

// describe names a clause for messages: its text and where it came from.
func (k *dratChecker) describe(c int) string {
	if c < k.nOrig {
		return fmt.Sprintf("%q (clause %d of the formula)", k.clauseText(c), c+1)
	}
	return fmt.Sprintf("%q (a lemma)", k.clauseText(c))
}

// checkResolvent assumes the negation of clause d without ¬p on top of the
// current assignment and propagates; a conflict is required.
func (k *dratChecker) checkResolvent(d int, p uint32, hints []int32, want bool) ([]int32, bool) {
	save := len(k.trail)
	var flagged []uint32
	confl := noClause
	taut := false
	for _, q := range k.lits(d) {
		if q == p^1 {
			continue
		}
		v := q >> 1
		if !k.asm[v] {
			k.asm[v] = true
			flagged = append(flagged, v)
		}
		if confl != noClause || taut {
			continue
		}
		switch k.vals[q] {
		case 1:
			if k.reason[v] == noClause {
				taut = true // q is the negation of a lemma literal
			} else {
				confl = int(k.reason[v])
			}
		case 0:
			k.assign(q^1, noClause)
		}
	}
	ok := true
	if !taut {
		if confl == noClause && !k.propagate() {
			confl = k.conflict
		}
		if confl == noClause {
			ok = false
		} else {
			hints = k.analyze(confl, hints, want)
		}
	}
	k.backtrack(save)
	k.head, k.headCore = save, save
	k.conflict = noClause
	for _, v := range flagged {
		k.asm[v] = false
	}
	return hints, ok
}

func (k *dratChecker) record(c int, hints []int32) {
	if k.lrat != nil {
		k.lrat.setHints(c, hints)
	}
}

// readSteps runs the forward pass. In backward mode it only propagates and
// records the steps; in forward mode it checks every lemma on the way. It
// stops checking at the first top-level conflict and then only reads on to
// make sure the proof states the empty clause.
func (k *dratChecker) readSteps(forward bool) (conflictStep int64, err error) {
	var step int64
	conflictStep = -1
	if k.conflict != noClause {
		conflictStep = 0
	}
	sawEmpty := false
	for {
		k.pr.vars = k.dense + len(k.extVar)
		k.pr.maxLits = stepLimit(k.pr.vars)
		del, ext, rerr := k.pr.next()
		if rerr == io.EOF {
			break
		}
		if rerr != nil {
			return 0, rerr
		}
		step++
		k.res.Steps++
		if step&4095 == 0 {
			if err := k.ctx.Err(); err != nil {
				return 0, fmt.Errorf("proof: %w", err)
			}
			if k.opt.Progress != nil {
				k.opt.Progress(Progress{Phase: "reading", Steps: uint64(step), Checked: k.res.CoreLemmas})
			}
		}
		if del {
			k.res.Deletions++
		} else {
			k.res.Lemmas++
			if len(ext) == 0 {
				sawEmpty = true
			}
		}
		if conflictStep >= 0 {
			continue // after the refutation: read, do not check
		}
		ls, taut := k.normalize(ext, k.buf)
		k.buf = ls
		if del {
			c := k.find(ls)
			switch {
			case c == noClause:
				k.res.MissingDeletions++
				if !forward {
					k.steps = append(k.steps, dratStep{c: noClause, pos: k.pr.stepLine, kind: stepIgnored})
				}
			case k.isReason(c):
				k.res.IgnoredDeletions++
				if !forward {
					k.steps = append(k.steps, dratStep{c: int32(c), pos: k.pr.stepLine, kind: stepIgnored})
				}
			default:
				k.detach(c)
				k.hashRemove(c)
				if forward {
					if k.lrat != nil {
						if err := k.lrat.forwardDelete(c); err != nil {
							return 0, err
						}
					}
					k.wasted += k.size(c)
					k.compact()
				} else {
					k.steps = append(k.steps, dratStep{c: int32(c), pos: k.pr.stepLine, kind: stepDelete})
				}
			}
			continue
		}
		c, err := k.add(ls, taut, true)
		if err != nil {
			return 0, err
		}
		if len(ext) > 0 {
			k.pivot[c-k.nOrig] = k.lit(ext[0])
		}
		if forward {
			k.res.CoreLemmas++
			if why := k.checkLemma(c); why != "" {
				k.res.FailedLemmas = 1
				return 0, k.reject(step, formatStep(false, ext), k.pr.where(), why)
			}
			if k.lrat != nil {
				if err := k.lrat.forwardAdd(k, c); err != nil {
					return 0, err
				}
			}
		} else {
			k.steps = append(k.steps, dratStep{c: int32(c), pos: k.pr.stepLine, kind: stepAdd})
		}
		if len(ls) == 0 {
			if forward {
				conflictStep = step
				k.conflict = c
				continue
			}
			// the empty clause without a conflict: it fails its check
			return 0, k.reject(step, "0", k.pr.where(), "the empty clause is not implied by unit propagation")
		}
		if !k.attach(c) || !k.propagate() {
			conflictStep = step
		}
	}
	if conflictStep < 0 {
		return 0, k.reject(0, "", "", "the proof does not derive the empty clause, and unit propagation does not refute the formula after its last step")
	}
	if !sawEmpty && conflictStep > 0 {
		return 0, k.reject(0, "", "", fmt.Sprintf("the proof never adds the empty clause (unit propagation refutes the formula after step %d, but a refutation must state the empty clause)", conflictStep))
	}
	return conflictStep, nil
}

// compactMin is the least waste (in literals) worth a compaction; 0
// compacts at every deletion (for tests).
var compactMin = 1 << 20

// compact rewrites the arena without the clauses deleted for good (forward
// mode), once they waste more than half of it.
func (k *dratChecker) compact() {
	if compactMin > 0 && (k.wasted < compactMin || 2*k.wasted < len(k.arena)) {
		return
	}
	arena := make([]uint32, 0, len(k.arena)-k.wasted)
	for c := range len(k.flags) {
		start := k.off[c]
		k.off[c] = uint32(len(arena))
		if k.flags[c]&flagActive != 0 {
			arena = append(arena, k.arena[start:k.off[c+1]]...)
		}
	}
	k.off[len(k.flags)] = uint32(len(arena))
	k.arena = arena
	k.wasted = 0
}

// backward verifies, from the conflict back to the first step, the lemmas
// marked core. A lemma that fails does not stop the walk, so that the
// failure reported is the first in proof order among the lemmas checked.
// dratFailure is a lemma that failed its check.
type dratFailure struct {
	step           int64
	text, pos, why string
}

func (k *dratChecker) backward(conflictStep int64) error {
	var failed *dratFailure
	final := k.analyze(k.conflict, nil, k.lrat != nil)
	if k.lrat != nil {
		k.lrat.final = final
	}
	total := uint64(conflictStep)
	if conflictStep == 0 {
		return nil
	}
	// undo the lemma that caused the conflict and propagate afresh
	last := k.steps[conflictStep-1]
	k.detach(int(last.c))
	if !k.resetTopLevel() {
		return errors.New("proof: internal error: the formula conflicts before the step that refuted it")
	}
	for i := conflictStep - 1; i >= 0; i-- {
		s := k.steps[i]
		if i&1023 == 0 {
			if err := k.ctx.Err(); err != nil {
				return fmt.Errorf("proof: %w", err)
			}
			if k.opt.Progress != nil {
				k.opt.Progress(Progress{Phase: "checking", Steps: uint64(conflictStep - i), Total: total, Checked: k.res.CoreLemmas})
			}
		}
		switch s.kind {
		case stepIgnored:
			continue
		case stepDelete:
			if !k.attach(int(s.c)) || !k.propagate() {
				return errors.New("proof: internal error: restoring a deleted clause caused a conflict")
			}
			continue
		}
		c := int(s.c)
		if i != conflictStep-1 {
			if k.isReason(c) {
				at := int(k.pos[k.arena[k.off[c]]>>1])
				k.detach(c)
				if !k.unassignFrom(at) {
					return errors.New("proof: internal error: removing a lemma caused a conflict")
				}
			} else {
				k.detach(c)
			}
		}
		if k.flags[c]&flagCore == 0 {
			continue
		}
		k.res.CoreLemmas++
		if why := k.checkLemma(c); why != "" {
			// keep going: the failure reported is the first in proof order
			k.res.FailedLemmas++
			failed = &dratFailure{i + 1, k.clauseText(c), k.posText(s.pos), why}
		}
	}
	if failed != nil {
		why := failed.why
		if n := k.res.FailedLemmas - 1; n > 0 {
			why += fmt.Sprintf(" (and %d more failing lemmas after it)", n)
		}
		return k.reject(failed.step, failed.text, failed.pos, why)
	}
	if k.opt.Progress != nil {
		k.opt.Progress(Progress{Phase: "checking", Steps: total, Total: total, Checked: k.res.CoreLemmas})
	}
	return nil
}

func (k *dratChecker) posText(p int64) string {
	if k.pr.format == DRATBinary {
		return fmt.Sprintf("byte %d", p)
	}
	return fmt.Sprintf("line %d", p)
}
