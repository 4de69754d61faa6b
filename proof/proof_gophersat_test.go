package proof

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"testing"

	"github.com/crillab/gophersat/solver"

	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture/formulas"
)

// gophersatProof solves f with gophersat (github.com/crillab/gophersat
// v1.4.0) in certified mode and returns the RUP lemmas it sends on its
// certificate channel, one per line, ending with "0" when it says UNSAT.
func gophersatProof(t *testing.T, f *dimacs.CNF) (string, bool) {
	t.Helper()
	cnf := make([][]int, len(f.Clauses))
	for i, c := range f.Clauses {
		for _, l := range c {
			cnf[i] = append(cnf[i], int(l))
		}
	}
	s := solver.New(solver.ParseSliceNb(cnf, f.Vars))
	s.Certified = true
	ch := make(chan string, 1024)
	s.CertChan = ch
	var b strings.Builder
	done := make(chan struct{})
	go func() {
		for line := range ch {
			b.WriteString(line)
			b.WriteByte('\n')
		}
		close(done)
	}()
	status := s.Solve()
	close(ch)
	<-done
	return b.String(), status == solver.Unsat
}

// gophersat's RUP certificates for pigeonhole formulas (Haken 1985: UNSAT)
// pass the checker read as rup, and their LRAT passes the LRAT checker.
func TestPigeonholeGophersat(t *testing.T) {
	for n := 3; n <= 6; n++ {
		t.Run(fmt.Sprintf("PHP(%d,%d)", n+1, n), func(t *testing.T) {
			f := formulas.Pigeonhole(n)
			proof, unsat := gophersatProof(t, f)
			if !unsat {
				t.Fatal("gophersat did not say UNSAT")
			}
			for _, forward := range []bool{false, true} {
				var lrat strings.Builder
				res, err := CheckDRAT(context.Background(), f, strings.NewReader(proof), DRATOptions{Format: RUP, Forward: forward, LRAT: &lrat})
				if err != nil || !res.Accepted || res.Detected {
					t.Fatalf("forward=%v: %v", forward, err)
				}
				if _, err := CheckLRAT(context.Background(), f, strings.NewReader(lrat.String()), "lrat"); err != nil {
					t.Fatalf("forward=%v: LRAT: %v", forward, err)
				}
			}
			// without its final empty clause the certificate is rejected
			cut := strings.TrimSuffix(proof, "0\n")
			if cut == proof {
				t.Fatalf("certificate does not end with the empty clause: %q", proof[max(0, len(proof)-20):])
			}
			if _, err := CheckDRAT(context.Background(), f, strings.NewReader(cut), DRATOptions{Format: RUP}); !errors.Is(err, ErrRejected) {
				t.Fatalf("certificate without the empty clause: %v", err)
			}
		})
	}
}
