package cube

import "errors"

// ErrNotCovering is wrapped when a set of cubes leaves some assignment out.
var ErrNotCovering = errors.New("cube: the cubes do not cover every assignment")

// ErrOverlap is wrapped when two cubes hold at once under some assignment.
var ErrOverlap = errors.New("cube: two cubes overlap")

// ErrNotTree is wrapped by CheckTree when the cubes are not the leaves of
// a complete binary decision tree (they may still cover the space; see
// CoverageCNF for the check by proof).
var ErrNotTree = errors.New("cube: the cubes are not the leaves of a complete binary decision tree")

// ErrTooMany is wrapped when a cube set is beyond the limits of a check.
var ErrTooMany = errors.New("cube: too many cubes")
