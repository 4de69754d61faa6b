package proof

// A deliberately small LRAT checker, written apart from the DRAT checker:
// it shares nothing with it beyond the DIMACS reader. It performs no search;
// every lemma must come with hints that make it follow by unit propagation
// (RUP), or, for RAT lemmas, with one group of hints per clause containing
// the negated pivot. Format: Cruz-Filipe, Heule, Hunt, Kaufmann,
// Schneider-Kamp, "Efficient certified RAT verification", CADE 2017.

import (
	"bufio"
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"spinecert.dev/dimacs"
	"spinecert.dev/textpos"
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

// run applies hints in order until a conflict; it reports whether one came.
func (s *lratState) run(hints []int64) (bool, error) {
	for _, h := range hints {
		done, err := s.hint(h)
		if err != nil || done {
			return done, err
		}
	}
	return false, nil
}

// lemma checks that lits follows from the current clauses with hints.
func (s *lratState) lemma(lits []int32, hints []int64) (rat bool, err error) {
	defer s.reset(0)
	for _, l := range lits {
		if !s.set(-l) {
			return false, nil // a tautology
		}
	}
	i := 0
	for i < len(hints) && hints[i] > 0 {
		i++
	}
	done, err := s.run(hints[:i])
	if err != nil || done {
		return false, err
	}
	if len(lits) == 0 {
		return false, errors.New("the hints do not lead to a conflict")
	}
	p := lits[0]
	groups := map[int64][]int64{}
	for i < len(hints) {
		j := -hints[i]
		if j <= 0 {
			return true, fmt.Errorf("expected a RAT hint (negative clause id), found %d", hints[i])
		}
		k := i + 1
		for k < len(hints) && hints[k] > 0 {
			k++
		}
		if _, dup := groups[j]; dup {
			return true, fmt.Errorf("two RAT hint groups for clause %d", j)
		}
		groups[j] = hints[i+1 : k]
		i = k
	}
	for j := range groups {
		if c, ok := s.cls[j]; !ok || !containsLit(c, -p) {
			return true, fmt.Errorf("RAT hint -%d names no current clause containing %d", j, -p)
		}
	}
	base := len(s.undo)
	for j, c := range s.cls {
		if !containsLit(c, -p) {
			continue
		}
		g, ok := groups[j]
		if !ok {
			return true, fmt.Errorf("no RAT hints for clause %d, which contains %d", j, -p)
		}
		clash := false
		for _, q := range c {
			if q != -p && !s.set(-q) {
				clash = true
				break
			}
		}
		if !clash {
			done, err := s.run(g)
			if err != nil {
				return true, fmt.Errorf("RAT hints for clause %d: %w", j, err)
			}
			if !done {
				return true, fmt.Errorf("the RAT hints for clause %d do not lead to a conflict", j)
			}
		}
		s.reset(base)
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
	br := bufio.NewReaderSize(dr, 1<<16)
	var lineNo int64
	parseErr := func(format string, args ...any) error {
		return fmt.Errorf("proof: %w", &textpos.Error{File: name, Line: int(lineNo), Msg: fmt.Sprintf(format, args...)})
	}
	reject := func(text, why string) (*LRATResult, error) {
		res.FailedLine, res.FailedText, res.Reason = lineNo, text, why
		return res, fmt.Errorf("%w: %s:%d: %s", ErrRejected, name, lineNo, why)
	}
	empty := false
	for {
		line, rerr := br.ReadString('\n')
		if rerr != nil && !errors.Is(rerr, io.EOF) {
			return nil, fmt.Errorf("proof: %s: %w", name, rerr)
		}
		if line == "" && rerr != nil {
			break
		}
		lineNo++
		if lineNo&4095 == 0 && ctx.Err() != nil {
			return nil, fmt.Errorf("proof: %w", ctx.Err())
		}
		f := strings.Fields(line)
		if len(f) == 0 || strings.HasPrefix(f[0], "c") {
			continue
		}
		text := strings.TrimSpace(line)
		id, err := strconv.ParseInt(f[0], 10, 64)
		if err != nil || id <= 0 {
			return nil, parseErr("expected a positive clause id, found %q", f[0])
		}
		if len(f) > 1 && f[1] == "d" {
			ids, rest, err := lratInts(f[2:])
			if err != nil || len(rest) != 0 {
				return nil, parseErr("expected clause ids ending in 0 after 'd'")
			}
			for _, j := range ids {
				if _, ok := s.cls[j]; !ok {
					return reject(text, fmt.Sprintf("deletes clause %d, which does not exist", j))
				}
				delete(s.cls, j)
				res.Deleted++
			}
			continue
		}
		nums, rest, err := lratInts(f[1:])
		if err != nil {
			return nil, parseErr("expected literals ending in 0")
		}
		hints, rest, err := lratInts(rest)
		if err != nil || len(rest) != 0 {
			return nil, parseErr("expected hints ending in 0 after the literals")
		}
		lits := make([]int32, len(nums))
		for i, n := range nums {
			if n > math.MaxInt32 || n < -math.MaxInt32 {
				return nil, parseErr("literal %d out of range (variables are at most %d)", n, math.MaxInt32)
			}
			lits[i] = int32(n)
		}
		if id <= last {
			return reject(text, fmt.Sprintf("clause id %d is not larger than the previous ones", id))
		}
		rat, err := s.lemma(lits, hints)
		if err != nil {
			return reject(text, err.Error())
		}
		if rat {
			res.RAT++
		}
		s.cls[id] = lits
		last = id
		res.Added++
		if len(lits) == 0 {
			empty = true
			break
		}
	}
	if !empty {
		return reject("", "the proof does not add the empty clause")
	}
	res.Accepted = true
	return res, nil
}

// lratInts reads integers up to a 0 and returns them and the tokens after it.
func lratInts(f []string) ([]int64, []string, error) {
	var out []int64
	for i, t := range f {
		n, err := strconv.ParseInt(t, 10, 64)
		if err != nil {
			return nil, nil, err
		}
		if n == 0 {
			return out, f[i+1:], nil
		}
		out = append(out, n)
	}
	return nil, nil, errors.New("missing 0")
}
