package cubejob

import (
	"context"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/cube"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/fixture/backends"
	"spinecert.dev/proof"
	"spinecert.dev/verify"
)

// The claims below rest on a published value: the book thickness of K_n is
// ⌈n/2⌉ for n ≥ 4 (Bernhart and Kainen, "The book thickness of a graph",
// 1979), so K7 has no 3-page stack layout and has a 4-page one.

func newWork(t *testing.T, g *graph.Graph, pages, cubes int, given []cube.Cube) *Work {
	t.Helper()
	w, _, err := Create(context.Background(), filepath.Join(t.TempDir(), "work"), CreateOptions{
		Graph: g, Encoding: dimacs.Options{Kind: cert.Stack, Pages: pages}, Cubes: given,
		Split: cube.SplitOptions{Cubes: cubes}, ToolVersion: "test"})
	if err != nil {
		t.Fatal(err)
	}
	return w
}

func solveOpts(t *testing.T) SolveOptions {
	return SolveOptions{Solvers: backends.InProcess(t), Task: "test"}
}

func runAll(t *testing.T, w *Work) Summary {
	t.Helper()
	sum, err := w.RunCubes(context.Background(), w.Remaining(), 2, solveOpts(t), nil)
	if err != nil {
		t.Fatal(err)
	}
	return sum
}

func bundle(t *testing.T, w *Work) (string, error) {
	t.Helper()
	out := filepath.Join(t.TempDir(), "claim"+archive.Suffix)
	_, err := w.Bundle(context.Background(), out, GatherOptions{Solvers: backends.InProcess(t), Jobs: 2}, "test")
	return out, err
}

func TestSplitConquerGatherVerify(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 16, nil)
	if len(w.Cubes) != 16 || w.Job.Cubes.Shape != ShapeTree {
		t.Fatalf("%d cubes of shape %s, want 16 of a decision tree", len(w.Cubes), w.Job.Cubes.Shape)
	}
	again, err := Open(w.Dir)
	if err != nil {
		t.Fatal(err)
	}
	if again.ID != w.ID {
		t.Fatal("Open gives another job ID than Create")
	}
	sum := runAll(t, w)
	if sum.Done != 16 || sum.Failed != 0 || sum.Refuted != nil {
		t.Fatalf("summary %+v, want 16 done", sum)
	}
	if st := w.Status(context.Background(), "squeue-absent"); st.Done != 16 || st.Remaining != 0 || st.Scratch != 0 {
		t.Fatalf("status %+v", st)
	}
	out, err := bundle(t, w)
	if err != nil {
		t.Fatal(err)
	}
	rep := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{Jobs: 2})
	if !rep.Verified {
		t.Fatalf("the bundle does not verify: %+v", rep.Failures())
	}
	m := rep.Manifest
	if m.Claim.K != 4 || m.Claim.Bound != archive.AtLeast || m.Refutation.Cubes == nil || m.Refutation.Cubes.Count != 16 {
		t.Fatalf("manifest claim %+v, cubes %+v", m.Claim, m.Refutation.Cubes)
	}
	// Built twice, the bundle is the same bytes.
	out2, err := bundle(t, w)
	if err != nil {
		t.Fatal(err)
	}
	a, _ := os.ReadFile(out)
	b, _ := os.ReadFile(out2)
	if string(a) != string(b) {
		t.Fatal("two gathers of the same work directory differ")
	}
}

func TestResumeRunsOnlyCubesWithoutAResult(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 16, nil)
	first := []int{0, 1, 2, 3, 4, 5, 6, 7}
	if _, err := w.RunCubes(context.Background(), first, 2, solveOpts(t), nil); err != nil {
		t.Fatal(err)
	}
	want := []int{8, 9, 10, 11, 12, 13, 14, 15}
	if got := w.Remaining(); !slices.Equal(got, want) {
		t.Fatalf("remaining %v, want %v", got, want)
	}
	// A truncated proof (a task killed while the file system flushed, or a
	// tampered file) makes its cube remaining again.
	r, err := w.ReadResult(3, true)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.Truncate(w.ProofPath(r), r.Proof.Size/2); err != nil {
		t.Fatal(err)
	}
	if got := w.Remaining(); !slices.Equal(got, append([]int{3}, want...)) {
		t.Fatalf("remaining %v after truncating cube 4's proof", got)
	}
	sum := runAll(t, w)
	if sum.Done != 9 {
		t.Fatalf("the second run decided %d cubes, want 9", sum.Done)
	}
	// One result per cube, nothing twice.
	results, _ := filepath.Glob(filepath.Join(w.Dir, ResultsDir, "*.json"))
	if len(results) != 16 {
		t.Fatalf("%d result files for 16 cubes", len(results))
	}
	if _, err := bundle(t, w); err != nil {
		t.Fatal(err)
	}
}

