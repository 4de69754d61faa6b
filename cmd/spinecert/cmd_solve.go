package main

import (
	"fmt"
	"io"
	"os"
	"sort"
	"strings"
	"sync"
	"time"

	"github.com/schollz/progressbar/v3"
	"github.com/spf13/cobra"
	"golang.org/x/term"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/heuristic"
	"spinecert.dev/verify"
)

// solveSolverFlags choose the backends; pagenumber takes the same ones.
type solveSolverFlags struct {
	solvers   string
	solverCmd []string
	timeLimit time.Duration
	quiet     bool
	subgraph  string
	formula   string
}

// subgraphAuto is the size from which --subgraph auto looks for a small
// refutable subgraph first.
const subgraphAuto = 100

func (f *solveSolverFlags) add(cmd *cobra.Command) {
	fl := cmd.Flags()
	fl.StringVar(&f.solvers, "solvers", strings.Join(verify.DefaultSolvers, ","),
		"comma-separated backends: "+strings.Join(verify.KnownSolvers(), ", ")+" (external ones must be on PATH), "+
			"or auto: cadical (else gophersat) and cryptominisat (else gini), as found on PATH")
	fl.StringArrayVar(&f.solverCmd, "solver-cmd", nil,
		`an extra external solver command line, e.g. "mysolver -q {cnf} {proof}" (repeatable; `+
			`{cnf} is the input, appended when absent; {proof} receives a DRAT proof)`)
	fl.DurationVar(&f.timeLimit, "time-limit", 10*time.Minute, "time limit for each solver run (0 = none)")
	fl.BoolVar(&f.quiet, "quiet", false, "no progress display on stderr")
	fl.StringVar(&f.formula, "formula", "default", "the formula solved: default (the whole encoding) or on-demand (clauses generated as models need them, then two solvers and a checked proof on the sub-formula, whose membership is checked)")
	fl.StringVar(&f.subgraph, "subgraph", "auto", fmt.Sprintf("refute a small subgraph first (every layout restricts to subgraphs): on, off, or auto (graphs with more than %d vertices)", subgraphAuto))
}

// quickLayout asks the layout heuristics (constructions included) for a
// layout before any solver runs; verify.DecideLayout checks it directly.
func quickLayout(kind cert.Kind) func(*graph.Graph) (*cert.Layout, string) {
	return func(g *graph.Graph) (*cert.Layout, string) {
		l, err := heuristic.Find(g, kind, heuristic.Options{Seed: 1, TimeLimit: 2 * time.Second})
		if err != nil {
			return nil, ""
		}
		return l, "spinecert layout (heuristic)"
	}
}

// obstruction returns the subgraph search for g, or nil when it is off.
func (f *solveSolverFlags) obstruction(g *graph.Graph, solvers []verify.Solver) *verify.ObstructionOptions {
	if f.subgraph == "off" || (f.subgraph == "auto" && g.N() <= subgraphAuto) {
		return nil
	}
	return &verify.ObstructionOptions{Oracle: verify.QuickOracle(solvers), CallLimit: min(f.timeLimit, 30*time.Second)}
}

// build returns the backends the flags name.
func (f *solveSolverFlags) build() ([]verify.Solver, error) {
	if f.timeLimit < 0 {
		return nil, usageErr(fmt.Errorf("--time-limit must not be negative"))
	}
	switch f.subgraph {
	case "auto", "on", "off":
	default:
		return nil, usageErr(fmt.Errorf("--subgraph %q: expected auto, on or off", f.subgraph))
	}
	switch f.formula {
	case "default", "on-demand":
	default:
		return nil, usageErr(fmt.Errorf("--formula %q: expected default or on-demand", f.formula))
	}
	child, err := verify.SelfChild(verify.GophersatChild)
	if err != nil {
		return nil, err
	}
	var out []verify.Solver
	seen := map[string]bool{}
	for _, name := range verify.ExpandAuto(strings.Split(f.solvers, ",")) {
		if seen[name] {
			return nil, usageErr(fmt.Errorf("--solvers names %s twice", name))
		}
		seen[name] = true
		s, err := verify.ByName(name, child)
		if err != nil {
			return nil, usageErr(err)
		}
		out = append(out, s)
	}
	for _, c := range f.solverCmd {
		s, err := verify.ParseSolverCmd(c)
		if err != nil {
			return nil, usageErr(err)
		}
		if seen[s.Name()] {
			return nil, usageErr(fmt.Errorf("--solver-cmd %q: a backend named %s is already in use", c, s.Name()))
		}
		seen[s.Name()] = true
		out = append(out, s)
	}
	if len(out) == 0 {
		return nil, usageErr(fmt.Errorf("no solvers: give --solvers or --solver-cmd"))
	}
	return out, nil
}

