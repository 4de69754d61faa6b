package dimacs

import (
	"bytes"
	"strings"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// solveResult is cadical's answer for one CNF.
type solveResult struct {
	status string
	model  []bool
}

// cadical solves the CNF with Debian's cadical and returns its answer.
func cadical(t testing.TB, c *CNF) solveResult {
	t.Helper()
	var buf bytes.Buffer
	if _, err := c.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	out := fixture.Cadical(t, buf.Bytes(), false).Stdout
	status, model, rerr := ReadModel(bytes.NewReader(out), "cadical")
	if rerr != nil {
		t.Fatalf("reading cadical output: %v", rerr)
	}
	if len(model) < c.Vars+1 {
		model = append(model, make([]bool, c.Vars+1-len(model))...)
	}
	return solveResult{status, model}
}

// batchSAT conjoins the formulas over disjoint variables (renumbered by
// offsets); the conjunction is satisfiable iff every formula is, and a model
// of it restricts to a model of each. One solver call then answers them all.
func batchSAT(t testing.TB, fs []*CNF) ([][]bool, bool) {
	big := &CNF{}
	offs := make([]int, len(fs))
	for i, f := range fs {
		offs[i] = big.Vars
		for _, cl := range f.Clauses {
			nc := make([]int32, len(cl))
			for j, l := range cl {
				if l > 0 {
					nc[j] = l + int32(offs[i])
				} else {
					nc[j] = l - int32(offs[i])
				}
			}
			big.Clauses = append(big.Clauses, nc)
		}
		big.Vars += f.Vars
	}
	r := cadical(t, big)
	if r.status != StatusSat {
		return nil, false
	}
	models := make([][]bool, len(fs))
	for i, f := range fs {
		m := make([]bool, f.Vars+1)
		copy(m[1:], r.model[offs[i]+1:offs[i]+1+f.Vars])
		models[i] = m
	}
	return models, true
}

// batchUNSAT builds the disjunction of the formulas with one selector per
// formula: selector s_i is added negated to every clause of formula i and
// one clause asks for some selector. The result is unsatisfiable iff every
// formula is; when it is satisfiable, the true selector names a satisfiable
// formula (returned, else -1).
func batchUNSAT(t testing.TB, fs []*CNF) int {
	big := &CNF{Vars: len(fs)}
	sel := make([]int32, len(fs))
	for i := range fs {
		sel[i] = int32(i + 1)
	}
	big.Clauses = append(big.Clauses, sel)
	for i, f := range fs {
		off := int32(big.Vars)
		for _, cl := range f.Clauses {
			nc := make([]int32, 0, len(cl)+1)
			nc = append(nc, -sel[i])
			for _, l := range cl {
				if l > 0 {
					nc = append(nc, l+off)
				} else {
					nc = append(nc, l-off)
				}
			}
			big.Clauses = append(big.Clauses, nc)
		}
		big.Vars += f.Vars
	}
	r := cadical(t, big)
	if r.status == StatusUnsat {
		return -1
	}
	for i := range fs {
		if r.model[i+1] {
			return i
		}
	}
	return 0
}

// crossing and nesting by the definitions (positions of the ends).
func crosses(a, b, c, d int) bool {
	if a > b {
		a, b = b, a
	}
	if c > d {
		c, d = d, c
	}
	return (a < c && c < b && b < d) || (c < a && a < d && d < b)
}

func nests(a, b, c, d int) bool {
	if a > b {
		a, b = b, a
	}
	if c > d {
		c, d = d, c
	}
	return (a < c && d < b) || (c < a && b < d)
}

// bruteNumber returns the least k such that some spine order of g admits a
// k-colouring of the edges with no conflict (crossing for stack, nesting for
// queue) inside a colour: the page number or queue number by definition,
// computed over all n! spine orders.
func bruteNumber(g *graph.Graph, kind cert.Kind) int {
	n, m := g.N(), g.M()
	if m == 0 {
		return 0
	}
	if m > 63 {
		panic("bruteNumber: too many edges")
	}
	edges := g.Edges()
	perm := make([]int, n)
	for i := range perm {
		perm[i] = i
	}
	pos := make([]int, n)
	best := m
	conflict := make([][]bool, m)
	for i := range conflict {
		conflict[i] = make([]bool, m)
	}
	side := make([]int, m)
	queue := make([]int, 0, m)
	// bipartite reports whether the conflict graph is 2-colourable (BFS).
	bipartite := func() bool {
		for i := range side {
			side[i] = -1
		}
		for s := 0; s < m; s++ {
			if side[s] >= 0 {
				continue
			}
			side[s] = 0
			queue = append(queue[:0], s)
			for len(queue) > 0 {
				x := queue[0]
				queue = queue[1:]
				for y := 0; y < m; y++ {
					if !conflict[x][y] {
						continue
					}
					if side[y] < 0 {
						side[y] = 1 - side[x]
						queue = append(queue, y)
					} else if side[y] == side[x] {
						return false
					}
				}
			}
		}
		return true
	}
	adj := make([]uint64, m)
	class := make([]uint64, m)
	// colourable tries to colour the uncoloured edges (mask left) with k
	// colours, always branching on the edge with the most distinct colours
	// around it (DSATUR order).
	var colourable func(left uint64, used, k int) bool
	colourable = func(left uint64, used, k int) bool {
		if left == 0 {
			return true
		}
		pick, bestSat := -1, -1
		for x := 0; x < m; x++ {
			if left&(1<<x) == 0 {
				continue
			}
			sat := 0
			for c := 0; c < used; c++ {
				if adj[x]&class[c] != 0 {
					sat++
				}
			}
			if sat > bestSat {
				pick, bestSat = x, sat
			}
		}
		if bestSat >= k {
			return false
		}
		for c := 0; c < min(used+1, k); c++ {
			if adj[pick]&class[c] != 0 {
				continue
			}
			class[c] |= 1 << pick
			nu := used
			if c == used {
				nu++
			}
			if colourable(left&^(1<<pick), nu, k) {
				class[c] &^= 1 << pick
				return true
			}
			class[c] &^= 1 << pick
		}
		return false
	}
	fits := func(k int) bool {
		switch k {
		case 1:
			for x := 0; x < m; x++ {
				for y := x + 1; y < m; y++ {
					if conflict[x][y] {
						return false
					}
				}
			}
			return true
		case 2:
			return bipartite()
		}
		for x := 0; x < m; x++ {
			adj[x] = 0
			for y := 0; y < m; y++ {
				if conflict[x][y] {
					adj[x] |= 1 << y
				}
			}
		}
		clear(class)
		return colourable(1<<m-1, 0, k)
	}
	var rec func(i int) bool
	rec = func(i int) bool {
		if i == n {
			for v, p := range perm {
				pos[p] = v
			}
			for x := 0; x < m; x++ {
				for y := 0; y < m; y++ {
					ex, ey := edges[x], edges[y]
					a, b, c, d := pos[ex.U], pos[ex.V], pos[ey.U], pos[ey.V]
					if kind == cert.Stack {
						conflict[x][y] = crosses(a, b, c, d)
					} else {
						conflict[x][y] = nests(a, b, c, d)
					}
				}
			}
			for best > 1 && fits(best-1) {
				best--
			}
			return best == 1
		}
		for j := i; j < n; j++ {
			perm[i], perm[j] = perm[j], perm[i]
			if rec(i + 1) {
				return true
			}
			perm[i], perm[j] = perm[j], perm[i]
		}
		return false
	}
	rec(0)
	return best
}

func optName(o Options) string {
	d, _ := o.Describe()
	return strings.ReplaceAll(d, " ", "_")
}
