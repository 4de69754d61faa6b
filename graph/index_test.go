package graph

import (
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"fmt"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// TestIndex looks up every label of graphs whose labels start with a run of
// consecutive numbers (found by computation) followed by other labels (found
// in a map), and labels that are not vertices.
func TestIndex(t *testing.T) {
	cases := []struct {
		labels []string
		absent []string
	}{
		{[]string{"0", "1", "2", "3"}, []string{"4", "-1", "01", "00", "", "a"}},
		{[]string{"7", "8", "9", "10"}, []string{"6", "11", "0", "07", "+8"}},
		{[]string{"0", "1", "2", "5", "12", "a", "b c", ""}, []string{"3", "4", "6", "13", "A", "02"}},
		{[]string{"x", "y"}, []string{"0", "1", "z"}},
		{[]string{"3", "999999999999999999", "9999999999999999999"}, []string{"4", "99999999999999999999"}},
		{nil, []string{"0", ""}},
	}
	for _, c := range cases {
		b := NewBuilder()
		for _, l := range c.labels {
			b.Vertex(l)
		}
		g, _ := b.Build()
		for v, l := range g.Labels() {
			if got, ok := g.Index(l); !ok || got != int32(v) {
				t.Errorf("labels %q: Index(%q) = %d, %v; want %d, true", c.labels, l, got, ok, v)
			}
		}
		for _, l := range c.absent {
			if got, ok := g.Index(l); ok {
				t.Errorf("labels %q: Index(%q) = %d, true; want false", c.labels, l, got)
			}
		}
		for k := -2; k < 30; k++ {
			want, wok := g.Index(strconv.Itoa(k))
			if got, ok := g.IndexNumber(k); ok != wok || (ok && got != want) {
				t.Errorf("labels %q: IndexNumber(%d) = %d, %v; want %d, %v", c.labels, k, got, ok, want, wok)
			}
		}
	}
}

// TestNumberedGraphs checks the graphs whose decimal labels are made only
// when asked for: their labels, Index, IndexNumber and ID are those of the
// same graph built from label strings.
func TestNumberedGraphs(t *testing.T) {
	for _, c := range []struct{ n, base int }{{0, 0}, {1, 0}, {12, 0}, {11, 1}, {120, 95}, {3, 999998}} {
		var in strings.Builder
		b := NewBuilder()
		for v := 0; v < c.n; v++ {
			fmt.Fprintf(&in, "%d %d\n", c.base+v, c.base+(v+1)%c.n)
			b.Vertex(strconv.Itoa(c.base + v))
		}
		for v := 0; v < c.n; v++ {
			if u, w := int32(v), int32((v+1)%c.n); u != w {
				_ = b.AddEdge(u, w)
			}
		}
		want, _ := b.Build()
		if c.n == 1 {
			in.Reset()
			in.WriteString(strconv.Itoa(c.base) + "\n")
		}
		res, err := Read(strings.NewReader(in.String()), "n.edges", FormatEdgeList)
		if err != nil {
			t.Fatal(err)
		}
		g := res.Graphs[0]
		if !g.numbered {
			t.Fatalf("%+v: not read as a numbered graph", c)
		}
		if g.ID() != want.ID() {
			t.Errorf("%+v: identity differs from the built graph's", c)
		}
		for k := c.base - 2; k < c.base+c.n+2; k++ {
			w, wok := want.Index(strconv.Itoa(k))
			if v, ok := g.IndexNumber(k); ok != wok || v != w {
				t.Errorf("%+v: IndexNumber(%d) = %d, %v; want %d, %v", c, k, v, ok, w, wok)
			}
		}
		if !slices.Equal(g.Labels(), want.Labels()) || g.ID() != want.ID() {
			t.Errorf("%+v: labels %q, want %q", c, g.Labels(), want.Labels())
		}
	}
}

// TestIDBuffered compares ID with the identity written out directly from its
// definition (the tag, the number of labels, each label's length and bytes,
// the number of edges, each edge's two ends, all integers as 8 bytes big
// endian), for labels shorter and longer than ID's buffer.
func TestIDBuffered(t *testing.T) {
	long := strings.Repeat("x", 100<<10)
	b := NewBuilder()
	for _, l := range []string{"0", "1", "2", "a", long, "b"} {
		b.Vertex(l)
	}
	for i := int32(0); i < 5; i++ {
		_ = b.AddEdge(i, i+1)
	}
	g, _ := b.Build()
	var want bytes.Buffer
	put := func(x uint64) { _ = binary.Write(&want, binary.BigEndian, x) }
	want.WriteString(identityTag)
	put(uint64(g.N()))
	for _, l := range g.Labels() {
		put(uint64(len(l)))
		want.WriteString(l)
	}
	put(uint64(g.M()))
	for _, e := range g.Edges() {
		put(uint64(e.U))
		put(uint64(e.V))
	}
	sum := sha256.Sum256(want.Bytes())
	if got := g.ID(); got != hex.EncodeToString(sum[:]) {
		t.Errorf("ID() = %s, want %x", got, sum)
	}
}

// TestBuilderLabels reads the labels of a builder while vertices are still
// being added, numbers and other labels mixed, and builds the graph.
func TestBuilderLabels(t *testing.T) {
	b := NewBuilder()
	for _, l := range []string{"5", "x", "0", "", "12345678"} {
		b.Vertex(l)
	}
	if got, want := strings.Join(b.Labels(), ","), "5,x,0,,12345678"; got != want {
		t.Errorf("Labels() = %q, want %q", got, want)
	}
	b.Vertex("16777216") // FastNumbers: hashed, not a table entry
	b.Vertex("3")
	b.Vertex("x")
	if got, want := strings.Join(b.Labels(), ","), "5,x,0,,12345678,16777216,3"; got != want {
		t.Errorf("Labels() = %q, want %q", got, want)
	}
	if err := b.AddEdge(1, 1); err == nil || !strings.Contains(err.Error(), `"x"`) {
		t.Errorf("AddEdge(1, 1) = %v, want a self-loop at \"x\"", err)
	}
	if err := b.AddEdge(9, 9); err == nil {
		t.Error("AddEdge(9, 9) accepted an unknown vertex")
	}
	g, _ := b.Build()
	if got, want := strings.Join(g.Labels(), ","), "0,3,5,12345678,16777216,,x"; got != want {
		t.Errorf("built labels %q, want %q", got, want)
	}
}
