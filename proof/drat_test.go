package proof

import (
	"bytes"
	"context"
	"errors"
	"io"
	"reflect"
	"strings"
	"testing"
)

// readAll decodes every step of a proof as DRAT text lines.
func readAll(t *testing.T, proof []byte, format string) ([]string, string) {
	t.Helper()
	pr, _, err := newProofReader(bytes.NewReader(proof), "p", format)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for {
		del, lits, err := pr.next()
		if err == io.EOF {
			return out, pr.format
		}
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, formatStep(del, lits))
	}
}

// The binary DRAT example of Wetzler, Heule, Hunt, "DRAT-trim: Efficient
// Checking and Trimming Using Expressive Clausal Proofs", SAT 2014: the
// bytes 64 7f 83 80 01 00 61 82 02 ff 7f 00 stand for "d -63 -8193 0" and
// "129 -8191 0".
func TestBinaryWorkedExample(t *testing.T) {
	b := []byte{0x64, 0x7f, 0x83, 0x80, 0x01, 0x00, 0x61, 0x82, 0x02, 0xff, 0x7f, 0x00}
	if got := DetectFormat(b); got != DRATBinary {
		t.Fatalf("detected %s, want %s", got, DRATBinary)
	}
	got, format := readAll(t, b, "")
	want := []string{"d -63 -8193 0", "129 -8191 0"}
	if format != DRATBinary || !reflect.DeepEqual(got, want) {
		t.Fatalf("decoded %q as %s, want %q", got, format, want)
	}
}

func TestTextReader(t *testing.T) {
	proof := "c a comment\n1 -2 0\nd 1 -2 0\n  -3\n 4 0\n0\n"
	got, format := readAll(t, []byte(proof), "")
	want := []string{"1 -2 0", "d 1 -2 0", "-3 4 0", "0"}
	if format != DRAT || !reflect.DeepEqual(got, want) {
		t.Fatalf("decoded %q as %s, want %q", got, format, want)
	}
}

func TestReaderErrors(t *testing.T) {
	cases := []struct {
		name, format, proof, want string
	}{
		{"letter", "", "1 x 0\n", "p:1:3: expected a literal"},
		{"unterminated", "", "1 2\n", "not terminated by 0"},
		{"minus zero", "", "-0\n", `"-0" is not a literal`},
		{"too big", "", "3000000000 0\n", "out of range"},
		{"glued d", "", "d1 0\n", "expected a space after 'd'"},
		{"rup deletion", RUP, "1 0\nd 1 0\n", "p:2:1: deletion step"},
		{"bad marker", DRATBinary, "a\x02\x00x\x02\x00", "byte 3: expected step marker"},
		{"binary eof", DRATBinary, "a\x02", "unexpected end of proof"},
		{"binary var 0", DRATBinary, "a\x01\x00", "names variable 0"},
		{"binary long", DRATBinary, "a\xff\xff\xff\xff\xff\x01\x00", "longer than 5 bytes"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			pr, _, err := newProofReader(strings.NewReader(c.proof), "p", c.format)
			if err != nil {
				t.Fatal(err)
			}
			for err == nil {
				_, _, err = pr.next()
			}
			if err == io.EOF || !strings.Contains(err.Error(), c.want) {
				t.Fatalf("error %v, want it to contain %q", err, c.want)
			}
		})
	}
}

// ratFormula needs RAT: {1 ±2 ±3} imply 1 but not by unit propagation
// from -1 alone, and (-1 4), (-1 -4) refute 1. The lemmas (5 1) and (-5 2)
// are RAT on their first literals (5 is a new variable) and not RUP; with
// them, (1) is RUP. Hand-made example; RAT as defined by Wetzler, Heule,
// Hunt (SAT 2014).
const ratFormula = "p cnf 4 6\n1 -2 3 0\n1 -2 -3 0\n1 2 3 0\n1 2 -3 0\n-1 4 0\n-1 -4 0\n"

