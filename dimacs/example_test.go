package dimacs_test

import (
	"fmt"
	"os"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
)

// Encode the claim "K4 has a 2-page stack layout" and print its size, with
// the default options (all four vertices are twins, so the spine order is
// fixed) and without twin symmetry breaking.
func ExampleEncode() {
	g, _ := graph.NewNumbered(4, 0, [][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}})
	enc, err := dimacs.Encode(g, dimacs.Options{Kind: cert.Stack, Pages: 2})
	if err != nil {
		fmt.Println(err)
		return
	}
	st := enc.Stats()
	fmt.Println(st.Vars, st.Clauses)
	enc, err = dimacs.Encode(g, dimacs.Options{Kind: cert.Stack, Pages: 2, NoTwins: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	st = enc.Stats()
	fmt.Println(st.Vars, st.Clauses)
	// Output:
	// 10 7
	// 13 13
}

// Write a small CNF.
func ExampleWriter() {
	w := dimacs.NewWriter(os.Stdout)
	w.Comment("x1 or not x2")
	w.Header(2, 1)
	w.Clause(1, -2)
	w.Flush()
	// Output:
	// c x1 or not x2
	// p cnf 2 1
	// 1 -2 0
}
