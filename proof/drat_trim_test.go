package proof

import (
	"bytes"
	"context"
	"testing"

	"spinecert.dev/internal/fixture/formulas"
)

// The formula is fourClauses (all four clauses on two variables) plus the
// clause 1 2 3. A proof with a lemma the refutation does not need ("1 3",
// RUP but unused, and deleted again) trims to the deletion of the formula
// clause, the unit 2 and the empty clause. Bytes as binary DRAT writes them
// (Wetzler, Heule and Hunt, SAT 2014): 'a' or 'd', each literal l as 2l
// (+1 if negative), 0.
func TestTrimmedDropsUnusedLemma(t *testing.T) {
	f := parseCNF(t, "p cnf 3 5\n1 2 0\n-1 2 0\n1 -2 0\n-1 -2 0\n1 2 3 0\n")
	var tr bytes.Buffer
	res, err := checkText(t, f, "1 3 0\nd 1 3 0\nd 3 2 1 0\n2 0\n0\n", DRATOptions{Trimmed: &tr})
	if err != nil || !res.Accepted {
		t.Fatalf("proof rejected: %v", err)
	}
	if res.Lemmas != 3 || res.CoreLemmas != 1 {
		t.Fatalf("lemmas %d, core %d; want 3 and 1", res.Lemmas, res.CoreLemmas)
	}
	want := []byte{'d', 0x02, 0x04, 0x06, 0, 'a', 0x04, 0, 'a', 0}
	if !bytes.Equal(tr.Bytes(), want) {
		t.Fatalf("trimmed proof % x, want % x", tr.Bytes(), want)
	}
	out := CheckRefutation(context.Background(), f, bytes.NewReader(tr.Bytes()), RefutationOptions{Format: DRATBinary})
	if !out.OK() {
		t.Fatalf("the trimmed proof did not pass both checkers: %s", out.Detail)
	}
}

// Trimming a solver's proof of PHP(n+1, n) (unsatisfiable: Haken, 1985)
// gives a proof of the same formula that both checkers accept again from
// scratch, with exactly the core lemmas of the first check.
func TestTrimmedCadicalProofStillRefutes(t *testing.T) {
	for _, n := range []int{5, 6} {
		f := formulas.Pigeonhole(n)
		p := cadicalProof(t, f, false)
		var tr bytes.Buffer
		res, err := CheckDRAT(context.Background(), f, bytes.NewReader(p), DRATOptions{Trimmed: &tr})
		if err != nil || !res.Accepted {
			t.Fatalf("PHP(%d,%d): cadical's proof rejected: %v", n+1, n, err)
		}
		out := CheckRefutation(context.Background(), f, bytes.NewReader(tr.Bytes()), RefutationOptions{Format: DRATBinary})
		if !out.OK() {
			t.Fatalf("PHP(%d,%d): the trimmed proof did not pass both checkers: %s", n+1, n, out.Detail)
		}
		// the empty clause is the one lemma added beyond the core
		if uint64(out.Lemmas) != res.CoreLemmas+1 {
			t.Errorf("PHP(%d,%d): trimmed proof has %d lemmas, want the %d core lemmas and the empty clause", n+1, n, out.Lemmas, res.CoreLemmas)
		}
		t.Logf("PHP(%d,%d): %d lemmas, %d core; %d bytes of text, %d trimmed binary", n+1, n, res.Lemmas, res.CoreLemmas, len(p), tr.Len())
	}
}

func TestTrimmedNeedsBackward(t *testing.T) {
	f := parseCNF(t, fourClauses)
	var tr bytes.Buffer
	if _, err := checkText(t, f, "2 0\n0\n", DRATOptions{Trimmed: &tr, Forward: true}); err == nil {
		t.Fatal("a trimmed proof was asked of the forward check and no error came back")
	}
}

// A lemma whose check does not need one of its literals is trimmed to the
// literals the check used: with the unit -3 in the formula, "2 3" is RUP
// through its literal 2 alone (assuming -2 propagates 1 by "1 2" and
// falsifies "-1 2"), so the trimmed proof adds "2" and the empty clause.
// Bytes as binary DRAT writes them (Wetzler, Heule and Hunt, SAT 2014).
func TestTrimmedShrinksLemma(t *testing.T) {
	f := parseCNF(t, "p cnf 3 5\n-3 0\n1 2 0\n-1 2 0\n1 -2 0\n-1 -2 0\n")
	var tr bytes.Buffer
	res, err := checkText(t, f, "2 3 0\n0\n", DRATOptions{Trimmed: &tr})
	if err != nil || !res.Accepted {
		t.Fatalf("proof rejected: %v", err)
	}
	want := []byte{'a', 0x04, 0, 'a', 0}
	if !bytes.Equal(tr.Bytes(), want) {
		t.Fatalf("trimmed proof % x, want % x", tr.Bytes(), want)
	}
	out := CheckRefutation(context.Background(), f, bytes.NewReader(tr.Bytes()), RefutationOptions{Format: DRATBinary})
	if !out.OK() {
		t.Fatalf("the trimmed proof did not pass both checkers: %s", out.Detail)
	}
}
