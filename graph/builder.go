package graph

import (
	"fmt"
	"slices"
	"strconv"
)

// Builder collects vertices and edges and builds a Graph.
// Labels that are canonical decimal integers below 1<<24 are interned
// without hashing, which keeps large numbered inputs fast.
type Builder struct {
	// vals[v] is k ≥ 0 for the vertex v of label strconv.Itoa(k), and -1-i
	// for the vertex of label others[i]; labels holds the labels of the
	// first vertices, made by makeLabels when they are asked for
	vals   []int32
	others []string
	labels []string
	index  map[string]int32 // the vertices of others
	num    []int32          // num[k] = 1 + vertex of label strconv.Itoa(k), 0 if absent
	pairs  []uint64
}

// NewBuilder returns an empty builder.
func NewBuilder() *Builder { return &Builder{index: make(map[string]int32)} }

// FastNumbers bounds the decimal labels that VertexNumber takes.
const FastNumbers = 1 << 24

// smallNumber returns the value of a canonical decimal label below FastNumbers.
func smallNumber(b []byte) (int, bool) {
	if len(b) == 0 || len(b) > 8 || (b[0] == '0' && len(b) > 1) {
		return 0, false
	}
	n := 0
	for _, c := range b {
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + int(c-'0')
	}
	return n, n < FastNumbers
}

// Vertex returns the vertex with the given label, adding it if new.
func (b *Builder) Vertex(label string) int32 { return b.VertexBytes([]byte(label)) }

// VertexBytes is Vertex for a byte slice; the bytes are copied when a vertex is added.
func (b *Builder) VertexBytes(label []byte) int32 {
	if k, ok := smallNumber(label); ok {
		return b.VertexNumber(k)
	}
	if v, ok := b.index[string(label)]; ok {
		return v
	}
	v := int32(len(b.vals))
	s := string(label)
	b.vals = append(b.vals, int32(-1-len(b.others)))
	b.others = append(b.others, s)
	b.index[s] = v
	return v
}

// Labels returns the labels added so far, in the order they were added.
// The slice must not be modified.
func (b *Builder) Labels() []string {
	b.makeLabels()
	return b.labels
}

// makeLabels makes the labels of the vertices added since it last ran; the
// decimal ones are slices of one string.
func (b *Builder) makeLabels() {
	from := len(b.labels)
	if from == len(b.vals) {
		return
	}
	digits := make([]byte, 0, 8*(len(b.vals)-from)) // numbers below FastNumbers have at most 8 digits
	for _, k := range b.vals[from:] {
		if k >= 0 {
			digits = strconv.AppendInt(digits, int64(k), 10)
		}
	}
	all := string(digits)
	b.labels = slices.Grow(b.labels, len(b.vals)-from)
	for _, k := range b.vals[from:] {
		if k < 0 {
			b.labels = append(b.labels, b.others[-1-k])
			continue
		}
		w := decimalDigits(int(k))
		b.labels, all = append(b.labels, all[:w]), all[w:]
	}
}

// decimalDigits returns the number of digits of k ≥ 0.
func decimalDigits(k int) int {
	w := 1
	for k >= 10 {
		k /= 10
		w++
	}
	return w
}

// VertexNumber is VertexBytes for the decimal label of k, without formatting
// it first; k must be at least 0 and below FastNumbers.
func (b *Builder) VertexNumber(k int) int32 {
	if k < len(b.num) && b.num[k] != 0 {
		return b.num[k] - 1
	}
	if k >= len(b.num) {
		size := max(k+1, 2*len(b.num), 1024)
		b.num = slices.Grow(b.num, size-len(b.num))[:size]
	}
	v := int32(len(b.vals))
	b.vals = append(b.vals, int32(k))
	b.num[k] = v + 1
	return v
}

// N returns the number of vertices added so far.
func (b *Builder) N() int { return len(b.vals) }

// AddEdge adds the edge {u, v} between vertices returned by Vertex.
// A repeated edge is accepted here and merged (and counted) by Build.
func (b *Builder) AddEdge(u, v int32) error {
	if u < 0 || v < 0 || int(u) >= len(b.vals) || int(v) >= len(b.vals) {
		return fmt.Errorf("graph: edge {%d, %d} names an unknown vertex", u, v)
	}
	if u == v {
		b.makeLabels()
		return fmt.Errorf("%w at vertex %q", ErrSelfLoop, b.labels[u])
	}
	if u > v {
		u, v = v, u
	}
	b.pairs = append(b.pairs, uint64(u)<<32|uint64(v))
	return nil
}

// BuildReport tells what Build merged.
type BuildReport struct {
	Duplicates int         // number of repeated edges merged away
	Examples   [][2]string // up to 10 of them, as label pairs
}

