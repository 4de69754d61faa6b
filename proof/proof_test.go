package proof

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/klauspost/compress/zstd"

	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture/formulas"
)

// checkBoth checks a proof backward and forward, writes LRAT from each and
// re-checks it with the small LRAT checker.
func checkBoth(t *testing.T, f *dimacs.CNF, proof []byte, wantFormat string) *DRATResult {
	t.Helper()
	var back *DRATResult
	for _, forward := range []bool{false, true} {
		var lrat bytes.Buffer
		res, err := CheckDRAT(context.Background(), f, bytes.NewReader(proof), DRATOptions{Forward: forward, LRAT: &lrat})
		if err != nil || !res.Accepted {
			t.Fatalf("forward=%v: proof rejected: %v", forward, err)
		}
		if res.Format != wantFormat || !res.Detected {
			t.Fatalf("format %s (detected %v), want detected %s", res.Format, res.Detected, wantFormat)
		}
		lr, err := CheckLRAT(context.Background(), f, &lrat, "lrat")
		if err != nil || !lr.Accepted {
			t.Fatalf("forward=%v: LRAT re-check failed: %v", forward, err)
		}
		if !forward {
			back = res
		}
	}
	return back
}

// Pigeonhole formulas are unsatisfiable (Haken 1985); cadical's DRAT
// proofs of them, text (--no-binary) and binary (its default), must pass.
func TestPigeonholeCadical(t *testing.T) {
	for n := 3; n <= 7; n++ {
		f := formulas.Pigeonhole(n)
		for _, binary := range []bool{false, true} {
			t.Run(fmt.Sprintf("PHP(%d,%d)/binary=%v", n+1, n, binary), func(t *testing.T) {
				proof := cadicalProof(t, f, binary)
				want := DRAT
				if binary {
					want = DRATBinary
				}
				res := checkBoth(t, f, proof, want)
				if res.CoreLemmas == 0 || res.CoreLemmas > res.Lemmas {
					t.Fatalf("checked %d of %d lemmas", res.CoreLemmas, res.Lemmas)
				}
			})
		}
	}
}

// coreLemmas returns the lemmas of an LRAT proof (as sorted literal sets).
func lratLemmaSet(lrat string) map[string]bool {
	out := map[string]bool{}
	for _, line := range strings.Split(lrat, "\n") {
		f := strings.Fields(line)
		if len(f) < 2 || f[1] == "d" {
			continue
		}
		out[clauseKey(f[1:])] = true
	}
	return out
}

func clauseKey(f []string) string {
	var lits []string
	for _, x := range f {
		if x == "0" {
			break
		}
		lits = append(lits, x)
	}
	m := map[string]bool{}
	for _, l := range lits {
		m[l] = true
	}
	var keys []string
	for k := range m {
		keys = append(keys, k)
	}
	for i := range keys {
		for j := i + 1; j < len(keys); j++ {
			if keys[j] < keys[i] {
				keys[i], keys[j] = keys[j], keys[i]
			}
		}
	}
	return strings.Join(keys, " ")
}

// Mutations of cadical's text proof of PHP(7,6) are rejected: a needed
// lemma removed from the middle, a literal flipped in a needed lemma, the
// empty clause dropped. A proof of PHP(7,6) offered for the satisfiable
// PHP(6,6) is rejected too (a sound checker accepts no refutation of a
// satisfiable formula).
func TestPigeonholeMutations(t *testing.T) {
	n := 6
	f := formulas.Pigeonhole(n)
	proof := string(cadicalProof(t, f, false))
	var lrat bytes.Buffer
	if _, err := CheckDRAT(context.Background(), f, strings.NewReader(proof), DRATOptions{LRAT: &lrat}); err != nil {
		t.Fatal(err)
	}
	core := lratLemmaSet(lrat.String())
	lines := strings.Split(strings.TrimSuffix(proof, "\n"), "\n")
	var needed []int // lines holding core lemmas
	for i, l := range lines {
		if !strings.HasPrefix(l, "d") && l != "0" && core[clauseKey(strings.Fields(l))] {
			needed = append(needed, i)
		}
	}
	if len(needed) < 3 {
		t.Fatalf("only %d core lemmas", len(needed))
	}
	mid := needed[len(needed)/2]
	join := func(ls []string) string { return strings.Join(ls, "\n") + "\n" }

	removed := join(append(append([]string{}, lines[:mid]...), lines[mid+1:]...))
	var noEmpty []string
	for _, l := range lines {
		if strings.TrimSpace(l) != "0" {
			noEmpty = append(noEmpty, l)
		}
	}
	cases := map[string]struct {
		f     *dimacs.CNF
		proof string
	}{
		"lemma removed":   {f, removed},
		"no empty clause": {f, join(noEmpty)},
		"satisfiable":     {pigeonhole2(n), proof},
		"satisfiable, 0":  {pigeonhole2(n), "0\n"},
	}
	for name, c := range cases {
		for _, forward := range []bool{false, true} {
			res, err := CheckDRAT(context.Background(), c.f, strings.NewReader(c.proof), DRATOptions{Forward: forward})
			if !errors.Is(err, ErrRejected) || res == nil || res.Accepted {
				t.Errorf("%s forward=%v: want rejection, got %v", name, forward, err)
				continue
			}
			if res.Reason == "" {
				t.Errorf("%s: rejection without a reason", name)
			}
			t.Logf("%s forward=%v: %v", name, forward, err)
		}
	}
}

