package cube

import (
	"context"
	"fmt"
	"slices"
	"sort"

	"spinecert.dev/dimacs"
)

// Split rules.
const (
	// RuleLookahead picks, at each node of the tree, among the candidate
	// variables the one whose two branches together propagate most:
	// the product (1+t)(1+f) of the literals unit propagation assigns
	// after setting it true (t) and false (f), the score look-ahead
	// splitters use. A branch that fails outright counts as 0.
	RuleLookahead = "lookahead"
	// RuleOccurrence picks the unassigned variable that occurs in the most
	// clauses (a static order).
	RuleOccurrence = "occurrence"
)

// Rules lists the split rules.
var Rules = []string{RuleOccurrence, RuleLookahead}

// SplitOptions controls Split.
type SplitOptions struct {
	Cubes      int    // the number of cubes wanted (at least 1)
	Rule       string // RuleOccurrence (default) or RuleLookahead
	Candidates int    // variables scored per node by RuleLookahead (0 = 32)
}

// SplitStats says what Split did.
type SplitStats struct {
	Closed   int // cubes unit propagation already refutes (they stay cubes)
	Full     int // cubes under which propagation assigns every variable
	MaxDepth int
	Probes   int // look-ahead propagations
}

// Split grows a complete binary decision tree over the variables of cnf
// and returns its leaves as cubes, root first: it splits the shallowest
// open leaf until there are opt.Cubes leaves, or until no leaf can be split
// (every open leaf is refuted by unit propagation or has no free variable
// left). The cubes pass CheckTree by construction; a caller checks them
// anyway before they are trusted.
func Split(ctx context.Context, cnf *dimacs.CNF, opt SplitOptions) ([]Cube, *SplitStats, error) {
	if opt.Cubes < 1 {
		return nil, nil, fmt.Errorf("cube: %d cubes asked for: at least 1", opt.Cubes)
	}
	if opt.Cubes > MaxCubes {
		return nil, nil, fmt.Errorf("%w: %d cubes asked for, at most %d", ErrTooMany, opt.Cubes, MaxCubes)
	}
	switch opt.Rule {
	case "":
		// The default by measurement (README, "Speed"): on the claim
		// where splitting paid, it gave the smaller total and the
		// smaller largest cube at 16, 64 and 256 cubes.
		opt.Rule = RuleOccurrence
	case RuleLookahead, RuleOccurrence:
	default:
		return nil, nil, fmt.Errorf("cube: unknown split rule %q (expected %s or %s)", opt.Rule, RuleLookahead, RuleOccurrence)
	}
	if opt.Candidates <= 0 {
		opt.Candidates = 32
	}
	p := newPropagator(cnf)
	s := &splitter{p: p, opt: opt, stats: &SplitStats{}, order: occurrenceOrder(cnf)}
	type leaf struct {
		path         Cube
		closed, full bool
	}
	queue := []leaf{{path: Cube{}, closed: p.failed}}
	var done []leaf
	for len(queue)+len(done) < opt.Cubes && len(queue) > 0 {
		if err := ctx.Err(); err != nil {
			return nil, nil, fmt.Errorf("cube: split: %w", err)
		}
		lf := queue[0]
		queue = queue[1:]
		if lf.closed {
			done = append(done, lf)
			continue
		}
		v, ok := s.choose(lf.path)
		if !ok {
			lf.full = true
			done = append(done, lf)
			continue
		}
		for _, l := range []int32{v, -v} {
			path := append(lf.path[:len(lf.path):len(lf.path)], l)
			queue = append(queue, leaf{path: path, closed: !s.replay(path)})
		}
	}
	all := append(done, queue...)
	cubes := make([]Cube, len(all))
	for i, lf := range all {
		cubes[i] = lf.path
		if lf.closed {
			s.stats.Closed++
		}
		if lf.full {
			s.stats.Full++
		}
		s.stats.MaxDepth = max(s.stats.MaxDepth, len(lf.path))
	}
	// Depth-first order of the tree: compare paths decision by decision,
	// the true branch first.
	sort.Slice(cubes, func(i, j int) bool { return treeLess(cubes[i], cubes[j]) })
	return cubes, s.stats, nil
}

func treeLess(a, b Cube) bool {
	for k := range min(len(a), len(b)) {
		if a[k] != b[k] {
			return a[k] > b[k] // the same variable at the same depth: v before ¬v
		}
	}
	return len(a) < len(b)
}

type splitter struct {
	p     *propagator
	opt   SplitOptions
	stats *SplitStats
	order []int32 // variables by decreasing occurrence
}

// replay sets the propagator to the decisions of path; false means
// propagation refutes them.
func (s *splitter) replay(path Cube) bool {
	s.p.backtrack(0)
	if s.p.failed {
		return false
	}
	for _, l := range path {
		if !s.p.assume(l) {
			s.p.backtrack(0)
			return false
		}
	}
	return true
}

// choose returns the variable to split the open leaf at path on (its
// decisions propagated without a conflict when the leaf was made), or false
// when propagation leaves no variable free.
func (s *splitter) choose(path Cube) (int32, bool) {
	s.replay(path)
	var cands []int32
	for _, v := range s.order {
		if s.p.val[v] == 0 {
			cands = append(cands, v)
			if s.opt.Rule == RuleOccurrence || len(cands) == s.opt.Candidates {
				break
			}
		}
	}
	if len(cands) == 0 {
		return 0, false
	}
	if s.opt.Rule == RuleOccurrence {
		return cands[0], true
	}
	level := len(s.p.levels)
	best, bestScore := cands[0], int64(-1)
	for _, v := range cands {
		var counts [2]int64
		for i, l := range []int32{v, -v} {
			before := len(s.p.trail)
			s.stats.Probes++
			if s.p.assume(l) {
				counts[i] = int64(len(s.p.trail) - before)
			}
			s.p.backtrack(level)
		}
		if score := (1 + counts[0]) * (1 + counts[1]); score > bestScore {
			best, bestScore = v, score
		}
	}
	return best, true
}

// occurrenceOrder returns the variables that occur in cnf, most frequent
// first (ties by number).
func occurrenceOrder(cnf *dimacs.CNF) []int32 {
	occ := make([]int, cnf.Vars+1)
	for _, cl := range cnf.Clauses {
		for _, l := range cl {
			occ[abs(l)]++
		}
	}
	var vars []int32
	for v := 1; v <= cnf.Vars; v++ {
		if occ[v] > 0 {
			vars = append(vars, int32(v))
		}
	}
	slices.SortStableFunc(vars, func(a, b int32) int { return occ[b] - occ[a] })
	return vars
}
