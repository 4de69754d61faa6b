package graph

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"spinecert.dev/internal/testtools"
	"spinecert.dev/textpos"
)

// ioRead reads src with the given format and fails the test on error.
func ioRead(t testing.TB, src string, f Format) *ReadResult {
	t.Helper()
	res, err := Read(strings.NewReader(src), "test", f)
	if err != nil {
		t.Fatalf("reading %q as %v: %v", src, f, err)
	}
	return res
}

// ioEdges lists g's edges as label pairs.
func ioEdges(g *Graph) [][2]string {
	var out [][2]string
	for _, e := range g.Edges() {
		out = append(out, [2]string{g.Label(e.U), g.Label(e.V)})
	}
	return out
}

// ioIndexEdges lists g's edges as vertex-index pairs.
func ioIndexEdges(g *Graph) [][2]int {
	var out [][2]int
	for _, e := range g.Edges() {
		out = append(out, [2]int{int(e.U), int(e.V)})
	}
	return out
}

func ioComplete(n int) [][2]int {
	var e [][2]int
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			e = append(e, [2]int{i, j})
		}
	}
	return e
}

// TestFormatsTxtExamples checks the worked examples of B. D. McKay,
// "Description of graph6, sparse6 and digraph6 encodings" (formats.txt).
func TestFormatsTxtExamples(t *testing.T) {
	cases := []struct {
		line  string
		f     Format
		n     int
		edges [][2]int
	}{
		// formats.txt: n=5 with edges 0-2, 0-4, 1-3, 3-4 is "DQc".
		{"DQc", FormatGraph6, 5, [][2]int{{0, 2}, {0, 4}, {1, 3}, {3, 4}}},
		// K4 = "C~" and K5 = "D~{": derived from the graph6 definition in
		// formats.txt (N(4) = 'C', six 1-bits = '~'; N(5) = 'D', ten 1-bits
		// padded with two 0-bits = '~' '{').
		{"C~", FormatGraph6, 4, ioComplete(4)},
		{"D~{", FormatGraph6, 5, ioComplete(5)},
		// formats.txt sparse6 example: n=7 with edges 0-1, 0-2, 1-2, 5-6 is ":Fa@x^".
		{":Fa@x^", FormatSparse6, 7, [][2]int{{0, 1}, {0, 2}, {1, 2}, {5, 6}}},
	}
	for _, c := range cases {
		res := ioRead(t, c.line+"\n", FormatAuto)
		if res.Format != c.f {
			t.Errorf("%s: detected %v, want %v", c.line, res.Format, c.f)
		}
		g := res.Graphs[0]
		if g.N() != c.n || !slices.Equal(ioIndexEdges(g), c.edges) {
			t.Errorf("%s: got n=%d edges %v, want n=%d edges %v", c.line, g.N(), ioIndexEdges(g), c.n, c.edges)
		}
		for v := 0; v < g.N(); v++ {
			if g.Label(int32(v)) != strconv.Itoa(v) {
				t.Errorf("%s: vertex %d labelled %q, want %q (formats.txt numbers vertices from 0)", c.line, v, g.Label(int32(v)), strconv.Itoa(v))
			}
		}
		var enc []byte
		if c.f == FormatGraph6 {
			enc = AppendGraph6(nil, g)
		} else {
			enc = AppendSparse6(nil, g)
		}
		if string(enc) != c.line {
			t.Errorf("encoding n=%d %v gives %q, formats.txt gives %q", c.n, c.edges, enc, c.line)
		}
	}
}

