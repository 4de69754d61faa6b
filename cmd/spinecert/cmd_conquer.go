package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"runtime"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"spinecert.dev/archive"
	"spinecert.dev/cubejob"
)

type conquerOptions struct {
	solver     solveSolverFlags
	local      bool
	jobs       int
	slurm      bool
	sl         slurmFlags
	wait       bool
	status     bool
	json       bool
	arrayTask  int
	submission int
	dir        string
}

func newConquerCmd() *cobra.Command {
	var o conquerOptions
	cmd := &cobra.Command{
		Use:   "conquer DIR [--local --jobs N | --slurm ...] [--status]",
		Short: "Decide every cube of a work directory, here or as a Slurm job array",
		Long: `Decide the cubes of a work directory made by "spinecert split". Each cube
is decided as the CNF with the cube's literals as units, under the same
policy as solve: UNSAT from two independent backends and a proof accepted
by spinecert's DRAT checker and the LRAT re-check. Its result (the runs and
that proof) is written atomically, after the checks passed; a cube with
such a result is done and is never run again.

--local (the default) runs the cubes on this machine, --jobs at a time (each
cube's backends run one after another, so a cube uses one CPU). --slurm
submits the cubes without a result as one Slurm job array with sbatch; each
array task runs spinecert on its slice of cubes (--cubes-per-task) in the
shared work directory. Re-running conquer after a time-out, a killed task or
a failed node runs only the cubes without a result; while a job of the
directory is still queued, --slurm refuses to submit again.

A satisfiable cube ends the job: its model is decoded into a layout, checked
directly, and written to DIR/layout.json; the claim is refuted (exit 1) and
the other cubes are cancelled.

--status shows the cubes done, running, queued and remaining, from the work
directory and (when jobs were submitted) squeue.`,
		Args: cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error {
			switch {
			case o.local && o.slurm:
				return usageErr(fmt.Errorf("give --local or --slurm, not both"))
			case o.jobs < 0:
				return usageErr(fmt.Errorf("--jobs must not be negative, got %d", o.jobs))
			case o.wait && !o.slurm:
				return usageErr(fmt.Errorf("--wait goes with --slurm"))
			case o.json && o.slurm && !o.status:
				return usageErr(fmt.Errorf("--json goes with --status or a local run"))
			case cmd.Flags().Changed("array-task") != cmd.Flags().Changed("submission"):
				return usageErr(fmt.Errorf("--array-task and --submission go together"))
			}
			if err := o.sl.check(cmd, o.slurm); err != nil {
				return err
			}
			_, err := o.solver.build()
			return err
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.dir = args[0]
			return runConquer(cmd, &o)
		},
	}
	o.solver.add(cmd)
	fl := cmd.Flags()
	fl.BoolVar(&o.local, "local", false, "run the cubes on this machine (the default)")
	fl.IntVar(&o.jobs, "jobs", 0, "--local: cubes decided at the same time (0 = one per CPU)")
	fl.BoolVar(&o.slurm, "slurm", false, "submit the cubes as one Slurm job array (sbatch)")
	o.sl.add(cmd)
	fl.BoolVar(&o.wait, "wait", false, "--slurm: wait until the job array has left the queue, then show the status")
	fl.BoolVar(&o.status, "status", false, "show the cubes done, running, queued and remaining, and do nothing else")
	fl.BoolVar(&o.json, "json", false, "print one JSON object on stdout (the status, or the summary of a local run)")
	fl.IntVar(&o.arrayTask, "array-task", 0, "run one array task of a submission (used by the job array)")
	fl.IntVar(&o.submission, "submission", 0, "the submission of --array-task")
	_ = fl.MarkHidden("array-task")
	_ = fl.MarkHidden("submission")
	return cmd
}

