package archive

import (
	"bytes"
	"context"
	"errors"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/verify"
)

// onDemandEvidence is the evidence that K5 needs 3 pages (Bernhart and
// Kainen 1979), refuted on a sub-formula of its on-demand formulation that
// verify.Refine builds, with cadical's proof of it.
func onDemandEvidence(t *testing.T) (*Evidence, *dimacs.Sub) {
	t.Helper()
	g := fixture.WithBase(fixture.Complete(5), 1)
	opt := dimacs.Options{Kind: cert.Stack, Pages: 2}
	f, err := dimacs.NewOnDemand(g, opt)
	if err != nil {
		t.Fatal(err)
	}
	res, err := verify.Refine(context.Background(), f, verify.RefineOptions{Limit: time.Minute})
	if err != nil || !res.Unsat {
		t.Fatalf("Refine: %v %+v", err, res)
	}
	return &Evidence{Graph: g, Name: "K5", Input: fixture.EdgeListBytes(t, g), InputFormat: graph.FormatEdgeList,
		Kind: cert.Stack, Bound: AtLeast, K: 3, ToolVersion: "test", Tool: "archive test",
		Refutation: &RefutationInput{Options: opt, Proof: proofByCadical(t, res.Sub.CNF), Sub: res.Sub}}, res.Sub
}

// TestOnDemandBundle: a refutation of an on-demand sub-formula is stored
// with its variable names, and verify checks its membership before the
// proof; a sub-formula with a clause that is not in the formulation is
// refused by Build and, slipped into a bundle, rejected by verify.
func TestOnDemandBundle(t *testing.T) {
	ev, sub := onDemandEvidence(t)
	b := bundleBytes(t, ev)
	r := verifyBytes(b, VerifyOptions{})
	if !r.Verified || !bytes.Contains([]byte(passNames(r)), []byte("membership")) {
		t.Fatalf("verified %v; passes:\n%s\nfailures:\n%s", r.Verified, passNames(r), failNames(r))
	}
	if c := r.Manifest.Refutation.CNF; c.Source != CNFSub || c.Member != memberSubCNF || c.VarNames != memberSubVars {
		t.Fatalf("cnf entry %+v", c)
	}
	// A unit clause on an order variable is no clause of the formulation (its
	// order clauses have two or three literals): it decides an order the
	// formulation leaves open.
	unit := int32(0)
	for i, v := range sub.Vars {
		if v.Kind == dimacs.OrderVar {
			unit = int32(i + 1)
			break
		}
	}
	bad := &dimacs.Sub{Vars: sub.Vars, CNF: &dimacs.CNF{Vars: sub.CNF.Vars, Clauses: append(append([][]int32(nil), sub.CNF.Clauses...), []int32{unit})}}
	ev2, _ := onDemandEvidence(t)
	ev2.Refutation.Sub = bad
	if _, _, err := Build(context.Background(), ev2, CurrentEncoder{}, t.TempDir()); !errors.Is(err, ErrRejected) || !errors.Is(err, dimacs.ErrNotMember) {
		t.Fatalf("Build with a non-member clause: %v", err)
	}
	files := members(t, b)
	text, sum, err := CNFText(bad.CNF)
	if err != nil {
		t.Fatal(err)
	}
	files[memberSubCNF] = text
	editManifest(t, files, func(m *Manifest) {
		m.Refutation.CNF.SHA256, m.Refutation.CNF.Clauses = sum, len(bad.CNF.Clauses)
		syncHashes(m, files)
	})
	mustFail(t, repack(t, files), "membership", "not a clause of the formulation")
}
