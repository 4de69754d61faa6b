package cert

import (
	"bytes"
	"errors"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func plPlanarCert(t *testing.T, g *Graph) *Embedding {
	t.Helper()
	res, err := Planarity(g)
	if err != nil {
		t.Fatal(err)
	}
	if !res.Planar {
		t.Fatalf("%v found not planar", g)
	}
	if err := CheckPlanarCert(g, res.Cert); err != nil {
		t.Fatalf("%v: %v", g, err)
	}
	return res.Cert.Embedding
}

// Every maximal planar graph on n >= 3 vertices has 3n − 6 edges, by Euler's
// formula (common practice, no source); a random stacked triangulation is
// maximal planar and adding any edge makes it non-planar.
func TestTriangulations(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 3))
	for _, n := range []int{3, 4, 5, 10, 100, 2000} {
		g := plRandomTriangulation(rng, n)
		if g.M() != 3*n-6 {
			t.Fatalf("n=%d: %d edges", n, g.M())
		}
		if !IsMaximalPlanar(g) {
			t.Fatalf("n=%d: not maximal planar", n)
		}
		emb := plPlanarCert(t, g)
		if n > 3 {
			// Every face of a triangulation is a triangle: 2n − 4 faces.
			if f := plCountFaces(emb); f != 2*n-4 {
				t.Fatalf("n=%d: %d faces, want %d", n, f, 2*n-4)
			}
		}
		for tries := 0; tries < 5 && n > 4; tries++ {
			a, b := rng.IntN(n), rng.IntN(n)
			if a == b || g.HasEdge(int32(a), int32(b)) {
				continue
			}
			h := plNumbered(n, append(plEdgePairs(g), [2]int{a, b}))
			if IsPlanar(h) {
				t.Fatalf("n=%d: triangulation plus an edge is planar", n)
			}
			plNonPlanarCert(t, h)
		}
	}
	if IsMaximalPlanar(plGridGraph(3, 3)) {
		t.Fatal("3x3 grid reported maximal planar")
	}
	if !IsMaximalPlanar(plCompleteGraph(4)) || IsMaximalPlanar(plCompleteGraph(5)) {
		t.Fatal("K4 / K5 maximal planarity wrong")
	}
}

func plEdgePairs(g *Graph) [][2]int {
	var e [][2]int
	for _, x := range g.Edges() {
		e = append(e, [2]int{int(x.U), int(x.V)})
	}
	return e
}

// countFaces traces faces independently of the checker, for the tests.
func plCountFaces(emb *Embedding) int {
	type dart struct{ u, v int32 }
	pos := make(map[dart]int)
	for u, r := range emb.Rotation {
		for i, v := range r {
			pos[dart{int32(u), v}] = i
		}
	}
	seen := make(map[dart]bool)
	faces := 0
	for d := range pos {
		if seen[d] {
			continue
		}
		faces++
		for !seen[d] {
			seen[d] = true
			r := emb.Rotation[d.v]
			i := pos[dart{d.v, d.u}]
			d = dart{d.v, r[(i+1)%len(r)]}
		}
	}
	return faces
}

func TestPlanarSmallCases(t *testing.T) {
	cases := []*Graph{
		plNumbered(0, nil), plNumbered(1, nil), plNumbered(3, nil), plNumbered(2, [][2]int{{0, 1}}),
		plCompleteGraph(4), plGridGraph(1, 10), plGridGraph(7, 9), plCompleteBipartite(2, 9),
		plNumbered(9, [][2]int{{0, 1}, {1, 2}, {2, 0}, {4, 5}, {6, 7}, {7, 8}}),
	}
	for _, g := range cases {
		plPlanarCert(t, g)
	}
}

// Deep DFS trees must not overflow the goroutine stack: a path and a long
// ladder on 10^6 vertices.
func TestPlanarDeep(t *testing.T) {
	if testing.Short() {
		t.Skip("large graph")
	}
	n := 1_000_000
	e := make([][2]int, 0, n)
	for i := 0; i+1 < n; i++ {
		e = append(e, [2]int{i, i + 1})
	}
	plPlanarCert(t, plNumbered(n, e))
	plPlanarCert(t, plGridGraph(2, n/2))
}

