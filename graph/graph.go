package graph

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"fmt"
	"slices"
	"strconv"
	"strings"
	"sync"
)

// Edge is an undirected edge between two vertex indices with U < V.
type Edge struct{ U, V int32 }

// Graph is a simple undirected graph with labelled vertices.
//
// Vertices are numbered 0..N()-1 in canonical label order (see LessLabel), so
// two graphs with the same labels and edges have the same numbering whatever
// the input format or edge order. Edges() is sorted by (U, V) with U < V.
// A Graph is immutable once built and safe for concurrent readers.
type Graph struct {
	n     int
	edges []Edge
	start []int32 // edges with U == u are edges[start[u]:start[u+1]]

	// A numbered graph has the labels base, base+1, …, base+n-1, made into
	// strings (labels) only when they are asked for; other graphs have their
	// labels from the start.
	numbered   bool
	labelsOnce sync.Once
	labels     []string

	indexOnce sync.Once
	// labels[:dense] are the decimal labels base, base+1, …: Index computes
	// their vertices; index holds the vertices of the other labels
	dense, base int
	index       map[string]int32

	adjOnce sync.Once
	adjOff  []int32
	adj     []int32
	adjEdge []int32
}

// N returns the number of vertices.
func (g *Graph) N() int { return g.n }

// M returns the number of edges.
func (g *Graph) M() int { return len(g.edges) }

// Label returns the label of vertex v.
func (g *Graph) Label(v int32) string { return g.Labels()[v] }

// Labels returns the vertex labels in vertex order. The slice must not be modified.
func (g *Graph) Labels() []string {
	if g.numbered {
		g.labelsOnce.Do(func() { g.labels = decimalLabels(g.base, g.n) })
	}
	return g.labels
}

// decimalLabels returns the labels base, base+1, …, base+n-1: slices of
// one string.
func decimalLabels(base, n int) []string {
	size := 0
	for k := base; k < base+n; {
		w := decimalDigits(k)
		next := min(base+n, pow10(w)) // the numbers of w digits
		size += w * (next - k)
		k = next
	}
	var digits strings.Builder
	digits.Grow(size)
	c := newCounter(base)
	for range n {
		digits.Write(c.text)
		c.next()
	}
	all := digits.String()
	labels := make([]string, n)
	w := decimalDigits(base)
	wider := pow10(w)
	for i := range labels {
		if base+i == wider {
			w, wider = w+1, wider*10
		}
		labels[i], all = all[:w], all[w:]
	}
	return labels
}

// pow10 returns 10^w for w < 19.
func pow10(w int) int {
	p := 1
	for ; w > 0; w-- {
		p *= 10
	}
	return p
}

// counter is the decimal text of a number k ≥ 0 that counts up: cheaper
// than formatting every number.
type counter struct{ text []byte }

func newCounter(k int) counter { return counter{strconv.AppendInt(nil, int64(k), 10)} }

// next makes the text that of k+1.
func (c *counter) next() {
	for i := len(c.text) - 1; i >= 0; i-- {
		if c.text[i] != '9' {
			c.text[i]++
			return
		}
		c.text[i] = '0'
	}
	c.text = append([]byte{'1'}, c.text...)
}

// Edges returns the edges sorted by (U, V). The slice must not be modified.
func (g *Graph) Edges() []Edge { return g.edges }

// Index returns the vertex with the given label.
func (g *Graph) Index(label string) (int32, bool) {
	g.indexOnce.Do(g.buildIndex)
	if k, ok := decimalValue(label); ok && k >= g.base && k-g.base < g.dense {
		return int32(k - g.base), true
	}
	v, ok := g.index[label]
	return v, ok
}

// IndexNumber returns the vertex labelled with the decimal text of k ≥ 0;
// it is Index(strconv.Itoa(k)) without the text.
func (g *Graph) IndexNumber(k int) (int32, bool) {
	g.indexOnce.Do(g.buildIndex)
	if k >= g.base && k-g.base < g.dense {
		return int32(k - g.base), true
	}
	if len(g.index) == 0 || k < 0 {
		return 0, false
	}
	v, ok := g.index[strconv.Itoa(k)]
	return v, ok
}

// buildIndex finds the run of consecutive numbers that the labels start
// with (labels are in canonical order: decimal labels first, by value) and
// maps the labels after it.
func (g *Graph) buildIndex() {
	if g.numbered {
		g.dense = g.n // and g.base is set
		return
	}
	if len(g.labels) > 0 {
		if k, ok := decimalValue(g.labels[0]); ok {
			g.base = k
			g.dense = 1
			for g.dense < len(g.labels) {
				if v, ok := decimalValue(g.labels[g.dense]); !ok || v != k+g.dense {
					break
				}
				g.dense++
			}
		}
	}
	rest := g.labels[g.dense:]
	g.index = make(map[string]int32, len(rest))
	for i, l := range rest {
		g.index[l] = int32(g.dense + i)
	}
}

// decimalValue returns the value of a canonical decimal label of at most 18
// digits (so that it fits an int).
func decimalValue(s string) (int, bool) {
	if len(s) == 0 || len(s) > 18 || (s[0] == '0' && len(s) > 1) {
		return 0, false
	}
	n := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + int(c-'0')
	}
	return n, true
}

