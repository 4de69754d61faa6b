package archive

import (
	"archive/tar"
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/klauspost/compress/zstd"
)

func sampleMembers() []Source {
	return []Source{
		BytesSource("manifest.json", []byte(`{"x":1}`+"\n")),
		BytesSource("graph/input.txt", []byte("1 2\n2 3\n")),
		BytesSource("proofs/refutation.drat", bytes.Repeat([]byte{'a', 0x81, 0x02, 0}, 5000)),
	}
}

func writeBytes(t testing.TB, ms []Source) []byte {
	t.Helper()
	var buf bytes.Buffer
	if err := Write(context.Background(), &buf, ms); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

func walkAll(b []byte) (map[string][]byte, error) {
	got := map[string][]byte{}
	c, err := Walk(context.Background(), bytes.NewReader(b), "test.spinecert.tar.zst", DefaultLimits(), func(m Member, r io.Reader) error {
		d, err := io.ReadAll(r)
		got[m.Name] = d
		return err
	})
	if err == nil && !c.Canonical {
		err = &BundleError{Kind: ErrCorrupt, Detail: fmt.Sprintf("not canonical at byte %d", c.DiffersAt)}
	}
	return got, err
}

func TestWriteWalkRoundTrip(t *testing.T) {
	ms := sampleMembers()
	b := writeBytes(t, ms)
	got, err := walkAll(b)
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != len(ms) {
		t.Fatalf("got %d members, want %d", len(got), len(ms))
	}
	for _, m := range ms {
		rc, _ := m.Open()
		want, _ := io.ReadAll(rc)
		if !bytes.Equal(got[m.Name], want) {
			t.Errorf("member %s differs", m.Name)
		}
	}
}

// Building the same members twice, in any order, gives the same bytes.
func TestWriteDeterministic(t *testing.T) {
	ms := sampleMembers()
	a := writeBytes(t, ms)
	rev := []Source{ms[2], ms[0], ms[1]}
	b := writeBytes(t, rev)
	if !bytes.Equal(a, b) {
		t.Fatal("two writes of the same members differ")
	}
}

// The tar headers carry fixed modes, owners and times (checked with the
// standard library's reader, independent of ours).
func TestWriteHeaders(t *testing.T) {
	b := writeBytes(t, sampleMembers())
	zr, err := zstd.NewReader(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	defer zr.Close()
	tr := tar.NewReader(zr)
	var names []string
	for {
		h, err := tr.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatal(err)
		}
		names = append(names, h.Name)
		if h.Mode != 0o644 || h.Uid != 0 || h.Gid != 0 || h.Uname != "" || h.Gname != "" || !h.ModTime.Equal(time.Unix(0, 0)) || h.Typeflag != tar.TypeReg {
			t.Errorf("%s: header %+v", h.Name, h)
		}
	}
	want := "SHA256SUMS graph/input.txt manifest.json proofs/refutation.drat"
	if strings.Join(names, " ") != want {
		t.Errorf("member order %v, want %s", names, want)
	}
}

// rawEntry is one member of a hand-made (possibly hostile) archive.
type rawEntry struct {
	hdr  tar.Header
	data []byte
}

func reg(name string, data []byte) rawEntry {
	return rawEntry{tar.Header{Typeflag: tar.TypeReg, Name: name, Mode: 0o644, Size: int64(len(data))}, data}
}

// sumsFor returns a SHA256SUMS entry listing the given members.
func sumsFor(es ...rawEntry) rawEntry {
	var b strings.Builder
	for _, e := range es {
		h := sha256.Sum256(e.data)
		fmt.Fprintf(&b, "%s  %s\n", hex.EncodeToString(h[:]), e.hdr.Name)
	}
	return reg(SumsName, []byte(b.String()))
}

func rawBundle(t testing.TB, es ...rawEntry) []byte {
	t.Helper()
	var tb bytes.Buffer
	tw := tar.NewWriter(&tb)
	for _, e := range es {
		h := e.hdr
		if err := tw.WriteHeader(&h); err != nil {
			t.Fatal(err)
		}
		if _, err := tw.Write(e.data); err != nil {
			t.Fatal(err)
		}
	}
	tw.Close()
	return compress(t, tb.Bytes())
}

func compress(t testing.TB, b []byte) []byte {
	var out bytes.Buffer
	zw, _ := zstd.NewWriter(&out)
	zw.Write(b)
	zw.Close()
	return out.Bytes()
}

func TestHostileArchives(t *testing.T) {
	ok := reg("manifest.json", []byte("{}\n"))
	link := func(typ byte, name, target string) rawEntry {
		return rawEntry{tar.Header{Typeflag: typ, Name: name, Linkname: target, Mode: 0o777}, nil}
	}
	huge := rawEntry{tar.Header{Typeflag: tar.TypeReg, Name: "proofs/big.drat", Mode: 0o644, Size: 10 << 30}, nil}
	valid := rawBundle(t, sumsFor(ok), ok)
	tests := []struct {
		name string
		data []byte
		kind error
	}{
		{"traversal", rawBundle(t, sumsFor(ok), reg("../evil", []byte("x"))), ErrUnsafeName},
		{"nested traversal", rawBundle(t, sumsFor(ok), reg("proofs/../../evil", []byte("x"))), ErrUnsafeName},
		{"absolute", rawBundle(t, sumsFor(ok), reg("/tmp/evil", []byte("x"))), ErrUnsafeName},
		{"symlink", rawBundle(t, sumsFor(ok), link(tar.TypeSymlink, "proofs", "/etc")), ErrMemberType},
		{"hardlink", rawBundle(t, sumsFor(ok), link(tar.TypeLink, "proofs/x", "/etc/passwd")), ErrMemberType},
		{"device", rawBundle(t, sumsFor(ok), rawEntry{tar.Header{Typeflag: tar.TypeChar, Name: "dev", Devmajor: 1, Devminor: 3}, nil}), ErrMemberType},
		{"directory", rawBundle(t, sumsFor(ok), rawEntry{tar.Header{Typeflag: tar.TypeDir, Name: "proofs", Mode: 0o755}, nil}), ErrMemberType},
		{"10 GB member", rawBundle(t, sumsFor(ok), huge), ErrTooLarge},
		{"duplicate", rawBundle(t, sumsFor(ok), ok, ok), ErrDuplicate},
		{"duplicate sums", rawBundle(t, sumsFor(ok), sumsFor(ok), ok), ErrDuplicate},
		{"unlisted", rawBundle(t, sumsFor(ok), ok, reg("proofs/extra.drat", []byte("x"))), ErrUnknownMember},
		{"missing", rawBundle(t, sumsFor(ok, reg("proofs/p.drat", []byte("p"))), ok), ErrMissingMember},
		{"sums not first", rawBundle(t, ok, sumsFor(ok)), ErrOrder},
		{"out of order", rawBundle(t, sumsFor(reg("a", nil), reg("b", nil)), reg("b", nil), reg("a", nil)), ErrOrder},
		{"bad hash", rawBundle(t, sumsFor(ok), reg("manifest.json", []byte("{]\n"))), ErrChecksum},
		{"bad sums line", rawBundle(t, reg(SumsName, []byte("abc manifest.json\n")), ok), ErrSums},
		{"empty archive", rawBundle(t), ErrMissingMember},
		{"not zstd", []byte("hello, this is text"), ErrNotBundle},
		{"truncated", valid[:len(valid)-10], nil},
		{"trailing garbage", append(append([]byte{}, valid...), []byte("garbage after the frame")...), ErrTrailing},
		{"trailing tar data", compress(t, append(tarBytes(t, sumsFor(ok), ok), []byte("junk")...)), ErrTrailing},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			target := filepath.Join(dir, "out")
			_, err := Extract(context.Background(), bytes.NewReader(tc.data), "hostile.spinecert.tar.zst", target, DefaultLimits())
			if err == nil {
				t.Fatal("accepted")
			}
			if !IsBadBundle(err) {
				t.Fatalf("error %v is not a bad-bundle error", err)
			}
			if tc.kind != nil && !errors.Is(err, tc.kind) {
				t.Fatalf("error %v, want kind %v", err, tc.kind)
			}
			if !strings.Contains(err.Error(), "hostile.spinecert.tar.zst") {
				t.Errorf("error %q does not name the bundle", err)
			}
			assertOnly(t, dir, "out")
			assertOnly(t, target)
		})
	}
}

