package proof

import (
	"bytes"
	"context"
	"errors"
	"strings"
	"testing"

	"spinecert.dev/textpos"
)

// A step may have at most 2·vars+16 literals (stepLimit): on the four
// clauses over two variables, 20 literals as written pass the reader and 21
// do not, in text and binary DRAT and in LRAT, and the error names the
// literal where the step went over the limit.
func TestStepLimit(t *testing.T) {
	f := parseCNF(t, fourClauses)
	if got := stepLimit(2); got != 20 {
		t.Fatalf("stepLimit(2) = %d, want 20", got)
	}
	rep := func(n int) string { return strings.Repeat("1 -2 ", n/2) + strings.Repeat("1 ", n%2) }
	binStep := func(n int) []byte {
		b := []byte{'a'}
		for i := range n {
			b = append(b, byte(2+i%2*3)) // 1, -2
		}
		return append(b, 0)
	}
	pos := func(t *testing.T, err error, line, col int, msg string) {
		t.Helper()
		var pe *textpos.Error
		if !errors.As(err, &pe) || pe.Line != line || pe.Col != col || !strings.Contains(pe.Msg, msg) {
			t.Fatalf("err %v, want a *textpos.Error at %d:%d saying %q", err, line, col, msg)
		}
	}
	const msg = "step has more than 20 literals"
	// at the limit: read, then rejected for what the lemma says
	if _, err := checkText(t, f, rep(20)+"0\n", DRATOptions{}); !errors.Is(err, ErrRejected) {
		t.Fatalf("20 literals: %v, want a rejection, not a read error", err)
	}
	_, err := checkText(t, f, "c a comment\n"+rep(21)+"0\n", DRATOptions{})
	pos(t, err, 2, 1+5*10, msg) // "1 -2 " takes 5 columns
	if _, err := CheckDRAT(context.Background(), f, bytes.NewReader(binStep(20)), DRATOptions{}); !errors.Is(err, ErrRejected) {
		t.Fatalf("binary, 20 literals: %v, want a rejection", err)
	}
	_, err = CheckDRAT(context.Background(), f, bytes.NewReader(binStep(21)), DRATOptions{})
	if err == nil || !strings.Contains(err.Error(), "byte 21: "+msg) {
		t.Fatalf("binary, 21 literals: %v, want %q at byte 21", err, msg)
	}
	// LRAT: 20 literals are read (and the lemma then checked), 21 are refused
	_, err = CheckLRAT(context.Background(), f, strings.NewReader("5 "+rep(20)+"0 1 0\n"), "x.lrat")
	if !errors.Is(err, ErrRejected) {
		t.Fatalf("LRAT, 20 literals: %v, want a rejection", err)
	}
	_, err = CheckLRAT(context.Background(), f, strings.NewReader("5 "+rep(21)+"0 1 0\n"), "x.lrat")
	pos(t, err, 1, 3+5*10, msg)
}

// The limit grows with the variables the proof introduces: after a lemma on
// new variables 3..12, a step may have 2·12+16 literals.
func TestStepLimitGrows(t *testing.T) {
	f := parseCNF(t, fourClauses)
	lemma := "3 4 5 6 7 8 9 10 11 12 0\n" // RAT on the new variable 3
	long := strings.Repeat("1 ", 40) + "0\n"
	if _, err := checkText(t, f, lemma+long, DRATOptions{}); !errors.Is(err, ErrRejected) {
		t.Fatalf("40 literals after 10 new variables: %v, want a rejection, not a read error", err)
	}
	_, err := checkText(t, f, lemma+"1 "+long, DRATOptions{})
	if err == nil || !strings.Contains(err.Error(), "step has more than 40 literals") {
		t.Fatalf("41 literals: %v, want the step limit", err)
	}
}
