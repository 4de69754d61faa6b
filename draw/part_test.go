package draw

import (
	"bytes"
	"io"
	"strconv"
	"strings"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// drawing is what a test reads back from an SVG: the arcs drawn in full and
// as stubs (by edge index), the spine positions of the drawn vertices, and
// the text saying what part is drawn.
type drawing struct {
	full, stubs map[int]bool
	pos         []int
	part        string
}

func readDrawing(t *testing.T, data []byte) drawing {
	t.Helper()
	dr := drawing{full: map[int]bool{}, stubs: map[int]bool{}}
	walkSVG(t, data, func(name string, attr map[string]string) func(string) {
		if name == "path" {
			e, err := strconv.Atoi(attr["data-edge"])
			if err != nil {
				t.Fatalf("arc without data-edge: %v", attr)
			}
			m := dr.full
			if attr["data-stub"] == "1" {
				m = dr.stubs
			}
			if dr.full[e] || dr.stubs[e] {
				t.Fatalf("edge %d drawn twice", e)
			}
			m[e] = true
		}
		if p, ok := attr["data-pos"]; ok && name == "text" {
			v, _ := strconv.Atoi(p)
			dr.pos = append(dr.pos, v)
		}
		if attr["data-legend-part"] == "1" {
			return func(s string) { dr.part += s }
		}
		return nil
	})
	return dr
}

// TestSVGWindowComplete draws windows of the spine of the ⌈n/2⌉-page layout
// of K_n (Bernhart and Kainen 1979). In K_n every pair of vertices is an
// edge, so a window of w of the n spine positions holds exactly C(w,2) edges
// with both ends inside and w·(n−w) edges with one end inside (counting,
// no source needed); the arcs drawn in full must be exactly the edges
// between window vertices, the stubs exactly the edges leaving it.
func TestSVGWindowComplete(t *testing.T) {
	for _, tc := range []struct{ n, from, to int }{{10, 3, 7}, {10, 1, 10}, {10, 10, 10}, {40, 1, 5}, {40, 31, 40}, {41, 12, 29}} {
		g := fixture.WithBase(fixture.Complete(tc.n), 1)
		l := completeLayout(g, cert.Stack)
		// Reverse the spine so positions and vertex numbers differ.
		l.Order = l.Order[:0]
		for v := tc.n - 1; v >= 0; v-- {
			l.Order = append(l.Order, int32(v))
		}
		inside := func(v int32) bool { p := tc.n - int(v); return p >= tc.from && p <= tc.to }
		w := tc.to - tc.from + 1
		for _, omit := range []bool{false, true} {
			var buf bytes.Buffer
			if err := SVG(&buf, g, l, Options{Window: &Window{tc.from, tc.to}, OmitLeaving: omit}); err != nil {
				t.Fatal(err)
			}
			dr := readDrawing(t, buf.Bytes())
			if len(dr.full) != w*(w-1)/2 {
				t.Fatalf("K_%d window %d:%d: %d full arcs, want C(%d,2) = %d", tc.n, tc.from, tc.to, len(dr.full), w, w*(w-1)/2)
			}
			wantStubs := w * (tc.n - w)
			if omit {
				wantStubs = 0
			}
			if len(dr.stubs) != wantStubs {
				t.Fatalf("K_%d window %d:%d omit=%v: %d stubs, want %d", tc.n, tc.from, tc.to, omit, len(dr.stubs), wantStubs)
			}
			for e, ed := range g.Edges() {
				in := inside(ed.U) && inside(ed.V)
				leaves := inside(ed.U) != inside(ed.V)
				if dr.full[e] != in || dr.stubs[e] != (leaves && !omit) {
					t.Fatalf("K_%d window %d:%d: edge %s–%s drawn full=%v stub=%v", tc.n, tc.from, tc.to, g.Label(ed.U), g.Label(ed.V), dr.full[e], dr.stubs[e])
				}
			}
			if len(dr.pos) != w {
				t.Fatalf("%d vertices drawn, want %d", len(dr.pos), w)
			}
			for i, p := range dr.pos {
				if p != tc.from+i {
					t.Fatalf("drawn positions %v, want %d..%d", dr.pos, tc.from, tc.to)
				}
			}
			want := "spine positions " + strconv.Itoa(tc.from) + "–" + strconv.Itoa(tc.to) + " of " + strconv.Itoa(tc.n)
			if !strings.Contains(dr.part, want) || !bytes.Contains(buf.Bytes(), []byte("<desc data-part=\"1\">drawn: "+want)) {
				t.Fatalf("legend %q does not say %q", dr.part, want)
			}
			outside := tc.n*(tc.n-1)/2 - w*(w-1)/2 - w*(tc.n-w)
			if !strings.Contains(dr.part, strconv.Itoa(outside)+" outside not drawn") {
				t.Fatalf("legend %q does not count %d edges outside", dr.part, outside)
			}
		}
	}
}

// TestSVGAroundGrid draws the ball of radius r around the centre of a grid.
// In the square grid the vertices at distance at most r from a vertex far
// from the border number 2r²+2r+1 (the centred square numbers, OEIS A001844,
// from memory), and the graph distance in a grid is the Manhattan distance.
func TestSVGAroundGrid(t *testing.T) {
	g := fixture.Grid(11, 11)
	centre := int32(5*11 + 5)
	for r := 0; r <= 4; r++ {
		vs := Around(g, centre, r)
		if len(vs) != 2*r*r+2*r+1 {
			t.Fatalf("radius %d: %d vertices, want 2r²+2r+1 = %d", r, len(vs), 2*r*r+2*r+1)
		}
		in := map[int32]bool{}
		for _, v := range vs {
			// Manhattan distance in the grid, the graph distance of a grid.
			dr, dc := int(v)/11-5, int(v)%11-5
			if abs(dr)+abs(dc) > r {
				t.Fatalf("radius %d: vertex %d at distance %d", r, v, abs(dr)+abs(dc))
			}
			in[v] = true
		}
		l := spineInOrder(g)
		var buf bytes.Buffer
		if err := SVG(&buf, g, l, Options{Vertices: vs, VerticesLabel: "within " + strconv.Itoa(r) + " of the centre"}); err != nil {
			t.Fatal(err)
		}
		d := readDrawing(t, buf.Bytes())
		for e, ed := range g.Edges() {
			if d.full[e] != (in[ed.U] && in[ed.V]) || d.stubs[e] != (in[ed.U] != in[ed.V]) {
				t.Fatalf("radius %d: edge %d drawn full=%v stub=%v", r, e, d.full[e], d.stubs[e])
			}
		}
		if !strings.Contains(d.part, "within "+strconv.Itoa(r)+" of the centre") {
			t.Fatalf("legend %q", d.part)
		}
	}
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

// spineInOrder is a one-page layout of g with the spine in vertex order (its
// crossings do not matter to the drawing).
func spineInOrder(g *graph.Graph) *cert.Layout {
	l := &cert.Layout{Kind: cert.Stack, PageKinds: []cert.Kind{cert.Stack}}
	for v := 0; v < g.N(); v++ {
		l.Order = append(l.Order, int32(v))
	}
	for range g.Edges() {
		l.Page = append(l.Page, 1)
	}
	return l
}

func TestSVGWindowErrors(t *testing.T) {
	g := fixture.Complete(5)
	l := completeLayout(g, cert.Stack)
	for _, w := range []Window{{0, 3}, {2, 6}, {4, 3}} {
		if err := SVG(io.Discard, g, l, Options{Window: &w}); err == nil {
			t.Errorf("window %v accepted", w)
		}
	}
	if err := SVG(io.Discard, g, l, Options{Vertices: []int32{7}}); err == nil {
		t.Error("vertex out of range accepted")
	}
}

// BenchmarkSVGWindow draws a 100-position window of a 10^5-edge layout.
func BenchmarkSVGWindow(b *testing.B) {
	g := fixture.Grid(224, 224) // 50176 vertices, 99904 edges
	l := spineInOrder(g)
	b.ResetTimer()
	for range b.N {
		if err := SVG(io.Discard, g, l, Options{Window: &Window{20000, 20099}}); err != nil {
			b.Fatal(err)
		}
	}
}
