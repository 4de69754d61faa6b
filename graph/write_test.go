package graph

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// ioWrite writes g with one of the writers.
func ioWrite(t testing.TB, f Format, g *Graph) []byte {
	t.Helper()
	var buf bytes.Buffer
	var err error
	switch f {
	case FormatEdgeList:
		err = WriteEdgeList(&buf, g)
	case FormatDIMACS:
		err = WriteDIMACS(&buf, g)
	case FormatGraph6:
		err = WriteGraph6(&buf, g)
	case FormatSparse6:
		err = WriteSparse6(&buf, g)
	}
	if err != nil {
		t.Fatalf("writing %v as %v: %v", g, f, err)
	}
	return buf.Bytes()
}

// TestRoundTripRandom writes random graphs in every format, reads them back
// (with and without auto-detection) and checks the identity and that a
// second write gives the same bytes. The round trip is common practice, no source.
func TestRoundTripRandom(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for trial := 0; trial < 100; trial++ {
		n := r.IntN(70)
		if trial%25 == 0 {
			n = 200 + r.IntN(200)
		}
		p := r.Float64()
		if r.IntN(2) == 0 {
			p *= 0.05
		}
		for _, f := range []Format{FormatEdgeList, FormatDIMACS, FormatGraph6, FormatSparse6} {
			base := 0
			if f == FormatDIMACS {
				base = 1
			}
			g := ioRandom(r, n, p, base)
			out := ioWrite(t, f, g)
			for _, rf := range []Format{f, FormatAuto} {
				res, err := Read(bytes.NewReader(out), "rt", rf)
				if err != nil {
					t.Fatalf("trial %d %v (read as %v): %v\n%s", trial, f, rf, err, out)
				}
				if len(res.Graphs) != 1 || res.Graphs[0].ID() != g.ID() {
					t.Fatalf("trial %d %v (read as %v): graph changed: %v -> %v", trial, f, rf, g, res.Graphs[0])
				}
				if rf == FormatAuto && res.Format != f {
					t.Errorf("trial %d: %v output detected as %v", trial, f, res.Format)
				}
				if again := ioWrite(t, f, res.Graphs[0]); !bytes.Equal(again, out) {
					t.Fatalf("trial %d %v: second write differs", trial, f)
				}
			}
		}
	}
}

// TestEdgeListForms covers the edge-list rules of the format: comments,
// isolated vertices, repeated edges, labels of every kind, and the switch
// from the numeric fast path to general labels in the middle of a file.
func TestEdgeListForms(t *testing.T) {
	src := "# header\n" +
		"1 2\n" +
		"  3\t4  \r\n" +
		"2 1\n" + // repeated edge, reversed
		"5 % isolated\n" +
		"007 7\n" + // "007" is a label of its own, not 7
		"16777216 1\n" + // beyond the numeric fast path
		"x y # comment\n" +
		"y 1\n" +
		"4 3"
	res := ioRead(t, src, FormatEdgeList)
	g := res.Graphs[0]
	wantLabels := []string{"1", "2", "3", "4", "5", "7", "16777216", "007", "x", "y"}
	if !slices.Equal(g.Labels(), wantLabels) {
		t.Errorf("labels %q, want %q", g.Labels(), wantLabels)
	}
	wantEdges := [][2]string{{"1", "2"}, {"1", "16777216"}, {"1", "y"}, {"3", "4"}, {"7", "007"}, {"x", "y"}}
	if !slices.Equal(ioEdges(g), wantEdges) {
		t.Errorf("edges %q, want %q", ioEdges(g), wantEdges)
	}
	if len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], "2 repeated edge(s) merged") {
		t.Errorf("warnings %q, want one about 2 merged edges", res.Warnings)
	}
	// The same graph given in another order has the same identity.
	other := ioRead(t, "y x\n4 3\n1 y\n5\n16777216 1\n7 007\n2 1\n", FormatEdgeList).Graphs[0]
	if other.ID() != g.ID() {
		t.Error("the identity depends on the input order")
	}
	// Purely numeric input through the fast path, with an isolated vertex.
	num := ioRead(t, "10 2\n2 30\n40\n", FormatEdgeList).Graphs[0]
	if !slices.Equal(num.Labels(), []string{"2", "10", "30", "40"}) || !slices.Equal(ioEdges(num), [][2]string{{"2", "10"}, {"2", "30"}}) {
		t.Errorf("numeric input: labels %q edges %q", num.Labels(), ioEdges(num))
	}
	// Self-loops are an error with the column of the second label, in both paths.
	for _, c := range []struct{ src, want string }{
		{"1 2\n 3 3\n", "t:2:4: self-loop at vertex \"3\""},
		{"a b\nc  c\n", "t:2:4: self-loop at vertex \"c\""},
		{"1 2\n3 3 # c\n", "t:2:3: self-loop at vertex \"3\""},
		{"1 2 3\n", "t:1:5: expected one or two vertex labels, found more"},
	} {
		_, err := Read(strings.NewReader(c.src), "t", FormatEdgeList)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("%q: error %v, want %q", c.src, err, c.want)
		}
	}
}

