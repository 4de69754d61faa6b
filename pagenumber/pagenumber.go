package pagenumber

import (
	"context"
	"fmt"
	"path/filepath"
	"strconv"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/heuristic"
	"spinecert.dev/verify"
)

// Options controls Compute.
type Options struct {
	Kind     cert.Kind       // cert.Stack (page number) or cert.Queue (queue number)
	Solvers  []verify.Solver // backends for the SAT steps
	Limit    time.Duration   // per backend and step (0 = none)
	ProofDir string          // keep each step's proofs in ProofDir/pages-K ("" = discard)
	Policy   verify.Policy   // zero value = verify.DefaultPolicy
	Encoding dimacs.Options  // encoding toggles; Kind and Pages are set per step
	// UnsatLower proves the lower bound with a checked UNSAT step even
	// when a theorem (edge count, planarity, toughness) already gives it.
	UnsatLower bool
	// Heuristic tunes the layout search of the upper bound; a zero
	// TimeLimit stands for heuristic.DefaultTimeLimit here, so that the
	// search cannot hold up the SAT steps on a large graph.
	Heuristic heuristic.Options
	Progress  func(step int, e verify.Event) // solver and proof events of step (pages) K; may be nil
	// Obstruction lets a refutation step rest on a small subgraph (see
	// verify.GraphOptions.Obstruction); nil decides the whole graph.
	Obstruction *verify.ObstructionOptions
	// OnDemand decides each step on the on-demand formulation (see
	// verify.DecideOnDemand).
	OnDemand bool
}

// Step is one SAT step: the claim "a layout on Pages pages".
type Step struct {
	Pages   int                  `json:"pages"`
	Outcome verify.Outcome       `json:"outcome"`
	Verdict *verify.GraphVerdict `json:"detail"`
}

// Result is the page number (or queue number) with the evidence
// for both bounds. PageNumber is -1 unless Lower == Upper.
type Result struct {
	Graph      string       `json:"graph"`
	Kind       string       `json:"kind"`
	PageNumber int          `json:"pagenumber"`
	Lower      Bound        `json:"lower"`
	Upper      Bound        `json:"upper"`
	Steps      []Step       `json:"steps,omitempty"`
	Layout     *cert.Layout `json:"-"` // the layout behind Upper, validated
	// Method names the construction of the first checked layout (see
	// heuristic.FindReport), with its class bound and theorem when it has
	// one; the SAT steps may improve on it.
	Method  heuristic.Report `json:"upper_start"`
	Elapsed time.Duration    `json:"elapsed_ns"`
}

