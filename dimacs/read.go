package dimacs

import (
	"bufio"
	"bytes"
	"fmt"
	"io"

	"github.com/klauspost/compress/gzip"
	"github.com/klauspost/compress/zstd"
	"spinecert.dev/textpos"
)

// Visitor receives a CNF as it is parsed. Header is called exactly once,
// before the first clause; lits is reused after Clause returns.
// A non-nil error from the visitor stops parsing and is returned as is.
type Visitor interface {
	Header(vars, clauses int) error
	Clause(lits []int32) error
}

// CommentVisitor is implemented by visitors that also want the comment lines.
// text is the line after its leading "c" and at most one following blank.
type CommentVisitor interface {
	Comment(text string) error
}

// ReadOptions controls how strictly Parse reads.
type ReadOptions struct {
	Lenient bool             // accept what solvers commonly accept (missing/wrong counts, missing final 0, ...)
	Warn    func(msg string) // called for each thing lenient mode forgave (may be nil)
}

// MaxVars is the largest variable a CNF may use (literals are int32).
const MaxVars = 1<<31 - 1

// maxClauses bounds the clause count a header may declare.
const maxClauses = 1 << 40

var (
	gzipMagic = []byte{0x1f, 0x8b}
	zstdMagic = []byte{0x28, 0xb5, 0x2f, 0xfd}
)

type decompressor struct {
	io.Reader
	close func()
}

func (d *decompressor) Close() error {
	if d.close != nil {
		d.close()
		d.close = nil
	}
	return nil
}

// Limits of Decompress, the same as those of evidence bundles: once more
// than RatioGrace bytes have come out, at most MaxRatio bytes may come out
// per compressed byte read so far.
const (
	MaxRatio   = 1000
	RatioGrace = 64 << 20
)

// ratioReader counts the bytes read from src and out of r, and fails with
// ErrBomb once the output outgrows the ratio limit.
type ratioReader struct {
	r    io.Reader
	src  *countReader
	n    int64
	fail error
}

type countReader struct {
	r io.Reader
	n int64
}

func (c *countReader) Read(p []byte) (int, error) {
	n, err := c.r.Read(p)
	c.n += int64(n)
	return n, err
}

func (l *ratioReader) Read(p []byte) (int, error) {
	if l.fail != nil {
		return 0, l.fail
	}
	n, err := l.r.Read(p)
	l.n += int64(n)
	if l.n > RatioGrace && l.n > MaxRatio*max(l.src.n, 1) {
		l.fail = fmt.Errorf("%w: %d bytes from %d compressed bytes (at most %d:1 beyond the first %d bytes)", ErrBomb, l.n, l.src.n, MaxRatio, RatioGrace)
		return n, l.fail
	}
	return n, err
}

// Decompress returns a reader that transparently decompresses gzip or zstd
// input (recognised by their magic bytes) and passes anything else through.
// Compressed input may not decompress to more than MaxRatio bytes per
// compressed byte once RatioGrace bytes have come out: the reader then fails
// with an error wrapping ErrBomb. Close releases the decoders; it does not
// close r.
func Decompress(r io.Reader) (io.ReadCloser, error) {
	src := &countReader{r: r}
	br := bufio.NewReaderSize(src, 64<<10)
	head, err := br.Peek(4)
	if err != nil && err != io.EOF && err != bufio.ErrBufferFull {
		return nil, fmt.Errorf("dimacs: %w", err)
	}
	switch {
	case bytes.HasPrefix(head, gzipMagic):
		zr, err := gzip.NewReader(br)
		if err != nil {
			return nil, fmt.Errorf("dimacs: gzip: %w", err)
		}
		return &decompressor{Reader: &ratioReader{r: zr, src: src}, close: func() { zr.Close() }}, nil
	case bytes.HasPrefix(head, zstdMagic):
		zr, err := zstd.NewReader(br, zstd.WithDecoderConcurrency(1))
		if err != nil {
			return nil, fmt.Errorf("dimacs: zstd: %w", err)
		}
		return &decompressor{Reader: &ratioReader{r: zr, src: src}, close: zr.Close}, nil
	}
	return &decompressor{Reader: br}, nil
}

// scanner reads bytes with line and column tracking.
type scanner struct {
	r         io.Reader
	buf       []byte
	pos, end  int
	eof       bool
	err       error
	line, col int // position of buf[pos], 1-based
}

func (s *scanner) fill() bool {
	if s.pos < s.end {
		return true
	}
	if s.eof {
		return false
	}
	for {
		n, err := s.r.Read(s.buf)
		s.pos, s.end = 0, n
		if err != nil {
			s.eof = true
			if err != io.EOF {
				s.err = err
			}
		}
		if n > 0 {
			return true
		}
		if s.eof {
			return false
		}
	}
}

// peek returns the next byte without consuming it.
func (s *scanner) peek() (byte, bool) {
	if !s.fill() {
		return 0, false
	}
	return s.buf[s.pos], true
}

func (s *scanner) advance(c byte) {
	s.pos++
	if c == '\n' {
		s.line++
		s.col = 1
	} else {
		s.col++
	}
}

