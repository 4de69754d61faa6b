package main

import (
	"strings"
	"testing"
)

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
		if got := lratLine(strings.Fields(c.line)); got != c.lrat {
			t.Errorf("lratLine(%q) = %v, want %v", c.line, got, c.lrat)
		}
	}
}