type solveOptions struct {
	graph    graphFlags
	claim    encodeClaimFlags
	solver   solveSolverFlags
	opt      dimacs.Options  // from claim, by validate
	solvers  []verify.Solver // from solver, by validate
	proofOut string
	output   string
	json     bool
	graphArg string
	quick    bool
}

func newSolveCmd() *cobra.Command {
	var o solveOptions
	cmd := &cobra.Command{
		Use:   "solve GRAPH --pages K",
		Short: "Decide whether GRAPH has a K-page layout, with checked evidence",
		Long: `Decide whether GRAPH has a layout of the given kind on K pages.

The claim is encoded as CNF (as "spinecert encode" writes it) and given to
several solver backends in parallel. The default, --solvers auto, is
cadical (it writes the DRAT proof spinecert checks) and cryptominisat when
they are on PATH, with the built-in gophersat (a proof writer too) and gini
in place of the ones that are not. Named ones: the built-in gophersat and gini;
cadical, kissat, minisat and cryptominisat (program cryptominisat5) when on
PATH; any other DIMACS solver with --solver-cmd (SAT competition
conventions: "s" and "v" lines, exit status 10 or 20).

  - A model is checked against every clause, decoded into a layout and the
    layout is checked directly; it is written with -o and the exit status
    is 0.
  - "No layout" needs at least two different backends to answer UNSAT and
    at least one of their proofs to pass spinecert's own DRAT checker and the
    LRAT re-check of its output; the exit status is then 1.
  - Backends that disagree, a model that violates the formula, a time-out
    or anything else short of the above is exit status 3, with what is
    missing.

Progress goes to stderr when it is a terminal (not with --quiet).`,
		Args:    cobra.ExactArgs(1),
		PreRunE: func(cmd *cobra.Command, args []string) error { return o.validate(cmd) },
		RunE: func(cmd *cobra.Command, args []string) error {
			o.graphArg = args[0]
			return runSolve(cmd, &o)
		},
	}
	o.graph.add(cmd)
	o.claim.add(cmd)
	o.solver.add(cmd)
	cmd.Flags().StringVar(&o.proofOut, "proof-out", "", "keep the solvers' proofs and their LRAT translations in DIR")
	cmd.Flags().BoolVar(&o.quick, "heuristic", true, "first try a layout from spinecert's layout heuristics (checked directly); no solver runs if it fits")
	cmd.Flags().StringVarP(&o.output, "output", "o", "", "write the layout (JSON) to FILE when one is found (- for stdout)")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	return cmd
}

// validate checks the flags and builds the solver list before any work starts.
func (o *solveOptions) validate(cmd *cobra.Command) error {
	var err error
	if o.opt, err = o.claim.options(cmd); err != nil {
		return err
	}
	if o.json && o.output == "-" {
		return usageErr(fmt.Errorf("--json prints the report on stdout: give the layout a file with -o FILE"))
	}
	o.solvers, err = o.solver.build()
	return err
}