func runConquer(cmd *cobra.Command, o *conquerOptions) error {
	ctx := cmd.Context()
	mode := cubejob.ForSolving
	if o.status || (o.slurm && !cmd.Flags().Changed("array-task")) {
		mode = cubejob.ForStatus // the array tasks read the CNF themselves
	}
	w, err := cubejob.OpenAs(o.dir, mode)
	if err != nil {
		return usageErr(err)
	}
	out := cmd.OutOrStdout()
	if o.status {
		return conquerStatus(cmd, w, o)
	}
	solvers, err := o.solver.build()
	if err != nil {
		return err
	}
	sopt := cubejob.SolveOptions{Solvers: solvers, Limit: o.solver.timeLimit, Task: "local"}
	report := func(e cubejob.Event) {
		if o.json {
			return
		}
		switch e.Outcome {
		case cubejob.Done:
			fmt.Fprintf(out, "cube %d: refuted, proof checked\n", e.Cube+1)
		case cubejob.Failed:
			fmt.Fprintf(out, "cube %d: %s\n", e.Cube+1, e.Detail)
		}
	}
	if cmd.Flags().Changed("array-task") {
		sopt.Task = fmt.Sprintf("slurm %s_%s", os.Getenv("SLURM_ARRAY_JOB_ID"), os.Getenv("SLURM_ARRAY_TASK_ID"))
		sum, err := w.ArrayTask(ctx, o.submission, o.arrayTask, sopt, report)
		return conquerEnd(ctx, out, cmd.ErrOrStderr(), w, sum, err, true, false)
	}
	if o.slurm {
		return conquerSlurm(cmd, w, o)
	}
	if err := w.CheckIdle(ctx, ""); err != nil {
		return undecided(err)
	}
	jobs := o.jobs
	if jobs == 0 {
		jobs = runtime.NumCPU()
	}
	rem := w.Remaining()
	if !o.json {
		fmt.Fprintf(out, "%d of %d cubes to decide, %d at a time\n", len(rem), len(w.Cubes), jobs)
	}
	sum, err := w.RunCubes(ctx, rem, jobs, sopt, report)
	return conquerEnd(ctx, out, cmd.ErrOrStderr(), w, sum, err, false, o.json)
}

// conquerEnd prints the outcome of a run of cubes and maps it to the exit status.
func conquerEnd(ctx contextT, out, errOut io.Writer, w *cubejob.Work, sum cubejob.Summary, err error, task, asJSON bool) error {
	if ierr := interruption(ctx); ierr != nil {
		fmt.Fprintf(errOut, "conquer: %d cubes done in this run; the others run again at the next conquer\n", sum.Done)
		return ierr
	}
	if err != nil {
		return err
	}
	claimRefuted := errors.Is(sum.Refuted, cubejob.ErrRefuted)
	left := sum.Failed // an array task counts its own slice only
	if !task {
		left = len(w.Remaining())
	}
	switch {
	case asJSON:
		j := conquerRunJSON{Dir: w.Dir, Total: len(w.Cubes), Done: sum.Done, Undecided: sum.Failed, Remaining: left, Refuted: claimRefuted}
		if sum.Refuted != nil {
			j.Detail = sum.Refuted.Error()
		}
		if err := writeJSON(out, j); err != nil {
			return err
		}
	case claimRefuted:
		fmt.Fprintf(out, "the claim is refuted: %v\n", sum.Refuted)
	case sum.Refuted != nil:
	case task:
		fmt.Fprintf(out, "this array task: %d cubes done, %d already done before, %d undecided\n", sum.Done, sum.Skipped, sum.Failed)
	default:
		fmt.Fprintf(out, "%d cubes done in this run, %d undecided; %d of %d cubes remain\n", sum.Done, sum.Failed, left, len(w.Cubes))
		if left == 0 {
			fmt.Fprintf(out, "every cube is refuted; next: spinecert gather %s -o NAME%s\n", w.Dir, archive.Suffix)
		}
	}
	switch {
	case claimRefuted:
		return refuted(nil)
	case sum.Refuted != nil:
		return undecided(sum.Refuted)
	case task && left > 0:
		return undecided(fmt.Errorf("%d cubes of this array task are undecided", left))
	case left > 0:
		return undecided(fmt.Errorf("%d cubes without a result: run conquer again (a larger --time-limit may help)", left))
	}
	return nil
}

func conquerSlurm(cmd *cobra.Command, w *cubejob.Work, o *conquerOptions) error {
	ctx := cmd.Context()
	out := cmd.OutOrStdout()
	sopt, err := o.sl.options(o.solver.taskArgs())
	if err != nil {
		return err
	}
	s, err := w.Submit(ctx, sopt)
	switch {
	case errors.Is(err, cubejob.ErrRefuted):
		fmt.Fprintf(out, "the claim is refuted: %v\n", err)
		return refuted(nil)
	case errors.Is(err, cubejob.ErrBusy):
		return undecided(err)
	case err != nil:
		return err
	case s == nil:
		fmt.Fprintf(out, "every cube already has a result; next: spinecert gather %s -o NAME.spinecert.tar.zst\n", w.Dir)
		return nil
	}
	fmt.Fprintf(out, "submitted job %s: %d array tasks for %d cubes (submission %d)\n", s.SlurmID, s.Tasks(), len(s.Cubes), s.Seq)
	if !o.wait {
		fmt.Fprintf(out, "follow it with: spinecert conquer %s --status\n", w.Dir)
		return nil
	}
	for {
		states, err := w.Queue(ctx, []*cubejob.Submission{s}, "")
		if err != nil {
			return err
		}
		if len(states) == 0 {
			break
		}
		select {
		case <-ctx.Done():
			fmt.Fprintf(cmd.ErrOrStderr(), "conquer: stopped waiting; job %s goes on (scancel %s stops it)\n", s.SlurmID, s.SlurmID)
			return interruption(ctx)
		case <-time.After(time.Second):
		}
	}
	st := w.Status(ctx, "")
	if err := printStatus(cmd, w, o, st); err != nil {
		return err
	}
	switch {
	case st.Refuted != nil && w.Subgraph == nil:
		fmt.Fprintf(out, "the claim is refuted: cube %d is satisfiable; the layout is in %s\n", st.Refuted.Cube, w.Dir+"/"+st.Refuted.Layout)
		return refuted(nil)
	case st.Refuted != nil:
		return undecided(fmt.Errorf("cube %d is satisfiable: the subgraph has a layout, so this job cannot refute the graph", st.Refuted.Cube))
	case st.Remaining > 0:
		return undecided(fmt.Errorf("%d cubes without a result: run conquer again (a larger --time-limit may help; the task logs are in %s)", st.Remaining, w.Dir+"/slurm"))
	}
	fmt.Fprintf(out, "every cube is refuted; next: spinecert gather %s -o NAME%s\n", w.Dir, archive.Suffix)
	return nil
}

