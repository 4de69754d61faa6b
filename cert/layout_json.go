package cert

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strconv"
	"unicode/utf8"

	"spinecert.dev/graph"
	"spinecert.dev/textpos"
)

// The layout file is one JSON object:
//
//	{"kind":"stack","pages":2,"spine":["a","b","c"],"edges":[["a","b",1],["a","c",2]]}
//
// "kind" is stack, queue or mixed; "pages" the number of pages k; for mixed,
// "page_kinds" lists the kind of each page ("stack" or "queue"). "spine"
// lists the vertex labels in spine order; "edges" lists [u, v, page] with
// pages 1..k. Labels may be JSON strings or integers (an integer stands for
// its decimal text). The optional "graph" field holds the graph identity
// (graph.Graph.ID) the layout was made for. No other fields are allowed.
//
// The reader is a streaming scanner for exactly this schema, so files with
// tens of millions of edges are read at memory speed.

// ReadLayoutFile reads a layout file; "-" reads standard input.
func ReadLayoutFile(path string) (*RawLayout, error) {
	if path == "-" {
		return ReadLayoutJSON(os.Stdin, "<stdin>")
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cert: %w", err)
	}
	defer f.Close()
	hint := 0
	if st, err := f.Stat(); err == nil && st.Mode().IsRegular() {
		hint = int(st.Size() / 8) // an edge record takes at least 8 bytes: [u,v,p],
	}
	return readLayout(f, path, hint)
}

// ReadLayoutJSON reads a layout in spinecert's JSON layout format.
func ReadLayoutJSON(r io.Reader, name string) (*RawLayout, error) {
	return readLayout(r, name, 0)
}

// readLayout reads a layout, reserving room for edgeHint edges.
func readLayout(r io.Reader, name string, edgeHint int) (*RawLayout, error) {
	s := newJScan(r, name)
	s.hint = edgeHint
	raw, err := s.layout()
	if err != nil {
		return nil, err
	}
	return raw, nil
}

type jscan struct {
	r    io.Reader
	name string
	data []byte // data[pos:] is unread
	pos  int
	// lines counts the newlines in input already dropped from data; cols
	// counts the bytes of the current line dropped with them
	lines, cols int
	rerr        error
	b           *graph.Builder
	buf         []byte
	hint        int // expected number of edges
}

func newJScan(r io.Reader, name string) *jscan {
	return &jscan{r: r, name: name, data: make([]byte, 0, 1<<20)}
}

// fill reads more input, keeping the unread bytes; it reports whether any arrived.
func (s *jscan) fill() bool {
	if s.rerr != nil {
		return false
	}
	dropped := s.data[:s.pos]
	s.lines += bytes.Count(dropped, []byte{'\n'})
	if nl := bytes.LastIndexByte(dropped, '\n'); nl >= 0 {
		s.cols = len(dropped) - nl - 1
	} else {
		s.cols += len(dropped)
	}
	n := copy(s.data[:cap(s.data)], s.data[s.pos:])
	s.data, s.pos = s.data[:n], 0
	for {
		m, err := s.r.Read(s.data[n:cap(s.data)])
		s.data = s.data[:n+m]
		if err != nil {
			s.rerr = err
		}
		if m > 0 || err != nil {
			return m > 0
		}
	}
}

func (s *jscan) errf(format string, a ...any) error {
	if s.rerr != nil && s.rerr != io.EOF {
		return fmt.Errorf("cert: reading %s: %w", s.name, s.rerr)
	}
	line, col := s.where()
	return &textpos.Error{File: s.name, Line: line, Col: col, Msg: fmt.Sprintf(format, a...)}
}

// where returns the line and column of the byte read last.
func (s *jscan) where() (line, col int) {
	before := s.data[:min(s.pos, len(s.data))]
	line = s.lines + bytes.Count(before, []byte{'\n'}) + 1
	if nl := bytes.LastIndexByte(before, '\n'); nl >= 0 {
		return line, len(before) - nl - 1
	}
	return line, s.cols + len(before)
}

// next returns the next byte; false at end of input.
func (s *jscan) next() (byte, bool) {
	if s.pos >= len(s.data) && !s.fill() {
		return 0, false
	}
	c := s.data[s.pos]
	s.pos++
	return c, true
}

