package verify

import (
	"encoding/json"
	"fmt"
	"slices"
	"strings"
	"time"
)

// Outcome is what the evidence decides about a formula.
type Outcome int

const (
	// Undecided: the evidence is short of a decision, or it contradicts itself.
	Undecided Outcome = iota
	// Satisfiable: a backend produced a model that satisfies every clause.
	Satisfiable
	// Unsatisfiable: enough independent backends said UNSAT and enough of
	// their proofs passed spinecert's checkers (see Policy).
	Unsatisfiable
)

// String returns "satisfiable", "unsatisfiable" or "undecided".
func (o Outcome) String() string {
	switch o {
	case Satisfiable:
		return "satisfiable"
	case Unsatisfiable:
		return "unsatisfiable"
	}
	return "undecided"
}

// MarshalJSON writes the outcome as its string.
func (o Outcome) MarshalJSON() ([]byte, error) { return json.Marshal(o.String()) }

// ProofCheck is the outcome of checking one backend's UNSAT proof with
// spinecert's own checkers: the DRAT checker and the LRAT re-check of the
// proof it produced.
type ProofCheck struct {
	Backend string        `json:"backend"`
	Format  string        `json:"format"`            // format the proof was read as
	DRAT    bool          `json:"drat_ok"`           // the DRAT checker accepted the proof
	LRAT    bool          `json:"lrat_ok"`           // the LRAT re-check accepted the checker's LRAT output
	Lemmas  int64         `json:"lemmas"`            // lemmas in the proof
	Core    int64         `json:"core_lemmas"`       // lemmas the checker had to verify
	Error   string        `json:"error,omitempty"`   // why a check failed
	Elapsed time.Duration `json:"elapsed_ns"`        // time for both checks
	Skipped string        `json:"skipped,omitempty"` // why the proof was not checked
}

// Passed reports whether the proof passed every check the policy asks for.
func (c ProofCheck) Passed(p Policy) bool { return c.DRAT && (c.LRAT || !p.RequireLRAT) }

// Policy says how much evidence turns UNSAT claims into a verdict.
type Policy struct {
	MinUnsat    int  // distinct backends that must say UNSAT
	MinProofs   int  // proofs that must pass spinecert's checkers
	RequireLRAT bool // a passing proof must also pass the LRAT re-check
}

// DefaultPolicy asks for two independent UNSAT answers and one proof that
// passes both the DRAT checker and the LRAT re-check.
func DefaultPolicy() Policy { return Policy{MinUnsat: 2, MinProofs: 1, RequireLRAT: true} }

// Verdict is the decision Decide draws from solver results and proof checks.
type Verdict struct {
	Outcome   Outcome  `json:"outcome"`
	Model     []bool   `json:"-"`                    // a checked model (Satisfiable only)
	ModelFrom string   `json:"model_from,omitempty"` // backend that produced Model
	SatBy     []string `json:"sat_by,omitempty"`     // backends with a checked model
	UnsatBy   []string `json:"unsat_by,omitempty"`   // backends that said UNSAT
	ProofsOK  []string `json:"proofs_ok,omitempty"`  // backends whose proof passed the checks
	Checked   []string `json:"checked,omitempty"`    // what was checked, for people
	Notes     []string `json:"notes,omitempty"`      // what was not checked or gave no answer, for people
	Missing   []string `json:"missing,omitempty"`    // what a decision still lacks (Undecided only)
	Conflict  string   `json:"conflict,omitempty"`   // the contradiction, when the backends disagree
}

