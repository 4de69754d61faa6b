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
)

// FindExact finds the page number and bundles exact K with both sides of the
// evidence. bt(K5) = 3: bt(K_n) = ceil(n/2) for n >= 4 (Bernhart and Kainen,
// "The book thickness of a graph", JCTB 27, 1979); bt(Petersen) = 3 (the
// same paper; REFERENCES). K6 also has 3 (ceil(6/2)), and the queue number of
// K3,3 is 2 (1-queue graphs are planar, K3,3 is not; derived, REFERENCES).
func TestMakeFindExact(t *testing.T) {
	tests := []struct {
		name string
		g    *graph.Graph
		kind string
		want int
	}{
		{"K5", fixture.Complete(5), "stack", 3},
		{"Petersen", fixture.Petersen(), "stack", 3},
		{"K6", fixture.Complete(6), "stack", 3},
		{"K3,3", fixture.CompleteBipartite(3, 3), "queue", 2},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			out := filepath.Join(t.TempDir(), "g"+archive.Suffix)
			r := request(t, tc.g, tc.name, archive.Exact, 0)
			r.Claim.Kind = tc.kind
			r.FindExact = true
			m, err := evidence.Make(context.Background(), r, out)
			if err != nil {
				t.Fatal(err)
			}
			if m.Claim.Bound != archive.Exact || m.Claim.K != tc.want {
				t.Fatalf("claim %s %d, want exact %d", m.Claim.Bound, m.Claim.K, tc.want)
			}
			if m.Layout == nil || m.Layout.Pages != tc.want || m.Refutation == nil || m.Refutation.Pages != tc.want-1 {
				t.Fatalf("manifest lacks evidence on both sides: %+v", m)
			}
			v := archive.VerifyFile(context.Background(), out, archive.VerifyOptions{})
			if !v.Verified {
				t.Fatalf("the bundle made does not verify: %+v", v.Checks)
			}
		})
	}
}

// A path is a tree, so its page number is 1 (trees are outerplanar;
// Bernhart and Kainen 1979, REFERENCES): no exact claim can be stated (it would refute 0 pages), and
// nothing is written.
func TestMakeFindExactOnePage(t *testing.T) {
	out := filepath.Join(t.TempDir(), "p"+archive.Suffix)
	r := request(t, fixture.Numbered(4, [][2]int{{0, 1}, {1, 2}, {2, 3}}), "P4", archive.Exact, 0)
	r.FindExact = true
	if _, err := evidence.Make(context.Background(), r, out); !errors.Is(err, evidence.ErrExactTooSmall) {
		t.Fatalf("got %v, want ErrExactTooSmall", err)
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Fatalf("a bundle was written: %v", err)
	}
}
