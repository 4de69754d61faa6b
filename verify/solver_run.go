package verify

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"sync"
	"time"

	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
)

// EventKind tells what a progress Event reports.
type EventKind int

const (
	SolverStarted  EventKind = iota // a backend started on the formula
	SolverFinished                  // a backend returned; Event.Result holds its result
	ProofProgress                   // proof checking advanced; Done of Total lemmas
	ProofFinished                   // a proof check ended; Event.Check holds the outcome
)

// Event is one progress report. Callbacks receive events from several
// goroutines, one at a time.
type Event struct {
	Kind    EventKind
	Backend string
	Result  *Result     // SolverFinished
	Check   *ProofCheck // ProofFinished
	Phase   string      // ProofProgress: "reading" (forward pass) or "checking" (backward pass)
	Done    int64       // ProofProgress: proof steps passed so far in this phase
	Total   int64       // ProofProgress: steps this phase will pass (0 when not known)
	Elapsed time.Duration
}

// RunOptions controls RunAll.
type RunOptions struct {
	Limit    time.Duration // per backend (0 = none)
	ProofDir string        // where proofs are written ("" = no proofs)
	// StopOnModel cancels the other backends once one has a checked
	// model (a model settles satisfiability; their answers are then not
	// needed, at the price of not seeing a contradicting one).
	StopOnModel bool
	// Sequential runs the backends one after another instead of at once
	// (one CPU per task, as on a cluster); with StopOnModel the backends
	// after a model are not run (their results say so).
	Sequential bool
	Progress   func(Event) // may be nil
}

// progress serialises calls to a Progress callback.
type progress struct {
	mu sync.Mutex
	f  func(Event)
}

func (p *progress) send(e Event) {
	if p == nil || p.f == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	p.f(e)
}

// ProofFileName is the name RunAll gives the proof of backend in ProofDir.
func ProofFileName(backend, format string) string {
	switch format {
	case proof.DRATBinary:
		return backend + ".drat.bin"
	case proof.RUP:
		return backend + ".rup"
	}
	return backend + ".drat"
}

// proofFormatOf returns the proof format a backend writes ("" when none or unknown).
func proofFormatOf(s Solver) string {
	switch b := s.(type) {
	case *External:
		if b.wantsProof() {
			return b.ProofFormat
		}
	case *Gophersat:
		return proof.RUP
	}
	return ""
}

// RunAll runs the backends on cnf in parallel and returns their results in
// the order of solvers. An error from a backend that could not be started
// at all becomes an Unknown result with the error as Detail.
func RunAll(ctx context.Context, cnf *dimacs.CNF, solvers []Solver, opt RunOptions) ([]*Result, error) {
	if len(solvers) == 0 {
		return nil, fmt.Errorf("verify: no solvers to run")
	}
	if opt.ProofDir != "" {
		if err := os.MkdirAll(opt.ProofDir, 0o755); err != nil {
			return nil, fmt.Errorf("verify: %w", err)
		}
	}
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	pr := &progress{f: opt.Progress}
	results := make([]*Result, len(solvers))
	var wg sync.WaitGroup
	for i, s := range solvers {
		if opt.Sequential && ctx.Err() != nil {
			results[i] = &Result{Backend: s.Name(), Detail: "not run: " + stopReason(ctx, 0)}
			continue
		}
		wg.Add(1)
		run := func() {
			defer wg.Done()
			proof := ""
			if opt.ProofDir != "" {
				proof = filepath.Join(opt.ProofDir, ProofFileName(s.Name(), proofFormatOf(s)))
			}
			pr.send(Event{Kind: SolverStarted, Backend: s.Name()})
			start := time.Now()
			r, err := s.Solve(ctx, cnf, opt.Limit, proof)
			if err != nil {
				r = &Result{Backend: s.Name(), Detail: err.Error(), Elapsed: time.Since(start)}
			}
			results[i] = r
			pr.send(Event{Kind: SolverFinished, Backend: s.Name(), Result: r, Elapsed: r.Elapsed})
			if r.Answer == Sat && opt.StopOnModel {
				cancel()
			}
		}
		if opt.Sequential {
			run()
		} else {
			go run()
		}
	}
	wg.Wait()
	return results, nil
}