// Compute determines the page number (Kind stack) or queue number (Kind
// queue) of g with evidence on both sides. The upper bound is always a
// layout that passed cert.Validate: first from package heuristic, then
// improved by SAT steps. The lower bound comes from solver-free arguments
// (see stackLowerBounds; also applied to every block, since a layout of g
// restricts to one of each block) or from a checked UNSAT step for one page
// fewer than the upper bound, decided by verify.Decide's rules.
//
// The solver-free bounds come first, then the heuristic layout; when they
// meet, Steps stays empty and no solver runs. Otherwise each SAT step asks
// for one page fewer than the best layout so far and the walk goes on only
// while steps find layouts, so at most one UNSAT step is needed. Steps
// lists the SAT steps in the order they ran.
func Compute(ctx context.Context, g *graph.Graph, opt Options) (*Result, error) {
	start := time.Now()
	res := &Result{Graph: g.ID(), Kind: opt.Kind.String(), PageNumber: -1}
	defer func() { res.Elapsed = time.Since(start) }()
	if opt.Kind != cert.Stack && opt.Kind != cert.Queue {
		return nil, fmt.Errorf("pagenumber: page number of kind %s: expected stack or queue", opt.Kind)
	}
	// Lower bound without solvers.
	res.Lower = trivialLowerBound(g)
	if opt.Kind == cert.Stack && !opt.UnsatLower {
		res.Lower = stackLowerBounds(g)
		for _, b := range blocks(g) {
			if len(b) < 4 || len(b) == g.N() {
				continue
			}
			h, _ := g.Induced(b)
			if lb := stackLowerBounds(h); lb.Pages > res.Lower.Pages {
				res.Lower = Bound{lb.Pages, SourceSubgraph, fmt.Sprintf("a block of %d vertices: %s", h.N(), lb.Detail)}
			}
		}
	}
	// Upper bound from the heuristic, checked directly.
	hopt := opt.Heuristic
	if hopt.TimeLimit == 0 {
		hopt.TimeLimit = heuristic.DefaultTimeLimit
	}
	l, hr, err := heuristic.FindReport(g, opt.Kind, hopt)
	if err != nil {
		return nil, fmt.Errorf("pagenumber: %w", err)
	}
	l = trimPages(l)
	if rep := cert.Validate(g, l); !rep.OK() {
		return nil, fmt.Errorf("pagenumber: layout by method %s failed the direct check: %w", hr.Method, rep.Err())
	}
	res.Layout = l
	res.Method = hr
	detail := fmt.Sprintf("layout by method %s on %d pages passed the direct check (cert.Validate)", hr.Method, l.Pages())
	if hr.Theorem != "" {
		detail += fmt.Sprintf("; the method's class bound is %d: %s", hr.Bound, hr.Theorem)
	}
	res.Upper = Bound{l.Pages(), SourceLayout, detail}
	if res.Lower.Pages > res.Upper.Pages {
		return nil, fmt.Errorf("pagenumber: lower bound %d (%s) above a checked layout on %d pages: a bound is wrong", res.Lower.Pages, res.Lower.Detail, res.Upper.Pages)
	}
	// SAT steps down from the upper bound.
	for res.Lower.Pages < res.Upper.Pages {
		k := res.Upper.Pages - 1
		eo := opt.Encoding
		eo.Kind, eo.Pages, eo.PageKinds = opt.Kind, k, nil
		gopt := verify.GraphOptions{Encoding: eo, Solvers: opt.Solvers, Limit: opt.Limit, Policy: opt.Policy, StopOnModel: true, Obstruction: opt.Obstruction, OnDemand: opt.OnDemand}
		if opt.ProofDir != "" {
			gopt.ProofDir = filepath.Join(opt.ProofDir, "pages-"+strconv.Itoa(k))
		}
		if opt.Progress != nil {
			gopt.Progress = func(e verify.Event) { opt.Progress(k, e) }
		}
		gv, err := verify.DecideLayout(ctx, g, gopt)
		if err != nil {
			return res, err
		}
		res.Steps = append(res.Steps, Step{Pages: k, Outcome: gv.Verdict.Outcome, Verdict: gv})
		switch gv.Verdict.Outcome {
		case verify.Satisfiable:
			res.Layout = trimPages(gv.Layout)
			used := res.Layout.Pages()
			res.Upper = Bound{used, SourceLayout, fmt.Sprintf("layout from the model of %s on %d pages passed the direct check (cert.Validate)", gv.Verdict.ModelFrom, used)}
		case verify.Unsatisfiable:
			res.Lower = Bound{k + 1, SourceUnsat, fmt.Sprintf("no %s layout on %d pages: %s", opt.Kind, k, joinChecked(gv.Verdict.Checked))}
		default:
			why := gv.Verdict.Conflict
			if why == "" {
				why = "missing " + joinChecked(gv.Verdict.Missing)
			}
			return res, fmt.Errorf("%w: %d pages: %s", ErrUndecided, k, why)
		}
	}
	res.PageNumber = res.Upper.Pages
	return res, nil
}

// trimPages drops unused trailing pages from a layout.
func trimPages(l *cert.Layout) *cert.Layout {
	used := l.UsedPages()
	if used >= l.Pages() {
		return l
	}
	c := *l
	c.PageKinds = l.PageKinds[:used]
	return &c
}

func joinChecked(s []string) string {
	out := ""
	for i, x := range s {
		if i > 0 {
			out += "; "
		}
		out += x
	}
	return out
}
