package atomicfile

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"io"
	"os"
	"path/filepath"
	"syscall"
	"testing"
)

func TestWriteReplacesAndCleansUp(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "out.txt")
	if err := os.WriteFile(path, []byte("old"), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := Write(path, func(w io.Writer) error { _, err := io.WriteString(w, "new"); return err }); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(path); string(b) != "new" {
		t.Fatalf("content %q, want new", b)
	}
	// a failing writer leaves the target as it was and no temporary file
	boom := errors.New("boom")
	if err := Write(path, func(w io.Writer) error { io.WriteString(w, "half"); return boom }); !errors.Is(err, boom) {
		t.Fatalf("error %v, want the writer's", err)
	}
	if b, _ := os.ReadFile(path); string(b) != "new" {
		t.Fatalf("content %q after a failed write, want new", b)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Fatalf("%d entries in the directory, want only the target", len(ents))
	}
}

// New files get 0666 less the umask (POSIX umask semantics; common
// practice, no source), or the mode given exactly.
func TestWriteModes(t *testing.T) {
	old := syscall.Umask(0o027)
	defer syscall.Umask(old)
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a"), filepath.Join(dir, "b")
	w := func(io.Writer) error { return nil }
	if err := Write(a, w); err != nil {
		t.Fatal(err)
	}
	if err := WriteMode(b, 0o644, w); err != nil {
		t.Fatal(err)
	}
	for path, want := range map[string]os.FileMode{a: 0o640, b: 0o644} {
		fi, err := os.Stat(path)
		if err != nil {
			t.Fatal(err)
		}
		if fi.Mode().Perm() != want {
			t.Errorf("%s: mode %v, want %v", filepath.Base(path), fi.Mode().Perm(), want)
		}
	}
}

// A FIFO is written to, not replaced by a regular file.
func TestWriteIntoFIFO(t *testing.T) {
	path := filepath.Join(t.TempDir(), "fifo")
	if err := syscall.Mkfifo(path, 0o600); err != nil {
		t.Skipf("no FIFO here: %v", err)
	}
	got := make(chan string, 1)
	go func() {
		f, err := os.Open(path)
		if err != nil {
			got <- err.Error()
			return
		}
		b, _ := io.ReadAll(f)
		f.Close()
		got <- string(b)
	}()
	if err := Write(path, func(w io.Writer) error { _, err := io.WriteString(w, "through"); return err }); err != nil {
		t.Fatal(err)
	}
	if s := <-got; s != "through" {
		t.Fatalf("read %q from the FIFO, want through", s)
	}
	if fi, err := os.Lstat(path); err != nil || fi.Mode()&os.ModeNamedPipe == 0 {
		t.Fatalf("the FIFO was replaced: %v %v", fi.Mode(), err)
	}
}

// SHA256 agrees with crypto/sha256 over the same bytes (FIPS 180-4).
func TestSHA256(t *testing.T) {
	path := filepath.Join(t.TempDir(), "x")
	data := []byte("spine and pages\n")
	if err := os.WriteFile(path, data, 0o600); err != nil {
		t.Fatal(err)
	}
	sum, n, err := SHA256(path)
	want := sha256.Sum256(data)
	if err != nil || n != int64(len(data)) || sum != hex.EncodeToString(want[:]) {
		t.Fatalf("SHA256 = %s, %d, %v; want %x, %d", sum, n, err, want, len(data))
	}
	if _, _, err := SHA256(filepath.Join(filepath.Dir(path), "missing")); err == nil {
		t.Fatal("no error for a missing file")
	}
}
