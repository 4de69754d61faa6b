package graph

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"spinecert.dev/textpos"
)

// Format is a graph file format.
type Format int

const (
	// FormatAuto detects the format from the content, with the extension as a hint.
	FormatAuto Format = iota
	// FormatEdgeList is one edge per line as two labels; one label declares a vertex.
	FormatEdgeList
	// FormatDIMACS is the DIMACS graph format (p edge N M, e U V, c comments).
	FormatDIMACS
	// FormatGraph6 is McKay's graph6, one graph per line.
	FormatGraph6
	// FormatSparse6 is McKay's sparse6, one graph per line.
	FormatSparse6
)

var formatNames = map[Format]string{
	FormatAuto: "auto", FormatEdgeList: "edgelist", FormatDIMACS: "dimacs",
	FormatGraph6: "graph6", FormatSparse6: "sparse6",
}

// String returns the format's name as used on the command line.
func (f Format) String() string {
	if s, ok := formatNames[f]; ok {
		return s
	}
	return fmt.Sprintf("format(%d)", int(f))
}

// ParseFormat parses a format name (auto, edgelist, dimacs, graph6, sparse6).
func ParseFormat(s string) (Format, error) {
	for f, n := range formatNames {
		if strings.EqualFold(s, n) {
			return f, nil
		}
	}
	return 0, fmt.Errorf("graph: unknown graph format %q (expected auto, edgelist, dimacs, graph6 or sparse6)", s)
}

// ReadResult is what a graph file held.
type ReadResult struct {
	Graphs   []*Graph
	Format   Format
	Warnings []string // for example repeated edges that were merged
}

// ReadFile reads the graphs in the file at path; "-" reads standard input.
func ReadFile(path string, f Format) (*ReadResult, error) {
	if path == "-" {
		return Read(os.Stdin, "<stdin>", f)
	}
	file, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("graph: %w", err)
	}
	defer file.Close()
	return Read(file, path, f)
}

// Read reads one or more graphs from r; name is used in messages and
// its extension as a format hint when f is FormatAuto.
func Read(r io.Reader, name string, f Format) (*ReadResult, error) {
	br := bufio.NewReaderSize(r, 1<<20)
	var warnings []string
	// A UTF-8 byte-order mark (some editors write one) is not part of the
	// first label: it would change the graph's identity unseen.
	if head, _ := br.Peek(len(utf8BOM)); bytes.Equal(head, utf8BOM) {
		_, _ = br.Discard(len(utf8BOM))
		warnings = append(warnings, fmt.Sprintf("%s: ignored the UTF-8 byte-order mark at the start of the file", name))
	}
	if f == FormatAuto {
		head, _ := br.Peek(detectPeek)
		f = DetectFormat(head, name)
	}
	res := &ReadResult{Format: f, Warnings: warnings}
	var err error
	switch f {
	case FormatEdgeList:
		var g *Graph
		g, err = readEdgeList(br, name, res)
		if g != nil {
			res.Graphs = []*Graph{g}
		}
	case FormatDIMACS:
		var g *Graph
		g, err = readDIMACSGraph(br, name, res)
		if g != nil {
			res.Graphs = []*Graph{g}
		}
	case FormatGraph6, FormatSparse6:
		res.Graphs, err = readNauty(br, name, f, res)
	default:
		return nil, fmt.Errorf("graph: %s: unknown graph format", name)
	}
	if err != nil {
		return nil, err
	}
	if len(res.Graphs) == 0 {
		return nil, &textpos.Error{File: name, Msg: "no graph found"}
	}
	return res, nil
}

// utf8BOM is the UTF-8 encoding of U+FEFF, the byte-order mark.
var utf8BOM = []byte{0xef, 0xbb, 0xbf}