// TestN checks N(n) against formats.txt: N(30) = 93, N(12345) = 126 66 63 120,
// N(460175067) = 126 126 63 90 90 90 90 90; and the boundaries of the forms
// (62 short, 63..258047 four bytes, 258048.. eight bytes).
func TestN(t *testing.T) {
	cases := []struct {
		n   uint64
		enc []byte
	}{
		{30, []byte{93}},
		{12345, []byte{126, 66, 63, 120}},
		{460175067, []byte{126, 126, 63, 90, 90, 90, 90, 90}},
		{62, []byte{125}},
		{63, []byte{126, 63, 63, 126}},
		{258047, []byte{126, 125, 126, 126}},
		{258048, []byte{126, 126, 63, 63, 63, 126, 63, 63}},
		{1<<36 - 1, []byte{126, 126, 126, 126, 126, 126, 126, 126}},
	}
	for _, c := range cases {
		if got := appendN(nil, c.n); !bytes.Equal(got, c.enc) {
			t.Errorf("N(%d) = %v, want %v", c.n, got, c.enc)
		}
		n, w, err := decodeN(c.enc, 1)
		if err != nil || n != c.n || w != len(c.enc) {
			t.Errorf("decoding %v: n=%d width=%d err=%v, want %d", c.enc, n, w, err, c.n)
		}
	}
	// A long form for a small n is not the N(n) formats.txt defines.
	if _, _, err := decodeN([]byte{126, 63, 63, 68}, 1); err == nil {
		t.Error("N(5) in the four-byte form was accepted")
	}
}

func TestNautyHeadersAndManyGraphs(t *testing.T) {
	src := ">>graph6<<DQc\nC~\n>>graph6<<D~{\n"
	res := ioRead(t, src, FormatAuto)
	if res.Format != FormatGraph6 || len(res.Graphs) != 3 {
		t.Fatalf("got format %v with %d graphs, want graph6 with 3", res.Format, len(res.Graphs))
	}
	if res.Graphs[0].M() != 4 || res.Graphs[1].M() != 6 || res.Graphs[2].M() != 10 {
		t.Errorf("graphs out of file order: m = %d %d %d, want 4 6 10", res.Graphs[0].M(), res.Graphs[1].M(), res.Graphs[2].M())
	}
	res = ioRead(t, ">>sparse6<<:Fa@x^\r\n:Fa@x^\r\n", FormatAuto)
	if res.Format != FormatSparse6 || len(res.Graphs) != 2 || res.Graphs[0].ID() != res.Graphs[1].ID() {
		t.Errorf("sparse6 with header and CRLF: format %v, %d graphs", res.Format, len(res.Graphs))
	}
	// Empty and one-vertex graphs: N(0) = '?', N(1) = '@'.
	res = ioRead(t, "?\n@\n:?\n:@\n", FormatGraph6)
	for i, want := range []int{0, 1, 0, 1} {
		if g := res.Graphs[i]; g.N() != want || g.M() != 0 {
			t.Errorf("graph %d: %v, want n=%d m=0", i+1, g, want)
		}
	}
}

// TestSparse6Padding checks the padding rule of formats.txt on the cases it
// names: for (n, k) = (2,1), (4,2), (8,3), (16,4), when vertex n-2 is the
// largest with an edge and k+1 or more bits are left, the padding starts
// with a 0-bit; 1-bits alone would decode to an extra edge {n-1, n-1}.
func TestSparse6Padding(t *testing.T) {
	// Derived by hand from the rule: n=4 (k=2) with edges 0-2 and 1-2 is
	// 1 10 0 00 | 0 01 (jump to 2, edge 0-2, edge 1-2): 9 bits, 3 to pad,
	// vertex n-2 = 2 is the largest with an edge, so the padding is 011:
	// 110000 001011 = 'o' 'J'. Padding 111 instead (":CoN") reads as the
	// pair b=1, x=3: v becomes 3 and {3,3} would be an edge.
	g, _ := NewNumbered(4, 0, [][2]int{{0, 2}, {1, 2}})
	if got := string(AppendSparse6(nil, g)); got != ":CoJ" {
		t.Errorf("sparse6 of n=4 {0-2, 1-2} = %q, want \":CoJ\"", got)
	}
	if res := ioRead(t, ":CoJ\n", FormatSparse6); res.Graphs[0].ID() != g.ID() {
		t.Errorf(":CoJ decodes to %v", ioIndexEdges(res.Graphs[0]))
	}
	if _, err := Read(strings.NewReader(":CoN\n"), "pad", FormatSparse6); err == nil || !strings.Contains(err.Error(), "self-loop at vertex 3") {
		t.Errorf(":CoN: error %v, want the self-loop the padding rule avoids", err)
	}
	// Round trips over the four special (n, k) and their neighbourhoods.
	for _, n := range []int{2, 3, 4, 5, 8, 9, 16, 17} {
		for _, edges := range [][][2]int{{{0, 1}}, {{n - 3, n - 2}}, {{0, n - 2}}, {{0, n - 1}}, {{0, n - 2}, {1, n - 2}}} {
			if slices.ContainsFunc(edges, func(e [2]int) bool { return e[0] < 0 || e[0] >= e[1] }) {
				continue
			}
			g, err := NewNumbered(n, 0, edges)
			if err != nil {
				t.Fatal(err)
			}
			line := string(AppendSparse6(nil, g))
			if res := ioRead(t, line+"\n", FormatSparse6); res.Graphs[0].ID() != g.ID() {
				t.Errorf("n=%d edges %v: %q decodes to %v", n, edges, line, ioIndexEdges(res.Graphs[0]))
			}
		}
	}
}

