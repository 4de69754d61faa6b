package archive

import (
	"bytes"
	"strings"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/planar"
)

func failNames(r *Report) string {
	var s []string
	for _, c := range r.Failures() {
		s = append(s, c.Name+": "+c.Detail)
	}
	return strings.Join(s, "\n")
}

// Round trips over stack, queue and mixed claims and all three bounds.
// Values: bt(K5) = 3 (Bernhart and Kainen, "The book thickness of a graph",
// JCTB 27, 1979); queue number of K_n is floor(n/2), so K5 has 2 (Heath and
// Rosenberg, "Laying out graphs using queues", SIAM J. Comput. 21, 1992;
// from memory). The mixed claims are about one stack and one queue page:
// K5 is not planar, so one stack page (outerplanar) is not enough either.
func TestRoundTrip(t *testing.T) {
	k5 := fixture.WithBase(fixture.Complete(5), 1)
	tests := []struct {
		name  string
		kind  cert.Kind
		pk    []cert.Kind
		bound string
		k     int
	}{
		{"stack exact", cert.Stack, nil, Exact, 3},
		{"stack at most", cert.Stack, nil, AtMost, 3},
		{"stack at least", cert.Stack, nil, AtLeast, 3},
		{"queue exact", cert.Queue, nil, Exact, 2},
		{"queue at least", cert.Queue, nil, AtLeast, 2},
		{"mixed at most", cert.Mixed, []cert.Kind{cert.Stack, cert.Queue}, AtMost, 2},
		{"mixed at least", cert.Mixed, []cert.Kind{cert.Stack}, AtLeast, 2},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			ev := evidence(t, k5, "K5", tc.kind, tc.pk, tc.bound, tc.k)
			b := bundleBytes(t, ev)
			r := verifyBytes(b, VerifyOptions{})
			if !r.Verified {
				t.Fatalf("not verified:\n%s", failNames(r))
			}
			for _, c := range r.Checks {
				t.Logf("%s %s: %s", c.Status, c.Name, c.Detail)
			}
			// The name is not checked, so it is not part of the claim text.
			if strings.Contains(r.Claim, "K5") || !strings.Contains(r.Claim, k5.ID()[:12]) || r.Label != "K5" {
				t.Errorf("claim %q, label %q: want the graph named by its identity and the name apart", r.Claim, r.Label)
			}
			// The same evidence gives the same bytes, however long the solvers ran.
			if ev.Refutation != nil {
				ev.Refutation.Runs[0].Seconds = 1.5
			}
			if b2 := bundleBytes(t, ev); !bytes.Equal(b, b2) {
				t.Error("two bundles of the same evidence differ")
			}
		})
	}
}

// A planarity certificate stored in a bundle is re-checked. K5 is not
// planar (Kuratowski 1930); the certificate is a Kuratowski subgraph.
func TestPlanarityMember(t *testing.T) {
	g := fixture.WithBase(fixture.Complete(5), 1)
	ev := evidence(t, g, "K5", cert.Stack, nil, AtMost, 3)
	res, err := planar.Decide(g)
	if err != nil {
		t.Fatal(err)
	}
	ev.Planarity = res.Cert
	b := bundleBytes(t, ev)
	r := verifyBytes(b, VerifyOptions{})
	if !r.Verified || !strings.Contains(passNames(r), "planarity: not planar") {
		t.Fatalf("verified=%v\n%s\n%s", r.Verified, failNames(r), passNames(r))
	}
}

func passNames(r *Report) string {
	var s []string
	for _, c := range r.Checks {
		if c.Status == StatusPass {
			s = append(s, c.Name+": "+c.Detail)
		}
	}
	return strings.Join(s, "\n")
}
