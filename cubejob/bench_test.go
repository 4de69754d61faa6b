package cubejob

import (
	"context"
	"path/filepath"
	"testing"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/cube"
	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/fixture/backends"
	"spinecert.dev/proof"
)

// fullTree returns the 2^depth leaves of the complete decision tree that
// splits on the variables 1 … depth in order, the true branch first: the
// shape a split with that many cubes has when nothing closes early.
func fullTree(depth int) []cube.Cube {
	cubes := make([]cube.Cube, 1<<depth)
	for i := range cubes {
		c := make(cube.Cube, depth)
		for v := range depth {
			c[v] = int32(v + 1)
			if i>>(depth-1-v)&1 == 1 {
				c[v] = -c[v]
			}
		}
		cubes[i] = c
	}
	return cubes
}

// BenchmarkCheckTree times the coverage check of Create, Open and gather on
// 2^16 cubes (one million literals).
func BenchmarkCheckTree(b *testing.B) {
	cubes := fullTree(16)
	for b.Loop() {
		if err := cube.CheckTree(cubes); err != nil {
			b.Fatal(err)
		}
	}
}

// benchWork is a work directory of K7 at 3 pages in 16 cubes, every cube
// decided: K7 needs 4 pages (Bernhart and Kainen, "The book thickness of a
// graph", 1979), so every cube is refuted.
func benchWork(b *testing.B) *Work {
	b.Helper()
	w, _, err := Create(context.Background(), filepath.Join(b.TempDir(), "work"), CreateOptions{
		Graph: fixture.Complete(7), Encoding: dimacs.Options{Kind: cert.Stack, Pages: 3},
		Split: cube.SplitOptions{Cubes: 16}, ToolVersion: "bench"})
	if err != nil {
		b.Fatal(err)
	}
	sum, err := w.RunCubes(context.Background(), w.Remaining(), 2, SolveOptions{Solvers: backends.InProcess(b), Task: "bench"}, nil)
	if err != nil || sum.Done != 16 {
		b.Fatalf("%+v, %v: want 16 cubes done", sum, err)
	}
	return w
}

// BenchmarkReadResult times reading one cube's result as Remaining, gather
// and --status do: without (stat the proof) and with its SHA-256.
func BenchmarkReadResult(b *testing.B) {
	w := benchWork(b)
	for _, hash := range []bool{false, true} {
		name := "stat"
		if hash {
			name = "sha256"
		}
		b.Run(name, func(b *testing.B) {
			i := 0
			for b.Loop() {
				if _, err := w.ReadResult(i%len(w.Cubes), hash); err != nil {
					b.Fatal(err)
				}
				i++
			}
		})
	}
}

// BenchmarkOpen times opening a work directory: job.json, the graph, the
// CNF re-encoded and hashed, the cubes read and checked.
func BenchmarkOpen(b *testing.B) {
	w := benchWork(b)
	for b.Loop() {
		if _, err := Open(w.Dir); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkBesideProofs measures what gather and verify spend per cube
// apart from checking proofs, on 256 cubes of K7 at 3 pages:
//
//   - evidence: Work.Evidence, gather's checks before archive.Build (every
//     result read and its proof hashed, coverage);
//
//   - write: writing the bundle's members (hashing and compressing);
//
//   - verify-records: archive.Verify with every cube's outcome supplied
//     (CubeOutcome), so that no proof is checked: streaming, hashing, the
//     graph, the CNF re-encoded, coverage;
//
//   - verify: archive.Verify with its proof checks, for comparison.
//
//     go test ./cubejob -run '^$' -bench BesideProofs -benchtime 5x
func BenchmarkBesideProofs(b *testing.B) {
	w, _, err := Create(context.Background(), filepath.Join(b.TempDir(), "work"), CreateOptions{
		Graph: fixture.Complete(7), Encoding: dimacs.Options{Kind: cert.Stack, Pages: 3},
		Split: cube.SplitOptions{Cubes: 256, Rule: cube.RuleLookahead}, ToolVersion: "bench"})
	if err != nil {
		b.Fatal(err)
	}
	if _, err := w.RunCubes(context.Background(), w.Remaining(), 2, SolveOptions{Solvers: backends.InProcess(b)}, nil); err != nil {
		b.Fatal(err)
	}
	n := float64(len(w.Cubes))
	tmp := b.TempDir()
	ev, cleanup, err := w.Evidence(context.Background(), GatherOptions{})
	if err != nil {
		b.Fatal(err)
	}
	defer cleanup()
	ev.ToolVersion, ev.Tool = "bench", "bench"
	_, srcs, err := archive.Build(context.Background(), ev, archive.CurrentEncoder{}, tmp)
	if err != nil {
		b.Fatal(err)
	}
	out := filepath.Join(tmp, "b"+archive.Suffix)
	if err := archive.WriteFile(context.Background(), out, srcs); err != nil {
		b.Fatal(err)
	}
	outcomes := map[int]proof.Outcome{}
	archive.VerifyFile(context.Background(), out, archive.VerifyOptions{CubeChecked: func(i int, _ string, o proof.Outcome) { outcomes[i] = o }})
	perCube := func(b *testing.B) { b.ReportMetric(b.Elapsed().Seconds()*1e3/float64(b.N)/n, "ms/cube") }
	b.Run("evidence", func(b *testing.B) {
		for b.Loop() {
			if _, c, err := w.Evidence(context.Background(), GatherOptions{}); err != nil {
				b.Fatal(err)
			} else {
				c()
			}
		}
		perCube(b)
	})
	b.Run("write", func(b *testing.B) {
		for b.Loop() {
			if err := archive.WriteFile(context.Background(), filepath.Join(tmp, "w"+archive.Suffix), srcs); err != nil {
				b.Fatal(err)
			}
		}
		perCube(b)
	})
	b.Run("verify-records", func(b *testing.B) {
		for b.Loop() {
			rep := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{CubeOutcome: func(i int, _ string) (proof.Outcome, bool) {
				o, ok := outcomes[i]
				return o, ok
			}})
			if !rep.Verified {
				b.Fatal("not verified")
			}
		}
		perCube(b)
	})
	b.Run("verify", func(b *testing.B) {
		for b.Loop() {
			if !archive.VerifyFile(context.Background(), out, archive.VerifyOptions{}).Verified {
				b.Fatal("not verified")
			}
		}
		perCube(b)
	})
}
