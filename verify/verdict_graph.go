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
	Sequential  bool        // see RunOptions
	AllProofs   bool        // check every proof, not only as many as Policy needs
	Progress    func(Event) // may be nil
	// Obstruction, when not nil, first looks for a small subgraph H with no
	// layout (FindObstruction) and decides the claim for H: if H is refuted
	// with the full policy, so is g (every layout of g restricts to one of
	// H; graph.CheckSubgraph confirms H ⊆ g). Otherwise g is decided whole.
	Obstruction *ObstructionOptions
	// Quick, when not nil, is asked for a layout before any solver runs
	// (a construction or a heuristic). One on at most the claim's pages that
	// passes the direct check decides "satisfiable" at once; anything else
	// is ignored. Not used for mixed claims.
	Quick func(*graph.Graph) (layout *cert.Layout, method string)
	// OnDemand decides the claim on a sub-formula of the on-demand
	// formulation (see DecideOnDemand) instead of the whole default encoding.
	OnDemand bool
}

// GraphVerdict is the decision about "g has a layout of this kind on K pages".
type GraphVerdict struct {
	Verdict *Verdict `json:"verdict"`
	// Subgraph, when not nil, is the subgraph H of g whose refutation the
	// verdict is (Unsatisfiable only): the CNF, results and proofs are H's.
	Subgraph *SubgraphRecord `json:"subgraph,omitempty"`
	// Sub, when not nil, is the sub-formula of the on-demand formulation
	// that CNF is (DecideOnDemand); it passed dimacs.CheckMembership.
	Sub      *dimacs.Sub      `json:"-"`
	Rounds   int              `json:"refine_rounds,omitempty"`
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
	if opt.Quick != nil && opt.Encoding.Kind != cert.Mixed {
		start := time.Now()
		if l, method := opt.Quick(g); l != nil && l.Kind == opt.Encoding.Kind && l.UsedPages() <= opt.Encoding.Pages {
			l = padPages(l, opt.Encoding.Pages)
			if cert.Validate(g, l).OK() {
				v := &Verdict{Outcome: Satisfiable, ModelFrom: method,
					Checked: []string{fmt.Sprintf("a layout on %d pages from %s passed the direct check (cert.Validate); no solver was needed", l.Pages(), method)}}
				return &GraphVerdict{Verdict: v, Layout: l, Elapsed: time.Since(start)}, nil
			}
		}
	}
	if o := opt.Obstruction; o != nil && o.Oracle != nil {
		start := time.Now()
		ob, err := FindObstruction(ctx, g, opt.Encoding, *o)
		if err != nil {
			return nil, err
		}
		if ob != nil {
			if err := graph.CheckSubgraph(ob.Graph, g); err != nil {
				return nil, fmt.Errorf("verify: the obstruction found is not a subgraph (a bug): %w", err)
			}
			sub := opt
			sub.Obstruction = nil
			gv, err := DecideLayout(ctx, ob.Graph, sub)
			if err != nil {
				return nil, err
			}
			if gv.Verdict.Outcome == Unsatisfiable {
				h := ob.Graph
				gv.Subgraph = &SubgraphRecord{Graph: h, ID: h.ID(), Vertices: h.N(), Edges: h.M(), Start: ob.Start, OracleCalls: ob.Calls, Search: ob.Search}
				gv.Verdict.Checked = append(gv.Verdict.Checked, fmt.Sprintf("the refuted graph is a subgraph of this one (%d of %d vertices, %d of %d edges; graph.CheckSubgraph), and every layout of a graph restricts to its subgraphs", h.N(), g.N(), h.M(), g.M()))
				gv.Elapsed = time.Since(start)
				return gv, nil
			}
		}
	}
	if opt.OnDemand {
		return DecideOnDemand(ctx, g, opt)
	}
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
	if err := gv.runPolicy(ctx, cnf, opt); err != nil {
		return nil, err
	}
	v := gv.Verdict
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
	r, _, ok := gv.CheckedResult()
	if !ok {
		return "", "", false
	}
	return r.Proof, r.ProofFormat, true
}

// CheckedResult returns the first UNSAT result whose proof passed both
// checkers, with that check.
func (gv *GraphVerdict) CheckedResult() (*Result, ProofCheck, bool) {
	for _, r := range gv.Results {
		if r.Answer != Unsat || r.Proof == "" {
			continue
		}
		for _, c := range gv.Checks {
			if c.Backend == r.Backend && c.DRAT && c.LRAT {
				return r, c, true
			}
		}
	}
	return nil, ProofCheck{}, false
}

// SubgraphRecord describes the subgraph whose refutation a verdict is.
type SubgraphRecord struct {
	Graph       *graph.Graph  `json:"-"`
	ID          string        `json:"graph"`
	Vertices    int           `json:"vertices"`
	Edges       int           `json:"edges"`
	Start       string        `json:"start"` // the vertex the search grew it from
	OracleCalls int           `json:"oracle_calls"`
	Search      time.Duration `json:"search_ns"`
}

// QuickOracle picks the backend that answers FindObstruction's trial
// questions: the first of solvers that runs outside spinecert and is not
// minisat (cadical, cryptominisat, kissat are fast on these small CNFs),
// else gini, in process.
func QuickOracle(solvers []Solver) Solver {
	for _, s := range solvers {
		switch s.Name() {
		case "cadical", "cryptominisat", "kissat":
			return s
		}
	}
	return Gini{}
}