// conquerRunJSON is the --json output of a local run.
type conquerRunJSON struct {
	Dir       string `json:"dir"`
	Total     int    `json:"total"`
	Done      int    `json:"done_in_this_run"`
	Undecided int    `json:"undecided"`
	Remaining int    `json:"remaining"`
	Refuted   bool   `json:"claim_refuted"`
	Detail    string `json:"detail,omitempty"`
}

// conquerStatusJSON is the --status --json output.
type conquerStatusJSON struct {
	Dir        string   `json:"dir"`
	Total      int      `json:"total"`
	Done       int      `json:"done"`
	Running    int      `json:"running"`
	Queued     int      `json:"queued"`
	Remaining  int      `json:"remaining"`
	Failed     int      `json:"failed"`
	Refuted    bool     `json:"refuted"`
	CPUSeconds float64  `json:"cpu_seconds"`
	Scratch    int      `json:"scratch_dirs"`
	Tasks      []string `json:"tasks,omitempty"`
	Queue      string   `json:"queue_error,omitempty"`
}

func conquerStatus(cmd *cobra.Command, w *cubejob.Work, o *conquerOptions) error {
	return printStatus(cmd, w, o, w.Status(cmd.Context(), ""))
}

// printStatus prints st as text or, with --json, as one object.
func printStatus(cmd *cobra.Command, w *cubejob.Work, o *conquerOptions, st *cubejob.Status) error {
	out := cmd.OutOrStdout()
	if o.json {
		j := conquerStatusJSON{Dir: w.Dir, Total: st.Total, Done: st.Done, Running: st.Running, Queued: st.Queued,
			Remaining: st.Remaining, Failed: st.Failed, Refuted: st.Refuted != nil, CPUSeconds: st.CPU, Scratch: st.Scratch}
		for _, t := range st.Tasks {
			j.Tasks = append(j.Tasks, t.ID+" "+t.State)
		}
		if st.QueueErr != nil {
			j.Queue = st.QueueErr.Error()
		}
		return writeJSON(out, j)
	}
	fmt.Fprintf(out, "%s: %d cubes of the claim: %s has no %d-page %s layout\n", w.Dir, st.Total, short(w.Job.Claim.GraphID), w.Job.Claim.Pages, w.Job.Claim.Kind)
	fmt.Fprintf(out, "done %d, running %d, queued %d, remaining %d (undecided at the last attempt: %d)\n", st.Done, st.Running, st.Queued, st.Remaining, st.Failed)
	if st.Done > 0 {
		fmt.Fprintf(out, "solver CPU time of the done cubes: %.1f s\n", st.CPU)
	}
	if st.Scratch > 0 {
		fmt.Fprintf(out, "scratch directories in %s: %d (of tasks running, or killed; removed before cubes are run or submitted again)\n", w.Dir+"/tmp", st.Scratch)
	}
	if st.Refuted != nil {
		fmt.Fprintf(out, "cube %d is satisfiable: a %d-page layout is in %s (checked when it was found)\n", st.Refuted.Cube, st.Refuted.Pages, w.Dir+"/"+st.Refuted.Layout)
	}
	if len(st.Tasks) > 0 {
		var parts []string
		for _, t := range st.Tasks {
			parts = append(parts, t.ID+" "+strings.ToLower(t.State))
		}
		fmt.Fprintf(out, "in the queue: %s\n", strings.Join(parts, ", "))
	}
	if st.QueueErr != nil {
		fmt.Fprintf(out, "the queue could not be read: %v\n", st.QueueErr)
	}
	return nil
}
