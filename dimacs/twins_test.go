package dimacs

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// partGraph is the graph of one encoded part on its local vertices.
type partGraph struct {
	n   int
	adj [][]bool
}

func newPartGraph(p *part) partGraph {
	pg := partGraph{n: p.n, adj: make([][]bool, p.n)}
	for i := range pg.adj {
		pg.adj[i] = make([]bool, p.n)
	}
	for j := range p.eu {
		pg.adj[p.eu[j]][p.ev[j]] = true
		pg.adj[p.ev[j]][p.eu[j]] = true
	}
	return pg
}

// twins is the definition: N(u)∖{v} = N(v)∖{u}.
func (pg partGraph) twins(u, v int) bool {
	for w := 0; w < pg.n; w++ {
		if w != u && w != v && pg.adj[u][w] != pg.adj[v][w] {
			return false
		}
	}
	return true
}

// swapIsAutomorphism checks that exchanging u and v maps edges to edges.
func (pg partGraph) swapIsAutomorphism(u, v int) bool {
	tau := func(x int) int {
		switch x {
		case u:
			return v
		case v:
			return u
		}
		return x
	}
	for a := 0; a < pg.n; a++ {
		for b := 0; b < pg.n; b++ {
			if pg.adj[a][b] != pg.adj[tau(a)][tau(b)] {
				return false
			}
		}
	}
	return true
}

// TestTwinClasses compares the encoder's twin classes with the definition
// on every graph with up to 6 vertices (nauty-geng), and checks that the
// exchange of two twins is an automorphism (the fact the symmetry breaking
// rests on; common practice, no source).
func TestTwinClasses(t *testing.T) {
	pairs := 0
	for n := 1; n <= 6; n++ {
		for _, g := range fixture.Geng(t, strconv.Itoa(n)) {
			e, err := Encode(g, Options{Kind: cert.Queue, Pages: 1, NoIsolated: true})
			if err != nil {
				t.Fatal(err)
			}
			p := e.parts[0]
			pg := newPartGraph(p)
			class, _ := p.twinClasses()
			for u := 0; u < n; u++ {
				for v := u + 1; v < n; v++ {
					same := class[u] >= 0 && class[u] == class[v]
					if same != pg.twins(u, v) {
						t.Fatalf("%v: vertices %d, %d: same class %v, twins by definition %v", g.Edges(), u, v, same, !same)
					}
					if same {
						pairs++
						if !pg.swapIsAutomorphism(u, v) {
							t.Fatalf("%v: exchanging twins %d and %d is not an automorphism", g.Edges(), u, v)
						}
					}
				}
			}
		}
	}
	if pairs == 0 {
		t.Fatal("no twins found")
	}
}

