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
	for _, n := range names {
		if _, err := os.Lstat(filepath.Join(dir, filepath.FromSlash(n))); err == nil {
			return c, fmt.Errorf("%w: %s", ErrExists, filepath.Join(dir, filepath.FromSlash(n)))
		} else if !errors.Is(err, fs.ErrNotExist) {
			return c, fmt.Errorf("archive: %w", err)
		}
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
	for _, n := range names {
		if d := path.Dir(n); d != "." {
			if err := dst.MkdirAll(d, 0o755); err != nil {
				return c, fmt.Errorf("archive: %w", err)
			}
		}
		if err := dst.Rename(path.Join(filepath.ToSlash(rel), n), n); err != nil {
			return c, fmt.Errorf("archive: %w", err)
		}
	}
	return c, nil
}
