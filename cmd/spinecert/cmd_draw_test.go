package main

import (
	"bytes"
	"context"
	"encoding/xml"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// petersenEdges is the Petersen graph: outer 5-cycle 0..4, spokes i–i+5,
// inner pentagram 5–7–9–6–8–5.
var petersenEdges = [][2]int{
	{0, 1}, {1, 2}, {2, 3}, {3, 4}, {4, 0},
	{0, 5}, {1, 6}, {2, 7}, {3, 8}, {4, 9},
	{5, 7}, {7, 9}, {9, 6}, {6, 8}, {8, 5},
}

// drawRun runs spinecert draw with args and returns the exit status and stderr.
func drawRun(t *testing.T, args ...string) (int, string) {
	t.Helper()
	cmd := newDrawCmd()
	var out, errOut bytes.Buffer
	cmd.SetArgs(args)
	cmd.SetOut(&out)
	cmd.SetErr(&errOut)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	err := cmd.ExecuteContext(context.Background())
	if err != nil {
		fmt.Fprintln(&errOut, err)
	}
	return exitCode(err), errOut.String()
}

func writeTestFile(t *testing.T, dir, name, text string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// edgeListAndLayout writes g as an edge list and a one-page layout with the
// spine in label order (its crossings do not stop the drawing).
func edgeListAndLayout(t *testing.T, dir, name string, n int, edges [][2]int) (string, string) {
	var el, lay strings.Builder
	lay.WriteString(`{"kind":"stack","pages":1,"spine":[`)
	for v := 0; v < n; v++ {
		if v > 0 {
			lay.WriteString(",")
		}
		fmt.Fprint(&lay, v)
	}
	lay.WriteString(`],"edges":[`)
	for i, e := range edges {
		fmt.Fprintf(&el, "%d %d\n", e[0], e[1])
		if i > 0 {
			lay.WriteString(",")
		}
		fmt.Fprintf(&lay, "[%d,%d,1]", e[0], e[1])
	}
	lay.WriteString("]}\n")
	return writeTestFile(t, dir, name+".txt", el.String()), writeTestFile(t, dir, name+".json", lay.String())
}

// highlightedSubgraph reads back from the SVG the edges drawn highlighted (as
// pairs of vertex labels, through the edge index in data-edge) and the
// vertex labels drawn highlighted.
func highlightedSubgraph(t *testing.T, svg []byte, graphFile string) (edges [][2]string, branch map[string]bool) {
	t.Helper()
	g, err := loadGraph(graphFile, 0)
	if err != nil {
		t.Fatal(err)
	}
	branch = map[string]bool{}
	d := xml.NewDecoder(bytes.NewReader(svg))
	inLabel := false
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG not well-formed: %v", err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			attr := map[string]string{}
			for _, a := range tok.Attr {
				attr[a.Name.Local] = a.Value
			}
			inLabel = tok.Name.Local == "text" && attr["data-highlight"] == "1"
			if tok.Name.Local == "path" && attr["data-highlight"] == "1" {
				e, err := strconv.Atoi(attr["data-edge"])
				if err != nil || e < 0 || e >= g.M() {
					t.Fatalf("highlighted arc with data-edge %q", attr["data-edge"])
				}
				ge := g.Edges()[e]
				edges = append(edges, [2]string{g.Label(ge.U), g.Label(ge.V)})
			}
		case xml.CharData:
			if inLabel {
				branch[string(tok)] = true
			}
		case xml.EndElement:
			inLabel = false
		}
	}
	return edges, branch
}

// suppress replaces every chain of degree-2 vertices between two branch
// vertices by one edge and returns those edges; it fails when the subgraph
// is not a subdivision with exactly these branch vertices (a vertex of
// another degree, a chain that does not end at a branch vertex, an edge left
// over). This is the definition of a subdivision (Kuratowski, "Sur le
// problème des courbes gauches en topologie", Fund. Math. 15, 1930),
// written here without the code under test.
func suppress(t *testing.T, edges [][2]string, branch map[string]bool) [][2]string {
	t.Helper()
	adj := map[string][]int{}
	for i, e := range edges {
		adj[e[0]] = append(adj[e[0]], i)
		adj[e[1]] = append(adj[e[1]], i)
	}
	for v, inc := range adj {
		if !branch[v] && len(inc) != 2 {
			t.Fatalf("vertex %s has %d highlighted edges but is not a branch vertex", v, len(inc))
		}
	}
	used := make([]bool, len(edges))
	var out [][2]string
	for b := range branch {
		for _, e := range adj[b] {
			if used[e] {
				continue
			}
			prev, cur := b, ""
			for {
				used[e] = true
				cur = edges[e][0]
				if cur == prev {
					cur = edges[e][1]
				}
				if branch[cur] {
					break
				}
				next := adj[cur][0]
				if next == e {
					next = adj[cur][1]
				}
				prev, e = cur, next
			}
			out = append(out, [2]string{b, cur})
		}
	}
	for e, u := range used {
		if !u {
			t.Fatalf("highlighted edge %v lies on no path between branch vertices", edges[e])
		}
	}
	return out
}

