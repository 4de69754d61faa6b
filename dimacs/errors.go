package dimacs

import "errors"

// ErrInvalidModel is returned (wrapped) by Decode when the model does not
// give a valid layout: it is too short, or the layout it describes fails
// the direct check of package cert.
var ErrInvalidModel = errors.New("dimacs: model does not give a valid layout")

// ErrUnknownVersion is returned (wrapped) by EncodeVersion for a version
// this encoder cannot reproduce.
var ErrUnknownVersion = errors.New("dimacs: unknown encoder version")

// ErrTooLarge is returned when an encoding would need more variables than
// a DIMACS CNF can name.
var ErrTooLarge = errors.New("dimacs: encoding too large")

// ErrNotMember is wrapped by CheckMembership when a clause of a sub-formula
// is not a clause of the on-demand formulation it claims to be part of.
var ErrNotMember = errors.New("dimacs: not a clause of the formulation")

// ErrBomb is returned (wrapped) by a reader from Decompress when the input
// decompresses to more than MaxRatio bytes per compressed byte.
var ErrBomb = errors.New("dimacs: decompression ratio too high")
