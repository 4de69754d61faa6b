package main

import (
	"encoding/json"
	"fmt"
	"io"
	"os"

	"github.com/spf13/cobra"
	"spinecert.dev/atomicfile"
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

// writeFileAtomic writes a file with atomicfile.Write, so that path is
// never left half-written; "-" writes to stdout. A device or FIFO is
// written directly, and new files get mode 0666 less the umask. An error of
// write is returned as it is; failing to create, sync or rename the file is
// a usage error.
func writeFileAtomic(path string, stdout io.Writer, write func(io.Writer) error) error {
	if path == "-" {
		return write(stdout)
	}
	var werr error
	err := atomicfile.Write(path, func(w io.Writer) error {
		werr = write(w)
		return werr
	})
	if err != nil && werr == nil {
		return usageErr(fmt.Errorf("cannot write %s: %w", path, err))
	}
	return err
}
