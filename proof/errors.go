package proof

import "errors"

// ErrRejected is wrapped by the error of a check that read its input
// and found the proof wrong. Other errors mean the input could not be read.
var ErrRejected = errors.New("proof: proof rejected")