// TestDetectFormat checks content-based detection with and without hints.
func TestDetectFormat(t *testing.T) {
	cases := []struct {
		head, name string
		want       Format
	}{
		{"DQc\n", "x", FormatGraph6},
		{">>graph6<<DQc\n", "x", FormatGraph6},
		{":Fa@x^\n", "x", FormatSparse6},
		{">>sparse6<<:Fa@x^", "x", FormatSparse6},
		{"c example\np edge 3 1\ne 1 2\n", "x", FormatDIMACS},
		{"p col 3 0\n", "x", FormatDIMACS},
		{"a b\nb c\n", "x", FormatEdgeList},
		{"# a comment\n1 2\n", "x", FormatEdgeList},
		{"c d\nd e\n", "x", FormatEdgeList},
		{"DQc\n", "g.edges", FormatEdgeList},
		{"&DI?AO?\n", "x", FormatGraph6}, // digraph6, so that the graph6 reader can say it is not supported
		{"1 2\n", "g.g6", FormatGraph6},  // the extension decides when the content does not contradict it
	}
	for _, c := range cases {
		if got := DetectFormat([]byte(c.head), c.name); got != c.want {
			t.Errorf("DetectFormat(%q, %q) = %v, want %v", c.head, c.name, got, c.want)
		}
	}
}

// TestIsGraph6Line checks the length rule of formats.txt: N(n) then
// ceil(n(n-1)/2 / 6) bytes, every byte in 63..126.
func TestIsGraph6Line(t *testing.T) {
	// n = 63 takes the four-byte N(n) and ceil(1953/6) = 326 data bytes.
	long := "~??~" + strings.Repeat("?", 326)
	cases := map[string]bool{
		"DQc": true, "DQ": false, "DQcc": false, "D Qc": false, "?": true, "@": true, "A_": true, "A": false,
		long: true, long[:len(long)-1]: false, long + "?": false, "~~~~~~~~": false,
	}
	for s, want := range cases {
		if got := isGraph6Line([]byte(s)); got != want {
			t.Errorf("isGraph6Line(%.20q) = %v, want %v", s, got, want)
		}
	}
}

// TestDetectLongGraph6 reads, without a format, a graph6 file whose first
// line is longer than the part of the file detection looks at.
func TestDetectLongGraph6(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	g := ioRandom(r, 1000, 0.5, 0)
	line := AppendGraph6(nil, g)
	if len(line) <= detectPeek {
		t.Fatalf("test graph6 line has %d bytes, not longer than %d", len(line), detectPeek)
	}
	res, err := Read(bytes.NewReader(append(line, '\n')), "big", FormatAuto)
	if err != nil {
		t.Fatal(err)
	}
	if res.Format != FormatGraph6 || res.Graphs[0].ID() != g.ID() {
		t.Errorf("long graph6 line: format %v, same graph %v", res.Format, res.Graphs[0].ID() == g.ID())
	}
}

// ioRandom returns a G(n, p) graph labelled base..base+n-1.
func ioRandom(r *rand.Rand, n int, p float64, base int) *Graph {
	var edges [][2]int
	for i := 0; i < n; i++ {
		for j := i + 1; j < n; j++ {
			if r.Float64() < p {
				edges = append(edges, [2]int{i, j})
			}
		}
	}
	g, err := NewNumbered(n, base, edges)
	if err != nil {
		panic(err)
	}
	return g
}