// orbitCovered checks the lemma behind the joint symmetry breaking of one
// part: every spine order can be brought, by rotations (stack only),
// reversal and exchanges of twins, to an order that satisfies every order
// literal the encoder fixed. Each of these maps valid layouts to valid
// layouts, so then every layout has a counterpart the CNF admits. It walks
// all n! orders breadth first from the admitted ones.
func orbitCovered(t *testing.T, p *part, stack bool) bool {
	t.Helper()
	n := p.n
	if n < 2 {
		return true
	}
	pg := newPartGraph(p)
	var twinPairs [][2]int32
	for u := 0; u < n; u++ {
		for v := u + 1; v < n; v++ {
			if pg.twins(u, v) {
				twinPairs = append(twinPairs, [2]int32{int32(u), int32(v)})
			}
		}
	}
	key := func(seq []int32) string {
		b := make([]byte, len(seq))
		for i, v := range seq {
			b[i] = byte(v)
		}
		return string(b)
	}
	admitted := func(seq []int32) bool {
		pos := make([]int, n)
		for i, v := range seq {
			pos[v] = i
		}
		for u := 0; u < n; u++ {
			for v := u + 1; v < n; v++ {
				switch p.ord[triIndex(n, u, v)] {
				case litTrue:
					if pos[u] > pos[v] {
						return false
					}
				case litFalse:
					t.Fatalf("order literal (%d,%d) fixed false", u, v)
				}
			}
		}
		return true
	}
	seen := map[string]bool{}
	var queue [][]int32
	total := 0
	seq := make([]int32, n)
	for i := range seq {
		seq[i] = int32(i)
	}
	var rec func(i int)
	rec = func(i int) {
		if i == n {
			total++
			if admitted(seq) {
				c := append([]int32(nil), seq...)
				seen[key(c)] = true
				queue = append(queue, c)
			}
			return
		}
		for j := i; j < n; j++ {
			seq[i], seq[j] = seq[j], seq[i]
			rec(i + 1)
			seq[i], seq[j] = seq[j], seq[i]
		}
	}
	rec(0)
	if len(queue) == 0 {
		t.Fatalf("no spine order admitted")
	}
	visit := func(s []int32) {
		if k := key(s); !seen[k] {
			seen[k] = true
			queue = append(queue, s)
		}
	}
	for len(queue) > 0 {
		s := queue[0]
		queue = queue[1:]
		rev := make([]int32, n)
		for i, v := range s {
			rev[n-1-i] = v
		}
		visit(rev)
		if stack {
			visit(append(append([]int32(nil), s[1:]...), s[0]))
		}
		for _, tp := range twinPairs {
			sw := make([]int32, n)
			for i, v := range s {
				switch v {
				case tp[0]:
					v = tp[1]
				case tp[1]:
					v = tp[0]
				}
				sw[i] = v
			}
			visit(sw)
		}
	}
	return len(seen) == total
}

// TestSymmetryBreakingJointlySound checks the orbit lemma (see
// orbitCovered) for every part of every graph on up to 6 vertices with
// every combination of rotation, reflection and twins and each way of
// splitting the graph, and on 7 vertices with the default options; graphs
// from nauty-geng. A failure names a graph for which the fixed order
// literals together exclude some layouts' whole orbits.
func TestSymmetryBreakingJointlySound(t *testing.T) {
	maxN := 7
	if testing.Short() {
		maxN = 5
	}
	var configs []Options
	for mask := 0; mask < 8; mask++ {
		for split := 0; split < 3; split++ {
			o := Options{Kind: cert.Stack, Pages: 2, NoRotation: mask&1 != 0, NoReflection: mask&2 != 0, NoTwins: mask&4 != 0}
			switch split {
			case 1:
				o.NoBlocks = true
			case 2:
				o.NoBlocks, o.NoLeaves, o.NoIsolated = true, true, true
			}
			configs = append(configs, o)
		}
		configs = append(configs, Options{Kind: cert.Queue, Pages: 2, NoReflection: mask&2 != 0, NoTwins: mask&4 != 0, NoIsolated: mask&1 != 0})
	}
	for n := 1; n <= maxN; n++ {
		cs := configs
		if n == 7 {
			cs = []Options{{Kind: cert.Stack, Pages: 2}, {Kind: cert.Queue, Pages: 2}}
		}
		for _, g := range fixture.Geng(t, strconv.Itoa(n)) {
			for _, o := range cs {
				e, err := Encode(g, o)
				if err != nil {
					t.Fatal(err)
				}
				for _, p := range e.parts {
					if !orbitCovered(t, p, o.Kind == cert.Stack) {
						t.Fatalf("%s: graph %v: a part on %d vertices has spine orders no symmetry maps to an admitted one", optName(o), g.Edges(), p.n)
					}
				}
			}
		}
	}
}

