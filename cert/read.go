package cert

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
)

// Format is a graph file format.
type Format int

const (
	// FormatAuto detects the format from the content, with the extension as a hint.
	FormatAuto Format = iota
	// FormatEdgeList is one edge per line as two labels; one label declares a vertex.
	FormatEdgeList
	// FormatDIMACS is the DIMACS graph format (p edge N M, e U V, c comments).
	FormatDIMACS
	// FormatGraph6 is McKay's graph6, one graph per line.
	FormatGraph6
	// FormatSparse6 is McKay's sparse6, one graph per line.
	FormatSparse6
)

var formatNames = map[Format]string{
	FormatAuto: "auto", FormatEdgeList: "edgelist", FormatDIMACS: "dimacs",
	FormatGraph6: "graph6", FormatSparse6: "sparse6",
}

// String returns the format's name as used on the command line.
func (f Format) String() string {
	if s, ok := formatNames[f]; ok {
		return s
	}
	return fmt.Sprintf("format(%d)", int(f))
}

// ParseFormat parses a format name (auto, edgelist, dimacs, graph6, sparse6).
func ParseFormat(s string) (Format, error) {
	for f, n := range formatNames {
		if strings.EqualFold(s, n) {
			return f, nil
		}
	}
	return 0, fmt.Errorf("cert: unknown graph format %q (expected auto, edgelist, dimacs, graph6 or sparse6)", s)
}

// ReadResult is what a graph file held.
type ReadResult struct {
	Graphs   []*Graph
	Format   Format
	Warnings []string // for example repeated edges that were merged
}

// ReadGraphFile reads the graphs in the file at path; "-" reads standard input.
func ReadGraphFile(path string, f Format) (*ReadResult, error) {
	if path == "-" {
		return ReadGraphs(os.Stdin, "<stdin>", f)
	}
	file, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cert: %w", err)
	}
	defer file.Close()
	hint := 0
	if st, err := file.Stat(); err == nil && st.Mode().IsRegular() {
		hint = int(st.Size() / 4) // an edge-list line takes at least 4 bytes: "u v\n"
	}
	return readGraphs(file, path, f, hint)
}

// ReadGraphs reads one or more graphs from r; name is used in messages and
// its extension as a format hint when f is FormatAuto.
func ReadGraphs(r io.Reader, name string, f Format) (*ReadResult, error) {
	return readGraphs(r, name, f, 0)
}

// readGraphs is ReadGraphs with room reserved for edgeHint edges.
func readGraphs(r io.Reader, name string, f Format, edgeHint int) (*ReadResult, error) {
	br := bufio.NewReaderSize(r, 1<<20)
	if f == FormatAuto {
		head, _ := br.Peek(detectPeek)
		f = DetectFormat(head, name)
	}
	res := &ReadResult{Format: f}
	var err error
	switch f {
	case FormatEdgeList:
		var g *Graph
		g, err = readEdgeList(br, name, res, edgeHint)
		if g != nil {
			res.Graphs = []*Graph{g}
		}
	case FormatDIMACS:
		var g *Graph
		g, err = readDIMACSGraph(br, name, res)
		if g != nil {
			res.Graphs = []*Graph{g}
		}
	case FormatGraph6, FormatSparse6:
		res.Graphs, err = readNauty(br, name, f, res)
	default:
		return nil, fmt.Errorf("cert: %s: unknown graph format", name)
	}
	if err != nil {
		return nil, err
	}
	if len(res.Graphs) == 0 {
		return nil, &ParseError{File: name, Msg: "no graph found"}
	}
	return res, nil
}

// DetectFormat guesses the format of a file from its first bytes and name.
// A recognised extension (.g6 .graph6, .s6 .sparse6, .dimacs .col .clq,
// .edges .el) decides unless the content contradicts it; otherwise the
// content decides: a >>graph6<< or >>sparse6<< header, a line starting with
// ':' or ';' (sparse6), DIMACS 'p edge'/'c' lines, a line that is a
// well-formed graph6 string, else an edge list.
func DetectFormat(head []byte, name string) Format {
	content := detectContent(head)
	switch strings.ToLower(filepath.Ext(name)) {
	case ".g6", ".graph6":
		if content == FormatGraph6 || content == FormatAuto {
			return FormatGraph6
		}
	case ".s6", ".sparse6":
		if content == FormatSparse6 || content == FormatAuto {
			return FormatSparse6
		}
	case ".dimacs", ".col", ".clq":
		if content == FormatDIMACS || content == FormatAuto {
			return FormatDIMACS
		}
	case ".edges", ".el", ".edgelist":
		return FormatEdgeList
	}
	if content == FormatAuto {
		return FormatEdgeList
	}
	return content
}

// detectPeek is how much of a file ReadGraphs shows DetectFormat. A head of
// this size may end inside a line (a graph6 line of a graph with more than
// about 360 vertices is longer), so its last unterminated line is only
// required to be a possible start of a graph6 string.
const detectPeek = 64 << 10

