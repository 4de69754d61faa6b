package verify

import (
	"path/filepath"
	"strings"
	"testing"

	"spinecert.dev/internal/fixture/formulas"
	"spinecert.dev/internal/testtools"
)

func cryptominisatForTest(t testing.TB) Solver {
	t.Helper()
	testtools.Require(t, "cryptominisat5", "cryptominisat")
	s, err := ByName("cryptominisat", ChildCommand{})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestCryptominisat: Debian's cryptominisat5 refutes PHP(n+1, n)
// (unsatisfiable: the pigeonhole principle, Haken 1985) without a proof
// spinecert could read, and agrees with gini on random 3-SAT at the
// threshold ratio (Mitchell, Selman, Levesque, AAAI 1992: a mix of both
// answers), each of its models satisfying the formula.
func TestCryptominisat(t *testing.T) {
	s := cryptominisatForTest(t)
	if v := s.(*External).Version; !strings.HasPrefix(v, "5.") {
		t.Errorf("version %q, want 5.x (Debian ships 5.11.4: cryptominisat5 --version)", v)
	}
	for _, n := range []int{1, 2, 3, 4, 5, 6} {
		r := solveOK(t, s, formulas.Pigeonhole(n), filepath.Join(t.TempDir(), "proof"))
		if r.Answer != Unsat || r.Suspect {
			t.Errorf("PHP(%d,%d): %s (%s), want UNSAT", n+1, n, r.Answer, r.Detail)
		}
		if r.Proof != "" {
			t.Errorf("PHP(%d,%d): proof %s in %s, want none (cryptominisat5 writes FRAT)", n+1, n, r.Proof, r.ProofFormat)
		}
	}
	const vars, clauses, count = 50, 213, 24
	seen := map[Answer]int{}
	for seed := range uint64(count) {
		cnf := formulas.Random3SAT(seed+1, vars, clauses)
		want := solveOK(t, Gini{}, cnf, "")
		r := solveOK(t, s, cnf, "")
		if r.Answer != want.Answer || r.Answer == Unknown {
			t.Errorf("seed %d: cryptominisat says %s (%s), gini %s", seed+1, r.Answer, r.Detail, want.Answer)
		}
		if r.Answer == Sat {
			if err := CheckModel(cnf, r.Model); err != nil {
				t.Errorf("seed %d: %v", seed+1, err)
			}
		}
		seen[r.Answer]++
	}
	if seen[Sat] == 0 || seen[Unsat] == 0 {
		t.Errorf("batch not mixed: %v", seen)
	}
}