// TestDIMACSExample reads a graph written as the 1993 DIMACS "Clique and
// Coloring Problems Graph Format" describes it: comment lines, one problem
// line "p edge NODES EDGES", then one "e W V" line per edge.
func TestDIMACSExample(t *testing.T) {
	src := "c an invented instance: five sensors on two buses\n" +
		"c vertex 5 has no link\n" +
		"p edge 5 4\n" +
		"e 1 2\n" +
		"e 2 3\n" +
		"c comments may come between edges\n" +
		"e 3 1\n" +
		"e 4 2\n"
	res := ioRead(t, src, FormatAuto)
	if res.Format != FormatDIMACS {
		t.Fatalf("detected %v, want dimacs", res.Format)
	}
	g := res.Graphs[0]
	if !slices.Equal(g.Labels(), []string{"1", "2", "3", "4", "5"}) {
		t.Errorf("labels %v, want 1..5 (isolated vertex 5 included)", g.Labels())
	}
	want := [][2]string{{"1", "2"}, {"1", "3"}, {"2", "3"}, {"2", "4"}}
	if !slices.Equal(ioEdges(g), want) {
		t.Errorf("edges %v, want %v", ioEdges(g), want)
	}
	// "p col" as many published instances use, and a repeated edge: it is a
	// line of its own for the count, then merged with a warning.
	res = ioRead(t, "p col 3 3\ne 1 2\ne 2 1\ne 2 3\n", FormatDIMACS)
	if g := res.Graphs[0]; g.M() != 2 || len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], "1 repeated edge") {
		t.Errorf("repeated edge: m=%d warnings %q, want m=2 and one warning", g.M(), res.Warnings)
	}
	// Vertex value lines of the weighted clique problem are skipped with a warning.
	res = ioRead(t, "p edge 2 1\nn 1 7\nn 2 3\ne 1 2\n", FormatDIMACS)
	if len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], "2 vertex value line(s) ignored") {
		t.Errorf("vertex value lines: warnings %q", res.Warnings)
	}
}

// TestDIMACSAgainstNauty converts random DIMACS files with nauty's
// dimacs2g (Debian package nauty) and compares the graphs: DIMACS vertex
// i+1 is vertex i of the sparse6 output.
func TestDIMACSAgainstNauty(t *testing.T) {
	tool := testtools.Require(t, "nauty-dimacs2g", "nauty")
	r := rand.New(rand.NewPCG(5, 6))
	dir := t.TempDir()
	for trial := 0; trial < 20; trial++ {
		g := ioRandom(r, 1+r.IntN(40), r.Float64()*0.5, 1)
		var buf bytes.Buffer
		if err := WriteDIMACS(&buf, g); err != nil {
			t.Fatal(err)
		}
		path := filepath.Join(dir, fmt.Sprintf("g%d.dimacs", trial))
		if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		out, err := exec.Command(tool, path).Output()
		if err != nil {
			t.Fatalf("%s %s: %v", tool, path, err)
		}
		ours := ioRead(t, buf.String(), FormatDIMACS).Graphs[0]
		theirs := ioRead(t, string(out), FormatSparse6).Graphs[0]
		if ours.N() != theirs.N() || !slices.Equal(ioIndexEdges(ours), ioIndexEdges(theirs)) {
			t.Errorf("trial %d: we read %v, nauty-dimacs2g %v", trial, ours, theirs)
		}
	}
}

// ioTool runs a tool with stdin and returns its standard output.
func ioTool(t testing.TB, stdin []byte, name string, args ...string) []byte {
	t.Helper()
	cmd := exec.Command(name, args...)
	cmd.Stdin = bytes.NewReader(stdin)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("%s %v: %v: %s", name, args, err, stderr.String())
	}
	return out
}

func ioLines(b []byte) []string {
	return strings.Split(strings.TrimSuffix(string(b), "\n"), "\n")
}

