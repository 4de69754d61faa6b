package planar

import (
	"errors"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar/planarcert"
)

func plNonPlanarCert(t *testing.T, g *graph.Graph) *planarcert.Kuratowski {
	t.Helper()
	res, err := Decide(g)
	if err != nil {
		t.Fatal(err)
	}
	if res.Planar {
		t.Fatalf("%v found planar", g)
	}
	if err := planarcert.Check(g, res.Cert); err != nil {
		t.Fatalf("%v: %v", g, err)
	}
	return res.Cert.Kuratowski
}

// K5 and K3,3 are not planar and are their own Kuratowski subgraphs
// (K. Kuratowski, "Sur le problème des courbes gauches en topologie",
// Fund. Math. 15, 1930).
func TestKuratowskiSelf(t *testing.T) {
	for _, c := range []struct {
		g    *graph.Graph
		kind planarcert.KuratowskiKind
	}{{fixture.Complete(5), planarcert.K5}, {fixture.CompleteBipartite(3, 3), planarcert.K33}} {
		k := plNonPlanarCert(t, c.g)
		if k.Kind != c.kind {
			t.Fatalf("%v: kind %s, want %s", c.g, k.Kind, c.kind)
		}
		used := 0
		for _, p := range k.Paths {
			if len(p) != 2 {
				t.Fatalf("%v: path %v is not a single edge", c.g, p)
			}
			used++
		}
		if used != c.g.M() {
			t.Fatalf("%v: %d paths for %d edges", c.g, used, c.g.M())
		}
		if c.kind == planarcert.K33 {
			// The sides of K3,3 as built: {0,1,2} and {3,4,5}.
			a := slices.Sorted(slices.Values(k.Branch[:3]))
			b := slices.Sorted(slices.Values(k.Branch[3:]))
			if !(slices.Equal(a, []int32{0, 1, 2}) && slices.Equal(b, []int32{3, 4, 5}) ||
				slices.Equal(b, []int32{0, 1, 2}) && slices.Equal(a, []int32{3, 4, 5})) {
				t.Fatalf("K3,3 sides %v %v", a, b)
			}
		}
	}
}

// The Petersen graph is not planar; it contains a subdivision of K3,3 and,
// being cubic, none of K5 (common knowledge, no source).
func TestKuratowskiPetersen(t *testing.T) {
	k := plNonPlanarCert(t, fixture.Petersen())
	if k.Kind != planarcert.K33 {
		t.Fatalf("Petersen: %s subdivision", k.Kind)
	}
}

// Larger non-planar graphs: K_n, K_{3,n}, random graphs, planar graphs with
// one extra edge far away.
func TestKuratowskiVarious(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 7))
	gs := []*graph.Graph{fixture.Complete(6), fixture.Complete(9), fixture.CompleteBipartite(3, 7), fixture.CompleteBipartite(4, 4)}
	for i := 0; i < 40; i++ {
		gs = append(gs, fixture.RandomGraph(rng, 50+rng.IntN(300), 400+rng.IntN(400)))
	}
	for _, g := range gs {
		plNonPlanarCert(t, g)
	}
	if _, err := FindKuratowski(fixture.Grid(5, 5)); !errors.Is(err, ErrPlanar) {
		t.Fatalf("grid: %v, want ErrPlanar", err)
	}
}

func TestKuratowskiMutations(t *testing.T) {
	g := fixture.Petersen()
	k := plNonPlanarCert(t, g)
	clone := func() *planarcert.Kuratowski {
		c := &planarcert.Kuratowski{Kind: k.Kind, Branch: slices.Clone(k.Branch)}
		for _, p := range k.Paths {
			c.Paths = append(c.Paths, slices.Clone(p))
		}
		return c
	}
	long := 0
	for i, p := range k.Paths {
		if len(p) > len(k.Paths[long]) {
			long = i
		}
	}
	if len(k.Paths[long]) < 3 {
		t.Fatal("Petersen subdivision with no subdivided path")
	}
	cases := map[string]func(c *planarcert.Kuratowski){
		"break a path": func(c *planarcert.Kuratowski) {
			p := c.Paths[long]
			c.Paths[long] = append(p[:1:1], p[2:]...)
		},
		"drop a path":     func(c *planarcert.Kuratowski) { c.Paths = c.Paths[1:] },
		"wrong kind":      func(c *planarcert.Kuratowski) { c.Kind = planarcert.K5 },
		"swap sides":      func(c *planarcert.Kuratowski) { c.Branch[0], c.Branch[3] = c.Branch[3], c.Branch[0] },
		"repeat a path":   func(c *planarcert.Kuratowski) { c.Paths[1] = slices.Clone(c.Paths[0]) },
		"branch repeated": func(c *planarcert.Kuratowski) { c.Branch[1] = c.Branch[0] },
	}
	for name, mutate := range cases {
		c := clone()
		mutate(c)
		if err := planarcert.CheckKuratowski(g, c); !errors.Is(err, planarcert.ErrRejected) {
			t.Errorf("%s: accepted (%v)", name, err)
		}
	}
	// Two paths sharing an inner vertex: K3,3 with an extra vertex x on the
	// paths 0–3 and 1–4 (both through x, which is adjacent to 0, 1, 3, 4).
	h := fixture.Numbered(7, [][2]int{{0, 3}, {0, 4}, {0, 5}, {1, 3}, {1, 4}, {1, 5}, {2, 3}, {2, 4}, {2, 5}, {0, 6}, {1, 6}, {3, 6}, {4, 6}})
	bad := &planarcert.Kuratowski{Kind: planarcert.K33, Branch: []int32{0, 1, 2, 3, 4, 5}, Paths: [][]int32{
		{0, 6, 3}, {0, 4}, {0, 5}, {1, 3}, {1, 6, 4}, {1, 5}, {2, 3}, {2, 4}, {2, 5}}}
	if err := planarcert.CheckKuratowski(h, bad); err == nil || !strings.Contains(err.Error(), "share") {
		t.Fatalf("shared inner vertex: %v", err)
	}
	bad.Paths[4] = []int32{1, 4}
	if err := planarcert.CheckKuratowski(h, bad); err != nil {
		t.Fatalf("repaired certificate: %v", err)
	}
}

// Long obstructions: a grid with one diagonal across many columns, and
// stacked triangulations with one extra edge, so that the tube found by
// shrink is thin or wide; planarcert checks every certificate.
func TestKuratowskiLong(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for _, c := range []int{40, 300} {
		r := 10
		e := fixture.EdgePairs(fixture.Grid(r, c))
		g := fixture.Numbered(r*c, append(e, [2]int{(r/2)*c + c/5, (r/2+1)*c + 4*c/5}))
		plNonPlanarCert(t, g)
	}
	for i := 0; i < 20; i++ {
		n := 20 + rng.IntN(2000)
		e := fixture.RandomTriangulationEdges(rng, n)
		for {
			a, b := rng.IntN(n), rng.IntN(n)
			if a != b && !plHasPair(e, a, b) {
				plNonPlanarCert(t, fixture.Numbered(n, append(e, [2]int{a, b})))
				break
			}
		}
	}
}
