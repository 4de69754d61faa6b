package planar

import (
	"bufio"
	"bytes"
	"fmt"
	"math/rand/v2"
	"os"
	"strings"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
	"spinecert.dev/internal/testtools"
	"spinecert.dev/planar/planarcert"
)

// plDecodeGraph6 reads one graph6 line of nauty's output with the package's
// own reader (checked against formats.txt and nauty in read_test.go).
func plDecodeGraph6(t testing.TB, line string) *graph.Graph {
	t.Helper()
	res, err := graph.Read(strings.NewReader(line), "nauty.g6", graph.FormatGraph6)
	if err != nil || len(res.Graphs) != 1 {
		t.Fatalf("graph6 line %q: %v", line, err)
	}
	return res.Graphs[0]
}

// plGraph6Big encodes g in graph6 in vertex order, for any n.
func plGraph6Big(g *graph.Graph) string { return string(graph.AppendGraph6(nil, g)) }

func plLines(b []byte) []string {
	var out []string
	sc := bufio.NewScanner(bytes.NewReader(b))
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	for sc.Scan() {
		if l := strings.TrimSpace(sc.Text()); l != "" && !strings.HasPrefix(l, ">") {
			out = append(out, l)
		}
	}
	return out
}

// checkAgainstPlanarg decides every graph6 line with Decide, checks each
// certificate, compares with nauty-planarg and returns the planar count.
func plCheckAgainstPlanarg(t *testing.T, input []byte) int {
	t.Helper()
	ref := make(map[string]bool)
	for _, l := range plLines(fixture.RunTool(t, input, "nauty-planarg", "nauty", "-q")) {
		ref[l] = true
	}
	count := 0
	for _, l := range plLines(input) {
		g := plDecodeGraph6(t, l)
		res, err := Decide(g)
		if err != nil {
			t.Fatalf("%s: %v", l, err)
		}
		if res.Planar != ref[l] {
			t.Fatalf("%s: planar=%v, nauty-planarg says %v", l, res.Planar, ref[l])
		}
		if err := planarcert.Check(g, res.Cert); err != nil {
			t.Fatalf("%s: certificate rejected: %v", l, err)
		}
		if res.Planar {
			count++
		}
	}
	return count
}

// TestPlanarCountsOEIS counts the planar graphs among all graphs on n
// vertices up to isomorphism, as listed by nauty-geng. Expected values:
// OEIS A005470 (number of planar graphs with n nodes) and, with -c, OEIS
// A003094 (connected planar graphs with n nodes), read in OEIS.
// Setting SPINECERT_PLANAR_N9=1 adds n = 9 (79853 and 71885).
func TestPlanarCountsOEIS(t *testing.T) {
	all := []int{1, 2, 4, 11, 33, 142, 822, 6966, 79853}
	connected := []int{1, 1, 2, 6, 20, 99, 646, 5974, 71885}
	maxN := 8
	if os.Getenv("SPINECERT_PLANAR_N9") == "1" {
		maxN = 9
	}
	if testing.Short() {
		maxN = 7
	}
	for n := 1; n <= maxN; n++ {
		for _, conn := range []bool{false, true} {
			name := fmt.Sprintf("n=%d", n)
			args := []string{"-q", fmt.Sprint(n)}
			want := all[n-1]
			if conn {
				name += "/connected"
				args = []string{"-q", "-c", fmt.Sprint(n)}
				want = connected[n-1]
			}
			t.Run(name, func(t *testing.T) {
				out := fixture.RunTool(t, nil, "nauty-geng", "nauty", args...)
				if got := plCheckAgainstPlanarg(t, out); got != want {
					t.Errorf("%d planar graphs, OEIS says %d", got, want)
				}
			})
		}
	}
}

// TestPlanarRandomAgainstPlanarg compares verdicts with nauty-planarg on
// random graphs of 10 to 1000 vertices around the planarity threshold.
func TestPlanarRandomAgainstPlanarg(t *testing.T) {
	testtools.Require(t, "nauty-planarg", "nauty")
	rng := rand.New(rand.NewPCG(6, 1))
	var buf bytes.Buffer
	var gs []*graph.Graph
	for i := 0; i < 300; i++ {
		n := 10 + rng.IntN(991)
		var g *graph.Graph
		switch i % 3 {
		case 0:
			g = fixture.RandomGraph(rng, n, n+rng.IntN(2*n))
		case 1:
			g = fixture.RandomPlanarPlus(rng, n, rng.IntN(3))
		default:
			g = fixture.RandomTriangulation(rng, n)
		}
		gs = append(gs, g)
		buf.WriteString(plGraph6Big(g))
		buf.WriteByte('\n')
	}
	ref := make(map[string]bool)
	for _, l := range plLines(fixture.RunTool(t, buf.Bytes(), "nauty-planarg", "nauty", "-q")) {
		ref[l] = true
	}
	var planar, nonPlanar int
	for i, g := range gs {
		res, err := Decide(g)
		if err != nil {
			t.Fatalf("graph %d (%v): %v", i, g, err)
		}
		if want := ref[plGraph6Big(g)]; res.Planar != want {
			t.Fatalf("graph %d (%v): planar=%v, nauty-planarg says %v", i, g, res.Planar, want)
		}
		if err := planarcert.Check(g, res.Cert); err != nil {
			t.Fatalf("graph %d (%v): %v", i, g, err)
		}
		if res.Planar {
			planar++
		} else {
			nonPlanar++
		}
	}
	if planar < 50 || nonPlanar < 50 {
		t.Fatalf("unbalanced sample: %d planar, %d not planar", planar, nonPlanar)
	}
}

func TestGraph6Helpers(t *testing.T) {
	// formats.txt example: 'DQc' is n=5 with edges 0-2, 0-4, 1-3, 3-4 (McKay, formats.txt).
	g := plDecodeGraph6(t, "DQc")
	want := []graph.Edge{{U: 0, V: 2}, {U: 0, V: 4}, {U: 1, V: 3}, {U: 3, V: 4}}
	if fmt.Sprint(g.Edges()) != fmt.Sprint(want) {
		t.Fatalf("DQc decodes to %v, want %v", g.Edges(), want)
	}
	if s := plGraph6Big(g); s != "DQc" {
		t.Fatalf("DQc re-encodes as %q", s)
	}
}