// TestGengCrossCheck reads what nauty's geng (Debian package nauty) writes.
// geng -c 5 lists the connected graphs on 5 vertices: 21 of them (OEIS
// A001349, from memory); geng 6 lists all 156 graphs on 6 vertices (OEIS
// A000088, from memory). The graph6 and sparse6 outputs must agree graph by
// graph, and re-encoding must give geng's bytes.
func TestGengCrossCheck(t *testing.T) {
	geng := testtools.Require(t, "nauty-geng", "nauty")
	for _, c := range []struct {
		args []string
		want int
	}{{[]string{"-c", "5"}, 21}, {[]string{"6"}, 156}, {[]string{"-c", "8", "7:9"}, 0 /* not counted, compared only */}} {
		g6 := ioTool(t, nil, geng, append([]string{"-q", "-g"}, c.args...)...)
		s6 := ioTool(t, nil, geng, append([]string{"-q", "-s"}, c.args...)...)
		rg := ioRead(t, string(g6), FormatAuto)
		rs := ioRead(t, string(s6), FormatAuto)
		if rg.Format != FormatGraph6 || rs.Format != FormatSparse6 {
			t.Errorf("geng %v: detected %v and %v", c.args, rg.Format, rs.Format)
		}
		if c.want > 0 && len(rg.Graphs) != c.want {
			t.Errorf("geng %v: read %d graphs, want %d", c.args, len(rg.Graphs), c.want)
		}
		if len(rg.Graphs) != len(rs.Graphs) {
			t.Fatalf("geng %v: %d graph6 graphs but %d sparse6 graphs", c.args, len(rg.Graphs), len(rs.Graphs))
		}
		gl, sl := ioLines(g6), ioLines(s6)
		for i := range rg.Graphs {
			if rg.Graphs[i].ID() != rs.Graphs[i].ID() {
				t.Errorf("geng %v graph %d: %s and %s differ", c.args, i+1, gl[i], sl[i])
			}
			if got := string(AppendGraph6(nil, rs.Graphs[i])); got != gl[i] {
				t.Errorf("graph6 of %s: %s, geng wrote %s", sl[i], got, gl[i])
			}
			if got := string(AppendSparse6(nil, rg.Graphs[i])); got != sl[i] {
				t.Errorf("sparse6 of %s: %s, geng wrote %s", gl[i], got, sl[i])
			}
		}
	}
}

// TestNautyRandomAgrees decodes random graphs from nauty's genrang and
// compares with nauty's listg -e edge lists, and re-encodes them and
// compares byte for byte with nauty's copyg (Debian package nauty). The
// vertex counts include 2, 4, 8 and 16, where sparse6 padding has its
// special case.
func TestNautyRandomAgrees(t *testing.T) {
	genrang := testtools.Require(t, "nauty-genrang", "nauty")
	listg := testtools.Require(t, "nauty-listg", "nauty")
	copyg := testtools.Require(t, "nauty-copyg", "nauty")
	for seed, n := range []int{2, 3, 4, 5, 7, 8, 9, 15, 16, 17, 31, 32, 33, 64, 100, 300} {
		for _, e := range []int{1, n / 2, 2 * n} {
			if e > n*(n-1)/2 {
				continue
			}
			s6 := ioTool(t, nil, genrang, "-q", fmt.Sprintf("-S%d", seed*100+e), fmt.Sprintf("-e%d", e), strconv.Itoa(n), "20")
			g6 := ioTool(t, s6, copyg, "-q", "-g")
			s6b := ioTool(t, s6, copyg, "-q", "-s")
			el := ioTool(t, s6, listg, "-q", "-e", "-l0")
			rs := ioRead(t, string(s6), FormatSparse6)
			rg := ioRead(t, string(g6), FormatGraph6)
			want := ioListgEdges(t, el)
			if len(want) != len(rs.Graphs) || len(rg.Graphs) != len(rs.Graphs) {
				t.Fatalf("n=%d e=%d: %d sparse6, %d graph6, %d listg graphs", n, e, len(rs.Graphs), len(rg.Graphs), len(want))
			}
			gl, sl := ioLines(g6), ioLines(s6b)
			for i, g := range rs.Graphs {
				if got := fmt.Sprint(g.N(), ioIndexEdges(g)); got != want[i] {
					t.Errorf("n=%d e=%d graph %d: we decode %s, listg %s", n, e, i+1, got, want[i])
				}
				if rg.Graphs[i].ID() != g.ID() {
					t.Errorf("n=%d e=%d graph %d: graph6 and sparse6 differ", n, e, i+1)
				}
				if got := string(AppendSparse6(nil, g)); got != sl[i] {
					t.Errorf("n=%d e=%d graph %d: sparse6 %s, copyg %s", n, e, i+1, got, sl[i])
				}
				if got := string(AppendGraph6(nil, g)); got != gl[i] {
					t.Errorf("n=%d e=%d graph %d: graph6 %s, copyg %s", n, e, i+1, got, gl[i])
				}
			}
		}
	}
}

