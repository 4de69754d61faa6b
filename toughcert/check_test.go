package toughcert_test

import (
	"errors"
	"math/bits"
	"math/rand/v2"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
	"spinecert.dev/toughcert"
)

// bruteComponents counts the components of g minus the vertices in mask by
// breadth-first search, written here independently of the checker.
func bruteComponents(g *graph.Graph, gone []bool) int {
	seen := make([]bool, g.N())
	c := 0
	for s := range g.N() {
		if gone[s] || seen[s] {
			continue
		}
		c++
		seen[s] = true
		queue := []int32{int32(s)}
		for len(queue) > 0 {
			v := queue[0]
			queue = queue[1:]
			for _, w := range g.Neighbors(v) {
				if !gone[w] && !seen[w] {
					seen[w] = true
					queue = append(queue, w)
				}
			}
		}
	}
	return c
}

// hamiltonian decides by dynamic programming over vertex subsets whether g
// (n <= 16) has a Hamiltonian cycle (common practice, no source).
func hamiltonian(g *graph.Graph) bool {
	n := g.N()
	if n < 3 {
		return false
	}
	// reach[mask] = set of v such that a path from 0 through exactly mask ends at v.
	reach := make([]uint32, 1<<n)
	reach[1] = 1
	for mask := 1; mask < 1<<n; mask += 2 {
		for v := range n {
			if reach[mask]>>v&1 == 0 {
				continue
			}
			for _, w := range g.Neighbors(int32(v)) {
				if mask>>w&1 == 0 {
					reach[mask|1<<w] |= 1 << w
				}
			}
		}
	}
	full := 1<<n - 1
	for _, w := range g.Neighbors(0) {
		if reach[full]>>w&1 != 0 {
			return true
		}
	}
	return false
}

func embedding(t testing.TB, g *graph.Graph) *planarcert.Embedding {
	t.Helper()
	res, err := planar.DecideChecked(g)
	if err != nil || !res.Planar {
		t.Fatalf("%v: planar %v, %v", g, res != nil && res.Planar, err)
	}
	return res.Cert.Embedding
}

type named struct {
	name string
	g    *graph.Graph
}

// smallTriangulations: stacked and flipped random triangulations on 3..10
// vertices, Kleetopes of triangulations on 4..6 vertices, and the published
// graphs below.
func smallTriangulations() []named {
	rng := rand.New(rand.NewPCG(7, 11))
	gs := []named{
		{"Goldner-Harary", fixture.GoldnerHarary()},
		{"octahedron", fixture.Octahedron()},
		{"icosahedron", fixture.Icosahedron()},
		{"K4", fixture.Complete(4)},
	}
	for n := 3; n <= 10; n++ {
		for range 4 {
			gs = append(gs, named{"stacked", fixture.RandomTriangulation(rng, n)})
			if n >= 4 {
				gs = append(gs, named{"flipped", fixture.RandomFlippedTriangulation(rng, n, 3*n).Graph()})
			}
		}
	}
	for n := 4; n <= 6; n++ {
		gs = append(gs, named{"Kleetope", fixture.RandomFlippedTriangulation(rng, n, 2*n).Kleetope()})
	}
	return gs
}