func TestSatisfiableCubeRefutesTheClaim(t *testing.T) {
	// Opened for solving, as conquer opens it: the encoding that decodes
	// the model is built only then.
	w, err := OpenAs(newWork(t, fixture.Complete(7), 4, 8, nil).Dir, ForSolving)
	if err != nil {
		t.Fatal(err)
	}
	if w.Encoding != nil {
		t.Fatal("opened for solving, the work directory was encoded")
	}
	sum, err := w.RunCubes(context.Background(), w.Remaining(), 2, solveOpts(t), nil)
	if err != nil {
		t.Fatal(err)
	}
	if !errors.Is(sum.Refuted, ErrRefuted) {
		t.Fatalf("refuted = %v, want ErrRefuted", sum.Refuted)
	}
	raw, err := cert.ReadLayoutFile(filepath.Join(w.Dir, LayoutFile))
	if err != nil {
		t.Fatal(err)
	}
	if rep := cert.Check(w.Graph, raw, cert.CheckOptions{}); !rep.OK() {
		t.Fatalf("the stored layout fails the direct check: %v", rep.Err())
	}
	if _, err := bundle(t, w); !errors.Is(err, ErrRefuted) {
		t.Fatalf("gather of a refuted job: %v, want ErrRefuted", err)
	}
}

// tree8 is the complete binary decision tree of depth 3 over variables 1, 2, 3.
func tree8() []cube.Cube {
	var out []cube.Cube
	for a := range 8 {
		c := cube.Cube{}
		for v := int32(1); v <= 3; v++ {
			if a>>(v-1)&1 == 1 {
				c = append(c, v)
			} else {
				c = append(c, -v)
			}
		}
		out = append(out, c)
	}
	return out
}

func TestCubesMadeElsewhere(t *testing.T) {
	g := fixture.Complete(7)
	// Not a tree in the order written, but disjoint and covering: the
	// coverage is proved by a refutation of the negated cubes.
	cubes := tree8()
	cubes[0] = cube.Cube{cubes[0][2], cubes[0][0], cubes[0][1]}
	w := newWork(t, g, 3, 0, cubes)
	if w.Job.Cubes.Shape != ShapeOther {
		t.Fatalf("shape %s, want %s", w.Job.Cubes.Shape, ShapeOther)
	}
	runAll(t, w)
	out, err := bundle(t, w)
	if err != nil {
		t.Fatal(err)
	}
	rep := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{})
	if !rep.Verified || rep.Manifest.Refutation.Cubes.Coverage.Method != archive.CoverProof {
		t.Fatalf("verified=%v coverage %+v: %+v", rep.Verified, rep.Manifest.Refutation.Cubes.Coverage, rep.Failures())
	}
}

