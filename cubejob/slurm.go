package cubejob

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
)

// SlurmOptions controls Submit.
type SlurmOptions struct {
	Partition   string   // --partition ("" = the cluster's default)
	Time        string   // --time per array task ("" = the partition's default)
	Mem         string   // --mem per array task
	CPUsPerTask int      // --cpus-per-task (0 = not given)
	Extra       []string // more sbatch arguments, passed as they are
	PerTask     int      // cubes per array task (0 = 1)
	MaxRunning  int      // at most this many array tasks at once (0 = no limit)
	Executable  string   // the spinecert binary the tasks run (absolute path)
	TaskArgs    []string // arguments for the tasks' "spinecert conquer" (solvers, limits)
	Sbatch      string   // the sbatch command ("" = "sbatch" on PATH)
	Squeue      string   // the squeue command ("" = "squeue" on PATH)
}

// Submission is one job array of a work directory: submit-NNN.json in slurm/.
type Submission struct {
	Seq     int    `json:"seq"`
	Job     string `json:"job"`      // the work directory's job ID
	PerTask int    `json:"per_task"` // cubes per array task
	Cubes   []int  `json:"cubes"`    // 1-based cube numbers, sliced PerTask at a time
	SlurmID string `json:"slurm_job_id,omitempty"`
}

// Tasks is the number of array tasks of s.
func (s *Submission) Tasks() int { return (len(s.Cubes) + s.PerTask - 1) / s.PerTask }

// Slice returns the 0-based cube indices of array task t.
func (s *Submission) Slice(t int) []int {
	var out []int
	for k := t * s.PerTask; k < min(len(s.Cubes), (t+1)*s.PerTask); k++ {
		out = append(out, s.Cubes[k]-1)
	}
	return out
}

func (w *Work) submissionPath(seq int) string {
	return filepath.Join(w.Dir, SlurmDir, fmt.Sprintf("submit-%03d.json", seq))
}

// Submissions reads every submission of the work directory, in order.
func (w *Work) Submissions() ([]*Submission, error) {
	var out []*Submission
	for seq := 1; ; seq++ {
		s, err := w.ReadSubmission(seq)
		if errors.Is(err, os.ErrNotExist) {
			return out, nil
		}
		if err != nil {
			return nil, err
		}
		out = append(out, s)
	}
}

// ReadSubmission reads submission seq.
func (w *Work) ReadSubmission(seq int) (*Submission, error) {
	data, err := os.ReadFile(w.submissionPath(seq))
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	s := &Submission{}
	if err := decodeJSON(data, w.submissionPath(seq), s); err != nil {
		return nil, fmt.Errorf("%w: %w", ErrBadWork, err)
	}
	if s.Job != w.ID || s.Seq != seq || s.PerTask < 1 {
		return nil, fmt.Errorf("%w: %s: not submission %d of this job", ErrBadWork, w.submissionPath(seq), seq)
	}
	for _, c := range s.Cubes {
		if c < 1 || c > len(w.Cubes) {
			return nil, fmt.Errorf("%w: %s: cube %d does not exist", ErrBadWork, w.submissionPath(seq), c)
		}
	}
	return s, nil
}

// CheckIdle returns an error wrapping ErrBusy while a job array of the
// work directory is still queued or running (so that its cubes are not
// run twice at once), and nil when none was submitted or all have left
// the queue.
func (w *Work) CheckIdle(ctx context.Context, squeue string) error {
	subs, err := w.Submissions()
	if err != nil || len(subs) == 0 {
		return err
	}
	states, err := w.Queue(ctx, subs, squeue)
	if errors.Is(err, exec.ErrNotFound) {
		return nil // no scheduler here: nothing of this directory can be queued on this machine
	}
	if err != nil {
		return err
	}
	for _, s := range subs {
		if s.SlurmID == "" && len(states) == 0 {
			// A submission whose job ID was never recorded (conquer was
			// stopped right after sbatch): look for the job by its name.
			if states, err = jobStatesByName(ctx, w.jobName(), squeue); err != nil {
				return err
			}
			break
		}
	}
	if len(states) > 0 {
		return fmt.Errorf("%w: array task %s is %s; wait for it, or cancel it with scancel", ErrBusy, states[0].ID, strings.ToLower(states[0].State))
	}
	return nil
}

// TaskState is the scheduler's view of one array task.
type TaskState struct {
	ID    string // JOBID_TASK
	State string // PENDING, RUNNING, …
}