func TestRATProof(t *testing.T) {
	f := parseCNF(t, ratFormula)
	for _, forward := range []bool{false, true} {
		var lrat bytes.Buffer
		res, err := checkText(t, f, "5 1 0\n-5 2 0\n1 0\n0\n", DRATOptions{Forward: forward, LRAT: &lrat})
		if err != nil || !res.Accepted {
			t.Fatalf("forward=%v: RAT proof rejected: %v", forward, err)
		}
		if res.RAT != 2 || res.CoreLemmas != 3 {
			t.Errorf("forward=%v: %d RAT lemmas, %d checked; want 2 and 3 (the unit refutes; the empty clause is the final conflict)", forward, res.RAT, res.CoreLemmas)
		}
		lr, err := CheckLRAT(context.Background(), f, &lrat, "lrat")
		if err != nil || lr.RAT != 2 {
			t.Fatalf("forward=%v: LRAT re-check: %v (%+v)\n%s", forward, err, lr, lrat.String())
		}
	}
	broken := []struct{ proof, failed string }{
		// pivot 1 first: the resolvents with (-1 4) and (-1 -4) are not RUP
		{"1 5 0\n-5 2 0\n1 0\n0\n", "1 5 0"},
		// without (5 1), (1) no longer follows
		{"-5 2 0\n1 0\n0\n", "1 0"},
	}
	for _, b := range broken {
		res, err := checkText(t, f, b.proof, DRATOptions{})
		if !errors.Is(err, ErrRejected) || res.Accepted || res.FailedText != b.failed {
			t.Errorf("proof %q: err %v, failed %q; want rejection at %q", b.proof, err, res.FailedText, b.failed)
		}
	}
}

// The formula of all four clauses on two variables, refuted by the two
// units. Common practice, no source.
const fourClauses = "p cnf 2 4\n1 2 0\n-1 2 0\n1 -2 0\n-1 -2 0\n"

func TestSmallProofs(t *testing.T) {
	f := parseCNF(t, fourClauses)
	cases := []struct {
		proof    string
		accepted bool
		step     int64
		reason   string
	}{
		{"-2 0\n1 0\n0\n", true, 0, ""},
		{"-2 0\nd -1 -2 0\n1 0\n0\n", true, 0, ""},
		{"1 0\n0\n", true, 0, ""},
		{"-2 0\n1 0\n", false, 0, "never adds the empty clause"},
		{"0\n", false, 1, "empty clause is not implied"},
		{"", false, 0, "does not derive the empty clause"},
		{"3 0\n0\n", false, 2, "empty clause is not implied"},
		{"-2 0\n-1 0\n0\n", true, 0, ""},
	}
	// A formula that unit propagation refutes by itself needs no proof
	// (common practice, no source: solvers write an empty proof for it).
	trivial := parseCNF(t, "p cnf 1 2\n1 0\n-1 0\n")
	for _, forward := range []bool{false, true} {
		if res, err := checkText(t, trivial, "", DRATOptions{Forward: forward}); err != nil || !res.Accepted {
			t.Fatalf("empty proof of a formula refuted by propagation: %v %+v", err, res)
		}
	}
	for _, c := range cases {
		for _, forward := range []bool{false, true} {
			res, err := checkText(t, f, c.proof, DRATOptions{Forward: forward})
			if c.accepted {
				if err != nil || !res.Accepted {
					t.Errorf("%q forward=%v: %v", c.proof, forward, err)
				}
				continue
			}
			if !errors.Is(err, ErrRejected) || res.FailedLemma != c.step || !strings.Contains(res.Reason, c.reason) {
				t.Errorf("%q forward=%v: err %v step %d; want rejection at step %d with %q", c.proof, forward, err, res.FailedLemma, c.step, c.reason)
			}
		}
	}
}

// A lemma that is neither RUP nor RAT is named with its step and text.
func TestRejectNamesLemma(t *testing.T) {
	f := parseCNF(t, "p cnf 3 2\n1 2 0\n-1 3 0\n")
	res, err := checkText(t, f, "2 3 0\n-3 0\n0\n", DRATOptions{Forward: true})
	if !errors.Is(err, ErrRejected) || res.FailedLemma != 2 || res.FailedText != "-3 0" || res.FailedPos != "line 2" {
		t.Fatalf("err %v, result %+v", err, res)
	}
}