func TestBadWork(t *testing.T) {
	g := fixture.Complete(7)
	t.Run("overlapping cubes", func(t *testing.T) {
		cubes := append(tree8(), cube.Cube{1, 2})
		_, _, err := Create(context.Background(), filepath.Join(t.TempDir(), "w"), CreateOptions{Graph: g, Encoding: dimacs.Options{Kind: cert.Stack, Pages: 3}, Cubes: cubes})
		if !errors.Is(err, cube.ErrOverlap) || !strings.Contains(err.Error(), "cubes") {
			t.Fatalf("err = %v, want an overlap naming the cubes", err)
		}
	})
	t.Run("cubes that do not cover", func(t *testing.T) {
		w := newWork(t, g, 3, 0, tree8()[1:])
		runAll(t, w)
		_, err := bundle(t, w)
		if !errors.Is(err, cube.ErrNotCovering) || !strings.Contains(err.Error(), "no cube holds under") {
			t.Fatalf("err = %v, want ErrNotCovering with an uncovered assignment", err)
		}
	})
	t.Run("a proof of another formula", func(t *testing.T) {
		// K7 has a 4-page layout, so no proof can refute its 4-page
		// formula under the empty cube: a proof of cube 1 of the 3-page
		// job, passed off as the result of that cube, must be rejected.
		other := newWork(t, g, 3, 2, nil)
		runAll(t, other)
		w := newWork(t, g, 4, 0, []cube.Cube{{}})
		r, err := other.ReadResult(0, true)
		if err != nil {
			t.Fatal(err)
		}
		data, _ := os.ReadFile(other.ProofPath(r))
		if err := os.WriteFile(w.ProofPath(r), data, 0o644); err != nil {
			t.Fatal(err)
		}
		r.Job, r.Literals = w.ID, ""
		writeResult(t, w, 0, r)
		_, err = bundle(t, w)
		if !errors.Is(err, archive.ErrRejected) || !strings.Contains(err.Error(), "cube 1 (") {
			t.Fatalf("err = %v, want a rejected proof naming cube 1", err)
		}
	})
	t.Run("a result of another job", func(t *testing.T) {
		w := newWork(t, g, 3, 8, nil)
		other := newWork(t, g, 3, 4, nil)
		runAll(t, other)
		runAll(t, w)
		for _, name := range []string{"000001.json"} {
			data, _ := os.ReadFile(filepath.Join(other.Dir, ResultsDir, name))
			os.WriteFile(filepath.Join(w.Dir, ResultsDir, name), data, 0o644)
		}
		_, err := bundle(t, w)
		if !errors.Is(err, ErrIncomplete) || !strings.Contains(err.Error(), "cube 1") || !strings.Contains(err.Error(), "another job") {
			t.Fatalf("err = %v, want cube 1 named as a result of another job", err)
		}
	})
	t.Run("a missing result", func(t *testing.T) {
		w := newWork(t, g, 3, 8, nil)
		runAll(t, w)
		os.Remove(w.resultPath(5))
		_, err := bundle(t, w)
		if !errors.Is(err, ErrIncomplete) || !strings.Contains(err.Error(), "(cube 6)") {
			t.Fatalf("err = %v, want cube 6 named", err)
		}
	})
	t.Run("a truncated proof", func(t *testing.T) {
		w := newWork(t, g, 3, 8, nil)
		runAll(t, w)
		r, _ := w.ReadResult(2, false)
		os.Truncate(w.ProofPath(r), 10)
		_, err := bundle(t, w)
		if !errors.Is(err, ErrIncomplete) || !strings.Contains(err.Error(), "cube 3") || !strings.Contains(err.Error(), "truncated") {
			t.Fatalf("err = %v, want cube 3 named as truncated", err)
		}
	})
	t.Run("a work directory of another claim", func(t *testing.T) {
		w := newWork(t, g, 3, 4, nil)
		p := filepath.Join(w.Dir, GraphFile)
		data, _ := os.ReadFile(p)
		os.WriteFile(p, append(data, []byte("7 8\n")...), 0o644)
		if _, err := Open(w.Dir); !errors.Is(err, ErrBadWork) || !strings.Contains(err.Error(), GraphFile) {
			t.Fatalf("err = %v, want ErrBadWork naming %s", err, GraphFile)
		}
	})
	t.Run("a changed formula", func(t *testing.T) {
		w := newWork(t, g, 3, 4, nil)
		p := filepath.Join(w.Dir, CNFFile)
		data, _ := os.ReadFile(p)
		os.WriteFile(p, append(data, []byte("1 0\n")...), 0o644)
		for _, mode := range []OpenMode{ForCheck, ForSolving} {
			if _, err := OpenAs(w.Dir, mode); !errors.Is(err, ErrBadWork) || !strings.Contains(err.Error(), CNFFile) {
				t.Fatalf("mode %d: err = %v, want ErrBadWork naming %s", mode, err, CNFFile)
			}
		}
		if _, err := OpenAs(w.Dir, ForStatus); err != nil {
			t.Fatalf("the status does not read the CNF: %v", err)
		}
	})
	t.Run("a job manifest with a repeated key", func(t *testing.T) {
		w := newWork(t, g, 3, 4, nil)
		p := filepath.Join(w.Dir, JobFile)
		data, _ := os.ReadFile(p)
		data = []byte(strings.Replace(string(data), `"format": `, `"Format": "x", "format": `, 1))
		os.WriteFile(p, data, 0o644)
		if _, err := Open(w.Dir); !errors.Is(err, ErrBadWork) {
			t.Fatalf("err = %v, want ErrBadWork", err)
		}
	})
	t.Run("a model that does not check", func(t *testing.T) {
		w := newWork(t, g, 3, 2, nil)
		script := filepath.Join(t.TempDir(), "liar.sh")
		// A solver that claims every variable true and exits as if satisfiable.
		os.WriteFile(script, []byte("#!/bin/sh\nn=$(grep '^p cnf' \"$1\" | cut -d' ' -f3)\necho 's SATISFIABLE'\nprintf 'v'\ni=1; while [ $i -le $n ]; do printf ' %d' $i; i=$((i+1)); done\necho ' 0'\nexit 10\n"), 0o755)
		liar, err := verify.ParseSolverCmd(script + " {cnf}")
		if err != nil {
			t.Fatal(err)
		}
		opt := SolveOptions{Solvers: []verify.Solver{liar, verify.Gini{}}}
		out, detail, err := w.SolveCube(context.Background(), 0, opt)
		if err != nil || out != Failed || !strings.Contains(detail, "contradicts") {
			t.Fatalf("outcome %v, detail %q, err %v: want a failure naming the contradiction", out, detail, err)
		}
		if _, err := os.Stat(filepath.Join(w.Dir, RefutedFile)); err == nil {
			t.Fatal("a model that does not check refuted the claim")
		}
		if st := w.Status(context.Background(), ""); st.Failed != 1 || st.Remaining != 2 {
			t.Fatalf("status %+v, want cube 1 failed and both remaining", st)
		}
	})
}

