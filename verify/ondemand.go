package verify

import (
	"context"
	"fmt"
	"slices"
	"time"

	"github.com/go-air/gini"
	"github.com/go-air/gini/z"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
)

// RefineOptions controls Refine.
type RefineOptions struct {
	// Limit bounds the whole loop (0: none).
	Limit time.Duration
	// Ref is a spine order that order variables not yet in the sub-formula
	// follow when a model is decoded, for example the order of a layout found
	// by a heuristic; nil means vertex order. It only steers the search.
	Ref []int32
	// MaxConflicts bounds the conflict clauses added in one round (0: 2m+1000).
	MaxConflicts int
	// MaxTriples bounds the transitivity clauses added in one round (0: 4n+1000).
	MaxTriples int
	// Progress, when not nil, is called after every round.
	Progress func(RefineRound)
}

// RefineRound says what one round of Refine did.
type RefineRound struct {
	Round     int
	Clauses   int // clauses of the sub-formula after the round
	Vars      int
	Triples   int // transitivity clauses added
	Conflicts int // crossing or nesting clauses added
	Elapsed   time.Duration
}

// Refinement is the outcome of Refine: a layout, a sub-formula that gini
// found unsatisfiable, or neither when it stopped early.
type Refinement struct {
	// Layout passed cert.Validate: the graph has a layout of the claim's kind
	// on the claim's pages.
	Layout *cert.Layout
	// Sub is the sub-formula of the on-demand formulation at the end. When
	// Unsat is set, gini found it unsatisfiable; that is a claim to be
	// checked (two solvers and a proof, on Sub's CNF, plus membership).
	Sub    *dimacs.Sub
	Unsat  bool
	Rounds int
	// Stopped says why the loop ended without an answer ("" otherwise).
	Stopped string
	Elapsed time.Duration
}

// Refine decides the claim of f by counterexample-guided generation of its
// clauses: it solves a part of f with the incremental in-process solver
// gini, decodes the model into a layout, checks that layout directly, and
// when the check fails adds clauses of f that the model violates — the
// transitivity clauses of 3-cycles in the decoded order, the crossing or
// nesting clauses of conflicting edges on a page — and repeats. Every round
// adds a clause of f that the current assignment violates, so the loop ends:
// with a layout that passed cert.Validate, or with a sub-formula F′ ⊆ f that
// gini found unsatisfiable. Nothing here is trusted: a layout is checked
// directly, and F′ must still be refuted by independent solvers with a
// checked proof and its membership in f checked (dimacs.CheckMembership).
func Refine(ctx context.Context, f *dimacs.OnDemand, opt RefineOptions) (*Refinement, error) {
	start := time.Now()
	g := f.Graph()
	n, m := int32(g.N()), int32(g.M())
	if opt.MaxConflicts <= 0 {
		opt.MaxConflicts = int(2*m) + 1000
	}
	if opt.MaxTriples <= 0 {
		opt.MaxTriples = int(4*n) + 1000
	}
	r := &refiner{f: f, s: gini.New(), index: map[dimacs.VarName]int32{}, seen: map[string]bool{}, n: n, m: m}
	r.ref = make([]int32, n)
	for i := range r.ref {
		r.ref[i] = int32(i)
	}
	if opt.Ref != nil && len(opt.Ref) == int(n) {
		copy(r.ref, opt.Ref)
	}
	for e := int32(0); e < m; e++ {
		for _, c := range f.PageClause(e) {
			r.add(c)
		}
	}
	rctx, cancel := withLimit(ctx, opt.Limit)
	defer cancel()
	res := &Refinement{}
	for {
		res.Rounds++
		out := r.solve(rctx)
		switch out {
		case 0:
			res.Stopped = stopReason(rctx, opt.Limit)
			res.Sub, res.Elapsed = r.sub(), time.Since(start)
			return res, nil
		case -1:
			res.Sub, res.Unsat, res.Elapsed = r.sub(), true, time.Since(start)
			return res, nil
		}
		l, triples, conflicts := r.refine(opt)
		if l != nil {
			res.Layout, res.Elapsed = l, time.Since(start)
			return res, nil
		}
		if opt.Progress != nil {
			opt.Progress(RefineRound{Round: res.Rounds, Clauses: len(r.clauses), Vars: len(r.names), Triples: triples, Conflicts: conflicts, Elapsed: time.Since(start)})
		}
		if triples+conflicts == 0 {
			return nil, fmt.Errorf("verify: on-demand round %d found the layout invalid but no violated clause (a bug)", res.Rounds)
		}
	}
}

