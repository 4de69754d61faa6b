package draw

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// completeLayout is the ⌈n/2⌉-page book embedding of K_n (Bernhart and
// Kainen, "The book thickness of a graph", JCTB 27, 1979): chords {u, v} of
// the circle 0..n'-1 (n' = n rounded up to even) go to page ((u+v) mod n')/2 + 1.
func completeLayout(g *graph.Graph, kind cert.Kind) *cert.Layout {
	n := g.N()
	nn := n + n%2
	l := &cert.Layout{Kind: kind}
	for i := 0; i < n; i++ {
		l.Order = append(l.Order, int32(i))
	}
	for _, e := range g.Edges() {
		l.Page = append(l.Page, int32((int(e.U)+int(e.V))%nn/2)+1)
	}
	for i := 0; i < (n+1)/2; i++ {
		l.PageKinds = append(l.PageKinds, kind)
	}
	return l
}

// walkSVG decodes an SVG with encoding/xml (well-formedness, XML 1.0) and
// calls start for every element with its attributes by name; the character
// data directly inside that element goes to the function start returns, if
// any.
func walkSVG(t *testing.T, data []byte, start func(name string, attr map[string]string) (text func(string))) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(data))
	var text func(string)
	for {
		tok, err := d.Token()
		if err == io.EOF {
			return
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			attr := map[string]string{}
			for _, a := range tok.Attr {
				attr[a.Name.Local] = a.Value
			}
			text = start(tok.Name.Local, attr)
		case xml.CharData:
			if text != nil {
				text(string(tok))
			}
		case xml.EndElement:
			text = nil
		}
	}
}

// scan collects the arcs per edge, the pages named in the legend, and the
// name of the root element.
func scan(t *testing.T, data []byte) (arcs map[int]int, legend map[int]bool, root string) {
	t.Helper()
	arcs, legend = map[int]int{}, map[int]bool{}
	walkSVG(t, data, func(name string, attr map[string]string) func(string) {
		if root == "" {
			root = name
		}
		if v, ok := attr["data-edge"]; ok && name == "path" {
			e, _ := strconv.Atoi(v)
			arcs[e]++
		}
		if v, ok := attr["data-legend-page"]; ok && name == "text" {
			p, _ := strconv.Atoi(v)
			legend[p] = true
		}
		return nil
	})
	return arcs, legend, root
}

func TestSVGComplete(t *testing.T) {
	for _, n := range []int{4, 9, 40} {
		g := fixture.WithBase(fixture.Complete(n), 1)
		l := completeLayout(g, cert.Stack)
		var buf bytes.Buffer
		opts := Options{Title: "K_" + strconv.Itoa(n) + " <book> & pages", HighlightEdges: []int{0, 1}, HighlightVertices: []int32{0}}
		if err := SVG(&buf, g, l, opts); err != nil {
			t.Fatal(err)
		}
		arcs, legend, root := scan(t, buf.Bytes())
		if root != "svg" {
			t.Fatalf("root element %q", root)
		}
		if len(arcs) != g.M() {
			t.Fatalf("K_%d: %d arcs for %d edges", n, len(arcs), g.M())
		}
		for e, c := range arcs {
			if c != 1 || e < 0 || e >= g.M() {
				t.Fatalf("edge %d drawn %d times", e, c)
			}
		}
		for p := 1; p <= l.UsedPages(); p++ {
			if !legend[p] {
				t.Fatalf("legend misses page %d", p)
			}
		}
		if len(legend) != l.Pages() {
			t.Fatalf("legend lists %d pages, layout has %d", len(legend), l.Pages())
		}
		var again bytes.Buffer
		_ = SVG(&again, g, l, opts)
		if !bytes.Equal(buf.Bytes(), again.Bytes()) {
			t.Fatal("output not deterministic")
		}
		if dir := os.Getenv("SPINECERT_DRAW_OUT"); dir != "" {
			_ = os.WriteFile(filepath.Join(dir, "K"+strconv.Itoa(n)+".svg"), buf.Bytes(), 0o644)
		}
	}
}