// TestTwinsFixKn: in K_n every pair of vertices are twins, so the default
// stack and queue encodings keep no order variable at all.
func TestTwinsFixKn(t *testing.T) {
	for _, kind := range []cert.Kind{cert.Stack, cert.Queue} {
		e, err := Encode(fixture.Complete(9), Options{Kind: kind, Pages: 4})
		if err != nil {
			t.Fatal(err)
		}
		st := e.Stats()
		if st.Families[FamOrder].Vars != 0 {
			t.Errorf("%s: %d order variables left", kind, st.Families[FamOrder].Vars)
		}
		off, err := Encode(fixture.Complete(9), Options{Kind: kind, Pages: 4, NoTwins: true})
		if err != nil {
			t.Fatal(err)
		}
		if off.Stats().Families[FamOrder].Vars == 0 {
			t.Errorf("%s: NoTwins left no order variables", kind)
		}
		if !strings.Contains(strings.Join(e.Comments(), "\n"), ",twins,") || strings.Contains(strings.Join(off.Comments(), "\n"), "twins") {
			t.Errorf("%s: header does not record the twin option: %q / %q", kind, e.Comments(), off.Comments())
		}
	}
}

// TestEncodeVersionLegacy: EncodeVersion reproduces byte for byte the CNFs
// spinecert-enc-1 wrote (files in testdata/enc1 written by that version), and
// the current version differs from it only where twins exist.
func TestEncodeVersionLegacy(t *testing.T) {
	cases := []struct {
		file, graph string
		opt         Options
	}{
		{"k7-stack-3.cnf", "k7.edges", Options{Kind: cert.Stack, Pages: 3}},
		{"k33-stack-2.cnf", "k33.edges", Options{Kind: cert.Stack, Pages: 2}},
		{"k33-queue-1.cnf", "k33.edges", Options{Kind: cert.Queue, Pages: 1}},
		{"k7-mixed-2.cnf", "k7.edges", Options{Kind: cert.Mixed, Pages: 2, PageKinds: []cert.Kind{cert.Stack, cert.Queue}, NoBlocks: true}},
	}
	dir := filepath.Join("testdata", "enc1")
	for _, c := range cases {
		want, err := os.ReadFile(filepath.Join(dir, c.file))
		if err != nil {
			t.Fatal(err)
		}
		res, err := graph.ReadFile(filepath.Join(dir, c.graph), graph.FormatAuto)
		if err != nil {
			t.Fatal(err)
		}
		g := res.Graphs[0]
		e, err := EncodeVersion(g, c.opt, "spinecert-enc-1")
		if err != nil {
			t.Fatal(err)
		}
		var b bytes.Buffer
		e.WriteTo(&b)
		if !bytes.Equal(b.Bytes(), want) {
			t.Errorf("%s: spinecert-enc-1 output not reproduced", c.file)
		}
		if e.Version() != "spinecert-enc-1" || !e.Options().NoTwins {
			t.Errorf("%s: version %s, options %+v", c.file, e.Version(), e.Options())
		}
		cur, _ := EncodeVersion(g, c.opt, EncoderVersion)
		b.Reset()
		cur.WriteTo(&b)
		if bytes.Equal(b.Bytes(), want) {
			t.Errorf("%s: current version gives the legacy bytes", c.file)
		}
	}
	// Without twins (the Petersen graph has none) only the header changes.
	g := fixture.Petersen()
	old, _ := EncodeVersion(g, Options{Kind: cert.Stack, Pages: 3}, "spinecert-enc-1")
	cur, _ := Encode(g, Options{Kind: cert.Stack, Pages: 3})
	if !equalClauses(old.CNF(), cur.CNF()) {
		t.Error("Petersen graph: clauses differ between spinecert-enc-1 and the current version")
	}
	if _, err := EncodeVersion(g, Options{Kind: cert.Stack, Pages: 3}, "spinecert-enc-0"); !errors.Is(err, ErrUnknownVersion) {
		t.Errorf("unknown version: %v", err)
	}
	if vs := EncoderVersions(); vs[len(vs)-1] != EncoderVersion {
		t.Errorf("EncoderVersions %v does not end with %s", vs, EncoderVersion)
	}
}

func equalClauses(a, b *CNF) bool {
	if a.Vars != b.Vars || len(a.Clauses) != len(b.Clauses) {
		return false
	}
	for i := range a.Clauses {
		if !slices.Equal(a.Clauses[i], b.Clauses[i]) {
			return false
		}
	}
	return true
}
