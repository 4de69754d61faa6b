package cubejob

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"time"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/cube"
	"spinecert.dev/verify"
)

// SolveOptions controls how cubes are decided.
type SolveOptions struct {
	Solvers []verify.Solver
	Limit   time.Duration // per solver run (0 = none)
	Policy  verify.Policy // zero = verify.DefaultPolicy()
	Task    string        // who runs the cube, recorded in results ("local", "slurm 12_3")
	// Parallel runs the backends of one cube at once; by default they run
	// one after another, so that a task uses one CPU and the cubes are
	// the unit of parallelism.
	Parallel bool
}

// Outcome is what deciding one cube ended in.
type Outcome int

const (
	// Failed: no decision (a time-out, a backend conflict, too few UNSATs);
	// a failure record is left and the cube stays remaining.
	Failed Outcome = iota
	// Done: the cube is refuted and its result written.
	Done
	// Refuted: the cube is satisfiable and the layout passed the direct
	// check; the claim is refuted.
	Refuted
	// Skipped: the cube already had a result.
	Skipped
)

// SolveCube decides formula ∧ cube i (0-based) under the policy. An
// unsatisfiable verdict is stored as a Result with the proof that passed
// the checkers; a satisfiable one is decoded, checked with cert.Validate
// and stored as refuted.json with layout.json. Files appear atomically:
// a task killed at any point leaves the cube either done or remaining.
func (w *Work) SolveCube(ctx context.Context, i int, opt SolveOptions) (Outcome, string, error) {
	if i < 0 || i >= len(w.Cubes) {
		return Failed, "", fmt.Errorf("cubejob: there is no cube %d (the job has %d)", i+1, len(w.Cubes))
	}
	if w.CNF == nil {
		return Failed, "", fmt.Errorf("cubejob: the work directory was opened without its CNF")
	}
	if _, err := w.ReadResult(i, false); err == nil {
		return Skipped, "", nil
	}
	start := time.Now()
	tmp, err := os.MkdirTemp(filepath.Join(w.Dir, TmpDir), fmt.Sprintf("%s-%d-cube-%06d-", scratchHost(), os.Getpid(), i+1))
	if err != nil {
		return Failed, "", fmt.Errorf("cubejob: %w", err)
	}
	defer os.RemoveAll(tmp)
	cnf := cube.Apply(w.CNF, w.Cubes[i])
	gv, err := verify.DecideCNF(ctx, cnf, verify.GraphOptions{Solvers: opt.Solvers, Limit: opt.Limit, ProofDir: tmp, Policy: opt.Policy, StopOnModel: true, Sequential: !opt.Parallel})
	if err != nil {
		return Failed, "", err
	}
	if ctx.Err() != nil {
		return Failed, "", ctx.Err()
	}
	v := gv.Verdict
	host, _ := os.Hostname()
	switch v.Outcome {
	case verify.Satisfiable:
		return w.storeLayout(i, v, opt)
	case verify.Unsatisfiable:
	default:
		reason := "undecided: " + joinNonEmpty(v.Conflict, v.Missing, v.Checked, v.Notes)
		f := Failure{Job: w.ID, Cube: i + 1, Reason: reason, Host: host, Task: opt.Task}
		data, _ := json.MarshalIndent(f, "", "  ")
		if err := writeAtomic(filepath.Join(w.Dir, FailuresDir, resultName(i)), append(data, '\n')); err != nil {
			return Failed, reason, err
		}
		return Failed, reason, nil
	}
	res, check, ok := gv.CheckedResult()
	if !ok {
		return Failed, "", fmt.Errorf("cubejob: cube %d: an unsatisfiable verdict without a proof that passed", i+1)
	}
	proofName := fmt.Sprintf("%06d.%s", i+1, check.Format)
	final := filepath.Join(w.Dir, ResultsDir, proofName)
	sum, size, err := hashFile(res.Proof)
	if err != nil {
		return Failed, "", fmt.Errorf("cubejob: %w", err)
	}
	if err := os.Chmod(res.Proof, mode); err != nil {
		return Failed, "", fmt.Errorf("cubejob: %w", err)
	}
	if err := os.Rename(res.Proof, final); err != nil {
		return Failed, "", fmt.Errorf("cubejob: %w", err)
	}
	r := Result{Job: w.ID, Cube: i + 1, Literals: w.Cubes[i].String(),
		Proof:       ProofFile{File: proofName, Backend: check.Backend, Format: check.Format, Size: size, SHA256: sum, Lemmas: check.Lemmas, Core: check.Core},
		WallSeconds: time.Since(start).Seconds(), Host: host, Task: opt.Task}
	for _, x := range gv.Results {
		r.Runs = append(r.Runs, archive.Run{Backend: x.Backend, Version: x.Version, Answer: strings.ToLower(x.Answer.String())})
		r.CPUSeconds += cpuOf(x).Seconds()
	}
	data, err := json.MarshalIndent(r, "", "  ")
	if err != nil {
		return Failed, "", fmt.Errorf("cubejob: %w", err)
	}
	if err := writeAtomic(w.resultPath(i), append(data, '\n')); err != nil {
		return Failed, "", err
	}
	os.Remove(filepath.Join(w.Dir, FailuresDir, resultName(i)))
	return Done, "", nil
}

