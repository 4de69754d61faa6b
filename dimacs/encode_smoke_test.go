package dimacs

import (
	"testing"

	"quire/cert"
)

func TestSmoke(t *testing.T) {
	for _, base := range []bool{false, true} {
		for n := 3; n <= 7; n++ {
			g := completeGraph(n)
			want := (n + 1) / 2
			for _, k := range []int{want - 1, want} {
				e, err := Encode(g, Options{Kind: cert.Stack, Pages: k, Baseline: base})
				if err != nil {
					t.Fatal(err)
				}
				r := cadical(t, e.CNF())
				t.Logf("K%d k=%d base=%v %s %+v", n, k, base, r.status, e.Stats().Clauses)
				if r.status == StatusSat {
					if _, err := e.Decode(r.model); err != nil {
						t.Error(err)
					}
				}
			}
		}
	}
}
