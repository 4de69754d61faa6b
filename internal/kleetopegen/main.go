// Command kleetopegen writes the Kleetope of a random stacked triangulation
// as an edge list: a triangle, T-3 vertices each stacked into a random face,
// then one more vertex stacked into every one of the 2T-4 faces. The result
// has 3T-4 vertices, is maximal planar and is not Hamiltonian (removing the
// T old vertices leaves 2T-4 > T components; Chvátal 1973), so it needs
// three pages (Bernhart and Kainen 1979). With -plain it writes the
// triangulation itself (after -flips random edge flips). Used by
// scripts/scale.sh.
package main

import (
	"bufio"
	"flag"
	"fmt"
	"math/rand/v2"
	"os"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

func main() {
	t := flag.Int("t", 135, "vertices of the stacked triangulation (the Kleetope has 3t-4)")
	seed := flag.Uint64("seed", 1, "random seed")
	out := flag.String("o", "kleetope.edges", "edge list to write")
	count := flag.Bool("count", false, "also print the size of the full on-demand formula for 2 pages")
	flips := flag.Int("flips", 0, "random edge flips after stacking (the graph is then no longer stacked)")
	plain := flag.Bool("plain", false, "write the triangulation itself, not its Kleetope")
	flag.Parse()
	if *t < 4 {
		fmt.Fprintln(os.Stderr, "kleetopegen: -t must be at least 4")
		os.Exit(2)
	}
	tr := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(*seed, 2)), *t, *flips)
	g := tr.Kleetope()
	if *plain {
		g = tr.Graph()
	}
	f, err := os.Create(*out)
	if err != nil {
		fmt.Fprintln(os.Stderr, "kleetopegen:", err)
		os.Exit(2)
	}
	w := bufio.NewWriter(f)
	if err := graph.WriteEdgeList(w, g); err != nil {
		fmt.Fprintln(os.Stderr, "kleetopegen:", err)
		os.Exit(2)
	}
	if err := w.Flush(); err != nil || f.Close() != nil {
		fmt.Fprintln(os.Stderr, "kleetopegen: writing", *out)
		os.Exit(2)
	}
	fmt.Fprintf(os.Stderr, "kleetopegen: wrote %s: %d vertices, %d edges\n", *out, g.N(), g.M())
	if *count {
		fullSize(g)
	}
}
