package cert

import (
	"strconv"
	"strings"

	"spinecert.dev/graph"
)

// labelSet numbers the vertex labels of a layout file as they are read.
//
// While every label read is a canonical decimal integer below
// graph.FastNumbers (the common case), a label stands for its own value in
// raw.Spine and raw.Edges and seen marks the values read; finish then
// numbers the labels in increasing order of value. When the values are
// all of k0..k1, label k is number k-k0 and no label text is made (see
// RawLayout.Label). The first other label moves the labels read so far
// into a graph.Builder, which numbers labels in order of first appearance.
type labelSet struct {
	b    *graph.Builder
	seen []bool // seen[k]: the label of value k was read (while b is nil)
}

// number returns the index of the label that is the decimal text of k,
// 0 ≤ k < graph.FastNumbers.
func (ls *labelSet) number(k int) int32 {
	if ls.b != nil {
		return ls.b.VertexNumber(k)
	}
	if k >= len(ls.seen) {
		size := max(k+1, 2*len(ls.seen), 1024)
		ls.seen = append(ls.seen, make([]bool, size-len(ls.seen))...)
	}
	ls.seen[k] = true
	return int32(k)
}

// bytes returns the index of the label b; raw holds the indices given so far.
func (ls *labelSet) bytes(b []byte, raw *RawLayout) int32 {
	if k, ok := smallLabel(b); ok {
		return ls.number(k)
	}
	if ls.b == nil {
		ls.toBuilder(raw)
	}
	return ls.b.VertexBytes(b)
}

// smallLabel returns k when b is the decimal text of k < graph.FastNumbers.
func smallLabel(b []byte) (int, bool) {
	if len(b) == 0 || len(b) > 8 || (b[0] == '0' && len(b) > 1) {
		return 0, false
	}
	k := 0
	for _, c := range b {
		if c < '0' || c > '9' {
			return 0, false
		}
		k = k*10 + int(c-'0')
	}
	return k, k < graph.FastNumbers
}

// toBuilder moves the labels read so far, which are values, into a Builder.
func (ls *labelSet) toBuilder(raw *RawLayout) {
	b := graph.NewBuilder()
	for i, k := range raw.Spine {
		raw.Spine[i] = b.VertexNumber(int(k))
	}
	for i, e := range raw.Edges {
		raw.Edges[i].U, raw.Edges[i].V = b.VertexNumber(int(e.U)), b.VertexNumber(int(e.V))
	}
	ls.b, ls.seen = b, nil
}

// finish sets the labels of raw and turns the values in raw.Spine and
// raw.Edges into label numbers.
func (ls *labelSet) finish(raw *RawLayout) {
	if ls.b != nil {
		raw.labels = ls.b.Labels()
		if raw.labels == nil {
			raw.labels = []string{}
		}
		return
	}
	seen := ls.seen
	hi := len(seen) - 1
	for hi >= 0 && !seen[hi] {
		hi--
	}
	if hi < 0 {
		return // no labels
	}
	// lo is the smallest value, n the number of values and size the number
	// of their digits
	lo, n, size := -1, 0, 0
	for k, w, wider := 0, 1, 10; k <= hi; k++ {
		if k == wider {
			w, wider = w+1, wider*10
		}
		if seen[k] {
			if lo < 0 {
				lo = k
			}
			n++
			size += w
		}
	}
	if n == hi-lo+1 {
		// the values lo..hi: label number k-lo, and no label texts needed
		if lo > 0 {
			for i := range raw.Spine {
				raw.Spine[i] -= int32(lo)
			}
			for i := range raw.Edges {
				raw.Edges[i].U -= int32(lo)
				raw.Edges[i].V -= int32(lo)
			}
		}
		raw.base, raw.numbers = lo, n
		ls.seen = nil
		return
	}
	rank := make([]int32, hi+1)
	r := int32(0)
	for k := lo; k <= hi; k++ {
		if seen[k] {
			rank[k] = r
			r++
		}
	}
	for i, k := range raw.Spine {
		raw.Spine[i] = rank[k]
	}
	for i, e := range raw.Edges {
		raw.Edges[i].U, raw.Edges[i].V = rank[e.U], rank[e.V]
	}
	// the labels: the values seen, in increasing order, as slices of one string
	var digits strings.Builder
	digits.Grow(size)
	c := strconv.AppendInt(nil, int64(lo), 10) // the text of k, counting up
	for k := lo; k <= hi; k++ {
		if seen[k] {
			digits.Write(c)
		}
		c = nextDecimal(c)
	}
	all := digits.String()
	raw.labels = make([]string, 0, n)
	w, wider := decimalWidth(lo), 1
	for range w {
		wider *= 10
	}
	for k := lo; k <= hi; k++ {
		if k == wider {
			w, wider = w+1, wider*10
		}
		if seen[k] {
			raw.labels, all = append(raw.labels, all[:w]), all[w:]
		}
	}
	ls.seen = nil
}