// skipBlanks skips spaces, tabs, carriage returns and form feeds (not newlines).
func (s *scanner) skipBlanks() {
	for {
		c, ok := s.peek()
		if !ok || !(c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v') {
			return
		}
		s.advance(c)
	}
}

func isBlank(c byte) bool {
	return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\f' || c == '\v'
}

// word reads a token up to the next blank (at most 40 bytes are kept).
func (s *scanner) word() string {
	var b []byte
	for {
		c, ok := s.peek()
		if !ok || isBlank(c) {
			return string(b)
		}
		if len(b) < 40 {
			b = append(b, c)
		}
		s.advance(c)
	}
}

// restOfLine reads up to (not including) the newline.
func (s *scanner) restOfLine() string {
	var b []byte
	for {
		c, ok := s.peek()
		if !ok || c == '\n' {
			return string(bytes.TrimRight(b, "\r"))
		}
		if len(b) < 1<<16 {
			b = append(b, c)
		}
		s.advance(c)
	}
}

// number reads an optionally signed decimal integer token. ok is false when
// the token is not a number (tok then holds its first bytes); big is true
// when its magnitude exceeds limit.
func (s *scanner) number(limit int64) (v int64, ok, big bool, tok string) {
	var b [40]byte
	nb := 0
	keep := func(c byte) {
		if nb < len(b) {
			b[nb] = c
			nb++
		}
	}
	c, _ := s.peek()
	neg := false
	if c == '-' {
		neg = true
		keep(c)
		s.advance(c)
	}
	digits := 0
	for {
		c, more := s.peek()
		if !more || isBlank(c) {
			break
		}
		keep(c)
		s.advance(c)
		if c < '0' || c > '9' {
			rest := s.word()
			return 0, false, false, string(b[:nb]) + rest
		}
		digits++
		if !big {
			v = v*10 + int64(c-'0')
			if v > limit {
				big = true
			}
		}
	}
	if digits == 0 {
		return 0, false, false, string(b[:nb])
	}
	if neg {
		v = -v
	}
	return v, true, big, ""
}

type parser struct {
	s      scanner
	name   string
	opt    ReadOptions
	v      Visitor
	cv     CommentVisitor
	header bool
	vars   int64
	decl   int64
	count  int64
	lits   []int32

	warnedVars bool
}

func (p *parser) errAt(line, col int, format string, args ...any) error {
	return &textpos.Error{File: p.name, Line: line, Col: col, Msg: fmt.Sprintf(format, args...)}
}

func (p *parser) warn(line int, format string, args ...any) {
	if p.opt.Warn != nil {
		p.opt.Warn(fmt.Sprintf("%s:%d: ", p.name, line) + fmt.Sprintf(format, args...))
	}
}

// Parse streams a DIMACS CNF (plain, gzip or zstd, detected by magic bytes)
// to v. name is used in error messages. Errors in the input are
// *textpos.Error values with file:line:col.
//
// In strict mode (the default) the input must have exactly one header
// "p cnf VARS CLAUSES" before any clause, exactly CLAUSES clauses, every
// literal within ±VARS, every clause ended by 0, and comments only at the
// start of a line. Lenient mode forgives a missing or repeated header (a
// missing one is reported to Header as 0, 0), wrong counts, literals above
// VARS, a missing final 0, comments after literals and a SATLIB-style "%"
// end marker, calling Warn for each. Numbers outside the int32 range are
// errors in both modes.
func Parse(r io.Reader, name string, opt ReadOptions, v Visitor) error {
	dr, err := Decompress(r)
	if err != nil {
		return err
	}
	defer dr.Close()
	p := &parser{name: name, opt: opt, v: v, decl: -1}
	p.cv, _ = v.(CommentVisitor)
	p.s = scanner{r: dr, buf: make([]byte, 64<<10), line: 1, col: 1}
	if err := p.run(); err != nil {
		return err
	}
	if p.s.err != nil {
		return fmt.Errorf("dimacs: reading %s: %w", name, p.s.err)
	}
	return nil
}

