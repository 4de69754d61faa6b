package cube

import (
	"bytes"
	"context"
	"errors"
	"math/rand/v2"
	"testing"

	"spinecert.dev/dimacs"
)

// The checks below are against brute force: every assignment of the
// variables is enumerated and the cubes that hold under it are counted
// (the definitions of coverage and disjointness; common practice, no
// source).

// holding returns, for every assignment of vars variables, how many cubes
// hold under it.
func holding(cubes []Cube, vars int) []int {
	out := make([]int, 1<<vars)
	for a := range out {
		value := func(v int32) bool { return a>>(v-1)&1 == 1 }
		for _, c := range cubes {
			if c.Satisfied(value) {
				out[a]++
			}
		}
	}
	return out
}

// randomTree returns the leaves of a random complete binary decision tree
// over vars variables with about n leaves.
func randomTree(r *rand.Rand, vars, n int) []Cube {
	leaves := []Cube{{}}
	for len(leaves) < n {
		i := r.IntN(len(leaves))
		c := leaves[i]
		used := map[int32]bool{}
		for _, l := range c {
			used[abs(l)] = true
		}
		var free []int32
		for v := int32(1); v <= int32(vars); v++ {
			if !used[v] {
				free = append(free, v)
			}
		}
		if len(free) == 0 {
			if len(leaves) >= 1<<vars {
				break
			}
			continue
		}
		v := free[r.IntN(len(free))]
		a := append(c[:len(c):len(c)], v)
		b := append(c[:len(c):len(c)], -v)
		leaves[i] = a
		leaves = append(leaves, b)
	}
	r.Shuffle(len(leaves), func(i, j int) { leaves[i], leaves[j] = leaves[j], leaves[i] })
	return leaves
}

// mutate changes a cube set a little: drops, duplicates, flips or
// truncates a cube, or swaps two literals of one.
func mutate(r *rand.Rand, cubes []Cube, vars int) []Cube {
	out := make([]Cube, len(cubes))
	for i, c := range cubes {
		out[i] = append(Cube{}, c...)
	}
	i := r.IntN(len(out))
	switch r.IntN(5) {
	case 0:
		out = append(out[:i], out[i+1:]...)
	case 1:
		out = append(out, append(Cube{}, out[i]...))
	case 2:
		if len(out[i]) > 0 {
			out[i][r.IntN(len(out[i]))] *= -1
		}
	case 3:
		if len(out[i]) > 0 {
			out[i] = out[i][:len(out[i])-1]
		}
	case 4:
		if len(out[i]) > 1 {
			j, k := r.IntN(len(out[i])), r.IntN(len(out[i]))
			out[i][j], out[i][k] = out[i][k], out[i][j]
		} else if v := int32(1 + r.IntN(vars)); len(out[i]) == 0 || abs(out[i][0]) != v {
			out[i] = append(out[i], v)
		}
	}
	return out
}

func TestCheckTreeAgainstBruteForce(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	accepted, rejected := 0, 0
	for trial := range 3000 {
		vars := 1 + r.IntN(7)
		cubes := randomTree(r, vars, 1+r.IntN(20))
		if trial%2 == 1 {
			cubes = mutate(r, cubes, vars)
		}
		if len(cubes) == 0 {
			continue
		}
		err := CheckTree(cubes)
		counts := holding(cubes, vars)
		exactlyOne := true
		for _, n := range counts {
			exactlyOne = exactlyOne && n == 1
		}
		if err == nil {
			accepted++
			if !exactlyOne {
				t.Fatalf("CheckTree accepted %v, but some assignment satisfies no cube or two: %v", cubes, counts)
			}
			continue
		}
		rejected++
		if trial%2 == 0 {
			t.Fatalf("CheckTree rejected the leaves of a decision tree %v: %v", cubes, err)
		}
		if errors.Is(err, ErrOverlap) {
			overlap := false
			for _, n := range counts {
				overlap = overlap || n > 1
			}
			if !overlap {
				t.Fatalf("CheckTree reported an overlap in %v, but no assignment satisfies two cubes: %v", cubes, err)
			}
		}
	}
	if accepted < 1000 || rejected < 500 {
		t.Fatalf("accepted %d, rejected %d: the trials do not exercise both outcomes", accepted, rejected)
	}
}

func TestCheckDisjointAgainstBruteForce(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for range 2000 {
		vars := 1 + r.IntN(6)
		cubes := mutate(r, randomTree(r, vars, 1+r.IntN(12)), vars)
		if len(cubes) == 0 {
			continue
		}
		overlap := false
		for _, n := range holding(cubes, vars) {
			overlap = overlap || n > 1
		}
		err := CheckDisjoint(cubes)
		if (err != nil) != overlap {
			t.Fatalf("CheckDisjoint(%v) = %v, brute force says overlap=%v", cubes, err, overlap)
		}
		if err != nil && !errors.Is(err, ErrOverlap) {
			t.Fatalf("error does not wrap ErrOverlap: %v", err)
		}
	}
}

