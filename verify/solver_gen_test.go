package verify

import (
	"math/rand/v2"

	"quire/dimacs"
)

// pigeonhole returns PHP(n+1, n): n+1 pigeons in n holes, variable
// (i-1)*n+j meaning pigeon i sits in hole j. Every pigeon sits somewhere and
// no hole holds two. It has n(n+1) variables and (n+1) + n*C(n+1, 2)
// clauses and is unsatisfiable (the pigeonhole principle; Haken, "The
// intractability of resolution", 1985, for its resolution hardness).
func pigeonhole(n int) *dimacs.CNF {
	v := func(i, j int) int32 { return int32((i-1)*n + j) }
	c := &dimacs.CNF{Vars: n * (n + 1)}
	for i := 1; i <= n+1; i++ {
		cl := make([]int32, 0, n)
		for j := 1; j <= n; j++ {
			cl = append(cl, v(i, j))
		}
		c.Clauses = append(c.Clauses, cl)
	}
	for j := 1; j <= n; j++ {
		for i := 1; i <= n+1; i++ {
			for k := i + 1; k <= n+1; k++ {
				c.Clauses = append(c.Clauses, []int32{-v(i, j), -v(k, j)})
			}
		}
	}
	return c
}

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