// A literal flipped in a needed lemma: a flipped clause of an unsatisfiable
// formula is still implied, so the check is on the format's rule, not on
// meaning. Core lemmas are flipped one at a time from the middle of the
// proof; every mutant that passes must also pass the separate LRAT checker
// through its LRAT (the two checkers agree), and some mutant near the middle
// must be rejected.
func TestPigeonholeFlippedLiteral(t *testing.T) {
	n := 6
	f := formulas.Pigeonhole(n)
	proof := string(cadicalProof(t, f, false))
	var lrat bytes.Buffer
	if _, err := CheckDRAT(context.Background(), f, strings.NewReader(proof), DRATOptions{LRAT: &lrat}); err != nil {
		t.Fatal(err)
	}
	core := lratLemmaSet(lrat.String())
	lines := strings.Split(strings.TrimSuffix(proof, "\n"), "\n")
	var needed []int
	for i, l := range lines {
		if !strings.HasPrefix(l, "d") && l != "0" && core[clauseKey(strings.Fields(l))] {
			needed = append(needed, i)
		}
	}
	for try := 0; try < 40 && try < len(needed); try++ {
		at := needed[len(needed)/2+try/2*(1-2*(try%2))]
		mut := append([]string{}, lines...)
		fl := strings.Fields(mut[at])
		fl[0] = fmt.Sprint(-atoi(t, fl[0]))
		mut[at] = strings.Join(fl, " ")
		var out bytes.Buffer
		res, err := CheckDRAT(context.Background(), f, strings.NewReader(strings.Join(mut, "\n")+"\n"), DRATOptions{LRAT: &out})
		if err == nil {
			if _, lerr := CheckLRAT(context.Background(), f, &out, "lrat"); lerr != nil {
				t.Fatalf("mutant accepted by the DRAT checker but its LRAT fails: %v", lerr)
			}
			continue
		}
		if !errors.Is(err, ErrRejected) || res.FailedLemma < int64(at+1) {
			t.Fatalf("mutant at line %d: %v (failed step %d)", at+1, err, res.FailedLemma)
		}
		t.Logf("flipped line %d %q: %v", at+1, mut[at], err)
		return
	}
	t.Fatal("no mutant with a flipped literal was rejected")
}

func atoi(t *testing.T, s string) int {
	var v int
	if _, err := fmt.Sscan(s, &v); err != nil {
		t.Fatal(err)
	}
	return v
}

// pigeonhole2 is PHP(n,n): n pigeons in n holes, satisfiable (the identity).
func pigeonhole2(n int) *dimacs.CNF {
	f := &dimacs.CNF{Vars: n * n}
	p := func(i, j int) int32 { return int32((i-1)*n + j) }
	for i := 1; i <= n; i++ {
		var c []int32
		for j := 1; j <= n; j++ {
			c = append(c, p(i, j))
		}
		f.Clauses = append(f.Clauses, c)
	}
	for j := 1; j <= n; j++ {
		for i := 1; i <= n; i++ {
			for k := i + 1; k <= n; k++ {
				f.Clauses = append(f.Clauses, []int32{-p(i, j), -p(k, j)})
			}
		}
	}
	return f
}

// proofRandom3SAT draws m clauses of three distinct variables out of n with
// random signs.
func proofRandom3SAT(rng *rand.Rand, n, m int) *dimacs.CNF {
	f := &dimacs.CNF{Vars: n}
	for range m {
		perm := rng.Perm(n)[:3]
		c := make([]int32, 3)
		for i, v := range perm {
			c[i] = int32(v + 1)
			if rng.IntN(2) == 0 {
				c[i] = -c[i]
			}
		}
		f.Clauses = append(f.Clauses, c)
	}
	return f
}

// Random 3-SAT at the threshold ratio m/n = 4.26 (Mitchell, Selman,
// Levesque, "Hard and easy distributions of SAT problems", AAAI 1992, from
// memory): about half the instances are UNSAT; cadical's proofs of those
// must check, backward and forward, and their LRAT must re-check.
func TestRandom3SATCadical(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 26))
	unsat := 0
	for i := range 30 {
		f := proofRandom3SAT(rng, 60, 256)
		proof, isUnsat := cadicalMaybeProof(t, f)
		if !isUnsat {
			continue
		}
		unsat++
		t.Run(fmt.Sprint(i), func(t *testing.T) { checkBoth(t, f, proof, DRATBinary) })
	}
	if unsat == 0 {
		t.Fatal("no UNSAT instance in the batch")
	}
	t.Logf("%d of 30 instances UNSAT", unsat)
}

