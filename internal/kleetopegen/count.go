package main

import (
	"fmt"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
)

// fullSize prints the size of the full on-demand formula of "g has a
// 2-page stack layout", for comparison with the formula a refutation used.
func fullSize(g *graph.Graph) {
	f, err := dimacs.NewOnDemand(g, dimacs.Options{Kind: cert.Stack, Pages: 2})
	if err != nil {
		fmt.Println("kleetopegen:", err)
		return
	}
	fmt.Printf("full on-demand formula, 2 pages: %d clauses\n", f.FullSize())
}