// TestCheckBruteForce runs the checker on every non-empty vertex set of
// small maximal planar graphs and compares with the definition, recounted by
// breadth-first search: it accepts exactly the sets whose removal leaves
// more components than their size. Where it accepts one, the graph must not
// be Hamiltonian (Chvátal, Discrete Math. 5, 1973: Hamiltonian graphs are
// 1-tough), which a brute-force Hamiltonicity test confirms. Published
// facts: the Goldner–Harary graph is not Hamiltonian (Goldner and Harary
// 1975) and removing its five bipyramid vertices leaves its six stacked
// vertices (see fixture.GoldnerHarary); the octahedron (4-connected) and the
// icosahedron (5-connected) are Hamiltonian (Tutte 1956), so no set passes;
// the Kleetope of a triangulation on n >= 5 vertices loses its 2n-4 stacked
// vertices as components when its n old vertices go (REFERENCES: derived
// with Chvátal 1973).
func TestCheckBruteForce(t *testing.T) {
	for _, tc := range smallTriangulations() {
		g := tc.g
		n := g.N()
		emb := embedding(t, g)
		accepted := 0
		for mask := 1; mask < 1<<n; mask++ {
			var s []int32
			gone := make([]bool, n)
			for v := range n {
				if mask>>v&1 != 0 {
					s = append(s, int32(v))
					gone[v] = true
				}
			}
			want := bruteComponents(g, gone)
			c, err := toughcert.Check(g, &toughcert.Cert{Embedding: emb, Removed: s})
			if ok := want > bits.OnesCount(uint(mask)); ok != (err == nil) {
				t.Fatalf("%s %v: S=%v leaves %d components, checker says %d, %v", tc.name, g, s, want, c, err)
			}
			if err == nil {
				accepted++
				if c != want {
					t.Fatalf("%s: S=%v: checker counts %d components, breadth-first search %d", tc.name, s, c, want)
				}
			} else if !errors.Is(err, toughcert.ErrRejected) {
				t.Fatalf("%s: rejection %v does not wrap ErrRejected", tc.name, err)
			}
		}
		ham := hamiltonian(g)
		if accepted > 0 && ham {
			t.Fatalf("%s %v: Hamiltonian, yet %d sets passed", tc.name, g, accepted)
		}
		switch tc.name {
		case "Goldner-Harary":
			if ham || accepted == 0 {
				t.Errorf("Goldner-Harary: Hamiltonian %v, %d sets passed; want not Hamiltonian and some set", ham, accepted)
			}
			if c, err := toughcert.Check(g, &toughcert.Cert{Embedding: emb, Removed: []int32{0, 1, 2, 3, 4}}); err != nil || c != 6 {
				t.Errorf("Goldner-Harary, the five bipyramid vertices: %d components, %v; want 6", c, err)
			}
		case "octahedron", "icosahedron":
			if !ham || accepted != 0 {
				t.Errorf("%s: Hamiltonian %v, %d sets passed; want Hamiltonian and none", tc.name, ham, accepted)
			}
		case "Kleetope":
			if m := (n + 4) / 3; m >= 5 {
				old := make([]int32, m)
				for i := range old {
					old[i] = int32(i)
				}
				if c, err := toughcert.Check(g, &toughcert.Cert{Embedding: emb, Removed: old}); err != nil || c != 2*m-4 {
					t.Errorf("Kleetope of %d vertices, its old vertices: %d components, %v; want %d", m, c, err, 2*m-4)
				}
			}
		}
	}
}

