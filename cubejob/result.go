package cubejob

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"spinecert.dev/archive"
)

// Result is the finished, checked result of one cube: the formula ∧ cube
// is unsatisfiable by the policy (UNSAT from enough independent backends,
// a proof accepted by spinecert's DRAT checker and the LRAT re-check of its
// output). It is written only after those checks passed, atomically, after
// its proof file; a cube with a readable result of this job is done.
type Result struct {
	Job      string        `json:"job"`  // the work directory's job ID (SHA-256 of job.json)
	Cube     int           `json:"cube"` // 1-based index in cubes.txt
	Literals string        `json:"literals"`
	Runs     []archive.Run `json:"runs"`
	Proof    ProofFile     `json:"proof"`
	// For the benchmarks and --status; not part of any bundle.
	CPUSeconds  float64 `json:"cpu_seconds"`  // solver CPU time of all runs
	WallSeconds float64 `json:"wall_seconds"` // solving and checking
	Host        string  `json:"host,omitempty"`
	Task        string  `json:"task,omitempty"` // "local" or the Slurm array task
}

// ProofFile is the proof a result rests on, beside it in results/.
type ProofFile struct {
	File    string `json:"file"` // name in results/
	Backend string `json:"backend"`
	Format  string `json:"format"`
	Size    int64  `json:"size"`
	SHA256  string `json:"sha256"`
	Lemmas  int64  `json:"lemmas"`
	Core    int64  `json:"core_lemmas"`
}

// Failure records the last attempt at a cube that ended without a result.
type Failure struct {
	Job    string `json:"job"`
	Cube   int    `json:"cube"`
	Reason string `json:"reason"`
	Host   string `json:"host,omitempty"`
	Task   string `json:"task,omitempty"`
}

// RefutedRecord records a satisfiable cube.
type RefutedRecord struct {
	Job     string `json:"job"`
	Cube    int    `json:"cube"`
	Backend string `json:"backend"`
	Layout  string `json:"layout"` // LayoutFile, checked directly
	Pages   int    `json:"pages"`
}

func resultName(i int) string { return fmt.Sprintf("%06d.json", i+1) }

func (w *Work) resultPath(i int) string {
	return filepath.Join(w.Dir, ResultsDir, resultName(i))
}

// ReadResult reads the result of cube i (0-based) and checks that it is
// a result of this job for this cube, with its proof file present at the
// recorded size. With hash, the proof's SHA-256 is checked too. It returns
// os.ErrNotExist (wrapped) when there is no result, and an error wrapping
// ErrBadWork that names the cube for anything else.
func (w *Work) ReadResult(i int, hash bool) (*Result, error) {
	path := w.resultPath(i)
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("cubejob: cube %d: %w", i+1, err)
	}
	bad := func(format string, args ...any) error {
		return fmt.Errorf("%w: cube %d (%s): %s", ErrBadWork, i+1, path, fmt.Sprintf(format, args...))
	}
	r, err := parseResult(data, path)
	if err != nil {
		return nil, fmt.Errorf("%w: cube %d: %w", ErrBadWork, i+1, err)
	}
	switch {
	case r.Job != w.ID:
		return nil, bad("a result of another job (%s; this work directory is %s)", short(r.Job), short(w.ID))
	case r.Cube != i+1:
		return nil, bad("the result of cube %d", r.Cube)
	case r.Literals != w.Cubes[i].String():
		return nil, bad("the result of the cube %q, the cube is %q", r.Literals, w.Cubes[i].String())
	case r.Proof.File == "" || filepath.Base(r.Proof.File) != r.Proof.File:
		return nil, bad("proof file %q is not a file name", r.Proof.File)
	}
	pp := filepath.Join(w.Dir, ResultsDir, r.Proof.File)
	st, err := os.Stat(pp)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return nil, bad("its proof %s is missing", r.Proof.File)
	case err != nil:
		return nil, bad("%v", err)
	case st.Size() != r.Proof.Size:
		return nil, bad("its proof %s has %d bytes, the result records %d (truncated or replaced)", r.Proof.File, st.Size(), r.Proof.Size)
	}
	if hash {
		if err := w.checkProofHash(i, r); err != nil {
			return nil, err
		}
	}
	return r, nil
}

// checkProofHash compares the proof of cube i's result r with the SHA-256
// the result records.
func (w *Work) checkProofHash(i int, r *Result) error {
	sum, _, err := hashFile(w.ProofPath(r))
	switch {
	case err != nil:
		return fmt.Errorf("%w: cube %d (%s): %v", ErrBadWork, i+1, w.resultPath(i), err)
	case sum != r.Proof.SHA256:
		return fmt.Errorf("%w: cube %d (%s): its proof %s has SHA-256 %s, the result records %s", ErrBadWork, i+1, w.resultPath(i), r.Proof.File, sum, r.Proof.SHA256)
	}
	return nil
}

// ProofPath returns the path of the proof of r.
func (w *Work) ProofPath(r *Result) string { return filepath.Join(w.Dir, ResultsDir, r.Proof.File) }

// Remaining returns the 0-based indices of the cubes without a readable
// result of this job (a bad result counts as none: the cube is run again).
func (w *Work) Remaining() []int {
	var out []int
	for i := range w.Cubes {
		if _, err := w.ReadResult(i, false); err != nil {
			out = append(out, i)
		}
	}
	return out
}

// ReadRefuted returns the record of a satisfiable cube, or nil.
func (w *Work) ReadRefuted() (*RefutedRecord, error) {
	data, err := os.ReadFile(filepath.Join(w.Dir, RefutedFile))
	if errors.Is(err, os.ErrNotExist) {
		return nil, nil
	}
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	r := &RefutedRecord{}
	if err := decodeJSON(data, filepath.Join(w.Dir, RefutedFile), r); err != nil {
		return nil, fmt.Errorf("%w: %w", ErrBadWork, err)
	}
	if r.Job != w.ID {
		return nil, fmt.Errorf("%w: %s: a record of another job", ErrBadWork, RefutedFile)
	}
	return r, nil
}

func short(id string) string {
	if len(id) > 12 {
		return id[:12]
	}
	return id
}

// refutedErr states a refuted.json record as the error RunCubes returns.
func refutedErr(w *Work, rec *RefutedRecord) error {
	if w.Subgraph != nil {
		return fmt.Errorf("%w: cube %d is satisfiable: the subgraph has a %d-page %s layout (%s, checked when it was found), so this job cannot refute the graph",
			ErrSubgraphLayout, rec.Cube, rec.Pages, w.Job.Claim.Kind, filepath.Join(w.Dir, rec.Layout))
	}
	return fmt.Errorf("%w: cube %d is satisfiable: %s found a %d-page %s layout, checked directly when it was found (%s)",
		ErrRefuted, rec.Cube, rec.Backend, rec.Pages, w.Job.Claim.Kind, filepath.Join(w.Dir, rec.Layout))
}

// parseResult reads a result file strictly (see parseJob).
func parseResult(data []byte, path string) (*Result, error) {
	r := &Result{}
	if err := decodeJSON(data, path, r); err != nil {
		return nil, err
	}
	if r.Proof.Size < 0 || r.Cube < 1 {
		return nil, fmt.Errorf("%s: a cube number of at least 1 and a proof size of at least 0 are required", path)
	}
	return r, nil
}
