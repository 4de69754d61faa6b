package dimacs

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// onDemandConfigs lists the symmetry-breaking combinations of the on-demand
// formulation for a kind.
func onDemandConfigs(kind cert.Kind) []Options {
	var out []Options
	for mask := 0; mask < 8; mask++ {
		o := Options{Kind: kind, NoRotation: mask&1 != 0, NoReflection: mask&2 != 0, NoPageSymmetry: mask&4 != 0}
		if kind == cert.Queue && o.NoRotation {
			continue // rotation is never used for queues
		}
		out = append(out, o)
	}
	return out
}

// fullCNF is the whole on-demand formula of a claim as a CNF, with the
// formulation to decode its models.
func fullCNF(t testing.TB, g *graph.Graph, o Options) (*OnDemand, *Sub) {
	t.Helper()
	f, err := NewOnDemand(g, o)
	if err != nil {
		t.Fatal(err)
	}
	return f, SubOf(f.Full())
}

// crossCheckOnDemand is crossCheck for the on-demand formulation: the full
// formula for want[i] pages is satisfiable with a model that decodes to a
// valid layout, and the one for want[i]-1 pages is unsatisfiable.
func crossCheckOnDemand(t *testing.T, gs []*graph.Graph, want []int, o Options) {
	t.Helper()
	var sat, unsat []*CNF
	var forms []*OnDemand
	var subs []*Sub
	var unsatIdx []int
	for i, g := range gs {
		o.Pages = want[i]
		f, s := fullCNF(t, g, o)
		forms, subs = append(forms, f), append(subs, s)
		sat = append(sat, s.CNF)
		if want[i] > 0 {
			o.Pages = want[i] - 1
			_, s2 := fullCNF(t, g, o)
			unsat = append(unsat, s2.CNF)
			unsatIdx = append(unsatIdx, i)
		}
	}
	name := "on-demand " + optName(o)
	models, ok := chunkedSAT(t, sat)
	if !ok {
		t.Fatalf("%s: a full formula for the brute-force page count is unsatisfiable", name)
	}
	for i, f := range forms {
		model, s := models[i], subs[i]
		index := map[VarName]int{}
		for j, v := range s.Vars {
			index[v] = j + 1
		}
		l := f.Decode(func(v VarName) (bool, bool) {
			j, ok := index[v]
			if !ok || j >= len(model) {
				return false, false
			}
			return model[j], true
		}, nil)
		if err := checkLayout(gs[i], f.PageKinds(), l); err != nil {
			t.Fatalf("%s: graph %d %v: decoded layout fails the independent check: %v", name, i, gs[i].Edges(), err)
		}
	}
	if len(unsat) > 0 {
		if i := chunkedUNSAT(t, unsat); i >= 0 {
			g := gs[unsatIdx[i]]
			t.Fatalf("%s: graph n=%d %v: full formula for %d pages satisfiable, brute force says %d are needed", name, g.N(), g.Edges(), want[unsatIdx[i]]-1, want[unsatIdx[i]])
		}
	}
}

// TestOnDemandExhaustive compares the full on-demand formula with brute
// force, as TestExhaustive does for the default formulation: every graph
// on up to 6 vertices with every symmetry-breaking combination, and every
// graph on 7 vertices with the default one (all graphs from nauty-geng,
// Debian's nauty; counts 1, 2, 4, 11, 34, 156, 1044, OEIS A000088). The
// formula's models are read by cadical (Debian's cadical).
func TestOnDemandExhaustive(t *testing.T) {
	maxN := 7
	if testing.Short() {
		maxN = 5
	}
	for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
		var small []*graph.Graph
		var smallWant []int
		for n := 1; n <= maxN; n++ {
			gs := fixture.Geng(t, strconv.Itoa(n))
			want := make([]int, len(gs))
			for i, g := range gs {
				want[i] = bruteNumber(g, kind)
			}
			if n <= 6 {
				small, smallWant = append(small, gs...), append(smallWant, want...)
				continue
			}
			start := time.Now()
			crossCheckOnDemand(t, gs, want, Options{Kind: kind})
			t.Logf("%s n=%d: on-demand formulation checked in %v", kind, n, time.Since(start).Round(time.Millisecond))
		}
		for _, o := range onDemandConfigs(kind) {
			crossCheckOnDemand(t, small, smallWant, o)
		}
	}
}