// ioListgEdges parses listg -e output ("n m" then the edges as pairs) into
// fmt.Sprint(n, sorted edges) per graph.
func ioListgEdges(t testing.TB, out []byte) []string {
	t.Helper()
	var res []string
	f := strings.Fields(string(out))
	for i := 0; i < len(f); {
		n, _ := strconv.Atoi(f[i])
		m, _ := strconv.Atoi(f[i+1])
		i += 2
		var edges [][2]int
		for k := 0; k < m; k++ {
			u, _ := strconv.Atoi(f[i])
			v, _ := strconv.Atoi(f[i+1])
			i += 2
			edges = append(edges, [2]int{min(u, v), max(u, v)})
		}
		slices.SortFunc(edges, func(a, b [2]int) int {
			if a[0] != b[0] {
				return a[0] - b[0]
			}
			return a[1] - b[1]
		})
		res = append(res, fmt.Sprint(n, edges))
	}
	return res
}

// TestSparse6MultiEdgesAndLoops reads nauty genrang output with multiple
// edges (merged with a warning) and with loops (an error naming the line).
func TestSparse6MultiEdgesAndLoops(t *testing.T) {
	genrang := testtools.Require(t, "nauty-genrang", "nauty")
	multi := ioTool(t, nil, genrang, "-q", "-S11", "-r4", "-m3", "10", "5")
	res := ioRead(t, string(multi), FormatSparse6)
	if len(res.Graphs) != 5 || len(res.Warnings) == 0 {
		t.Errorf("multigraphs: %d graphs, warnings %q; want 5 graphs and warnings", len(res.Graphs), res.Warnings)
	}
	for _, w := range res.Warnings {
		if !strings.HasPrefix(w, "test:") || !strings.Contains(w, "repeated edge") {
			t.Errorf("warning %q does not name the line and the merge", w)
		}
	}
	loops := ioTool(t, nil, genrang, "-q", "-S12", "-l1", "-P1/2", "10", "5")
	_, err := Read(bytes.NewReader(loops), "loops.s6", FormatSparse6)
	var pe *textpos.Error
	if !errors.As(err, &pe) || pe.Line < 1 || !strings.Contains(pe.Msg, "self-loop") {
		t.Errorf("sparse6 with loops: error %v, want a self-loop textpos.Error with a line", err)
	}
}

