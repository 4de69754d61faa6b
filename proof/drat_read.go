package proof

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"

	"spinecert.dev/textpos"
)

// detectWindow is how many leading bytes of a proof format detection looks at.
const detectWindow = 1024

// DetectFormat decides between text and binary DRAT from the first
// bytes of a proof. The rule: the proof is binary (DRATBinary) when one
// of its first 1024 bytes is not printable ASCII text or whitespace, that is
// not in 0x20..0x7e and not tab, line feed, carriage return, vertical tab or
// form feed; otherwise it is text (DRAT). An empty prefix is text.
//
// This is the principle drat-trim applies (Wetzler, Heule, Hunt, SAT 2014
// describe binary DRAT; drat-trim inspects the leading characters of the
// proof, from memory). Every binary step ends with a zero byte, so any binary
// proof whose first step fits in the window is recognised; a text proof is
// printable throughout and is never taken for binary.
func DetectFormat(prefix []byte) string {
	if len(prefix) > detectWindow {
		prefix = prefix[:detectWindow]
	}
	for _, c := range prefix {
		if (c < 0x20 || c > 0x7e) && c != '\t' && c != '\n' && c != '\r' && c != '\v' && c != '\f' {
			return DRATBinary
		}
	}
	return DRAT
}

// proofReader yields the steps of a DRAT proof one at a time from a stream.
type proofReader struct {
	br     *bufio.Reader
	name   string
	format string
	lits   []int32
	// maxLits, when positive, bounds the literals of one step (stepLimit);
	// vars is the variable count it was computed from, for the message
	maxLits, vars int
	// text position (1-based) or binary byte offset (0-based)
	line, col int64
	off       int64
	// position of the step just returned: text line, or binary offset
	stepLine int64
	stepCol  int64
}

// newProofReader wraps r. When format is empty the format is detected from
// the first bytes; detected reports whether it was.
func newProofReader(r io.Reader, name, format string) (pr *proofReader, detected bool, err error) {
	br := bufio.NewReaderSize(r, 1<<16)
	switch format {
	case "":
		prefix, perr := br.Peek(detectWindow)
		if perr != nil && !errors.Is(perr, io.EOF) && !errors.Is(perr, bufio.ErrBufferFull) {
			return nil, false, fmt.Errorf("proof: %s: %w", name, perr)
		}
		format, detected = DetectFormat(prefix), true
	case DRAT, DRATBinary, RUP:
	default:
		return nil, false, fmt.Errorf("proof: unknown proof format %q (want %s, %s or %s)", format, DRAT, DRATBinary, RUP)
	}
	return &proofReader{br: br, name: name, format: format, line: 1, col: 1}, detected, nil
}

// where describes the position of the last step returned, for messages.
func (p *proofReader) where() string {
	if p.format == DRATBinary {
		return fmt.Sprintf("byte %d", p.stepLine)
	}
	return fmt.Sprintf("line %d", p.stepLine)
}

func (p *proofReader) textErr(line, col int64, format string, args ...any) error {
	return fmt.Errorf("proof: %w", &textpos.Error{File: p.name, Line: int(line), Col: int(col), Msg: fmt.Sprintf(format, args...)})
}

func (p *proofReader) binErr(off int64, format string, args ...any) error {
	return fmt.Errorf("proof: %w", &textpos.Error{File: p.name, Msg: fmt.Sprintf("byte %d: ", off) + fmt.Sprintf(format, args...)})
}

// next returns the next step: del reports a deletion; lits is reused by the
// following call. At the end of the proof it returns io.EOF.
func (p *proofReader) next() (del bool, lits []int32, err error) {
	if p.format == DRATBinary {
		return p.nextBinary()
	}
	return p.nextText()
}

func (p *proofReader) readByte() (byte, error) {
	c, err := p.br.ReadByte()
	if err != nil {
		if errors.Is(err, io.EOF) {
			return 0, io.EOF
		}
		return 0, fmt.Errorf("proof: %s: %w", p.name, err)
	}
	p.off++
	if c == '\n' {
		p.line++
		p.col = 1
	} else {
		p.col++
	}
	return c, nil
}

func isSpace(c byte) bool {
	return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\v' || c == '\f'
}

