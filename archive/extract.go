package archive

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"slices"
)

// Extract unpacks the bundle read from r into dir (created if missing).
// Members go first into a fresh staging directory inside dir, opened as an
// os.Root so that no name can reach outside it; only when the whole bundle
// has been read and every hash matched are they moved into place. On any
// error nothing is left in dir but what was there before. Existing files are
// never replaced. SHA256SUMS is extracted too, so `sha256sum -c SHA256SUMS`
// can be run in dir.
func Extract(ctx context.Context, r io.Reader, name, dir string, lim Limits) (*Contents, error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, fmt.Errorf("archive: %w", err)
	}
	stage, err := os.MkdirTemp(dir, ".spinecert-extract-*")
	if err != nil {
		return nil, fmt.Errorf("archive: %w", err)
	}
	defer os.RemoveAll(stage)
	root, err := os.OpenRoot(stage)
	if err != nil {
		return nil, fmt.Errorf("archive: %w", err)
	}
	defer root.Close()
	write := func(name string, r io.Reader) error {
		if d := path.Dir(name); d != "." {
			if err := root.MkdirAll(d, 0o755); err != nil {
				return fmt.Errorf("archive: %w", err)
			}
		}
		f, err := root.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
		if err != nil {
			return fmt.Errorf("archive: %w", err)
		}
		if _, err := io.Copy(f, r); err != nil {
			f.Close()
			return err
		}
		return f.Close()
	}
	c, err := Walk(ctx, r, name, lim, func(m Member, r io.Reader) error { return write(m.Name, r) })
	if err != nil {
		return c, err
	}
	if err := write(SumsName, bytes.NewReader(c.Sums)); err != nil {
		return c, err
	}
	names := []string{SumsName}
	for _, m := range c.Members {
		names = append(names, m.Name)
	}
	dst, err := os.OpenRoot(dir)
	if err != nil {
		return c, fmt.Errorf("archive: %w", err)
	}
	defer dst.Close()
	rel, err := filepath.Rel(dir, stage)
	if err != nil {
		return c, fmt.Errorf("archive: %w", err)
	}
	// Every directory a member goes into must be a directory or missing: a
	// symbolic link or a file in its place would stop the moves halfway.
	for _, n := range names {
		var dirs []string
		for d := path.Dir(n); d != "."; d = path.Dir(d) {
			dirs = append(dirs, d)
		}
		for _, d := range slices.Backward(dirs) { // the top first
			fi, err := dst.Lstat(d)
			switch {
			case errors.Is(err, fs.ErrNotExist):
			case err != nil:
				return c, fmt.Errorf("archive: %w", err)
			case !fi.IsDir():
				return c, fmt.Errorf("%w: %s is not a directory (it is in the way of %s)", ErrExists, filepath.Join(dir, filepath.FromSlash(d)), n)
			}
		}
	}
	for _, n := range names {
		if _, err := os.Lstat(filepath.Join(dir, filepath.FromSlash(n))); err == nil {
			return c, fmt.Errorf("%w: %s", ErrExists, filepath.Join(dir, filepath.FromSlash(n)))
		} else if !errors.Is(err, fs.ErrNotExist) {
			return c, fmt.Errorf("archive: %w", err)
		}
	}
	// Should a move fail all the same, the members moved and the
	// directories made are taken out again, so nothing is left in dir.
	var moved, made []string
	undo := func(err error) (*Contents, error) {
		for _, n := range slices.Backward(moved) {
			dst.Remove(n)
		}
		for _, d := range slices.Backward(made) {
			dst.Remove(d)
		}
		return c, err
	}
	for _, n := range names {
		if d := path.Dir(n); d != "." {
			var missing []string
			for p := d; p != "."; p = path.Dir(p) {
				if _, err := dst.Lstat(p); errors.Is(err, fs.ErrNotExist) {
					missing = append(missing, p)
				}
			}
			if err := dst.MkdirAll(d, 0o755); err != nil {
				return undo(fmt.Errorf("archive: %w", err))
			}
			slices.Reverse(missing) // parents first, as MkdirAll made them
			made = append(made, missing...)
		}
		if err := testOnlyBeforeMove(n); err != nil {
			return undo(err)
		}
		if err := dst.Rename(path.Join(filepath.ToSlash(rel), n), n); err != nil {
			return undo(fmt.Errorf("archive: %w", err))
		}
		moved = append(moved, n)
	}
	return c, nil
}

// testOnlyBeforeMove is called before each member is moved into place; tests
// make it fail to see a failure halfway through the moves undone.
var testOnlyBeforeMove = func(name string) error { return nil }