// TestEdgeListFastPathMatchesBuilder compares the numeric fast path with the
// general Builder on random numeric inputs with repeats and isolated lines.
func TestEdgeListFastPathMatchesBuilder(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	for trial := 0; trial < 40; trial++ {
		var sb strings.Builder
		b := NewBuilder()
		n := 1 + r.IntN(200000)
		for i := r.IntN(3000); i > 0; i-- {
			u := r.IntN(n)
			if r.IntN(20) == 0 {
				fmt.Fprintf(&sb, "%d\n", u)
				b.Vertex(strconv.Itoa(u))
				continue
			}
			v := r.IntN(n)
			if u == v {
				continue
			}
			fmt.Fprintf(&sb, "%d %d\n", u, v)
			_ = b.AddEdge(b.Vertex(strconv.Itoa(u)), b.Vertex(strconv.Itoa(v)))
		}
		want, rep := b.Build()
		res := ioRead(t, sb.String(), FormatEdgeList)
		if res.Graphs[0].ID() != want.ID() || (rep.Duplicates > 0) != (len(res.Warnings) > 0) {
			t.Fatalf("trial %d: fast path gives %v (warnings %q), builder %v (%d repeats)", trial, res.Graphs[0], res.Warnings, want, rep.Duplicates)
		}
	}
}

// TestEdgeListLongInput crosses the reader's chunk boundaries.
func TestEdgeListLongInput(t *testing.T) {
	in := ioEdgeListInput(5000, 300000)
	g := ioRead(t, string(in)+"a b\n", FormatEdgeList).Graphs[0]
	h := ioRead(t, string(in), FormatEdgeList).Graphs[0]
	if g.N() != h.N()+2 || g.M() != h.M()+1 {
		t.Errorf("with a labelled edge at the end: %v, without: %v", g, h)
	}
	if _, err := Read(strings.NewReader(strings.Repeat("a", 1<<21)), "long", FormatEdgeList); err == nil || !strings.Contains(err.Error(), "long:1: line longer than 1 MiB") {
		t.Errorf("a 2 MiB line: error %v", err)
	}
}

func TestWriteEdgeListForm(t *testing.T) {
	b := NewBuilder()
	b.Vertex("zeta")
	b.Vertex("3")
	_ = b.AddEdge(b.Vertex("b"), b.Vertex("a"))
	_ = b.AddEdge(b.Vertex("10"), b.Vertex("a"))
	g, _ := b.Build()
	got := string(ioWrite(t, FormatEdgeList, g))
	want := "3\nzeta\n10 a\na b\n"
	if got != want {
		t.Errorf("edge list:\n%s\nwant:\n%s", got, want)
	}
	for _, bad := range []string{"a b", "x#1", "50%", "tab\there", ""} {
		b := NewBuilder()
		b.Vertex(bad)
		g, _ := b.Build()
		if err := WriteEdgeList(&bytes.Buffer{}, g); !errors.Is(err, ErrUnwritableLabels) {
			t.Errorf("label %q: error %v, want ErrUnwritableLabels", bad, err)
		}
	}
}

func TestWriteNumberedFormatsNeedNumberedLabels(t *testing.T) {
	g0, _ := NewNumbered(3, 0, [][2]int{{0, 1}})
	g1, _ := NewNumbered(3, 1, [][2]int{{0, 1}})
	if got := string(ioWrite(t, FormatDIMACS, g1)); got != "p edge 3 1\ne 1 2\n" {
		t.Errorf("DIMACS: %q", got)
	}
	if got := string(ioWrite(t, FormatGraph6, g0)); got != "B_\n" {
		t.Errorf("graph6 of n=3 {0-1}: %q, want \"B_\" (bit (0,1) set: 100000 = 32+63)", got)
	}
	var buf bytes.Buffer
	for _, c := range []struct {
		name string
		err  error
	}{
		{"DIMACS of labels 0..2", WriteDIMACS(&buf, g0)},
		{"graph6 of labels 1..3", WriteGraph6(&buf, g1)},
		{"sparse6 of labels 1..3", WriteSparse6(&buf, g1)},
	} {
		if !errors.Is(c.err, ErrUnwritableLabels) {
			t.Errorf("%s: error %v, want ErrUnwritableLabels", c.name, c.err)
		}
	}
	// Append* drop labels: g1 encodes like g0.
	if !bytes.Equal(AppendGraph6(nil, g1), AppendGraph6(nil, g0)) || !bytes.Equal(AppendSparse6(nil, g1), AppendSparse6(nil, g0)) {
		t.Error("AppendGraph6/AppendSparse6 depend on labels")
	}
}