// TestBadInputs reads each file of testdata/graphs/bad and checks the error
// names the file and line and says what was expected.
func TestBadInputs(t *testing.T) {
	cases := []struct {
		file string
		f    Format
		line int
		want string
	}{
		{"dimacs_more_edges.dimacs", FormatDIMACS, 5, "more edge lines than the 2"},
		{"dimacs_fewer_edges.dimacs", FormatDIMACS, 2, "declares 3 edges, found 2 edge lines"},
		{"dimacs_out_of_range.dimacs", FormatDIMACS, 3, "expected a vertex number in 1..3, found \"4\""},
		{"dimacs_zero_vertex.dimacs", FormatDIMACS, 2, "expected a vertex number in 1..3, found \"0\""},
		{"dimacs_self_loop.dimacs", FormatDIMACS, 3, "self-loop at vertex 2"},
		{"dimacs_edge_before_p.dimacs", FormatDIMACS, 2, "edge line before the problem line"},
		{"dimacs_two_p.dimacs", FormatDIMACS, 3, "second problem line (the first is on line 1)"},
		{"dimacs_bad_format_word.dimacs", FormatDIMACS, 1, "expected the format word 'edge'"},
		{"dimacs_bad_count.dimacs", FormatDIMACS, 1, "expected the number of edges"},
		{"dimacs_short_edge.dimacs", FormatDIMACS, 2, "expected an edge line 'e W V' with 3 fields, found 2"},
		{"dimacs_unknown_line.dimacs", FormatDIMACS, 3, "unexpected line type \"x\""},
		{"dimacs_no_p.dimacs", FormatDIMACS, 0, "no problem line"},
		{"dimacs_too_many_vertices.dimacs", FormatDIMACS, 1, "spinecert reads at most"},
		{"dimacs_isolated_bomb.dimacs", FormatDIMACS, 1, "graph declares 67108864 vertices in a file of 18 bytes; spinecert reads at most 64 vertices per byte plus 1048576 (here 1049728)"},
		{"graph6_truncated.g6", FormatGraph6, 2, "truncated graph6: n = 5 needs 2 data bytes after N(n), found 1"},
		{"graph6_too_long.g6", FormatGraph6, 1, "graph6 too long"},
		{"graph6_bad_char.g6", FormatGraph6, 1, "unexpected byte ' '"},
		{"graph6_padding.g6", FormatGraph6, 1, "padding bits must be zero"},
		{"graph6_empty_line.g6", FormatGraph6, 2, "empty line"},
		{"graph6_truncated_n.g6", FormatGraph6, 1, "truncated vertex count"},
		{"graph6_huge_n.g6", FormatGraph6, 1, "spinecert reads at most"},
		{"graph6_then_sparse6.g6", FormatGraph6, 2, "sparse6 graph (':') after a >>graph6<< header"},
		{"sparse6_self_loop.s6", FormatSparse6, 1, "self-loop at vertex 0"},
		{"sparse6_incremental.s6", FormatSparse6, 2, "incremental sparse6"},
		{"sparse6_out_of_range.s6", FormatSparse6, 1, "beyond n-1 = 3"},
		{"sparse6_bad_char.s6", FormatSparse6, 1, "unexpected byte"},
		{"sparse6_isolated_bomb.s6", FormatSparse6, 1, "graph declares 67108864 vertices in a sparse6 line of 9 bytes; spinecert reads at most 64 vertices per byte plus 1048576 (here 1049152)"},
		{"digraph6.d6", FormatGraph6, 1, "digraph6"},
		{"edgelist_three_labels.edges", FormatEdgeList, 2, "expected one or two vertex labels"},
		{"edgelist_self_loop.edges", FormatEdgeList, 3, "self-loop at vertex \"b\""},
	}
	seen := map[string]bool{}
	for _, c := range cases {
		path := filepath.Join("testdata", "graphs", "bad", c.file)
		seen[c.file] = true
		for _, f := range []Format{c.f, FormatAuto} {
			_, err := ReadFile(path, f)
			var pe *textpos.Error
			if !errors.As(err, &pe) {
				t.Errorf("%s (%v): error %v, want a *textpos.Error", c.file, f, err)
				continue
			}
			prefix := path + ":"
			if c.line > 0 {
				prefix = fmt.Sprintf("%s:%d:", path, c.line)
			}
			if msg := err.Error(); !strings.HasPrefix(msg, prefix) || !strings.Contains(msg, c.want) {
				t.Errorf("%s (%v): error %q, want prefix %q and %q", c.file, f, msg, prefix, c.want)
			}
		}
	}
	entries, err := os.ReadDir(filepath.Join("testdata", "graphs", "bad"))
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		if !seen[e.Name()] {
			t.Errorf("testdata/graphs/bad/%s has no row in the table", e.Name())
		}
	}
}

