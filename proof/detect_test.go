package proof

import (
	"bytes"
	"strings"
	"testing"
)

// TestDetect: the LRAT example of REFERENCES (Mathlib's FromLRAT docs, after
// Cruz-Filipe et al., CADE 2017), text DRAT steps, and the binary DRAT
// example of Wetzler, Heule and Hunt (SAT 2014).
func TestDetect(t *testing.T) {
	for _, c := range []struct {
		name, proof, want string
	}{
		{"lrat addition", "5 -2 0 4 3 0\n5 d 3 4 0\n", LRAT},
		{"lrat deletion first", "c made by hand\n\n5 d 3 4 0\n", LRAT},
		{"lrat empty clause", "7 0 5 2 6 0\n", LRAT},
		{"drat lemma", "-2 0\n1 0\n0\n", DRAT},
		{"drat deletion", "d -2 1 0\n-2 0\n", DRAT},
		{"drat empty", "", DRAT},
		{"comments only", "c nothing\n", DRAT},
		{"binary drat", "d\xff\x7f\x00", DRATBinary},
		{"binary example", "\x64\x7f\x83\x80\x01\x00\x61\x82\x02\xff\x7f\x00", DRATBinary},
		// First lines longer than the prefix a caller reads (common
		// practice: 64 KiB heads), cut in the middle of a number.
		{"lrat long hints, cut", "9 -2 3 0 " + strings.Repeat("12345 ", 20000)[:65536], LRAT},
		{"lrat long deletion, cut", "9 d " + strings.Repeat("12345 ", 20000)[:65536], LRAT},
		{"drat long lemma, cut", strings.Repeat("-12345 ", 20000)[:65536], DRAT},
		{"lrat last line without newline", "5 -2 0 4 3 0", LRAT},
		{"drat last line without newline", "-2 0", DRAT},
	} {
		if got := Detect([]byte(c.proof)); got != c.want {
			t.Errorf("%s: Detect = %s, want %s", c.name, got, c.want)
		}
	}
}

// TestLRATLine: the line shapes of LRAT and text DRAT, as the LRAT paper
// (Cruz-Filipe et al., CADE 2017; from memory) and the DRAT paper (Wetzler,
// Heule, Hunt, SAT 2014) describe them.
func TestLRATLine(t *testing.T) {
	for _, c := range []struct {
		line string
		lrat bool
	}{
		{"5 -2 0 4 0", true}, // lemma 5: clause (-2), hint 4
		{"7 0 5 6 0", true},  // the empty clause
		{"6 d 1 2 0", true},  // deletion of clauses 1 and 2
		{"-2 0", false},      // DRAT lemma
		{"1 2 0", false},     // DRAT lemma
		{"0", false},         // DRAT empty clause
		{"d -1 -2 0", false}, // DRAT deletion
		{"5 -2 0 4", false},  // hints not ended
		{"x 0 1 0", false},   // no step number
		{"0 1 0 2 0", false}, // step number 0
	} {
		if got := lratLine(bytes.Fields([]byte(c.line))); got != c.lrat {
			t.Errorf("lratLine(%q) = %v, want %v", c.line, got, c.lrat)
		}
	}
}