// nextText reads one text step: an optional "d", literals, and a 0.
// Lines whose first word starts with 'c' are comments.
func (p *proofReader) nextText() (bool, []int32, error) {
	p.lits = p.lits[:0]
	del, started := false, false
	for {
		c, err := p.readByte()
		if err == io.EOF {
			if started {
				return false, nil, p.textErr(p.line, p.col, "unexpected end of proof: step starting at line %d is not terminated by 0", p.stepLine)
			}
			return false, nil, io.EOF
		}
		if err != nil {
			return false, nil, err
		}
		if isSpace(c) {
			continue
		}
		line, col := p.line, p.col-1
		switch {
		case c == 'c' && !started:
			if err := p.skipLine(); err != nil {
				return false, nil, err
			}
			continue
		case c == 'd' && started:
			return false, nil, p.textErr(line, col, "found 'd' after the literals of a step: the line looks like an LRAT deletion (\"ID d IDS 0\"), which DRAT does not have")
		case c == 'd' && !started:
			if p.format == RUP {
				return false, nil, p.textErr(line, col, "deletion step in a proof read as %s (lemmas only)", RUP)
			}
			del, started = true, true
			p.stepLine, p.stepCol = line, col
			if err := p.expectSeparator(); err != nil {
				return false, nil, err
			}
			continue
		case c == '-' || (c >= '0' && c <= '9'):
			if !started {
				started = true
				p.stepLine, p.stepCol = line, col
			}
			v, err := p.number(c, line, col)
			if err != nil {
				return false, nil, err
			}
			if v == 0 {
				return del, p.lits, nil
			}
			if p.maxLits > 0 && len(p.lits) >= p.maxLits {
				return false, nil, p.textErr(line, col, "%s (the step starts at line %d)", stepLimitMsg(p.maxLits, p.vars), p.stepLine)
			}
			p.lits = append(p.lits, v)
		default:
			return false, nil, p.textErr(line, col, "expected a literal, 0 or 'd', found %q", c)
		}
	}
}

func (p *proofReader) skipLine() error {
	for {
		c, err := p.readByte()
		if err == io.EOF || (err == nil && c == '\n') {
			return nil
		}
		if err != nil {
			return err
		}
	}
}

// expectSeparator requires white space (or the end) after a 'd'.
func (p *proofReader) expectSeparator() error {
	b, err := p.br.Peek(1)
	if err != nil || isSpace(b[0]) {
		return nil
	}
	return p.textErr(p.line, p.col, "expected a space after 'd', found %q", b[0])
}

// number reads the rest of an integer whose first byte is c.
func (p *proofReader) number(c byte, line, col int64) (int32, error) {
	neg := c == '-'
	var v int64
	digits := 0
	if !neg {
		v, digits = int64(c-'0'), 1
	}
	for {
		b, err := p.br.Peek(1)
		if err != nil || isSpace(b[0]) {
			break
		}
		if b[0] < '0' || b[0] > '9' {
			return 0, p.textErr(p.line, p.col, "expected a digit, found %q", b[0])
		}
		p.readByte()
		v = v*10 + int64(b[0]-'0')
		digits++
		if v > math.MaxInt32 {
			return 0, p.textErr(line, col, "literal out of range (variables are at most %d)", math.MaxInt32)
		}
	}
	if digits == 0 {
		return 0, p.textErr(line, col, "expected digits after '-'")
	}
	if neg {
		if v == 0 {
			return 0, p.textErr(line, col, "\"-0\" is not a literal")
		}
		v = -v
	}
	return int32(v), nil
}

// nextBinary reads one binary step: 'a' or 'd', then literals as unsigned
// LEB128 numbers 2*v+sign (sign 1 for negative), then a 0 byte.
func (p *proofReader) nextBinary() (bool, []int32, error) {
	p.lits = p.lits[:0]
	start := p.off
	c, err := p.readByte()
	if err == io.EOF {
		return false, nil, io.EOF
	}
	if err != nil {
		return false, nil, err
	}
	p.stepLine = start
	var del bool
	switch c {
	case 'a':
	case 'd':
		del = true
	default:
		return false, nil, p.binErr(start, "expected step marker 'a' (0x61) or 'd' (0x64), found 0x%02x", c)
	}
	for {
		at := p.off
		var u uint64
		for shift := uint(0); ; shift += 7 {
			b, err := p.readByte()
			if err == io.EOF {
				return false, nil, p.binErr(p.off, "unexpected end of proof inside the step starting at byte %d", start)
			}
			if err != nil {
				return false, nil, err
			}
			if shift >= 35 {
				return false, nil, p.binErr(at, "literal encoding longer than 5 bytes")
			}
			u |= uint64(b&0x7f) << shift
			if b&0x80 == 0 {
				break
			}
		}
		if u == 0 {
			return del, p.lits, nil
		}
		v := u >> 1
		if v == 0 {
			return false, nil, p.binErr(at, "encoded value 1 names variable 0")
		}
		if v > math.MaxInt32 {
			return false, nil, p.binErr(at, "literal out of range (variables are at most %d)", math.MaxInt32)
		}
		l := int32(v)
		if u&1 == 1 {
			l = -l
		}
		if p.maxLits > 0 && len(p.lits) >= p.maxLits {
			return false, nil, p.binErr(at, "%s (the step starts at byte %d)", stepLimitMsg(p.maxLits, p.vars), start)
		}
		p.lits = append(p.lits, l)
	}
}

// formatStep writes a step as DRAT text, for messages.
func formatStep(del bool, lits []int32) string {
	b := make([]byte, 0, 8*len(lits)+4)
	if del {
		b = append(b, "d "...)
	}
	for _, l := range lits {
		b = fmt.Appendf(b, "%d ", l)
	}
	return string(append(b, '0'))
}