// TestOnDemandMixed: the mixed kinds of the on-demand formulation agree with
// the default formulation on every graph up to 6 vertices (both decided by
// cadical; the default one is itself checked against brute force).
func TestOnDemandMixed(t *testing.T) {
	var gs []*graph.Graph
	for n := 4; n <= 6; n++ {
		gs = append(gs, fixture.Geng(t, strconv.Itoa(n))...)
	}
	o := Options{Kind: cert.Mixed, Pages: 2, PageKinds: []cert.Kind{cert.Stack, cert.Queue}}
	var def, od []*CNF
	for _, g := range gs {
		e, err := Encode(g, o)
		if err != nil {
			t.Fatal(err)
		}
		def = append(def, e.CNF())
		_, s := fullCNF(t, g, o)
		od = append(od, s.CNF)
	}
	for i := 0; i < len(gs); i++ {
		a, b := cadical(t, def[i]).status, cadical(t, od[i]).status
		if a != b {
			t.Fatalf("graph %v: default formulation %v, on-demand %v", gs[i].Edges(), a, b)
		}
	}
}

// TestOnDemandFullSize: FullSize counts the clauses Full builds.
func TestOnDemandFullSize(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 60; trial++ {
		g := fixture.RandomGNP(r, 1+r.IntN(9), r.Float64())
		for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
			for _, o := range onDemandConfigs(kind) {
				o.Pages = 1 + r.IntN(3)
				f, err := NewOnDemand(g, o)
				if err != nil {
					t.Fatal(err)
				}
				if got, want := f.FullSize(), int64(len(f.Full())); got != want {
					t.Fatalf("n=%d m=%d %s: FullSize %d, Full has %d", g.N(), g.M(), optName(o), got, want)
				}
			}
		}
	}
}

func clauseKey(c []NamedLit) string {
	return litsText(sortLits(append([]NamedLit(nil), c...)))
}

// TestMembershipAcceptsF: every clause of F is a member, in any numbering.
func TestMembershipAcceptsF(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for trial := 0; trial < 40; trial++ {
		g := fixture.RandomGNP(r, 2+r.IntN(8), r.Float64())
		for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
			o := onDemandConfigs(kind)[r.IntN(len(onDemandConfigs(kind)))]
			o.Pages = 1 + r.IntN(3)
			f, s := fullCNF(t, g, o)
			// Renumber the variables at random: membership must not depend on it.
			perm := r.Perm(len(s.Vars))
			vars := make([]VarName, len(s.Vars))
			for i, p := range perm {
				vars[p] = s.Vars[i]
			}
			cnf := &CNF{Vars: len(vars)}
			for _, c := range s.CNF.Clauses {
				d := make([]int32, len(c))
				for i, l := range c {
					x := int32(perm[max(l, -l)-1] + 1)
					if l < 0 {
						x = -x
					}
					d[i] = x
				}
				r.Shuffle(len(d), func(i, j int) { d[i], d[j] = d[j], d[i] })
				cnf.Clauses = append(cnf.Clauses, d)
			}
			if err := CheckMembership(f, &Sub{Vars: vars, CNF: cnf}); err != nil {
				t.Fatalf("n=%d %s: the full formula fails membership: %v", g.N(), optName(o), err)
			}
		}
	}
}