func writeResult(t *testing.T, w *Work, i int, r *Result) {
	t.Helper()
	data, err := json.MarshalIndent(r, "", "  ")
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(w.resultPath(i), data, 0o644); err != nil {
		t.Fatal(err)
	}
}

func TestVerifyJobRecords(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 8, nil)
	runAll(t, w)
	out, err := bundle(t, w)
	if err != nil {
		t.Fatal(err)
	}
	j, err := NewVerifyJob(filepath.Join(t.TempDir(), "v"), out, 8, 4)
	if err != nil {
		t.Fatal(err)
	}
	// One array task's slice: only its cubes are checked, and recorded.
	var checked []int
	rep := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{
		CubeFilter:  func(i int) bool { return j.InSlice(1, i) },
		CubeChecked: func(i int, sum string, o proof.Outcome) { checked = append(checked, i); j.Record(i, sum, o, "test") },
	})
	slices.Sort(checked)
	if rep.Verified || !slices.Equal(checked, []int{4, 5, 6, 7}) {
		t.Fatalf("task 1 checked %v (verified %v), want cubes 4 to 7 and no verdict", checked, rep.Verified)
	}
	// The other slice, then a verify that takes every outcome from the records.
	archive.VerifyFile(context.Background(), out, archive.VerifyOptions{
		CubeFilter:  func(i int) bool { return j.InSlice(0, i) },
		CubeChecked: func(i int, sum string, o proof.Outcome) { j.Record(i, sum, o, "test") },
	})
	used := 0
	rep = archive.VerifyFile(context.Background(), out, archive.VerifyOptions{CubeOutcome: func(i int, sum string) (proof.Outcome, bool) {
		o, ok := j.Outcome(i, sum)
		if ok {
			used++
		}
		return o, ok
	}})
	if !rep.Verified || used != 8 {
		t.Fatalf("verified %v with %d records, want 8", rep.Verified, used)
	}
	// A record of another proof is not taken; a record of a rejection is.
	if _, ok := j.Outcome(0, strings.Repeat("0", 64)); ok {
		t.Fatal("a record for another proof was taken")
	}
	rep = archive.VerifyFile(context.Background(), out, archive.VerifyOptions{CubeOutcome: func(i int, sum string) (proof.Outcome, bool) {
		if i == 2 {
			return proof.Outcome{Detail: "rejected by an array task"}, true
		}
		return j.Outcome(i, sum)
	}})
	if rep.Verified {
		t.Fatal("a bundle verified though a record says cube 3's proof was rejected")
	}
}

