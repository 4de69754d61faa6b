package cert

import (
	"fmt"
	"strconv"
	"strings"
)

// Kind is the kind of a layout or of one page.
type Kind uint8

const (
	// Stack pages forbid crossings: never a < c < b < d for edges (a,b), (c,d).
	Stack Kind = iota + 1
	// Queue pages forbid nestings: never a < c < d < b for edges (a,b), (c,d).
	Queue
	// Mixed layouts have a kind per page, each Stack or Queue.
	Mixed
)

// String returns "stack", "queue" or "mixed".
func (k Kind) String() string {
	switch k {
	case Stack:
		return "stack"
	case Queue:
		return "queue"
	case Mixed:
		return "mixed"
	}
	return fmt.Sprintf("kind(%d)", uint8(k))
}

// ParseKind parses "stack", "queue" or "mixed".
func ParseKind(s string) (Kind, error) {
	switch strings.ToLower(s) {
	case "stack":
		return Stack, nil
	case "queue":
		return Queue, nil
	case "mixed":
		return Mixed, nil
	}
	return 0, fmt.Errorf("cert: unknown layout kind %q (expected stack, queue or mixed)", s)
}

// PageKinds returns the kind of each of k pages for a layout of kind kind;
// for Mixed the explicit list is required and checked.
func PageKinds(kind Kind, k int, mixed []Kind) ([]Kind, error) {
	switch kind {
	case Stack, Queue:
		if len(mixed) != 0 {
			for _, m := range mixed {
				if m != kind {
					return nil, fmt.Errorf("cert: page kinds given for a %s layout", kind)
				}
			}
		}
		out := make([]Kind, k)
		for i := range out {
			out[i] = kind
		}
		return out, nil
	case Mixed:
		if len(mixed) != k {
			return nil, fmt.Errorf("cert: mixed layout with %d pages needs %d page kinds, got %d", k, k, len(mixed))
		}
		for _, m := range mixed {
			if m != Stack && m != Queue {
				return nil, fmt.Errorf("cert: page kind %s is not stack or queue", m)
			}
		}
		return append([]Kind(nil), mixed...), nil
	}
	return nil, fmt.Errorf("cert: unknown layout kind %d", kind)
}

// Layout is a layout resolved against a graph: a spine order of all vertices
// and a page (1..len(PageKinds)) for every edge of the graph.
type Layout struct {
	Kind      Kind
	PageKinds []Kind  // kind of page p is PageKinds[p-1]
	Order     []int32 // Order[i] is the vertex at spine position i
	Page      []int32 // Page[e] is the page of graph.Graph.Edges()[e], 1-based
}

// Pages returns the number of pages.
func (l *Layout) Pages() int { return len(l.PageKinds) }

// UsedPages returns the highest page that some edge uses.
func (l *Layout) UsedPages() int {
	m := int32(0)
	for _, p := range l.Page {
		m = max(m, p)
	}
	return int(m)
}

// Positions returns pos with pos[v] = spine position of vertex v, for n vertices.
func (l *Layout) Positions(n int) []int32 {
	pos := make([]int32, n)
	for i := range pos {
		pos[i] = -1
	}
	for i, v := range l.Order {
		if v >= 0 && int(v) < n {
			pos[v] = int32(i)
		}
	}
	return pos
}

// RawLayout is a layout as read from a file, before it is matched with a graph.
// Vertices are label numbers 0..NumLabels()-1 (see Label); the spine lists
// them in order.
type RawLayout struct {
	Kind      Kind
	Pages     int
	PageKinds []Kind // as given (only for mixed), else nil
	Spine     []int32
	Edges     []RawEdge
	Graph     string // graph identity named in the file, if any

	// The labels are labels[i]; when labels is nil, they are the decimal
	// texts of base, base+1, …, base+numbers-1, made only when asked for.
	labels        []string
	base, numbers int
}

// NumLabels returns the number of distinct labels in the layout.
func (r *RawLayout) NumLabels() int {
	if r.labels == nil {
		return r.numbers
	}
	return len(r.labels)
}

// Label returns label i, 0 ≤ i < NumLabels().
func (r *RawLayout) Label(i int32) string {
	if r.labels == nil {
		if i < 0 || int(i) >= r.numbers {
			panic(fmt.Sprintf("cert: label %d of a layout with %d labels", i, r.numbers))
		}
		return strconv.Itoa(r.base + int(i))
	}
	return r.labels[i]
}

// RawEdge is one edge record of a raw layout: two label indices and a page.
type RawEdge struct {
	U, V int32
	Page int32
}
