package planarcert

import "errors"

// ErrRejected is returned (wrapped) when a planarity certificate is rejected.
var ErrRejected = errors.New("planarcert: planarity certificate rejected")
