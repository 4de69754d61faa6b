package cert

import (
	"bytes"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"spinecert.dev/graph"
	"spinecert.dev/textpos"
)

func TestLayoutJSONRoundTrip(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for trial := 0; trial < 300; trial++ {
		g := randomLayoutGraph(r, 1+r.IntN(15), r.Float64())
		l := randomLayout(r, g, Kind(1+r.IntN(3)), 1+r.IntN(4))
		var buf bytes.Buffer
		if err := WriteLayoutJSON(&buf, g, l); err != nil {
			t.Fatal(err)
		}
		raw, err := ReadLayoutJSON(bytes.NewReader(buf.Bytes()), "layout.json")
		if err != nil {
			t.Fatalf("reading what was written: %v\n%s", err, buf.String())
		}
		if raw.Graph != g.ID() {
			t.Fatalf("graph identity not kept")
		}
		back, rep := Resolve(g, raw)
		if !rep.OK() {
			t.Fatalf("round trip lost something: %v", rep.Err())
		}
		var again bytes.Buffer
		if err := WriteLayoutJSON(&again, g, back); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(buf.Bytes(), again.Bytes()) {
			t.Fatalf("writing is not stable:\n%s\n%s", buf.String(), again.String())
		}
		if Validate(g, back).OK() != Validate(g, l).OK() {
			t.Fatal("verdict changed through the file")
		}
	}
}

func TestCheckRawLayoutFindings(t *testing.T) {
	b := graph.NewBuilder()
	for _, e := range [][2]string{{"a", "b"}, {"b", "c"}, {"c", "d"}, {"a", "c"}} {
		_ = b.AddEdge(b.Vertex(e[0]), b.Vertex(e[1]))
	}
	g, _ := b.Build()
	cases := []struct {
		name, json string
		want       []ProblemKind
	}{
		{"valid", `{"kind":"stack","pages":1,"spine":["a","b","c","d"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1]]}`, nil},
		{"missing edge", `{"kind":"stack","pages":1,"spine":["a","b","c","d"],"edges":[["a","b",1],["b","c",1],["c","d",1]]}`, []ProblemKind{MissingEdge}},
		{"extra edge", `{"kind":"stack","pages":1,"spine":["a","b","c","d"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1],["b","d",1]]}`, []ProblemKind{ExtraEdge}},
		{"duplicate edge", `{"kind":"stack","pages":1,"spine":["a","b","c","d"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1],["c","a",1]]}`, []ProblemKind{DuplicateEdge}},
		{"duplicate vertex", `{"kind":"stack","pages":1,"spine":["a","b","c","d","a"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1]]}`, []ProblemKind{DuplicateVertex}},
		{"missing and unknown vertex", `{"kind":"stack","pages":1,"spine":["a","b","c","x"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1]]}`, []ProblemKind{UnknownVertex, MissingVertex}},
		{"page out of range", `{"kind":"stack","pages":1,"spine":["a","b","c","d"],"edges":[["a","b",1],["b","c",2],["c","d",1],["a","c",1]]}`, []ProblemKind{BadPage}},
		{"crossing", `{"kind":"stack","pages":1,"spine":["a","d","b","c"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1]]}`, []ProblemKind{Crossing}},
		{"nesting", `{"kind":"queue","pages":1,"spine":["d","a","b","c"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1]]}`, []ProblemKind{Nesting}},
		{"mixed fixes it", `{"kind":"mixed","pages":2,"page_kinds":["queue","stack"],"spine":["a","b","c","d"],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",2]]}`, nil},
		{"integer labels compared as text", `{"kind":"stack","pages":1,"spine":["a","b","c",4],"edges":[["a","b",1],["b","c",1],["c","d",1],["a","c",1]]}`, []ProblemKind{UnknownVertex, MissingVertex}},
	}
	defer func(old int) { parallelMin = old }(parallelMin)
	for _, pm := range []int{1 << 16, 0} { // serial and two-half lookups
		parallelMin = pm
		for _, c := range cases {
			t.Run(c.name, func(t *testing.T) {
				raw, err := ReadLayoutJSON(strings.NewReader(c.json), "l.json")
				if err != nil {
					t.Fatal(err)
				}
				rep := Check(g, raw, CheckOptions{})
				got := map[string]bool{}
				for k := range rep.Counts {
					got[k] = true
				}
				if len(got) != len(c.want) {
					t.Fatalf("want %v, got %v (%v)", c.want, rep.Counts, rep.Problems)
				}
				for _, w := range c.want {
					if !got[w.String()] {
						t.Fatalf("want %v, got %v", c.want, rep.Counts)
					}
				}
			})
		}
	}
	raw, _ := ReadLayoutJSON(strings.NewReader(cases[9].json), "l.json")
	if rep := Check(g, raw, CheckOptions{MaxPages: 1}); rep.Counts[PageLimit.String()] != 1 {
		t.Fatalf("page limit not enforced: %v", rep.Counts)
	}
}