// deletionFormula: 1 follows from (1 2), (1 -2); then (-1 3) makes 3 a unit
// whose reason is (-1 3); the last four clauses say 3 is false. Hand-made.
const deletionFormula = "p cnf 5 7\n1 2 0\n1 -2 0\n-1 3 0\n-3 4 5 0\n-3 4 -5 0\n-3 -4 5 0\n-3 -4 -5 0\n"

// Deleting the reason of a unit is ignored (as drat-trim does in its
// default mode): the proof below needs (-1 3) after deleting it. Deleting
// a clause that is no reason takes effect. The backward pass takes back the
// unit (1), the reason of 1.
func TestDeletions(t *testing.T) {
	f := parseCNF(t, deletionFormula)
	for _, forward := range []bool{false, true} {
		var lrat bytes.Buffer
		// (-3 4) already makes propagation conflict: (-3) and 0 are not checked
		res, err := checkText(t, f, "1 0\nd -1 3 0\nd 7 8 0\n-3 4 0\n-3 0\n0\n", DRATOptions{Forward: forward, LRAT: &lrat})
		if err != nil || res.IgnoredDeletions != 1 || res.MissingDeletions != 1 || res.CoreLemmas != 2 {
			t.Fatalf("forward=%v: %v %+v", forward, err, res)
		}
		if _, err := CheckLRAT(context.Background(), f, &lrat, "lrat"); err != nil {
			t.Fatalf("forward=%v: LRAT: %v\n%s", forward, err, lrat.String())
		}
		res, err = checkText(t, f, "1 0\nd -3 4 5 0\n-3 4 0\n-3 0\n0\n", DRATOptions{Forward: forward})
		if !errors.Is(err, ErrRejected) || res.FailedLemma != 3 {
			t.Fatalf("forward=%v: deletion did not take effect: %v", forward, err)
		}
	}
}

// Variable numbers up to 2^31-1 cost memory by use, not by number (a
// formula naming variable 2147483647 would otherwise need gigabytes).
func TestHugeVariables(t *testing.T) {
	f := parseCNF(t, "p cnf 2147483647 4\n2147483647 5 0\n-2147483647 5 0\n2147483647 -5 0\n-2147483647 -5 0\n")
	// 2000000000 is new: (2000000000 -5) is RAT on it; then (-5) and 0
	proof := "2000000000 -5 0\n-5 0\n0\n"
	for _, forward := range []bool{false, true} {
		var lrat bytes.Buffer
		res, err := checkText(t, f, proof, DRATOptions{Forward: forward, LRAT: &lrat})
		if err != nil || !res.Accepted {
			t.Fatalf("forward=%v: %v", forward, err)
		}
		if _, err := CheckLRAT(context.Background(), f, &lrat, "lrat"); err != nil {
			t.Fatalf("forward=%v: LRAT %v\n%s", forward, err, lrat.String())
		}
	}
	res, err := checkText(t, f, "-2147483647 0\n2147483647 0\n", DRATOptions{})
	if !errors.Is(err, ErrRejected) || res.FailedText != "" {
		t.Fatalf("no empty clause: %v %+v", err, res)
	}
}

// Backward checking reports the first failing lemma in proof order even
// though it meets the later one first, and counts both.
func TestFirstFailureInProofOrder(t *testing.T) {
	f := parseCNF(t, ratFormula)
	// (1) is RUP through the chain (1 5), (-5 6), (1 -6), and each link of
	// the chain is neither RUP nor RAT on its first literal
	proof := "1 5 0\n-5 6 0\n1 -6 0\n1 0\n0\n"
	res, err := checkText(t, f, proof, DRATOptions{})
	if !errors.Is(err, ErrRejected) {
		t.Fatalf("accepted: %v", err)
	}
	if res.FailedLemma != 1 || res.FailedText != "1 5 0" || res.FailedLemmas != 3 {
		t.Fatalf("failed at step %d %q (%d failures); want step 1", res.FailedLemma, res.FailedText, res.FailedLemmas)
	}
	t.Logf("%v", err)
}