// TestMembershipRejectsOthers mutates clauses of F (a sign flipped, a
// literal dropped, added or replaced) and checks that the checker accepts a
// mutant exactly when it is a clause of F, by comparison with F built in full.
func TestMembershipRejectsOthers(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	rejected := 0
	for trial := 0; trial < 200; trial++ {
		g := fixture.RandomGNP(r, 4+r.IntN(5), 0.3+0.6*r.Float64())
		kind := []cert.Kind{cert.Stack, cert.Queue}[r.IntN(2)]
		o := onDemandConfigs(kind)[r.IntN(len(onDemandConfigs(kind)))]
		o.Pages = 1 + r.IntN(3)
		f, s := fullCNF(t, g, o)
		if len(s.CNF.Clauses) == 0 || len(s.Vars) < 2 {
			continue
		}
		inF := map[string]bool{}
		for _, c := range f.Full() {
			inF[clauseKey(c)] = true
		}
		for k := 0; k < 20; k++ {
			c := append([]int32(nil), s.CNF.Clauses[r.IntN(len(s.CNF.Clauses))]...)
			switch op := r.IntN(4); {
			case op == 0 || len(c) < 2:
				c[r.IntN(len(c))] *= -1
			case op == 1:
				i := r.IntN(len(c))
				c = append(c[:i], c[i+1:]...)
			case op == 2:
				c = append(c, int32(1+r.IntN(len(s.Vars)))*[]int32{1, -1}[r.IntN(2)])
			default:
				c[r.IntN(len(c))] = int32(1+r.IntN(len(s.Vars))) * []int32{1, -1}[r.IntN(2)]
			}
			named := make([]NamedLit, len(c))
			for i, l := range c {
				named[i] = NamedLit{Var: s.Vars[max(l, -l)-1], Neg: l < 0}
			}
			member := inF[clauseKey(named)]
			err := CheckMembership(f, &Sub{Vars: s.Vars, CNF: &CNF{Vars: len(s.Vars), Clauses: [][]int32{c}}})
			if member && err != nil {
				t.Fatalf("%s: %s is a clause of F but was rejected: %v", optName(o), clauseKey(named), err)
			}
			if !member {
				if !errors.Is(err, ErrNotMember) {
					t.Fatalf("%s: %s is not a clause of F but was accepted (err %v)", optName(o), clauseKey(named), err)
				}
				rejected++
			}
		}
	}
	if rejected < 1000 {
		t.Fatalf("only %d mutants were non-members: the test is too weak", rejected)
	}
}

// TestMembershipNames: variable names outside the graph, repeated names and
// a CNF with more variables than names are rejected with the reason.
func TestMembershipNames(t *testing.T) {
	g := fixture.Complete(4)
	f, err := NewOnDemand(g, Options{Kind: cert.Stack, Pages: 2})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		vars []VarName
		want string
	}{
		{[]VarName{{OrderVar, 2, 1}}, "A < B required"},
		{[]VarName{{OrderVar, 1, 4}}, "4 vertices"},
		{[]VarName{{PageVar, 6, 1}}, "6 edges"},
		{[]VarName{{PageVar, 0, 3}}, "on 2 pages"},
		{[]VarName{{PageVar, 0, 1}, {PageVar, 0, 1}}, "both name page 0 1"},
		{[]VarName{{'x', 0, 1}}, "unknown kind"},
	} {
		err := CheckMembership(f, &Sub{Vars: c.vars, CNF: &CNF{Vars: len(c.vars)}})
		if !errors.Is(err, ErrNotMember) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%v: got %v, want %q", c.vars, err, c.want)
		}
	}
	err = CheckMembership(f, &Sub{Vars: []VarName{{PageVar, 0, 1}}, CNF: &CNF{Vars: 2}})
	if !errors.Is(err, ErrNotMember) || !strings.Contains(err.Error(), "2 variables and 1 are named") {
		t.Errorf("more variables than names: %v", err)
	}
}

