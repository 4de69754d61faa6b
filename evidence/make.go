package evidence

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/verify"
)

// Outcomes a caller branches on. Errors from archive (ErrRejected, a bad
// bundle) pass through wrapped.
var (
	// ErrClaimFalse: the solvers settled the claim the other way (a checked
	// layout beside a lower-bound claim, or a checked refutation beside an
	// upper-bound claim).
	ErrClaimFalse = errors.New("evidence: the claim is false")
	// ErrUndecided: the solvers neither proved nor refuted what the claim needs.
	ErrUndecided = errors.New("evidence: undecided")
	// ErrNotPlanar: RequirePlanar was set and the checked verdict is "not planar".
	ErrNotPlanar = errors.New("evidence: the graph is not planar")
	// ErrLayoutRejected: the given layout failed the direct check.
	ErrLayoutRejected = errors.New("evidence: layout rejected")
	// ErrExactTooSmall: FindExact found a page number below 2, for which
	// no exact claim can be stated (its lower bound would refute 0 pages).
	ErrExactTooSmall = errors.New("evidence: no exact claim for this page number")
)

// Request is a claim and what is known about it.
type Request struct {
	Graph       *graph.Graph
	Input       []byte       // the graph file as given
	InputFormat graph.Format // its format
	Claim       archive.Claim
	// FindExact finds the page number K for an exact claim (Claim.Bound
	// Exact, Claim.K ignored, Kind stack or queue) with the solvers: the
	// bundle then claims exact K, with a layout on K pages and a checked
	// refutation of K-1. Layout and FromProof must be empty.
	FindExact bool
	// Layout is a layout read from a file for an upper bound; it is matched
	// with the graph and checked directly. Nil means: find one with the solvers.
	Layout *cert.RawLayout
	// FromProof is a proof made elsewhere for the lower bound (FromCNF the
	// CNF it refutes, when that is not spinecert's encoding). Empty means:
	// refute with the solvers.
	FromProof, FromCNF string
	Planarity          bool // store a checked planarity certificate
	RequirePlanar      bool // fail with ErrNotPlanar unless the graph is planar (implies Planarity)
	Solvers            []verify.Solver
	Limit              time.Duration // per solver run; 0 = none
	// Obstruction, when not nil, lets a lower bound rest on a small subgraph
	// (verify.FindObstruction): the bundle then stores the subgraph, and
	// archive and verify check that it is one.
	Obstruction *verify.ObstructionOptions
	// OnDemand refutes on a sub-formula of the on-demand formulation
	// (verify.DecideOnDemand); the bundle stores it with its variable names.
	OnDemand    bool
	ToolVersion string
	Tool        string
	Created     string // RFC 3339 or ""
	IncludeCNF  bool
}

// NeedsSolvers reports whether r needs solver backends: an upper bound
// without a layout, or a lower bound without a proof.
func (r *Request) NeedsSolvers() bool {
	if r.FindExact {
		return true
	}
	b := r.Claim.Bound
	return (b != archive.AtLeast && r.Layout == nil) || (b != archive.AtMost && r.FromProof == "")
}

// Make gathers the evidence for r, has archive.Build check it, and writes
// the bundle to out atomically. Nothing is written unless every check passed.
func Make(ctx context.Context, r *Request, out string) (*archive.Manifest, error) {
	if err := r.Validate(); err != nil {
		return nil, err
	}
	tmp, err := os.MkdirTemp("", "spinecert-bundle-")
	if err != nil {
		return nil, fmt.Errorf("evidence: %w", err)
	}
	defer os.RemoveAll(tmp)
	ev, err := Gather(ctx, r, tmp)
	if err != nil {
		return nil, err
	}
	return archive.BuildFile(ctx, ev, archive.CurrentEncoder{}, tmp, out)
}

// Validate checks the claim of r (for FindExact, the rules of an exact
// claim with the smallest K it allows, 2) and that FindExact comes with no
// evidence given.
func (r *Request) Validate() error {
	c := r.Claim
	if !r.FindExact {
		return c.Validate()
	}
	if c.Bound != archive.Exact {
		return fmt.Errorf("%w: finding the page number is for an exact claim", archive.ErrBadClaim)
	}
	if r.Layout != nil || r.FromProof != "" {
		return fmt.Errorf("%w: finding the page number takes no layout or proof", archive.ErrBadClaim)
	}
	c.K = 2
	return c.Validate()
}

