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
		hint = int(min(st.Size()/8, 1<<27)) // an edge record takes at least 8 bytes: [u,v,p],
	}
	return readLayout(f, path, hint)
}

// ReadLayoutJSON reads a layout in spinecert's JSON layout format.
func ReadLayoutJSON(r io.Reader, name string) (*RawLayout, error) {
	hint := 0
	if l, ok := r.(interface{ Len() int }); ok { // bytes.Reader, strings.Reader, bytes.Buffer
		hint = min(l.Len()/8, 1<<27)
	}
	return readLayout(r, name, hint)
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
	labels      labelSet
	raw         *RawLayout // the layout being read
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
	s.raw = raw
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
	s.labels.finish(raw)
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
		return s.labels.bytes(b, s.raw), nil
	case c == '-' || (c >= '0' && c <= '9'):
		if v, ok := s.fastNumber(c); ok {
			return v, nil
		}
		if _, err := s.integer(c); err != nil {
			return 0, err
		}
		return s.labels.bytes(s.buf, s.raw), nil
	}
	return 0, s.errf("expected a vertex label (string or integer), found %q", c)
}

// fastNumber interns the label of a canonical decimal integer of at most 7
// digits whose first byte c was read, when the whole number and the byte
// after it are in the buffer and that byte ends a number; otherwise it
// consumes nothing more and returns false, and the general parser takes over.
func (s *jscan) fastNumber(c byte) (int32, bool) {
	d, p := s.data, s.pos-1 // d[p] is c
	if c-'0' > 9 || p < 0 || d[p] != c {
		return 0, false
	}
	k, q, ok := smallDecimal(d, p)
	if !ok || q >= len(d) {
		return 0, false
	}
	if b := d[q]; b-'0' <= 9 || b == '.' || b == 'e' || b == 'E' {
		return 0, false
	}
	s.pos = q
	return s.labels.number(k), true
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
		if s.fastSpine(c, raw) {
			return nil
		}
		v, err := s.label(c)
		raw.Spine = appendDoubling(raw.Spine, v)
		return err
	})
}

// appendDoubling appends v to a, doubling its capacity when it is full:
// append grows large slices by a quarter, which copies (and faults in)
// about five times the final size.
func appendDoubling[T any](a []T, v T) []T {
	if len(a) == cap(a) {
		b := make([]T, len(a), max(2*cap(a), 1024))
		copy(b, a)
		a = b
	}
	return append(a, v)
}

// fastSpine reads spine labels that are canonical decimal integers of at
// most 7 digits separated by bare commas, starting with the one whose first
// byte c was read. It stops after the last such label whose following byte
// is in the buffer and ends a number, leaving the rest to the general parser;
// it returns false when it consumed nothing.
func (s *jscan) fastSpine(c byte, raw *RawLayout) bool {
	d, p := s.data, s.pos-1 // d[p] is c
	if c-'0' > 9 || p < 0 || d[p] != c {
		return false
	}
	found := false
	for {
		k, q, ok := smallDecimal(d, p)
		if !ok || q >= len(d) {
			break
		}
		if b := d[q]; b-'0' <= 9 || b == '.' || b == 'e' || b == 'E' {
			break
		}
		v := int32(k)
		if ls := &s.labels; ls.b == nil && k < len(ls.seen) {
			ls.seen[k] = true // labelSet.number, inlined
		} else {
			v = ls.number(k)
		}
		raw.Spine = appendDoubling(raw.Spine, v)
		found = true
		s.pos = q
		if len(d)-q < 32 {
			s.fill()
			d, q = s.data, s.pos
		}
		if q+1 >= len(d) || d[q] != ',' || d[q+1]-'0' > 9 {
			break
		}
		p = q + 1
	}
	return found
}

func (s *jscan) edges(raw *RawLayout) error {
	raw.Edges = make([]RawEdge, 0, s.hint)
	return s.array(`"edges" (a list of [u, v, page])`, func(c byte) error {
		if c != '[' {
			return s.errf("expected an edge [u, v, page], found %q", c)
		}
		if s.fastEdges(raw) {
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
		values := s.labels.b == nil
		if e.V, err = s.label(c); err != nil {
			return err
		}
		if values && s.labels.b != nil { // e.V moved the labels into a Builder
			e.U = s.labels.b.VertexNumber(int(e.U))
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

// fastEdges parses edge records of the common shape, from just after the
// '[' of one: three canonical decimal integers of at most 7 digits
// separated by commas without spaces, then ']'. After each it goes on to
// the next record when a ',', white space and '[' follow. It stops after
// the last complete record of that shape, leaving the rest to the general
// parser; it returns false when it consumed nothing.
func (s *jscan) fastEdges(raw *RawLayout) bool {
	if len(s.data)-s.pos < 64 {
		s.fill()
	}
	d, p := s.data, s.pos
	edges := raw.Edges
	found := false
	for {
		u, q, ok := smallDecimal(d, p)
		if !ok || q >= len(d) || d[q] != ',' {
			break
		}
		v, q, ok := smallDecimal(d, q+1)
		if !ok || q >= len(d) || d[q] != ',' {
			break
		}
		page, q, ok := smallDecimal(d, q+1)
		if !ok || q >= len(d) || d[q] != ']' {
			break
		}
		e := RawEdge{U: int32(u), V: int32(v), Page: int32(page)}
		if ls := &s.labels; ls.b == nil && u < len(ls.seen) && v < len(ls.seen) {
			ls.seen[u], ls.seen[v] = true, true // labelSet.number, inlined
		} else {
			e.U, e.V = ls.number(u), ls.number(v)
		}
		edges = append(edges, e)
		found = true
		s.pos = q + 1 // the records up to here are consumed
		if len(d)-s.pos < 64 {
			s.fill()
			d = s.data
		}
		q = s.pos
		if q >= len(d) || d[q] != ',' {
			break
		}
		for q++; q < len(d) && (d[q] == '\n' || d[q] == ' ' || d[q] == '\r' || d[q] == '\t'); q++ {
		}
		if q >= len(d) || d[q] != '[' {
			break
		}
		p = q + 1
	}
	raw.Edges = edges
	return found
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