// TestCheckRejects: the precondition and the set are checked.
func TestCheckRejects(t *testing.T) {
	gh := fixture.GoldnerHarary()
	emb := embedding(t, gh)
	good := []int32{0, 1, 2, 3, 4}
	if _, err := toughcert.Check(gh, &toughcert.Cert{Embedding: emb, Removed: good}); err != nil {
		t.Fatal(err)
	}
	// Goldner–Harary minus the edge 0-1: planar with 3n-7 edges, and the
	// same set still leaves six components, but the graph is not maximal.
	var es [][2]int
	for _, e := range gh.Edges() {
		if !(e.U == 0 && e.V == 1) {
			es = append(es, [2]int{int(e.U), int(e.V)})
		}
	}
	minus := fixture.MustNumbered(t, 11, es)
	// K3,3 plus three edges on one side: 12 = 3·6-6 edges, not planar;
	// any rotation system must fail.
	k33 := fixture.MustNumbered(t, 6, [][2]int{{0, 3}, {0, 4}, {0, 5}, {1, 3}, {1, 4}, {1, 5}, {2, 3}, {2, 4}, {2, 5}, {0, 1}, {1, 2}, {0, 2}})
	k33rot := make([][]int32, 6)
	for v := range 6 {
		k33rot[v] = append([]int32(nil), k33.Neighbors(int32(v))...)
	}
	tests := []struct {
		name string
		g    *graph.Graph
		c    *toughcert.Cert
	}{
		{"nil certificate", gh, nil},
		{"no embedding", gh, &toughcert.Cert{Removed: good}},
		{"embedding of another graph", gh, &toughcert.Cert{Embedding: embedding(t, fixture.Icosahedron()), Removed: good}},
		{"not maximal", minus, &toughcert.Cert{Embedding: embedding(t, minus), Removed: good}},
		{"not planar, 3n-6 edges", k33, &toughcert.Cert{Embedding: &planarcert.Embedding{Rotation: k33rot}, Removed: []int32{0}}},
		{"two vertices", fixture.Complete(2), &toughcert.Cert{Removed: []int32{0}}},
		{"empty set", gh, &toughcert.Cert{Embedding: emb}},
		{"repeated vertex", gh, &toughcert.Cert{Embedding: emb, Removed: []int32{0, 1, 2, 3, 4, 4}}},
		{"negative vertex", gh, &toughcert.Cert{Embedding: emb, Removed: []int32{0, 1, 2, 3, -1}}},
		{"vertex out of range", gh, &toughcert.Cert{Embedding: emb, Removed: []int32{0, 1, 2, 3, 11}}},
		{"too few components", gh, &toughcert.Cert{Embedding: emb, Removed: []int32{0, 1, 2, 3}}},
	}
	for _, tt := range tests {
		if c, err := toughcert.Check(tt.g, tt.c); !errors.Is(err, toughcert.ErrRejected) {
			t.Errorf("%s: accepted (%d components, %v)", tt.name, c, err)
		}
	}
}

// FuzzCheckSet: a random vertex set on a random triangulation (stacked or
// flipped, or a Kleetope); the checker accepts it exactly when the
// breadth-first recount finds more components than vertices removed.
func FuzzCheckSet(f *testing.F) {
	f.Add(uint64(1), uint8(20), uint8(0), []byte{0, 1, 2, 3})
	f.Add(uint64(2), uint8(7), uint8(2), []byte{0, 1, 2, 3, 4, 5, 6})
	f.Add(uint64(3), uint8(30), uint8(1), []byte{})
	f.Add(uint64(4), uint8(9), uint8(2), []byte{255, 7, 7})
	f.Fuzz(func(t *testing.T, seed uint64, size, kind uint8, set []byte) {
		rng := rand.New(rand.NewPCG(seed, 5))
		n := 4 + int(size)%40
		var g *graph.Graph
		switch kind % 3 {
		case 0:
			g = fixture.RandomTriangulation(rng, n)
		case 1:
			g = fixture.RandomFlippedTriangulation(rng, n, 2*n).Graph()
		default:
			tr := fixture.RandomFlippedTriangulation(rng, n, n)
			g = tr.Kleetope()
			if len(set) == 0 { // the old vertices, an accepted set for n >= 5
				for v := range n {
					set = append(set, byte(v))
				}
			}
		}
		emb := embedding(t, g)
		var s []int32
		gone := make([]bool, g.N())
		dup := false
		for _, b := range set {
			v := int32(b)
			if b == 255 {
				v = -1
			}
			s = append(s, v)
			if v >= 0 && int(v) < g.N() {
				dup = dup || gone[v]
				gone[v] = true
			}
		}
		valid := !dup && len(s) > 0
		for _, v := range s {
			valid = valid && v >= 0 && int(v) < g.N()
		}
		want := bruteComponents(g, gone)
		c, err := toughcert.Check(g, &toughcert.Cert{Embedding: emb, Removed: s})
		switch {
		case err != nil && !errors.Is(err, toughcert.ErrRejected):
			t.Fatalf("rejection %v does not wrap ErrRejected", err)
		case err != nil && valid && want > len(s):
			t.Fatalf("S=%v rejected, but it leaves %d components: %v", s, want, err)
		case err == nil && !valid:
			t.Fatalf("S=%v accepted with a repeated vertex, a vertex out of range, or empty", s)
		case err == nil && (c != want || want <= len(s)):
			t.Fatalf("S=%v accepted with %d components; breadth-first search counts %d", s, c, want)
		}
	})
}
