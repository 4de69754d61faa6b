package cert

import (
	"bytes"
	"testing"
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
