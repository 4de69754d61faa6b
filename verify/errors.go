package verify

import "errors"

// ErrNoSolver is returned when a named backend is not known or not installed.
var ErrNoSolver = errors.New("verify: no such solver")

// ErrEncoderModel is wrapped in a Verdict's Conflict when a checked model
// decodes to a layout that fails cert.Validate: the encoding is wrong.
var ErrEncoderModel = errors.New("verify: model of the CNF decodes to an invalid layout")