// DetectFormat guesses the format of a file from its first bytes and name.
// A recognised extension (.g6 .graph6, .s6 .sparse6, .dimacs .col .clq,
// .edges .el) decides unless the content contradicts it; otherwise the
// content decides: a >>graph6<< or >>sparse6<< header, a line starting with
// ':' or ';' (sparse6), a digraph6 line ('&', given to the graph6 reader,
// which rejects it), DIMACS 'p edge'/'c' lines, a line that is a
// well-formed graph6 string (or, if it runs past the inspected head, could
// start one), else an edge list.
func DetectFormat(head []byte, name string) Format {
	content := detectContent(head)
	switch strings.ToLower(filepath.Ext(name)) {
	case ".g6", ".graph6":
		if content == FormatGraph6 || content == FormatAuto {
			return FormatGraph6
		}
	case ".s6", ".sparse6":
		if content == FormatSparse6 || content == FormatAuto {
			return FormatSparse6
		}
	case ".dimacs", ".col", ".clq":
		if content == FormatDIMACS || content == FormatAuto {
			return FormatDIMACS
		}
	case ".edges", ".el", ".edgelist":
		return FormatEdgeList
	}
	if content == FormatAuto {
		return FormatEdgeList
	}
	return content
}

// detectPeek is how much of a file Read shows DetectFormat. A head of
// this size may end inside a line (a graph6 line of a graph with more than
// about 360 vertices is longer), so its last unterminated line is only
// required to be a possible start of a graph6 string.
const detectPeek = 64 << 10

// detectContent returns the format the content shows, or FormatAuto.
func detectContent(head []byte) Format {
	cut := len(head) >= detectPeek
	switch {
	case bytes.HasPrefix(head, []byte(">>graph6<<")):
		return FormatGraph6
	case bytes.HasPrefix(head, []byte(">>sparse6<<")):
		return FormatSparse6
	}
	for len(head) > 0 {
		line := head
		last := false
		if i := bytes.IndexByte(head, '\n'); i >= 0 {
			line, head = head[:i], head[i+1:]
		} else {
			head, last = nil, true
		}
		line = bytes.TrimRight(line, "\r")
		t := bytes.TrimSpace(line)
		if len(t) == 0 || t[0] == '#' || t[0] == '%' {
			continue
		}
		switch {
		case t[0] == ':' || t[0] == ';':
			return FormatSparse6
		case t[0] == '&' && len(t) > 1 && bytes.IndexFunc(t[1:], func(r rune) bool { return r < 63 || r > 126 }) < 0:
			// digraph6: the graph6 reader explains that it is not supported
			return FormatGraph6
		case bytes.HasPrefix(t, []byte("p ")) || bytes.HasPrefix(t, []byte("p\t")):
			return FormatDIMACS
		case (t[0] == 'c' && (len(t) == 1 || t[1] == ' ' || t[1] == '\t')):
			// a DIMACS comment, or an edge list vertex named c: look further
			if looksDIMACS(head) {
				return FormatDIMACS
			}
			return FormatAuto
		case isGraph6Line(t), last && cut && isGraph6Prefix(t):
			return FormatGraph6
		}
		return FormatAuto
	}
	return FormatAuto
}

// looksDIMACS reports whether the remaining lines reach a 'p' line through 'c' lines only.
func looksDIMACS(rest []byte) bool {
	for _, line := range bytes.Split(rest, []byte("\n")) {
		t := bytes.TrimSpace(line)
		if len(t) == 0 {
			continue
		}
		if t[0] == 'p' && len(t) > 1 && (t[1] == ' ' || t[1] == '\t') {
			return true
		}
		if t[0] != 'c' || (len(t) > 1 && t[1] != ' ' && t[1] != '\t') {
			return false
		}
	}
	return false
}

