package archive

import (
	"context"
	"path/filepath"
	"testing"

	"spinecert.dev/graph"
)

// The bundles in testdata/bundles hold evidence for published values and
// must keep verifying with the current encoder and checkers:
//   - bt(K7) = ceil(7/2) = 4 (Bernhart and Kainen, "The book thickness of a
//     graph", JCTB 27, 1979);
//   - bt(Petersen) = 3: not planar, and bt <= 2 iff subhamiltonian planar
//     (Bernhart and Kainen 1979);
//   - bt(Goldner-Harary) = 3: maximal planar and not Hamiltonian (Goldner
//     and Harary 1975), so not subhamiltonian (Bernhart and Kainen 1979);
//   - the Kleetope of a random stacked triangulation on 335 vertices (1001
//     vertices, internal/kleetopegen -t 335 -seed 1) needs at least 3 pages:
//     it is maximal planar and not Hamiltonian (removing the 335 old vertices
//     leaves 666 components; Chvátal 1973), so not subhamiltonian (Bernhart
//     and Kainen 1979). The bundle's refutation rests on a 37-vertex subgraph;
//     the on-demand bundle refutes a sub-formula of the on-demand formulation
//     of that subgraph, whose membership verify checks;
//   - the Petersen graph needs at least 3 pages, as above, by a refutation
//     split into 16 cubes (spinecert split, conquer and gather);
//   - queue number of K3,3 = 2: 1-queue graphs are planar (Heath and
//     Rosenberg, "Laying out graphs using queues", SIAM J. Comput. 21,
//     1992), K3,3 is not (derived, as in REFERENCES).
//
// The first three were made with encoder spinecert-enc-1 and so also test that
// old evidence keeps verifying after the encoder changed.
func TestPublishedBundles(t *testing.T) {
	want := []struct {
		bundle, graph, kind, bound string
		k                          int
	}{
		{"k7.spinecert.tar.zst", "k7.txt", "stack", Exact, 4},
		{"petersen.spinecert.tar.zst", "petersen.txt", "stack", Exact, 3},
		{"goldner-harary.spinecert.tar.zst", "goldner-harary.txt", "stack", Exact, 3},
		{"k33-queue.spinecert.tar.zst", "k33.txt", "queue", Exact, 2},
		{"kleetope-1001.spinecert.tar.zst", "kleetope-1001.txt", "stack", AtLeast, 3},
		{"kleetope-1001-on-demand.spinecert.tar.zst", "kleetope-1001.txt", "stack", AtLeast, 3},
		{"petersen-cubes.spinecert.tar.zst", "petersen.txt", "stack", AtLeast, 3},
	}
	dir := filepath.Join("..", "testdata", "bundles")
	for _, w := range want {
		t.Run(w.bundle, func(t *testing.T) {
			r := VerifyFile(context.Background(), filepath.Join(dir, w.bundle), VerifyOptions{})
			if !r.Verified {
				t.Fatalf("not verified:\n%s", failNames(r))
			}
			m := r.Manifest
			if m.Claim.Bound != w.bound || m.Claim.K != w.k || m.Claim.Kind != w.kind {
				t.Fatalf("claim %s, want %s %s %d", r.Claim, w.kind, w.bound, w.k)
			}
			res, err := graph.ReadFile(filepath.Join(dir, w.graph), graph.FormatAuto)
			if err != nil {
				t.Fatal(err)
			}
			if id := res.Graphs[0].ID(); id != m.Claim.GraphID {
				t.Fatalf("bundle is about graph %s, %s is %s", m.Claim.GraphID, w.graph, id)
			}
		})
	}
}