// EdgeIndex returns the index in Edges() of the edge {u, v}, or -1.
func (g *Graph) EdgeIndex(u, v int32) int {
	if u > v {
		u, v = v, u
	}
	if u < 0 || int(v) >= g.n || u == v {
		return -1
	}
	lo, hi := int(g.start[u]), int(g.start[u+1])
	for lo < hi {
		mid := int(uint(lo+hi) >> 1)
		if g.edges[mid].V < v {
			lo = mid + 1
		} else {
			hi = mid
		}
	}
	if lo < int(g.start[u+1]) && g.edges[lo].V == v {
		return lo
	}
	return -1
}

// HasEdge reports whether {u, v} is an edge.
func (g *Graph) HasEdge(u, v int32) bool { return g.EdgeIndex(u, v) >= 0 }

func (g *Graph) buildAdj() {
	g.adjOnce.Do(func() {
		n := g.n
		off := make([]int32, n+1)
		for _, e := range g.edges {
			off[e.U+1]++
			off[e.V+1]++
		}
		for i := 0; i < n; i++ {
			off[i+1] += off[i]
		}
		adj := make([]int32, 2*len(g.edges))
		eid := make([]int32, 2*len(g.edges))
		fill := slices.Clone(off[:n])
		for i, e := range g.edges {
			adj[fill[e.U]], eid[fill[e.U]] = e.V, int32(i)
			fill[e.U]++
			adj[fill[e.V]], eid[fill[e.V]] = e.U, int32(i)
			fill[e.V]++
		}
		g.adjOff, g.adj, g.adjEdge = off, adj, eid
	})
}

// Neighbors returns the neighbours of v in increasing order. The slice must not be modified.
func (g *Graph) Neighbors(v int32) []int32 {
	g.buildAdj()
	return g.adj[g.adjOff[v]:g.adjOff[v+1]]
}

// IncidentEdges returns the indices (into Edges) of the edges at v, aligned with Neighbors(v).
func (g *Graph) IncidentEdges(v int32) []int32 {
	g.buildAdj()
	return g.adjEdge[g.adjOff[v]:g.adjOff[v+1]]
}

// Degree returns the degree of v.
func (g *Graph) Degree(v int32) int {
	g.buildAdj()
	return int(g.adjOff[v+1] - g.adjOff[v])
}

// identityTag versions the canonical serialisation hashed by ID.
const identityTag = "spinecert-graph-identity-v1\x00"

// ID returns the canonical identity of the graph: the lowercase hex SHA-256 of
// identityTag, the vertex count, every label (length-prefixed, in canonical
// order) and every edge (as a pair of vertex indices, in sorted order), all
// integers as unsigned 64-bit big-endian. It depends on the labels and the
// edge set only, not on the input format or the order of the input.
func (g *Graph) ID() string {
	h := sha256.New()
	// The hashed bytes are gathered in a buffer: one Write per label or
	// edge would cost more than the hashing.
	buf := make([]byte, 0, 64<<10)
	put := func(x uint64) {
		if len(buf)+8 > cap(buf) {
			h.Write(buf)
			buf = buf[:0]
		}
		buf = binary.BigEndian.AppendUint64(buf, x)
	}
	buf = append(buf, identityTag...)
	put(uint64(g.n))
	if g.numbered {
		// the same bytes as below, without making the labels
		c := newCounter(g.base)
		for range g.n {
			put(uint64(len(c.text)))
			if len(buf)+len(c.text) > cap(buf) {
				h.Write(buf)
				buf = buf[:0]
			}
			buf = append(buf, c.text...)
			c.next()
		}
	} else {
		for _, l := range g.Labels() {
			put(uint64(len(l)))
			if len(buf)+len(l) > cap(buf) {
				h.Write(buf)
				buf = buf[:0]
			}
			if len(l) > cap(buf) {
				h.Write([]byte(l))
			} else {
				buf = append(buf, l...)
			}
		}
	}
	put(uint64(len(g.edges)))
	for _, e := range g.edges {
		put(uint64(e.U))
		put(uint64(e.V))
	}
	h.Write(buf)
	return hex.EncodeToString(h.Sum(nil))
}

// Induced returns the subgraph induced by the given vertices (in any order),
// keeping their labels, and the map from new vertex index to old.
func (g *Graph) Induced(vertices []int32) (*Graph, []int32) {
	b := NewBuilder()
	labels := g.Labels()
	for _, v := range vertices {
		b.Vertex(labels[v])
	}
	in := make(map[int32]int32, len(vertices))
	for i, v := range vertices {
		in[v] = int32(i)
	}
	for _, e := range g.edges {
		nu, ok1 := in[e.U]
		nv, ok2 := in[e.V]
		if ok1 && ok2 {
			_ = b.AddEdge(nu, nv)
		}
	}
	h, _ := b.Build()
	old := make([]int32, h.N())
	for i := range old {
		v, _ := g.Index(h.Labels()[i])
		old[i] = v
	}
	return h, old
}

// String returns a short description such as "graph n=5 m=7".
func (g *Graph) String() string { return fmt.Sprintf("graph n=%d m=%d", g.N(), g.M()) }
