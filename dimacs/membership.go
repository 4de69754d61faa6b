package dimacs

import (
	"fmt"
	"slices"
)

// Sub is a sub-formula F′ of the on-demand formulation F of one claim, as it
// is stored: a CNF over variables 1..len(Vars) and, for every variable, the
// variable of F it stands for (Vars[i] names variable i+1).
type Sub struct {
	Vars []VarName
	CNF  *CNF
}

// MembershipError lists clauses of a sub-formula that are not clauses of F.
type MembershipError struct {
	Problems []string // at most maxMembershipProblems, each naming a clause
	Total    int      // how many were found
}

const maxMembershipProblems = 20

func (e *MembershipError) Error() string {
	s := fmt.Sprintf("%v: %s", ErrNotMember, e.Problems[0])
	if e.Total > 1 {
		s += fmt.Sprintf(" (and %d more)", e.Total-1)
	}
	return s
}

func (e *MembershipError) Unwrap() error { return ErrNotMember }

// CheckMembership checks that every clause of sub is a clause of the
// on-demand formulation f, so that "sub is unsatisfiable" implies "f is".
// It checks the variable names (each a variable of f, no name twice, as many
// names as the CNF has variables), then each clause: its literals, mapped
// to f's variables, must be exactly one of the clauses of the one group that
// they name — the triple of the vertices of its order literals when it has
// no page literal; the edge of its page literals when all are positive and
// there is no order literal; the pair of edges and the page of its two
// negative page literals otherwise. The group's clauses are generated as F
// defines them (TripleClauses, PageClause, ConflictClauses), never all of F.
// Every clause not in F is reported (up to a limit) in a *MembershipError.
func CheckMembership(f *OnDemand, sub *Sub) error {
	if sub == nil || sub.CNF == nil {
		return fmt.Errorf("%w: no sub-formula", ErrNotMember)
	}
	n, m, k := int32(f.g.N()), int32(f.g.M()), int32(len(f.kinds))
	merr := &MembershipError{}
	bad := func(format string, args ...any) {
		if merr.Total < maxMembershipProblems {
			merr.Problems = append(merr.Problems, fmt.Sprintf(format, args...))
		}
		merr.Total++
	}
	if sub.CNF.Vars != len(sub.Vars) {
		bad("the CNF has %d variables and %d are named", sub.CNF.Vars, len(sub.Vars))
	}
	seen := make(map[VarName]int, len(sub.Vars))
	for i, v := range sub.Vars {
		switch {
		case v.Kind == OrderVar && (v.A < 0 || v.A >= v.B || v.B >= n):
			bad("variable %d: %s is not an order variable of a graph with %d vertices (A < B required)", i+1, v, n)
		case v.Kind == PageVar && (v.A < 0 || v.A >= m || v.B < 1 || v.B > k):
			bad("variable %d: %s is not a page variable of a graph with %d edges on %d pages", i+1, v, m, k)
		case v.Kind != OrderVar && v.Kind != PageVar:
			bad("variable %d: unknown kind %q", i+1, rune(v.Kind))
		}
		if j, dup := seen[v]; dup {
			bad("variables %d and %d both name %s", j, i+1, v)
		}
		seen[v] = i + 1
	}
	if merr.Total > 0 {
		return merr
	}
	for ci, c := range sub.CNF.Clauses {
		want := make([]NamedLit, 0, len(c))
		for _, l := range c {
			x := int(max(l, -l))
			if l == 0 || x > len(sub.Vars) {
				bad("clause %d: literal %d outside the named variables", ci+1, l)
				want = nil
				break
			}
			want = append(want, NamedLit{Var: sub.Vars[x-1], Neg: l < 0})
		}
		if want == nil {
			continue
		}
		sortLits(want)
		group, err := f.groupOf(want)
		if err == nil && !slices.ContainsFunc(group, func(g []NamedLit) bool { return slices.Equal(g, want) }) {
			err = fmt.Errorf("not among the clauses of its group")
		}
		if err != nil {
			bad("clause %d %s: %v", ci+1, litsText(want), err)
		}
	}
	if merr.Total > 0 {
		return merr
	}
	return nil
}

// groupOf returns the clauses of the group that the clause c (sorted) names.
func (f *OnDemand) groupOf(c []NamedLit) ([][]NamedLit, error) {
	var verts []int32
	var pages []NamedLit
	for _, l := range c {
		if l.Var.Kind == OrderVar {
			for _, v := range [2]int32{l.Var.A, l.Var.B} {
				if !slices.Contains(verts, v) {
					verts = append(verts, v)
				}
			}
		} else {
			pages = append(pages, l)
		}
	}
	switch {
	case len(pages) == 0:
		if len(verts) != 3 {
			return nil, fmt.Errorf("order literals over %d vertices: a transitivity clause has three", len(verts))
		}
		slices.Sort(verts)
		return f.TripleClauses(verts[0], verts[1], verts[2]), nil
	case len(verts) == 0 && !slices.ContainsFunc(pages, func(l NamedLit) bool { return l.Neg || l.Var.A != pages[0].Var.A }):
		return f.PageClause(pages[0].Var.A), nil
	case len(pages) == 2 && pages[0].Neg && pages[1].Neg && pages[0].Var.B == pages[1].Var.B && pages[0].Var.A != pages[1].Var.A:
		e, fe := min(pages[0].Var.A, pages[1].Var.A), max(pages[0].Var.A, pages[1].Var.A)
		return f.ConflictClauses(e, fe, pages[0].Var.B), nil
	}
	return nil, fmt.Errorf("its literals name no group of the formulation")
}

func litsText(c []NamedLit) string {
	s := "("
	for i, l := range c {
		if i > 0 {
			s += " ∨ "
		}
		if l.Neg {
			s += "¬"
		}
		s += l.Var.String()
	}
	return s + ")"
}