func TestCompressedProof(t *testing.T) {
	f := parseCNF(t, fourClauses)
	// gzip of "-2 0\n1 0\n0\n", made with Go's compress/gzip
	var b bytes.Buffer
	gzipTo(t, &b, []byte("-2 0\n1 0\n0\n"))
	res, err := CheckDRAT(context.Background(), f, &b, DRATOptions{})
	if err != nil || !res.Accepted || res.Format != DRAT {
		t.Fatalf("gzip proof: %v %+v", err, res)
	}
	// zstd (klauspost/compress), binary inside: a -2, a 1, a (empty)
	var z bytes.Buffer
	enc, err := zstd.NewWriter(&z)
	if err != nil {
		t.Fatal(err)
	}
	enc.Write([]byte("a\x05\x00a\x02\x00a\x00"))
	enc.Close()
	res, err = CheckDRAT(context.Background(), f, &z, DRATOptions{})
	if err != nil || !res.Accepted || res.Format != DRATBinary {
		t.Fatalf("zstd proof: %v %+v", err, res)
	}
}

// Mutated cadical proofs of random 3-SAT instances (a line dropped, a
// literal flipped, a deletion of a formula clause inserted): whenever the
// DRAT checker accepts one, in either mode, the LRAT it writes must pass the
// separate LRAT checker. The two checkers share no code, so this catches a
// DRAT checker that accepts what it should not.
func TestMutantsAgreeWithLRAT(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 7))
	accepted, rejected := 0, 0
	for inst := 0; inst < 40 && accepted+rejected < 200; inst++ {
		f := proofRandom3SAT(rng, 40, 175)
		proof, isUnsat := cadicalMaybeProof(t, f)
		if !isUnsat {
			continue
		}
		steps, err := fuzzSteps(proof, DRATBinary)
		if err != nil {
			t.Fatal(err)
		}
		for range 8 {
			mut := append([]string{}, steps...)
			i := rng.IntN(len(mut))
			switch rng.IntN(3) {
			case 0:
				mut = append(mut[:i], mut[i+1:]...)
			case 1:
				fl := strings.Fields(mut[i])
				j := rng.IntN(len(fl))
				if fl[j] != "0" && fl[j] != "d" {
					if strings.HasPrefix(fl[j], "-") {
						fl[j] = fl[j][1:]
					} else {
						fl[j] = "-" + fl[j]
					}
				}
				mut[i] = strings.Join(fl, " ")
			case 2:
				c := f.Clauses[rng.IntN(len(f.Clauses))]
				del := "d " + strings.Trim(fmt.Sprint(c), "[]") + " 0"
				mut = append(mut[:i], append([]string{del}, mut[i:]...)...)
			}
			text := strings.Join(mut, "\n") + "\n"
			for _, forward := range []bool{false, true} {
				var lrat bytes.Buffer
				_, err := CheckDRAT(context.Background(), f, strings.NewReader(text), DRATOptions{Forward: forward, LRAT: &lrat})
				if err != nil {
					if !errors.Is(err, ErrRejected) {
						t.Fatal(err)
					}
					rejected++
					continue
				}
				accepted++
				if _, err := CheckLRAT(context.Background(), f, &lrat, "lrat"); err != nil {
					t.Fatalf("forward=%v: accepted mutant, LRAT fails: %v", forward, err)
				}
			}
		}
	}
	t.Logf("%d accepted, %d rejected", accepted, rejected)
	if accepted == 0 || rejected == 0 {
		t.Fatalf("mutants: %d accepted, %d rejected; want some of each", accepted, rejected)
	}
}

// Forward mode frees deleted clauses by compacting its clause store; with
// compaction forced at every chance, cadical's proofs still check and their
// LRAT still re-checks.
func TestForwardCompaction(t *testing.T) {
	old := compactMin
	compactMin = 0
	defer func() { compactMin = old }()
	rng := rand.New(rand.NewPCG(9, 9))
	checked := 0
	for range 10 {
		f := proofRandom3SAT(rng, 60, 256)
		proof, isUnsat := cadicalMaybeProof(t, f)
		if !isUnsat {
			continue
		}
		var lrat bytes.Buffer
		res, err := CheckDRAT(context.Background(), f, bytes.NewReader(proof), DRATOptions{Forward: true, LRAT: &lrat})
		if err != nil || res.Deletions == 0 {
			t.Fatalf("%v (%d deletions)", err, res.Deletions)
		}
		if _, err := CheckLRAT(context.Background(), f, &lrat, "lrat"); err != nil {
			t.Fatal(err)
		}
		checked++
	}
	if checked == 0 {
		t.Fatal("no UNSAT instance")
	}
}
