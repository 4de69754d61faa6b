package heuristic_test

import (
	"fmt"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/heuristic"
)

func ExampleStack() {
	// The 3x3 grid, vertices numbered row by row.
	g, _ := graph.NewNumbered(9, 0, [][2]int{
		{0, 1}, {1, 2}, {3, 4}, {4, 5}, {6, 7}, {7, 8},
		{0, 3}, {3, 6}, {1, 4}, {4, 7}, {2, 5}, {5, 8},
	})
	l := heuristic.Stack(g, heuristic.Options{Seed: 1})
	fmt.Println("pages:", l.Pages(), "valid:", cert.Validate(g, l).OK())
	// Output: pages: 2 valid: true
}

// HamiltonianTwoPage turns a Hamiltonian cycle of a planar graph into a
// 2-page stack layout.
func ExampleHamiltonianTwoPage() {
	// The octahedron: apexes 0 and 5 over the square 1 2 3 4.
	g, _ := graph.NewNumbered(6, 0, [][2]int{{0, 1}, {0, 2}, {0, 3}, {0, 4}, {5, 1}, {5, 2}, {5, 3}, {5, 4}, {1, 2}, {2, 3}, {3, 4}, {4, 1}})
	l, ok := heuristic.HamiltonianTwoPage(g, nil, 10000)
	fmt.Println(ok, l.Pages(), cert.Validate(g, l).OK())
	// Output: true 2 true
}