func tarBytes(t testing.TB, es ...rawEntry) []byte {
	var tb bytes.Buffer
	tw := tar.NewWriter(&tb)
	for _, e := range es {
		h := e.hdr
		tw.WriteHeader(&h)
		tw.Write(e.data)
	}
	tw.Close()
	return tb.Bytes()
}

// assertOnly checks that dir holds exactly the given names.
func assertOnly(t *testing.T, dir string, names ...string) {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, e := range es {
		got = append(got, e.Name())
	}
	if strings.Join(got, ",") != strings.Join(names, ",") {
		t.Errorf("%s holds %v, want %v", dir, got, names)
	}
}

// A zstd bomb: a small compressed stream that expands to gigabytes of a
// member that claims to be small enough is stopped by the ratio cap long
// before the total cap.
func TestZstdBomb(t *testing.T) {
	const size = 3 << 30
	var tb bytes.Buffer
	tw := tar.NewWriter(&tb)
	sums := []byte(strings.Repeat("0", 64) + "  a\n")
	tw.WriteHeader(&tar.Header{Typeflag: tar.TypeReg, Name: SumsName, Mode: 0o644, Size: int64(len(sums))})
	tw.Write(sums)
	tw.WriteHeader(&tar.Header{Typeflag: tar.TypeReg, Name: "a", Mode: 0o644, Size: size})
	var out bytes.Buffer
	zw, _ := zstd.NewWriter(&out, zstd.WithEncoderConcurrency(1))
	zw.Write(tb.Bytes())
	zero := make([]byte, 1<<20)
	for i := 0; i < size>>20; i++ {
		zw.Write(zero)
	}
	zw.Close()
	if out.Len() > 1<<20 {
		t.Fatalf("bomb is %d bytes, expected a small one", out.Len())
	}
	_, err := Walk(context.Background(), bytes.NewReader(out.Bytes()), "bomb", DefaultLimits(), nil)
	if !errors.Is(err, ErrBomb) {
		t.Fatalf("got %v, want a compression ratio error", err)
	}
}