type refiner struct {
	f       *dimacs.OnDemand
	s       *gini.Gini
	index   map[dimacs.VarName]int32
	names   []dimacs.VarName
	clauses [][]int32
	seen    map[string]bool
	n, m    int32
	ref     []int32 // current reference spine
	before  []bool  // before[u*n+v]: u precedes v in the current assignment
}

// lit returns the sub-formula's literal for l, creating the variable.
func (r *refiner) lit(l dimacs.NamedLit) int32 {
	x, ok := r.index[l.Var]
	if !ok {
		r.names = append(r.names, l.Var)
		x = int32(len(r.names))
		r.index[l.Var] = x
	}
	if l.Neg {
		return -x
	}
	return x
}

// add adds a clause of f to the sub-formula and to the solver, once.
func (r *refiner) add(c []dimacs.NamedLit) bool {
	key := clauseKey(c)
	if r.seen[key] {
		return false
	}
	r.seen[key] = true
	out := make([]int32, len(c))
	for i, l := range c {
		out[i] = r.lit(l)
		r.s.Add(z.Dimacs2Lit(int(out[i])))
	}
	r.s.Add(z.LitNull)
	r.clauses = append(r.clauses, out)
	return true
}

func (r *refiner) sub() *dimacs.Sub {
	return &dimacs.Sub{Vars: slices.Clone(r.names), CNF: &dimacs.CNF{Vars: len(r.names), Clauses: r.clauses}}
}

// solve runs gini until it answers or ctx ends: 1 sat, -1 unsat, 0 stopped.
func (r *refiner) solve(ctx context.Context) int {
	run := r.s.GoSolve()
	tick := time.NewTicker(pollEvery)
	defer tick.Stop()
	for {
		select {
		case <-ctx.Done():
			return run.Stop()
		case <-tick.C:
			if out, done := run.Test(); done {
				return out
			}
		}
	}
}

// value is the model's value of a variable known to the sub-formula.
func (r *refiner) value(v dimacs.VarName) (bool, bool) {
	x, ok := r.index[v]
	if !ok {
		return false, false
	}
	return r.s.Value(z.Var(x).Pos()), true
}

