package proof

// A deliberately small LRAT checker, written apart from the DRAT checker:
// it shares nothing with it beyond the DIMACS reader. It performs no search;
// every lemma must come with hints that make it follow by unit propagation
// (RUP), or, for RAT lemmas, with one group of hints per clause containing
// the negated pivot. Format: Cruz-Filipe, Heule, Hunt, Kaufmann,
// Schneider-Kamp, "Efficient certified RAT verification", CADE 2017.

import (
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"

	"spinecert.dev/dimacs"
)

// LRATResult is the outcome of CheckLRAT.
type LRATResult struct {
	Accepted   bool   `json:"accepted"`
	Added      uint64 `json:"added"`
	Deleted    uint64 `json:"deleted"`
	RAT        uint64 `json:"rat"`
	FailedLine int64  `json:"failed_line,omitempty"`
	FailedText string `json:"failed_text,omitempty"`
	Reason     string `json:"reason,omitempty"`
}

type lratState struct {
	cls   map[int64][]int32
	val   []int8         // per variable below dense: 1 true, -1 false
	far   map[int32]int8 // the same for variables from dense on
	dense int
	undo  []int32
}

func (s *lratState) value(l int32) int8 {
	v := int(max(l, -l))
	var x int8
	switch {
	case v >= s.dense:
		x = s.far[int32(v)]
	case v < len(s.val):
		x = s.val[v]
	}
	if l < 0 {
		return -x
	}
	return x
}

// set makes l true; it reports false when l is already false.
func (s *lratState) set(l int32) bool {
	switch s.value(l) {
	case 1:
		return true
	case -1:
		return false
	}
	v := int(max(l, -l))
	x := int8(1)
	if l < 0 {
		x = -1
	}
	if v >= s.dense {
		s.far[int32(v)] = x
	} else {
		for len(s.val) <= v {
			s.val = append(s.val, 0)
		}
		s.val[v] = x
	}
	s.undo = append(s.undo, int32(v))
	return true
}

func (s *lratState) reset(to int) {
	for _, v := range s.undo[to:] {
		if int(v) >= s.dense {
			delete(s.far, v)
		} else {
			s.val[v] = 0
		}
	}
	s.undo = s.undo[:to]
}

// hint applies one hint clause: it must be falsified (conflict, returns
// true) or unit (its literal is set). Anything else is an error.
func (s *lratState) hint(id int64) (bool, error) {
	c, ok := s.cls[id]
	if !ok {
		return false, fmt.Errorf("hint %d names no current clause", id)
	}
	var free int32
	for _, l := range c {
		switch s.value(l) {
		case 1:
			return false, fmt.Errorf("hint %d is satisfied, not unit", id)
		case 0:
			if free != 0 && free != l {
				return false, fmt.Errorf("hint %d is not unit (literals %d and %d are unassigned)", id, free, l)
			}
			free = l
		}
	}
	if free == 0 {
		return true, nil
	}
	s.set(free)
	return false, nil
}

// lemmaCheck checks one lemma while its hints are read, one at a time, so
// that no hint list is held: the hints before the first negative one are
// applied as they come, then each RAT group "-j hints" is checked on its own.
type lemmaCheck struct {
	s      *lratState
	lits   []int32
	done   bool // nothing more to check: a tautology or a conflict reached
	rat    bool
	group  int64 // clause of the open RAT group, 0 for none
	gdone  bool  // the open group reached its conflict (or clashed)
	groups map[int64]bool
	base   int
}

// begin assigns the negation of the lemma's literals.
func (s *lratState) begin(lits []int32) *lemmaCheck {
	m := &lemmaCheck{s: s, lits: lits}
	for _, l := range lits {
		if !s.set(-l) {
			m.done = true // a tautology
			break
		}
	}
	return m
}

// hint takes the next hint of the lemma.
func (m *lemmaCheck) hint(h int64) error {
	s := m.s
	switch {
	case m.done:
		return nil
	case h > 0 && m.group == 0:
		done, err := s.hint(h)
		m.done = done
		return err
	case h > 0:
		if m.gdone {
			return nil
		}
		done, err := s.hint(h)
		if err != nil {
			return fmt.Errorf("RAT hints for clause %d: %w", m.group, err)
		}
		m.gdone = done
		return nil
	}
	// -j opens the group of clause j
	if err := m.closeGroup(); err != nil {
		return err
	}
	if m.group == 0 {
		if len(m.lits) == 0 {
			return errors.New("the hints do not lead to a conflict")
		}
		m.rat, m.groups, m.base = true, map[int64]bool{}, len(s.undo)
	}
	j, p := -h, m.lits[0]
	if m.groups[j] {
		return fmt.Errorf("two RAT hint groups for clause %d", j)
	}
	c, ok := s.cls[j]
	if !ok || !containsLit(c, -p) {
		return fmt.Errorf("RAT hint -%d names no current clause containing %d", j, -p)
	}
	m.groups[j], m.group, m.gdone = true, j, false
	for _, q := range c {
		if q != -p && !s.set(-q) {
			m.gdone = true // the resolvent is a tautology
			break
		}
	}
	return nil
}

// closeGroup ends the open RAT group, which must have reached a conflict.
func (m *lemmaCheck) closeGroup() error {
	if m.group == 0 {
		return nil
	}
	if !m.gdone {
		return fmt.Errorf("the RAT hints for clause %d do not lead to a conflict", m.group)
	}
	m.s.reset(m.base)
	return nil
}

