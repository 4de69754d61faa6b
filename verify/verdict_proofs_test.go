package verify

import (
	"context"
	"strings"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/fixture/formulas"
	"spinecert.dev/proof"
)

// TestPipelinePigeonhole runs the whole UNSAT path on PHP(n+1, n), which is
// unsatisfiable (Haken 1985): the backends in parallel, their proofs
// through spinecert's DRAT checker and the LRAT re-check, then Decide.
func TestPipelinePigeonhole(t *testing.T) {
	for _, n := range []int{3, 5} {
		cnf := formulas.Pigeonhole(n)
		solvers := inProcess(t)
		results, err := RunAll(context.Background(), cnf, solvers, RunOptions{Limit: time.Minute, ProofDir: t.TempDir()})
		if err != nil {
			t.Fatal(err)
		}
		checks := CheckProofs(context.Background(), cnf, results, ProofCheckOptions{})
		if len(checks) != 1 || !checks[0].DRAT || !checks[0].LRAT {
			t.Fatalf("PHP(%d,%d): proof checks %+v", n+1, n, checks)
		}
		v := Decide(results, checks, DefaultPolicy())
		if v.Outcome != Unsatisfiable {
			t.Fatalf("PHP(%d,%d): %s, missing %q, conflict %q", n+1, n, v.Outcome, v.Missing, v.Conflict)
		}
	}
	t.Run("cadical", func(t *testing.T) {
		cnf := formulas.Pigeonhole(6)
		results, err := RunAll(context.Background(), cnf, []Solver{cadicalForTest(t), Gini{}}, RunOptions{Limit: time.Minute, ProofDir: t.TempDir()})
		if err != nil {
			t.Fatal(err)
		}
		checks := CheckProofs(context.Background(), cnf, results, ProofCheckOptions{})
		if len(checks) != 1 || !checks[0].DRAT || !checks[0].LRAT || checks[0].Format != proof.DRATBinary {
			t.Fatalf("proof checks %+v", checks)
		}
		if v := Decide(results, checks, DefaultPolicy()); v.Outcome != Unsatisfiable {
			t.Fatalf("%s, missing %q", v.Outcome, v.Missing)
		}
	})
}

// TestPipelineLiars: a lying UNSAT next to honest backends on a
// satisfiable formula is a conflict; two liars with a fake proof on a
// satisfiable formula get nowhere because the proof is rejected.
func TestPipelineLiars(t *testing.T) {
	ctx := context.Background()
	solvers := append(inProcess(t), script(t, "liar_unsat.sh"))
	results, err := RunAll(ctx, satFormula, solvers, RunOptions{Limit: time.Minute, ProofDir: t.TempDir()})
	if err != nil {
		t.Fatal(err)
	}
	v := Decide(results, CheckProofs(ctx, satFormula, results, ProofCheckOptions{}), DefaultPolicy())
	if v.Outcome != Undecided || !strings.Contains(v.Conflict, "liar_unsat.sh said UNSAT") {
		t.Fatalf("%s conflict %q", v.Outcome, v.Conflict)
	}

	liars := []Solver{script(t, "liar_unsat.sh"), script(t, "fake_proof.sh")}
	results, err = RunAll(ctx, satFormula, liars, RunOptions{Limit: time.Minute, ProofDir: t.TempDir()})
	if err != nil {
		t.Fatal(err)
	}
	checks := CheckProofs(ctx, satFormula, results, ProofCheckOptions{})
	if len(checks) != 1 || checks[0].DRAT || checks[0].Error == "" {
		t.Fatalf("fake proof checks %+v", checks)
	}
	v = Decide(results, checks, DefaultPolicy())
	if v.Outcome != Undecided || len(v.Missing) == 0 {
		t.Fatalf("liars decided %s", v.Outcome)
	}
}

// TestDecideLayoutSkipsHopelessProofs: with one UNSAT backend no verdict is
// possible, so its proof is not checked; K4 has no 1-page layout (it is not
// outerplanar, Bernhart & Kainen 1979).
func TestDecideLayoutSkipsHopelessProofs(t *testing.T) {
	gv, err := DecideLayout(context.Background(), fixture.Complete(4), GraphOptions{
		Encoding: dimacs.Options{Kind: cert.Stack, Pages: 1},
		Solvers:  []Solver{gophersatForTest(t)},
		Limit:    time.Minute,
	})
	if err != nil {
		t.Fatal(err)
	}
	if gv.Verdict.Outcome != Undecided || len(gv.Checks) != 1 || gv.Checks[0].Skipped == "" {
		t.Fatalf("verdict %+v checks %+v", gv.Verdict, gv.Checks)
	}
	gv, err = DecideLayout(context.Background(), fixture.Complete(4), GraphOptions{
		Encoding: dimacs.Options{Kind: cert.Stack, Pages: 1},
		Solvers:  inProcess(t),
		Limit:    time.Minute,
	})
	if err != nil {
		t.Fatal(err)
	}
	if gv.Verdict.Outcome != Unsatisfiable || len(gv.Checks) != 1 || !gv.Checks[0].DRAT || !gv.Checks[0].LRAT {
		t.Fatalf("verdict %+v checks %+v", gv.Verdict, gv.Checks)
	}
}
