package graph

import "errors"

// ErrSelfLoop is returned (wrapped) when an edge joins a vertex to itself.
var ErrSelfLoop = errors.New("graph: self-loop")

// ErrIndex is wrapped by ReadResult.Pick when the index does not name one
// graph of the file.
var ErrIndex = errors.New("graph: no such graph in the file")

// ErrUnwritableLabels is returned (wrapped) when a graph's labels cannot be
// expressed in the requested format.
var ErrUnwritableLabels = errors.New("graph: labels do not fit the format")

// ErrNotSubgraph is wrapped by CheckSubgraph when a vertex or an edge of the
// smaller graph is missing from the larger one.
var ErrNotSubgraph = errors.New("graph: not a subgraph")
