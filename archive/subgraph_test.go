package archive

import (
	"bytes"
	"context"
	"errors"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// k5Plus is K5 on vertices 1..5 with a sixth vertex joined to 1 and 2, and
// its subgraph K5. bt(K5) = 3 (Bernhart and Kainen 1979), so both need 3
// pages; the refutation of 2 pages is made for K5 alone.
func k5Plus(t *testing.T) (g, h *graph.Graph) {
	t.Helper()
	es := fixture.EdgePairs(fixture.Complete(5))
	g = fixture.WithBase(fixture.Numbered(6, append(es, [2]int{5, 0}, [2]int{5, 1})), 1)
	h = fixture.WithBase(fixture.Complete(5), 1)
	return g, h
}

func subgraphEvidence(t *testing.T, g, h *graph.Graph) *Evidence {
	t.Helper()
	opt := dimacs.Options{Kind: cert.Stack, Pages: 2}
	cnf, err := CurrentEncoder{}.Encode(h, opt)
	if err != nil {
		t.Fatal(err)
	}
	return &Evidence{Graph: g, Name: "K5+", Input: fixture.EdgeListBytes(t, g), InputFormat: graph.FormatEdgeList,
		Kind: cert.Stack, Bound: AtLeast, K: 3, ToolVersion: "test", Tool: "archive test",
		Refutation: &RefutationInput{Options: opt, Proof: proofByCadical(t, cnf), Subgraph: h}}
}

// TestSubgraphBundle: a lower bound resting on a subgraph is built, stored
// with the subgraph, and verifies with the subgraph re-checked.
func TestSubgraphBundle(t *testing.T) {
	g, h := k5Plus(t)
	b := bundleBytes(t, subgraphEvidence(t, g, h))
	r := verifyBytes(b, VerifyOptions{})
	if !r.Verified {
		t.Fatalf("not verified:\n%s", failNames(r))
	}
	if !bytes.Contains([]byte(passNames(r)), []byte("subgraph")) {
		t.Fatalf("no subgraph check among the passes:\n%s", passNames(r))
	}
	if sg := r.Manifest.Refutation.Subgraph; sg == nil || sg.GraphID != h.ID() || sg.Vertices != 5 || sg.Edges != 10 {
		t.Fatalf("manifest subgraph %+v", sg)
	}
}

// TestSubgraphRejected: Build refuses a "subgraph" with an edge the graph
// lacks, and verify fails a bundle whose subgraph was swapped for one that
// is not a subgraph, or for another subgraph than the proof refutes.
func TestSubgraphRejected(t *testing.T) {
	g, h := k5Plus(t)
	// K5 plus the edge 6-3, which g lacks.
	bad := fixture.WithBase(fixture.Numbered(6, append(fixture.EdgePairs(fixture.Complete(5)), [2]int{5, 2})), 1)
	ev := subgraphEvidence(t, g, h)
	ev.Refutation.Subgraph = bad
	if _, _, err := Build(context.Background(), ev, CurrentEncoder{}, t.TempDir()); !errors.Is(err, ErrRejected) || !errors.Is(err, graph.ErrNotSubgraph) {
		t.Fatalf("Build with a non-subgraph: %v", err)
	}
	good := bundleBytes(t, subgraphEvidence(t, g, h))
	swap := func(repl *graph.Graph) []byte {
		files := members(t, good)
		files[memberSubgraph] = fixture.EdgeListBytes(t, repl)
		editManifest(t, files, func(m *Manifest) {
			sg := m.Refutation.Subgraph
			sg.GraphID, sg.Vertices, sg.Edges = repl.ID(), repl.N(), repl.M()
			m.Claim.Edges, m.Claim.Vertices = g.M(), g.N()
			syncHashes(m, files)
		})
		return repack(t, files)
	}
	mustFail(t, swap(bad), "subgraph")
	// K4 is a subgraph of g, but the proof refutes K5's encoding.
	k4 := fixture.WithBase(fixture.Complete(4), 1)
	mustFail(t, swap(k4), "encoder drift", "or the bundle was altered")
}
