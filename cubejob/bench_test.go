package cubejob

import (
	"context"
	"path/filepath"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/cube"
	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/fixture/backends"
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
