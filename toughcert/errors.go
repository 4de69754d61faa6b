package toughcert

import "errors"

// ErrRejected is returned (wrapped) when a toughness certificate is rejected.
var ErrRejected = errors.New("toughcert: certificate rejected")