// refine decodes the model; it returns the layout when it passes the direct
// check, else adds violated clauses and says how many of each kind.
func (r *refiner) refine(opt RefineOptions) (*cert.Layout, int, int) {
	f, n, m := r.f, r.n, r.m
	// The assignment: the model where it speaks, the fixed values, and the
	// reference order elsewhere.
	pos := make([]int32, n)
	for i, v := range r.ref {
		pos[v] = int32(i)
	}
	if len(r.before) != int(n*n) {
		r.before = make([]bool, n*n)
	}
	wins := make([]int32, n)
	for u := int32(0); u < n; u++ {
		for v := u + 1; v < n; v++ {
			b := r.orderValue(u, v, pos)
			r.before[u*n+v], r.before[v*n+u] = b, !b
			if b {
				wins[u]++
			} else {
				wins[v]++
			}
		}
	}
	kinds := f.PageKinds()
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
	}
	slices.SortStableFunc(order, func(a, b int32) int { return int(wins[b] - wins[a]) })
	l := &cert.Layout{Kind: f.Options().Kind, PageKinds: slices.Clone(kinds), Order: order, Page: make([]int32, m)}
	for e := int32(0); e < m; e++ {
		l.Page[e] = 1
		for p := int32(1); p <= int32(len(kinds)); p++ {
			if val, ok := r.value(dimacs.VarName{Kind: dimacs.PageVar, A: e, B: p}); ok && val {
				l.Page[e] = p
				break
			}
		}
	}
	if cert.Validate(f.Graph(), l).OK() {
		return l, 0, 0
	}
	truth := func(lt dimacs.NamedLit) bool {
		var val bool
		if lt.Var.Kind == dimacs.OrderVar {
			val = r.before[lt.Var.A*n+lt.Var.B]
		} else {
			val, _ = r.value(lt.Var)
		}
		return val != lt.Neg
	}
	violated := func(c []dimacs.NamedLit) bool {
		for _, lt := range c {
			if truth(lt) {
				return false
			}
		}
		return true
	}
	at := make([]int32, n)
	for i, v := range order {
		at[v] = int32(i)
	}
	// Transitivity: an arc u→v against the order has wins[u] <= wins[v], so
	// some w with v→w and w→u closes a 3-cycle (v beats at least as many
	// vertices as u; if u beat all of them it would beat more than v).
	triples := 0
	for i := int32(0); i < n && triples < opt.MaxTriples; i++ {
		v := order[i]
		for j := i + 1; j < n && triples < opt.MaxTriples; j++ {
			u := order[j]
			if !r.before[u*n+v] {
				continue
			}
			for w := int32(0); w < n; w++ {
				if w != u && w != v && r.before[v*n+w] && r.before[w*n+u] {
					t := [3]int32{u, v, w}
					slices.Sort(t[:])
					for _, c := range f.TripleClauses(t[0], t[1], t[2]) {
						if violated(c) && r.add(c) {
							triples++
						}
					}
					break
				}
			}
		}
	}
	// Conflicts: pairs of edges that cross (stack) or nest (queue) on a page
	// in the decoded order, with the clause of the order they are in.
	conflicts := 0
	edges := f.Graph().Edges()
	lo := func(e int32) int32 { return min(at[edges[e].U], at[edges[e].V]) }
	hi := func(e int32) int32 { return max(at[edges[e].U], at[edges[e].V]) }
	for p := int32(1); p <= int32(len(kinds)) && conflicts < opt.MaxConflicts; p++ {
		var onPage []int32
		for e := range edges {
			if l.Page[e] == p {
				onPage = append(onPage, int32(e))
			}
		}
		slices.SortFunc(onPage, func(a, b int32) int { return int(lo(a) - lo(b)) })
		queue := kinds[p-1] == cert.Queue
		for i := 0; i < len(onPage) && conflicts < opt.MaxConflicts; i++ {
			e := onPage[i]
			for j := i + 1; j < len(onPage) && lo(onPage[j]) < hi(e) && conflicts < opt.MaxConflicts; j++ {
				fe := onPage[j]
				if lo(fe) == lo(e) || hi(fe) == hi(e) || lo(fe) == hi(e) {
					continue // a common end
				}
				if queue != (hi(fe) < hi(e)) {
					continue // stack: fe must end outside e; queue: inside
				}
				// The whole group, and the transitivity of the four ends,
				// so that the pair's order is decided locally at once.
				a, b := min(e, fe), max(e, fe)
				for _, c := range f.ConflictClauses(a, b, p) {
					if r.add(c) {
						conflicts++
					}
				}
				q := [4]int32{edges[a].U, edges[a].V, edges[b].U, edges[b].V}
				slices.Sort(q[:])
				for _, t := range [4][3]int{{0, 1, 2}, {0, 1, 3}, {0, 2, 3}, {1, 2, 3}} {
					for _, c := range f.TripleClauses(q[t[0]], q[t[1]], q[t[2]]) {
						if r.add(c) {
							triples++
						}
					}
				}
			}
		}
	}
	r.ref = order
	return nil, triples, conflicts
}

// orderValue is "u before v" (u < v) in the current assignment.
func (r *refiner) orderValue(u, v int32, pos []int32) bool {
	name := dimacs.VarName{Kind: dimacs.OrderVar, A: u, B: v}
	if x, ok := r.index[name]; ok {
		return r.s.Value(z.Var(x).Pos())
	}
	if val, ok := r.f.Fixed(name); ok {
		return val
	}
	return pos[u] < pos[v]
}

// clauseKey is a compact identity of a clause of f.
func clauseKey(c []dimacs.NamedLit) string {
	b := make([]byte, 0, 10*len(c))
	for _, l := range c {
		neg := byte(0)
		if l.Neg {
			neg = 1
		}
		b = append(b, byte(l.Var.Kind), neg, byte(l.Var.A), byte(l.Var.A>>8), byte(l.Var.A>>16), byte(l.Var.A>>24),
			byte(l.Var.B), byte(l.Var.B>>8), byte(l.Var.B>>16), byte(l.Var.B>>24))
	}
	return string(b)
}
