package verify

import (
	"context"
	"strings"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// TestQuickLayout: a layout offered by GraphOptions.Quick decides the claim
// only when it passes the direct check on at most the claim's pages; a bad
// one is ignored and the solvers decide. K4 has a 2-page layout and no
// 1-page one (Bernhart and Kainen 1979: bt = 1 iff outerplanar).
func TestQuickLayout(t *testing.T) {
	g := fixture.Complete(4)
	// 0 1 2 3 on the spine, 0-2 alone on page 2: valid on 2 pages.
	good := &cert.Layout{Kind: cert.Stack, PageKinds: []cert.Kind{cert.Stack, cert.Stack}, Order: []int32{0, 1, 2, 3}, Page: []int32{1, 2, 1, 1, 1, 1}}
	// Everything on page 1: 0-2 and 1-3 cross.
	bad := &cert.Layout{Kind: cert.Stack, PageKinds: []cert.Kind{cert.Stack}, Order: []int32{0, 1, 2, 3}, Page: []int32{1, 1, 1, 1, 1, 1}}
	offer := func(l *cert.Layout) func(*graph.Graph) (*cert.Layout, string) {
		return func(*graph.Graph) (*cert.Layout, string) { return l, "test offer" }
	}
	run := func(pages int, l *cert.Layout) *GraphVerdict {
		gv, err := DecideLayout(context.Background(), g, GraphOptions{Encoding: dimacs.Options{Kind: cert.Stack, Pages: pages},
			Solvers: []Solver{gophersatForTest(t), Gini{}}, Quick: offer(l)})
		if err != nil {
			t.Fatal(err)
		}
		return gv
	}
	if gv := run(2, good); gv.Verdict.Outcome != Satisfiable || gv.CNF != nil || !strings.Contains(strings.Join(gv.Verdict.Checked, "\n"), "from test offer passed the direct check") {
		t.Fatalf("a valid offered layout did not decide: %+v", gv.Verdict)
	}
	if gv := run(3, good); gv.Verdict.Outcome != Satisfiable || gv.Layout.Pages() != 3 || !cert.Validate(g, gv.Layout).OK() {
		t.Fatalf("a 2-page layout for a 3-page claim: %+v", gv.Verdict)
	}
	// The bad offer is ignored: the solvers find K4 has no 1-page layout.
	if gv := run(1, bad); gv.Verdict.Outcome != Unsatisfiable || gv.CNF == nil {
		t.Fatalf("an invalid offered layout was used: %+v", gv.Verdict)
	}
	// A layout on more pages than the claim is ignored too.
	if gv := run(1, good); gv.Verdict.Outcome != Unsatisfiable {
		t.Fatalf("a 2-page layout decided a 1-page claim: %+v", gv.Verdict)
	}
}
