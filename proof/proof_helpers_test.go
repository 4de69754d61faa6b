package proof

import (
	"bytes"
	"compress/gzip"
	"context"
	"io"
	"strings"
	"testing"

	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
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
	var args []string
	if !binary {
		args = []string{"--no-binary"}
	}
	r := fixture.Cadical(t, cnfBytes(t, f), true, args...)
	if r.Exit != 20 {
		t.Fatalf("cadical exit %d, want 20 (UNSAT); output %s", r.Exit, r.Stdout)
	}
	return r.Proof
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
	r := fixture.Cadical(t, cnfBytes(t, f), true)
	return r.Proof, r.Exit == 20
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
