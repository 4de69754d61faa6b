package archive

import (
	"archive/tar"
	"bufio"
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/klauspost/compress/zstd"
)

// MaxCubes is the most cubes a refutation split into cubes may have in
// one bundle: each has its proof member and its manifest entry.
const MaxCubes = 1 << 16

// Size limits of the reader. A bundle beyond them is rejected as bad.
const (
	MaxMemberSize = 4 << 30          // bytes in one member
	MaxTotalSize  = 16 << 30         // decompressed bytes in the whole bundle
	MaxMembers    = MaxCubes + 256   // members, SHA256SUMS included (a proof per cube)
	MaxRatio      = 1000             // decompressed bytes per compressed byte ...
	RatioGrace    = 64 << 20         // ... once this many bytes are decompressed
	maxSumsSize   = 128 * MaxMembers // one line of at most 128 bytes per member
	maxZeroTail   = 1 << 20          // zero bytes accepted after the end-of-archive blocks
	maxWindow     = 64 << 20
)

// Limits bounds what a reader accepts; DefaultLimits gives the constants above.
type Limits struct {
	MemberSize int64
	TotalSize  int64
	Members    int
	Ratio      int64
	Grace      int64
}

// DefaultLimits returns the limits every command uses.
func DefaultLimits() Limits {
	return Limits{MemberSize: MaxMemberSize, TotalSize: MaxTotalSize, Members: MaxMembers, Ratio: MaxRatio, Grace: RatioGrace}
}

// ValidName checks a member name: a relative slash-separated path of at most
// three components of [A-Za-z0-9._-], none "." or "..", at most 100 bytes.
func ValidName(name string) error {
	switch {
	case name == "":
		return errors.New("empty name")
	case strings.HasPrefix(name, "/"):
		return fmt.Errorf("absolute path %q", name)
	case len(name) > 100:
		return fmt.Errorf("name of %d bytes (at most 100)", len(name))
	}
	parts := strings.Split(name, "/")
	if len(parts) > 3 {
		return fmt.Errorf("%q is nested too deeply (at most 3 components)", name)
	}
	for _, p := range parts {
		switch p {
		case "":
			return fmt.Errorf("%q has an empty path component", name)
		case ".", "..":
			return fmt.Errorf("%q leaves its directory (component %q)", name, p)
		}
		for i := 0; i < len(p); i++ {
			c := p[i]
			if !(c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '.' || c == '_' || c == '-') {
				return fmt.Errorf("%q has the character %q (expected A-Z a-z 0-9 . _ - /)", name, c)
			}
		}
	}
	return nil
}

// Member describes one member while it is read.
type Member struct {
	Name   string
	Size   int64
	SHA256 string // the hash SHA256SUMS gives for it
}

// Contents is what a walk over a bundle found.
type Contents struct {
	Members []Member // in archive order, SHA256SUMS excluded
	Sums    []byte   // the SHA256SUMS member as stored
	Packed  int64    // compressed bytes read
	Total   int64    // decompressed bytes

	// Canonical tells whether the compressed bytes are exactly what this
	// program's writer makes of the decompressed bytes; if not, DiffersAt is
	// the offset of the first difference. Only meaningful when the bundle was
	// written with the same version of the compressor (CompressVersion).
	Canonical bool
	DiffersAt int64
}

// srcReader remembers an error of the underlying reader, so that a failing
// disk is told apart from a bad bundle.
type srcReader struct {
	r     io.Reader
	n     int64
	err   error
	canon *canon
}

func (s *srcReader) Read(p []byte) (int, error) {
	n, err := s.r.Read(p)
	s.n += int64(n)
	s.canon.source(p[:n])
	if err != nil && err != io.EOF {
		s.err = err
	}
	return n, err
}

// errReader remembers the first error other than io.EOF it returned.
type errReader struct {
	r   io.Reader
	err error
}

func (e *errReader) Read(p []byte) (int, error) {
	n, err := e.r.Read(p)
	if err != nil && err != io.EOF && e.err == nil {
		e.err = err
	}
	return n, err
}

// limitReader counts decompressed bytes and enforces the total and ratio caps.
type limitReader struct {
	r    io.Reader
	src  *srcReader
	lim  Limits
	n    int64
	fail error
}

func (l *limitReader) Read(p []byte) (int, error) {
	if l.fail != nil {
		return 0, l.fail
	}
	n, err := l.r.Read(p)
	l.n += int64(n)
	l.src.canon.content(p[:n])
	if l.n > l.lim.TotalSize {
		l.fail = &BundleError{Kind: ErrTooLarge, Detail: fmt.Sprintf("more than %d bytes decompressed", l.lim.TotalSize)}
		return n, l.fail
	}
	if l.n > l.lim.Grace && l.n > l.lim.Ratio*max(l.src.n, 1) {
		l.fail = &BundleError{Kind: ErrBomb, Detail: fmt.Sprintf("%d bytes from %d compressed (more than %d:1)", l.n, l.src.n, l.lim.Ratio)}
		return n, l.fail
	}
	return n, err
}