// TestLayoutReaderRejectsBadFiles reads every file in testdata/layouts/bad; the
// first line of each file after "//want: " names a fragment of the expected error.
func TestLayoutReaderRejectsBadFiles(t *testing.T) {
	files, _ := filepath.Glob("testdata/layouts/bad/*.json")
	if len(files) == 0 {
		t.Fatal("no bad layout files")
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			data, _ := os.ReadFile(f)
			want, body, _ := strings.Cut(string(data), "\n")
			want = strings.TrimPrefix(want, "//want: ")
			_, err := ReadLayoutJSON(strings.NewReader(body), filepath.Base(f))
			if err == nil {
				t.Fatalf("accepted")
			}
			if !strings.Contains(err.Error(), want) {
				t.Fatalf("error %q lacks %q", err, want)
			}
			if _, ok := err.(*textpos.Error); !ok {
				t.Fatalf("error is %T, want *textpos.Error", err)
			}
		})
	}
}

func FuzzLayoutJSON(f *testing.F) {
	seeds, _ := filepath.Glob("testdata/layouts/*.json")
	bad, _ := filepath.Glob("testdata/layouts/bad/*.json")
	for _, s := range append(seeds, bad...) {
		data, _ := os.ReadFile(s)
		f.Add(data)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		raw, err := ReadLayoutJSON(bytes.NewReader(data), "fuzz.json")
		if err != nil {
			return
		}
		// Build the graph the layout names and check the layout against it:
		// nothing may panic, and a layout that resolves must write and read back.
		b := graph.NewBuilder()
		for i := range raw.NumLabels() {
			b.Vertex(raw.Label(int32(i)))
		}
		for _, e := range raw.Edges {
			if e.U != e.V {
				_ = b.AddEdge(b.Vertex(raw.Label(e.U)), b.Vertex(raw.Label(e.V)))
			}
		}
		g, _ := b.Build()
		rep := Check(g, raw, CheckOptions{})
		l, res := Resolve(g, raw)
		if !res.OK() {
			return
		}
		var buf bytes.Buffer
		if err := WriteLayoutJSON(&buf, g, l); err != nil {
			t.Fatal(err)
		}
		raw2, err := ReadLayoutJSON(&buf, "again.json")
		if err != nil {
			t.Fatalf("rereading a written layout: %v", err)
		}
		if rep2 := Check(g, raw2, CheckOptions{}); rep2.OK() != rep.OK() {
			t.Fatalf("verdict changed after a round trip")
		}
	})
}

