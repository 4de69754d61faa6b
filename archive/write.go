package archive

import (
	"archive/tar"
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"os"
	"slices"
	"strings"
	"time"

	"github.com/klauspost/compress/zstd"
	"spinecert.dev/atomicfile"
)

// SumsName is the member holding the SHA-256 of every other member.
const SumsName = "SHA256SUMS"

// Suffix is the file name suffix of a bundle.
const Suffix = ".spinecert.tar.zst"

// memberMode, memberTime: every member is written with mode 0644, owner and
// group 0 with empty names, and modification time 1970-01-01T00:00:00Z
// (Unix time 0), so the bytes depend on the contents alone.
const memberMode = 0o644

var memberTime = time.Unix(0, 0).UTC()

// Source is one member to be written: its name in the bundle, its size and a
// way to open its contents. Open is called twice (once to hash, once to
// write); both reads must give the same bytes.
type Source struct {
	Name string
	Size int64
	Open func() (io.ReadCloser, error)
}

// BytesSource returns a member holding b.
func BytesSource(name string, b []byte) Source {
	return Source{Name: name, Size: int64(len(b)), Open: func() (io.ReadCloser, error) {
		return io.NopCloser(bytes.NewReader(b)), nil
	}}
}

// FileSource returns a member holding the contents of the file at path.
func FileSource(name, path string) (Source, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return Source{}, fmt.Errorf("archive: %w", err)
	}
	if !fi.Mode().IsRegular() {
		return Source{}, fmt.Errorf("archive: %s is not a regular file", path)
	}
	return Source{Name: name, Size: fi.Size(), Open: func() (io.ReadCloser, error) {
		f, err := os.Open(path)
		if err != nil {
			return nil, fmt.Errorf("archive: %w", err)
		}
		return f, nil
	}}, nil
}

// encoderOptions are the fixed zstd settings of every bundle: one thread,
// best-compression level, an 8 MiB window and a content checksum per frame.
// With a given version of github.com/klauspost/compress they make the
// compressed bytes a function of the tar stream alone.
func encoderOptions() []zstd.EOption {
	return []zstd.EOption{
		zstd.WithEncoderConcurrency(1),
		zstd.WithEncoderLevel(zstd.SpeedBestCompression),
		zstd.WithWindowSize(8 << 20),
		zstd.WithEncoderCRC(true),
		zstd.WithZeroFrames(false),
		zstd.WithSingleSegment(false),
	}
}

// Write writes a bundle holding members to w: a tar stream (USTAR) whose
// first member is SHA256SUMS, followed by the members sorted by name,
// compressed as a single zstd stream. Names must be valid member names
// (see ValidName) and distinct.
func Write(ctx context.Context, w io.Writer, members []Source) error {
	ms := slices.Clone(members)
	slices.SortFunc(ms, func(a, b Source) int { return strings.Compare(a.Name, b.Name) })
	for i, m := range ms {
		if err := ValidName(m.Name); err != nil {
			return fmt.Errorf("archive: cannot add member: %w", err)
		}
		if m.Name == SumsName {
			return fmt.Errorf("archive: member name %s is reserved", SumsName)
		}
		if i > 0 && ms[i-1].Name == m.Name {
			return fmt.Errorf("archive: member %q given twice", m.Name)
		}
		if m.Size < 0 || m.Size > MaxMemberSize {
			return fmt.Errorf("archive: member %q: size %d outside 0..%d", m.Name, m.Size, int64(MaxMemberSize))
		}
	}
	sums := make([]string, len(ms))
	var list bytes.Buffer
	for i, m := range ms {
		s, err := hashSource(ctx, m)
		if err != nil {
			return err
		}
		sums[i] = s
		fmt.Fprintf(&list, "%s  %s\n", s, m.Name)
	}
	zw, err := zstd.NewWriter(w, encoderOptions()...)
	if err != nil {
		return fmt.Errorf("archive: zstd: %w", err)
	}
	tw := tar.NewWriter(zw)
	if err := writeMember(ctx, tw, BytesSource(SumsName, list.Bytes()), ""); err != nil {
		zw.Close()
		return err
	}
	for i, m := range ms {
		if err := writeMember(ctx, tw, m, sums[i]); err != nil {
			zw.Close()
			return err
		}
	}
	if err := tw.Close(); err != nil {
		zw.Close()
		return fmt.Errorf("archive: %w", err)
	}
	if err := zw.Close(); err != nil {
		return fmt.Errorf("archive: %w", err)
	}
	return nil
}

// ctxReader stops reading once ctx is done.
type ctxReader struct {
	ctx context.Context
	r   io.Reader
}

func (c ctxReader) Read(p []byte) (int, error) {
	if err := c.ctx.Err(); err != nil {
		return 0, err
	}
	if len(p) > 1<<20 {
		p = p[:1<<20]
	}
	return c.r.Read(p)
}

func hashSource(ctx context.Context, m Source) (string, error) {
	rc, err := m.Open()
	if err != nil {
		return "", err
	}
	defer rc.Close()
	h := sha256.New()
	n, err := io.Copy(h, ctxReader{ctx, rc})
	if err != nil {
		return "", fmt.Errorf("archive: reading member %q: %w", m.Name, err)
	}
	if n != m.Size {
		return "", fmt.Errorf("archive: member %q: expected %d bytes, read %d", m.Name, m.Size, n)
	}
	return hex.EncodeToString(h.Sum(nil)), nil
}

func writeMember(ctx context.Context, tw *tar.Writer, m Source, sum string) error {
	hdr := &tar.Header{
		Typeflag: tar.TypeReg,
		Name:     m.Name,
		Mode:     memberMode,
		Size:     m.Size,
		ModTime:  memberTime,
		Format:   tar.FormatUSTAR,
	}
	if err := tw.WriteHeader(hdr); err != nil {
		return fmt.Errorf("archive: member %q: %w", m.Name, err)
	}
	rc, err := m.Open()
	if err != nil {
		return err
	}
	defer rc.Close()
	h := sha256.New()
	n, err := io.Copy(io.MultiWriter(tw, h), io.LimitReader(ctxReader{ctx, rc}, m.Size+1))
	if err != nil {
		return fmt.Errorf("archive: member %q: %w", m.Name, err)
	}
	if n != m.Size || (sum != "" && hex.EncodeToString(h.Sum(nil)) != sum) {
		return fmt.Errorf("archive: member %q changed while the bundle was written", m.Name)
	}
	return nil
}

// WriteFile writes a bundle to path atomically: through a temporary file in
// the same directory that is synced and renamed into place. On any error,
// including cancellation of ctx, the temporary file is removed and path is
// left as it was. The file gets mode 0666 less the umask. A path that
// exists and is not a regular file (a device, a FIFO) is written directly,
// since renaming over it would replace it.
func WriteFile(ctx context.Context, path string, members []Source) error {
	var werr error
	err := atomicfile.Write(path, func(w io.Writer) error {
		if werr = Write(ctx, w, members); werr == nil {
			werr = ctx.Err()
		}
		return werr
	})
	if err != nil && werr == nil {
		return fmt.Errorf("archive: %w", err)
	}
	return err
}

// sha256Hex is the SHA-256 of b in lowercase hex, as manifests record it.
func sha256Hex(b []byte) string {
	h := sha256.Sum256(b)
	return hex.EncodeToString(h[:])
}