// end is called after the last hint: it reports whether the lemma was
// checked as RAT, and an error when it does not follow.
func (m *lemmaCheck) end() (rat bool, err error) {
	defer m.s.reset(0)
	if m.done {
		return false, nil
	}
	if err := m.closeGroup(); err != nil {
		return true, err
	}
	if m.group == 0 {
		if len(m.lits) == 0 {
			return false, errors.New("the hints do not lead to a conflict")
		}
		m.rat = true
	}
	p := m.lits[0]
	for j, c := range m.s.cls {
		if !m.groups[j] && containsLit(c, -p) {
			return true, fmt.Errorf("no RAT hints for clause %d, which contains %d", j, -p)
		}
	}
	return true, nil
}

func containsLit(c []int32, l int32) bool {
	for _, x := range c {
		if x == l {
			return true
		}
	}
	return false
}

// CheckLRAT checks an LRAT proof (text; plain, gzip or zstd) of the empty
// clause for cnf. A rejected proof returns the result and an error wrapping
// ErrRejected; unreadable input returns a *textpos.Error.
func CheckLRAT(ctx context.Context, cnf *dimacs.CNF, r io.Reader, name string) (*LRATResult, error) {
	dr, err := dimacs.Decompress(r)
	if err != nil {
		return nil, fmt.Errorf("proof: %s: %w", name, err)
	}
	defer dr.Close()
	s := &lratState{cls: make(map[int64][]int32, len(cnf.Clauses)), far: map[int32]int8{}, dense: min(cnf.Vars, 2*cnf.Literals()+1<<16) + 1}
	for i, c := range cnf.Clauses {
		s.cls[int64(i+1)] = c
	}
	last := int64(len(cnf.Clauses))
	res := &LRATResult{}
	sc := newLRATScanner(dr, name)
	reject := func(why string) (*LRATResult, error) {
		res.FailedLine, res.FailedText, res.Reason = int64(sc.line), sc.lineText(), why
		return res, fmt.Errorf("%w: %s:%d: %s", ErrRejected, name, sc.line, why)
	}
	// variables mentioned so far: those below dense, and the others seen
	far := map[int32]bool{}
	var lits []int32
	empty := false
	for {
		more, err := sc.nextLine()
		if err != nil {
			return nil, err
		}
		if !more {
			break
		}
		if sc.line&4095 == 0 && ctx.Err() != nil {
			return nil, fmt.Errorf("proof: %w", ctx.Err())
		}
		id, perr := strconv.ParseInt(string(sc.tok), 10, 64)
		if perr != nil || id <= 0 {
			return nil, sc.errAt(sc.tokCol, "expected a positive clause id, found %q", sc.tok)
		}
		ok, err := sc.token()
		if err != nil {
			return nil, err
		}
		if !ok {
			return nil, sc.errAt(sc.col, "expected literals or 'd' after the clause id, found the end of the line")
		}
		if string(sc.tok) == "d" {
			var fail string
			for {
				j, err := sc.int("a clause id or the 0 that ends the deletion")
				if err != nil {
					return nil, err
				}
				if j == 0 {
					break
				}
				if _, ok := s.cls[j]; !ok && fail == "" {
					fail = fmt.Sprintf("deletes clause %d, which does not exist", j)
				}
				if fail == "" {
					delete(s.cls, j)
					res.Deleted++
				}
			}
			if err := sc.endLine(); err != nil {
				return nil, err
			}
			if fail != "" {
				return reject(fail)
			}
			continue
		}
		vars := s.dense - 1 + len(far)
		limit := stepLimit(vars)
		lits = lits[:0]
		for first := true; ; first = false {
			var n int64
			if first {
				if n, perr = strconv.ParseInt(string(sc.tok), 10, 64); perr != nil {
					return nil, sc.errAt(sc.tokCol, "expected a literal or the 0 that ends the clause, found %q", sc.tok)
				}
			} else if n, err = sc.int("a literal or the 0 that ends the clause"); err != nil {
				return nil, err
			}
			if n == 0 {
				break
			}
			if n > math.MaxInt32 || n < -math.MaxInt32 {
				return nil, sc.errAt(sc.tokCol, "literal %d out of range (variables are at most %d)", n, math.MaxInt32)
			}
			if len(lits) >= limit {
				return nil, sc.errAt(sc.tokCol, "%s", stepLimitMsg(limit, vars))
			}
			lits = append(lits, int32(n))
		}
		// A failed check is reported once the line is read: a line that
		// does not parse is an input error first.
		var fail error
		if id <= last {
			fail = fmt.Errorf("clause id %d is not larger than the previous ones", id)
		}
		m := s.begin(lits)
		for {
			h, err := sc.int("a hint or the 0 that ends the hints")
			if err != nil {
				s.reset(0)
				return nil, err
			}
			if h == 0 {
				break
			}
			if fail == nil {
				fail = m.hint(h)
			}
		}
		if err := sc.endLine(); err != nil {
			s.reset(0)
			return nil, err
		}
		rat, err := false, fail
		if fail == nil {
			rat, err = m.end()
		}
		s.reset(0)
		if err != nil {
			return reject(err.Error())
		}
		if rat {
			res.RAT++
		}
		for _, l := range lits {
			if v := max(l, -l); int(v) >= s.dense {
				far[v] = true
			}
		}
		s.cls[id] = slices.Clone(lits)
		last = id
		res.Added++
		if len(lits) == 0 {
			empty = true
			break
		}
	}
	if !empty {
		res.FailedLine, res.Reason = int64(sc.line), "the proof does not add the empty clause"
		return res, fmt.Errorf("%w: %s:%d: %s", ErrRejected, name, sc.line, res.Reason)
	}
	res.Accepted = true
	return res, nil
}
