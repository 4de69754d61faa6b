package cubejob

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/cube"
	"spinecert.dev/graph"
	"spinecert.dev/verify"
)

// GatherOptions controls Evidence.
type GatherOptions struct {
	// Solvers and Limit decide the coverage formula of cubes that are not
	// a decision tree (ShapeOther); unused for trees.
	Solvers []verify.Solver
	Limit   time.Duration
	Policy  verify.Policy // zero = verify.DefaultPolicy(): the UNSATs each cube's runs must show
	Jobs    int           // proofs checked at once by archive.Build
	TempDir string        // for the coverage proof
	Name    string        // label of the graph in the bundle ("" = the job's)
}

// Evidence checks a finished work directory and returns the evidence
// for archive.Build, which checks every proof again before it writes the
// bundle. Before that, it checks: that no cube was satisfiable; that every
// cube has a result of this job for this cube, whose proof has the
// recorded SHA-256 and whose runs show UNSAT from enough independent
// backends; and coverage, by cube.CheckTree for a decision tree, else by
// a refutation of the coverage formula that the solvers find and
// spinecert's checkers accept (a model is an uncovered assignment). Every
// error names the cube. The returned cleanup removes the coverage proof.
func (w *Work) Evidence(ctx context.Context, opt GatherOptions) (*archive.Evidence, func(), error) {
	none := func() {}
	if rec, err := w.ReadRefuted(); err != nil || rec != nil {
		if err != nil {
			return nil, none, err
		}
		return nil, none, refutedErr(w, rec)
	}
	policy := opt.Policy
	if policy == (verify.Policy{}) {
		policy = verify.DefaultPolicy()
	}
	// One pass reads every result; the proofs are hashed only when every
	// cube has one.
	results := make([]*Result, len(w.Cubes))
	var rem []int
	why := "" // why the first cube without a result has none, when its result is there but bad
	for i := range w.Cubes {
		r, err := w.ReadResult(i, false)
		if err != nil {
			if len(rem) == 0 && !errors.Is(err, os.ErrNotExist) {
				why = ": " + err.Error()
			}
			rem = append(rem, i)
			continue
		}
		results[i] = r
	}
	if len(rem) > 0 {
		var names []string
		for _, i := range rem[:min(len(rem), 8)] {
			names = append(names, fmt.Sprint(i+1))
		}
		more := ""
		if len(rem) > 8 {
			more = fmt.Sprintf(" and %d more", len(rem)-8)
		}
		return nil, none, fmt.Errorf("%w: %d of %d cubes (cube %s%s)%s", ErrIncomplete, len(rem), len(w.Cubes), strings.Join(names, ", "), more, why)
	}
	in := &archive.CubesInput{Cubes: w.Cubes, Jobs: opt.Jobs}
	for i, r := range results {
		if err := w.checkProofHash(i, r); err != nil {
			return nil, none, err
		}
		var unsat []string
		for _, run := range r.Runs {
			if run.Answer == strings.ToLower(verify.Unsat.String()) && !slices.Contains(unsat, run.Backend) {
				unsat = append(unsat, run.Backend)
			}
		}
		if len(unsat) < policy.MinUnsat {
			return nil, none, fmt.Errorf("%w: cube %d: its runs show UNSAT from %d backends (%s), the policy needs %d", ErrBadWork, i+1, len(unsat), strings.Join(unsat, ", "), policy.MinUnsat)
		}
		if !slices.Contains(unsat, r.Proof.Backend) {
			return nil, none, fmt.Errorf("%w: cube %d: its proof is from %s, which did not say UNSAT", ErrBadWork, i+1, r.Proof.Backend)
		}
		in.Entries = append(in.Entries, archive.CubeProofInput{Runs: r.Runs, Proof: w.ProofPath(r), ProofFormat: r.Proof.Format})
	}
	cleanup := none
	switch w.Job.Cubes.Shape {
	case ShapeTree:
		if err := cube.CheckTree(w.Cubes); err != nil {
			return nil, none, fmt.Errorf("%w: %s: %w", ErrBadWork, filepath.Join(w.Dir, CubesFile), err)
		}
	default:
		if err := cube.CheckDisjoint(w.Cubes); err != nil {
			return nil, none, fmt.Errorf("%w: %s: %w", ErrBadWork, filepath.Join(w.Dir, CubesFile), err)
		}
		tmp, err := os.MkdirTemp(opt.TempDir, "spinecert-coverage-*")
		if err != nil {
			return nil, none, fmt.Errorf("cubejob: %w", err)
		}
		cleanup = func() { os.RemoveAll(tmp) }
		cov := cube.CoverageCNF(w.Cubes, w.CNF.Vars)
		gv, err := verify.DecideCNF(ctx, cov, verify.GraphOptions{Solvers: opt.Solvers, Limit: opt.Limit, ProofDir: tmp, Policy: policy})
		if err != nil {
			cleanup()
			return nil, none, err
		}
		switch gv.Verdict.Outcome {
		case verify.Satisfiable:
			cleanup()
			return nil, none, fmt.Errorf("%w: %s: %w", ErrBadWork, filepath.Join(w.Dir, CubesFile), cube.Uncovered(w.Cubes, gv.Verdict.Model))
		case verify.Unsatisfiable:
			in.CoverageProof, in.CoverageFormat, _ = gv.CheckedProof()
		default:
			cleanup()
			return nil, none, fmt.Errorf("cubejob: the coverage of the cubes is undecided: %s", joinNonEmpty(gv.Verdict.Conflict, gv.Verdict.Missing))
		}
	}
	input, err := os.ReadFile(filepath.Join(w.Dir, GraphFile))
	if err != nil {
		cleanup()
		return nil, none, fmt.Errorf("cubejob: %w", err)
	}
	opts, err := archive.UnmarshalEncoderOptions(w.Job.Encoder.Options)
	if err != nil {
		cleanup()
		return nil, none, err
	}
	name := opt.Name
	if name == "" {
		name = w.Job.Claim.Name
	}
	kind, _ := cert.ParseKind(w.Job.Claim.Kind)
	ev := &archive.Evidence{
		Graph: w.Graph, Name: name, Input: input, InputFormat: graph.FormatEdgeList,
		Kind: kind, Bound: archive.AtLeast, K: w.Job.Claim.Pages + 1,
		Refutation: &archive.RefutationInput{Options: opts, Subgraph: w.Subgraph, Cubes: in},
	}
	return ev, cleanup, nil
}

// Bundle checks the work directory (Evidence), has archive.Build check
// every proof again, and writes the bundle to out atomically. Nothing is
// written unless every check passed.
func (w *Work) Bundle(ctx context.Context, out string, opt GatherOptions, toolVersion string) (*archive.Manifest, error) {
	tmp, err := os.MkdirTemp(opt.TempDir, "spinecert-gather-")
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	defer os.RemoveAll(tmp)
	opt.TempDir = tmp
	ev, cleanup, err := w.Evidence(ctx, opt)
	defer cleanup()
	if err != nil {
		return nil, err
	}
	ev.ToolVersion, ev.Tool = toolVersion, "spinecert gather"
	return archive.BuildFile(ctx, ev, archive.CurrentEncoder{}, tmp, out)
}
