package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"spinecert.dev/cubejob"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/testtools"
)

// These tests run spinecert against a real Slurm: the single-node cluster
// that scripts/cluster-up.sh brings up (.ci/run starts it). The claim is
// K7 on 3 stack pages, false by the book thickness of K_n, ⌈n/2⌉ for n ≥ 4
// (Bernhart and Kainen, "The book thickness of a graph", 1979).

// slurmCluster skips (or fails under SPINECERT_REQUIRE_TOOLS=1) without
// slurm-wlm or without a running cluster, and returns a spinecert binary.
func slurmCluster(t *testing.T) string {
	t.Helper()
	if testing.Short() {
		t.Skip("the Slurm tests take about a minute")
	}
	for _, p := range []string{"sbatch", "squeue", "scancel", "sinfo"} {
		testtools.Require(t, p, "slurm-wlm")
	}
	out, err := exec.Command("sinfo", "-h", "-o", "%T").CombinedOutput()
	if err != nil || !strings.Contains(string(out), "idle") && !strings.Contains(string(out), "mix") && !strings.Contains(string(out), "alloc") {
		msg := fmt.Sprintf("no Slurm node is up (sinfo: %s %v): start one with scripts/cluster-up.sh", strings.TrimSpace(string(out)), err)
		if os.Getenv(testtools.RequireEnv) == "1" {
			t.Fatal(msg)
		}
		t.Skip(msg)
	}
	testtools.Require(t, "cadical", "cadical")
	// The array tasks run the binary by its path, so it must be a real
	// spinecert, not this test binary.
	bin := filepath.Join(t.TempDir(), "spinecert")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
}

// run runs the spinecert binary and returns its stdout and exit status.
func runBin(t *testing.T, bin string, args ...string) (string, int) {
	t.Helper()
	cmd := exec.Command(bin, args...)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	err := cmd.Run()
	code := 0
	if ee, ok := err.(*exec.ExitError); ok {
		code = ee.ExitCode()
	} else if err != nil {
		t.Fatal(err)
	}
	if stderr.Len() > 0 {
		t.Logf("spinecert %s: stderr:\n%s", strings.Join(args, " "), stderr.String())
	}
	return stdout.String(), code
}

func mustRunBin(t *testing.T, bin string, args ...string) string {
	t.Helper()
	out, code := runBin(t, bin, args...)
	if code != 0 {
		t.Fatalf("spinecert %s: exit %d\n%s", strings.Join(args, " "), code, out)
	}
	return out
}

