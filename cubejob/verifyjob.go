package cubejob

import (
	"context"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"time"

	"spinecert.dev/proof"
)

// VerifyJobFile names the record of a verify job in its directory.
const VerifyJobFile = "verify.json"

// VerifyJob hands the cube proof checks of one bundle to a Slurm job
// array: each array task runs spinecert verify on the bundle for its slice
// of cubes and writes one record per cube into checks/; the verify that
// submitted the array then takes those records instead of checking the
// proofs again (and checks itself every cube without one).
type VerifyJob struct {
	Dir     string `json:"-"`
	Bundle  string `json:"bundle"` // absolute path, as the tasks see it
	SHA256  string `json:"sha256"` // of the bundle file
	Cubes   int    `json:"cubes"`
	PerTask int    `json:"per_task"`
	SlurmID string `json:"slurm_job_id,omitempty"`
}

// CheckRecord is the outcome of one cube proof check by an array task.
type CheckRecord struct {
	Bundle string `json:"bundle_sha256"`
	Cube   int    `json:"cube"` // 1-based
	Proof  string `json:"proof_sha256"`
	Format string `json:"format"`
	DRAT   bool   `json:"drat_ok"`
	LRAT   bool   `json:"lrat_ok"`
	Lemmas int64  `json:"lemmas"`
	Core   int64  `json:"core_lemmas"`
	Detail string `json:"detail,omitempty"`
	Task   string `json:"task,omitempty"`
}

// NewVerifyJob records a verify job for the bundle in dir (created if
// needed).
func NewVerifyJob(dir, bundle string, cubes, perTask int) (*VerifyJob, error) {
	abs, err := filepath.Abs(bundle)
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	sum, _, err := hashFile(abs)
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	if err := os.MkdirAll(filepath.Join(dir, "checks"), 0o755); err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	j := &VerifyJob{Dir: dir, Bundle: abs, SHA256: sum, Cubes: cubes, PerTask: max(1, perTask)}
	return j, j.write()
}

func (j *VerifyJob) write() error {
	data, err := json.MarshalIndent(j, "", "  ")
	if err != nil {
		return fmt.Errorf("cubejob: %w", err)
	}
	return writeAtomic(filepath.Join(j.Dir, VerifyJobFile), append(data, '\n'))
}

// OpenVerifyJob reads the verify job in dir and checks that its bundle is
// still the file it was made for.
func OpenVerifyJob(dir string) (*VerifyJob, error) {
	data, err := os.ReadFile(filepath.Join(dir, VerifyJobFile))
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	j := &VerifyJob{Dir: dir}
	if err := decodeJSON(data, filepath.Join(dir, VerifyJobFile), j); err != nil || j.PerTask < 1 || j.Cubes < 1 {
		return nil, fmt.Errorf("%w: %s: not a verify job (%v)", ErrBadWork, filepath.Join(dir, VerifyJobFile), err)
	}
	sum, _, err := hashFile(j.Bundle)
	if err != nil || sum != j.SHA256 {
		return nil, fmt.Errorf("%w: %s changed since the verify job was made (SHA-256 %s, recorded %s)", ErrBadWork, j.Bundle, sum, j.SHA256)
	}
	return j, nil
}

// Tasks is the number of array tasks.
func (j *VerifyJob) Tasks() int { return (j.Cubes + j.PerTask - 1) / j.PerTask }

// InSlice reports whether the 0-based cube belongs to array task t.
func (j *VerifyJob) InSlice(t, cube int) bool { return cube/j.PerTask == t }

func (j *VerifyJob) recordPath(cube int) string {
	return filepath.Join(j.Dir, "checks", fmt.Sprintf("%06d.json", cube+1))
}

// Record writes the outcome of the check of the 0-based cube's proof.
func (j *VerifyJob) Record(cube int, proofSHA string, out proof.Outcome, task string) error {
	rec := CheckRecord{Bundle: j.SHA256, Cube: cube + 1, Proof: proofSHA, Format: out.Format, DRAT: out.DRAT, LRAT: out.LRAT,
		Lemmas: out.Lemmas, Core: out.Core, Detail: out.Detail, Task: task}
	if out.Err != nil && rec.Detail == "" {
		rec.Detail = out.Err.Error()
	}
	data, err := json.MarshalIndent(rec, "", "  ")
	if err != nil {
		return fmt.Errorf("cubejob: %w", err)
	}
	return writeAtomic(j.recordPath(cube), append(data, '\n'))
}

// Outcome returns the recorded outcome for the 0-based cube, if there is
// a record of this bundle for this cube and this proof.
func (j *VerifyJob) Outcome(cube int, proofSHA string) (proof.Outcome, bool) {
	data, err := os.ReadFile(j.recordPath(cube))
	if err != nil {
		return proof.Outcome{}, false
	}
	var rec CheckRecord
	if err := decodeJSON(data, j.recordPath(cube), &rec); err != nil || rec.Bundle != j.SHA256 || rec.Cube != cube+1 || rec.Proof != proofSHA {
		return proof.Outcome{}, false
	}
	out := proof.Outcome{Format: rec.Format, DRAT: rec.DRAT, LRAT: rec.LRAT, Lemmas: rec.Lemmas, Core: rec.Core, Detail: rec.Detail}
	if !out.OK() && out.Detail == "" {
		out.Detail = "rejected by an array task"
	}
	return out, true
}

// Submit submits the array; every task runs spinecert verify on the
// bundle with taskArgs, "--slurm-task" and its index appended.
func (j *VerifyJob) Submit(ctx context.Context, opt SlurmOptions) error {
	if opt.Executable == "" || !filepath.IsAbs(opt.Executable) {
		return fmt.Errorf("cubejob: the tasks need the absolute path of spinecert, not %q", opt.Executable)
	}
	dir, err := filepath.Abs(j.Dir)
	if err != nil {
		return fmt.Errorf("cubejob: %w", err)
	}
	script := filepath.Join(dir, "verify.sh")
	args := append([]string{opt.Executable, "verify", j.Bundle, "--slurm", dir, "--cubes-per-task", strconv.Itoa(j.PerTask)}, opt.TaskArgs...)
	args = append(args, "--slurm-task", "${SLURM_ARRAY_TASK_ID}")
	if err := writeScript(script, "spinecert verify: one array task of the cube proof checks of "+j.Bundle, args); err != nil {
		return err
	}
	id, err := submitArray(ctx, opt, script, "spinecert-verify", j.Tasks(), filepath.Join(dir, "verify-%A_%a.out"), dir)
	if err != nil {
		return err
	}
	j.SlurmID = id
	return j.write()
}

// Wait polls squeue until the array has left the queue.
func (j *VerifyJob) Wait(ctx context.Context, squeue string) error {
	for {
		states, err := JobStates(ctx, j.SlurmID, squeue)
		if err != nil {
			return err
		}
		if len(states) == 0 {
			return nil
		}
		select {
		case <-ctx.Done():
			return ctx.Err()
		case <-time.After(time.Second):
		}
	}
}
