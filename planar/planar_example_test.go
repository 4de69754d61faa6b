package planar_test

import (
	"fmt"

	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

// Decide decides planarity with a certificate that planarcert.Check checks
// independently.
func ExampleDecide() {
	// K3,3: sides {0, 1, 2} and {3, 4, 5}.
	var edges [][2]int
	for a := 0; a < 3; a++ {
		for b := 3; b < 6; b++ {
			edges = append(edges, [2]int{a, b})
		}
	}
	g, _ := graph.NewNumbered(6, 0, edges)
	res, _ := planar.Decide(g)
	fmt.Println("planar:", res.Planar)
	fmt.Println("kuratowski:", res.Cert.Kuratowski.Kind, len(res.Cert.Kuratowski.Paths), "paths")
	fmt.Println("checked:", planarcert.Check(g, res.Cert) == nil)
	// Output:
	// planar: false
	// kuratowski: K3,3 9 paths
	// checked: true
}