func TestCleanScratch(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 2, nil)
	tmp := filepath.Join(w.Dir, TmpDir)
	// pid 1 is alive on any Linux host; a huge pid is not.
	names := []string{scratchHost() + "-1-cube-000001-a", scratchHost() + "-2147483646-cube-000001-b", "elsewhere-42-cube-000002-c", "unrelated"}
	for _, n := range names {
		if err := os.MkdirAll(filepath.Join(tmp, n), 0o755); err != nil {
			t.Fatal(err)
		}
	}
	if got := w.CleanScratch(false); got != 1 {
		t.Fatalf("removed %d, want only the dead local task's", got)
	}
	if got := w.CleanScratch(true); got != 1 {
		t.Fatalf("removed %d, want the other host's too", got)
	}
	left, _ := os.ReadDir(tmp)
	if len(left) != 2 {
		t.Fatalf("%d entries left, want the live task's and the unrelated one", len(left))
	}
}

// TestManyCubes gathers a job of more cubes than a bundle once held
// members (256) and verifies the bundle.
func TestManyCubes(t *testing.T) {
	if testing.Short() {
		t.Skip("300 cubes")
	}
	w, _, err := Create(context.Background(), filepath.Join(t.TempDir(), "work"), CreateOptions{
		Graph: fixture.Complete(7), Encoding: dimacs.Options{Kind: cert.Stack, Pages: 3},
		Split: cube.SplitOptions{Cubes: 300, Rule: cube.RuleLookahead}, ToolVersion: "test"})
	if err != nil {
		t.Fatal(err)
	}
	if len(w.Cubes) != 300 {
		t.Fatalf("%d cubes", len(w.Cubes))
	}
	opt := SolveOptions{Solvers: []verify.Solver{verify.Gini{}, backends.Gophersat(t)}}
	if _, err := w.RunCubes(context.Background(), w.Remaining(), 2, opt, nil); err != nil {
		t.Fatal(err)
	}
	out, err := bundle(t, w)
	if err != nil {
		t.Fatal(err)
	}
	if rep := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{Jobs: 2}); !rep.Verified {
		t.Fatalf("not verified: %+v", rep.Failures())
	}
}

func TestCheckIdle(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 2, nil)
	if err := w.CheckIdle(context.Background(), "squeue-absent-here"); err != nil {
		t.Fatalf("no submission: %v", err)
	}
	if err := w.writeSubmission(&Submission{Seq: 1, Job: w.ID, PerTask: 1, Cubes: []int{1, 2}, SlurmID: "7"}); err != nil {
		t.Fatal(err)
	}
	// A scheduler that still lists the job: busy.
	fake := filepath.Join(t.TempDir(), "squeue")
	os.WriteFile(fake, []byte("#!/bin/sh\necho '7_0 RUNNING'\necho '7_1 PENDING'\n"), 0o755)
	if err := w.CheckIdle(context.Background(), fake); !errors.Is(err, ErrBusy) {
		t.Fatalf("err = %v, want ErrBusy", err)
	}
	if st := w.Status(context.Background(), fake); st.Running != 1 || st.Queued != 1 || st.Remaining != 0 {
		t.Fatalf("status %+v, want one cube running and one queued", st)
	}
	// One that says the job has left the queue, and none at all: idle.
	gone := filepath.Join(t.TempDir(), "squeue")
	os.WriteFile(gone, []byte("#!/bin/sh\necho 'slurm_load_jobs error: Invalid job id specified' >&2\nexit 1\n"), 0o755)
	for _, q := range []string{gone, "squeue-absent-here"} {
		if err := w.CheckIdle(context.Background(), q); err != nil {
			t.Fatalf("%s: %v", q, err)
		}
	}
}

func TestSubmitWithoutSlurm(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 2, nil)
	_, err := w.Submit(context.Background(), SlurmOptions{Executable: "/bin/true", Sbatch: "sbatch-absent-here", Squeue: "squeue-absent-here"})
	if err == nil || !strings.Contains(err.Error(), "is not on PATH: --slurm runs on a machine of a Slurm cluster") {
		t.Fatalf("err = %v", err)
	}
	if _, err := w.ReadSubmission(1); err == nil {
		t.Fatal("a failed submission left its record")
	}
}