// Positions in a single-line layout stay right when the reader refills its
// buffer: near the end of the input (the fast edge path asks for more when
// few bytes are left) and past the first megabyte.
func TestLayoutJSONColumnAfterRefill(t *testing.T) {
	short := `{"kind":"stack","pages":1,"spine":[1,2,3],"edges":[[1,2,1],[2,3,1],[1,3,1],[1,2,1],[2,3,1],9]}`
	var long strings.Builder
	long.WriteString(`{"kind":"stack","pages":1,"spine":[1,2],"edges":[`)
	for long.Len() < 3<<20 {
		long.WriteString("[1,2,1],")
	}
	long.WriteString("[1,2,1]x")
	for in, col := range map[string]int{
		short:                     len(short) - 2, // the stray 9 (column 93)
		long.String():             long.Len(),     // the x
		"\n" + short:              len(short) - 2,
		"{\n" + long.String()[1:]: long.Len() - 1,
	} {
		_, err := ReadLayoutJSON(strings.NewReader(in), "l.json")
		pe, ok := err.(*textpos.Error)
		if !ok {
			t.Fatalf("error %v, want a *textpos.Error", err)
		}
		if line := strings.Count(in, "\n") + 1; pe.Line != line || pe.Col != col {
			t.Errorf("error %v, want it at %d:%d", err, line, col)
		}
	}
}

// TestLabelVertices compares the lookup of a layout's labels, which takes
// runs of consecutive numbers without parsing them, with Index on every
// label, for graphs and label lists with and without gaps.
func TestLabelVertices(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 3000; trial++ {
		b := graph.NewBuilder()
		for k := r.IntN(30); k < 60; k++ {
			if r.IntN(8) > 0 || trial%2 == 0 {
				b.Vertex(strconv.Itoa(k))
			}
		}
		if trial%5 == 0 {
			b.Vertex("x")
			b.Vertex("007")
		}
		g, _ := b.Build()
		var labels []string
		for k := r.IntN(40); k < 40+r.IntN(40); k++ {
			if r.IntN(10) > 0 || trial%3 == 0 {
				labels = append(labels, strconv.Itoa(k))
			}
		}
		if trial%7 == 0 {
			labels = append(labels, "x", "y", "007", "7")
		}
		got := labelVertices(g, labels)
		for i, lab := range labels {
			want, ok := g.Index(lab)
			if !ok {
				want = -1
			}
			if got[i] != want {
				t.Fatalf("trial %d: label %q: vertex %d, want %d (labels %q, graph %q)", trial, lab, got[i], want, labels, g.Labels())
			}
		}
	}
}

// TestRawLabels reads layouts whose labels are consecutive numbers (kept as
// numbers), other numbers, and strings (some met only after numbers), and
// checks that the spine and the edges name the labels of the file.
func TestRawLabels(t *testing.T) {
	for _, c := range []struct {
		spine, edges string
		want         []string // the spine's labels, then each edge's two
	}{
		{`0,1,2`, `[0,1,1],[1,2,1]`, []string{"0", "1", "2", "0", "1", "1", "2"}},
		{`5,7,6`, `[5,6,1],[7,6,1]`, []string{"5", "7", "6", "5", "6", "7", "6"}},
		{`9,3,30`, `[3,9,1],[30,9,1]`, []string{"9", "3", "30", "3", "9", "30", "9"}},
		{`1,2,"a"`, `[1,"a",1],[2,1,1]`, []string{"1", "2", "a", "1", "a", "2", "1"}},
		{`1,2,3`, `[1,2,1],[3,"x",1],["2",3,1]`, []string{"1", "2", "3", "1", "2", "3", "x", "2", "3"}},
		{`"1","02",1`, `[1,"02",1]`, []string{"1", "02", "1", "1", "02"}},
		{``, `[4,2,1]`, []string{"4", "2"}},
	} {
		in := `{"kind":"stack","pages":1,"spine":[` + c.spine + `],"edges":[` + c.edges + `]}`
		raw, err := ReadLayoutJSON(strings.NewReader(in), "l.json")
		if err != nil {
			t.Fatal(err)
		}
		var got []string
		for _, v := range raw.Spine {
			got = append(got, raw.Label(v))
		}
		for _, e := range raw.Edges {
			got = append(got, raw.Label(e.U), raw.Label(e.V))
		}
		distinct := map[string]bool{}
		for i := range raw.NumLabels() {
			distinct[raw.Label(int32(i))] = true
		}
		if strings.Join(got, " ") != strings.Join(c.want, " ") || len(distinct) != raw.NumLabels() {
			t.Errorf("%s: labels %q of %d (%d distinct), want %q", in, got, raw.NumLabels(), len(distinct), c.want)
		}
	}
}
