package archive

import (
	"bytes"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/testtools"
	"spinecert.dev/verify"
)

// complete returns K_n on vertices 1..n.
func complete(t testing.TB, n int) *graph.Graph {
	var es [][2]int
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			es = append(es, [2]int{i, j})
		}
	}
	g, err := graph.NewNumbered(n, 1, es)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

func edgeListBytes(t testing.TB, g *graph.Graph) []byte {
	var b bytes.Buffer
	if err := graph.WriteEdgeList(&b, g); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

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

// proofByCadical writes cnf to a file and has cadical (Debian package
// cadical) refute it, returning the path of its binary DRAT proof.
func proofByCadical(t testing.TB, cnf *dimacs.CNF, args ...string) string {
	t.Helper()
	cad := testtools.Require(t, "cadical", "cadical")
	dir := t.TempDir()
	cnfPath := filepath.Join(dir, "f.cnf")
	text, _, err := CNFText(cnf)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(cnfPath, text, 0o644); err != nil {
		t.Fatal(err)
	}
	proof := filepath.Join(dir, "f.drat")
	// A formula holding the empty clause is refuted by the empty clause
	// alone (binary DRAT: 'a' 0); cadical would only delete it.
	for _, c := range cnf.Clauses {
		if len(c) == 0 {
			if err := os.WriteFile(proof, []byte{'a', 0}, 0o644); err != nil {
				t.Fatal(err)
			}
			return proof
		}
	}
	cmd := exec.Command(cad, append(append([]string{"-q"}, args...), cnfPath, proof)...)
	err = cmd.Run()
	if ee, ok := err.(*exec.ExitError); !ok || ee.ExitCode() != 20 {
		t.Fatalf("cadical: expected exit 20 (unsat), got %v", err)
	}
	// cadical writes no step at all when unit propagation alone refutes
	// the formula; the refutation then is the empty clause by itself
	// (binary DRAT: 'a' 0).
	if fi, err := os.Stat(proof); err == nil && fi.Size() == 0 {
		if err := os.WriteFile(proof, []byte{'a', 0}, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return proof
}

// petersen returns the Petersen graph: outer cycle 0..4, spokes i-(i+5),
// inner pentagram.
func petersen(t testing.TB) *graph.Graph {
	var es [][2]int
	for i := 0; i < 5; i++ {
		es = append(es, [2]int{i, (i + 1) % 5}, [2]int{i, i + 5}, [2]int{5 + i, 5 + (i+2)%5})
	}
	g, err := graph.NewNumbered(10, 0, es)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// evidence makes the evidence for a claim about g, solving as needed.
func evidence(t testing.TB, g *graph.Graph, name string, kind cert.Kind, pageKinds []cert.Kind, bound string, k int) *Evidence {
	t.Helper()
	ev := &Evidence{Graph: g, Name: name, Input: edgeListBytes(t, g), InputFormat: graph.FormatEdgeList,
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