func runSolve(cmd *cobra.Command, o *solveOptions) error {
	opt, solvers := o.opt, o.solvers
	g, err := o.graph.load(cmd, o.graphArg)
	if err != nil {
		return err
	}
	prog := newSolveProgress(cmd.ErrOrStderr(), o.solver.quiet, solvers)
	var quick func(*graph.Graph) (*cert.Layout, string)
	if o.quick {
		quick = quickLayout(opt.Kind)
	}
	gv, err := verify.DecideLayout(cmd.Context(), g, verify.GraphOptions{
		Quick:       quick,
		OnDemand:    o.solver.formula == "on-demand",
		Encoding:    opt,
		Solvers:     solvers,
		Limit:       o.solver.timeLimit,
		ProofDir:    o.proofOut,
		Progress:    prog.event,
		Obstruction: o.solver.obstruction(g, solvers),
	})
	prog.finish()
	if err := interruption(cmd.Context()); err != nil {
		return err
	}
	if err != nil {
		return usageErr(err)
	}
	v := gv.Verdict
	if v.Outcome == verify.Satisfiable && o.output != "" {
		if err := writeFileAtomic(o.output, cmd.OutOrStdout(), func(w io.Writer) error {
			return cert.WriteLayoutJSON(w, g, gv.Layout)
		}); err != nil {
			return err
		}
	}
	claim := solveClaim(opt.Kind, opt.Pages, opt.PageKinds)
	out := cmd.OutOrStdout()
	if o.json {
		type result struct {
			Graph   string               `json:"graph"`
			Claim   string               `json:"claim"`
			Kind    string               `json:"kind"`
			Pages   int                  `json:"pages"`
			Outcome string               `json:"outcome"`
			Layout  string               `json:"layout,omitempty"`
			Detail  *verify.GraphVerdict `json:"detail"`
		}
		r := result{Graph: g.ID(), Claim: claim, Kind: opt.Kind.String(), Pages: opt.Pages, Outcome: solveOutcome(v.Outcome), Detail: gv}
		if gv.Layout != nil && o.output != "" {
			r.Layout = o.output
		}
		if err := writeJSON(out, r); err != nil {
			return err
		}
	} else {
		printSolveReport(out, claim, gv)
	}
	switch v.Outcome {
	case verify.Satisfiable:
		return nil
	case verify.Unsatisfiable:
		return refuted(nil)
	}
	if v.Conflict != "" {
		return undecided(fmt.Errorf("SOLVERS DISAGREE, no verdict: %s", v.Conflict))
	}
	return undecided(fmt.Errorf("undecided: missing %s", strings.Join(v.Missing, "; ")))
}

// solveOutcome names an outcome for the claim rather than the formula.
func solveOutcome(o verify.Outcome) string {
	switch o {
	case verify.Satisfiable:
		return "layout"
	case verify.Unsatisfiable:
		return "no-layout"
	}
	return "undecided"
}

// solveClaim describes the claim, e.g. "2-page stack layout".
func solveClaim(kind cert.Kind, pages int, kinds []cert.Kind) string {
	s := fmt.Sprintf("%d-page %s layout", pages, kind)
	if kind == cert.Mixed {
		names := make([]string, len(kinds))
		for i, k := range kinds {
			names[i] = k.String()
		}
		s += " (" + strings.Join(names, ",") + ")"
	}
	return s
}

func printSolveReport(w io.Writer, claim string, gv *verify.GraphVerdict) {
	v := gv.Verdict
	switch v.Outcome {
	case verify.Satisfiable:
		fmt.Fprintf(w, "%s found: checked\n", claim)
	case verify.Unsatisfiable:
		fmt.Fprintf(w, "no %s: checked\n", claim)
	default:
		if v.Conflict != "" {
			fmt.Fprintf(w, "SOLVERS DISAGREE: no verdict on the %s\n", claim)
		} else {
			fmt.Fprintf(w, "undecided: %s\n", claim)
		}
	}
	for _, c := range v.Checked {
		fmt.Fprintf(w, "  checked: %s\n", c)
	}
	for _, n := range v.Notes {
		fmt.Fprintf(w, "  note: %s\n", n)
	}
	if v.Conflict != "" {
		fmt.Fprintf(w, "  conflict: %s\n", v.Conflict)
	}
	for _, m := range v.Missing {
		fmt.Fprintf(w, "  missing: %s\n", m)
	}
	if gv.CNF != nil {
		fmt.Fprintf(w, "  encoding: %d variables, %d clauses (%s)\n", gv.Vars, gv.Clauses, gv.Options)
	}
	for _, r := range gv.Results {
		line := fmt.Sprintf("  %s", r.Backend)
		if r.Version != "" {
			line += " " + r.Version
		}
		line += fmt.Sprintf(": %s in %s", r.Answer, r.Elapsed.Round(time.Millisecond))
		if r.Detail != "" {
			line += " (" + r.Detail + ")"
		}
		fmt.Fprintln(w, line)
	}
	if gv.ProofDir != "" {
		fmt.Fprintf(w, "  proofs kept in %s\n", gv.ProofDir)
	}
}

