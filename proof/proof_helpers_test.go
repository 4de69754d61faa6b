package proof

import (
	"bytes"
	"compress/gzip"
	"context"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"spinecert.dev/dimacs"
	"spinecert.dev/internal/testtools"
)

func cnfBytes(t testing.TB, f *dimacs.CNF) []byte {
	t.Helper()
	var b bytes.Buffer
	if _, err := f.WriteTo(&b); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// cadicalProof runs Debian's cadical on f and returns its DRAT proof (text
// with --no-binary, else binary, cadical's default). It fails unless cadical
// says UNSAT (exit 20, the SAT-competition convention).
func cadicalProof(t testing.TB, f *dimacs.CNF, binary bool) []byte {
	t.Helper()
	bin := testtools.Require(t, "cadical", "cadical")
	dir := t.TempDir()
	in, out := filepath.Join(dir, "f.cnf"), filepath.Join(dir, "f.drat")
	if err := os.WriteFile(in, cnfBytes(t, f), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"-q", in, out}
	if !binary {
		args = append([]string{"--no-binary"}, args...)
	}
	cmd := exec.Command(bin, args...)
	stdout, _ := cmd.Output()
	if cmd.ProcessState.ExitCode() != 20 {
		t.Fatalf("cadical exit %d, want 20 (UNSAT); output %s", cmd.ProcessState.ExitCode(), stdout)
	}
	proof, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	return proof
}

func checkText(t testing.TB, f *dimacs.CNF, proof string, opt DRATOptions) (*DRATResult, error) {
	t.Helper()
	return CheckDRAT(context.Background(), f, strings.NewReader(proof), opt)
}

func parseCNF(t testing.TB, s string) *dimacs.CNF {
	t.Helper()
	f, err := dimacs.ReadCNF(strings.NewReader(s), "test.cnf", dimacs.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// cadicalMaybeProof runs cadical with its default (binary) proof output and
// reports whether it said UNSAT (exit 20) or SAT (exit 10).
func cadicalMaybeProof(t testing.TB, f *dimacs.CNF) ([]byte, bool) {
	t.Helper()
	bin := testtools.Require(t, "cadical", "cadical")
	dir := t.TempDir()
	in, out := filepath.Join(dir, "f.cnf"), filepath.Join(dir, "f.drat")
	if err := os.WriteFile(in, cnfBytes(t, f), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(bin, "-q", in, out)
	cmd.Run()
	switch cmd.ProcessState.ExitCode() {
	case 10:
		return nil, false
	case 20:
		proof, err := os.ReadFile(out)
		if err != nil {
			t.Fatal(err)
		}
		return proof, true
	}
	t.Fatalf("cadical exit %d", cmd.ProcessState.ExitCode())
	return nil, false
}

func gzipTo(t testing.TB, w io.Writer, data []byte) {
	t.Helper()
	z := gzip.NewWriter(w)
	if _, err := z.Write(data); err != nil {
		t.Fatal(err)
	}
	if err := z.Close(); err != nil {
		t.Fatal(err)
	}
}