// isK33 reports whether the pairs are exactly the nine edges of K3,3 on six
// vertices: simple, and 2-colourable with three vertices on each side.
func isK33(pairs [][2]string, branch map[string]bool) bool {
	if len(branch) != 6 || len(pairs) != 9 {
		return false
	}
	seen := map[[2]string]bool{}
	adj := map[string][]string{}
	for _, p := range pairs {
		a, b := min(p[0], p[1]), max(p[0], p[1])
		if a == b || seen[[2]string{a, b}] {
			return false
		}
		seen[[2]string{a, b}] = true
		adj[a], adj[b] = append(adj[a], b), append(adj[b], a)
	}
	side := map[string]int{}
	var start string
	for v := range branch {
		start = v
		break
	}
	side[start] = 1
	queue := []string{start}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		for _, w := range adj[v] {
			switch side[w] {
			case 0:
				side[w] = -side[v]
				queue = append(queue, w)
			case side[v]:
				return false
			}
		}
	}
	count := map[int]int{}
	for v := range branch {
		count[side[v]]++
	}
	return count[1] == 3 && count[-1] == 3
}

// TestDrawKuratowskiPetersen reads the drawing back and checks, with code of
// its own, that the highlighted subgraph is a subdivision of K3,3: the
// Petersen graph is not planar and has a K3,3 subdivision but no K5
// subdivision (common knowledge, no source).
func TestDrawKuratowskiPetersen(t *testing.T) {
	dir := t.TempDir()
	gf, lf := edgeListAndLayout(t, dir, "petersen", 10, petersenEdges)
	out := filepath.Join(dir, "petersen.svg")
	code, stderr := drawRun(t, gf, lf, "-o", out, "--kuratowski")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	svg, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(svg, []byte(">highlighted: K3,3 subdivision, checked<")) {
		t.Fatal("legend does not name the K3,3 subdivision")
	}
	edges, branch := highlightedSubgraph(t, svg, gf)
	pairs := suppress(t, edges, branch)
	if !isK33(pairs, branch) {
		t.Fatalf("highlighted subgraph with branch vertices %v reduces to %v, not K3,3", branch, pairs)
	}
	// A K3,3 subdivision inside a cubic graph on 10 vertices uses at most
	// 6 + 4 vertices, so 9 to 13 edges.
	if len(edges) < 9 || len(edges) > 13 {
		t.Fatalf("%d highlighted edges", len(edges))
	}
}

// TestDrawKuratowskiExitCodes checks the exit statuses of the table in main.go.
func TestDrawKuratowskiExitCodes(t *testing.T) {
	dir := t.TempDir()
	// K3,3 with sides {0,1,2} and {3,4,5}.
	var k33 [][2]int
	for a := 0; a < 3; a++ {
		for b := 3; b < 6; b++ {
			k33 = append(k33, [2]int{a, b})
		}
	}
	kf, kl := edgeListAndLayout(t, dir, "k33", 6, k33)
	// K4 is planar.
	pf, pl := edgeListAndLayout(t, dir, "k4", 4, [][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}})

	if code, stderr := drawRun(t, kf, kl, "-o", filepath.Join(dir, "k33.svg"), "--kuratowski"); code != 0 {
		t.Fatalf("K3,3: exit %d: %s", code, stderr)
	}
	out := filepath.Join(dir, "k4.svg")
	code, stderr := drawRun(t, pf, pl, "-o", out, "--kuratowski")
	if code != exitUsage || !strings.Contains(stderr, "graph is planar: no Kuratowski subgraph") {
		t.Fatalf("K4 --kuratowski: exit %d: %s", code, stderr)
	}
	if _, err := os.Stat(out); err == nil {
		t.Fatal("K4: drawing written")
	}

	// A certificate for K3,3 whose branch vertices are given in the wrong
	// sides: the paths then join vertices of one side (rejected, exit 1).
	id := mustGraphID(t, kf)
	bad := writeTestFile(t, dir, "bad.json", `{"format":"spinecert-planarity","version":1,"graph":"`+id+`","planar":false,
"kuratowski":{"kind":"K3,3","branch":["0","3","2","1","4","5"],
"paths":[["0","3"],["0","4"],["0","5"],["1","3"],["1","4"],["1","5"],["2","3"],["2","4"],["2","5"]]}}`)
	out = filepath.Join(dir, "bad.svg")
	code, stderr = drawRun(t, kf, kl, "-o", out, "--kuratowski-cert", bad)
	if code != exitRefuted || !strings.Contains(stderr, "certificate rejected") {
		t.Fatalf("bad certificate: exit %d: %s", code, stderr)
	}
	if _, err := os.Stat(out); err == nil {
		t.Fatal("bad certificate: drawing written")
	}
	good := writeTestFile(t, dir, "good.json", strings.Replace(mustRead(t, bad), `["0","3","2","1","4","5"]`, `["0","1","2","3","4","5"]`, 1))
	if code, stderr := drawRun(t, kf, kl, "-o", filepath.Join(dir, "good.svg"), "--kuratowski-cert", good); code != 0 {
		t.Fatalf("good certificate: exit %d: %s", code, stderr)
	}

	planarCert := writeTestFile(t, dir, "k4.cert.json", `{"format":"spinecert-planarity","version":1,"graph":"`+mustGraphID(t, pf)+`","planar":true,
"rotation":[["0","1","2","3"],["1","0","3","2"],["2","0","1","3"],["3","0","2","1"]]}`)
	code, stderr = drawRun(t, pf, pl, "-o", filepath.Join(dir, "k4c.svg"), "--kuratowski-cert", planarCert)
	if code != exitUsage || !strings.Contains(stderr, "certificate says planar: nothing to highlight") {
		t.Fatalf("planar certificate: exit %d: %s", code, stderr)
	}
}

func mustGraphID(t *testing.T, path string) string {
	t.Helper()
	g, err := loadGraph(path, 0)
	if err != nil {
		t.Fatal(err)
	}
	return g.ID()
}

func mustRead(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}
