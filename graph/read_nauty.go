package graph

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"strconv"

	"spinecert.dev/textpos"
)

// graph6 and sparse6 as described by B. D. McKay, "Description of graph6,
// sparse6 and digraph6 encodings" (formats.txt, distributed with nauty).
// Vertices are numbered from 0 there; spinecert labels them "0".."n-1".

const (
	graph6Header  = ">>graph6<<"
	sparse6Header = ">>sparse6<<"
	// maxNautyLine bounds one graph6/sparse6 line held in memory.
	maxNautyLine = 1 << 30
)

// maxVertices is the largest vertex count a header (graph6/sparse6 N(n),
// DIMACS p line) may declare: all vertices are allocated up front, so a tiny
// file could otherwise ask for terabytes. Tests lower it for fuzzing.
var maxVertices = 1 << 26

// lineReader hands out whole lines of any length, without the end of line.
type lineReader struct {
	br   *bufio.Reader
	buf  []byte
	line int
	max  int
	n    int64 // bytes read so far
}

// next returns the next line, or io.EOF after the last one.
func (lr *lineReader) next() ([]byte, error) {
	lr.buf = lr.buf[:0]
	for {
		chunk, err := lr.br.ReadSlice('\n')
		lr.n += int64(len(chunk))
		if err == bufio.ErrBufferFull {
			if len(lr.buf)+len(chunk) > lr.max {
				return nil, fmt.Errorf("line longer than %d bytes", lr.max)
			}
			lr.buf = append(lr.buf, chunk...)
			continue
		}
		if err != nil && err != io.EOF {
			return nil, err
		}
		if len(chunk) == 0 && len(lr.buf) == 0 && err == io.EOF {
			return nil, io.EOF
		}
		var l []byte
		if len(lr.buf) == 0 {
			l = chunk
		} else {
			lr.buf = append(lr.buf, chunk...)
			l = lr.buf
		}
		lr.line++
		l = bytes.TrimSuffix(l, []byte("\n"))
		l = bytes.TrimSuffix(l, []byte("\r"))
		return l, nil
	}
}

// readNauty reads graph6 and sparse6 lines, one graph per line, in file
// order. The kind of each line is told by its first byte (':' sparse6, else
// graph6), as in nauty; a >>graph6<< or >>sparse6<< header may open the file
// or any line and must then agree with the line.
func readNauty(br *bufio.Reader, name string, f Format, res *ReadResult) ([]*Graph, error) {
	lr := &lineReader{br: br, max: maxNautyLine}
	var graphs []*Graph
	for {
		l, err := lr.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, &textpos.Error{File: name, Line: lr.line + 1, Msg: err.Error()}
		}
		g, warn, perr := parseNautyLine(l)
		if perr != nil {
			perr.File, perr.Line = name, lr.line
			return nil, perr
		}
		if g == nil { // a header alone on its line
			continue
		}
		if warn != "" {
			res.Warnings = append(res.Warnings, fmt.Sprintf("%s:%d: %s", name, lr.line, warn))
		}
		graphs = append(graphs, g)
	}
	return graphs, nil
}

// parseNautyLine decodes one line. It returns a nil graph and nil error for a
// line holding only a header. The error's File and Line are left to the caller.
func parseNautyLine(l []byte) (*Graph, string, *textpos.Error) {
	col := 1
	want := byte(0)
	switch {
	case bytes.HasPrefix(l, []byte(graph6Header)):
		l, col, want = l[len(graph6Header):], col+len(graph6Header), 'g'
	case bytes.HasPrefix(l, []byte(sparse6Header)):
		l, col, want = l[len(sparse6Header):], col+len(sparse6Header), 's'
	case bytes.HasPrefix(l, []byte(">>digraph6<<")):
		return nil, "", &textpos.Error{Col: 1, Msg: "digraph6 is not supported: spinecert graphs are undirected"}
	}
	if len(l) == 0 {
		if want != 0 {
			return nil, "", nil
		}
		return nil, "", &textpos.Error{Col: 1, Msg: "empty line: expected a graph6 or sparse6 graph"}
	}
	switch l[0] {
	case ':':
		if want == 'g' {
			return nil, "", &textpos.Error{Col: col, Msg: "sparse6 graph (':') after a >>graph6<< header"}
		}
		g, warn, err := parseSparse6(l[1:], col+1)
		return g, warn, err
	case ';':
		return nil, "", &textpos.Error{Col: col, Msg: "incremental sparse6 (a line starting with ';') is not supported: write plain sparse6 (':') instead"}
	case '&':
		return nil, "", &textpos.Error{Col: col, Msg: "digraph6 ('&') is not supported: spinecert graphs are undirected"}
	}
	if want == 's' {
		return nil, "", &textpos.Error{Col: col, Msg: "expected a sparse6 graph starting with ':' after a >>sparse6<< header"}
	}
	g, err := parseGraph6(l, col)
	return g, "", err
}

