package proof

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"strconv"

	"spinecert.dev/textpos"
)

// lratTextMax bounds how much of a line the LRAT reader keeps for messages.
const lratTextMax = 200

// lratScanner reads LRAT text one token at a time, so that a line of any
// length costs no memory beyond its clause: only the first lratTextMax bytes
// of the current line are kept, for messages.
type lratScanner struct {
	br        *bufio.Reader
	name      string
	line, col int // current line and the column of its next byte, 1-based
	text      []byte
	cut       bool // text holds only the start of the line
	eol       bool // the current line has ended
	tok       []byte
	tokCol    int
}

func newLRATScanner(r io.Reader, name string) *lratScanner {
	return &lratScanner{br: bufio.NewReaderSize(r, 1<<16), name: name, col: 1, eol: true}
}

func (sc *lratScanner) errAt(col int, format string, args ...any) error {
	return fmt.Errorf("proof: %w", &textpos.Error{File: sc.name, Line: sc.line, Col: col, Msg: fmt.Sprintf(format, args...)})
}

// readByte returns the next byte of the current line; ok is false at its end
// (the newline is consumed) or at the end of the input.
func (sc *lratScanner) readByte() (c byte, ok bool, err error) {
	if sc.eol {
		return 0, false, nil
	}
	c, err = sc.br.ReadByte()
	if err != nil {
		sc.eol = true
		if errors.Is(err, io.EOF) {
			return 0, false, nil
		}
		return 0, false, fmt.Errorf("proof: %s: %w", sc.name, err)
	}
	if c == '\n' {
		sc.eol = true
		return 0, false, nil
	}
	sc.col++
	if len(sc.text) < lratTextMax {
		sc.text = append(sc.text, c)
	} else {
		sc.cut = true
	}
	return c, true, nil
}

// token reads the next token of the current line (at most 32 bytes of it
// are kept; a longer one is no number). ok is false at the end of the line.
func (sc *lratScanner) token() (ok bool, err error) {
	sc.tok = sc.tok[:0]
	for {
		c, ok, err := sc.readByte()
		if !ok || err != nil {
			if len(sc.tok) > 0 && err == nil {
				return true, nil
			}
			return false, err
		}
		if isSpace(c) {
			if len(sc.tok) > 0 {
				return true, nil
			}
			continue
		}
		if len(sc.tok) == 0 {
			sc.tokCol = sc.col - 1
		}
		if len(sc.tok) < 32 {
			sc.tok = append(sc.tok, c)
		}
	}
}

// nextLine moves to the next line that holds a step, skipping empty lines and
// comments, and reads its first token; it reports false at the end of input.
func (sc *lratScanner) nextLine() (bool, error) {
	for {
		if err := sc.skipLine(); err != nil {
			return false, err
		}
		if _, err := sc.br.Peek(1); err != nil {
			if errors.Is(err, io.EOF) {
				return false, nil
			}
			return false, fmt.Errorf("proof: %s: %w", sc.name, err)
		}
		sc.line++
		sc.col, sc.text, sc.cut, sc.eol = 1, sc.text[:0], false, false
		ok, err := sc.token()
		if err != nil {
			return false, err
		}
		if ok && sc.tok[0] != 'c' {
			return true, nil
		}
	}
}

// skipLine reads to the end of the current line.
func (sc *lratScanner) skipLine() error {
	for {
		_, ok, err := sc.readByte()
		if !ok || err != nil {
			return err
		}
	}
}

// int reads the next token as an integer; what names the expected thing.
func (sc *lratScanner) int(what string) (int64, error) {
	ok, err := sc.token()
	if err != nil {
		return 0, err
	}
	if !ok {
		return 0, sc.errAt(sc.col, "expected %s, found the end of the line", what)
	}
	n, perr := strconv.ParseInt(string(sc.tok), 10, 64)
	if perr != nil {
		return 0, sc.errAt(sc.tokCol, "expected %s, found %q", what, sc.tok)
	}
	return n, nil
}

// endLine requires the current line to end here.
func (sc *lratScanner) endLine() error {
	ok, err := sc.token()
	if err != nil || !ok {
		return err
	}
	return sc.errAt(sc.tokCol, "expected the end of the line after the final 0, found %q", sc.tok)
}

// lineText is the current line (its start, when long), for messages: the
// rest of the line up to lratTextMax bytes is read first.
func (sc *lratScanner) lineText() string {
	for len(sc.text) < lratTextMax {
		if _, ok, err := sc.readByte(); !ok || err != nil {
			break
		}
	}
	if _, ok, _ := sc.readByte(); ok || sc.cut {
		return string(trimSpace(sc.text)) + " …"
	}
	return string(trimSpace(sc.text))
}

func trimSpace(b []byte) []byte {
	for len(b) > 0 && isSpace(b[0]) {
		b = b[1:]
	}
	for len(b) > 0 && isSpace(b[len(b)-1]) {
		b = b[:len(b)-1]
	}
	return b
}
