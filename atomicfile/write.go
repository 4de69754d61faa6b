package atomicfile

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
)

// Write writes the file at path with write, atomically.
func Write(path string, write func(io.Writer) error) error {
	return WriteMode(path, 0, write)
}

// WriteMode is Write giving a new file mode perm exactly (not filtered by
// the umask); perm 0 means 0666 less the umask. An error returned by write
// is returned as it is.
func WriteMode(path string, perm os.FileMode, write func(io.Writer) error) (err error) {
	if fi, err := os.Stat(path); err == nil && !fi.Mode().IsRegular() {
		return writeDirect(path, write)
	}
	tmp, err := Create(path)
	if err != nil {
		return err
	}
	name := tmp.Name()
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(name)
		}
	}()
	if err := write(tmp); err != nil {
		return err
	}
	if perm != 0 {
		if err := tmp.Chmod(perm); err != nil {
			return err
		}
	}
	if err := tmp.Sync(); err != nil {
		return err
	}
	if err := tmp.Close(); err != nil {
		return err
	}
	if err := os.Rename(name, path); err != nil {
		return err
	}
	if d, err := os.Open(filepath.Dir(path)); err == nil {
		d.Sync()
		d.Close()
	}
	return nil
}

// writeDirect writes to an existing file that is not a regular file.
func writeDirect(path string, write func(io.Writer) error) error {
	f, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return err
	}
	if err := write(f); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// Create creates a new temporary file beside path (".BASE.tmp-RANDOM").
// Unlike os.CreateTemp (mode 0600) it asks for mode 0666, which the umask
// filters, so a file renamed into place has the mode a user expects.
func Create(path string) (*os.File, error) {
	dir, base := filepath.Split(path)
	for range 1000 {
		name := filepath.Join(dir, fmt.Sprintf(".%s.tmp-%016x", base, rand.Uint64()))
		f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o666)
		if !errors.Is(err, fs.ErrExist) {
			return f, err
		}
	}
	return nil, fmt.Errorf("no unused temporary file name in %s", filepath.Dir(path))
}

// SHA256 returns the SHA-256 (lowercase hex) and the size of the file at
// path.
func SHA256(path string) (string, int64, error) {
	f, err := os.Open(path)
	if err != nil {
		return "", 0, err
	}
	defer f.Close()
	h := sha256.New()
	n, err := io.Copy(h, f)
	if err != nil {
		return "", 0, err
	}
	return hex.EncodeToString(h.Sum(nil)), n, nil
}
