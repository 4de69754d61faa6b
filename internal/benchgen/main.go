// Command benchgen writes large graph and layout files for spinecert's speed
// figures (scripts/bench.sh): the complete graph K_n with the classical
// ⌈n/2⌉-page stack layout (vertex order 0..n-1, edge {a, b} on page
// ⌊((a+b) mod 2p)/2⌋+1 with p = ⌈n/2⌉), as an edge list and a layout file.
// With -fan it writes instead the fan plus a path on n vertices, a sparse
// graph with many vertices: edges i–(i+1) and 0–i, with the one-page layout
// (vertices 0..n-1 on the spine in order, every edge on page 1; the edges
// 0–i nest around the path edges, so no two cross).
package main

import (
	"bufio"
	"flag"
	"fmt"
	"os"
	"strconv"
)

func main() {
	n := flag.Int("n", 4473, "number of vertices of K_n")
	graph := flag.String("graph", "kn.edges", "edge list to write")
	layout := flag.String("layout", "kn.layout.json", "layout to write")
	fan := flag.Bool("fan", false, "write the fan plus a path on n vertices instead of K_n")
	flag.Parse()
	pages, edges := completeEdges(*n)
	if *fan {
		pages, edges = fanEdges(*n)
	}
	if err := write(*n, pages, edges, *graph, *layout); err != nil {
		fmt.Fprintln(os.Stderr, "benchgen:", err)
		os.Exit(1)
	}
}

// completeEdges lists the edges of K_n with their pages in the classical
// ⌈n/2⌉-page layout.
func completeEdges(n int) (int, func(edge func(a, b, page int))) {
	p := (n + 1) / 2
	return p, func(edge func(a, b, page int)) {
		for a := 0; a < n; a++ {
			for b := a + 1; b < n; b++ {
				edge(a, b, ((a+b)%(2*p))/2+1)
			}
		}
	}
}

// fanEdges lists the edges of the fan plus a path on n vertices (i–(i+1)
// for 0 ≤ i < n-1 and 0–i for 2 ≤ i < n: 2n-3 edges), all on page 1.
func fanEdges(n int) (int, func(edge func(a, b, page int))) {
	return 1, func(edge func(a, b, page int)) {
		for i := 0; i+1 < n; i++ {
			edge(i, i+1, 1)
		}
		for i := 2; i < n; i++ {
			edge(0, i, 1)
		}
	}
}

// write writes the edge list and the layout (vertices 0..n-1 on the spine
// in order) of the edges that edges lists.
func write(n, pages int, edges func(edge func(a, b, page int)), graphPath, layoutPath string) error {
	gf, err := os.Create(graphPath)
	if err != nil {
		return err
	}
	defer gf.Close()
	lf, err := os.Create(layoutPath)
	if err != nil {
		return err
	}
	defer lf.Close()
	g, l := bufio.NewWriterSize(gf, 1<<20), bufio.NewWriterSize(lf, 1<<20)
	fmt.Fprintf(l, "{\"kind\":\"stack\",\"pages\":%d,\n\"spine\":[", pages)
	for v := 0; v < n; v++ {
		if v > 0 {
			l.WriteByte(',')
		}
		l.WriteString(strconv.Itoa(v))
	}
	l.WriteString("],\n\"edges\":[")
	first := true
	var buf []byte
	edges(func(a, b, page int) {
		buf = strconv.AppendInt(buf[:0], int64(a), 10)
		buf = append(buf, ' ')
		buf = strconv.AppendInt(buf, int64(b), 10)
		buf = append(buf, '\n')
		g.Write(buf)
		if !first {
			l.WriteByte(',')
		}
		first = false
		buf = append(buf[:0], "\n["...)
		buf = strconv.AppendInt(buf, int64(a), 10)
		buf = append(buf, ',')
		buf = strconv.AppendInt(buf, int64(b), 10)
		buf = append(buf, ',')
		buf = strconv.AppendInt(buf, int64(page), 10)
		buf = append(buf, ']')
		l.Write(buf)
	})
	l.WriteString("]}\n")
	if err := g.Flush(); err != nil {
		return err
	}
	return l.Flush()
}
