package proof

import (
	"context"
	"errors"
	"strings"
	"testing"
)

// The LRAT example of Cruz-Filipe, Heule, Hunt, Kaufmann, Schneider-Kamp,
// "Efficient certified RAT verification" (CADE 2017), as reproduced in
// Mathlib's LRAT documentation (Mathlib.Tactic.Sat.FromLRAT): the four
// clauses on two variables and a five-line proof.
const lratExample = "5 -2 0 4 3 0\n5 d 3 4 0\n6 1 0 5 1 0\n6 d 1 0\n7 0 5 2 6 0\n"

func TestLRATWorkedExample(t *testing.T) {
	f := parseCNF(t, fourClauses)
	res, err := CheckLRAT(context.Background(), f, strings.NewReader(lratExample), "ex.lrat")
	if err != nil || !res.Accepted || res.Added != 3 || res.Deleted != 3 {
		t.Fatalf("worked example: %v %+v", err, res)
	}
	mutants := []struct{ name, proof, why string }{
		{"hint dropped", strings.Replace(lratExample, "7 0 5 2 6 0", "7 0 5 2 0", 1), "do not lead to a conflict"},
		{"deleted hint", strings.Replace(lratExample, "7 0 5 2 6 0", "7 0 5 3 6 0", 1), "hint 3 names no current clause"},
		{"literal flipped", strings.Replace(lratExample, "6 1 0 5 1 0", "6 -1 0 5 1 0", 1), "hint 1 is satisfied"},
		{"no empty clause", strings.Replace(lratExample, "7 0 5 2 6 0\n", "", 1), "does not add the empty clause"},
		{"not unit", strings.Replace(lratExample, "7 0 5 2 6 0", "7 0 2 5 6 0", 1), "hint 2 is not unit"},
		{"id reused", strings.Replace(lratExample, "6 1 0 5 1 0", "5 1 0 5 1 0", 1), "not larger"},
		{"bad deletion", strings.Replace(lratExample, "6 d 1 0", "6 d 9 0", 1), "deletes clause 9"},
	}
	for _, m := range mutants {
		res, err := CheckLRAT(context.Background(), f, strings.NewReader(m.proof), "ex.lrat")
		if !errors.Is(err, ErrRejected) || res.Accepted || !strings.Contains(res.Reason, m.why) {
			t.Errorf("%s: err %v, want rejection with %q", m.name, err, m.why)
		}
	}
}

// RAT hints: lemma (5 1) on a new variable needs no group; (-5 2) needs a
// group for (5 1). See ratFormula.
func TestLRATRAT(t *testing.T) {
	f := parseCNF(t, ratFormula)
	good := "7 5 1 0 0\n8 -5 2 0 -7 3 4 0\n9 1 0 7 8 1 2 0\n10 0 9 5 6 0\n"
	res, err := CheckLRAT(context.Background(), f, strings.NewReader(good), "rat.lrat")
	if err != nil || res.RAT != 2 {
		t.Fatalf("RAT proof: %v %+v", err, res)
	}
	bad := []struct{ proof, why string }{
		{strings.Replace(good, "-7 3 4 0", "0", 1), "no RAT hints for clause 7"},
		{strings.Replace(good, "-7 3 4 0", "-7 3 0", 1), "do not lead to a conflict"},
		{strings.Replace(good, "-7 3 4 0", "-1 3 4 0", 1), "names no current clause containing 5"},
		{strings.Replace(good, "-7 3 4 0", "-7 3 4 -7 0", 1), "two RAT hint groups"},
	}
	for _, b := range bad {
		res, err := CheckLRAT(context.Background(), f, strings.NewReader(b.proof), "rat.lrat")
		if !errors.Is(err, ErrRejected) || !strings.Contains(res.Reason, b.why) {
			t.Errorf("%q: err %v, want %q", b.proof, err, b.why)
		}
	}
}

func TestLRATParseErrors(t *testing.T) {
	f := parseCNF(t, fourClauses)
	// -2^63 is a valid int64 whose negation overflows; read as a literal it
	// would wrap to 0. -2^31 has no int32 negation (variables are at most
	// 2^31-1, as in DIMACS; common practice, no source).
	for _, p := range []string{"x 0 0\n", "5 1 0 2\n", "5 1 2\n", "5 d 1\n", "-5 0 0\n", "5 -9223372036854775808 0 0\n", "5 -2147483648 0 0\n", "5 2147483648 0 0\n"} {
		_, err := CheckLRAT(context.Background(), f, strings.NewReader(p), "bad.lrat")
		if err == nil || errors.Is(err, ErrRejected) || !strings.Contains(err.Error(), "bad.lrat:1:") {
			t.Errorf("%q: err %v, want a parse error at bad.lrat:1", p, err)
		}
	}
}

// A satisfiable formula has no refutation: no proof may pass against it.
// The proof below once passed because the literal -2^63 wrapped to 0 and
// made a RAT lemma that every clause "contained" vacuously.
func TestLRATNoRefutationOfSatisfiable(t *testing.T) {
	f := parseCNF(t, "p cnf 1 1\n1 0\n")
	proof := "2 -9223372036854775808 0 0\n3 0 2 0\n"
	res, err := CheckLRAT(context.Background(), f, strings.NewReader(proof), "sat.lrat")
	if err == nil || (res != nil && res.Accepted) {
		t.Fatalf("a refutation of the satisfiable formula (1) was accepted: %+v", res)
	}
}