// readEdgeList reads an edge list: one edge per line as two whitespace-separated
// labels, or one label for an isolated vertex; '#' and '%' start comments.
//
// While every label is a canonical decimal below edgeListFast, lines of the
// form "NUM NUM" are parsed in place from large chunks and the edges kept as
// pairs of numbers; the graph is then built without hashing or sorting
// labels. The first other label moves everything into a Builder.
func readEdgeList(br *bufio.Reader, name string, res *ReadResult) (*Graph, error) {
	st := &edgeListReader{name: name, maxv: -1}
	line := 0
	for {
		// Work on the reader's own buffer: no copy of the input is made.
		data, err := br.Peek(br.Size())
		eof := err == io.EOF
		if err != nil && !eof {
			return nil, &textpos.Error{File: name, Line: line + 1, Msg: err.Error()}
		}
		end := len(data)
		if !eof {
			end = bytes.LastIndexByte(data, '\n') + 1
			if end == 0 {
				return nil, &textpos.Error{File: name, Line: line + 1, Msg: "line longer than 1 MiB"}
			}
		}
		var perr error
		if line, perr = st.chunk(data[:end], line); perr != nil {
			return nil, perr
		}
		if eof {
			break
		}
		_, _ = br.Discard(end)
	}
	g, rep := st.build()
	res.Warnings = append(res.Warnings, duplicateWarnings(name, rep)...)
	return g, nil
}

// edgeListFast bounds the numeric labels of the fast edge-list path.
const edgeListFast = 1 << 24

// edgeListReader holds an edge list being read: numbers while b is nil,
// Builder vertices afterwards.
type edgeListReader struct {
	name    string
	b       *Builder
	pairs   []uint64   // u<<32|v label values, u < v, while b is nil: the current block
	full    [][]uint64 // earlier blocks of pairs
	cu, cv  []int32    // cu[x], cv[x]: pairs with smaller, larger value x
	singles []uint32   // labels of one-label lines while b is nil
	maxv    int
}

// fastNum parses a canonical decimal below edgeListFast at d[p].
func fastNum(d []byte, p int) (int, int, bool) {
	if p >= len(d) || d[p]-'0' > 9 {
		return 0, p, false
	}
	if d[p] == '0' {
		return 0, p + 1, p+1 == len(d) || d[p+1]-'0' > 9
	}
	v, q := 0, p
	for q < len(d) && d[q]-'0' <= 9 {
		if q-p == 8 {
			return 0, q, false
		}
		v = v*10 + int(d[q]-'0')
		q++
	}
	return v, q, v < edgeListFast
}

// chunk reads the complete lines in d; line is the number of lines before.
func (st *edgeListReader) chunk(d []byte, line int) (int, error) {
	for p := 0; p < len(d); {
		line++
		if st.b == nil {
			q := p
			for q < len(d) && (d[q] == ' ' || d[q] == '\t') {
				q++
			}
			u, q, ok := fastNum(d, q)
			if ok && q < len(d) && (d[q] == ' ' || d[q] == '\t') {
				for q < len(d) && (d[q] == ' ' || d[q] == '\t') {
					q++
				}
				vstart := q
				var v int
				v, q, ok = fastNum(d, q)
				for ok && q < len(d) && (d[q] == ' ' || d[q] == '\t' || d[q] == '\r') {
					q++
				}
				if ok && (q == len(d) || d[q] == '\n') {
					if u == v {
						return line, &textpos.Error{File: st.name, Line: line, Col: vstart - p + 1, Msg: fmt.Sprintf("self-loop at vertex %q (spinecert graphs are simple)", strconv.Itoa(u))}
					}
					st.addNum(u, v)
					p = q + 1
					continue
				}
			}
		}
		raw := d[p:]
		if i := bytes.IndexByte(raw, '\n'); i >= 0 {
			raw, p = raw[:i], p+i+1
		} else {
			p = len(d)
		}
		if err := st.general(raw, line); err != nil {
			return line, err
		}
	}
	return line, nil
}

