package verify

import (
	"context"
	"fmt"
	"os"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
)

// GraphOptions controls DecideLayout.
type GraphOptions struct {
	Encoding dimacs.Options // the claim (kind, pages, page kinds) and the encoding
	Solvers  []Solver
	Limit    time.Duration // per backend (0 = none)
	// ProofDir keeps the proofs (and their LRAT translations) there; when
	// empty they go to a temporary directory that is removed afterwards.
	ProofDir    string
	Policy      Policy
	StopOnModel bool        // see RunOptions
	AllProofs   bool        // check every proof, not only as many as Policy needs
	Progress    func(Event) // may be nil
}

// GraphVerdict is the decision about "g has a layout of this kind on K pages".
type GraphVerdict struct {
	Verdict  *Verdict         `json:"verdict"`
	Results  []*Result        `json:"results"`
	Checks   []ProofCheck     `json:"proof_checks,omitempty"`
	Layout   *cert.Layout     `json:"-"` // a layout that passed cert.Validate (Satisfiable only)
	Vars     int              `json:"variables"`
	Clauses  int              `json:"clauses"`
	Options  string           `json:"encoding"`            // the encoding, as recorded in the CNF header
	ProofDir string           `json:"proof_dir,omitempty"` // where the proofs were kept
	Encode   time.Duration    `json:"encode_ns"`
	Elapsed  time.Duration    `json:"elapsed_ns"`
	Encoded  *dimacs.Encoding `json:"-"`
	CNF      *dimacs.CNF      `json:"-"`
	Stats    *dimacs.Stats    `json:"-"`
}

// DecideLayout encodes the claim, runs the solvers, checks the proofs of
// UNSAT answers and decides (see Decide). A Satisfiable verdict comes with
// a layout decoded from the model and checked directly with cert.Validate;
// if that check fails the verdict is turned into a conflict, since the
// claim cannot then be trusted either way.
func DecideLayout(ctx context.Context, g *graph.Graph, opt GraphOptions) (*GraphVerdict, error) {
	start := time.Now()
	enc, err := dimacs.Encode(g, opt.Encoding)
	if err != nil {
		return nil, fmt.Errorf("verify: %w", err)
	}
	cnf := enc.CNF()
	stats := enc.Stats()
	gv := &GraphVerdict{Vars: cnf.Vars, Clauses: len(cnf.Clauses), Encode: time.Since(start), Encoded: enc, CNF: cnf, Stats: &stats}
	if d, err := opt.Encoding.Describe(); err == nil {
		gv.Options = d
	}
	policy := opt.Policy
	if policy == (Policy{}) {
		policy = DefaultPolicy()
	}
	dir := opt.ProofDir
	if dir == "" {
		tmp, err := os.MkdirTemp("", "spinecert-proofs-*")
		if err != nil {
			return nil, fmt.Errorf("verify: %w", err)
		}
		defer os.RemoveAll(tmp)
		dir = tmp
	} else {
		gv.ProofDir = dir
	}
	gv.Results, err = RunAll(ctx, cnf, opt.Solvers, RunOptions{Limit: opt.Limit, ProofDir: dir, StopOnModel: opt.StopOnModel, Progress: opt.Progress})
	if err != nil {
		return nil, err
	}
	unsatBy := map[string]bool{}
	hasSat := false
	for _, r := range gv.Results {
		if r.Answer == Unsat {
			unsatBy[r.Backend] = true
		}
		hasSat = hasSat || r.Answer == Sat
	}
	// Proofs matter only when there is no model (with a model beside an
	// UNSAT claim the verdict is a conflict whatever the proof says) and
	// when enough backends said UNSAT for a verdict.
	switch {
	case len(unsatBy) == 0 || hasSat:
	case len(unsatBy) < policy.MinUnsat:
		for _, r := range gv.Results {
			if r.Answer == Unsat && r.Proof != "" {
				gv.Checks = append(gv.Checks, ProofCheck{Backend: r.Backend, Format: r.ProofFormat,
					Skipped: fmt.Sprintf("too few UNSAT answers for a verdict (%d of %d)", len(unsatBy), policy.MinUnsat)})
			}
		}
	default:
		enough := policy.MinProofs
		if opt.AllProofs {
			enough = 0
		}
		gv.Checks = CheckProofs(ctx, cnf, gv.Results, ProofCheckOptions{Enough: enough, KeepLRAT: opt.ProofDir != "", Progress: opt.Progress})
	}
	v := Decide(gv.Results, gv.Checks, policy)
	if opt.ProofDir == "" {
		for _, r := range gv.Results {
			r.Proof = "" // in the temporary directory, removed on return
		}
	}
	gv.Verdict = v
	if v.Outcome == Satisfiable {
		model := make([]bool, len(v.Model)+1) // the encoder counts variables from 1
		copy(model[1:], v.Model)
		l, err := enc.Decode(model)
		if err == nil {
			if rep := cert.Validate(g, l); !rep.OK() {
				err = rep.Err()
			}
		}
		if err != nil {
			v.Outcome = Undecided
			v.Conflict = fmt.Sprintf("%v: model from %s: %v", ErrEncoderModel, v.ModelFrom, err)
			v.Missing = append(v.Missing, "a model that decodes to a valid layout")
			v.Model = nil
		} else {
			gv.Layout = l
			v.Checked = append(v.Checked, fmt.Sprintf("decoded layout on %d pages passed the direct check (cert.Validate)", l.Pages()))
		}
	}
	gv.Elapsed = time.Since(start)
	return gv, nil
}

// CheckedProof returns the proof of an UNSAT result that passed both proof
// checkers (the first such, in result order), and its format; ok is false
// when no proof passed.
func (gv *GraphVerdict) CheckedProof() (path, format string, ok bool) {
	for _, r := range gv.Results {
		if r.Answer != Unsat || r.Proof == "" {
			continue
		}
		for _, c := range gv.Checks {
			if c.Backend == r.Backend && c.DRAT && c.LRAT {
				return r.Proof, r.ProofFormat, true
			}
		}
	}
	return "", "", false
}
