package heuristic

import (
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/internal/fixture"
)

// Every planar graph on up to 9 vertices (nauty-geng, filtered by
// nauty-planarg) gets a checked stack layout within the bound of its class:
// at most 4 pages for every planar graph (Yannakakis, JCSS 38, 1989;
// REFERENCES), at most 3 for planar 3-trees (Heath 1984; from memory), and 2
// for maximal planar graphs, which are all Hamiltonian below 11 vertices
// (the Goldner–Harary graph is the smallest non-Hamiltonian one; its title,
// REFERENCES) and so have 2 pages (Bernhart and Kainen 1979). The counts of
// planar graphs (OEIS A005470) and triangulations (OEIS A000109) check the
// input.
func TestPlanarClassesNauty(t *testing.T) {
	planarCount := []int{1, 1, 2, 4, 11, 33, 142, 822, 6966, 79853} // A005470, n = 0..9 (n = 9 from memory)
	triangulations := []int{0, 0, 0, 1, 1, 1, 2, 5, 14, 50}         // A000109, n = 3..9
	threeTrees := []int{0, 0, 0, 1, 1, 1, 1, 3, 7, 24}              // planar 3-trees, OEIS A027610 (from memory), n = 4..9
	maxN := 9
	if testing.Short() {
		maxN = 8
	}
	for n := 1; n <= maxN; n++ {
		raw := fixture.RunTool(t, nil, "nauty-geng", "nauty", "-q", itoa(n))
		gs := fixture.FromGraph6(t, fixture.RunTool(t, raw, "nauty-planarg", "nauty", "-q"))
		if len(gs) != planarCount[n] {
			t.Fatalf("n=%d: %d planar graphs, A005470 says %d", n, len(gs), planarCount[n])
		}
		tri, stacked := 0, 0
		for _, g := range gs {
			l, rep, err := FindReport(g, cert.Stack, Options{Seed: 1})
			if err != nil {
				t.Fatal(err)
			}
			if vr := cert.Validate(g, l); !vr.OK() {
				t.Fatalf("%v: layout by %s rejected: %v", g, rep.Method, vr.Err())
			}
			bound := 4
			if n >= 3 && g.M() == 3*n-6 {
				tri++
				bound = 2
			}
			if sk, ok := RecognizeStacked(g); ok {
				stacked++
				if st := StackedThreePage(g, sk); st == nil || !cert.Validate(g, st).OK() || st.Pages() > 3 {
					t.Fatalf("%v: the planar 3-tree construction fails", g)
				}
			}
			if l.Pages() > bound {
				t.Errorf("%v: %d pages by %s, above the class bound %d", g, l.Pages(), rep.Method, bound)
			}
		}
		if tri != triangulations[n] {
			t.Errorf("n=%d: %d triangulations, A000109 says %d", n, tri, triangulations[n])
		}
		if stacked != threeTrees[n] {
			t.Errorf("n=%d: %d planar 3-trees recognised, A027610 says %d", n, stacked, threeTrees[n])
		}
		t.Logf("n=%d: %d planar graphs, %d triangulations, %d planar 3-trees", n, len(gs), tri, stacked)
	}
}

func itoa(n int) string { return string(rune('0' + n)) }
