package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"
	"spinecert.dev/graph"
)

// graphFlags are the flags of every command that reads a GRAPH argument.
type graphFlags struct {
	format string
	index  int
}

// add registers --graph-format and --index on cmd.
func (f *graphFlags) add(cmd *cobra.Command) {
	cmd.Flags().StringVar(&f.format, "graph-format", "auto", "graph file format: auto, edgelist, dimacs, graph6, sparse6")
	cmd.Flags().IntVar(&f.index, "index", 0, "which graph of a multi-graph file to use (1-based; 0 = the only one)")
}

// load reads the graph chosen by the flags from path ("-" for stdin).
func (f *graphFlags) load(cmd *cobra.Command, path string) (*graph.Graph, error) {
	return loadGraphFormat(cmd.ErrOrStderr(), path, f.format, f.index)
}

// loadAll reads every graph in path (for commands that run over all of them).
func (f *graphFlags) loadAll(cmd *cobra.Command, path string) ([]*graph.Graph, error) {
	res, err := readGraphFile(cmd.ErrOrStderr(), path, f.format)
	if err != nil {
		return nil, err
	}
	return res.Graphs, nil
}

// loadGraph reads one graph (auto-detected format) from path; index is
// 1-based for multi-graph files, 0 when the file must hold exactly one.
// Warnings go to stderr. Errors are input errors (exit 2).
func loadGraph(path string, index int) (*graph.Graph, error) {
	return loadGraphFormat(os.Stderr, path, "auto", index)
}

func readGraphFile(stderr io.Writer, path, format string) (*graph.ReadResult, error) {
	f, err := graph.ParseFormat(format)
	if err != nil {
		return nil, usageErr(err)
	}
	res, err := graph.ReadFile(path, f)
	if err != nil {
		return nil, usageErr(err)
	}
	for _, w := range res.Warnings {
		fmt.Fprintf(stderr, "spinecert: warning: %s\n", w)
	}
	return res, nil
}

func loadGraphFormat(stderr io.Writer, path, format string, index int) (*graph.Graph, error) {
	res, err := readGraphFile(stderr, path, format)
	if err != nil {
		return nil, err
	}
	g, err := res.Pick(path, index)
	if err != nil {
		return nil, usageErr(err)
	}
	return g, nil
}

// writeJSON writes v as one indented JSON object followed by a newline.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

// writeFileAtomic writes a file through a temporary file in the same
// directory, synced and renamed into place, so that path is never left
// half-written. "-" writes to stdout. A path that exists and is not a
// regular file (a device such as /dev/null, a FIFO) is written directly:
// renaming over it would replace it. New files get mode 0666 less the umask.
func writeFileAtomic(path string, stdout io.Writer, write func(io.Writer) error) error {
	if path == "-" {
		return write(stdout)
	}
	if fi, err := os.Stat(path); err == nil && !fi.Mode().IsRegular() {
		return writeDirect(path, write)
	}
	tmp, err := createTemp(path)
	if err != nil {
		return usageErr(fmt.Errorf("cannot write %s: %w", path, err))
	}
	name := tmp.Name()
	ok := false
	defer func() {
		if !ok {
			tmp.Close()
			os.Remove(name)
		}
	}()
	if err := write(tmp); err != nil {
		return err
	}
	if err := tmp.Sync(); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err := os.Rename(name, path); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	ok = true
	return nil
}

// writeDirect writes to an existing file that is not a regular file.
func writeDirect(path string, write func(io.Writer) error) error {
	f, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return usageErr(fmt.Errorf("cannot write %s: %w", path, err))
	}
	if err := write(f); err != nil {
		f.Close()
		return err
	}
	if err := f.Close(); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return nil
}

// createTemp creates a new temporary file beside path. Unlike
// os.CreateTemp (mode 0600) it asks for mode 0666, which the umask filters
// as it does for any file a program creates, so the file renamed into
// place has the mode a user expects.
func createTemp(path string) (*os.File, error) {
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