// Queue asks squeue for the array tasks of the submissions that are still
// queued or running. Without squeue it returns an error.
func (w *Work) Queue(ctx context.Context, subs []*Submission, squeue string) ([]TaskState, error) {
	var states []TaskState
	for _, s := range subs {
		if s.SlurmID == "" {
			continue
		}
		st, err := JobStates(ctx, s.SlurmID, squeue)
		if err != nil {
			return nil, err
		}
		states = append(states, st...)
	}
	return states, nil
}

// jobName is the name the work directory's job arrays are submitted under.
func (w *Work) jobName() string { return "spinecert-" + short(w.ID)[:8] }

// jobStatesByName asks squeue for the array tasks of the jobs of a name.
func jobStatesByName(ctx context.Context, name, squeue string) ([]TaskState, error) {
	if squeue == "" {
		squeue = "squeue"
	}
	out, err := exec.CommandContext(ctx, squeue, "-h", "-r", "--name", name, "-o", "%i %T").Output()
	if err != nil {
		return nil, fmt.Errorf("cubejob: %s: %w", squeue, err)
	}
	return parseStates(out), nil
}

func parseStates(out []byte) []TaskState {
	var states []TaskState
	for _, line := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		if f := strings.Fields(line); len(f) == 2 {
			states = append(states, TaskState{ID: f[0], State: f[1]})
		}
	}
	return states
}

// JobStates asks squeue for the array tasks of one job still in the
// queue; a job that has left it has none.
func JobStates(ctx context.Context, id, squeue string) ([]TaskState, error) {
	if squeue == "" {
		squeue = "squeue"
	}
	out, err := exec.CommandContext(ctx, squeue, "-h", "-r", "-j", id, "-o", "%i %T").Output()
	if err != nil {
		var ee *exec.ExitError
		if errors.As(err, &ee) && strings.Contains(string(ee.Stderr), "Invalid job id") {
			return nil, nil // the job has left the queue
		}
		return nil, fmt.Errorf("cubejob: %s: %w", squeue, err)
	}
	return parseStates(out), nil
}

// Submit submits the cubes without a result as one Slurm job array: it
// writes submit-NNN.json (the cubes, PerTask per array task) and an array
// script, then runs sbatch. It refuses (ErrBusy) while an earlier job of
// the directory is still queued or running, and does nothing (nil, nil)
// when no cube remains.
func (w *Work) Submit(ctx context.Context, opt SlurmOptions) (*Submission, error) {
	if rec, err := w.ReadRefuted(); err != nil || rec != nil {
		if err != nil {
			return nil, err
		}
		return nil, refutedErr(w, rec)
	}
	if err := w.CheckIdle(ctx, opt.Squeue); err != nil {
		return nil, err
	}
	subs, err := w.Submissions()
	if err != nil {
		return nil, err
	}
	w.CleanScratch(true) // nothing of the directory is in the queue
	remaining := w.Remaining()
	if len(remaining) == 0 {
		return nil, nil
	}
	if opt.Executable == "" || !filepath.IsAbs(opt.Executable) {
		return nil, fmt.Errorf("cubejob: the tasks need the absolute path of spinecert, not %q", opt.Executable)
	}
	dir, err := filepath.Abs(w.Dir)
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	s := &Submission{Seq: len(subs) + 1, Job: w.ID, PerTask: max(1, opt.PerTask)}
	for _, i := range remaining {
		s.Cubes = append(s.Cubes, i+1)
	}
	if err := w.writeSubmission(s); err != nil {
		return nil, err
	}
	script := filepath.Join(dir, SlurmDir, fmt.Sprintf("submit-%03d.sh", s.Seq))
	args := append([]string{opt.Executable, "conquer", dir, "--array-task", "${SLURM_ARRAY_TASK_ID}", "--submission", strconv.Itoa(s.Seq)}, opt.TaskArgs...)
	if err := writeScript(script, fmt.Sprintf("spinecert conquer: one array task of submission %d of the work directory %s", s.Seq, dir), args); err != nil {
		return nil, err
	}
	id, err := submitArray(ctx, opt, script, w.jobName(), s.Tasks(),
		filepath.Join(dir, SlurmDir, fmt.Sprintf("submit-%03d-%%A_%%a.out", s.Seq)), dir)
	if err != nil {
		os.Remove(w.submissionPath(s.Seq))
		return nil, err
	}
	s.SlurmID = id
	if err := w.writeSubmission(s); err != nil {
		return nil, err
	}
	return s, nil
}