// Walk reads the bundle in r and calls fn for every member except
// SHA256SUMS, in archive order, with a reader of its contents. It trusts
// nothing: the first member must be SHA256SUMS, every other member must be
// listed there exactly once and appear in name order, every listed member
// must appear, and each member's hash is compared after fn returns (the rest
// of a member fn did not read is read and hashed). fn must therefore not act
// on what it read before Walk returns nil. name is used in messages.
//
// Errors: a *BundleError when the bundle is bad, the error from fn as is,
// ctx.Err() when cancelled, and any other error when r cannot be read.
func Walk(ctx context.Context, r io.Reader, name string, lim Limits, fn func(m Member, r io.Reader) error) (*Contents, error) {
	c, err := walk(ctx, r, lim, fn)
	var be *BundleError
	if errors.As(err, &be) && be.Bundle == "" {
		be.Bundle = name
	}
	return c, err
}

func walk(ctx context.Context, r io.Reader, lim Limits, fn func(m Member, r io.Reader) error) (*Contents, error) {
	src := &srcReader{r: r, canon: newCanon()}
	defer src.canon.finish()
	br := bufio.NewReaderSize(src, 64<<10)
	head, err := br.Peek(4)
	if src.err != nil {
		return nil, src.err
	}
	if err != nil || !bytes.Equal(head, []byte{0x28, 0xb5, 0x2f, 0xfd}) {
		return nil, &BundleError{Kind: ErrNotBundle, Detail: "not zstd-compressed (expected a .spinecert.tar.zst file)"}
	}
	zr, err := zstd.NewReader(br, zstd.WithDecoderConcurrency(1), zstd.WithDecoderMaxWindow(maxWindow), zstd.WithDecoderLowmem(true))
	if err != nil {
		return nil, fmt.Errorf("archive: zstd: %w", err)
	}
	defer zr.Close()
	lr := &limitReader{r: zr, src: src, lim: lim}
	tr := tar.NewReader(ctxReader{ctx, lr})
	c := &Contents{}
	// classify turns an error from the tar or zstd layer into the right kind.
	classify := func(err error, member string, atEnd bool) error {
		var be *BundleError
		switch {
		case err == nil:
			return nil
		case ctx.Err() != nil:
			return ctx.Err()
		case src.err != nil:
			return fmt.Errorf("archive: reading bundle: %w", src.err)
		case errors.As(err, &be):
			if be.Member == "" {
				be.Member = member
			}
			return be
		case atEnd:
			return &BundleError{Kind: ErrTrailing, Detail: err.Error()}
		case errors.Is(err, io.ErrUnexpectedEOF):
			return &BundleError{Member: member, Kind: ErrTruncated, Detail: "the archive ends early"}
		}
		return &BundleError{Member: member, Kind: ErrCorrupt, Detail: err.Error()}
	}
	var want map[string]string
	var order []string
	seen := map[string]bool{}
	last := ""
	for i := 0; ; i++ {
		hdr, err := tr.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return c, classify(err, "", false)
		}
		if err := checkHeader(hdr, lim); err != nil {
			return c, err
		}
		if i == 0 {
			if hdr.Name != SumsName {
				return c, &BundleError{Member: hdr.Name, Kind: ErrOrder, Detail: "the first member must be " + SumsName}
			}
			if hdr.Size > maxSumsSize {
				return c, &BundleError{Member: SumsName, Kind: ErrTooLarge, Detail: fmt.Sprintf("%d bytes (at most %d)", hdr.Size, maxSumsSize)}
			}
			data, err := io.ReadAll(tr)
			if err != nil {
				return c, classify(err, SumsName, false)
			}
			c.Sums = data
			if want, order, err = ParseSums(data); err != nil {
				return c, err
			}
			if len(order)+1 > lim.Members {
				return c, &BundleError{Member: SumsName, Kind: ErrTooLarge, Detail: fmt.Sprintf("%d members listed (at most %d)", len(order)+1, lim.Members)}
			}
			continue
		}
		switch sum, ok := want[hdr.Name]; {
		case seen[hdr.Name] || hdr.Name == SumsName:
			return c, &BundleError{Member: hdr.Name, Kind: ErrDuplicate, Detail: "the name occurs twice"}
		case !ok:
			return c, &BundleError{Member: hdr.Name, Kind: ErrUnknownMember, Detail: "not listed in " + SumsName}
		case hdr.Name < last:
			return c, &BundleError{Member: hdr.Name, Kind: ErrOrder, Detail: fmt.Sprintf("after %q (members must be sorted by name)", last)}
		default:
			seen[hdr.Name] = true
			last = hdr.Name
			m := Member{Name: hdr.Name, Size: hdr.Size, SHA256: sum}
			h := sha256.New()
			rec := &errReader{r: tr}
			body := io.TeeReader(rec, h)
			if fn != nil {
				if err := fn(m, body); err != nil {
					if rec.err != nil {
						// fn failed because the archive could not be read: say why.
						return c, classify(rec.err, hdr.Name, false)
					}
					return c, err
				}
			}
			if _, err := io.Copy(io.Discard, body); err != nil {
				return c, classify(err, hdr.Name, false)
			}
			if got := hex.EncodeToString(h.Sum(nil)); got != sum {
				return c, &BundleError{Member: hdr.Name, Kind: ErrChecksum, Detail: fmt.Sprintf("SHA-256 is %s, %s lists %s", got, SumsName, sum)}
			}
			c.Members = append(c.Members, m)
		}
	}
	if want == nil {
		return c, &BundleError{Kind: ErrMissingMember, Detail: "the archive is empty (no " + SumsName + ")"}
	}
	for _, n := range order {
		if !seen[n] {
			return c, &BundleError{Member: n, Kind: ErrMissingMember, Detail: "listed in " + SumsName + " but not in the archive"}
		}
	}
	// After the end-of-archive blocks only zero padding may follow, and the
	// zstd stream must end cleanly.
	var buf [32 << 10]byte
	zeros := int64(0)
	for {
		n, err := lr.Read(buf[:])
		for _, b := range buf[:n] {
			if b != 0 {
				return c, &BundleError{Kind: ErrTrailing, Detail: "data after the end-of-archive blocks"}
			}
		}
		zeros += int64(n)
		if zeros > maxZeroTail {
			return c, &BundleError{Kind: ErrTrailing, Detail: fmt.Sprintf("more than %d bytes of padding", maxZeroTail)}
		}
		if err == io.EOF {
			break
		}
		if err != nil {
			return c, classify(err, "", true)
		}
	}
	// Whatever follows the zstd stream was consumed by the decoder; make sure
	// the file really ends here.
	if n, _ := br.Read(buf[:1]); n > 0 {
		return c, &BundleError{Kind: ErrTrailing, Detail: "data after the zstd stream"}
	}
	c.Packed, c.Total = src.n, lr.n
	c.Canonical, c.DiffersAt = src.canon.finish()
	return c, nil
}

