package heuristic_test

import (
	"fmt"

	"spinecert.dev/cert"
	"spinecert.dev/heuristic"
)

func ExampleStack() {
	// The 3x3 grid, vertices numbered row by row.
	g, _ := cert.NewNumbered(9, 0, [][2]int{
		{0, 1}, {1, 2}, {3, 4}, {4, 5}, {6, 7}, {7, 8},
		{0, 3}, {3, 6}, {1, 4}, {4, 7}, {2, 5}, {5, 8},
	})
	l := heuristic.Stack(g, heuristic.Options{Seed: 1})
	fmt.Println("pages:", l.Pages(), "valid:", cert.Validate(g, l).OK())
	// Output: pages: 2 valid: true
}
