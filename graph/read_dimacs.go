package graph

import (
	"bufio"
	"fmt"
	"io"
	"strconv"

	"spinecert.dev/textpos"
)

// The DIMACS graph format as described in "Clique and Coloring Problems
// Graph Format" (DIMACS, last revision May 08, 1993): every line starts with
// a one-character designator; 'c' lines are comments, one problem line
// "p edge NODES EDGES" comes before any edge, and each "e W V" line is an
// edge with 1 <= W, V <= NODES. spinecert also accepts "p col NODES EDGES" as
// many published instances use it, ignores blank lines and vertex value
// lines "n ID VALUE" (with a warning), and rejects every other designator.
//
// Counting: EDGES must equal the number of 'e' lines. A repeated edge (in
// either orientation) counts as a line like any other and is then merged
// into one edge with a warning, so the graph may have fewer than EDGES edges.
// All NODES vertices exist, labelled "1".."NODES", even when isolated; so
// NODES may be at most 64 per byte of the file plus 2^20 (checkDeclared).

// dimacsFields splits a line into at most len(out) fields separated by
// blanks, recording 1-based columns; it returns the number of fields, or
// len(out)+1 when there are more.
func dimacsFields(l []byte, out [][]byte, cols []int) int {
	nf := 0
	for i := 0; i < len(l); {
		for i < len(l) && isSpace(l[i]) {
			i++
		}
		if i == len(l) {
			break
		}
		j := i
		for j < len(l) && !isSpace(l[j]) {
			j++
		}
		if nf == len(out) {
			cols[nf] = i + 1
			return nf + 1
		}
		out[nf], cols[nf] = l[i:j], i+1
		nf++
		i = j
	}
	return nf
}

// fieldCount describes a count from dimacsFields with 4 slots.
func fieldCount(nf int) string {
	if nf > 4 {
		return "more than 4"
	}
	return strconv.Itoa(nf)
}

// dimacsUint parses a decimal field without sign.
func dimacsUint(f []byte) (uint64, bool) {
	if len(f) == 0 || len(f) > 19 {
		return 0, false
	}
	var n uint64
	for _, c := range f {
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + uint64(c-'0')
	}
	return n, true
}

func readDIMACSGraph(br *bufio.Reader, name string, res *ReadResult) (*Graph, error) {
	lr := &lineReader{br: br, max: 1 << 20}
	perr := func(line, col int, format string, a ...any) error {
		return &textpos.Error{File: name, Line: line, Col: col, Msg: fmt.Sprintf(format, a...)}
	}
	var (
		fields   [4][]byte
		cols     [5]int
		n, m     uint64
		pline    int
		pcol     int
		elines   uint64
		pairs    []uint64
		valueLns int
		valueAt  int
	)
	for {
		l, err := lr.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, perr(lr.line+1, 0, "%s", err.Error())
		}
		line := lr.line
		nf := dimacsFields(l, fields[:], cols[:])
		if nf == 0 {
			continue
		}
		d := fields[0]
		if d[0] == 'c' {
			continue // the rest of a comment line is free text
		}
		if len(d) != 1 {
			return nil, perr(line, cols[0], "expected a one-character line designator (c, p, e or n), found %q", d)
		}
		switch d[0] {
		case 'p':
			if pline > 0 {
				return nil, perr(line, cols[0], "second problem line (the first is on line %d)", pline)
			}
			if nf != 4 {
				return nil, perr(line, cols[nf-1], "expected a problem line 'p edge NODES EDGES' with 4 fields, found %s", fieldCount(nf))
			}
			if f := string(fields[1]); f != "edge" && f != "col" {
				return nil, perr(line, cols[1], "expected the format word 'edge' (or 'col') in the problem line, found %q", f)
			}
			var ok bool
			if n, ok = dimacsUint(fields[2]); !ok {
				return nil, perr(line, cols[2], "expected the number of vertices (a non-negative integer), found %q", fields[2])
			}
			if n > uint64(maxVertices) {
				return nil, perr(line, cols[2], "problem line declares %d vertices; spinecert reads at most %d", n, maxVertices)
			}
			if m, ok = dimacsUint(fields[3]); !ok {
				return nil, perr(line, cols[3], "expected the number of edges (a non-negative integer), found %q", fields[3])
			}
			pline, pcol = line, cols[2]
			pairs = make([]uint64, 0, min(m, 1<<20))
		case 'e':
			if pline == 0 {
				return nil, perr(line, cols[0], "edge line before the problem line 'p edge NODES EDGES'")
			}
			if nf != 3 {
				return nil, perr(line, cols[nf-1], "expected an edge line 'e W V' with 3 fields, found %s", fieldCount(nf))
			}
			var uv [2]uint64
			for k := 0; k < 2; k++ {
				x, ok := dimacsUint(fields[1+k])
				if !ok || x < 1 || x > n {
					return nil, perr(line, cols[1+k], "expected a vertex number in 1..%d, found %q", n, fields[1+k])
				}
				uv[k] = x - 1
			}
			if uv[0] == uv[1] {
				return nil, perr(line, cols[2], "self-loop at vertex %d (spinecert graphs are simple)", uv[0]+1)
			}
			if elines++; elines > m {
				return nil, perr(line, cols[0], "more edge lines than the %d the problem line (line %d) declares", m, pline)
			}
			u, v := min(uv[0], uv[1]), max(uv[0], uv[1])
			pairs = append(pairs, u<<32|v)
		case 'n':
			if pline == 0 {
				return nil, perr(line, cols[0], "vertex line before the problem line 'p edge NODES EDGES'")
			}
			if nf != 3 {
				return nil, perr(line, cols[nf-1], "expected a vertex line 'n ID VALUE' with 3 fields, found %s", fieldCount(nf))
			}
			if x, ok := dimacsUint(fields[1]); !ok || x < 1 || x > n {
				return nil, perr(line, cols[1], "expected a vertex number in 1..%d, found %q", n, fields[1])
			}
			if _, err := strconv.ParseInt(string(fields[2]), 10, 64); err != nil {
				return nil, perr(line, cols[2], "expected an integer vertex value, found %q", fields[2])
			}
			if valueLns++; valueLns == 1 {
				valueAt = line
			}
		default:
			return nil, perr(line, cols[0], "unexpected line type %q: expected c, p, e or n", d)
		}
	}
	if pline == 0 {
		return nil, &textpos.Error{File: name, Msg: "no problem line 'p edge NODES EDGES' found"}
	}
	if elines != m {
		return nil, perr(pline, 0, "problem line declares %d edges, found %d edge lines", m, elines)
	}
	if err := checkDeclared(n, lr.n, "file", pcol); err != nil {
		err.File, err.Line = name, pline
		return nil, err
	}
	if valueLns > 0 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("%s:%d: %d vertex value line(s) ignored", name, valueAt, valueLns))
	}
	g, rep := numberedGraph(int(n), 1, pairs)
	res.Warnings = append(res.Warnings, duplicateWarnings(name, rep)...)
	return g, nil
}
