package cert

import (
	"fmt"
	"strings"
)

// ProblemKind classifies a finding of the layout checker.
type ProblemKind int

const (
	UnknownVertex   ProblemKind = iota + 1 // the spine names a vertex the graph lacks
	DuplicateVertex                        // the spine names a vertex twice
	MissingVertex                          // a vertex of the graph is not on the spine
	ExtraEdge                              // the layout places an edge the graph lacks
	DuplicateEdge                          // the layout places an edge twice
	MissingEdge                            // an edge of the graph has no page
	BadPage                                // an edge's page is outside 1..pages
	PageLimit                              // an edge's page is above the limit asked for
	Crossing                               // two edges of a stack page cross
	Nesting                                // two edges of a queue page nest
)

var problemNames = map[ProblemKind]string{
	UnknownVertex: "unknown-vertex", DuplicateVertex: "duplicate-vertex", MissingVertex: "missing-vertex",
	ExtraEdge: "extra-edge", DuplicateEdge: "duplicate-edge", MissingEdge: "missing-edge",
	BadPage: "bad-page", PageLimit: "page-limit", Crossing: "crossing", Nesting: "nesting",
}

// String returns the kind's name as printed in reports, e.g. "crossing".
func (k ProblemKind) String() string {
	if s, ok := problemNames[k]; ok {
		return s
	}
	return fmt.Sprintf("problem(%d)", int(k))
}

// MarshalText lets problem kinds appear by name in JSON.
func (k ProblemKind) MarshalText() ([]byte, error) { return []byte(k.String()), nil }

// WitnessEdge is an edge named in a problem, with its spine positions (0-based, -1 when not on the spine).
type WitnessEdge struct {
	U    string `json:"u"`
	V    string `json:"v"`
	PosU int    `json:"pos_u"`
	PosV int    `json:"pos_v"`
	Page int    `json:"page,omitempty"`
}

// Problem is one finding with its witness.
type Problem struct {
	Kind   ProblemKind   `json:"kind"`
	Page   int           `json:"page,omitempty"`
	Vertex string        `json:"vertex,omitempty"`
	Edges  []WitnessEdge `json:"edges,omitempty"`
	Msg    string        `json:"message"`
}

// MaxWitnesses is how many problems of each kind a Report keeps; all are counted.
const MaxWitnesses = 20

// Report lists what the checker found. A layout passes when it has no problems.
type Report struct {
	Problems []Problem        `json:"problems"`
	Counts   map[string]int64 `json:"counts"`
	Pages    int              `json:"pages"`
	Used     int              `json:"pages_used"`
	Kind     Kind             `json:"-"`
	PerPage  []int            `json:"edges_per_page"`
	kept     map[ProblemKind]int
}

// OK reports whether the check found no problem.
func (r *Report) OK() bool { return len(r.Counts) == 0 }

// Total returns the number of problems found (kept or not).
func (r *Report) Total() int64 {
	var t int64
	for _, c := range r.Counts {
		t += c
	}
	return t
}

func (r *Report) add(p Problem) {
	if r.Counts == nil {
		r.Counts = map[string]int64{}
		r.kept = map[ProblemKind]int{}
	}
	r.Counts[p.Kind.String()]++
	if r.kept[p.Kind] < MaxWitnesses {
		r.kept[p.Kind]++
		r.Problems = append(r.Problems, p)
	}
}

// merge adds the findings of o to r, keeping the per-kind witness limit.
func (r *Report) merge(o *Report) {
	for _, p := range o.Problems {
		r.add(p)
	}
	for kind, c := range o.Counts {
		kept := int64(0)
		for _, p := range o.Problems {
			if p.Kind.String() == kind {
				kept++
			}
		}
		r.Counts[kind] += c - kept
	}
}

// Err returns nil when the layout passed, else a *LayoutError summarising the report.
func (r *Report) Err() error {
	if r.OK() {
		return nil
	}
	return &LayoutError{Report: r}
}

// LayoutError is returned by checks that found problems.
type LayoutError struct{ Report *Report }

func (e *LayoutError) Error() string {
	var b strings.Builder
	b.WriteString("cert: layout rejected:")
	for _, p := range e.Report.Problems {
		if b.Len() > 200 {
			break
		}
		b.WriteString(" ")
		b.WriteString(p.Msg)
		b.WriteString(";")
	}
	fmt.Fprintf(&b, " (%d problem(s))", e.Report.Total())
	return b.String()
}
