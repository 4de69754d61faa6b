package dimacs

import (
	"fmt"
	"slices"
	"strings"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// OnDemandVersion names the on-demand formulation (see the package
// documentation, "The on-demand formulation"). It changes whenever the
// clauses of the formulation for some graph and options change.
const OnDemandVersion = "spinecert-od-1"

// VarKind tells what a variable of the on-demand formulation stands for.
type VarKind uint8

const (
	// OrderVar is o(A, B), A < B: vertex A lies before vertex B on the spine.
	OrderVar VarKind = 'o'
	// PageVar is φ(A, B): edge A (0-based, in graph order) is on page B (1-based).
	PageVar VarKind = 'p'
)

// VarName is a variable of the on-demand formulation, named by what it
// stands for rather than by a number.
type VarName struct {
	Kind VarKind
	A, B int32
}

func (v VarName) String() string {
	if v.Kind == OrderVar {
		return fmt.Sprintf("order %d %d", v.A, v.B)
	}
	return fmt.Sprintf("page %d %d", v.A, v.B)
}

// NamedLit is a literal of the on-demand formulation: a variable and a sign.
type NamedLit struct {
	Var VarName
	Neg bool
}

// OnDemand is the on-demand formulation of one claim: every clause of the
// full formula F is available by its group (a triple of vertices, an edge,
// or a pair of edges on a page) without F ever being materialised.
type OnDemand struct {
	g     *graph.Graph
	opt   Options
	kinds []cert.Kind
	// rank[p-1] is page p's rank among the pages of its kind (page symmetry).
	rank       []int32
	rotation   bool // vertex 0 first
	reflectU   int32
	reflectV   int32 // o(reflectU, reflectV) fixed true; reflectU < 0: none
	pageSymOff bool
}

// NewOnDemand returns the on-demand formulation of "g has a layout of the
// kind and page count in opt". Of the reduction toggles it honours
// NoRotation, NoReflection and NoPageSymmetry; the others (blocks, leaves,
// twins, ...) belong to the default formulation and must be left unset.
func NewOnDemand(g *graph.Graph, opt Options) (*OnDemand, error) {
	kinds, err := opt.normalize()
	if err != nil {
		return nil, err
	}
	if opt.Baseline || opt.NoBlocks || opt.NoLeaves || opt.NoIsolated || opt.NoBetweenness || opt.NoDirect || opt.NoTwins {
		return nil, fmt.Errorf("dimacs: the on-demand formulation takes only no-rotation, no-reflection and no-page-symmetry")
	}
	if opt.Kind != cert.Mixed {
		opt.PageKinds = nil
	}
	f := &OnDemand{g: g, opt: opt, kinds: kinds, rank: make([]int32, len(kinds)), reflectU: -1, pageSymOff: opt.NoPageSymmetry}
	seen := map[cert.Kind]int32{}
	for i, k := range kinds {
		f.rank[i] = seen[k]
		seen[k]++
	}
	n := int32(g.N())
	f.rotation = allStack(kinds) && !opt.NoRotation && n > 0
	if !opt.NoReflection {
		switch {
		case f.rotation && n >= 3:
			f.reflectU, f.reflectV = 1, 2
		case !f.rotation && n >= 2:
			f.reflectU, f.reflectV = 0, 1
		}
	}
	return f, nil
}

// Graph returns the graph of the claim.
func (f *OnDemand) Graph() *graph.Graph { return f.g }

// Options returns the options of the claim.
func (f *OnDemand) Options() Options { return f.opt }

// PageKinds returns the kind of every page.
func (f *OnDemand) PageKinds() []cert.Kind { return f.kinds }

// Describe is the one-line description written in CNF headers.
func (f *OnDemand) Describe() string {
	var r []string
	if f.rotation {
		r = append(r, "rotation")
	}
	if f.reflectU >= 0 {
		r = append(r, "reflection")
	}
	if !f.pageSymOff {
		r = append(r, "page-symmetry")
	}
	if len(r) == 0 {
		r = []string{"none"}
	}
	d := fmt.Sprintf("%s pages=%d", f.opt.Kind, len(f.kinds))
	if f.opt.Kind == cert.Mixed {
		names := make([]string, len(f.kinds))
		for i, k := range f.kinds {
			names[i] = k.String()
		}
		d += " page-kinds=" + strings.Join(names, ",")
	}
	return d + " formulation=on-demand reductions=" + strings.Join(r, ",")
}

// Fixed reports whether symmetry breaking fixes v, and to what: such a
// variable appears in no clause of the formulation, its value substituted.
func (f *OnDemand) Fixed(v VarName) (value, ok bool) { return f.fixed(v) }

// fixed reports whether symmetry breaking fixes v, and to what.
func (f *OnDemand) fixed(v VarName) (value, ok bool) {
	switch v.Kind {
	case OrderVar:
		if f.rotation && v.A == 0 {
			return true, true
		}
		if v.A == f.reflectU && v.B == f.reflectV {
			return true, true
		}
	case PageVar:
		if !f.pageSymOff && f.rank[v.B-1] > v.A {
			return false, true // edge A may use only the first A+1 pages of each kind
		}
	}
	return false, false
}

// before returns the literal "x before y" for distinct vertices.
func before(x, y int32) NamedLit {
	if x < y {
		return NamedLit{Var: VarName{OrderVar, x, y}}
	}
	return NamedLit{Var: VarName{OrderVar, y, x}, Neg: true}
}

func (l NamedLit) not() NamedLit { return NamedLit{Var: l.Var, Neg: !l.Neg} }

// emit substitutes the fixed variables into the clause lits and appends the
// result to out, unless a fixed literal satisfies it.
func (f *OnDemand) emit(out [][]NamedLit, lits ...NamedLit) [][]NamedLit {
	c := make([]NamedLit, 0, len(lits))
	for _, l := range lits {
		if val, ok := f.fixed(l.Var); ok {
			if val != l.Neg {
				return out // the literal is true: the clause is satisfied
			}
			continue // the literal is false: drop it
		}
		c = append(c, l)
	}
	return append(out, sortLits(c))
}

// sortLits puts a clause's literals in a canonical order.
func sortLits(c []NamedLit) []NamedLit {
	slices.SortFunc(c, cmpLit)
	return c
}

func cmpLit(a, b NamedLit) int {
	switch {
	case a.Var.Kind != b.Var.Kind:
		return int(a.Var.Kind) - int(b.Var.Kind)
	case a.Var.A != b.Var.A:
		return int(a.Var.A - b.Var.A)
	case a.Var.B != b.Var.B:
		return int(a.Var.B - b.Var.B)
	case a.Neg != b.Neg:
		if a.Neg {
			return 1
		}
		return -1
	}
	return 0
}

// TripleClauses returns the transitivity clauses of the vertices u < v < w:
// the two cyclic orientations are forbidden.
func (f *OnDemand) TripleClauses(u, v, w int32) [][]NamedLit {
	uv, vw, uw := before(u, v), before(v, w), before(u, w)
	out := f.emit(nil, uv.not(), vw.not(), uw)
	return f.emit(out, uv, vw, uw.not())
}

// PageClause returns the clause "edge e is on one of the pages it may use".
func (f *OnDemand) PageClause(e int32) [][]NamedLit {
	lits := make([]NamedLit, 0, len(f.kinds))
	for p := range f.kinds {
		lits = append(lits, NamedLit{Var: VarName{PageVar, e, int32(p + 1)}})
	}
	return f.emit(nil, lits...)
}

// Stack crossing and queue nesting patterns of two disjoint edges (a, b) and
// (c, d): the spine orders of the four ends, as indices into [a b c d], in
// which they cross (stack) or nest (queue).
var (
	crossOrders = [8][4]int{{0, 2, 1, 3}, {0, 3, 1, 2}, {1, 2, 0, 3}, {1, 3, 0, 2}, {2, 0, 3, 1}, {2, 1, 3, 0}, {3, 0, 2, 1}, {3, 1, 2, 0}}
	nestOrders  = [8][4]int{{0, 2, 3, 1}, {0, 3, 2, 1}, {1, 2, 3, 0}, {1, 3, 2, 0}, {2, 0, 1, 3}, {2, 1, 0, 3}, {3, 0, 1, 2}, {3, 1, 0, 2}}
)

// ConflictClauses returns the clauses forbidding edges e < f on page p in
// the orders where they cross (stack page) or nest (queue page): for each
// such order x1 x2 x3 x4 of their ends, ¬φ(e,p) ∨ ¬φ(f,p) ∨ ¬[x1<x2] ∨
// ¬[x2<x3] ∨ ¬[x3<x4]. Edges with a common end give none.
func (f *OnDemand) ConflictClauses(e, fe, p int32) [][]NamedLit {
	edges := f.g.Edges()
	ea, eb := edges[e], edges[fe]
	if ea.U == eb.U || ea.U == eb.V || ea.V == eb.U || ea.V == eb.V {
		return nil
	}
	ends := [4]int32{ea.U, ea.V, eb.U, eb.V}
	orders := &crossOrders
	if f.kinds[p-1] == cert.Queue {
		orders = &nestOrders
	}
	pe := NamedLit{Var: VarName{PageVar, e, p}, Neg: true}
	pf := NamedLit{Var: VarName{PageVar, fe, p}, Neg: true}
	var out [][]NamedLit
	for _, o := range orders {
		x := [4]int32{ends[o[0]], ends[o[1]], ends[o[2]], ends[o[3]]}
		out = f.emit(out, pe, pf, before(x[0], x[1]).not(), before(x[1], x[2]).not(), before(x[2], x[3]).not())
	}
	return out
}

// Full returns every clause of the formulation, in named literals: all
// triples, all edges, all pairs of edges on all pages. It is for small
// graphs (the tests' cross-checks); its size grows as n³ + m²·k.
func (f *OnDemand) Full() [][]NamedLit {
	n, m, k := int32(f.g.N()), int32(f.g.M()), int32(len(f.kinds))
	var out [][]NamedLit
	for u := int32(0); u < n; u++ {
		for v := u + 1; v < n; v++ {
			for w := v + 1; w < n; w++ {
				out = append(out, f.TripleClauses(u, v, w)...)
			}
		}
	}
	for e := int32(0); e < m; e++ {
		out = append(out, f.PageClause(e)...)
	}
	for e := int32(0); e < m; e++ {
		for fe := e + 1; fe < m; fe++ {
			for p := int32(1); p <= k; p++ {
				out = append(out, f.ConflictClauses(e, fe, p)...)
			}
		}
	}
	return out
}

// FullSize returns the number of clauses of the full formula without
// building it: the triples by counting, the pairs of edges by evaluating
// each group's substitution (time O(m²·k), no memory beyond the graph).
func (f *OnDemand) FullSize() int64 {
	n := int64(f.g.N())
	c3 := func(x int64) int64 {
		if x < 3 {
			return 0
		}
		return x * (x - 1) * (x - 2) / 6
	}
	var total int64
	if f.rotation {
		// Every triple with vertex 0 is satisfied by o(0, ·) = true.
		total = 2 * c3(n-1)
	} else {
		total = 2 * c3(n)
	}
	if f.reflectU >= 0 {
		// The triples holding the fixed pair keep one clause of two.
		if f.rotation {
			total -= max(n-3, 0)
		} else {
			total -= max(n-2, 0)
		}
	}
	m, k := int32(f.g.M()), int32(len(f.kinds))
	total += int64(m)
	edges := f.g.Edges()
	for e := int32(0); e < m; e++ {
		for fe := e + 1; fe < m; fe++ {
			a, b := edges[e], edges[fe]
			if a.U == b.U || a.U == b.V || a.V == b.U || a.V == b.V {
				continue
			}
			for p := int32(1); p <= k; p++ {
				total += int64(f.countConflict(e, fe, p))
			}
		}
	}
	return total
}

// countConflict is len(ConflictClauses(e, fe, p)) without allocating.
func (f *OnDemand) countConflict(e, fe, p int32) int {
	for _, x := range [2]int32{e, fe} {
		if v, ok := f.fixed(VarName{PageVar, x, p}); ok && !v {
			return 0
		}
	}
	edges := f.g.Edges()
	ends := [4]int32{edges[e].U, edges[e].V, edges[fe].U, edges[fe].V}
	orders := &crossOrders
	if f.kinds[p-1] == cert.Queue {
		orders = &nestOrders
	}
	count := 0
	for _, o := range orders {
		kept := true
		for i := 0; i < 3; i++ {
			l := before(ends[o[i]], ends[o[i+1]]).not()
			if val, ok := f.fixed(l.Var); ok && val != l.Neg {
				kept = false
				break
			}
		}
		if kept {
			count++
		}
	}
	return count
}

// SubOf numbers the variables of the clauses in order of first use and
// returns them as a sub-formula with its CNF.
func SubOf(clauses [][]NamedLit) *Sub {
	index := map[VarName]int32{}
	s := &Sub{CNF: &CNF{}}
	for _, c := range clauses {
		out := make([]int32, len(c))
		for i, l := range c {
			x, ok := index[l.Var]
			if !ok {
				s.Vars = append(s.Vars, l.Var)
				x = int32(len(s.Vars))
				index[l.Var] = x
			}
			if l.Neg {
				x = -x
			}
			out[i] = x
		}
		s.CNF.Clauses = append(s.CNF.Clauses, out)
	}
	s.CNF.Vars = len(s.Vars)
	return s
}

// Decode turns an assignment into a layout of the graph. value gives the
// value of a variable and whether it is known; fixed variables take their
// fixed value, and an order variable that is neither known nor fixed
// follows ref (a spine order; nil means vertex order). The spine sorts the
// vertices by how many others they precede, which is the order itself when
// the order variables are transitive; each edge goes on its first page whose
// variable is true (page 1 when none is). The layout is not checked here.
func (f *OnDemand) Decode(value func(VarName) (val, known bool), ref []int32) *cert.Layout {
	n, m := int32(f.g.N()), int32(f.g.M())
	pos := make([]int32, n)
	for i := range pos {
		pos[i] = int32(i)
	}
	for i, v := range ref {
		pos[v] = int32(i)
	}
	get := func(v VarName) bool {
		if val, ok := f.fixed(v); ok {
			return val
		}
		if val, ok := value(v); ok {
			return val
		}
		if v.Kind == OrderVar {
			return pos[v.A] < pos[v.B]
		}
		return false
	}
	wins := make([]int32, n)
	for u := int32(0); u < n; u++ {
		for v := u + 1; v < n; v++ {
			if get(VarName{OrderVar, u, v}) {
				wins[u]++
			} else {
				wins[v]++
			}
		}
	}
	order := make([]int32, n)
	for i := range order {
		order[i] = int32(i)
	}
	slices.SortStableFunc(order, func(a, b int32) int { return int(wins[b] - wins[a]) })
	l := &cert.Layout{Kind: f.opt.Kind, PageKinds: slices.Clone(f.kinds), Order: order, Page: make([]int32, m)}
	for e := int32(0); e < m; e++ {
		l.Page[e] = 1
		for p := int32(1); p <= int32(len(f.kinds)); p++ {
			if get(VarName{PageVar, e, p}) {
				l.Page[e] = p
				break
			}
		}
	}
	return l
}
