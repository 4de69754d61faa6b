package planar

import "errors"

// ErrPlanar is returned (wrapped) by FindKuratowski when the graph is planar.
var ErrPlanar = errors.New("planar: graph is planar")

// ErrNotPlanar is returned (wrapped) where a planar graph is required.
var ErrNotPlanar = errors.New("planar: graph is not planar")