func (p *parser) run() error {
	s := &p.s
	lineStart := true
	clauseLine := 0
	for {
		s.skipBlanks()
		c, ok := s.peek()
		if !ok {
			break
		}
		line, col := s.line, s.col
		switch {
		case c == '\n':
			s.advance(c)
			lineStart = true
			continue
		case c == 'c':
			if !lineStart {
				if !p.opt.Lenient {
					return p.errAt(line, col, "expected literal, found %q (comments must start a line)", s.word())
				}
				p.warn(line, "comment after literals")
			}
			s.advance(c)
			text := s.restOfLine()
			if len(text) > 0 && (text[0] == ' ' || text[0] == '\t') {
				text = text[1:]
			}
			if p.cv != nil {
				if err := p.cv.Comment(text); err != nil {
					return err
				}
			}
			continue
		case c == 'p':
			if err := p.readHeader(line, col, lineStart); err != nil {
				return err
			}
			continue
		case c == '%':
			if !p.opt.Lenient {
				return p.errAt(line, col, "expected literal, found %q", s.word())
			}
			p.warn(line, "input ended by %q marker", "%")
			goto done
		}
		lineStart = false
		lit, isNum, big, tok := s.number(MaxVars)
		if !isNum {
			return p.errAt(line, col, "expected literal (signed integer) or 0, found %q", tok)
		}
		if big {
			return p.errAt(line, col, "literal out of range: magnitude above %d", MaxVars)
		}
		if !p.header {
			if !p.opt.Lenient {
				return p.errAt(line, col, "expected header \"p cnf VARS CLAUSES\" before the first clause")
			}
			p.warn(line, "missing header \"p cnf VARS CLAUSES\"")
			p.header = true
			if err := p.v.Header(0, 0); err != nil {
				return err
			}
		}
		if lit == 0 {
			if err := p.endClause(line, col); err != nil {
				return err
			}
			continue
		}
		if len(p.lits) == 0 {
			clauseLine = line
		}
		if a := max(lit, -lit); a > p.vars {
			if !p.opt.Lenient {
				return p.errAt(line, col, "literal %d out of range: the header declares %d variables", lit, p.vars)
			}
			if !p.warnedVars {
				p.warn(line, "literal %d above the %d declared variables", lit, p.vars)
				p.warnedVars = true
			}
			p.vars = a
		}
		p.lits = append(p.lits, int32(lit))
	}
done:
	if len(p.lits) > 0 {
		if !p.opt.Lenient {
			return p.errAt(s.line, s.col, "unexpected end of input: clause started on line %d is not ended by 0", clauseLine)
		}
		p.warn(clauseLine, "last clause not ended by 0")
		if err := p.endClause(s.line, s.col); err != nil {
			return err
		}
	}
	if !p.header {
		if !p.opt.Lenient {
			return p.errAt(s.line, 0, "missing header \"p cnf VARS CLAUSES\"")
		}
		p.warn(s.line, "missing header \"p cnf VARS CLAUSES\"")
		p.header = true
		if err := p.v.Header(0, 0); err != nil {
			return err
		}
	}
	if p.count != p.decl && p.decl >= 0 {
		if !p.opt.Lenient {
			return p.errAt(s.line, 0, "the header declares %d clauses, found %d", p.decl, p.count)
		}
		p.warn(s.line, "the header declares %d clauses, found %d", p.decl, p.count)
	}
	return nil
}

func (p *parser) endClause(line, col int) error {
	p.count++
	if p.decl >= 0 && p.count > p.decl {
		if !p.opt.Lenient {
			return p.errAt(line, col, "more clauses than the %d the header declares", p.decl)
		}
		p.warn(line, "more clauses than the %d the header declares", p.decl)
		p.decl = -1 // warn once; the final count check is skipped
	}
	err := p.v.Clause(p.lits)
	p.lits = p.lits[:0]
	return err
}

func (p *parser) readHeader(line, col int, lineStart bool) error {
	s := &p.s
	if !lineStart || len(p.lits) > 0 {
		if !p.opt.Lenient {
			return p.errAt(line, col, "header \"p cnf VARS CLAUSES\" must start a line and precede all clauses")
		}
	}
	if p.header {
		if !p.opt.Lenient {
			return p.errAt(line, col, "second header (the first one is already in effect)")
		}
		p.warn(line, "second header ignored")
		s.restOfLine()
		return nil
	}
	if p.count > 0 && !p.opt.Lenient {
		return p.errAt(line, col, "header after clauses")
	}
	if w := s.word(); w != "p" {
		return p.errAt(line, col, "expected header \"p cnf VARS CLAUSES\", found %q", w)
	}
	var vals [2]int64
	s.skipBlanks()
	fl, fc := s.line, s.col
	if w := s.word(); w != "cnf" {
		return p.errAt(fl, fc, "expected \"cnf\" after \"p\", found %q (only CNF is supported)", w)
	}
	for i, what := range []string{"variable count", "clause count"} {
		s.skipBlanks()
		fl, fc = s.line, s.col
		c, ok := s.peek()
		if !ok || c == '\n' {
			return p.errAt(fl, fc, "header: expected %s, found end of line", what)
		}
		limit := int64(MaxVars)
		if i == 1 {
			limit = maxClauses
		}
		v, isNum, big, _ := s.number(limit)
		switch {
		case !isNum:
			return p.errAt(fl, fc, "header: expected %s (non-negative integer)", what)
		case v < 0:
			return p.errAt(fl, fc, "header: %s %d is negative", what, v)
		case big:
			return p.errAt(fl, fc, "header: %s too large (at most %d)", what, limit)
		}
		vals[i] = v
	}
	s.skipBlanks()
	if c, ok := s.peek(); ok && c != '\n' {
		fl, fc = s.line, s.col
		return p.errAt(fl, fc, "header: unexpected %q after the clause count", s.word())
	}
	p.header = true
	if vals[0] > p.vars {
		p.vars = vals[0]
	}
	p.decl = vals[1]
	if p.count > 0 { // lenient: header after clauses
		p.warn(line, "header after %d clauses", p.count)
		p.decl = -1
	}
	return p.v.Header(int(vals[0]), int(vals[1]))
}
