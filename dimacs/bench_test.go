package dimacs

import (
	"io"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/testtools"
)

type benchCase struct {
	name  string
	g     *graph.Graph
	pages int
}

// benchGraphs are the graphs of the size table: K_9 on 4 pages, a random
// 100-vertex maximal planar graph on 2 and 3 pages, and the 200-vertex
// Kleetope of a random 68-vertex triangulation on 2 pages.
func benchGraphs() []benchCase {
	r := rand.New(rand.NewPCG(2015, 9))
	planar := fixture.RandomFlippedTriangulation(r, 100, 1000).Graph()
	klee := fixture.RandomFlippedTriangulation(r, 68, 700).Kleetope()
	return []benchCase{
		{"K9_p4", fixture.Complete(9), 4},
		{"planar100_p2", planar, 2},
		{"planar100_p3", planar, 3},
		{"kleetope200_p2", klee, 2},
	}
}

// TestBenchGraphs checks the generators: maximal planar graphs have 3n-6 edges.
func TestBenchGraphs(t *testing.T) {
	for _, c := range benchGraphs()[1:] {
		if c.g.M() != 3*c.g.N()-6 {
			t.Errorf("%s: n=%d m=%d, want m=3n-6", c.name, c.g.N(), c.g.M())
		}
	}
}

// benchVariants are the encodings compared: the default, the default
// without twin symmetry breaking, and the baseline.
var benchVariants = []struct {
	name string
	opt  Options
}{
	{"default", Options{Kind: cert.Stack}},
	{"no-twins", Options{Kind: cert.Stack, NoTwins: true}},
	{"baseline", Options{Kind: cert.Stack, Baseline: true}},
}

// BenchmarkEncodeSize encodes the table graphs and reports their sizes.
func BenchmarkEncodeSize(b *testing.B) {
	for _, c := range benchGraphs() {
		for _, v := range benchVariants {
			b.Run(c.name+"/"+v.name, func(b *testing.B) {
				var st Stats
				for i := 0; i < b.N; i++ {
					o := v.opt
					o.Pages = c.pages
					e, err := Encode(c.g, o)
					if err != nil {
						b.Fatal(err)
					}
					st = e.Stats()
				}
				b.ReportMetric(float64(st.Vars), "vars")
				b.ReportMetric(float64(st.Clauses), "clauses")
				b.ReportMetric(float64(st.Literals), "literals")
			})
		}
	}
}

// BenchmarkSolve runs Debian's cadical on the table graphs (limit set by
// SPINECERT_BENCH_SOLVE_LIMIT seconds, default 300) and reports its time.
func BenchmarkSolve(b *testing.B) {
	bin := testtools.Require(b, "cadical", "cadical")
	limit := "300"
	if s := os.Getenv("SPINECERT_BENCH_SOLVE_LIMIT"); s != "" {
		limit = s
	}
	for _, c := range benchGraphs() {
		for _, v := range benchVariants {
			name := v.name
			b.Run(c.name+"/"+name, func(b *testing.B) {
				o := v.opt
				o.Pages = c.pages
				e, err := Encode(c.g, o)
				if err != nil {
					b.Fatal(err)
				}
				path := filepath.Join(b.TempDir(), "f.cnf")
				f, _ := os.Create(path)
				e.WriteTo(f)
				f.Close()
				b.ResetTimer()
				for i := 0; i < b.N; i++ {
					start := time.Now()
					cmd := exec.Command(bin, "-q", "-n", "-t", limit, path)
					out, _ := cmd.Output()
					code := cmd.ProcessState.ExitCode()
					status := map[int]string{10: "sat", 20: "unsat"}[code]
					if status == "" {
						status = "timeout"
					}
					b.ReportMetric(time.Since(start).Seconds(), "s/solve")
					b.Logf("%s %s: %s in %v (%d bytes of output)", c.name, name, status, time.Since(start).Round(time.Millisecond), len(out))
				}
			})
		}
	}
}

// BenchmarkWrite measures the CNF writing speed.
func BenchmarkWrite(b *testing.B) {
	c := benchGraphs()[2]
	e, err := Encode(c.g, Options{Kind: cert.Stack, Pages: c.pages})
	if err != nil {
		b.Fatal(err)
	}
	n, _ := e.WriteTo(io.Discard)
	b.SetBytes(n)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		e.WriteTo(io.Discard)
	}
}

// BenchmarkEncode300 encodes a 300-vertex maximal planar graph on 3 pages.
func BenchmarkEncode300(b *testing.B) {
	g := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(300, 3)), 300, 3000).Graph()
	for i := 0; i < b.N; i++ {
		e, err := Encode(g, Options{Kind: cert.Stack, Pages: 3})
		if err != nil {
			b.Fatal(err)
		}
		if i == 0 {
			st := e.Stats()
			b.ReportMetric(float64(st.Clauses), "clauses")
			n, _ := e.WriteTo(io.Discard)
			b.ReportMetric(float64(n)/1e6, "MB")
		}
	}
}

// TestSizeRatio checks the size target of the default encoding: at most half
// the clauses of the baseline on the smaller table graphs (the Kleetope is
// measured by BenchmarkEncodeSize only, to keep the test quick).
func TestSizeRatio(t *testing.T) {
	if testing.Short() {
		t.Skip("encodes 100-vertex graphs")
	}
	for _, c := range benchGraphs()[:3] {
		d, err := Encode(c.g, Options{Kind: cert.Stack, Pages: c.pages})
		if err != nil {
			t.Fatal(err)
		}
		b, err := Encode(c.g, Options{Kind: cert.Stack, Pages: c.pages, Baseline: true})
		if err != nil {
			t.Fatal(err)
		}
		dc, bc := d.Stats().Clauses, b.Stats().Clauses
		t.Logf("%s: default %d clauses, baseline %d (%.2f)", c.name, dc, bc, float64(dc)/float64(bc))
		if 2*dc > bc {
			t.Errorf("%s: default %d clauses > half of baseline %d", c.name, dc, bc)
		}
	}
}
