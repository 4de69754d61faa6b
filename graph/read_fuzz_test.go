package graph

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"spinecert.dev/textpos"
)

// The fuzz targets check that the readers never panic, that every failure is
// a *textpos.Error, and that what they accept round-trips: parse, write, parse
// gives the same graphs (the same IDs) and writing again gives the same bytes.
// Seeds: testdata/fuzz/FuzzRead*/ and the files of testdata/graphs.

// ioFuzzSeeds adds the testdata graph files whose names end in one of exts.
func ioFuzzSeeds(f *testing.F, exts ...string) {
	for _, dir := range []string{"testdata/graphs", "testdata/graphs/bad"} {
		entries, _ := os.ReadDir(dir)
		for _, e := range entries {
			for _, ext := range exts {
				if strings.HasSuffix(e.Name(), ext) {
					if b, err := os.ReadFile(filepath.Join(dir, e.Name())); err == nil {
						f.Add(b)
					}
				}
			}
		}
	}
}

// ioFuzzRoundTrip reads data as format, then checks the round trip through write.
func ioFuzzRoundTrip(t *testing.T, data []byte, format Format, write func(*bytes.Buffer, *Graph) error) {
	// Detection must not panic either, whatever it decides.
	if _, err := Read(bytes.NewReader(data), "fuzz", FormatAuto); err != nil {
		var pe *textpos.Error
		if !errors.As(err, &pe) {
			t.Fatalf("auto-detected read failed without a ParseError: %v", err)
		}
	}
	res, err := Read(bytes.NewReader(data), "fuzz", format)
	if err != nil {
		var pe *textpos.Error
		if !errors.As(err, &pe) {
			t.Fatalf("read failed without a ParseError: %v", err)
		}
		return
	}
	var out bytes.Buffer
	for _, g := range res.Graphs {
		// the same graph built from its label strings has the same identity
		b := NewBuilder()
		for _, l := range g.Labels() {
			b.Vertex(l)
		}
		for _, e := range g.Edges() {
			_ = b.AddEdge(e.U, e.V)
		}
		if h, _ := b.Build(); h.ID() != g.ID() {
			t.Fatalf("graph %v: identity differs from that of the graph built from its labels", g)
		}
		if err := write(&out, g); err != nil {
			t.Fatalf("cannot write what was read (%v): %v", g, err)
		}
	}
	res2, err := Read(bytes.NewReader(out.Bytes()), "fuzz-out", format)
	if err != nil {
		t.Fatalf("cannot read what was written: %v\n%q", err, out.Bytes())
	}
	if len(res2.Graphs) != len(res.Graphs) {
		t.Fatalf("%d graphs read, %d after the round trip", len(res.Graphs), len(res2.Graphs))
	}
	var again bytes.Buffer
	for i, g := range res2.Graphs {
		if g.ID() != res.Graphs[i].ID() {
			t.Fatalf("graph %d changed in the round trip: %v -> %v", i+1, res.Graphs[i], g)
		}
		if err := write(&again, g); err != nil {
			t.Fatal(err)
		}
	}
	if !bytes.Equal(again.Bytes(), out.Bytes()) {
		t.Fatalf("writing is not byte-stable:\n%q\n%q", out.Bytes(), again.Bytes())
	}
}

// ioFuzzLimit keeps declared vertex counts small while fuzzing.
func ioFuzzLimit(f *testing.F) {
	old := maxVertices
	maxVertices = 1 << 12
	f.Cleanup(func() { maxVertices = old })
}

func FuzzReadEdgeList(f *testing.F) {
	ioFuzzLimit(f)
	ioFuzzSeeds(f, ".edges")
	f.Add([]byte("1 2\n2 3\n4\n# c\n007 7\nx y % z\r\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		ioFuzzRoundTrip(t, data, FormatEdgeList, func(b *bytes.Buffer, g *Graph) error { return WriteEdgeList(b, g) })
	})
}

func FuzzReadDIMACS(f *testing.F) {
	ioFuzzLimit(f)
	ioFuzzSeeds(f, ".dimacs")
	f.Add([]byte("c x\np edge 4 3\ne 1 2\ne 2 1\nn 3 5\ne 3 4\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		ioFuzzRoundTrip(t, data, FormatDIMACS, func(b *bytes.Buffer, g *Graph) error { return WriteDIMACS(b, g) })
	})
}

func FuzzReadGraph6(f *testing.F) {
	ioFuzzLimit(f)
	ioFuzzSeeds(f, ".g6", ".d6")
	f.Add([]byte(">>graph6<<DQc\nC~\nD~{\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		ioFuzzRoundTrip(t, data, FormatGraph6, func(b *bytes.Buffer, g *Graph) error { return WriteGraph6(b, g) })
	})
}

func FuzzReadSparse6(f *testing.F) {
	ioFuzzLimit(f)
	ioFuzzSeeds(f, ".s6")
	f.Add([]byte(">>sparse6<<:Fa@x^\n:CoJ\n:~?@?_~\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		ioFuzzRoundTrip(t, data, FormatSparse6, func(b *bytes.Buffer, g *Graph) error { return WriteSparse6(b, g) })
	})
}