// peek returns the next byte without consuming it.
func (s *jscan) peek() (byte, bool) {
	if s.pos >= len(s.data) && !s.fill() {
		return 0, false
	}
	return s.data[s.pos], true
}

// skip returns the next non-space byte.
func (s *jscan) skip() (byte, bool) {
	for {
		c, ok := s.next()
		if !ok || (c != ' ' && c != '\t' && c != '\n' && c != '\r') {
			return c, ok
		}
	}
}

func (s *jscan) expect(want byte, what string) error {
	c, ok := s.skip()
	if !ok {
		return s.errf("unexpected end of input, expected %s", what)
	}
	if c != want {
		return s.errf("expected %s, found %q", what, c)
	}
	return nil
}

func (s *jscan) layout() (*RawLayout, error) {
	raw := &RawLayout{}
	s.b = graph.NewBuilder()
	if err := s.expect('{', "'{' at the start of a layout"); err != nil {
		return nil, err
	}
	seen := map[string]bool{}
	var pageKinds []string
	var endLine, endCol, kindsLine, kindsCol int // the closing '}', "page_kinds"
	first := true
	for {
		c, ok := s.skip()
		if !ok {
			return nil, s.errf("unexpected end of input inside the layout object")
		}
		if c == '}' && first {
			endLine, endCol = s.where()
			break
		}
		if !first {
			if c == '}' {
				endLine, endCol = s.where()
				break
			}
			if c != ',' {
				return nil, s.errf("expected ',' or '}' after a field, found %q", c)
			}
			if c, ok = s.skip(); !ok {
				return nil, s.errf("unexpected end of input, expected a field name")
			}
		}
		first = false
		if c != '"' {
			return nil, s.errf("expected a field name in double quotes, found %q", c)
		}
		keyLine, keyCol := s.where()
		key, err := s.str()
		if err != nil {
			return nil, err
		}
		if seen[string(key)] {
			return nil, &textpos.Error{File: s.name, Line: keyLine, Col: keyCol, Msg: fmt.Sprintf("field %q appears twice", key)}
		}
		seen[string(key)] = true
		if err := s.expect(':', "':' after a field name"); err != nil {
			return nil, err
		}
		switch string(key) {
		case "kind":
			v, err := s.stringValue("kind")
			if err != nil {
				return nil, err
			}
			if raw.Kind, err = ParseKind(v); err != nil {
				return nil, s.errf("unknown kind %q (expected stack, queue or mixed)", v)
			}
		case "graph":
			if raw.Graph, err = s.stringValue("graph"); err != nil {
				return nil, err
			}
		case "pages":
			c, _ := s.skip()
			p, err := s.integer(c)
			if err != nil {
				return nil, err
			}
			if p < 0 || p > 1<<20 {
				return nil, s.errf("pages must be between 0 and %d, found %d", 1<<20, p)
			}
			raw.Pages = int(p)
		case "page_kinds":
			kindsLine, kindsCol = keyLine, keyCol
			if pageKinds, err = s.stringArray(); err != nil {
				return nil, err
			}
		case "spine":
			if err := s.spine(raw); err != nil {
				return nil, err
			}
		case "edges":
			if err := s.edges(raw); err != nil {
				return nil, err
			}
		default:
			return nil, &textpos.Error{File: s.name, Line: keyLine, Col: keyCol, Msg: fmt.Sprintf("unknown field %q (expected kind, pages, page_kinds, spine, edges or graph; field names are case-sensitive)", key)}
		}
	}
	if c, ok := s.skip(); ok {
		return nil, s.errf("unexpected %q after the layout object", c)
	}
	for _, f := range []string{"kind", "pages", "spine", "edges"} {
		if !seen[f] {
			return nil, &textpos.Error{File: s.name, Line: endLine, Col: endCol, Msg: fmt.Sprintf("missing field %q", f)}
		}
	}
	if raw.Kind == Mixed {
		if !seen["page_kinds"] {
			return nil, &textpos.Error{File: s.name, Line: endLine, Col: endCol, Msg: `a mixed layout needs "page_kinds"`}
		}
		if len(pageKinds) != raw.Pages {
			return nil, &textpos.Error{File: s.name, Line: kindsLine, Col: kindsCol, Msg: fmt.Sprintf(`"page_kinds" has %d entries for %d pages`, len(pageKinds), raw.Pages)}
		}
		for _, pk := range pageKinds {
			k, err := ParseKind(pk)
			if err != nil || k == Mixed {
				return nil, &textpos.Error{File: s.name, Line: kindsLine, Col: kindsCol, Msg: fmt.Sprintf(`page kind %q is not stack or queue`, pk)}
			}
			raw.PageKinds = append(raw.PageKinds, k)
		}
	} else if seen["page_kinds"] {
		for _, pk := range pageKinds {
			if k, err := ParseKind(pk); err != nil || k != raw.Kind {
				return nil, &textpos.Error{File: s.name, Line: kindsLine, Col: kindsCol, Msg: fmt.Sprintf(`page kind %q in a %s layout`, pk, raw.Kind)}
			}
		}
	}
	raw.Labels = s.b.Labels()
	return raw, nil
}