// decodeN reads N(n) from the start of b and returns n and its width in bytes.
// Only the shortest form formats.txt allows for n is accepted.
func decodeN(b []byte, col int) (uint64, int, *textpos.Error) {
	for i, c := range b {
		if c < 63 || c > 126 {
			return 0, 0, badByte(c, col+i)
		}
		if i >= 7 {
			break
		}
	}
	if len(b) == 0 {
		return 0, 0, &textpos.Error{Col: col, Msg: "expected the vertex count N(n)"}
	}
	if b[0] != 126 {
		return uint64(b[0] - 63), 1, nil
	}
	width, lo := 4, uint64(63)
	if len(b) > 1 && b[1] == 126 {
		width, lo = 8, 258048
	}
	if len(b) < width {
		return 0, 0, &textpos.Error{Col: col, Msg: fmt.Sprintf("truncated vertex count: the long form N(n) takes %d bytes, found %d", width, len(b))}
	}
	var n uint64
	start := 1
	if width == 8 {
		start = 2
	}
	for _, c := range b[start:width] {
		n = n<<6 | uint64(c-63)
	}
	if n < lo {
		return 0, 0, &textpos.Error{Col: col, Msg: fmt.Sprintf("vertex count %d written in a %d-byte N(n); formats.txt uses that form only for n >= %d", n, width, lo)}
	}
	return n, width, nil
}

func badByte(c byte, col int) *textpos.Error {
	return &textpos.Error{Col: col, Msg: fmt.Sprintf("unexpected byte %s: graph6/sparse6 data bytes are 63..126 ('?'..'~')", strconv.QuoteRune(rune(c)))}
}

// checkVertices rejects vertex counts too large to hold.
func checkVertices(n uint64, col int) *textpos.Error {
	if n > uint64(maxVertices) {
		return &textpos.Error{Col: col, Msg: fmt.Sprintf("graph has %d vertices; spinecert reads at most %d", n, maxVertices)}
	}
	return nil
}

// Formats in which an isolated vertex takes no room (sparse6, DIMACS) may
// declare at most verticesPerByte vertices per byte of the input plus
// verticesGrace: memory then follows what the file holds, not what its
// header claims.
const (
	verticesPerByte = 64
	verticesGrace   = 1 << 20
)

// verticesFor is the most vertices an input of size bytes may declare.
func verticesFor(size int64) uint64 {
	return uint64(verticesPerByte)*uint64(max(size, 0)) + verticesGrace
}

// checkDeclared rejects a vertex count out of proportion to the input of
// size bytes that declares it; what names that input ("line", "file").
func checkDeclared(n uint64, size int64, what string, col int) *textpos.Error {
	if lim := verticesFor(size); n > lim {
		return &textpos.Error{Col: col, Msg: fmt.Sprintf("graph declares %d vertices in a %s of %d bytes; spinecert reads at most %d vertices per byte plus %d (here %d), as isolated vertices take no room in this format", n, what, size, verticesPerByte, verticesGrace, lim)}
	}
	return nil
}

// graph6DataLen is the number of bytes R(x) takes for n vertices.
func graph6DataLen(n uint64) uint64 { return (n*(n-1)/2 + 5) / 6 }

// isGraph6Line reports whether t is a well-formed graph6 string: every byte in
// 63..126 and the length exactly that of N(n) followed by ceil(n(n-1)/2 / 6) bytes.
func isGraph6Line(t []byte) bool {
	for _, c := range t {
		if c < 63 || c > 126 {
			return false
		}
	}
	n, w, err := decodeN(t, 1)
	if err != nil || n > 1<<32 {
		return false
	}
	if n == 0 {
		return len(t) == w
	}
	return uint64(len(t)-w) == graph6DataLen(n)
}

// isGraph6Prefix reports whether t could be the start of a graph6 string.
func isGraph6Prefix(t []byte) bool {
	for _, c := range t {
		if c < 63 || c > 126 {
			return false
		}
	}
	n, w, err := decodeN(t, 1)
	if err != nil || n > 1<<32 {
		return false
	}
	return n > 0 && uint64(len(t)-w) <= graph6DataLen(n)
}

