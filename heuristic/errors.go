package heuristic

import "errors"

// ErrKind is returned (wrapped) by Find for a layout kind it cannot search.
var ErrKind = errors.New("heuristic: unsupported layout kind")

// ErrMethod is returned (wrapped) for an unknown method name.
var ErrMethod = errors.New("heuristic: unknown method (expected auto, complete, planar-3-tree, 4-connected, hamiltonian-search or sweep)")

// ErrMethodNotApplicable is returned (wrapped) when a forced method does
// not apply to the graph.
var ErrMethodNotApplicable = errors.New("heuristic: method does not apply")

// ErrNotSubgraph is returned (wrapped) when a host graph given for a
// layout does not contain the graph.
var ErrNotSubgraph = errors.New("heuristic: the graph is not a subgraph of the host")
