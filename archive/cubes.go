package archive

import (
	"bytes"
	"context"
	"fmt"
	"slices"
	"sync"

	"spinecert.dev/cube"
	"spinecert.dev/dimacs"
)

// Cube coverage methods recorded in a manifest.
const (
	// CoverTree: the cubes are the leaves of a complete binary decision
	// tree, checked by cube.CheckTree (rule spinecert-cover-tree-1).
	CoverTree = "spinecert-cover-tree-1"
	// CoverProof: a refutation of the cubes' coverage formula
	// (cube.CoverageCNF) is stored and checked.
	CoverProof = "proof"
)

const (
	memberCubes    = "cubes/cubes.txt"
	memberCoverage = "proofs/coverage"
)

// CubesInput is the evidence of a refutation split into cubes: the
// formula F ∧ cube is refuted for every cube, and the cubes cover every
// assignment, so F is refuted.
type CubesInput struct {
	Cubes   []cube.Cube
	Entries []CubeProofInput // one per cube, in the order of Cubes
	// CoverageProof, when not empty, is a refutation of
	// cube.CoverageCNF(Cubes, vars); without it the cubes must pass
	// cube.CheckTree.
	CoverageProof  string
	CoverageFormat string
	Jobs           int // proofs checked at once (0 = 1)
}

// CubeProofInput is the refutation of one cube.
type CubeProofInput struct {
	Runs        []Run
	Proof       string
	ProofFormat string
}

// CubeSplit is the manifest record of a refutation by cubes.
type CubeSplit struct {
	Member   string      `json:"member"` // the cube file, "a LIT … 0" per cube
	SHA256   string      `json:"sha256"`
	Count    int         `json:"count"`
	Coverage Coverage    `json:"coverage"`
	Entries  []CubeEntry `json:"entries"` // one per cube, in the order of the cube file
}

// Coverage is the evidence that the cubes cover every assignment.
type Coverage struct {
	Method string `json:"method"`          // CoverTree or CoverProof
	Proof  *Proof `json:"proof,omitempty"` // CoverProof only
}

// CubeEntry is the refutation of one cube: formula ∧ cube.
type CubeEntry struct {
	Cube  int   `json:"cube"` // 1-based
	Runs  []Run `json:"runs"`
	Proof Proof `json:"proof"`
}

// cubeMember names the proof member of cube i (0-based) without extension.
func cubeMember(i int) string { return fmt.Sprintf("proofs/cube-%06d", i+1) }

// buildCubes checks and stores the cube evidence for the CNF: coverage
// first, then every cube's proof against cnf ∧ cube with the same
// checkers as any proof, Jobs at a time.
func buildCubes(ctx context.Context, r *Refutation, in *CubesInput, cnf *dimacs.CNF, tmpDir string) ([]Source, error) {
	if len(in.Cubes) > MaxCubes {
		return nil, fmt.Errorf("archive: %d cubes; a bundle holds at most %d (split the claim into fewer cubes)", len(in.Cubes), MaxCubes)
	}
	if len(in.Entries) != len(in.Cubes) {
		return nil, fmt.Errorf("archive: %d cube proofs for %d cubes", len(in.Entries), len(in.Cubes))
	}
	var cb bytes.Buffer
	if err := cube.Write(&cb, in.Cubes); err != nil {
		return nil, err
	}
	cs := &CubeSplit{Member: memberCubes, SHA256: sha256Hex(cb.Bytes()), Count: len(in.Cubes)}
	srcs := []Source{BytesSource(memberCubes, cb.Bytes())}
	for i, c := range in.Cubes {
		for _, l := range c {
			if int(max(l, -l)) > cnf.Vars {
				return nil, fmt.Errorf("%w: cube %d has literal %d, the formula has %d variables", ErrRejected, i+1, l, cnf.Vars)
			}
		}
	}
	if in.CoverageProof == "" {
		if err := cube.CheckTree(in.Cubes); err != nil {
			return nil, fmt.Errorf("%w: %w", ErrRejected, err)
		}
		cs.Coverage.Method = CoverTree
	} else {
		p, src, err := storeProof(ctx, cube.CoverageCNF(in.Cubes, cnf.Vars), in.CoverageProof, in.CoverageFormat, memberCoverage, tmpDir)
		if err != nil {
			return nil, fmt.Errorf("archive: the coverage proof: %w", err)
		}
		cs.Coverage = Coverage{Method: CoverProof, Proof: &p}
		srcs = append(srcs, src)
	}
	cs.Entries = make([]CubeEntry, len(in.Cubes))
	cubeSrcs := make([]Source, len(in.Cubes))
	errs := make([]error, len(in.Cubes))
	var wg sync.WaitGroup
	sem := make(chan struct{}, max(1, in.Jobs))
	for i := range in.Cubes {
		sem <- struct{}{}
		wg.Add(1)
		go func() {
			defer func() { <-sem; wg.Done() }()
			if ctx.Err() != nil {
				errs[i] = ctx.Err()
				return
			}
			e := in.Entries[i]
			p, src, err := storeProof(ctx, cube.Apply(cnf, in.Cubes[i]), e.Proof, e.ProofFormat, cubeMember(i), tmpDir)
			if err != nil {
				errs[i] = fmt.Errorf("cube %d (%s): %w", i+1, in.Cubes[i], err)
				return
			}
			entry := CubeEntry{Cube: i + 1, Proof: p}
			for _, run := range e.Runs {
				run.Seconds = 0
				entry.Runs = append(entry.Runs, run)
			}
			cs.Entries[i], cubeSrcs[i] = entry, src
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	r.Cubes = cs
	return append(srcs, cubeSrcs...), nil
}

// validateCubes applies the manifest rules of a refutation by cubes.
func validateCubes(cs *CubeSplit, bad func(string, ...any), name func(string, string), proofRule func(string, Proof)) {
	name("refutation.cubes.member", cs.Member)
	if cs.Member != memberCubes {
		bad("refutation.cubes.member is %q, expected %q", cs.Member, memberCubes)
	}
	if !isHex64(cs.SHA256) {
		bad("refutation.cubes.sha256 %q is not 64 lowercase hex digits", cs.SHA256)
	}
	if cs.Count < 1 || cs.Count > MaxCubes {
		bad("refutation.cubes.count is %d, expected 1 to %d", cs.Count, MaxCubes)
	}
	if len(cs.Entries) != cs.Count {
		bad("refutation.cubes has %d entries for %d cubes", len(cs.Entries), cs.Count)
	}
	switch cs.Coverage.Method {
	case CoverTree:
		if cs.Coverage.Proof != nil {
			bad("refutation.cubes.coverage: the method %s takes no proof", CoverTree)
		}
	case CoverProof:
		if cs.Coverage.Proof == nil {
			bad("refutation.cubes.coverage: the method proof needs a proof")
		} else {
			proofRule("refutation.cubes.coverage.proof", *cs.Coverage.Proof)
		}
	default:
		bad("refutation.cubes.coverage.method %q is not %s or %s", cs.Coverage.Method, CoverTree, CoverProof)
	}
	for i, e := range cs.Entries {
		f := fmt.Sprintf("refutation.cubes.entries[%d]", i)
		if e.Cube != i+1 {
			bad("%s.cube is %d, expected %d", f, e.Cube, i+1)
		}
		for j, run := range e.Runs {
			if run.Backend == "" || !slices.Contains(answers, run.Answer) || run.Seconds < 0 {
				bad("%s.runs[%d]: backend, an answer (sat, unsat, unknown) and seconds >= 0 are required", f, j)
			}
		}
		proofRule(f+".proof", e.Proof)
	}
}
