package cubejob

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"io"
	"os"

	"spinecert.dev/atomicfile"
	"spinecert.dev/textpos"
)

// Names of the files of a work directory.
const (
	JobFile      = "job.json"     // the job manifest, written last
	GraphFile    = "graph.txt"    // the claim's graph, spinecert's canonical edge list
	SubgraphFile = "subgraph.txt" // the subgraph the CNF encodes, when there is one
	CNFFile      = "formula.cnf"  // the CNF all cubes split
	CubesFile    = "cubes.txt"    // the cubes, "a LIT … 0" per line
	ResultsDir   = "results"      // one finished result per cube
	FailuresDir  = "failures"     // the last failed attempt per cube, for --status
	TmpDir       = "tmp"          // per-task scratch directories
	SlurmDir     = "slurm"        // submissions, array scripts and task logs
	RefutedFile  = "refuted.json" // a satisfiable cube: the claim is refuted
	LayoutFile   = "layout.json"  // the layout decoded from that cube's model
	mode         = os.FileMode(0o644)
)

// writeAtomic writes data to path through a temporary file in the same
// directory that is synced and renamed over path, so a reader (or a task
// killed half way) never sees part of it.
func writeAtomic(path string, data []byte) error {
	return writeAtomicFunc(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

func writeAtomicFunc(path string, write func(io.Writer) error) error {
	var werr error
	err := atomicfile.WriteMode(path, mode, func(w io.Writer) error {
		werr = write(w)
		return werr
	})
	switch {
	case werr != nil:
		return fmt.Errorf("cubejob: writing %s: %w", path, werr)
	case err != nil:
		return fmt.Errorf("cubejob: %w", err)
	}
	return nil
}

func sha(data []byte) string {
	h := sha256.Sum256(data)
	return hex.EncodeToString(h[:])
}

func hashFile(path string) (string, int64, error) {
	return atomicfile.SHA256(path)
}

// decodeJSON reads the JSON object in data (the file at path) into v
// strictly, as every reader of the work directory does: no unknown,
// repeated or case-variant keys, nothing after the object. Errors name
// the file.
func decodeJSON(data []byte, path string, v any) error {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	if err := dec.Decode(v); err != nil {
		return fmt.Errorf("%s: %v", path, err)
	}
	if dec.More() {
		return fmt.Errorf("%s: data after the JSON object", path)
	}
	return textpos.CheckJSONKeys(data, path, v)
}
