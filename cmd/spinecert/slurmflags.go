package main

import (
	"fmt"
	"os"

	"github.com/spf13/cobra"

	"spinecert.dev/cubejob"
)

// slurmFlags are the sbatch settings of conquer --slurm and verify --slurm.
type slurmFlags struct {
	partition  string
	timeLimit  string
	mem        string
	cpus       int
	sbatchArgs []string
	perTask    int
	maxRunning int
}

var slurmFlagNames = []string{"partition", "time", "mem", "cpus-per-task", "sbatch-arg", "cubes-per-task", "max-running"}

func (f *slurmFlags) add(cmd *cobra.Command) {
	fl := cmd.Flags()
	fl.StringVar(&f.partition, "partition", "", "--slurm: the partition (default: the cluster's)")
	fl.StringVar(&f.timeLimit, "time", "", "--slurm: time limit of each array task, as sbatch --time takes it")
	fl.StringVar(&f.mem, "mem", "", "--slurm: memory of each array task, as sbatch --mem takes it")
	fl.IntVar(&f.cpus, "cpus-per-task", 0, "--slurm: CPUs of each array task (it decides that many of its cubes at once)")
	fl.StringArrayVar(&f.sbatchArgs, "sbatch-arg", nil, "--slurm: one more sbatch argument (repeatable)")
	fl.IntVar(&f.perTask, "cubes-per-task", 1, "--slurm: cubes each array task takes")
	fl.IntVar(&f.maxRunning, "max-running", 0, "--slurm: array tasks running at once (0 = as the scheduler allows)")
}

// check validates the flags; slurm says whether --slurm was given.
func (f *slurmFlags) check(cmd *cobra.Command, slurm bool) error {
	switch {
	case f.perTask < 1:
		return usageErr(fmt.Errorf("--cubes-per-task must be at least 1, got %d", f.perTask))
	case f.cpus < 0 || f.maxRunning < 0:
		return usageErr(fmt.Errorf("--cpus-per-task and --max-running must not be negative"))
	}
	if !slurm {
		for _, name := range slurmFlagNames {
			if cmd.Flags().Changed(name) {
				return usageErr(fmt.Errorf("--%s goes with --slurm", name))
			}
		}
	}
	return nil
}

// options returns the sbatch settings for tasks that run spinecert with taskArgs.
func (f *slurmFlags) options(taskArgs []string) (cubejob.SlurmOptions, error) {
	exe, err := os.Executable()
	if err != nil {
		return cubejob.SlurmOptions{}, fmt.Errorf("the path of spinecert: %w", err)
	}
	return cubejob.SlurmOptions{Partition: f.partition, Time: f.timeLimit, Mem: f.mem, CPUsPerTask: f.cpus,
		Extra: f.sbatchArgs, PerTask: f.perTask, MaxRunning: f.maxRunning, Executable: exe, TaskArgs: taskArgs}, nil
}

// taskArgs passes the solver flags on to array tasks.
func (f *solveSolverFlags) taskArgs() []string {
	args := []string{"--solvers", f.solvers, "--time-limit", f.timeLimit.String()}
	for _, c := range f.solverCmd {
		args = append(args, "--solver-cmd", c)
	}
	return args
}