// str reads a JSON string body after the opening quote into s.buf.
func (s *jscan) str() ([]byte, error) {
	s.buf = s.buf[:0]
	for {
		c, ok := s.next()
		if !ok {
			return nil, s.errf("unterminated string")
		}
		switch {
		case c == '"':
			if !utf8.Valid(s.buf) {
				return nil, s.errf("string is not valid UTF-8")
			}
			return s.buf, nil
		case c == '\\':
			e, ok := s.next()
			if !ok {
				return nil, s.errf("unterminated string")
			}
			switch e {
			case '"', '\\', '/':
				s.buf = append(s.buf, e)
			case 'b':
				s.buf = append(s.buf, '\b')
			case 'f':
				s.buf = append(s.buf, '\f')
			case 'n':
				s.buf = append(s.buf, '\n')
			case 'r':
				s.buf = append(s.buf, '\r')
			case 't':
				s.buf = append(s.buf, '\t')
			case 'u':
				r, err := s.hex4()
				if err != nil {
					return nil, err
				}
				if r >= 0xd800 && r < 0xdc00 {
					if a, _ := s.next(); a != '\\' {
						return nil, s.errf("unpaired surrogate in \\u escape")
					}
					if b, _ := s.next(); b != 'u' {
						return nil, s.errf("unpaired surrogate in \\u escape")
					}
					lo, err := s.hex4()
					if err != nil {
						return nil, err
					}
					if lo < 0xdc00 || lo >= 0xe000 {
						return nil, s.errf("unpaired surrogate in \\u escape")
					}
					r = 0x10000 + (r-0xd800)<<10 + (lo - 0xdc00)
				} else if r >= 0xdc00 && r < 0xe000 {
					return nil, s.errf("unpaired surrogate in \\u escape")
				}
				s.buf = utf8.AppendRune(s.buf, r)
			default:
				return nil, s.errf("invalid escape \\%c in string", e)
			}
		case c < 0x20:
			return nil, s.errf("control character in string")
		default:
			s.buf = append(s.buf, c)
		}
	}
}

func (s *jscan) hex4() (rune, error) {
	var r rune
	for i := 0; i < 4; i++ {
		c, _ := s.next()
		var d byte
		switch {
		case c >= '0' && c <= '9':
			d = c - '0'
		case c >= 'a' && c <= 'f':
			d = c - 'a' + 10
		case c >= 'A' && c <= 'F':
			d = c - 'A' + 10
		default:
			return 0, s.errf("invalid \\u escape")
		}
		r = r<<4 | rune(d)
	}
	return r, nil
}

func (s *jscan) stringValue(field string) (string, error) {
	c, ok := s.skip()
	if !ok || c != '"' {
		return "", s.errf("field %q must be a string", field)
	}
	b, err := s.str()
	return string(b), err
}

