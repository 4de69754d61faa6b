package archive

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"slices"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/verify"
)

// layoutBySAT finds a layout with the in-process gini backend and decodes it.
func layoutBySAT(t testing.TB, g *graph.Graph, opt dimacs.Options) *cert.Layout {
	t.Helper()
	enc, err := dimacs.Encode(g, opt)
	if err != nil {
		t.Fatal(err)
	}
	res, err := verify.Gini{}.Solve(context.Background(), enc.CNF(), 0, "")
	if err != nil || res.Answer != verify.Sat {
		t.Fatalf("expected a layout for %+v: %v %v", opt, res, err)
	}
	l, err := enc.Decode(append([]bool{false}, res.Model...))
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// proofByCadical has cadical (Debian package cadical) refute cnf and
// returns the path of its binary DRAT proof.
func proofByCadical(t testing.TB, cnf *dimacs.CNF, args ...string) string {
	t.Helper()
	// A formula holding the empty clause is refuted by the empty clause
	// alone (binary DRAT: 'a' 0); cadical would only delete it. cadical
	// also writes no step at all when unit propagation alone refutes the
	// formula; the refutation then is the empty clause by itself too.
	drat := []byte{'a', 0}
	if !slices.ContainsFunc(cnf.Clauses, func(c []int32) bool { return len(c) == 0 }) {
		text, _, err := CNFText(cnf)
		if err != nil {
			t.Fatal(err)
		}
		r := fixture.Cadical(t, text, true, args...)
		if r.Exit != 20 {
			t.Fatalf("cadical: expected exit 20 (unsat), got %d", r.Exit)
		}
		if len(r.Proof) > 0 {
			drat = r.Proof
		}
	}
	proof := filepath.Join(t.TempDir(), "f.drat")
	if err := os.WriteFile(proof, drat, 0o644); err != nil {
		t.Fatal(err)
	}
	return proof
}

// evidence makes the evidence for a claim about g, solving as needed.
func evidence(t testing.TB, g *graph.Graph, name string, kind cert.Kind, pageKinds []cert.Kind, bound string, k int) *Evidence {
	t.Helper()
	ev := &Evidence{Graph: g, Name: name, Input: fixture.EdgeListBytes(t, g), InputFormat: graph.FormatEdgeList,
		Kind: kind, PageKinds: pageKinds, Bound: bound, K: k, ToolVersion: "test", Tool: "archive test"}
	if bound == AtMost || bound == Exact {
		ev.Layout = layoutBySAT(t, g, dimacs.Options{Kind: kind, Pages: k, PageKinds: pageKinds})
	}
	if bound == AtLeast || bound == Exact {
		opt := dimacs.Options{Kind: kind, Pages: k - 1, PageKinds: pageKinds}
		cnf, err := CurrentEncoder{}.Encode(g, opt)
		if err != nil {
			t.Fatal(err)
		}
		ev.Refutation = &RefutationInput{Options: opt, Proof: proofByCadical(t, cnf),
			Runs: []Run{{Backend: "cadical", Version: "test", Answer: "unsat", Seconds: 0}}}
	}
	return ev
}

func bundleBytes(t testing.TB, ev *Evidence) []byte {
	t.Helper()
	_, srcs, err := Build(context.Background(), ev, CurrentEncoder{}, t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := Write(context.Background(), &b, srcs); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

func verifyBytes(b []byte, opt VerifyOptions) *Report {
	return Verify(context.Background(), bytes.NewReader(b), "test.spinecert.tar.zst", opt)
}

func readAllFile(p string) ([]byte, error) { return os.ReadFile(p) }
