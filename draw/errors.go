package draw

import "errors"

// ErrShape is returned (wrapped) when a layout does not fit its graph.
var ErrShape = errors.New("draw: layout does not fit the graph")