// integer reads a JSON integer whose first byte is c; it leaves the byte after
// the number unread.
func (s *jscan) integer(c byte) (int64, error) {
	s.buf = s.buf[:0]
	if c == '-' {
		s.buf = append(s.buf, c)
		c, _ = s.next()
	}
	if c < '0' || c > '9' {
		return 0, s.errf("expected an integer")
	}
	s.buf = append(s.buf, c)
	for {
		b, ok := s.peek()
		if !ok || b < '0' || b > '9' {
			if ok && (b == '.' || b == 'e' || b == 'E') {
				return 0, s.errf("expected an integer, found a fraction or exponent")
			}
			break
		}
		s.pos++
		s.buf = append(s.buf, b)
		if len(s.buf) > 19 {
			return 0, s.errf("integer too large")
		}
	}
	if len(s.buf) > 1 && s.buf[0] == '0' || len(s.buf) > 2 && s.buf[0] == '-' && s.buf[1] == '0' {
		return 0, s.errf("integer with a leading zero")
	}
	v, err := strconv.ParseInt(string(s.buf), 10, 64)
	if err != nil {
		return 0, s.errf("integer out of range")
	}
	return v, nil
}

// label reads a vertex label (string or integer) starting at c and interns it.
func (s *jscan) label(c byte) (int32, error) {
	switch {
	case c == '"':
		b, err := s.str()
		if err != nil {
			return 0, err
		}
		return s.b.VertexBytes(b), nil
	case c == '-' || (c >= '0' && c <= '9'):
		if v, ok := s.fastNumber(c); ok {
			return v, nil
		}
		if _, err := s.integer(c); err != nil {
			return 0, err
		}
		return s.b.VertexBytes(s.buf), nil
	}
	return 0, s.errf("expected a vertex label (string or integer), found %q", c)
}

// fastNumber interns the label of a canonical decimal integer of at most 7
// digits whose first byte c was read, when the whole number and the byte
// after it are in the buffer and that byte ends a number; otherwise it
// consumes nothing more and returns false, and the general parser takes over.
func (s *jscan) fastNumber(c byte) (int32, bool) {
	if c < '0' || c > '9' {
		return 0, false
	}
	d, p := s.data, s.pos
	n := int(c - '0')
	for p < len(d) && p-s.pos < 6 && d[p] >= '0' && d[p] <= '9' {
		n = n*10 + int(d[p]-'0')
		p++
	}
	if p >= len(d) || (c == '0' && p > s.pos) {
		return 0, false
	}
	if b := d[p]; (b >= '0' && b <= '9') || b == '.' || b == 'e' || b == 'E' {
		return 0, false
	}
	s.pos = p
	return s.b.VertexNumber(n), true
}

func (s *jscan) stringArray() ([]string, error) {
	var out []string
	err := s.array("a list of strings", func(c byte) error {
		if c != '"' {
			return s.errf("expected a string")
		}
		b, err := s.str()
		out = append(out, string(b))
		return err
	})
	return out, err
}

// array reads a JSON array, calling elem with the first byte of each element.
func (s *jscan) array(what string, elem func(c byte) error) error {
	if err := s.expect('[', what); err != nil {
		return err
	}
	c, ok := s.skip()
	if !ok {
		return s.errf("unexpected end of input in %s", what)
	}
	if c == ']' {
		return nil
	}
	for {
		if err := elem(c); err != nil {
			return err
		}
		c, ok = s.skip()
		if !ok {
			return s.errf("unexpected end of input in %s", what)
		}
		if c == ']' {
			return nil
		}
		if c != ',' {
			return s.errf("expected ',' or ']' in %s, found %q", what, c)
		}
		if c, ok = s.skip(); !ok {
			return s.errf("unexpected end of input in %s", what)
		}
	}
}

func (s *jscan) spine(raw *RawLayout) error {
	return s.array(`"spine" (a list of vertex labels)`, func(c byte) error {
		v, err := s.label(c)
		raw.Spine = append(raw.Spine, v)
		return err
	})
}

