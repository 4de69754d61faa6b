package verify

import (
	"bytes"
	"context"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"testing"
	"time"

	"quire/dimacs"
)

// benchProof makes cadical's binary DRAT proof of PHP(n+1,n) and reports
// cadical's own solve time; it skips when cadical is absent.
func benchProof(b *testing.B, n int) (*dimacs.CNF, []byte) {
	b.Helper()
	f := pigeonhole(n)
	bin, err := exec.LookPath("cadical")
	if err != nil {
		b.Skip("cadical not on PATH: install the Debian package cadical")
	}
	dir := b.TempDir()
	in, out := filepath.Join(dir, "f.cnf"), filepath.Join(dir, "f.drat")
	if err := os.WriteFile(in, cnfBytes(b, f), 0o644); err != nil {
		b.Fatal(err)
	}
	start := time.Now()
	cmd := exec.Command(bin, "-q", in, out)
	cmd.Run()
	solve := time.Since(start)
	if cmd.ProcessState.ExitCode() != 20 {
		b.Fatalf("cadical exit %d", cmd.ProcessState.ExitCode())
	}
	proof, err := os.ReadFile(out)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportMetric(float64(solve.Milliseconds()), "cadical-solve-ms")
	b.ReportMetric(float64(len(proof)), "proof-bytes")
	return f, proof
}

func benchCheck(b *testing.B, n int, opt DRATOptions) {
	f, proof := benchProof(b, n)
	b.ReportAllocs()
	b.ResetTimer()
	var res *ProofResult
	for b.Loop() {
		var err error
		res, err = CheckDRAT(context.Background(), f, bytes.NewReader(proof), opt)
		if err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(res.Lemmas), "lemmas")
	b.ReportMetric(float64(res.CoreLemmas), "checked")
}

// PHP(9,8), the pigeonhole benchmark of the proof-checking target.
func BenchmarkCheckPHP9Backward(b *testing.B) { benchCheck(b, 8, DRATOptions{}) }
func BenchmarkCheckPHP9Forward(b *testing.B)  { benchCheck(b, 8, DRATOptions{Forward: true}) }
func BenchmarkCheckPHP9LRAT(b *testing.B)     { benchCheck(b, 8, DRATOptions{LRAT: io.Discard}) }

// The separate LRAT checker on the LRAT written for PHP(9,8).
func BenchmarkLRATCheckPHP9(b *testing.B) {
	f, proof := benchProof(b, 8)
	var lrat bytes.Buffer
	if _, err := CheckDRAT(context.Background(), f, bytes.NewReader(proof), DRATOptions{LRAT: &lrat}); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		if _, err := CheckLRAT(context.Background(), f, bytes.NewReader(lrat.Bytes()), "lrat"); err != nil {
			b.Fatal(err)
		}
	}
}