// general reads one line of any form.
func (st *edgeListReader) general(raw []byte, line int) error {
	if i := bytes.IndexAny(raw, "#%"); i >= 0 {
		raw = raw[:i]
	}
	var tok [3][]byte
	var col [3]int
	nt := 0
	for i := 0; i < len(raw) && nt < 3; {
		for i < len(raw) && isSpace(raw[i]) {
			i++
		}
		if i == len(raw) {
			break
		}
		j := i
		for j < len(raw) && !isSpace(raw[j]) {
			j++
		}
		tok[nt], col[nt] = raw[i:j], i+1
		nt++
		i = j
	}
	if nt == 3 {
		return &textpos.Error{File: st.name, Line: line, Col: col[2], Msg: "expected one or two vertex labels, found more"}
	}
	if nt == 2 && bytes.Equal(tok[0], tok[1]) {
		return &textpos.Error{File: st.name, Line: line, Col: col[1], Msg: fmt.Sprintf("self-loop at vertex %q (spinecert graphs are simple)", tok[0])}
	}
	var num [2]int
	if st.b == nil {
		for k := 0; k < nt; k++ {
			v, q, ok := fastNum(tok[k], 0)
			if !ok || q != len(tok[k]) {
				st.toBuilder()
				break
			}
			num[k] = v
		}
	}
	switch {
	case nt == 0:
	case st.b != nil && nt == 1:
		st.b.VertexBytes(tok[0])
	case st.b != nil:
		_ = st.b.AddEdge(st.b.VertexBytes(tok[0]), st.b.VertexBytes(tok[1]))
	case nt == 1:
		st.maxv = max(st.maxv, num[0])
		st.singles = append(st.singles, uint32(num[0]))
	default:
		st.addNum(num[0], num[1])
	}
	return nil
}

// addNum adds the edge between the numeric labels u != v.
func (st *edgeListReader) addNum(u, v int) {
	if u > v {
		u, v = v, u
	}
	if v >= len(st.cu) {
		k := max(2*len(st.cu), v+1, 1024)
		st.cu = append(st.cu, make([]int32, k-len(st.cu))...)
		st.cv = append(st.cv, make([]int32, k-len(st.cv))...)
	}
	st.cu[u]++
	st.cv[v]++
	st.maxv = max(st.maxv, v)
	if len(st.pairs) == cap(st.pairs) {
		st.newBlock()
	}
	st.pairs = append(st.pairs, uint64(u)<<32|uint64(v))
}

// edgeBlock is the size of the blocks pairs are collected in: growing one
// slice by doubling would copy and fault in far more memory.
const edgeBlock = 1 << 16

// newBlock starts a new block of pairs.
func (st *edgeListReader) newBlock() {
	if len(st.pairs) > 0 {
		st.full = append(st.full, st.pairs)
	}
	st.pairs = make([]uint64, 0, edgeBlock)
}

// allPairs returns every pair collected, in one slice.
func (st *edgeListReader) allPairs() []uint64 {
	if len(st.full) == 0 {
		return st.pairs
	}
	m := len(st.pairs)
	for _, b := range st.full {
		m += len(b)
	}
	all := make([]uint64, 0, m)
	for i, b := range st.full {
		all = append(all, b...)
		st.full[i] = nil
	}
	all = append(all, st.pairs...)
	st.full, st.pairs = nil, nil
	return all
}

// toBuilder moves the numbers read so far into a Builder.
func (st *edgeListReader) toBuilder() {
	b := NewBuilder()
	var buf []byte
	vertex := func(x uint64) int32 {
		buf = strconv.AppendUint(buf[:0], x, 10)
		return b.VertexBytes(buf)
	}
	for _, s := range st.singles {
		vertex(uint64(s))
	}
	for _, p := range st.allPairs() {
		_ = b.AddEdge(vertex(p>>32), vertex(p&0xffffffff))
	}
	st.b, st.singles = b, nil
}