// padPages returns l with k pages of its kind, the extra ones empty.
func padPages(l *cert.Layout, k int) *cert.Layout {
	out := *l
	out.PageKinds = make([]cert.Kind, k)
	for i := range out.PageKinds {
		out.PageKinds[i] = l.Kind
	}
	return &out
}

// runPolicy runs the solvers on cnf, checks the proofs the policy needs and
// draws the verdict into gv. Proofs kept in a temporary directory are
// removed before it returns.
func (gv *GraphVerdict) runPolicy(ctx context.Context, cnf *dimacs.CNF, opt GraphOptions) error {
	var err error
	policy := opt.Policy
	if policy == (Policy{}) {
		policy = DefaultPolicy()
	}
	dir := opt.ProofDir
	if dir == "" {
		tmp, err := os.MkdirTemp("", "spinecert-proofs-*")
		if err != nil {
			return fmt.Errorf("verify: %w", err)
		}
		defer os.RemoveAll(tmp)
		dir = tmp
	} else {
		gv.ProofDir = dir
	}
	gv.Results, err = RunAll(ctx, cnf, opt.Solvers, RunOptions{Limit: opt.Limit, ProofDir: dir, StopOnModel: opt.StopOnModel, Sequential: opt.Sequential, Progress: opt.Progress})
	if err != nil {
		return err
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
	return nil
}

// DecideOnDemand decides "g has a layout" on the on-demand formulation F:
// Refine works with gini until it has a layout (checked directly: the
// verdict is "satisfiable" with no other solver) or a sub-formula F′ ⊆ F
// that gini finds unsatisfiable. F′ must pass dimacs.CheckMembership, and
// then it goes to the solvers and proof checkers under the policy like any
// CNF: "unsatisfiable" needs two UNSATs on F′ and a checked proof of F′.
// Since F′ ⊆ F, that refutes F and so the claim.
func DecideOnDemand(ctx context.Context, g *graph.Graph, opt GraphOptions) (*GraphVerdict, error) {
	start := time.Now()
	f, err := dimacs.NewOnDemand(g, opt.Encoding)
	if err != nil {
		return nil, fmt.Errorf("verify: %w", err)
	}
	ref, err := Refine(ctx, f, RefineOptions{Limit: opt.Limit})
	if err != nil {
		return nil, err
	}
	gv := &GraphVerdict{Options: f.Describe(), Rounds: ref.Rounds, Encode: ref.Elapsed}
	switch {
	case ref.Layout != nil:
		gv.Layout = ref.Layout
		gv.Verdict = &Verdict{Outcome: Satisfiable, ModelFrom: "gini (on-demand)",
			Checked: []string{fmt.Sprintf("a layout on %d pages decoded from gini's model of an on-demand sub-formula passed the direct check (cert.Validate)", ref.Layout.Pages())}}
		gv.Elapsed = time.Since(start)
		return gv, nil
	case !ref.Unsat:
		gv.Verdict = &Verdict{Outcome: Undecided, Missing: []string{"on-demand generation stopped: " + ref.Stopped}}
		gv.Elapsed = time.Since(start)
		return gv, nil
	}
	if err := dimacs.CheckMembership(f, ref.Sub); err != nil {
		return nil, fmt.Errorf("verify: the sub-formula built is not part of the formulation (a bug): %w", err)
	}
	cnf := ref.Sub.CNF
	gv.Sub, gv.CNF, gv.Vars, gv.Clauses = ref.Sub, cnf, cnf.Vars, len(cnf.Clauses)
	if err := gv.runPolicy(ctx, cnf, opt); err != nil {
		return nil, err
	}
	v := gv.Verdict
	switch v.Outcome {
	case Unsatisfiable:
		v.Checked = append(v.Checked, fmt.Sprintf("every clause of the sub-formula (%d clauses) is a clause of the on-demand formulation %s (dimacs.CheckMembership)", len(cnf.Clauses), dimacs.OnDemandVersion))
	case Satisfiable:
		// gini found F′ unsatisfiable and another solver a model: the model
		// still has to give a layout to count.
		model := v.Model
		index := make(map[dimacs.VarName]int, len(ref.Sub.Vars))
		for i, n := range ref.Sub.Vars {
			index[n] = i
		}
		l := f.Decode(func(x dimacs.VarName) (bool, bool) {
			if i, ok := index[x]; ok && i < len(model) {
				return model[i], true
			}
			return false, false
		}, nil)
		if rep := cert.Validate(g, l); !rep.OK() {
			v.Outcome = Undecided
			v.Conflict = fmt.Sprintf("gini found the sub-formula unsatisfiable, %s found a model of it, which gives no valid layout", v.ModelFrom)
			v.Missing = append(v.Missing, "agreement on the sub-formula")
			v.Model = nil
		} else {
			gv.Layout = l
			v.Checked = append(v.Checked, fmt.Sprintf("decoded layout on %d pages passed the direct check (cert.Validate)", l.Pages()))
		}
	}
	gv.Elapsed = time.Since(start)
	return gv, nil
}