func checkHeader(hdr *tar.Header, lim Limits) error {
	name := hdr.Name
	if err := ValidName(name); err != nil {
		return &BundleError{Member: name, Kind: ErrUnsafeName, Detail: err.Error()}
	}
	switch hdr.Typeflag {
	case tar.TypeReg:
	case tar.TypeSymlink:
		return &BundleError{Member: name, Kind: ErrMemberType, Detail: fmt.Sprintf("symbolic link to %q", hdr.Linkname)}
	case tar.TypeLink:
		return &BundleError{Member: name, Kind: ErrMemberType, Detail: fmt.Sprintf("hard link to %q", hdr.Linkname)}
	case tar.TypeChar, tar.TypeBlock, tar.TypeFifo:
		return &BundleError{Member: name, Kind: ErrMemberType, Detail: "device or fifo"}
	case tar.TypeDir:
		return &BundleError{Member: name, Kind: ErrMemberType, Detail: "directory"}
	default:
		return &BundleError{Member: name, Kind: ErrMemberType, Detail: fmt.Sprintf("tar type flag %q", hdr.Typeflag)}
	}
	if hdr.Size < 0 || hdr.Size > lim.MemberSize {
		return &BundleError{Member: name, Kind: ErrTooLarge, Detail: fmt.Sprintf("claims %d bytes (at most %d per member)", hdr.Size, lim.MemberSize)}
	}
	return nil
}

// ParseSums parses a SHA256SUMS member in the format of GNU coreutils
// sha256sum (text mode): one line "<64 lowercase hex>  <name>\n" per member,
// sorted by name, no duplicates. It returns the hash of each name and the
// names in order.
func ParseSums(data []byte) (map[string]string, []string, error) {
	want := map[string]string{}
	var order []string
	if len(data) == 0 {
		return want, order, nil
	}
	if data[len(data)-1] != '\n' {
		return nil, nil, &BundleError{Member: SumsName, Kind: ErrSums, Detail: "the last line does not end with a newline"}
	}
	lines := strings.Split(string(data[:len(data)-1]), "\n")
	for i, ln := range lines {
		at := func(format string, args ...any) error {
			return &BundleError{Member: SumsName, Kind: ErrSums, Detail: fmt.Sprintf("line %d: ", i+1) + fmt.Sprintf(format, args...)}
		}
		if len(ln) < 67 || ln[64:66] != "  " {
			return nil, nil, at("expected 64 hex digits, two spaces and a member name")
		}
		sum, name := ln[:64], ln[66:]
		for j := 0; j < 64; j++ {
			if c := sum[j]; !(c >= '0' && c <= '9' || c >= 'a' && c <= 'f') {
				return nil, nil, at("column %d: expected a lowercase hex digit, found %q", j+1, c)
			}
		}
		if err := ValidName(name); err != nil {
			return nil, nil, at("%v", err)
		}
		if name == SumsName {
			return nil, nil, at("%s lists itself", SumsName)
		}
		if _, dup := want[name]; dup {
			return nil, nil, at("%q listed twice", name)
		}
		if len(order) > 0 && name < order[len(order)-1] {
			return nil, nil, at("%q after %q (names must be sorted)", name, order[len(order)-1])
		}
		want[name] = sum
		order = append(order, name)
	}
	return want, order, nil
}
