package pagenumber

import "errors"

// ErrUndecided is returned (wrapped) by Compute when the bounds could
// not be closed: a solver run ended without a verdict. The result still
// holds the bounds that were established.
var ErrUndecided = errors.New("pagenumber: page number undecided")
