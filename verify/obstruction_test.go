package verify

import (
	"context"
	"math/rand/v2"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// TestFindObstruction: on K5 with a long path attached (bt(K5) = 3,
// Bernhart and Kainen 1979) and on the Kleetope of a stacked triangulation
// (maximal planar, not Hamiltonian, so more than 2 pages: REFERENCES, with
// Chvátal 1973) the search returns a subgraph whose 2-page claim cadical
// refutes; on a grid (2 pages suffice, REFERENCES) it returns nothing.
func TestFindObstruction(t *testing.T) {
	cad := cadicalForTest(t)
	var path [][2]int
	path = append(path, fixture.EdgePairs(fixture.Complete(5))...)
	for v := 4; v < 60; v++ {
		path = append(path, [2]int{v, v + 1})
	}
	kleetope := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(3, 4)), 40, 0).Kleetope()
	opt := dimacs.Options{Kind: cert.Stack, Pages: 2}
	for _, c := range []struct {
		name string
		g    *graph.Graph
		want bool
	}{
		{"K5 and a path", fixture.Numbered(61, path), true},
		{"Kleetope", kleetope, true},
		{"grid", fixture.Grid(8, 8), false},
	} {
		ob, err := FindObstruction(context.Background(), c.g, opt, ObstructionOptions{Oracle: cad})
		if err != nil {
			t.Fatal(err)
		}
		if (ob != nil) != c.want {
			t.Fatalf("%s: found %v, want %v", c.name, ob != nil, c.want)
		}
		if ob == nil {
			continue
		}
		if err := graph.CheckSubgraph(ob.Graph, c.g); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if ob.Graph.N() >= c.g.N() {
			t.Errorf("%s: the obstruction is the whole graph (%d vertices)", c.name, ob.Graph.N())
		}
		e, err := dimacs.Encode(ob.Graph, opt)
		if err != nil {
			t.Fatal(err)
		}
		if r, err := cad.Solve(context.Background(), e.CNF(), 0, ""); err != nil || r.Answer != Unsat {
			t.Fatalf("%s: the obstruction's claim is %v (%v)", c.name, r.Answer, err)
		}
		t.Logf("%s: %d of %d vertices, %d oracle calls", c.name, ob.Graph.N(), c.g.N(), ob.Calls)
	}
}

// TestDecideLayoutOnSubgraph: with the search on, a refutation of the
// Kleetope rests on a subgraph, and the verdict says so.
func TestDecideLayoutOnSubgraph(t *testing.T) {
	g := fixture.RandomFlippedTriangulation(rand.New(rand.NewPCG(5, 6)), 40, 0).Kleetope()
	gv, err := DecideLayout(context.Background(), g, GraphOptions{Encoding: dimacs.Options{Kind: cert.Stack, Pages: 2},
		Solvers: []Solver{gophersatForTest(t), Gini{}}, Obstruction: &ObstructionOptions{Oracle: Gini{}}})
	if err != nil {
		t.Fatal(err)
	}
	if gv.Verdict.Outcome != Unsatisfiable || gv.Subgraph == nil || gv.Subgraph.Vertices >= g.N() {
		t.Fatalf("verdict %+v, subgraph %+v", gv.Verdict, gv.Subgraph)
	}
	if err := graph.CheckSubgraph(gv.Subgraph.Graph, g); err != nil {
		t.Fatal(err)
	}
}
