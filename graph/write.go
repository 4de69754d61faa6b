package graph

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// WriteEdgeList writes g in spinecert's canonical edge-list form: first every
// isolated vertex on a line of its own, in vertex order, then every edge as
// "u v" in the order of g.Edges(). Reading the output back gives a graph
// with the same ID. A label that is empty or holds whitespace, '#' or '%'
// cannot be written and makes it return an error wrapping ErrUnwritableLabels.
func WriteEdgeList(w io.Writer, g *Graph) error {
	labels := g.Labels()
	for _, l := range labels {
		if l == "" || strings.ContainsAny(l, " \t\r\n\v\f#%") {
			return fmt.Errorf("%w: label %q cannot be written in an edge list (empty, or holds whitespace, '#' or '%%')", ErrUnwritableLabels, l)
		}
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	touched := make([]bool, g.n)
	for _, e := range g.edges {
		touched[e.U], touched[e.V] = true, true
	}
	for v, t := range touched {
		if !t {
			bw.WriteString(labels[v])
			bw.WriteByte('\n')
		}
	}
	for _, e := range g.edges {
		bw.WriteString(labels[e.U])
		bw.WriteByte(' ')
		bw.WriteString(labels[e.V])
		bw.WriteByte('\n')
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("graph: %w", err)
	}
	return nil
}

// checkNumbered reports whether vertex v is labelled base+v for every v.
func checkNumbered(g *Graph, base int, format string) error {
	if g.numbered && g.base == base {
		return nil
	}
	var buf []byte
	for v, l := range g.Labels() {
		buf = strconv.AppendInt(buf[:0], int64(base+v), 10)
		if l != string(buf) {
			return fmt.Errorf("%w: %s needs vertices labelled %d..%d, vertex %d is labelled %q",
				ErrUnwritableLabels, format, base, base+g.n-1, v, l)
		}
	}
	return nil
}

// WriteDIMACS writes g in the DIMACS graph format ("p edge N M" then one
// "e U V" line per edge in the order of g.Edges()). The format numbers
// vertices 1..N and keeps no other labels, so g's labels must be exactly
// "1".."N"; otherwise it returns an error wrapping ErrUnwritableLabels.
func WriteDIMACS(w io.Writer, g *Graph) error {
	if err := checkNumbered(g, 1, "the DIMACS graph format"); err != nil {
		return err
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	fmt.Fprintf(bw, "p edge %d %d\n", g.n, len(g.edges))
	var buf []byte
	for _, e := range g.edges {
		buf = append(buf[:0], 'e', ' ')
		buf = strconv.AppendInt(buf, int64(e.U)+1, 10)
		buf = append(buf, ' ')
		buf = strconv.AppendInt(buf, int64(e.V)+1, 10)
		buf = append(buf, '\n')
		bw.Write(buf)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("graph: %w", err)
	}
	return nil
}

// WriteGraph6 writes g as one graph6 line (without header) followed by a
// newline. graph6 keeps no labels: vertex i of g becomes vertex i of the
// encoding, which readers label "i". So that reading the line back gives the
// same graph (the same ID), g's labels must be exactly "0".."n-1"; otherwise
// it returns an error wrapping ErrUnwritableLabels. AppendGraph6 encodes any
// graph, dropping its labels.
func WriteGraph6(w io.Writer, g *Graph) error {
	if err := checkNumbered(g, 0, "graph6"); err != nil {
		return err
	}
	return writeLine(w, AppendGraph6(nil, g))
}

// WriteSparse6 is WriteGraph6 for sparse6; AppendSparse6 encodes any graph,
// dropping its labels.
func WriteSparse6(w io.Writer, g *Graph) error {
	if err := checkNumbered(g, 0, "sparse6"); err != nil {
		return err
	}
	return writeLine(w, AppendSparse6(nil, g))
}

func writeLine(w io.Writer, b []byte) error {
	b = append(b, '\n')
	if _, err := w.Write(b); err != nil {
		return fmt.Errorf("graph: %w", err)
	}
	return nil
}

// appendN appends N(n) as formats.txt defines it.
func appendN(dst []byte, n uint64) []byte {
	switch {
	case n <= 62:
		return append(dst, byte(n)+63)
	case n <= 258047:
		return append(dst, 126, byte(n>>12)+63, byte(n>>6&63)+63, byte(n&63)+63)
	}
	dst = append(dst, 126, 126)
	for s := 30; s >= 0; s -= 6 {
		dst = append(dst, byte(n>>uint(s)&63)+63)
	}
	return dst
}

// AppendGraph6 appends the graph6 encoding of g (vertices in g's order,
// labels dropped, no header, no newline) to dst.
func AppendGraph6(dst []byte, g *Graph) []byte {
	n := uint64(g.n)
	dst = appendN(dst, n)
	if n < 2 {
		return dst
	}
	data := make([]byte, graph6DataLen(n))
	for _, e := range g.edges {
		k := uint64(e.V)*(uint64(e.V)-1)/2 + uint64(e.U)
		data[k/6] |= 1 << (5 - k%6)
	}
	for i := range data {
		data[i] += 63
	}
	return append(dst, data...)
}

// bitWriter packs bits six at a time into graph6/sparse6 bytes.
type bitWriter struct {
	dst  []byte
	acc  byte
	nacc uint
}

func (bw *bitWriter) bits(x uint64, k uint) {
	for k > 0 {
		k--
		bw.acc = bw.acc<<1 | byte(x>>k&1)
		if bw.nacc++; bw.nacc == 6 {
			bw.dst = append(bw.dst, bw.acc+63)
			bw.acc, bw.nacc = 0, 0
		}
	}
}

// AppendSparse6 appends the sparse6 encoding of g (':' then N(n) and the
// edges, vertices in g's order, labels dropped, no header, no newline) to
// dst. Edges are written by increasing larger end, then smaller end, and the
// last byte is padded with 1-bits, or with a 0-bit and 1-bits in the special
// case formats.txt names (n a power of two up to 16, vertex n-2 the largest
// with an edge, and at least k+1 bits to pad), so the output matches nauty's.
func AppendSparse6(dst []byte, g *Graph) []byte {
	n := uint64(g.n)
	dst = appendN(append(dst, ':'), n)
	k := sparse6Bits(n)
	keys := make([]uint64, len(g.edges))
	for i, e := range g.edges {
		keys[i] = uint64(e.V)<<32 | uint64(e.U)
	}
	radixSort64(keys, int(n))
	bw := &bitWriter{dst: dst}
	last := uint64(0)
	for _, key := range keys {
		i, j := key&0xffffffff, key>>32
		switch {
		case j == last:
			bw.bits(0, 1)
		case j == last+1:
			bw.bits(1, 1)
		default:
			bw.bits(1, 1)
			bw.bits(j, k)
			bw.bits(0, 1)
		}
		last = j
		bw.bits(i, k)
	}
	if bw.nacc > 0 {
		pad := 6 - bw.nacc
		if pad >= k+1 && last == n-2 && n == 1<<k {
			bw.bits(0, 1)
			pad--
		}
		bw.bits(1<<pad-1, pad)
	}
	return bw.dst
}
