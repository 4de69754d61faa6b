package verify

import (
	"strings"
	"testing"
)

// TestDecide exercises the decision rules of Decide: two independent UNSAT
// answers plus one proof passing both checkers, a checked model, and a
// conflict on any disagreement.
func TestDecide(t *testing.T) {
	sat := func(b string) *Result { return &Result{Backend: b, Answer: Sat, Model: []bool{true}} }
	unsat := func(b string) *Result { return &Result{Backend: b, Answer: Unsat, Proof: "/p/" + b} }
	unknown := func(b, why string) *Result { return &Result{Backend: b, Detail: why} }
	suspect := func(b string) *Result {
		return &Result{Backend: b, Suspect: true, Detail: "WRONG MODEL: " + b + " claimed SAT"}
	}
	good := func(b string) ProofCheck {
		return ProofCheck{Backend: b, Format: "drat", DRAT: true, LRAT: true, Lemmas: 9, Core: 4}
	}
	dratOnly := func(b string) ProofCheck { return ProofCheck{Backend: b, DRAT: true} }
	bad := func(b string) ProofCheck { return ProofCheck{Backend: b, Error: "lemma 3 is not RUP"} }
	tests := []struct {
		name     string
		results  []*Result
		checks   []ProofCheck
		outcome  Outcome
		contains []string
	}{
		{"two unsat one proof", []*Result{unsat("a"), unsat("b")}, []ProofCheck{good("a")}, Unsatisfiable,
			[]string{"UNSAT from 2 independent backends: a, b", "passed spinecert's DRAT checker and the LRAT re-check"}},
		{"one unsat", []*Result{unsat("a"), unknown("b", "time limit")}, []ProofCheck{good("a")}, Undecided,
			[]string{"UNSAT from 2 independent backends (have 1: a)", "b gave no answer: time limit"}},
		{"same backend twice", []*Result{unsat("a"), unsat("a")}, []ProofCheck{good("a")}, Undecided,
			[]string{"have 1: a"}},
		{"no proof", []*Result{unsat("a"), unsat("b")}, nil, Undecided,
			[]string{"1 proof(s) passing spinecert's DRAT checker and the LRAT re-check (have 0)"}},
		{"drat without lrat", []*Result{unsat("a"), unsat("b")}, []ProofCheck{dratOnly("a")}, Undecided,
			[]string{"(have 0)"}},
		{"rejected proof", []*Result{unsat("a"), unsat("b")}, []ProofCheck{bad("a")}, Undecided,
			[]string{"proof from a REJECTED: lemma 3 is not RUP"}},
		{"rejected and good", []*Result{unsat("a"), unsat("b")}, []ProofCheck{bad("a"), good("b")}, Unsatisfiable,
			[]string{"REJECTED", "proof from b"}},
		{"proof of a non-unsat backend", []*Result{unsat("a"), unsat("b"), unknown("c", "x")}, []ProofCheck{good("c")}, Undecided,
			[]string{"(have 0)"}},
		{"sat", []*Result{sat("a"), unknown("b", "crashed")}, nil, Satisfiable,
			[]string{"model from a satisfies every clause"}},
		{"disagree", []*Result{sat("a"), unsat("b")}, []ProofCheck{good("b")}, Undecided,
			[]string{"backends disagree: a found a model", "but b said UNSAT"}},
		{"suspect beside unsat", []*Result{suspect("liar"), unsat("a"), unsat("b")}, []ProofCheck{good("a")}, Undecided,
			[]string{"WRONG MODEL: liar"}},
		{"suspect beside sat", []*Result{suspect("liar"), sat("a")}, nil, Undecided,
			[]string{"WRONG MODEL: liar"}},
		{"nothing", []*Result{unknown("a", "x"), unknown("b", "y")}, nil, Undecided,
			[]string{"have 0", "a gave no answer: x"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			v := Decide(tt.results, tt.checks, DefaultPolicy())
			if v.Outcome != tt.outcome {
				t.Errorf("outcome %s, want %s (%+v)", v.Outcome, tt.outcome, v)
			}
			text := strings.Join(append(append(append(append([]string{}, v.Checked...), v.Notes...), v.Missing...), v.Conflict), "\n")
			for _, c := range tt.contains {
				if !strings.Contains(text, c) {
					t.Errorf("no %q in\n%s", c, text)
				}
			}
			if (v.Outcome == Satisfiable) != (v.Model != nil) {
				t.Errorf("model %v with outcome %s", v.Model, v.Outcome)
			}
			if v.Outcome != Undecided && len(v.Missing) > 0 {
				t.Errorf("decided with missing %q", v.Missing)
			}
		})
	}
}
