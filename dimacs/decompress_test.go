package dimacs

import (
	"bytes"
	"errors"
	"io"
	"testing"

	"github.com/klauspost/compress/zstd"
)

// A zstd stream of RatioGrace+1 MiB of comment lines is far beyond
// MaxRatio: Decompress fails with ErrBomb once RatioGrace bytes are out,
// while the same bytes compressed at a ratio below the limit read in full.
func TestDecompressRatio(t *testing.T) {
	plain := bytes.Repeat([]byte("c\n"), (RatioGrace+1<<20)/2)
	var z bytes.Buffer
	w, err := zstd.NewWriter(&z, zstd.WithEncoderLevel(zstd.SpeedDefault))
	if err != nil {
		t.Fatal(err)
	}
	w.Write(plain)
	w.Close()
	if int64(len(plain)) <= MaxRatio*int64(z.Len()) {
		t.Fatalf("test input compresses only %d:1", len(plain)/z.Len())
	}
	r, err := Decompress(&z)
	if err != nil {
		t.Fatal(err)
	}
	defer r.Close()
	n, err := io.Copy(io.Discard, r)
	if !errors.Is(err, ErrBomb) || n > RatioGrace+1<<20 {
		t.Fatalf("read %d bytes, err %v; want ErrBomb", n, err)
	}
	// uncompressed input is not limited
	r, _ = Decompress(bytes.NewReader(plain))
	if n, err := io.Copy(io.Discard, r); err != nil || n != int64(len(plain)) {
		t.Fatalf("plain: %d bytes, %v", n, err)
	}
}
