package verify

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"time"

	"spinecert.dev/dimacs"
)

// Answer is what a solver run concluded about a formula.
type Answer int

const (
	// Unknown means no conclusion: time-out, crash, give-up, an answer that
	// could not be parsed or a model that failed its check.
	Unknown Answer = iota
	// Sat means the backend produced a model, and the model was checked
	// against every clause of the formula.
	Sat
	// Unsat means the backend claims the formula has no model. On its own
	// this is only a claim; see Decide for what turns it into a verdict.
	Unsat
)

// String returns "SAT", "UNSAT" or "UNKNOWN".
func (a Answer) String() string {
	switch a {
	case Sat:
		return "SAT"
	case Unsat:
		return "UNSAT"
	}
	return "UNKNOWN"
}

// MarshalJSON writes the answer as its string.
func (a Answer) MarshalJSON() ([]byte, error) { return json.Marshal(a.String()) }

// Result is the outcome of one solver run.
type Result struct {
	Backend     string        `json:"backend"`
	Version     string        `json:"version,omitempty"`
	Answer      Answer        `json:"answer"`
	Model       []bool        `json:"-"`                      // Model[v-1] is the value of variable v (only for Sat)
	Proof       string        `json:"proof,omitempty"`        // path of the proof file (only for Unsat from a proof-writing backend)
	ProofFormat string        `json:"proof_format,omitempty"` // one of the Proof* constants
	Elapsed     time.Duration `json:"elapsed_ns"`
	CPU         time.Duration `json:"cpu_ns,omitempty"` // user+system time of a solver process (external backends)
	Detail      string        `json:"detail,omitempty"` // why the answer is Unknown, or other notes
	// Suspect is set when the backend said something provably false (a
	// model that violates a clause) or inconsistent (exit code against its
	// own answer line); such a backend must not be trusted in this run.
	Suspect bool `json:"suspect,omitempty"`
}

// Solver is one decision procedure for CNF formulas.
//
// Solve decides cnf within limit (0 = no limit) and ctx. When proofPath is
// not empty and the backend writes proofs, an UNSAT answer comes with a
// proof file there. Failures of the backend itself (a crash, a time-out,
// garbage output) are reported as a Result with Answer Unknown and a
// Detail, not as an error; an error means the run could not be attempted
// (for example the proof file could not be created). Every model in a Sat
// result has been checked against cnf by the backend before it returns.
type Solver interface {
	Name() string
	Solve(ctx context.Context, cnf *dimacs.CNF, limit time.Duration, proofPath string) (*Result, error)
}

// CheckModel checks that model satisfies every clause of cnf; model[v-1] is
// the value of variable v and must cover all cnf.Vars variables. It returns
// nil or an error naming the first violated clause.
func CheckModel(cnf *dimacs.CNF, model []bool) error {
	if len(model) < cnf.Vars {
		return fmt.Errorf("verify: model assigns %d variables, the formula has %d", len(model), cnf.Vars)
	}
	for i, cl := range cnf.Clauses {
		sat := false
		for _, l := range cl {
			v := int(l)
			if v < 0 {
				v = -v
			}
			if v > len(model) {
				return fmt.Errorf("verify: clause %d uses variable %d beyond the model", i+1, v)
			}
			if model[v-1] == (l > 0) {
				sat = true
				break
			}
		}
		if !sat {
			return fmt.Errorf("verify: model violates clause %d (%s)", i+1, clauseText(cl))
		}
	}
	return nil
}

// clauseText renders a clause as DIMACS text, shortened when long.
func clauseText(cl []int32) string {
	b := make([]byte, 0, 64)
	for i, l := range cl {
		if i == 12 {
			b = fmt.Appendf(b, "... (%d literals) ", len(cl))
			break
		}
		b = fmt.Appendf(b, "%d ", l)
	}
	return string(append(b, '0'))
}

// settle makes a backend's result safe to believe: a Sat result must carry
// a model that satisfies cnf, or it becomes Unknown and Suspect with a loud
// Detail. Non-Unsat results lose their proof path.
func settle(cnf *dimacs.CNF, r *Result) *Result {
	if r.Answer == Sat {
		if err := CheckModel(cnf, r.Model); err != nil {
			r.Answer = Unknown
			r.Suspect = true
			r.Detail = fmt.Sprintf("WRONG MODEL: %s claimed SAT but %v", r.Backend, err)
			r.Model = nil
		}
	}
	if r.Answer != Sat {
		r.Model = nil
	}
	if r.Answer != Unsat {
		r.Proof, r.ProofFormat = "", ""
	}
	return r
}

// withLimit derives the context for a run limited to limit (0 = none).
func withLimit(ctx context.Context, limit time.Duration) (context.Context, context.CancelFunc) {
	if limit > 0 {
		return context.WithTimeout(ctx, limit)
	}
	return context.WithCancel(ctx)
}

// stopReason says why a context ended, for a result's Detail.
func stopReason(ctx context.Context, limit time.Duration) string {
	if errors.Is(ctx.Err(), context.DeadlineExceeded) {
		return fmt.Sprintf("time limit %v reached", limit)
	}
	return "cancelled"
}
