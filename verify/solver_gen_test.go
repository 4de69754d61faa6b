package verify

import (
	"math/rand/v2"

	"spinecert.dev/dimacs"
)

// pigeonhole(n), PHP(n+1, n), is defined with the proof tests.

// random3SAT returns a uniform random 3-CNF with n variables and m clauses
// of three distinct variables, each negated with probability 1/2, from seed.
func random3SAT(seed uint64, n, m int) *dimacs.CNF {
	r := rand.New(rand.NewPCG(seed, 0x9e3779b97f4a7c15))
	c := &dimacs.CNF{Vars: n}
	for range m {
		var vs [3]int32
		for i := 0; i < 3; i++ {
		again:
			x := int32(r.IntN(n) + 1)
			for _, y := range vs[:i] {
				if y == x {
					goto again
				}
			}
			vs[i] = x
		}
		cl := make([]int32, 3)
		for i, x := range vs {
			if r.IntN(2) == 0 {
				x = -x
			}
			cl[i] = x
		}
		c.Clauses = append(c.Clauses, cl)
	}
	return c
}
