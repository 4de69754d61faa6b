package archive

import (
	"bytes"
	"io"
	"runtime/debug"
	"sync"

	"github.com/klauspost/compress/zstd"
)

// CompressModule is the module that compresses bundles.
const CompressModule = "github.com/klauspost/compress"

// Settings names the fixed zstd settings of encoderOptions, as recorded in manifests.
const Settings = "zstd best-compression, 8 MiB window, 1 thread, content checksum, one frame"

// CompressVersion returns the version of CompressModule built into this
// program, or "unknown".
func CompressVersion() string {
	if bi, ok := debug.ReadBuildInfo(); ok {
		for _, d := range bi.Deps {
			if d.Path == CompressModule {
				if d.Replace != nil {
					return d.Replace.Version
				}
				return d.Version
			}
		}
	}
	return "unknown"
}

// canon checks that the compressed bytes of a bundle are exactly those the
// writer produces from the decompressed bytes. zstd can encode the same
// content in many ways, and some bits of a frame do not affect the content
// (the window size field, for instance), so without this check a changed
// byte in the file could go unnoticed. The check holds only for the same
// version of the compressor; Walk reports the outcome in Contents.Canonical.
type canon struct {
	src, enc []byte // bytes of the file and of the re-encoding not yet matched
	matched  int64
	diff     bool
	zw       *zstd.Encoder
}

const maxCanonLag = 16 << 20

// canonEncoders keeps encoders for reuse: making one at the best level
// costs far more than checking a small bundle.
var canonEncoders sync.Pool

func newCanon() *canon {
	c := &canon{}
	if zw, ok := canonEncoders.Get().(*zstd.Encoder); ok {
		zw.Reset(canonSink{c})
		c.zw = zw
		return c
	}
	zw, err := zstd.NewWriter(canonSink{c}, encoderOptions()...)
	if err != nil {
		c.diff = true
		return c
	}
	c.zw = zw
	return c
}

// release closes the encoder and returns it to the pool.
func (c *canon) release() {
	if c.zw != nil {
		zw := c.zw
		zw.Close()
		canonEncoders.Put(zw)
		c.zw = nil
	}
}

type canonSink struct{ c *canon }

func (s canonSink) Write(p []byte) (int, error) {
	if !s.c.diff {
		s.c.enc = append(s.c.enc, p...)
		s.c.match()
	}
	return len(p), nil
}

// source is fed the bytes of the file as they are read.
func (c *canon) source(p []byte) {
	if !c.diff {
		c.src = append(c.src, p...)
		c.match()
	}
}

// content is fed the decompressed bytes as they are read.
func (c *canon) content(p []byte) {
	if !c.diff && c.zw != nil {
		c.zw.Write(p)
	}
}

func (c *canon) match() {
	n := min(len(c.src), len(c.enc))
	if !bytes.Equal(c.src[:n], c.enc[:n]) {
		for i := 0; i < n; i++ {
			if c.src[i] != c.enc[i] {
				c.matched += int64(i)
				break
			}
		}
		c.fail()
		return
	}
	c.matched += int64(n)
	c.src = append(c.src[:0], c.src[n:]...)
	c.enc = append(c.enc[:0], c.enc[n:]...)
	if len(c.src) > maxCanonLag || len(c.enc) > maxCanonLag {
		c.fail()
	}
}

func (c *canon) fail() {
	c.diff = true
	c.src, c.enc = nil, nil
	c.release()
}

// finish flushes the re-encoding and reports whether it matched the file,
// and else the offset of the first difference.
func (c *canon) finish() (bool, int64) {
	c.release()
	if c.diff {
		return false, c.matched
	}
	if len(c.src) != 0 || len(c.enc) != 0 {
		return false, c.matched
	}
	return true, c.matched
}

var _ io.Writer = canonSink{}
