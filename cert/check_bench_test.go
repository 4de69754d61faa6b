package cert

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"testing"

	"spinecert.dev/graph"
)

// BenchmarkValidateComplete validates the ⌈n/2⌉-page layout of K_n
// (n = 1000: 499,500 edges, 500 pages) after it was read.
func BenchmarkValidateComplete(b *testing.B) {
	g, l := completeLayout(1000)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if !Validate(g, l).OK() {
			b.Fatal("rejected")
		}
	}
	b.ReportMetric(float64(g.M())*float64(b.N)/b.Elapsed().Seconds()/1e6, "Medges/s")
}

// BenchmarkReadLayoutJSON reads the layout file of K_1000.
func BenchmarkReadLayoutJSON(b *testing.B) {
	g, l := completeLayout(1000)
	var buf bytes.Buffer
	if err := WriteLayoutJSON(&buf, g, l); err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(buf.Len()))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := ReadLayoutJSON(bytes.NewReader(buf.Bytes()), "k.json"); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(g.M())*float64(b.N)/b.Elapsed().Seconds()/1e6, "Medges/s")
}

// BenchmarkCheckRaw matches a read layout with the graph and validates it.
func BenchmarkCheckRaw(b *testing.B) {
	g, l := completeLayout(1000)
	var buf bytes.Buffer
	if err := WriteLayoutJSON(&buf, g, l); err != nil {
		b.Fatal(err)
	}
	raw, err := ReadLayoutJSON(bytes.NewReader(buf.Bytes()), "k.json")
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if !Check(g, raw, CheckOptions{}).OK() {
			b.Fatal("rejected")
		}
	}
	b.ReportMetric(float64(g.M())*float64(b.N)/b.Elapsed().Seconds()/1e6, "Medges/s")
}

// fanFiles returns the edge list and the one-page layout file of the fan plus
// a path on n vertices (edges i–(i+1) and 0–i), as internal/benchgen -fan
// writes them.
func fanFiles(n int) (edges, layout []byte) {
	var g, l bytes.Buffer
	l.WriteString("{\"kind\":\"stack\",\"pages\":1,\n\"spine\":[")
	for v := 0; v < n; v++ {
		if v > 0 {
			l.WriteByte(',')
		}
		l.WriteString(strconv.Itoa(v))
	}
	l.WriteString("],\n\"edges\":[")
	first := true
	edge := func(a, b int) {
		fmt.Fprintf(&g, "%d %d\n", a, b)
		if !first {
			l.WriteByte(',')
		}
		first = false
		fmt.Fprintf(&l, "\n[%d,%d,1]", a, b)
	}
	for i := 0; i+1 < n; i++ {
		edge(i, i+1)
	}
	for i := 2; i < n; i++ {
		edge(0, i)
	}
	l.WriteString("]}\n")
	return g.Bytes(), l.Bytes()
}

// BenchmarkCheckFan is the whole work of spinecert check on the fan plus a
// path with 500,000 vertices (999,997 edges, one page): read the edge list
// and the layout, match them, validate, and compute the graph identity.
func BenchmarkCheckFan(b *testing.B) {
	edges, layout := fanFiles(500000)
	dir := b.TempDir()
	gpath, lpath := filepath.Join(dir, "fan.edges"), filepath.Join(dir, "fan.json")
	if os.WriteFile(gpath, edges, 0o666) != nil || os.WriteFile(lpath, layout, 0o666) != nil {
		b.Fatal("cannot write the input files")
	}
	b.ReportAllocs()
	b.ResetTimer()
	var m int
	for i := 0; i < b.N; i++ {
		res, err := graph.ReadFile(gpath, graph.FormatEdgeList)
		if err != nil {
			b.Fatal(err)
		}
		g := res.Graphs[0]
		raw, err := ReadLayoutFile(lpath)
		if err != nil {
			b.Fatal(err)
		}
		if !Check(g, raw, CheckOptions{}).OK() {
			b.Fatal("rejected")
		}
		if g.ID() == "" {
			b.Fatal("no identity")
		}
		m = g.M()
	}
	b.ReportMetric(float64(m)*float64(b.N)/b.Elapsed().Seconds()/1e6, "Medges/s")
}
