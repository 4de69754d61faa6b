package graph

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"slices"
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
	hint := 0
	if st, err := file.Stat(); err == nil && st.Mode().IsRegular() {
		hint = int(min(st.Size(), 1<<40))
	}
	return read(file, path, f, hint)
}

// Read reads one or more graphs from r; name is used in messages and
// its extension as a format hint when f is FormatAuto.
func Read(r io.Reader, name string, f Format) (*ReadResult, error) {
	hint := 0
	if l, ok := r.(interface{ Len() int }); ok { // bytes.Reader, strings.Reader, bytes.Buffer
		hint = l.Len()
	}
	return read(r, name, f, hint)
}

// read is Read for an input of about size bytes (0 if not known).
func read(r io.Reader, name string, f Format, size int) (*ReadResult, error) {
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
		g, err = readEdgeList(br, name, res, size)
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
func readEdgeList(br *bufio.Reader, name string, res *ReadResult, size int) (*Graph, error) {
	// An edge takes at least 4 bytes ("0 1\n"): when the size is known, the
	// first block of pairs has room for all (up to 1<<26; the room no edge
	// takes is reserved but never touched).
	st := &edgeListReader{name: name, maxv: -1, sorted: true, pairs: make([]Edge, 0, min(size/4, 1<<26))}
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
	pairs   []Edge   // pairs of label values, U < V, while b is nil: the current block
	full    [][]Edge // earlier blocks of pairs
	sorted  bool     // the pairs came in increasing order
	last    Edge     // the pair added last
	singles []uint32 // labels of one-label lines while b is nil
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
	st.maxv = max(st.maxv, v)
	e := Edge{int32(u), int32(v)}
	if e.U < st.last.U || e.U == st.last.U && e.V < st.last.V {
		st.sorted = false
	}
	st.last = e
	if len(st.pairs) == cap(st.pairs) {
		st.newBlock()
	}
	st.pairs = append(st.pairs, e)
}

// edgeBlock is the size of the blocks pairs are collected in when the size
// of the input is not known: growing one slice by doubling would copy and
// fault in far more memory.
const edgeBlock = 1 << 16

// newBlock starts a new block of pairs.
func (st *edgeListReader) newBlock() {
	if len(st.pairs) > 0 {
		st.full = append(st.full, st.pairs)
	}
	st.pairs = make([]Edge, 0, edgeBlock)
}

// allPairs returns every pair collected, in one slice.
func (st *edgeListReader) allPairs() []Edge {
	if len(st.full) == 0 {
		return st.pairs
	}
	m := len(st.pairs)
	for _, b := range st.full {
		m += len(b)
	}
	all := make([]Edge, 0, m)
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
		_ = b.AddEdge(vertex(uint64(p.U)), vertex(uint64(p.V)))
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
	// rank[x] is the vertex of label x (-1 if no vertex has it): numbers in
	// increasing order are in canonical label order.
	rank := make([]int32, st.maxv+1)
	for _, s := range st.singles {
		rank[s] = 1
	}
	m := 0
	for _, b := range blocks {
		for _, e := range b {
			rank[e.U], rank[e.V] = 1, 1
		}
		m += len(b)
	}
	n, lo, size := int32(0), 0, 0
	for x, w, wider := 0, 1, 10; x < len(rank); x++ {
		if x == wider {
			w, wider = w+1, wider*10
		}
		if rank[x] == 0 {
			rank[x] = -1
			continue
		}
		if n == 0 {
			lo = x
		}
		rank[x] = n
		n++
		size += w
	}
	// A run of consecutive numbers makes a numbered graph, whose labels are
	// made only when asked for; other labels are made now.
	numbered := int(n) == len(rank)-lo
	var labels []string
	label := func(v int32) string { return strconv.Itoa(lo + int(v)) }
	if !numbered {
		var digits strings.Builder
		digits.Grow(size)
		c := newCounter(lo)
		for _, r := range rank[lo:] {
			if r >= 0 {
				digits.Write(c.text)
			}
			c.next()
		}
		all := digits.String()
		labels = make([]string, n)
		for x, w, wider := 0, 1, 10; x < len(rank); x++ {
			if x == wider {
				w, wider = w+1, wider*10
			}
			if r := rank[x]; r >= 0 {
				labels[r], all = all[:w], all[w:]
			}
		}
		label = func(v int32) string { return labels[v] }
	}
	edges := sortPairs(blocks, m, rank, st.sorted, numbered && lo == 0)
	// drop repeats
	var rep BuildReport
	w := 0
	for _, e := range edges {
		if w > 0 && edges[w-1] == e {
			rep.Duplicates++
			if len(rep.Examples) < 10 {
				rep.Examples = append(rep.Examples, [2]string{label(e.U), label(e.V)})
			}
			continue
		}
		edges[w] = e
		w++
	}
	if numbered {
		return newNumberedGraph(int(n), lo, edges[:w]), rep
	}
	return newGraph(labels, edges[:w]), rep
}

// sortPairs returns the m pairs of label values in blocks as edges between
// the vertices rank gives them, sorted by (U, V); sorted says that the pairs
// came in order, same that every label value is its vertex. Pairs that came
// sorted in one block are numbered in place. Otherwise a stable counting
// sort by smaller value follows, which suffices when the pairs of each
// smaller value came in order; if they did not, a counting sort by larger
// value comes first.
func sortPairs(blocks [][]Edge, m int, rank []int32, sorted, same bool) []Edge {
	if len(blocks) == 1 && sorted {
		edges := blocks[0]
		if !same {
			for i, e := range edges {
				edges[i] = Edge{rank[e.U], rank[e.V]}
			}
		}
		return edges
	}
	n := len(rank)
	count := make([]int32, n+1)
	for _, b := range blocks {
		for _, e := range b {
			count[e.U+1]++
		}
	}
	for x := 1; x <= n; x++ {
		count[x] += count[x-1]
	}
	cu := slices.Clone(count)
	edges := make([]Edge, m)
	for _, b := range blocks {
		for _, e := range b {
			edges[cu[e.U]] = Edge{rank[e.U], rank[e.V]}
			cu[e.U]++
		}
	}
	inOrder := true
	for i := 1; i < len(edges); i++ {
		if edges[i].U == edges[i-1].U && edges[i].V < edges[i-1].V {
			inOrder = false
			break
		}
	}
	if inOrder {
		return edges
	}
	cv := cu // reused: by larger value now
	clear(cv)
	for _, b := range blocks {
		for _, e := range b {
			cv[e.V+1]++
		}
	}
	for x := 1; x <= n; x++ {
		cv[x] += cv[x-1]
	}
	tmp := edges // reused: sorted by larger value, then by smaller into edges
	for _, b := range blocks {
		for _, e := range b {
			tmp[cv[e.V]] = e
			cv[e.V]++
		}
	}
	edges = make([]Edge, m)
	for _, e := range tmp {
		edges[count[e.U]] = Edge{rank[e.U], rank[e.V]}
		count[e.U]++
	}
	return edges
}

// graphFromPairs builds the graph over labels (in canonical order) from
// vertex pairs u<<32|v with u < v, merging repeats.
func graphFromPairs(labels []string, pairs []uint64) (*Graph, BuildReport) {
	edges, rep := edgesFromPairs(pairs, len(labels), func(v int32) string { return labels[v] })
	return newGraph(labels, edges), rep
}

// edgesFromPairs sorts vertex pairs u<<32|v with u < v < n and returns them
// as edges, merging repeats; label names vertices in the report.
func edgesFromPairs(pairs []uint64, n int, label func(int32) string) ([]Edge, BuildReport) {
	radixSort64(pairs, n)
	var rep BuildReport
	edges := make([]Edge, 0, len(pairs))
	for i, p := range pairs {
		if i > 0 && pairs[i-1] == p {
			rep.Duplicates++
			if len(rep.Examples) < 10 {
				rep.Examples = append(rep.Examples, [2]string{label(int32(p >> 32)), label(int32(p & 0xffffffff))})
			}
			continue
		}
		edges = append(edges, Edge{int32(p >> 32), int32(p & 0xffffffff)})
	}
	return edges, rep
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
