package archive

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"sync"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// benchLarge enables the benchmarks that need a large proof (minutes of
// cadical time): SPINECERT_BENCH_LARGE=1.
func benchLarge(b *testing.B) {
	if os.Getenv("SPINECERT_BENCH_LARGE") != "1" {
		b.Skip("set SPINECERT_BENCH_LARGE=1 to run (needs minutes of solver time)")
	}
}

// textProofBundle refutes K_n on pages stack pages with cadical writing a
// text proof (--no-binary), bundles it, and returns the text proof's size
// and the bundle. bt(K_n) = ceil(n/2) (Bernhart and Kainen 1979), so
// pages < ceil(n/2) is unsatisfiable.
func textProofBundle(b *testing.B, n, pages int) (int64, []byte) {
	b.Helper()
	g := fixture.WithBase(fixture.Complete(n), 1)
	// Twin symmetry breaking makes complete graphs easy (all vertices are
	// twins); without it the refutations are large, as wanted here.
	opt := dimacs.Options{Kind: cert.Stack, Pages: pages, NoTwins: true}
	cnf, err := CurrentEncoder{}.Encode(g, opt)
	if err != nil {
		b.Fatal(err)
	}
	text, _, err := CNFText(cnf)
	if err != nil {
		b.Fatal(err)
	}
	r := fixture.Cadical(b, text, true, "--no-binary")
	if r.Exit != 20 {
		b.Fatalf("cadical: exit %d, want 20 (unsat)", r.Exit)
	}
	dir := b.TempDir()
	proof := filepath.Join(dir, "f.drat.txt")
	if err := os.WriteFile(proof, r.Proof, 0o644); err != nil {
		b.Fatal(err)
	}
	ev := &Evidence{Graph: g, Name: fmt.Sprintf("K%d", n), Input: fixture.EdgeListBytes(b, g), InputFormat: graph.FormatEdgeList,
		Kind: cert.Stack, Bound: AtLeast, K: pages + 1, ToolVersion: "bench", Tool: "archive benchmark",
		Refutation: &RefutationInput{Options: opt, Proof: proof}}
	_, srcs, err := Build(context.Background(), ev, CurrentEncoder{}, dir)
	if err != nil {
		b.Fatal(err)
	}
	var buf bytes.Buffer
	if err := Write(context.Background(), &buf, srcs); err != nil {
		b.Fatal(err)
	}
	return int64(len(r.Proof)), buf.Bytes()
}

func reportSize(b *testing.B, text int64, bundle []byte) {
	b.ReportMetric(float64(text), "text-proof-bytes")
	b.ReportMetric(float64(len(bundle)), "bundle-bytes")
	b.ReportMetric(100*float64(len(bundle))/float64(text), "%-of-text")
}

// BenchmarkBundleSize measures a bundle against the text proof it holds
// (bt(K8) >= 4: no 3-page layout), and the time to verify it.
func BenchmarkBundleSize(b *testing.B) {
	text, bundle := textProofBundle(b, 8, 3)
	for b.Loop() {
		if r := verifyBytes(bundle, VerifyOptions{}); !r.Verified {
			b.Fatal(failNames(r))
		}
	}
	reportSize(b, text, bundle)
}

var (
	largeOnce   sync.Once
	largeText   int64
	largeBundle []byte
)

// BenchmarkVerifyLargeProof verifies a bundle for bt(K9) >= 5 whose proof
// (cadical, text) is about 87 MB. With SPINECERT_BENCH_BUNDLE=FILE it also
// writes the bundle to FILE, for measuring "spinecert verify" as a process
// (its peak memory: scripts/bench.sh).
func BenchmarkVerifyLargeProof(b *testing.B) {
	benchLarge(b)
	largeOnce.Do(func() {
		largeText, largeBundle = textProofBundle(b, 9, 4)
		if out := os.Getenv("SPINECERT_BENCH_BUNDLE"); out != "" {
			if err := os.WriteFile(out, largeBundle, 0o666); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.ReportAllocs()
	for b.Loop() {
		if r := verifyBytes(largeBundle, VerifyOptions{}); !r.Verified {
			b.Fatal(failNames(r))
		}
	}
	reportSize(b, largeText, largeBundle)
}

// BenchmarkVerifyJobs verifies four bundles one at a time and two at a time.
func BenchmarkVerifyJobs(b *testing.B) {
	paths, _ := filepath.Glob(filepath.Join("..", "testdata", "bundles", "*.spinecert.tar.zst"))
	if len(paths) == 0 {
		b.Skip("no bundles in testdata/bundles")
	}
	k7 := filepath.Join("..", "testdata", "bundles", "k7.spinecert.tar.zst")
	list := []string{k7, k7, k7, k7}
	for _, jobs := range []int{1, 2} {
		b.Run(fmt.Sprintf("jobs=%d", jobs), func(b *testing.B) {
			for b.Loop() {
				next := make(chan string)
				var wg sync.WaitGroup
				for range jobs {
					wg.Add(1)
					go func() {
						defer wg.Done()
						for p := range next {
							if r := VerifyFile(context.Background(), p, VerifyOptions{}); !r.Verified {
								b.Error(failNames(r))
							}
						}
					}()
				}
				for _, p := range list {
					next <- p
				}
				close(next)
				wg.Wait()
			}
		})
	}
}

// BenchmarkWalk measures the container alone on a 32 MiB member of
// incompressible bytes: decompression, hashing and the canonical check.
func BenchmarkWalk(b *testing.B) {
	data := make([]byte, 32<<20)
	rng := rand.New(rand.NewPCG(1, 2))
	for i := range data {
		data[i] = byte(rng.Uint32())
	}
	bundle := writeBytes(b, []Source{BytesSource("proofs/p.drat", data)})
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		c, err := Walk(context.Background(), bytes.NewReader(bundle), "bench", DefaultLimits(), func(m Member, r io.Reader) error {
			_, err := io.Copy(io.Discard, r)
			return err
		})
		if err != nil || !c.Canonical {
			b.Fatal(err)
		}
	}
}