func TestSVGLabelsEscaped(t *testing.T) {
	b := graph.NewBuilder()
	u, v, w := b.Vertex("a<b"), b.Vertex(`"q"&`), b.Vertex("ünï")
	_ = b.AddEdge(u, v)
	_ = b.AddEdge(v, w)
	g, _ := b.Build()
	l := &cert.Layout{Kind: cert.Queue, PageKinds: []cert.Kind{cert.Queue}, Order: []int32{0, 1, 2}, Page: []int32{1, 1}}
	var buf bytes.Buffer
	if err := SVG(&buf, g, l, Options{}); err != nil {
		t.Fatal(err)
	}
	arcs, legend, _ := scan(t, buf.Bytes())
	if len(arcs) != 2 || !legend[1] {
		t.Fatalf("arcs %v legend %v", arcs, legend)
	}
	if !bytes.Contains(buf.Bytes(), []byte("a&lt;b")) {
		t.Fatal("label not escaped")
	}
}

func TestSVGShape(t *testing.T) {
	g := fixture.WithBase(fixture.Complete(4), 1)
	good := completeLayout(g, cert.Stack)
	bad := []*cert.Layout{
		{Kind: cert.Stack, PageKinds: good.PageKinds, Order: good.Order[:3], Page: good.Page},
		{Kind: cert.Stack, PageKinds: good.PageKinds, Order: []int32{0, 1, 2, 2}, Page: good.Page},
		{Kind: cert.Stack, PageKinds: good.PageKinds, Order: good.Order, Page: append([]int32{3}, good.Page[1:]...)},
		{Kind: cert.Stack, PageKinds: good.PageKinds, Order: good.Order, Page: good.Page[1:]},
	}
	for i, l := range bad {
		if err := SVG(io.Discard, g, l, Options{}); !errors.Is(err, ErrShape) {
			t.Errorf("layout %d: err = %v, want ErrShape", i, err)
		}
	}
	if err := SVG(io.Discard, g, good, Options{HighlightEdges: []int{99}}); err == nil {
		t.Error("highlight out of range accepted")
	}
}

// TestSVGHighlight checks that exactly the highlighted edges and vertices are
// marked and that the legend names the highlight set.
func TestSVGHighlight(t *testing.T) {
	g := fixture.WithBase(fixture.Complete(6), 1)
	l := completeLayout(g, cert.Stack)
	hiE := []int{0, 4, 9}
	hiV := []int32{1, 5}
	var buf bytes.Buffer
	if err := SVG(&buf, g, l, Options{HighlightEdges: hiE, HighlightVertices: hiV, HighlightLabel: "K3,3 <subdivision>"}); err != nil {
		t.Fatal(err)
	}
	edges, labels := map[int]bool{}, map[string]bool{}
	legend := ""
	walkSVG(t, buf.Bytes(), func(name string, attr map[string]string) func(string) {
		hi := attr["data-highlight"] == "1"
		if hi && name == "path" {
			e, _ := strconv.Atoi(attr["data-edge"])
			edges[e] = true
		}
		switch {
		case hi && name == "text":
			return func(s string) { labels[s] = true }
		case attr["data-legend-highlight"] == "1":
			return func(s string) { legend += s }
		}
		return nil
	})
	if len(edges) != len(hiE) {
		t.Fatalf("highlighted arcs %v, want %v", edges, hiE)
	}
	for _, e := range hiE {
		if !edges[e] {
			t.Fatalf("edge %d not highlighted (got %v)", e, edges)
		}
	}
	if len(labels) != len(hiV) || !labels[g.Label(1)] || !labels[g.Label(5)] {
		t.Fatalf("highlighted vertex labels %v, want %q and %q", labels, g.Label(1), g.Label(5))
	}
	if legend != "highlighted: K3,3 <subdivision>" {
		t.Fatalf("legend entry %q", legend)
	}

	// Without a highlight set there is no legend entry and nothing marked.
	buf.Reset()
	if err := SVG(&buf, g, l, Options{}); err != nil {
		t.Fatal(err)
	}
	if bytes.Contains(buf.Bytes(), []byte("data-highlight")) || bytes.Contains(buf.Bytes(), []byte("data-legend-highlight")) {
		t.Fatal("highlight marks without a highlight set")
	}
}
