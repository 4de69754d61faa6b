package archive

import (
	"errors"
	"fmt"
)

// Kinds of bad bundle. A *BundleError wraps exactly one of them, so callers
// can branch with errors.Is; every one of them means "the bundle is bad"
// (exit 1 in the command), as opposed to an I/O error reading it (exit 2).
var (
	ErrNotBundle     = errors.New("not a spinecert bundle")
	ErrCorrupt       = errors.New("corrupt data")
	ErrTruncated     = errors.New("truncated")
	ErrTrailing      = errors.New("trailing data after the end of the archive")
	ErrUnsafeName    = errors.New("unsafe member name")
	ErrMemberType    = errors.New("member is not a regular file")
	ErrDuplicate     = errors.New("duplicate member")
	ErrOrder         = errors.New("members out of order")
	ErrTooLarge      = errors.New("size limit exceeded")
	ErrBomb          = errors.New("compression ratio limit exceeded")
	ErrUnknownMember = errors.New("unknown member")
	ErrMissingMember = errors.New("missing member")
	ErrChecksum      = errors.New("checksum mismatch")
	ErrSums          = errors.New("bad SHA256SUMS")
	ErrManifest      = errors.New("bad manifest")
)

// BundleError reports what is wrong with a bundle and where.
type BundleError struct {
	Bundle string // bundle file name ("" when unknown)
	Member string // member name ("" when not about one member)
	Kind   error  // one of the Err... kinds above
	Detail string // what was found, for people
}

func (e *BundleError) Error() string {
	s := "archive: "
	if e.Bundle != "" {
		s += e.Bundle + ": "
	}
	if e.Member != "" {
		s += fmt.Sprintf("member %q: ", e.Member)
	}
	s += e.Kind.Error()
	if e.Detail != "" {
		s += ": " + e.Detail
	}
	return s
}

func (e *BundleError) Unwrap() error { return e.Kind }

// IsBadBundle reports whether err says the bundle itself is bad (as opposed
// to the bundle being unreadable, or the caller giving up).
func IsBadBundle(err error) bool {
	var be *BundleError
	return errors.As(err, &be)
}

// ErrBadClaim is wrapped by Claim.Validate: the claim breaks its own rules
// (kind, bound, K, page kinds).
var ErrBadClaim = errors.New("archive: bad claim")

// ErrRejected is wrapped by Build when the evidence given does not hold up:
// the layout fails the check or the proof fails a checker.
var ErrRejected = errors.New("archive: evidence rejected")

// ErrExists is returned (wrapped) by Extract when a member would replace an
// existing file.
var ErrExists = errors.New("archive: file exists")
