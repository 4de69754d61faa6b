package proof

import (
	"bytes"
	"context"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"syscall"
	"testing"
	"time"

	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture/formulas"
)

// benchProof makes cadical's binary DRAT proof of PHP(n+1,n) and reports
// cadical's own solve time; it skips when cadical is absent.
func benchProof(b *testing.B, n int) (*dimacs.CNF, []byte, func()) {
	b.Helper()
	f := formulas.Pigeonhole(n)
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
	user := cmd.ProcessState.UserTime() + cmd.ProcessState.SystemTime()
	report := func() {
		b.ReportMetric(float64(solve.Microseconds())/1000, "cadical-wall-ms")
		b.ReportMetric(float64(user.Microseconds())/1000, "cadical-cpu-ms")
		b.ReportMetric(float64(len(proof)), "proof-bytes")
	}
	return f, proof, report
}

func benchCheck(b *testing.B, n int, opt DRATOptions) {
	f, proof, report := benchProof(b, n)
	b.ReportAllocs()
	b.ResetTimer()
	var res *DRATResult
	cpu := cpuTime()
	for b.Loop() {
		var err error
		res, err = CheckDRAT(context.Background(), f, bytes.NewReader(proof), opt)
		if err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64((cpuTime()-cpu).Microseconds())/1000/float64(b.N), "check-cpu-ms")
	b.ReportMetric(float64(res.Lemmas), "lemmas")
	b.ReportMetric(float64(res.CoreLemmas), "checked")
	report()
}

// PHP(9,8), the pigeonhole benchmark of the proof-checking target.
func BenchmarkCheckPHP9Backward(b *testing.B) { benchCheck(b, 8, DRATOptions{}) }
func BenchmarkCheckPHP9Forward(b *testing.B)  { benchCheck(b, 8, DRATOptions{Forward: true}) }
func BenchmarkCheckPHP9LRAT(b *testing.B)     { benchCheck(b, 8, DRATOptions{LRAT: io.Discard}) }

// padded returns f with m random 3-clauses on n fresh variables: a formula
// whose size, not its proof, sets the checker's memory (as for the CNFs of
// page-number claims, millions of clauses refuted by a short proof). The
// padding shares no variable with f, so f's proof refutes it unchanged.
func padded(f *dimacs.CNF, n, m int) *dimacs.CNF {
	pad := formulas.Random3SAT(1, n, m)
	g := &dimacs.CNF{Vars: f.Vars + n, Clauses: append([][]int32(nil), f.Clauses...)}
	for _, c := range pad.Clauses {
		for i, l := range c {
			if l < 0 {
				c[i] = l - int32(f.Vars)
			} else {
				c[i] = l + int32(f.Vars)
			}
		}
		g.Clauses = append(g.Clauses, c)
	}
	return g
}

// BenchmarkCheckPaddedPHP9 checks the proof of PHP(9,8) against PHP(9,8)
// with a million random 3-clauses beside it. It reports allocated bytes per
// check (B/op) and live-MB, the heap still in use when the check ends (after
// a collection), that is what the checker holds for the formula and proof.
func BenchmarkCheckPaddedPHP9(b *testing.B) {
	f, proof, report := benchProof(b, 8)
	f = padded(f, 200000, 1000000)
	var live uint64
	opt := DRATOptions{Progress: func(p Progress) {
		if p.Phase == "checking" && p.Steps == p.Total {
			runtime.GC()
			var ms runtime.MemStats
			runtime.ReadMemStats(&ms)
			live = ms.HeapAlloc
		}
	}}
	runtime.GC()
	var ms runtime.MemStats
	runtime.ReadMemStats(&ms)
	before := ms.HeapAlloc
	if _, err := CheckDRAT(context.Background(), f, bytes.NewReader(proof), opt); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	cpu := cpuTime()
	for b.Loop() {
		if _, err := CheckDRAT(context.Background(), f, bytes.NewReader(proof), DRATOptions{}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64((cpuTime()-cpu).Microseconds())/1000/float64(b.N), "check-cpu-ms")
	b.ReportMetric(float64(live-min(live, before))/(1<<20), "live-MB")
	b.ReportMetric(float64(len(f.Clauses)), "clauses")
	report()
}

// The separate LRAT checker on the LRAT written for PHP(9,8).
func BenchmarkLRATCheckPHP9(b *testing.B) {
	f, proof, report := benchProof(b, 8)
	var lrat bytes.Buffer
	if _, err := CheckDRAT(context.Background(), f, bytes.NewReader(proof), DRATOptions{LRAT: &lrat}); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	cpu := cpuTime()
	for b.Loop() {
		if _, err := CheckLRAT(context.Background(), f, bytes.NewReader(lrat.Bytes()), "lrat"); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64((cpuTime()-cpu).Microseconds())/1000/float64(b.N), "check-cpu-ms")
	b.ReportMetric(float64(lrat.Len()), "lrat-bytes")
	report()
}

// cpuTime is the user plus system CPU time of this process so far, a fairer
// measure than wall time on a shared machine.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
