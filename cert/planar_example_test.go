package cert_test

import (
	"fmt"

	"spinecert.dev/cert"
)

// Planarity decides planarity with a certificate that CheckPlanarCert checks
// independently.
func ExamplePlanarity() {
	// K3,3: sides {0, 1, 2} and {3, 4, 5}.
	var edges [][2]int
	for a := 0; a < 3; a++ {
		for b := 3; b < 6; b++ {
			edges = append(edges, [2]int{a, b})
		}
	}
	g, _ := cert.NewNumbered(6, 0, edges)
	res, _ := cert.Planarity(g)
	fmt.Println("planar:", res.Planar)
	fmt.Println("kuratowski:", res.Cert.Kuratowski.Kind, len(res.Cert.Kuratowski.Paths), "paths")
	fmt.Println("checked:", cert.CheckPlanarCert(g, res.Cert) == nil)
	// Output:
	// planar: false
	// kuratowski: K3,3 9 paths
	// checked: true
}

// HamiltonianTwoPage turns a Hamiltonian cycle of a planar graph into a
// 2-page stack layout.
func ExampleHamiltonianTwoPage() {
	// The octahedron: apexes 0 and 5 over the square 1 2 3 4.
	g, _ := cert.NewNumbered(6, 0, [][2]int{{0, 1}, {0, 2}, {0, 3}, {0, 4}, {5, 1}, {5, 2}, {5, 3}, {5, 4}, {1, 2}, {2, 3}, {3, 4}, {4, 1}})
	l, ok := cert.HamiltonianTwoPage(g, nil, 10000)
	fmt.Println(ok, l.Pages(), cert.Validate(g, l).OK())
	// Output: true 2 true
}