// submitArray runs sbatch for a job array of tasks array tasks running
// script, and returns the job ID.
func submitArray(ctx context.Context, opt SlurmOptions, script, name string, tasks int, output, chdir string) (string, error) {
	array := fmt.Sprintf("0-%d", tasks-1)
	if opt.MaxRunning > 0 {
		array += "%" + strconv.Itoa(opt.MaxRunning)
	}
	sargs := []string{"--parsable", "--job-name", name, "--array", array, "--output", output, "--chdir", chdir}
	if opt.Partition != "" {
		sargs = append(sargs, "--partition", opt.Partition)
	}
	if opt.Time != "" {
		sargs = append(sargs, "--time", opt.Time)
	}
	if opt.Mem != "" {
		sargs = append(sargs, "--mem", opt.Mem)
	}
	if opt.CPUsPerTask > 0 {
		sargs = append(sargs, "--cpus-per-task", strconv.Itoa(opt.CPUsPerTask))
	}
	sargs = append(append(sargs, opt.Extra...), script)
	sbatch := opt.Sbatch
	if sbatch == "" {
		sbatch = "sbatch"
	}
	cmd := exec.CommandContext(ctx, sbatch, sargs...)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if errors.Is(err, exec.ErrNotFound) {
		return "", fmt.Errorf("cubejob: %s is not on PATH: --slurm runs on a machine of a Slurm cluster (scripts/cluster-up.sh brings up a test cluster with Debian's slurm-wlm)", sbatch)
	}
	if err != nil {
		return "", fmt.Errorf("cubejob: sbatch: %w: %s", err, strings.TrimSpace(stderr.String()))
	}
	id, _, _ := strings.Cut(strings.TrimSpace(string(out)), ";")
	if _, err := strconv.Atoi(id); err != nil {
		return "", fmt.Errorf("cubejob: sbatch printed %q, expected a job ID", strings.TrimSpace(string(out)))
	}
	return id, nil
}

// writeScript writes an array task script that execs args, with the
// literal ${SLURM_ARRAY_TASK_ID} left for the shell to expand.
func writeScript(path, comment string, args []string) error {
	var b bytes.Buffer
	fmt.Fprintf(&b, "#!/bin/sh\n# %s\n", comment)
	b.WriteString("exec")
	for _, a := range args {
		if a == "${SLURM_ARRAY_TASK_ID}" {
			b.WriteString(` "${SLURM_ARRAY_TASK_ID}"`)
		} else {
			b.WriteString(" " + shellQuote(a))
		}
	}
	b.WriteString("\n")
	if err := writeAtomic(path, b.Bytes()); err != nil {
		return err
	}
	if err := os.Chmod(path, 0o755); err != nil {
		return fmt.Errorf("cubejob: %w", err)
	}
	return nil
}

func (w *Work) writeSubmission(s *Submission) error {
	data, err := json.MarshalIndent(s, "", "  ")
	if err != nil {
		return fmt.Errorf("cubejob: %w", err)
	}
	return writeAtomic(w.submissionPath(s.Seq), append(data, '\n'))
}

// ArrayTask runs array task t of submission seq: its slice of cubes, one
// at a time, or SLURM_CPUS_PER_TASK at a time when Slurm gave it more
// CPUs. On a satisfiable cube it cancels the rest of the job array with
// scancel (best effort: the other tasks also stop when they see
// refuted.json).
func (w *Work) ArrayTask(ctx context.Context, seq, t int, opt SolveOptions, report func(Event)) (Summary, error) {
	s, err := w.ReadSubmission(seq)
	if err != nil {
		return Summary{}, err
	}
	if t < 0 || t >= s.Tasks() {
		return Summary{}, fmt.Errorf("cubejob: submission %d has array tasks 0 to %d, not %d", seq, s.Tasks()-1, t)
	}
	// A task given several CPUs (sbatch --cpus-per-task) decides that many
	// cubes of its slice at once.
	jobs := 1
	if n, err := strconv.Atoi(os.Getenv("SLURM_CPUS_PER_TASK")); err == nil && n > 1 {
		jobs = n
	}
	sum, err := w.RunCubes(ctx, s.Slice(t), jobs, opt, report)
	if sum.Refuted != nil {
		if id := os.Getenv("SLURM_ARRAY_JOB_ID"); id != "" {
			_ = exec.Command("scancel", id).Run()
		}
	}
	return sum, err
}

func shellQuote(s string) string {
	if s != "" && strings.IndexFunc(s, func(r rune) bool {
		return !(r == '/' || r == '-' || r == '_' || r == '.' || r == ',' || r == '=' || r == ':' || r >= '0' && r <= '9' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z')
	}) < 0 {
		return s
	}
	return "'" + strings.ReplaceAll(s, "'", `'\''`) + "'"
}
