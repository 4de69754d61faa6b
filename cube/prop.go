package cube

import "spinecert.dev/dimacs"

// propagator is a unit propagator with two watched literals per clause and
// a trail that can be undone level by level. It serves the split rules
// only: nothing it says is trusted (the cubes are checked for coverage and
// every cube is refuted under a checked proof).
type propagator struct {
	vars    int
	lits    []int32 // clause literals, back to back
	start   []int   // clause i is lits[start[i]:start[i+1]]
	watches [][]int // watches[code(l)]: clauses watching literal l
	val     []int8  // val[v]: 0 unassigned, 1 true, -1 false
	trail   []int32
	levels  []int // trail length at each assumption
	head    int   // next trail entry to propagate
	failed  bool  // the root level is in conflict
}

func code(l int32) int {
	if l > 0 {
		return 2 * int(l)
	}
	return 2*int(-l) + 1
}

func newPropagator(cnf *dimacs.CNF) *propagator {
	p := &propagator{vars: cnf.Vars, val: make([]int8, cnf.Vars+1), watches: make([][]int, 2*cnf.Vars+2)}
	n := 0
	for _, cl := range cnf.Clauses {
		n += len(cl)
	}
	p.lits = make([]int32, 0, n)
	p.start = make([]int, 0, len(cnf.Clauses)+1)
	var units []int32
	for _, cl := range cnf.Clauses {
		switch len(cl) {
		case 0:
			p.failed = true
			continue
		case 1:
			units = append(units, cl[0])
			continue
		}
		i := len(p.start)
		p.start = append(p.start, len(p.lits))
		p.lits = append(p.lits, cl...)
		p.watches[code(cl[0])] = append(p.watches[code(cl[0])], i)
		p.watches[code(cl[1])] = append(p.watches[code(cl[1])], i)
	}
	p.start = append(p.start, len(p.lits))
	for _, u := range units {
		if !p.set(u) {
			p.failed = true
		}
	}
	if !p.failed && !p.propagate() {
		p.failed = true
	}
	return p
}

func (p *propagator) value(l int32) int8 {
	if l > 0 {
		return p.val[l]
	}
	return -p.val[-l]
}

// set makes l true; it returns false when l is already false.
func (p *propagator) set(l int32) bool {
	switch p.value(l) {
	case 1:
		return true
	case -1:
		return false
	}
	if l > 0 {
		p.val[l] = 1
	} else {
		p.val[-l] = -1
	}
	p.trail = append(p.trail, l)
	return true
}

// propagate runs unit propagation to a fixpoint; false means a conflict.
func (p *propagator) propagate() bool {
	for p.head < len(p.trail) {
		falseLit := -p.trail[p.head]
		p.head++
		ws := p.watches[code(falseLit)]
		kept := ws[:0]
		conflict := false
		for k, ci := range ws {
			if conflict {
				kept = append(kept, ws[k:]...)
				break
			}
			cl := p.lits[p.start[ci]:p.start[ci+1]]
			if cl[0] == falseLit {
				cl[0], cl[1] = cl[1], cl[0]
			}
			if p.value(cl[0]) == 1 {
				kept = append(kept, ci)
				continue
			}
			moved := false
			for j := 2; j < len(cl); j++ {
				if p.value(cl[j]) != -1 {
					cl[1], cl[j] = cl[j], cl[1]
					p.watches[code(cl[1])] = append(p.watches[code(cl[1])], ci)
					moved = true
					break
				}
			}
			if moved {
				continue
			}
			kept = append(kept, ci)
			if !p.set(cl[0]) {
				conflict = true
			}
		}
		p.watches[code(falseLit)] = kept
		if conflict {
			return false
		}
	}
	return true
}

// assume opens a level, makes l true and propagates; false means a
// conflict (the level stays open: undo it with backtrack).
func (p *propagator) assume(l int32) bool {
	p.levels = append(p.levels, len(p.trail))
	if !p.set(l) {
		return false
	}
	return p.propagate()
}

// backtrack undoes every level above level.
func (p *propagator) backtrack(level int) {
	if level >= len(p.levels) {
		return
	}
	to := p.levels[level]
	for _, l := range p.trail[to:] {
		if l > 0 {
			p.val[l] = 0
		} else {
			p.val[-l] = 0
		}
	}
	p.trail = p.trail[:to]
	p.head = to
	p.levels = p.levels[:level]
}
