package evidence_test

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"testing"

	"spinecert.dev/archive"
	"spinecert.dev/evidence"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/fixture/backends"
)

func TestMain(m *testing.M) {
	backends.ServeChild()
	os.Exit(m.Run())
}

func request(t *testing.T, g *graph.Graph, name, bound string, k int) *evidence.Request {
	t.Helper()
	return &evidence.Request{Graph: g, Input: fixture.EdgeListBytes(t, g), InputFormat: graph.FormatEdgeList,
		Claim:   archive.Claim{Name: name, Kind: "stack", Bound: bound, K: k, GraphID: g.ID(), Vertices: g.N(), Edges: g.M()},
		Solvers: backends.InProcess(t), ToolVersion: "test", Tool: "evidence test", Planarity: true}
}

// bt(K_n) = ceil(n/2) for n >= 4 (Bernhart and Kainen, "The book thickness
// of a graph", JCTB 27, 1979): K5 needs exactly 3 pages.
func TestMakeExactK5(t *testing.T) {
	out := filepath.Join(t.TempDir(), "k5"+archive.Suffix)
	m, err := evidence.Make(context.Background(), request(t, fixture.Complete(5), "K5", archive.Exact, 3), out)
	if err != nil {
		t.Fatal(err)
	}
	if m.Layout == nil || m.Layout.Pages != 3 || m.Refutation == nil || len(m.Refutation.Proofs) == 0 {
		t.Fatalf("manifest lacks evidence: %+v", m)
	}
	if r := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{}); !r.Verified {
		t.Fatalf("the bundle made does not verify: %+v", r.Checks)
	}
}

// K4 is planar and Hamiltonian, so it has a 2-page layout (Bernhart and
// Kainen 1979): a claim that it needs 3 pages is false, and nothing is written.
func TestMakeFalseClaim(t *testing.T) {
	out := filepath.Join(t.TempDir(), "k4"+archive.Suffix)
	_, err := evidence.Make(context.Background(), request(t, fixture.Complete(4), "K4", archive.AtLeast, 3), out)
	if !errors.Is(err, evidence.ErrClaimFalse) {
		t.Fatalf("got %v, want ErrClaimFalse", err)
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Fatalf("a bundle was written for a false claim: %v", err)
	}
}

// The Petersen graph is not planar (it contains a K3,3 subdivision; common
// knowledge, no source): RequirePlanar refuses it before any solving.
func TestMakeRequirePlanar(t *testing.T) {
	r := request(t, fixture.Petersen(), "Petersen", archive.AtMost, 3)
	r.RequirePlanar = true
	if _, err := evidence.Make(context.Background(), r, filepath.Join(t.TempDir(), "p"+archive.Suffix)); !errors.Is(err, evidence.ErrNotPlanar) {
		t.Fatalf("got %v, want ErrNotPlanar", err)
	}
}

// A claim that breaks its own rules is refused before any work.
func TestMakeBadClaim(t *testing.T) {
	r := request(t, fixture.Complete(4), "K4", archive.AtLeast, 1)
	if _, err := evidence.Make(context.Background(), r, filepath.Join(t.TempDir(), "x"+archive.Suffix)); !errors.Is(err, archive.ErrBadClaim) {
		t.Fatalf("got %v, want ErrBadClaim", err)
	}
}