// TestSubgraphJob refutes a graph through a subgraph: K7 inside K8 minus an
// edge. K8 − e contains K7, whose book thickness is 4 (Bernhart and Kainen
// 1979), so K8 − e has no 3-page layout either.
func TestSubgraphJob(t *testing.T) {
	var edges [][2]int
	for i := range 8 {
		for j := i + 1; j < 8; j++ {
			if i != 0 || j != 7 {
				edges = append(edges, [2]int{i, j})
			}
		}
	}
	g := fixture.Numbered(8, edges)
	h := fixture.Numbered(7, fixture.EdgePairs(fixture.Complete(7)))
	w, _, err := Create(context.Background(), filepath.Join(t.TempDir(), "work"), CreateOptions{
		Graph: g, Subgraph: h, Encoding: dimacs.Options{Kind: cert.Stack, Pages: 3}, Split: cube.SplitOptions{Cubes: 8}})
	if err != nil {
		t.Fatal(err)
	}
	if w, err = Open(w.Dir); err != nil || w.Subgraph == nil || w.Target().N() != 7 {
		t.Fatalf("reopened: %v", err)
	}
	runAll(t, w)
	out, err := bundle(t, w)
	if err != nil {
		t.Fatal(err)
	}
	rep := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{})
	if !rep.Verified || rep.Manifest.Refutation.Subgraph == nil || rep.Manifest.Claim.Vertices != 8 || rep.Manifest.Claim.K != 4 {
		t.Fatalf("verified %v, manifest %+v: %+v", rep.Verified, rep.Manifest.Claim, rep.Failures())
	}
	// A "subgraph" that is not one is refused.
	other := fixture.Numbered(3, [][2]int{{0, 1}, {1, 2}, {0, 2}})
	other = fixture.WithBase(other, 20)
	if _, _, err := Create(context.Background(), filepath.Join(t.TempDir(), "bad"), CreateOptions{
		Graph: g, Subgraph: other, Encoding: dimacs.Options{Kind: cert.Stack, Pages: 2}, Split: cube.SplitOptions{Cubes: 2}}); err == nil {
		t.Fatal("a graph that is not a subgraph was accepted")
	}
}

// A submission whose job ID was never recorded is looked up by its name.
func TestCheckIdleByName(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 2, nil)
	if err := w.writeSubmission(&Submission{Seq: 1, Job: w.ID, PerTask: 1, Cubes: []int{1, 2}}); err != nil {
		t.Fatal(err)
	}
	fake := filepath.Join(t.TempDir(), "squeue")
	script := "#!/bin/sh\nfor a in \"$@\"; do [ \"$a\" = " + w.jobName() + " ] && echo '9_0 RUNNING'; done\nexit 0\n"
	os.WriteFile(fake, []byte(script), 0o755)
	if err := w.CheckIdle(context.Background(), fake); !errors.Is(err, ErrBusy) {
		t.Fatalf("err = %v, want ErrBusy from the job found by its name", err)
	}
}

// Every JSON file of the work directory is read strictly: a repeated key
// in a submission or in refuted.json is refused, naming the file.
func TestStrictRecords(t *testing.T) {
	w := newWork(t, fixture.Complete(7), 3, 2, nil)
	os.WriteFile(w.submissionPath(1), []byte(`{"seq":1,"job":"`+w.ID+`","per_task":1,"cubes":[1],"Cubes":[2]}`), 0o644)
	if _, err := w.ReadSubmission(1); !errors.Is(err, ErrBadWork) || !strings.Contains(err.Error(), "submit-001.json") {
		t.Fatalf("submission: err = %v", err)
	}
	os.WriteFile(filepath.Join(w.Dir, RefutedFile), []byte(`{"job":"`+w.ID+`","cube":1,"cube":2,"backend":"x","layout":"layout.json","pages":3}`), 0o644)
	if _, err := w.ReadRefuted(); !errors.Is(err, ErrBadWork) || !strings.Contains(err.Error(), RefutedFile) {
		t.Fatalf("refuted.json: err = %v", err)
	}
}