// Decide draws a verdict from the results of solver runs on one formula and
// the checks of their proofs. It is a pure function. The rules:
//
//   - A suspect backend (a model that violates the formula, an exit status
//     against its own answer) or a checked model beside an UNSAT claim is a
//     conflict: Undecided, with both sides named in Conflict.
//   - Otherwise a checked model decides Satisfiable.
//   - Otherwise UNSAT claims decide Unsatisfiable when at least
//     p.MinUnsat distinct backends made them and at least p.MinProofs of
//     their proofs passed the checks p asks for.
//   - Anything else is Undecided, with what is missing.
func Decide(results []*Result, checks []ProofCheck, p Policy) *Verdict {
	v := &Verdict{}
	var suspects []string
	for _, r := range results {
		switch {
		case r.Suspect:
			suspects = append(suspects, fmt.Sprintf("%s: %s", r.Backend, r.Detail))
		case r.Answer == Sat:
			if !slices.Contains(v.SatBy, r.Backend) {
				v.SatBy = append(v.SatBy, r.Backend)
			}
			if v.Model == nil {
				v.Model, v.ModelFrom = r.Model, r.Backend
			}
		case r.Answer == Unsat:
			if !slices.Contains(v.UnsatBy, r.Backend) {
				v.UnsatBy = append(v.UnsatBy, r.Backend)
			}
		}
	}
	for _, c := range checks {
		if c.Passed(p) && slices.Contains(v.UnsatBy, c.Backend) && !slices.Contains(v.ProofsOK, c.Backend) {
			v.ProofsOK = append(v.ProofsOK, c.Backend)
		}
	}
	switch {
	case len(suspects) > 0:
		v.Conflict = "backend contradicts itself or the formula: " + strings.Join(suspects, "; ")
	case len(v.SatBy) > 0 && len(v.UnsatBy) > 0:
		v.Conflict = fmt.Sprintf("backends disagree: %s found a model that satisfies every clause, but %s said UNSAT",
			strings.Join(v.SatBy, ", "), strings.Join(v.UnsatBy, ", "))
	}
	if v.Conflict != "" {
		v.Outcome = Undecided
		v.Model, v.ModelFrom = nil, ""
		v.Missing = append(v.Missing, "consistent answers from the backends")
		return v
	}
	if len(v.SatBy) > 0 {
		v.Outcome = Satisfiable
		v.Checked = append(v.Checked, fmt.Sprintf("model from %s satisfies every clause", v.ModelFrom))
		return v
	}
	for _, c := range checks {
		switch {
		case c.Skipped != "":
			v.Notes = append(v.Notes, fmt.Sprintf("proof from %s not checked: %s", c.Backend, c.Skipped))
		case c.Passed(p):
			what := "passed spinecert's DRAT checker"
			if c.LRAT {
				what += " and the LRAT re-check"
			}
			v.Checked = append(v.Checked, fmt.Sprintf("proof from %s (%s, %d lemmas, %d needed) %s", c.Backend, c.Format, c.Lemmas, c.Core, what))
		default:
			v.Checked = append(v.Checked, fmt.Sprintf("proof from %s REJECTED: %s", c.Backend, c.Error))
		}
	}
	if n := len(v.UnsatBy); n < p.MinUnsat {
		v.Missing = append(v.Missing, fmt.Sprintf("UNSAT from %d independent backends (have %d%s)", p.MinUnsat, n, listed(v.UnsatBy)))
	}
	if n := len(v.ProofsOK); n < p.MinProofs {
		need := "spinecert's DRAT checker"
		if p.RequireLRAT {
			need += " and the LRAT re-check"
		}
		v.Missing = append(v.Missing, fmt.Sprintf("%d proof(s) passing %s (have %d)", p.MinProofs, need, n))
	}
	for _, r := range results {
		if r.Answer == Unknown && !r.Suspect {
			v.Notes = append(v.Notes, fmt.Sprintf("%s gave no answer: %s", r.Backend, r.Detail))
		}
	}
	if len(v.Missing) == 0 {
		v.Outcome = Unsatisfiable
		v.Checked = append([]string{fmt.Sprintf("UNSAT from %d independent backends: %s", len(v.UnsatBy), strings.Join(v.UnsatBy, ", "))}, v.Checked...)
	}
	return v
}

// listed renders ": a, b" for a non-empty list.
func listed(names []string) string {
	if len(names) == 0 {
		return ""
	}
	return ": " + strings.Join(names, ", ")
}