func (s *jscan) edges(raw *RawLayout) error {
	raw.Edges = make([]RawEdge, 0, s.hint)
	return s.array(`"edges" (a list of [u, v, page])`, func(c byte) error {
		if c != '[' {
			return s.errf("expected an edge [u, v, page], found %q", c)
		}
		if e, ok := s.fastEdge(); ok {
			raw.Edges = append(raw.Edges, e)
			return nil
		}
		var e RawEdge
		c, _ = s.skip()
		var err error
		if e.U, err = s.label(c); err != nil {
			return err
		}
		if err := s.expect(',', "',' between the parts of an edge [u, v, page]"); err != nil {
			return err
		}
		c, _ = s.skip()
		if e.V, err = s.label(c); err != nil {
			return err
		}
		if err := s.expect(',', "',' between the parts of an edge [u, v, page]"); err != nil {
			return err
		}
		c, _ = s.skip()
		p, err := s.integer(c)
		if err != nil {
			return s.errf("expected a page number as the third part of an edge")
		}
		if p < -1<<31 || p >= 1<<31 {
			return s.errf("page number %d out of range", p)
		}
		e.Page = int32(p)
		if err := s.expect(']', "']' after an edge [u, v, page]"); err != nil {
			return err
		}
		raw.Edges = append(raw.Edges, e)
		return nil
	})
}

// fastEdge parses the common shape of an edge record after its '[': three
// small decimal integers separated by commas, without spaces, then ']'. On
// anything else it consumes nothing and returns false, and the general
// parser takes over.
func (s *jscan) fastEdge() (RawEdge, bool) {
	if len(s.data)-s.pos < 40 && !s.fill() {
		return RawEdge{}, false
	}
	d, p := s.data, s.pos
	var nums [3]int
	for k := 0; k < 3; k++ {
		start := p
		n := 0
		for p < len(d) && p-start < 7 && d[p] >= '0' && d[p] <= '9' {
			n = n*10 + int(d[p]-'0')
			p++
		}
		if p == start || p >= len(d) || (d[start] == '0' && p-start > 1) {
			return RawEdge{}, false
		}
		want := byte(',')
		if k == 2 {
			want = ']'
		}
		if d[p] != want {
			return RawEdge{}, false
		}
		p++
		nums[k] = n
	}
	s.pos = p
	return RawEdge{U: s.b.VertexNumber(nums[0]), V: s.b.VertexNumber(nums[1]), Page: int32(nums[2])}, true
}

// WriteLayoutJSON writes l (a layout of g) in spinecert's JSON layout format:
// the spine on one line, then one edge per line in g's edge order.
// Decimal labels are written as integers, all others as strings.
func WriteLayoutJSON(w io.Writer, g *graph.Graph, l *Layout) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	fmt.Fprintf(bw, "{\"kind\":\"%s\",\"pages\":%d,", l.Kind, l.Pages())
	if l.Kind == Mixed {
		bw.WriteString("\"page_kinds\":[")
		for i, k := range l.PageKinds {
			if i > 0 {
				bw.WriteByte(',')
			}
			fmt.Fprintf(bw, "\"%s\"", k)
		}
		bw.WriteString("],")
	}
	fmt.Fprintf(bw, "\"graph\":\"%s\",\n\"spine\":[", g.ID())
	var buf []byte
	for i, v := range l.Order {
		if i > 0 {
			bw.WriteByte(',')
		}
		buf = appendLabel(buf[:0], g.Labels()[v])
		bw.Write(buf)
	}
	bw.WriteString("],\n\"edges\":[")
	for e, ed := range g.Edges() {
		if e > 0 {
			bw.WriteByte(',')
		}
		bw.WriteString("\n[")
		buf = appendLabel(buf[:0], g.Labels()[ed.U])
		buf = append(buf, ',')
		buf = appendLabel(buf, g.Labels()[ed.V])
		buf = append(buf, ',')
		buf = strconv.AppendInt(buf, int64(l.Page[e]), 10)
		buf = append(buf, ']')
		bw.Write(buf)
	}
	bw.WriteString("]}\n")
	return bw.Flush()
}

func appendLabel(buf []byte, label string) []byte {
	if graph.IsDecimal(label) && len(label) < 19 {
		return append(buf, label...)
	}
	return appendQuotedLabel(buf, label)
}

// appendQuotedLabel appends s as a JSON string literal.
func appendQuotedLabel(buf []byte, s string) []byte {
	plain := true
	for i := 0; i < len(s); i++ {
		if c := s[i]; c < 0x20 || c >= 0x7f || c == '"' || c == '\\' {
			plain = false
			break
		}
	}
	if plain {
		buf = append(buf, '"')
		buf = append(buf, s...)
		return append(buf, '"')
	}
	b, _ := json.Marshal(s) // a string always marshals
	return append(buf, b...)
}
