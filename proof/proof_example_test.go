package proof_test

import (
	"context"
	"fmt"
	"strings"

	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
)

// The four clauses on two variables are refuted by the units -2 and 1.
func ExampleCheckDRAT() {
	cnf, _ := dimacs.ReadCNF(strings.NewReader("p cnf 2 4\n1 2 0\n-1 2 0\n1 -2 0\n-1 -2 0\n"), "four.cnf", dimacs.ReadOptions{})
	var lrat strings.Builder
	res, err := proof.WriteLRAT(context.Background(), cnf, strings.NewReader("-2 0\n1 0\n0\n"), &lrat, proof.DRATOptions{})
	fmt.Println(res.Accepted, res.Format, res.Detected, err)
	fmt.Print(lrat.String())
	check, err := proof.CheckLRAT(context.Background(), cnf, strings.NewReader(lrat.String()), "four.lrat")
	fmt.Println(check.Accepted, err)
	// Output:
	// true drat true <nil>
	// 5 -2 0 3 4 0
	// 6 0 5 1 2 0
	// true <nil>
}