// Build sorts vertices into canonical label order, merges repeated edges and
// returns the graph. The builder must not be used afterwards.
func (b *Builder) Build() (*Graph, BuildReport) {
	b.makeLabels()
	n := len(b.labels)
	// Labels below FastNumbers come first in canonical order, by value:
	// the table of numbers lists them so; the others are sorted.
	order := make([]int32, 0, n)
	for _, v := range b.num {
		if v != 0 {
			order = append(order, v-1)
		}
	}
	numbers := len(order)
	for _, v := range b.index {
		order = append(order, v)
	}
	rest := order[numbers:]
	slices.SortFunc(rest, func(x, y int32) int { return CompareLabels(b.labels[x], b.labels[y]) })
	rank := make([]int32, n)
	labels := make([]string, n)
	for r, v := range order {
		rank[v] = int32(r)
		labels[r] = b.labels[v]
	}
	pairs := b.pairs
	b.pairs, b.labels, b.index, b.num, b.vals, b.others = nil, nil, nil, nil, nil, nil
	for i, p := range pairs {
		u, v := rank[p>>32], rank[p&0xffffffff]
		if u > v {
			u, v = v, u
		}
		pairs[i] = uint64(u)<<32 | uint64(v)
	}
	return graphFromPairs(labels, pairs)
}

// newGraph wraps sorted, duplicate-free edges over canonically ordered labels.
func newGraph(labels []string, edges []Edge) *Graph {
	return &Graph{n: len(labels), labels: labels, edges: edges, start: edgeStarts(len(labels), edges)}
}

// newNumberedGraph wraps sorted, duplicate-free edges over the vertices
// labelled base, base+1, …, base+n-1 (base ≥ 0), whose labels are made when
// they are first asked for.
func newNumberedGraph(n, base int, edges []Edge) *Graph {
	return &Graph{n: n, numbered: true, base: base, edges: edges, start: edgeStarts(n, edges)}
}

// edgeStarts returns start with the edges of U == u at edges[start[u]:start[u+1]].
func edgeStarts(n int, edges []Edge) []int32 {
	start := make([]int32, n+1)
	for _, e := range edges {
		start[e.U+1]++
	}
	for i := 0; i < n; i++ {
		start[i+1] += start[i]
	}
	return start
}

// radixSort64 sorts keys whose two 32-bit halves are below n.
func radixSort64(a []uint64, n int) {
	if len(a) < 256 {
		slices.Sort(a)
		return
	}
	bits := 1
	for (1 << bits) < n {
		bits++
	}
	// Pack both halves into 2*bits bits, sort by 11-bit digits, unpack.
	mask := uint64(1)<<bits - 1
	for i, x := range a {
		a[i] = (x>>32)<<bits | x&mask
	}
	tmp := make([]uint64, len(a))
	src, dst := a, tmp
	var count [1 << 11]int
	for shift := 0; shift < 2*bits; shift += 11 {
		clear(count[:])
		for _, x := range src {
			count[(x>>shift)&0x7ff]++
		}
		sum := 0
		for i := range count {
			c := count[i]
			count[i] = sum
			sum += c
		}
		for _, x := range src {
			d := (x >> shift) & 0x7ff
			dst[count[d]] = x
			count[d]++
		}
		src, dst = dst, src
	}
	for i, x := range src {
		a[i] = (x>>bits)<<32 | x&mask
	}
}

// CompareLabels orders labels canonically: canonical decimal integers first,
// by value; then all other labels bytewise.
func CompareLabels(a, b string) int {
	na, nb := IsDecimal(a), IsDecimal(b)
	switch {
	case na && nb:
		if len(a) != len(b) {
			if len(a) < len(b) {
				return -1
			}
			return 1
		}
	case na:
		return -1
	case nb:
		return 1
	}
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// IsDecimal reports whether s is a canonical non-negative decimal integer.
func IsDecimal(s string) bool {
	if s == "" || (s[0] == '0' && len(s) > 1) {
		return false
	}
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return false
		}
	}
	return true
}

// NewNumbered builds a graph on vertices labelled base..base+n-1 from index pairs
// in 0..n-1. It is a convenience for generators and tests.
func NewNumbered(n, base int, edges [][2]int) (*Graph, error) {
	b := NewBuilder()
	for i := 0; i < n; i++ {
		b.Vertex(strconv.Itoa(base + i))
	}
	for _, e := range edges {
		if e[0] < 0 || e[1] < 0 || e[0] >= n || e[1] >= n {
			return nil, fmt.Errorf("graph: edge {%d, %d} out of range 0..%d", e[0], e[1], n-1)
		}
		if err := b.AddEdge(int32(e[0]), int32(e[1])); err != nil {
			return nil, err
		}
	}
	g, _ := b.Build()
	return g, nil
}