// solveProgress shows the solvers' states and the proof check on a terminal.
type solveProgress struct {
	mu     sync.Mutex
	w      io.Writer
	on     bool
	start  time.Time
	prefix string
	states map[string]string
	order  []string
	bar    *progressbar.ProgressBar
	proof  string // "backend/phase" of the proof check on display
	stop   chan struct{}
	done   sync.WaitGroup
}

// solveProgressOn reports whether progress should be drawn on w.
func solveProgressOn(w io.Writer, quiet bool) bool {
	if quiet {
		return false
	}
	f, ok := w.(*os.File)
	return ok && term.IsTerminal(int(f.Fd()))
}

func newSolveProgress(w io.Writer, quiet bool, solvers []verify.Solver) *solveProgress {
	p := &solveProgress{w: w, on: solveProgressOn(w, quiet), start: time.Now(), states: map[string]string{}}
	for _, s := range solvers {
		p.order = append(p.order, s.Name())
		p.states[s.Name()] = "waiting"
	}
	if !p.on {
		return p
	}
	p.spinner()
	p.stop = make(chan struct{})
	p.done.Add(1)
	go func() {
		defer p.done.Done()
		t := time.NewTicker(150 * time.Millisecond)
		defer t.Stop()
		for {
			select {
			case <-p.stop:
				return
			case <-t.C:
				p.mu.Lock()
				if p.proof == "" && p.bar != nil {
					p.bar.Describe(p.describe())
					p.bar.Add(1)
				}
				p.mu.Unlock()
			}
		}
	}()
	return p
}

// spinner starts the indeterminate bar for the solver phase (mu held or unused).
func (p *solveProgress) spinner() {
	p.bar = progressbar.NewOptions(-1,
		progressbar.OptionSetWriter(p.w),
		spineLook(),
		progressbar.OptionSetDescription(p.describe()),
		progressbar.OptionClearOnFinish(),
		progressbar.OptionSetElapsedTime(true),
	)
}

// describe renders the solver states.
func (p *solveProgress) describe() string {
	names := append([]string(nil), p.order...)
	sort.Strings(names)
	parts := make([]string, 0, len(names))
	for _, n := range names {
		parts = append(parts, n+": "+p.states[n])
	}
	return p.prefix + strings.Join(parts, "  ")
}

// setPrefix puts a label (such as the step of a search) before the states.
func (p *solveProgress) setPrefix(s string) {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.prefix = s
	for n := range p.states {
		p.states[n] = "waiting"
	}
}

func (p *solveProgress) event(e verify.Event) {
	if !p.on {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	switch e.Kind {
	case verify.SolverStarted:
		p.states[e.Backend] = "running"
	case verify.SolverFinished:
		p.states[e.Backend] = fmt.Sprintf("%s %s", e.Result.Answer, e.Elapsed.Round(10*time.Millisecond))
	case verify.ProofProgress:
		if phase := e.Backend + "/" + e.Phase; p.proof != phase {
			p.bar.Finish()
			p.proof = phase
			// The total of a phase is known from its first report on, or never.
			total := e.Total
			if total <= 0 {
				total = -1
			}
			p.bar = progressbar.NewOptions64(total,
				progressbar.OptionSetWriter(p.w),
				progressbar.OptionSetDescription(fmt.Sprintf("%s%s proof from %s (steps)", p.prefix, e.Phase, e.Backend)),
				progressbar.OptionShowCount(),
				spineLook(),
				progressbar.OptionClearOnFinish(),
				progressbar.OptionSetElapsedTime(true),
				progressbar.OptionThrottle(100*time.Millisecond),
			)
		}
		p.bar.Set64(e.Done)
	case verify.ProofFinished:
		if p.proof != "" {
			p.bar.Finish()
			p.proof = ""
			p.spinner()
		}
	}
}

func (p *solveProgress) finish() {
	if !p.on {
		return
	}
	close(p.stop)
	p.done.Wait()
	p.mu.Lock()
	defer p.mu.Unlock()
	p.bar.Finish()
}