// parseGraph6 decodes N(n) R(x), x the upper triangle of the adjacency
// matrix in the order (0,1),(0,2),(1,2),(0,3),... with zero padding bits.
func parseGraph6(b []byte, col int) (*Graph, *textpos.Error) {
	n, w, err := decodeN(b, col)
	if err != nil {
		return nil, err
	}
	if err := checkVertices(n, col); err != nil {
		return nil, err
	}
	data := b[w:]
	need := uint64(0)
	if n > 1 {
		need = graph6DataLen(n)
	}
	if uint64(len(data)) != need {
		if uint64(len(data)) < need {
			return nil, &textpos.Error{Col: col + len(b), Msg: fmt.Sprintf("truncated graph6: n = %d needs %d data bytes after N(n), found %d", n, need, len(data))}
		}
		return nil, &textpos.Error{Col: col + w + int(need), Msg: fmt.Sprintf("graph6 too long: n = %d needs %d data bytes after N(n), found %d", n, need, len(data))}
	}
	var pairs []uint64
	i, j := uint64(0), uint64(1)
	bits := n * (n - 1) / 2
	if n < 2 {
		bits = 0
	}
	for k, c := range data {
		if c < 63 || c > 126 {
			return nil, badByte(c, col+w+k)
		}
		x := c - 63
		base := uint64(k) * 6
		for t := uint64(0); t < 6; t++ {
			bit := x >> (5 - t) & 1
			if base+t >= bits {
				if bit != 0 {
					return nil, &textpos.Error{Col: col + w + k, Msg: "graph6 padding bits must be zero"}
				}
				continue
			}
			if bit != 0 {
				pairs = append(pairs, i<<32|j)
			}
			if i++; i == j {
				i, j = 0, j+1
			}
		}
	}
	g, _ := numberedGraph(int(n), 0, pairs)
	return g, nil
}

// sparse6Bits returns k, the number of bits needed to write n-1 in binary.
func sparse6Bits(n uint64) uint {
	k := uint(0)
	for v := n - 1; n > 1 && v > 0; v >>= 1 {
		k++
	}
	return k
}

// parseSparse6 decodes the part after ':' per formats.txt: a sequence of
// (b, x) pairs, b one bit and x k bits, read with v = 0 as: if b = 1 then
// v++; if x > v then v = x else {x, v} is an edge. The padding (at most
// five bits) may carry v or x past n-1; such pairs are ignored, as the
// decoder in nauty does, but a pair that starts before the last five bits
// and names a vertex beyond n-1 is an error. An incomplete pair at the end
// is discarded. Repeated edges are merged and reported in the warning.
func parseSparse6(b []byte, col int) (*Graph, string, *textpos.Error) {
	n, w, err := decodeN(b, col)
	if err != nil {
		return nil, "", err
	}
	if err := checkVertices(n, col); err != nil {
		return nil, "", err
	}
	if err := checkDeclared(n, int64(len(b)+1), "sparse6 line", col); err != nil {
		return nil, "", err
	}
	data := b[w:]
	for i, c := range data {
		if c < 63 || c > 126 {
			return nil, "", badByte(c, col+w+i)
		}
	}
	k := sparse6Bits(n)
	total := uint64(len(data)) * 6
	bitAt := func(p uint64) uint64 { return uint64(data[p/6]-63) >> (5 - p%6) & 1 }
	var pairs []uint64
	v := uint64(0)
	for p := uint64(0); p+1+uint64(k) <= total; {
		start := p
		bb := bitAt(p)
		p++
		x := uint64(0)
		for t := uint(0); t < k; t++ {
			x = x<<1 | bitAt(p)
			p++
		}
		if bb == 1 {
			v++
		}
		if (v >= n || x >= n) && start+5 < total {
			return nil, "", &textpos.Error{Col: col + w + int(start/6), Msg: fmt.Sprintf("sparse6 names vertex %d, beyond n-1 = %d, before the final padding", max(v, x), int64(n)-1)}
		}
		if x > v {
			v = x
			continue
		}
		if v >= n {
			continue // padding
		}
		if x == v {
			return nil, "", &textpos.Error{Col: col + w + int(start/6), Msg: fmt.Sprintf("self-loop at vertex %d (spinecert graphs are simple)", v)}
		}
		pairs = append(pairs, x<<32|v)
	}
	g, rep := numberedGraph(int(n), 0, pairs)
	warn := ""
	if rep.Duplicates > 0 {
		warn = duplicateWarnings("sparse6", rep)[0]
	}
	return g, warn, nil
}

// numberedGraph builds the graph on vertices labelled base..base+n-1 from
// index pairs u<<32|v with u < v < n, merging repeats. Decimal labels in
// increasing order are already in canonical order, so no label sort is needed.
func numberedGraph(n, base int, pairs []uint64) (*Graph, BuildReport) {
	edges, rep := edgesFromPairs(pairs, n, func(v int32) string { return strconv.Itoa(base + int(v)) })
	return newNumberedGraph(n, base, edges), rep
}