// bruteSat reports whether cnf has a model, and one.
func bruteSat(cnf *dimacs.CNF) ([]bool, bool) {
	for a := 0; a < 1<<cnf.Vars; a++ {
		model := make([]bool, cnf.Vars)
		for v := range model {
			model[v] = a>>v&1 == 1
		}
		ok := true
		for _, cl := range cnf.Clauses {
			sat := false
			for _, l := range cl {
				sat = sat || model[abs(l)-1] == (l > 0)
			}
			if !sat {
				ok = false
				break
			}
		}
		if ok {
			return model, true
		}
	}
	return nil, false
}

func TestCoverageCNFAgainstBruteForce(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for range 2000 {
		vars := 1 + r.IntN(6)
		cubes := mutate(r, randomTree(r, vars, 1+r.IntN(12)), vars)
		if len(cubes) == 0 {
			continue
		}
		covered := true
		for _, n := range holding(cubes, vars) {
			covered = covered && n > 0
		}
		model, sat := bruteSat(CoverageCNF(cubes, vars))
		if sat == covered {
			t.Fatalf("cubes %v: coverage formula satisfiable=%v, brute force covered=%v", cubes, sat, covered)
		}
		if sat {
			if err := Uncovered(cubes, model); !errors.Is(err, ErrNotCovering) {
				t.Fatalf("Uncovered(%v, %v) = %v, want ErrNotCovering", cubes, model, err)
			}
		}
	}
}

// randomCNF returns a random 3-CNF.
func randomCNF(r *rand.Rand, vars, clauses int) *dimacs.CNF {
	cnf := &dimacs.CNF{Vars: vars}
	for range clauses {
		var cl []int32
		for range 3 {
			l := int32(1 + r.IntN(vars))
			if r.IntN(2) == 0 {
				l = -l
			}
			cl = append(cl, l)
		}
		cnf.Clauses = append(cnf.Clauses, cl)
	}
	return cnf
}

func TestSplitGivesATreeThatPreservesSatisfiability(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for trial := range 300 {
		vars := 3 + r.IntN(8)
		cnf := randomCNF(r, vars, r.IntN(6*vars))
		for _, rule := range Rules {
			n := 1 + r.IntN(16)
			cubes, stats, err := Split(context.Background(), cnf, SplitOptions{Cubes: n, Rule: rule, Candidates: 1 + trial%8})
			if err != nil {
				t.Fatal(err)
			}
			if err := CheckTree(cubes); err != nil {
				t.Fatalf("%s: Split gave cubes that fail CheckTree: %v\n%v", rule, err, cubes)
			}
			if len(cubes) > n {
				t.Fatalf("%s: %d cubes, asked for %d", rule, len(cubes), n)
			}
			if len(cubes) < n && stats.Closed+stats.Full != len(cubes) {
				t.Fatalf("%s: only %d of %d cubes though %d could still be split", rule, len(cubes), n, len(cubes)-stats.Closed-stats.Full)
			}
			_, sat := bruteSat(cnf)
			anySat := false
			for _, c := range cubes {
				_, s := bruteSat(Apply(cnf, c))
				anySat = anySat || s
			}
			if sat != anySat {
				t.Fatalf("%s: F satisfiable=%v, but some F∧cube satisfiable=%v", rule, sat, anySat)
			}
		}
	}
}

func TestSplitIsDeterministic(t *testing.T) {
	cnf := randomCNF(rand.New(rand.NewPCG(9, 9)), 30, 120)
	var first []byte
	for range 3 {
		cubes, _, err := Split(context.Background(), cnf, SplitOptions{Cubes: 16})
		if err != nil {
			t.Fatal(err)
		}
		var b bytes.Buffer
		if err := Write(&b, cubes); err != nil {
			t.Fatal(err)
		}
		if first == nil {
			first = b.Bytes()
		} else if !bytes.Equal(first, b.Bytes()) {
			t.Fatal("two splits of the same formula differ")
		}
	}
}

func TestApplySharesClausesAndAddsUnits(t *testing.T) {
	cnf := &dimacs.CNF{Vars: 3, Clauses: [][]int32{{1, 2}, {-3}}}
	got := Apply(cnf, Cube{2, -1})
	if got.Vars != 3 || len(got.Clauses) != 4 || got.Clauses[2][0] != 2 || got.Clauses[3][0] != -1 || len(got.Clauses[3]) != 1 {
		t.Fatalf("Apply = %+v", got)
	}
	if len(cnf.Clauses) != 2 {
		t.Fatal("Apply changed its input")
	}
}