// Gather collects the evidence for r without checking it for the bundle
// (archive.Build does that). Proofs go to files under tmpDir, which the
// caller removes after building the bundle.
func Gather(ctx context.Context, r *Request, tmpDir string) (*archive.Evidence, error) {
	c := r.Claim
	kind, err := cert.ParseKind(c.Kind)
	if err != nil {
		return nil, fmt.Errorf("evidence: %w", err)
	}
	var pageKinds []cert.Kind
	for _, s := range c.PageKinds {
		pk, err := cert.ParseKind(s)
		if err != nil {
			return nil, fmt.Errorf("evidence: %w", err)
		}
		pageKinds = append(pageKinds, pk)
	}
	g := r.Graph
	ev := &archive.Evidence{Graph: g, Name: c.Name, Input: r.Input, InputFormat: r.InputFormat,
		Kind: kind, PageKinds: pageKinds, Bound: c.Bound, K: c.K,
		ToolVersion: r.ToolVersion, Tool: r.Tool, Created: r.Created, IncludeCNF: r.IncludeCNF}
	if r.Planarity || r.RequirePlanar {
		res, err := planar.DecideChecked(g)
		if err != nil {
			return nil, fmt.Errorf("evidence: planarity: %w", err)
		}
		if r.RequirePlanar && !res.Planar {
			return nil, fmt.Errorf("%w (a %s subdivision was checked)", ErrNotPlanar, res.Cert.Kuratowski.Kind)
		}
		ev.Planarity = res.Cert
	}
	name := c.Name
	if name == "" {
		name = "the graph"
	}
	if r.FindExact {
		if err := findExact(ctx, r, kind, tmpDir, ev); err != nil {
			return nil, err
		}
		return ev, nil
	}
	if c.Bound != archive.AtLeast {
		if ev.Layout, err = upper(ctx, r, kind, pageKinds, name, tmpDir); err != nil {
			return nil, err
		}
	}
	if c.Bound != archive.AtMost {
		if ev.Refutation, err = lower(ctx, r, kind, pageKinds, name, tmpDir); err != nil {
			return nil, err
		}
	}
	return ev, nil
}

// upper returns a checked layout on K pages: the given one, or one decoded
// from a solver's model.
func upper(ctx context.Context, r *Request, kind cert.Kind, pageKinds []cert.Kind, name, tmpDir string) (*cert.Layout, error) {
	k := r.Claim.K
	if r.Layout != nil {
		l, rep := cert.Resolve(r.Graph, r.Layout)
		if !rep.OK() {
			return nil, fmt.Errorf("%w: %w", ErrLayoutRejected, rep.Err())
		}
		return l, nil
	}
	gv, err := verify.DecideLayout(ctx, r.Graph, verify.GraphOptions{
		Encoding: dimacs.Options{Kind: kind, Pages: k, PageKinds: pageKinds}, Solvers: r.Solvers,
		Limit: r.Limit, ProofDir: filepath.Join(tmpDir, "upper"), StopOnModel: true,
	})
	if err != nil {
		return nil, fmt.Errorf("evidence: %w", err)
	}
	switch gv.Verdict.Outcome {
	case verify.Satisfiable:
		return gv.Layout, nil
	case verify.Unsatisfiable:
		return nil, fmt.Errorf("%w: there is no %s layout of %s on %d pages (checked refutation)", ErrClaimFalse, kind, name, k)
	}
	return nil, fmt.Errorf("%w: no %d-page layout found and none ruled out: %s", ErrUndecided, k, strings.Join(gv.Verdict.Missing, "; "))
}

// lower returns the refutation of K-1 pages: the given proof, or a proof
// that passed both checkers after at least two solvers answered UNSAT.
func lower(ctx context.Context, r *Request, kind cert.Kind, pageKinds []cert.Kind, name, tmpDir string) (*archive.RefutationInput, error) {
	k := r.Claim.K
	ropt := dimacs.Options{Kind: kind, Pages: k - 1, PageKinds: pageKinds}
	if kind != cert.Mixed {
		ropt.PageKinds = nil
	}
	ref := &archive.RefutationInput{Options: ropt, Proof: r.FromProof, ForeignCNF: r.FromCNF}
	if r.FromProof != "" {
		return ref, nil
	}
	gv, err := verify.DecideLayout(ctx, r.Graph, verify.GraphOptions{
		Encoding: ropt, Solvers: r.Solvers, Limit: r.Limit, ProofDir: filepath.Join(tmpDir, "lower"),
		Obstruction: r.Obstruction, OnDemand: r.OnDemand,
	})
	if err != nil {
		return nil, fmt.Errorf("evidence: %w", err)
	}
	switch gv.Verdict.Outcome {
	case verify.Satisfiable:
		return nil, fmt.Errorf("%w: %s has a %s layout on %d pages", ErrClaimFalse, name, kind, k-1)
	case verify.Unsatisfiable:
	default:
		return nil, fmt.Errorf("%w: %d pages neither refuted nor found: %s", ErrUndecided, k-1, strings.Join(gv.Verdict.Missing, "; "))
	}
	if err := fromVerdict(ref, gv); err != nil {
		return nil, err
	}
	return ref, nil
}

// fromVerdict fills ref from an UNSAT verdict: the solver runs, the
// subgraph or sub-formula refuted, and the proof that passed both checkers.
func fromVerdict(ref *archive.RefutationInput, gv *verify.GraphVerdict) error {
	for _, res := range gv.Results {
		ref.Runs = append(ref.Runs, archive.Run{Backend: res.Backend, Version: res.Version, Answer: strings.ToLower(res.Answer.String()), Seconds: res.Elapsed.Seconds()})
	}
	if gv.Subgraph != nil {
		ref.Subgraph = gv.Subgraph.Graph
	}
	ref.Sub = gv.Sub
	var ok bool
	if ref.Proof, ref.ProofFormat, ok = gv.CheckedProof(); !ok {
		return fmt.Errorf("%w: no proof of the refutation passed the checkers", ErrUndecided)
	}
	return nil
}