// detectContent returns the format the content shows, or FormatAuto.
func detectContent(head []byte) Format {
	cut := len(head) >= detectPeek
	switch {
	case bytes.HasPrefix(head, []byte(">>graph6<<")):
		return FormatGraph6
	case bytes.HasPrefix(head, []byte(">>sparse6<<")):
		return FormatSparse6
	}
	for len(head) > 0 {
		line := head
		last := false
		if i := bytes.IndexByte(head, '\n'); i >= 0 {
			line, head = head[:i], head[i+1:]
		} else {
			head, last = nil, true
		}
		line = bytes.TrimRight(line, "\r")
		t := bytes.TrimSpace(line)
		if len(t) == 0 || t[0] == '#' || t[0] == '%' {
			continue
		}
		switch {
		case t[0] == ':' || t[0] == ';':
			return FormatSparse6
		case t[0] == '&' && len(t) > 1 && bytes.IndexFunc(t[1:], func(r rune) bool { return r < 63 || r > 126 }) < 0:
			// digraph6: the graph6 reader explains that it is not supported
			return FormatGraph6
		case bytes.HasPrefix(t, []byte("p ")) || bytes.HasPrefix(t, []byte("p\t")):
			return FormatDIMACS
		case (t[0] == 'c' && (len(t) == 1 || t[1] == ' ' || t[1] == '\t')):
			// a DIMACS comment, or an edge list vertex named c: look further
			if looksDIMACS(head) {
				return FormatDIMACS
			}
			return FormatAuto
		case isGraph6Line(t), last && cut && isGraph6Prefix(t):
			return FormatGraph6
		}
		return FormatAuto
	}
	return FormatAuto
}

// looksDIMACS reports whether the remaining lines reach a 'p' line through 'c' lines only.
func looksDIMACS(rest []byte) bool {
	for _, line := range bytes.Split(rest, []byte("\n")) {
		t := bytes.TrimSpace(line)
		if len(t) == 0 {
			continue
		}
		if t[0] == 'p' && len(t) > 1 && (t[1] == ' ' || t[1] == '\t') {
			return true
		}
		if t[0] != 'c' || (len(t) > 1 && t[1] != ' ' && t[1] != '\t') {
			return false
		}
	}
	return false
}

// readEdgeList reads an edge list: one edge per line as two whitespace-separated
// labels, or one label for an isolated vertex; '#' and '%' start comments.
func readEdgeList(br *bufio.Reader, name string, res *ReadResult, edgeHint int) (*Graph, error) {
	b := NewBuilder()
	b.Grow(edgeHint)
	line := 0
	for {
		raw, err := br.ReadSlice('\n')
		if err == bufio.ErrBufferFull {
			return nil, &ParseError{File: name, Line: line + 1, Msg: "line longer than 1 MiB"}
		}
		if len(raw) == 0 && err != nil {
			if err == io.EOF {
				break
			}
			return nil, &ParseError{File: name, Line: line + 1, Msg: err.Error()}
		}
		line++
		if i := bytes.IndexAny(raw, "#%"); i >= 0 {
			raw = raw[:i]
		}
		var tok [3][]byte
		var col [3]int
		nt := 0
		for i := 0; i < len(raw) && nt < 3; {
			for i < len(raw) && isSpace(raw[i]) {
				i++
			}
			if i == len(raw) {
				break
			}
			j := i
			for j < len(raw) && !isSpace(raw[j]) {
				j++
			}
			tok[nt], col[nt] = raw[i:j], i+1
			nt++
			i = j
		}
		switch nt {
		case 0:
		case 1:
			b.VertexBytes(tok[0])
		case 2:
			u, v := b.VertexBytes(tok[0]), b.VertexBytes(tok[1])
			if u == v {
				return nil, &ParseError{File: name, Line: line, Col: col[1], Msg: fmt.Sprintf("self-loop at vertex %q (quire graphs are simple)", tok[0])}
			}
			_ = b.AddEdge(u, v)
		default:
			return nil, &ParseError{File: name, Line: line, Col: col[2], Msg: "expected one or two vertex labels, found more"}
		}
		if err == io.EOF {
			break
		}
	}
	g, rep := b.Build()
	res.Warnings = append(res.Warnings, duplicateWarnings(name, rep)...)
	return g, nil
}

func isSpace(c byte) bool {
	return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\v' || c == '\f'
}

// duplicateWarnings describes merged repeated edges.
func duplicateWarnings(name string, rep BuildReport) []string {
	if rep.Duplicates == 0 {
		return nil
	}
	ex := make([]string, len(rep.Examples))
	for i, e := range rep.Examples {
		ex[i] = e[0] + "–" + e[1]
	}
	more := ""
	if rep.Duplicates > len(ex) {
		more = fmt.Sprintf(" (and %d more)", rep.Duplicates-len(ex))
	}
	return []string{fmt.Sprintf("%s: %d repeated edge(s) merged: %s%s", name, rep.Duplicates, strings.Join(ex, ", "), more)}
}