func TestExtractAndSha256sum(t *testing.T) {
	b := writeBytes(t, sampleMembers())
	dir := t.TempDir()
	c, err := Extract(context.Background(), bytes.NewReader(b), "b", dir, DefaultLimits())
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Members) != 3 {
		t.Fatalf("%d members", len(c.Members))
	}
	assertOnly(t, dir, SumsName, "graph", "manifest.json", "proofs")
	// Outside check: GNU coreutils sha256sum accepts the extracted SHA256SUMS.
	sum, err := exec.LookPath("sha256sum")
	if err != nil {
		t.Skip("sha256sum not found on PATH: install the Debian package coreutils")
	}
	cmd := exec.Command(sum, "--strict", "-c", SumsName)
	cmd.Dir = dir
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("sha256sum -c: %v\n%s", err, out)
	}
	if strings.Count(string(out), ": OK") != 3 {
		t.Fatalf("sha256sum -c output:\n%s", out)
	}
	// A second extraction into the same directory refuses to replace files.
	if _, err := Extract(context.Background(), bytes.NewReader(b), "b", dir, DefaultLimits()); !errors.Is(err, ErrExists) {
		t.Fatalf("second extract: %v", err)
	}
	assertOnly(t, dir, SumsName, "graph", "manifest.json", "proofs")
}

func TestWriteFileAtomicCancel(t *testing.T) {
	dir := t.TempDir()
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	err := WriteFile(ctx, filepath.Join(dir, "x.spinecert.tar.zst"), sampleMembers())
	if !errors.Is(err, context.Canceled) {
		t.Fatalf("got %v", err)
	}
	assertOnly(t, dir)
	if err := WriteFile(context.Background(), filepath.Join(dir, "x.spinecert.tar.zst"), sampleMembers()); err != nil {
		t.Fatal(err)
	}
	assertOnly(t, dir, "x.spinecert.tar.zst")
}

// Flipping any byte of a bundle file is caught.
func TestFlipBundleBytes(t *testing.T) {
	b := writeBytes(t, sampleMembers())
	step := max(1, len(b)/200)
	for i := 0; i < len(b); i += step {
		c := bytes.Clone(b)
		c[i] ^= 0x01
		if _, err := walkAll(c); err == nil {
			t.Errorf("flip at byte %d of %d accepted", i, len(b))
		} else if !IsBadBundle(err) {
			t.Errorf("flip at byte %d: %v is not a bad-bundle error", i, err)
		}
	}
}

// Extraction that fails after the bundle was read leaves nothing in DIR: a
// symbolic link where a member's directory goes is refused before any member
// is moved, and a move that fails halfway is undone.
func TestExtractFailureLeavesNothing(t *testing.T) {
	b := writeBytes(t, sampleMembers())
	t.Run("symlink", func(t *testing.T) {
		dir, elsewhere := t.TempDir(), t.TempDir()
		if err := os.Symlink(elsewhere, filepath.Join(dir, "proofs")); err != nil {
			t.Fatal(err)
		}
		_, err := Extract(context.Background(), bytes.NewReader(b), "b", dir, DefaultLimits())
		if !errors.Is(err, ErrExists) || !strings.Contains(err.Error(), "proofs is not a directory (it is in the way of proofs/refutation.drat)") {
			t.Fatalf("got %v", err)
		}
		assertOnly(t, dir, "proofs")
		assertOnly(t, elsewhere)
	})
	t.Run("file", func(t *testing.T) {
		dir := t.TempDir()
		if err := os.WriteFile(filepath.Join(dir, "graph"), nil, 0o644); err != nil {
			t.Fatal(err)
		}
		if _, err := Extract(context.Background(), bytes.NewReader(b), "b", dir, DefaultLimits()); !errors.Is(err, ErrExists) {
			t.Fatalf("got %v", err)
		}
		assertOnly(t, dir, "graph")
	})
	t.Run("halfway", func(t *testing.T) {
		dir := t.TempDir()
		boom := errors.New("boom")
		testOnlyBeforeMove = func(n string) error {
			if n == "proofs/refutation.drat" {
				return boom
			}
			return nil
		}
		defer func() { testOnlyBeforeMove = func(string) error { return nil } }()
		if _, err := Extract(context.Background(), bytes.NewReader(b), "b", dir, DefaultLimits()); !errors.Is(err, boom) {
			t.Fatalf("got %v", err)
		}
		assertOnly(t, dir)
	})
}