// TestGoodFiles reads each file of testdata/graphs with auto-detection and
// checks the format and the counts: the Groetzsch graph has 11 vertices and
// 20 edges (Mycielski 1955, from memory); geng -c 5 gives 21 graphs (OEIS
// A001349, from memory), the first with 4 edges (a tree: geng lists by
// increasing edges, common practice, no source).
func TestGoodFiles(t *testing.T) {
	cases := []struct {
		file       string
		f          Format
		graphs     int
		n, m       int
		wantWarned bool
	}{
		{"grotzsch.dimacs", FormatDIMACS, 1, 11, 20, false},
		{"lab.edges", FormatEdgeList, 1, 7, 6, true},
		{"geng5c.g6", FormatGraph6, 21, 5, 4, false},
		{"geng5c.s6", FormatSparse6, 21, 5, 4, false},
		{"formats_examples.g6", FormatGraph6, 3, 5, 4, false},
	}
	for _, c := range cases {
		res, err := ReadFile(filepath.Join("testdata", "graphs", c.file), FormatAuto)
		if err != nil {
			t.Errorf("%s: %v", c.file, err)
			continue
		}
		g := res.Graphs[0]
		if res.Format != c.f || len(res.Graphs) != c.graphs || g.N() != c.n || g.M() != c.m || (len(res.Warnings) > 0) != c.wantWarned {
			t.Errorf("%s: %v, %d graphs, first %v, warnings %q; want %v, %d graphs, n=%d m=%d, warned %v",
				c.file, res.Format, len(res.Graphs), g, res.Warnings, c.f, c.graphs, c.n, c.m, c.wantWarned)
		}
	}
}

// ioEdgeListInput is a numbered edge list of m random edges on n vertices.
func ioEdgeListInput(n, m int) []byte {
	r := rand.New(rand.NewPCG(1, 2))
	var b []byte
	for i := 0; i < m; i++ {
		u := r.IntN(n)
		v := r.IntN(n - 1)
		if v >= u {
			v++
		}
		b = strconv.AppendInt(b, int64(u), 10)
		b = append(b, ' ')
		b = strconv.AppendInt(b, int64(v), 10)
		b = append(b, '\n')
	}
	return b
}

// BenchmarkReadEdgeList reads a file of 10^6 random edges on 10^5 numbered
// vertices, as the command line does; edges/s is the figure to quote.
func BenchmarkReadEdgeList(b *testing.B) {
	const m = 1000000
	path := filepath.Join(b.TempDir(), "bench.edges")
	if err := os.WriteFile(path, ioEdgeListInput(100000, m), 0o644); err != nil {
		b.Fatal(err)
	}
	st, _ := os.Stat(path)
	b.SetBytes(st.Size())
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := ReadFile(path, FormatEdgeList); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(m)*float64(b.N)/b.Elapsed().Seconds(), "edges/s")
}

// A UTF-8 byte-order mark at the start is dropped with a warning; it does
// not become part of the first label, and the graph keeps its identity.
func TestByteOrderMark(t *testing.T) {
	for _, body := range []string{"a b\nb c\n", "1 2\n2 3\n", "p edge 3 2\ne 1 2\ne 2 3\n"} {
		plain, err := Read(strings.NewReader(body), "g", FormatAuto)
		if err != nil {
			t.Fatal(err)
		}
		res, err := Read(strings.NewReader("\ufeff"+body), "g", FormatAuto)
		if err != nil {
			t.Fatalf("%q with a byte-order mark: %v", body, err)
		}
		if res.Format != plain.Format || res.Graphs[0].ID() != plain.Graphs[0].ID() {
			t.Errorf("%q: with a byte-order mark %v %s, without %v %s", body, res.Format, res.Graphs[0].ID(), plain.Format, plain.Graphs[0].ID())
		}
		if len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], "g: ignored the UTF-8 byte-order mark") {
			t.Errorf("%q: warnings %q", body, res.Warnings)
		}
	}
}

// A DIMACS file may declare 64 vertices per byte plus 2^20: "p edge N 0"
// (17 bytes) reads with N = 64·17+2^20 isolated vertices and is refused,
// at the column of N, with one more.
func TestDeclaredVertexLimit(t *testing.T) {
	const lim = 64*17 + 1<<20
	res, err := Read(strings.NewReader(fmt.Sprintf("p edge %d 0\n", lim)), "at.dimacs", FormatDIMACS)
	if err != nil || res.Graphs[0].N() != lim {
		t.Fatalf("at the limit: %v", err)
	}
	_, err = Read(strings.NewReader(fmt.Sprintf("p edge %d 0\n", lim+1)), "over.dimacs", FormatDIMACS)
	if err == nil || !strings.HasPrefix(err.Error(), "over.dimacs:1:8: graph declares 1049665 vertices in a file of 17 bytes") {
		t.Fatalf("over the limit: %v", err)
	}
}
