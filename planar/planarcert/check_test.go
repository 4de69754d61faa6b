package planarcert_test

import (
	"bytes"
	"errors"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
	"spinecert.dev/textpos"
)

func plPlanarCert(t *testing.T, g *graph.Graph) *planarcert.Embedding {
	t.Helper()
	res, err := planar.Decide(g)
	if err != nil {
		t.Fatal(err)
	}
	if !res.Planar {
		t.Fatalf("%v found not planar", g)
	}
	if err := planarcert.Check(g, res.Cert); err != nil {
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
		g := fixture.RandomTriangulation(rng, n)
		if g.M() != 3*n-6 {
			t.Fatalf("n=%d: %d edges", n, g.M())
		}
		if !planar.IsMaximal(g) {
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
			h := fixture.Numbered(n, append(fixture.EdgePairs(g), [2]int{a, b}))
			if planar.IsPlanar(h) {
				t.Fatalf("n=%d: triangulation plus an edge is planar", n)
			}
			if res, err := planar.Decide(h); err != nil || res.Planar || planarcert.Check(h, res.Cert) != nil {
				t.Fatalf("n=%d: triangulation plus an edge: no checked Kuratowski certificate (%v)", n, err)
			}
		}
	}
	if planar.IsMaximal(fixture.Grid(3, 3)) {
		t.Fatal("3x3 grid reported maximal planar")
	}
	if !planar.IsMaximal(fixture.Complete(4)) || planar.IsMaximal(fixture.Complete(5)) {
		t.Fatal("K4 / K5 maximal planarity wrong")
	}
}

// countFaces traces faces independently of the checker, for the tests.
func plCountFaces(emb *planarcert.Embedding) int {
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
	cases := []*graph.Graph{
		fixture.Numbered(0, nil), fixture.Numbered(1, nil), fixture.Numbered(3, nil), fixture.Numbered(2, [][2]int{{0, 1}}),
		fixture.Complete(4), fixture.Grid(1, 10), fixture.Grid(7, 9), fixture.CompleteBipartite(2, 9),
		fixture.Numbered(9, [][2]int{{0, 1}, {1, 2}, {2, 0}, {4, 5}, {6, 7}, {7, 8}}),
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
	plPlanarCert(t, fixture.Numbered(n, e))
	plPlanarCert(t, fixture.Grid(2, n/2))
}

func TestEmbeddingMutations(t *testing.T) {
	g := fixture.Grid(4, 4)
	emb := plPlanarCert(t, g)
	clone := func() *planarcert.Embedding {
		c := &planarcert.Embedding{}
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
	if err := planarcert.CheckEmbedding(g, c); !errors.Is(err, planarcert.ErrRejected) || !strings.Contains(err.Error(), "Euler") {
		t.Fatalf("swapped rotation: %v", err)
	}
	c = clone()
	c.Rotation[v] = c.Rotation[v][1:]
	if err := planarcert.CheckEmbedding(g, c); err == nil {
		t.Fatal("missing neighbour accepted")
	}
	c = clone()
	c.Rotation[v][0] = c.Rotation[v][1]
	if err := planarcert.CheckEmbedding(g, c); err == nil || !strings.Contains(err.Error(), "twice") {
		t.Fatalf("repeated neighbour: %v", err)
	}
	c = clone()
	c.Rotation[0][0] = 15
	if err := planarcert.CheckEmbedding(g, c); err == nil || !strings.Contains(err.Error(), "not a neighbour") {
		t.Fatalf("non-neighbour: %v", err)
	}
	// A rotation system of K5 exists (on the torus) but cannot pass.
	k5 := fixture.Complete(5)
	rot := make([][]int32, 5)
	for u := range rot {
		for w := int32(0); w < 5; w++ {
			if w != int32(u) {
				rot[u] = append(rot[u], w)
			}
		}
	}
	if err := planarcert.CheckEmbedding(k5, &planarcert.Embedding{Rotation: rot}); !errors.Is(err, planarcert.ErrRejected) {
		t.Fatalf("K5 rotation accepted: %v", err)
	}
	if err := planarcert.Check(g, &planarcert.Cert{Planar: true}); err == nil {
		t.Fatal("empty certificate accepted")
	}
}

// TestPlanarJSON: a certificate written, read back and checked is written
// again byte for byte, for a planar graph and for non-planar ones (Petersen,
// K5 and K7 contain Kuratowski subdivisions: common knowledge, no source).
func TestPlanarJSON(t *testing.T) {
	for _, g := range []*graph.Graph{
		fixture.MustNumbered(t, 6, [][2]int{{0, 1}, {1, 2}, {2, 0}, {2, 3}, {3, 4}}),
		fixture.Petersen(), fixture.Complete(5), fixture.Complete(7),
	} {
		res, err := planar.Decide(g)
		if err != nil {
			t.Fatal(err)
		}
		var a bytes.Buffer
		if err := planarcert.Write(&a, g, res.Cert); err != nil {
			t.Fatal(err)
		}
		c, err := planarcert.Read(bytes.NewReader(a.Bytes()), "p.json", g)
		if err != nil {
			t.Fatalf("%v\n%s", err, a.String())
		}
		if err := planarcert.Check(g, c); err != nil {
			t.Fatal(err)
		}
		var b bytes.Buffer
		if err := planarcert.Write(&b, g, c); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(a.Bytes(), b.Bytes()) {
			t.Fatalf("rewrite differs:\n%s\n%s", a.String(), b.String())
		}
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
		"bad-case.json":       `p.json:1:143: keys "planar" and "Planar" differ only in case`,
		"bad-case-inner.json": `keys "kind" and "Kind" differ only in case`,
		"bad-key-twice.json":  `key "planar" appears twice`,
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		data = bytes.ReplaceAll(data, []byte("GRAPHID"), []byte(g.ID()))
		_, err = planarcert.Read(bytes.NewReader(data), "p.json", g)
		w, ok := want[filepath.Base(f)]
		if !ok {
			t.Errorf("%s: no expectation", f)
			continue
		}
		var pe *textpos.Error
		if err == nil || !errors.As(err, &pe) || !strings.Contains(err.Error(), w) {
			t.Errorf("%s: error %v, want a parse error containing %q", f, err, w)
		}
	}
}

func plPlanarTestdataGraph(t testing.TB) *graph.Graph {
	// The triangle a b c with the pendant path c d e, and the isolated vertex f.
	b := graph.NewBuilder()
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
