package heuristic

import "errors"

// ErrKind is returned (wrapped) by Find for a layout kind it cannot search.
var ErrKind = errors.New("heuristic: unsupported layout kind")