// TestVarsRoundTrip: WriteVars and ReadVars agree, and bad lines are
// reported with their line and column.
func TestVarsRoundTrip(t *testing.T) {
	vars := []VarName{{OrderVar, 0, 7}, {PageVar, 12, 2}, {OrderVar, 3, 2147483647}}
	var b bytes.Buffer
	if err := WriteVars(&b, vars); err != nil {
		t.Fatal(err)
	}
	got, err := ReadVars(bytes.NewReader(b.Bytes()), "v.txt")
	if err != nil || fmt.Sprint(got) != fmt.Sprint(vars) {
		t.Fatalf("round trip: %v %v", got, err)
	}
	for _, c := range []struct{ in, want string }{
		{"o 1\n", "v.txt:1:4: expected two non-negative numbers"},
		{"c x\nq 1 2\n", "v.txt:2:1: expected \"o\" (order) or \"p\" (page)"},
		{"o 1 -2\n", "v.txt:1:5: expected a non-negative decimal number"},
		{"o 1 02\n", "v.txt:1:5: expected a non-negative"},
		{"p 1 2 3\n", "v.txt:1:7: expected the end of the line"},
		{"o 1 2\n\n", "v.txt:2:1: empty line"},
		{"o 1 2147483648\n", "v.txt:1:5: expected a non-negative decimal number below 2^31"},
		{"o 1 " + strings.Repeat("1", 300) + "\n", "v.txt:1:1: line longer than"},
	} {
		_, err := ReadVars(strings.NewReader(c.in), "v.txt")
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: got %v, want %q", c.in, err, c.want)
		}
	}
}

// FuzzReadVars: ReadVars never panics, errors carry a position, and what it
// accepts is written back to something it reads as the same names.
func FuzzReadVars(f *testing.F) {
	f.Add([]byte("c x\no 0 1\np 2 3\n"))
	f.Add([]byte("o 1 2"))
	f.Add([]byte("p 0 0\r\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		vars, err := ReadVars(bytes.NewReader(data), "f")
		if err != nil {
			return
		}
		var b bytes.Buffer
		if err := WriteVars(&b, vars); err != nil {
			t.Fatal(err)
		}
		again, err := ReadVars(&b, "f")
		if err != nil || fmt.Sprint(again) != fmt.Sprint(vars) {
			t.Fatalf("round trip: %v %v", again, err)
		}
	})
}

// FuzzMembership: a sub-formula read from arbitrary text for K4 (stack, 2
// pages) or C5 (queue, 1 page) is accepted only if every one of its clauses
// is a clause of F, compared with F built in full.
func FuzzMembership(f *testing.F) {
	f.Add(uint8(0), []byte("o 1 2\no 1 3\no 2 3\n"), []byte("p cnf 3 1\n-1 3 -2 0\n"))
	f.Add(uint8(1), []byte("p 0 1\np 1 1\n"), []byte("p cnf 2 1\n1 0\n"))
	f.Add(uint8(0), []byte("p 0 1\np 5 1\no 0 2\n"), []byte("p cnf 3 2\n-1 -2 3 0\n1 0\n"))
	k4 := fixture.Complete(4)
	c5 := fixture.Numbered(5, [][2]int{{0, 1}, {1, 2}, {2, 3}, {3, 4}, {4, 0}})
	f.Fuzz(func(t *testing.T, which uint8, varsText, cnfText []byte) {
		o, g := Options{Kind: cert.Stack, Pages: 2}, k4
		if which%2 == 1 {
			o, g = Options{Kind: cert.Queue, Pages: 1}, c5
		}
		vars, err := ReadVars(bytes.NewReader(varsText), "v")
		if err != nil {
			return
		}
		cnf, err := ReadCNF(bytes.NewReader(cnfText), "c", ReadOptions{})
		if err != nil {
			return
		}
		form, err := NewOnDemand(g, o)
		if err != nil {
			t.Fatal(err)
		}
		if CheckMembership(form, &Sub{Vars: vars, CNF: cnf}) != nil {
			return
		}
		inF := map[string]bool{}
		for _, c := range form.Full() {
			inF[clauseKey(c)] = true
		}
		for _, c := range cnf.Clauses {
			named := make([]NamedLit, len(c))
			for i, l := range c {
				named[i] = NamedLit{Var: vars[max(l, -l)-1], Neg: l < 0}
			}
			if !inF[clauseKey(named)] {
				t.Fatalf("accepted %s, which is not a clause of F", clauseKey(named))
			}
		}
	})
}