func TestEmbeddingMutations(t *testing.T) {
	g := plGridGraph(4, 4)
	emb := plPlanarCert(t, g)
	clone := func() *Embedding {
		c := &Embedding{}
		for _, r := range emb.Rotation {
			c.Rotation = append(c.Rotation, slices.Clone(r))
		}
		return c
	}
	// Swapping two neighbours in the rotation of an interior vertex (degree 4)
	// changes the face count, so Euler's formula fails.
	v := int32(5)
	c := clone()
	r := c.Rotation[v]
	r[0], r[1] = r[1], r[0]
	if plCountFaces(c) == plCountFaces(emb) {
		t.Fatal("swap kept the face count")
	}
	if err := CheckEmbedding(g, c); !errors.Is(err, ErrBadPlanarCert) || !strings.Contains(err.Error(), "Euler") {
		t.Fatalf("swapped rotation: %v", err)
	}
	c = clone()
	c.Rotation[v] = c.Rotation[v][1:]
	if err := CheckEmbedding(g, c); err == nil {
		t.Fatal("missing neighbour accepted")
	}
	c = clone()
	c.Rotation[v][0] = c.Rotation[v][1]
	if err := CheckEmbedding(g, c); err == nil || !strings.Contains(err.Error(), "twice") {
		t.Fatalf("repeated neighbour: %v", err)
	}
	c = clone()
	c.Rotation[0][0] = 15
	if err := CheckEmbedding(g, c); err == nil || !strings.Contains(err.Error(), "not a neighbour") {
		t.Fatalf("non-neighbour: %v", err)
	}
	// A rotation system of K5 exists (on the torus) but cannot pass.
	k5 := plCompleteGraph(5)
	rot := make([][]int32, 5)
	for u := range rot {
		for w := int32(0); w < 5; w++ {
			if w != int32(u) {
				rot[u] = append(rot[u], w)
			}
		}
	}
	if err := CheckEmbedding(k5, &Embedding{Rotation: rot}); !errors.Is(err, ErrBadPlanarCert) {
		t.Fatalf("K5 rotation accepted: %v", err)
	}
	if err := CheckPlanarCert(g, &PlanarCert{Planar: true}); err == nil {
		t.Fatal("empty certificate accepted")
	}
}

func TestPlanarJSON(t *testing.T) {
	g := plMustNumbered(t, 6, [][2]int{{0, 1}, {1, 2}, {2, 0}, {2, 3}, {3, 4}})
	res, err := Planarity(g)
	if err != nil {
		t.Fatal(err)
	}
	var a bytes.Buffer
	if err := WritePlanarCert(&a, g, res.Cert); err != nil {
		t.Fatal(err)
	}
	c, err := ReadPlanarCert(bytes.NewReader(a.Bytes()), "p.json", g)
	if err != nil {
		t.Fatalf("%v\n%s", err, a.String())
	}
	if err := CheckPlanarCert(g, c); err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := WritePlanarCert(&b, g, c); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Fatalf("rewrite differs:\n%s\n%s", a.String(), b.String())
	}
	if _, err := ReadPlanarCert(bytes.NewReader(a.Bytes()), "p.json", plCompleteGraph(4)); err == nil || !strings.Contains(err.Error(), "not for this graph") {
		t.Fatalf("other graph: %v", err)
	}
}

// Table of bad certificate files in testdata/planar/bad-*.json, read against
// the graph in testdata/planar/g.txt (edge pairs), each with the expected
// message fragment on its first line after "//" removed by the test.
func TestPlanarCertBadFiles(t *testing.T) {
	g := plPlanarTestdataGraph(t)
	files, _ := filepath.Glob("testdata/planar/bad-*.json")
	if len(files) == 0 {
		t.Fatal("no test files")
	}
	want := map[string]string{
		"bad-syntax.json":     "p.json:3:",
		"bad-format.json":     "expected \"format\"",
		"bad-unknown.json":    "not a vertex",
		"bad-twice.json":      "given twice",
		"bad-kind.json":       "expected \"kind\"",
		"bad-field.json":      "unknown field",
		"bad-both.json":       "no \"kuratowski\"",
		"bad-type.json":       "expected",
		"bad-trailing.json":   "end of input",
		"bad-neighbours.json": "list of [vertex, neighbours...] lists",
		"bad-empty.json":      "is empty",
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		data = bytes.ReplaceAll(data, []byte("GRAPHID"), []byte(g.ID()))
		_, err = ReadPlanarCert(bytes.NewReader(data), "p.json", g)
		w, ok := want[filepath.Base(f)]
		if !ok {
			t.Errorf("%s: no expectation", f)
			continue
		}
		var pe *ParseError
		if err == nil || !errors.As(err, &pe) || !strings.Contains(err.Error(), w) {
			t.Errorf("%s: error %v, want a parse error containing %q", f, err, w)
		}
	}
}

func plPlanarTestdataGraph(t testing.TB) *Graph {
	// The triangle a b c with the pendant path c d e, and the isolated vertex f.
	b := NewBuilder()
	for _, l := range []string{"a", "b", "c", "d", "e", "f"} {
		b.Vertex(l)
	}
	for _, p := range [][2]string{{"a", "b"}, {"b", "c"}, {"c", "a"}, {"c", "d"}, {"d", "e"}} {
		if err := b.AddEdge(b.Vertex(p[0]), b.Vertex(p[1])); err != nil {
			t.Fatal(err)
		}
	}
	g, _ := b.Build()
	return g
}
