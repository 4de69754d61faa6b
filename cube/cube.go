package cube

import (
	"fmt"
	"strconv"
	"strings"

	"spinecert.dev/dimacs"
)

// Cube is a conjunction of literals, written in the order of the decisions
// that made it (for a decision tree: root first).
type Cube []int32

// String renders the cube as in a cube file, without the "a " and " 0".
func (c Cube) String() string {
	var b strings.Builder
	for i, l := range c {
		if i > 0 {
			b.WriteByte(' ')
		}
		b.WriteString(strconv.Itoa(int(l)))
	}
	return b.String()
}

// Satisfied reports whether every literal of c is true under the
// assignment value (value(v) is the value of variable v ≥ 1).
func (c Cube) Satisfied(value func(v int32) bool) bool {
	for _, l := range c {
		if value(abs(l)) != (l > 0) {
			return false
		}
	}
	return true
}

// Apply returns cnf ∧ c: the clauses of cnf (shared, not copied) followed
// by one unit clause per literal of c. It is the formula whose refutation
// refutes cnf on the part of the space where c holds.
func Apply(cnf *dimacs.CNF, c Cube) *dimacs.CNF {
	cls := make([][]int32, len(cnf.Clauses), len(cnf.Clauses)+len(c))
	copy(cls, cnf.Clauses)
	units := make([]int32, len(c))
	copy(units, c)
	for i := range units {
		cls = append(cls, units[i:i+1:i+1])
	}
	return &dimacs.CNF{Vars: cnf.Vars, Clauses: cls}
}

// CoverageCNF returns the formula over vars variables whose clauses are
// the negations of the cubes: one clause ¬l1 ∨ … ∨ ¬lk per cube l1 ∧ … ∧ lk.
// An assignment satisfies it exactly when no cube holds under it, so the
// cubes cover every assignment if and only if it is unsatisfiable; a
// checked refutation of it is the coverage evidence for cubes of any shape.
func CoverageCNF(cubes []Cube, vars int) *dimacs.CNF {
	cnf := &dimacs.CNF{Vars: vars, Clauses: make([][]int32, len(cubes))}
	for i, c := range cubes {
		cl := make([]int32, len(c))
		for j, l := range c {
			cl[j] = -l
		}
		cnf.Clauses[i] = cl
	}
	return cnf
}

// Uncovered checks an assignment that satisfies CoverageCNF (a model from
// a solver) against the cubes and returns an error wrapping ErrNotCovering
// that names the assignment of the cubes' variables, or an error saying
// the model is wrong when some cube holds under it after all.
func Uncovered(cubes []Cube, model []bool) error {
	value := func(v int32) bool { return int(v) <= len(model) && model[v-1] }
	for i, c := range cubes {
		if c.Satisfied(value) {
			return fmt.Errorf("cube: the model of the coverage formula satisfies cube %d: it is not a witness", i+1)
		}
	}
	seen := map[int32]bool{}
	var lits []string
	for _, c := range cubes {
		for _, l := range c {
			v := abs(l)
			if seen[v] {
				continue
			}
			seen[v] = true
			if value(v) {
				lits = append(lits, strconv.Itoa(int(v)))
			} else {
				lits = append(lits, strconv.Itoa(-int(v)))
			}
			if len(lits) == 64 {
				lits = append(lits, "…")
				return fmt.Errorf("%w: no cube holds under %s", ErrNotCovering, strings.Join(lits, " "))
			}
		}
	}
	return fmt.Errorf("%w: no cube holds under %s", ErrNotCovering, strings.Join(lits, " "))
}

func abs(l int32) int32 {
	if l < 0 {
		return -l
	}
	return l
}

// wellFormed checks that no cube mentions a variable twice (Read refuses
// such cubes; library callers may pass them).
func wellFormed(cubes []Cube) error {
	seen := map[int32]bool{}
	for i, c := range cubes {
		clear(seen)
		for _, l := range c {
			if l == 0 || seen[abs(l)] {
				return fmt.Errorf("cube: cube %d (%s) mentions variable %d twice or holds 0", i+1, c, abs(l))
			}
			seen[abs(l)] = true
		}
	}
	return nil
}