func k7File(t *testing.T) string {
	p := filepath.Join(t.TempDir(), "k7.txt")
	if err := os.WriteFile(p, fixture.EdgeListBytes(t, fixture.Complete(7)), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func status(t *testing.T, bin, dir string) conquerStatusJSON {
	t.Helper()
	var st conquerStatusJSON
	if err := json.Unmarshal([]byte(mustRunBin(t, bin, "conquer", dir, "--status", "--json")), &st); err != nil {
		t.Fatal(err)
	}
	return st
}

// checkResults opens the work directory and checks that every cube has
// exactly one result, of this job and this cube, with its proof as recorded.
func checkResults(t *testing.T, dir string, n int) *cubejob.Work {
	t.Helper()
	w, err := cubejob.Open(dir)
	if err != nil {
		t.Fatal(err)
	}
	files, _ := filepath.Glob(filepath.Join(dir, cubejob.ResultsDir, "*.json"))
	if len(files) != n || len(w.Cubes) != n {
		t.Fatalf("%d result files, %d cubes, want %d", len(files), len(w.Cubes), n)
	}
	for i := range w.Cubes {
		r, err := w.ReadResult(i, true)
		if err != nil {
			t.Fatal(err)
		}
		if !strings.HasPrefix(r.Task, "slurm ") {
			t.Fatalf("cube %d was decided by %q, not by a Slurm array task", i+1, r.Task)
		}
	}
	return w
}

func TestSlurmSplitConquerGatherVerify(t *testing.T) {
	bin := slurmCluster(t)
	dir := filepath.Join(t.TempDir(), "work")
	mustRunBin(t, bin, "split", k7File(t), "--pages", "3", "--cubes", "16", "-o", dir)
	out := mustRunBin(t, bin, "conquer", dir, "--slurm", "--wait", "--cubes-per-task", "2", "--cpus-per-task", "1",
		"--solvers", "cadical,cryptominisat", "--time", "5", "--sbatch-arg=--job-name=spinecert-e2e")
	if !strings.Contains(out, "8 array tasks for 16 cubes") || !strings.Contains(out, "done 16, running 0, queued 0, remaining 0") {
		t.Fatalf("conquer --slurm --wait printed:\n%s", out)
	}
	checkResults(t, dir, 16)
	bundle := filepath.Join(t.TempDir(), "k7"+".spinecert.tar.zst")
	mustRunBin(t, bin, "gather", dir, "-o", bundle, "--jobs", "2")
	out = mustRunBin(t, bin, "verify", bundle, "--jobs", "2")
	if !strings.Contains(out, "holds — every check passed") || !strings.Contains(out, "all 16 cubes refuted") {
		t.Fatalf("verify printed:\n%s", out)
	}
	// The cube proof checks handed to a job array: every record is used.
	vdir := filepath.Join(t.TempDir(), "verify")
	out = mustRunBin(t, bin, "verify", bundle, "--slurm", vdir, "--cubes-per-task", "4")
	if !strings.Contains(out, "holds — every check passed") || !strings.Contains(out, "16 of them checked by Slurm array tasks") {
		t.Fatalf("verify --slurm printed:\n%s", out)
	}
	// Each record names its bundle, its cube and its proof, and what both checkers said.
	rec := filepath.Join(vdir, "checks", "000003.json")
	data, err := os.ReadFile(rec)
	if err != nil {
		t.Fatal(err)
	}
	var r cubejob.CheckRecord
	if err := json.Unmarshal(data, &r); err != nil {
		t.Fatal(err)
	}
	if !r.DRAT || !r.LRAT || r.Cube != 3 {
		t.Fatalf("record %+v", r)
	}

	// K7 has a 4-page layout: an array task finds it, checks it and
	// refutes the claim (exit 1); the layout passes check.
	sat := filepath.Join(t.TempDir(), "sat")
	mustRunBin(t, bin, "split", k7File(t), "--pages", "4", "--cubes", "8", "-o", sat)
	out, code := runBin(t, bin, "conquer", sat, "--slurm", "--wait", "--cubes-per-task", "2")
	if code != 1 || !strings.Contains(out, "the claim is refuted: cube") {
		t.Fatalf("conquer --slurm of a false claim: exit %d\n%s", code, out)
	}
	mustRunBin(t, bin, "check", k7File(t), filepath.Join(sat, cubejob.LayoutFile), "--pages", "4")
}

// TestSlurmKilledTaskIsRunAgain kills one array task while it decides its
// cubes and shows that running conquer again decides exactly the cubes
// without a result, so that nothing is lost or counted twice.
func TestSlurmKilledTaskIsRunAgain(t *testing.T) {
	bin := slurmCluster(t)
	dir := filepath.Join(t.TempDir(), "work")
	mustRunBin(t, bin, "split", k7File(t), "--pages", "3", "--cubes", "16", "-o", dir)
	// A second backend that takes a second per cube, so that a task is
	// still running when it is killed.
	slow := filepath.Join(t.TempDir(), "slowsat")
	if err := os.WriteFile(slow, []byte("#!/bin/sh\nsleep 1\nexec cadical -q \"$@\"\n"), 0o755); err != nil {
		t.Fatal(err)
	}
	solverArgs := []string{"--solvers", "cadical", "--solver-cmd", slow + " {cnf}"}
	out := mustRunBin(t, bin, append([]string{"conquer", dir, "--slurm", "--cubes-per-task", "4"}, solverArgs...)...)
	var job string
	if _, err := fmt.Sscanf(out, "submitted job %s", &job); err != nil {
		t.Fatalf("conquer --slurm printed %q", out)
	}
	job = strings.TrimSuffix(job, ":")
	// Wait for a running task with at least one of its cubes done, then kill it.
	w, err := cubejob.Open(dir)
	if err != nil {
		t.Fatal(err)
	}
	sub, err := w.ReadSubmission(1)
	if err != nil {
		t.Fatal(err)
	}
	victim := ""
	deadline := time.Now().Add(2 * time.Minute)
	for victim == "" && time.Now().Before(deadline) {
		states, err := w.Queue(t.Context(), []*cubejob.Submission{sub}, "")
		if err != nil {
			t.Fatal(err)
		}
		for _, s := range states {
			var task int
			if s.State != "RUNNING" || !strings.HasPrefix(s.ID, job+"_") {
				continue
			}
			fmt.Sscanf(strings.TrimPrefix(s.ID, job+"_"), "%d", &task)
			slice := sub.Slice(task)
			done := 0
			for _, i := range slice {
				if _, err := w.ReadResult(i, false); err == nil {
					done++
				}
			}
			if done >= 1 && done < len(slice) {
				victim = s.ID
				break
			}
		}
		time.Sleep(100 * time.Millisecond)
	}
	if victim == "" {
		t.Fatal("no array task was caught half way through its cubes")
	}
	if out, err := exec.Command("scancel", "--signal=KILL", victim).CombinedOutput(); err != nil {
		t.Fatalf("scancel %s: %v %s", victim, err, out)
	}
	waitQueue(t, w, sub)
	st := status(t, bin, dir)
	if st.Done >= 16 || st.Done+st.Remaining != 16 {
		t.Fatalf("after killing %s: %+v, want some cubes remaining and every cube counted once", victim, st)
	}
	left := w.Remaining()
	out = mustRunBin(t, bin, append([]string{"conquer", dir, "--slurm", "--wait", "--cubes-per-task", "4"}, solverArgs...)...)
	if !strings.Contains(out, "done 16, running 0, queued 0, remaining 0") {
		t.Fatalf("the second conquer printed:\n%s", out)
	}
	second, err := w.ReadSubmission(2)
	if err != nil {
		t.Fatal(err)
	}
	if len(second.Cubes) != len(left) {
		t.Fatalf("the second submission has cubes %v, the cubes left were %v (0-based)", second.Cubes, left)
	}
	for k, c := range second.Cubes {
		if c != left[k]+1 {
			t.Fatalf("the second submission has cubes %v, the cubes left were %v (0-based)", second.Cubes, left)
		}
	}
	checkResults(t, dir, 16)
	// The killed task's scratch space went when the cubes were submitted again.
	if left, _ := os.ReadDir(filepath.Join(dir, cubejob.TmpDir)); len(left) != 0 {
		t.Fatalf("scratch directories left: %v", left)
	}
	bundle := filepath.Join(t.TempDir(), "k7"+".spinecert.tar.zst")
	mustRunBin(t, bin, "gather", dir, "-o", bundle)
	if out := mustRunBin(t, bin, "verify", bundle); !strings.Contains(out, "all 16 cubes refuted") {
		t.Fatalf("verify printed:\n%s", out)
	}
}

func waitQueue(t *testing.T, w *cubejob.Work, sub *cubejob.Submission) {
	t.Helper()
	deadline := time.Now().Add(3 * time.Minute)
	for time.Now().Before(deadline) {
		states, err := w.Queue(t.Context(), []*cubejob.Submission{sub}, "")
		if err != nil {
			t.Fatal(err)
		}
		if len(states) == 0 {
			return
		}
		time.Sleep(200 * time.Millisecond)
	}
	t.Fatal("the job array did not leave the queue in 3 minutes")
}