// cpuOf is a run's CPU time: the process's for external solvers, the wall
// time for in-process ones.
func cpuOf(r *verify.Result) time.Duration {
	if r.CPU > 0 {
		return r.CPU
	}
	return r.Elapsed
}

func (w *Work) storeLayout(i int, v *verify.Verdict, opt SolveOptions) (Outcome, string, error) {
	if w.Encoding == nil {
		if err := w.encode(); err != nil {
			return Failed, "", err
		}
	}
	model := make([]bool, len(v.Model)+1) // the encoder counts variables from 1
	copy(model[1:], v.Model)
	l, err := w.Encoding.Decode(model)
	if err != nil {
		return Failed, "", fmt.Errorf("cubejob: cube %d: the model of %s does not decode to a layout: %w", i+1, v.ModelFrom, err)
	}
	target := w.Target()
	if rep := cert.Validate(target, l); !rep.OK() {
		return Failed, "", fmt.Errorf("cubejob: cube %d: the layout from the model of %s fails the direct check: %w", i+1, v.ModelFrom, rep.Err())
	}
	if err := writeAtomicFunc(filepath.Join(w.Dir, LayoutFile), func(wr io.Writer) error { return cert.WriteLayoutJSON(wr, target, l) }); err != nil {
		return Failed, "", err
	}
	rec := RefutedRecord{Job: w.ID, Cube: i + 1, Backend: v.ModelFrom, Layout: LayoutFile, Pages: l.Pages()}
	data, _ := json.MarshalIndent(rec, "", "  ")
	if err := writeAtomic(filepath.Join(w.Dir, RefutedFile), append(data, '\n')); err != nil {
		return Failed, "", err
	}
	if w.Subgraph != nil {
		return Refuted, "", fmt.Errorf("%w: cube %d is satisfiable: the subgraph has a %d-page %s layout (%s, checked directly), so this job cannot refute the graph",
			ErrSubgraphLayout, i+1, l.Pages(), w.Job.Claim.Kind, filepath.Join(w.Dir, LayoutFile))
	}
	return Refuted, "", fmt.Errorf("%w: cube %d is satisfiable: %s found a %d-page %s layout, checked directly (%s)",
		ErrRefuted, i+1, v.ModelFrom, l.Pages(), w.Job.Claim.Kind, filepath.Join(w.Dir, LayoutFile))
}

// joinNonEmpty joins the conflict (when there is one) and the lists with "; ".
func joinNonEmpty(conflict string, lists ...[]string) string {
	var parts []string
	if conflict != "" {
		parts = append(parts, conflict)
	}
	for _, l := range lists {
		parts = append(parts, l...)
	}
	if len(parts) == 0 {
		return "no answer"
	}
	return strings.Join(parts, "; ")
}

// IsRefuted reports whether err says the claim (or the job's subgraph) has a layout.
func IsRefuted(err error) bool {
	return errors.Is(err, ErrRefuted) || errors.Is(err, ErrSubgraphLayout)
}
