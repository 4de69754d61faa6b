package planarcert_test

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

// FuzzPlanarCert reads arbitrary bytes as a planarity certificate for a
// small fixed graph: reading must not panic, checking what was read must not
// panic, and a certificate that reads is written back byte-stably (write →
// read → write gives the same bytes).
func FuzzPlanarCert(f *testing.F) {
	g := plPlanarTestdataGraph(f)
	files, _ := filepath.Glob("testdata/planar/*.json")
	for _, name := range files {
		data, err := os.ReadFile(name)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(bytes.ReplaceAll(data, []byte("GRAPHID"), []byte(g.ID())))
	}
	for _, h := range []*graph.Graph{g} {
		res, err := planar.Decide(h)
		if err != nil {
			f.Fatal(err)
		}
		var b bytes.Buffer
		if err := planarcert.Write(&b, h, res.Cert); err != nil {
			f.Fatal(err)
		}
		f.Add(b.Bytes())
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		c, err := planarcert.Read(bytes.NewReader(data), "fuzz.json", g)
		if err != nil {
			return
		}
		_ = planarcert.Check(g, c)
		var a bytes.Buffer
		if err := planarcert.Write(&a, g, c); err != nil {
			return // e.g. a rotation that does not list every vertex
		}
		c2, err := planarcert.Read(bytes.NewReader(a.Bytes()), "fuzz.json", g)
		if err != nil {
			t.Fatalf("rewritten certificate does not read: %v\n%s", err, a.String())
		}
		var b bytes.Buffer
		if err := planarcert.Write(&b, g, c2); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(a.Bytes(), b.Bytes()) {
			t.Fatalf("not byte-stable:\n%s\n%s", a.String(), b.String())
		}
	})
}

// FuzzKuratowskiCert fuzzes the reader and checker of non-planar certificates
// against K3,3 plus a subdivided edge.
func FuzzKuratowskiCert(f *testing.F) {
	g := fixture.Numbered(7, [][2]int{{0, 3}, {0, 4}, {0, 6}, {6, 5}, {1, 3}, {1, 4}, {1, 5}, {2, 3}, {2, 4}, {2, 5}})
	res, err := planar.Decide(g)
	if err != nil || res.Planar {
		f.Fatalf("seed graph: %v %v", err, res)
	}
	var b bytes.Buffer
	if err := planarcert.Write(&b, g, res.Cert); err != nil {
		f.Fatal(err)
	}
	f.Add(b.Bytes())
	f.Add(bytes.Replace(b.Bytes(), []byte(`"6"`), []byte(`"5"`), 1))
	f.Fuzz(func(t *testing.T, data []byte) {
		c, err := planarcert.Read(bytes.NewReader(data), "fuzz.json", g)
		if err != nil {
			return
		}
		if planarcert.Check(g, c) == nil && c.Planar {
			t.Fatal("a planar certificate passed for a non-planar graph")
		}
	})
}

// FuzzEmbeddingCheck builds a graph and a rotation system from bytes; the
// checker must not panic, and must never accept a rotation system of a
// graph that the planarity test calls non-planar.
func FuzzEmbeddingCheck(f *testing.F) {
	f.Add([]byte{5, 0, 1, 1, 2, 2, 0, 0, 3}, []byte{1, 2, 3, 4})
	f.Add([]byte{5, 0, 1, 0, 2, 0, 3, 0, 4, 1, 2, 1, 3, 1, 4, 2, 3, 2, 4, 3, 4}, []byte{0, 0, 1})
	f.Fuzz(func(t *testing.T, ge, perm []byte) {
		if len(ge) == 0 {
			return
		}
		n := int(ge[0])%12 + 1
		var e [][2]int
		for i := 1; i+1 < len(ge); i += 2 {
			a, b := int(ge[i])%n, int(ge[i+1])%n
			if a != b {
				e = append(e, [2]int{a, b})
			}
		}
		g := fixture.Numbered(n, e)
		rot := make([][]int32, n)
		k := 0
		for v := 0; v < n; v++ {
			nb := append([]int32(nil), g.Neighbors(int32(v))...)
			for i := len(nb) - 1; i > 0; i-- {
				j := 0
				if k < len(perm) {
					j = int(perm[k]) % (i + 1)
					k++
				}
				nb[i], nb[j] = nb[j], nb[i]
			}
			rot[v] = nb
		}
		if planarcert.CheckEmbedding(g, &planarcert.Embedding{Rotation: rot}) == nil && !planar.IsPlanar(g) {
			t.Fatalf("rotation accepted for a non-planar graph %v", g.Edges())
		}
	})
}