// build returns the graph read.
func (st *edgeListReader) build() (*Graph, BuildReport) {
	if st.b != nil {
		return st.b.Build()
	}
	blocks := append(st.full, st.pairs)
	st.full, st.pairs = nil, nil
	// rank[x] is the vertex of label x: numbers in increasing order are in
	// canonical label order.
	cu, cv := st.cu, st.cv
	rank := make([]int32, st.maxv+1)
	for _, s := range st.singles {
		rank[s] = 1
	}
	m := 0
	for x := range min(len(cu), len(rank)) {
		if cu[x] != 0 || cv[x] != 0 {
			rank[x] = 1
		}
		m += int(cu[x])
	}
	var digits []byte
	var ends []int
	n := int32(0)
	for x, r := range rank {
		if r == 0 {
			continue
		}
		rank[x] = n
		n++
		digits = strconv.AppendInt(digits, int64(x), 10)
		ends = append(ends, len(digits))
	}
	all := string(digits)
	labels := make([]string, n)
	prev := 0
	for i, e := range ends {
		labels[i], prev = all[prev:e], e
	}
	// Sort the pairs by (smaller, larger) value with two counting sorts, by
	// larger value into tmp, then stably by smaller value into edges, and
	// number the vertices; then drop repeats.
	sumU, sumV := int32(0), int32(0)
	for x := range cu {
		cu[x], sumU = sumU, sumU+cu[x]
		cv[x], sumV = sumV, sumV+cv[x]
	}
	tmp := make([]uint64, m)
	for k, b := range blocks {
		for _, p := range b {
			v := p & 0xffffffff
			tmp[cv[v]] = p
			cv[v]++
		}
		blocks[k] = nil
	}
	edges := make([]Edge, m)
	for _, p := range tmp {
		u := p >> 32
		edges[cu[u]] = Edge{rank[u], rank[p&0xffffffff]}
		cu[u]++
	}
	var rep BuildReport
	w := 0
	for _, e := range edges {
		if w > 0 && edges[w-1] == e {
			rep.Duplicates++
			if len(rep.Examples) < 10 {
				rep.Examples = append(rep.Examples, [2]string{labels[e.U], labels[e.V]})
			}
			continue
		}
		edges[w] = e
		w++
	}
	return newGraph(labels, edges[:w]), rep
}

// graphFromPairs builds the graph over labels (in canonical order) from
// vertex pairs u<<32|v with u < v, merging repeats.
func graphFromPairs(labels []string, pairs []uint64) (*Graph, BuildReport) {
	radixSort64(pairs, len(labels))
	var rep BuildReport
	edges := make([]Edge, 0, len(pairs))
	for i, p := range pairs {
		if i > 0 && pairs[i-1] == p {
			rep.Duplicates++
			if len(rep.Examples) < 10 {
				rep.Examples = append(rep.Examples, [2]string{labels[p>>32], labels[p&0xffffffff]})
			}
			continue
		}
		edges = append(edges, Edge{int32(p >> 32), int32(p & 0xffffffff)})
	}
	return newGraph(labels, edges), rep
}

func isSpace(c byte) bool {
	return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\v' || c == '\f'
}

// duplicateWarnings describes merged repeated edges.
func duplicateWarnings(name string, rep BuildReport) []string {
	if rep.Duplicates == 0 {
		return nil
	}
	ex := make([]string, len(rep.Examples))
	for i, e := range rep.Examples {
		ex[i] = e[0] + "–" + e[1]
	}
	more := ""
	if rep.Duplicates > len(ex) {
		more = fmt.Sprintf(" (and %d more)", rep.Duplicates-len(ex))
	}
	return []string{fmt.Sprintf("%s: %d repeated edge(s) merged: %s%s", name, rep.Duplicates, strings.Join(ex, ", "), more)}
}

// Pick returns graph number index (1-based) of a file that holds several;
// index 0 means "the only one" and is an error when the file holds more or
// fewer. name names the file in messages.
func (r *ReadResult) Pick(name string, index int) (*Graph, error) {
	n := len(r.Graphs)
	switch {
	case index == 0 && n == 1:
		return r.Graphs[0], nil
	case index == 0:
		return nil, fmt.Errorf("%w: %s holds %d graphs: choose one with --index 1..%d", ErrIndex, name, n, n)
	case index < 0 || index > n:
		return nil, fmt.Errorf("%w: %s: --index %d out of range 1..%d", ErrIndex, name, index, n)
	}
	return r.Graphs[index-1], nil
}
