package cube

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"

	"spinecert.dev/textpos"
)

// Limits of the reader; a file beyond them is refused with its position.
const (
	MaxLineBytes = 64 << 10 // one cube line
	MaxCubeLen   = 4096     // literals in one cube
	MaxCubes     = 1 << 20  // cubes in one file
)

// ReadOptions controls Read.
type ReadOptions struct {
	// Vars, when positive, is the number of variables of the formula the
	// cubes split: a literal beyond it is an error.
	Vars int
}

// Read reads a cube file: one cube per line as "a LIT … 0" (the cube
// convention cube-and-conquer tools share: the letter a, the literals as
// non-zero DIMACS integers, and a closing 0, all on one line). Lines
// starting with "c" are comments and blank lines are skipped. Every error
// is a *textpos.Error with the line and column in name. A literal repeated
// in a cube, or a variable with both signs in one cube, is an error (such a
// cube is a duplicate or empty).
func Read(r io.Reader, name string, opt ReadOptions) ([]Cube, error) {
	br := bufio.NewReaderSize(r, MaxLineBytes)
	var cubes []Cube
	seen := map[int32]int{}
	for line := 1; ; line++ {
		text, err := br.ReadSlice('\n')
		if errors.Is(err, bufio.ErrBufferFull) {
			return nil, &textpos.Error{File: name, Line: line, Msg: fmt.Sprintf("line longer than %d bytes", MaxLineBytes)}
		}
		if err != nil && !errors.Is(err, io.EOF) {
			return nil, fmt.Errorf("cube: %s: %w", name, err)
		}
		if len(text) > 0 {
			c, perr := parseLine(text, name, line, opt, seen)
			if perr != nil {
				return nil, perr
			}
			if c != nil {
				if len(cubes) == MaxCubes {
					return nil, &textpos.Error{File: name, Line: line, Msg: fmt.Sprintf("more than %d cubes", MaxCubes)}
				}
				cubes = append(cubes, c)
			}
		}
		if err != nil {
			break
		}
	}
	if len(cubes) == 0 {
		return nil, &textpos.Error{File: name, Msg: "no cubes: expected lines of the form \"a LIT … 0\""}
	}
	return cubes, nil
}

// ReadFile reads the cube file at path (see Read).
func ReadFile(path string, opt ReadOptions) ([]Cube, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cube: %w", err)
	}
	defer f.Close()
	return Read(f, path, opt)
}

func isSpace(b byte) bool { return b == ' ' || b == '\t' || b == '\r' || b == '\n' }

// parseLine parses one line; it returns nil, nil for comments and blanks.
// seen is scratch space, cleared on return.
func parseLine(text []byte, name string, line int, opt ReadOptions, seen map[int32]int) (Cube, error) {
	defer clear(seen)
	at := func(col int, format string, args ...any) error {
		return &textpos.Error{File: name, Line: line, Col: col, Msg: fmt.Sprintf(format, args...)}
	}
	i := 0
	next := func() (tok []byte, col int) {
		for i < len(text) && isSpace(text[i]) {
			i++
		}
		start := i
		for i < len(text) && !isSpace(text[i]) {
			i++
		}
		return text[start:i], start + 1
	}
	tok, col := next()
	switch {
	case len(tok) == 0:
		return nil, nil
	case tok[0] == 'c' && (len(tok) == 1 || col == 1):
		return nil, nil
	case !bytes.Equal(tok, []byte("a")):
		return nil, at(col, "expected a cube line \"a LIT … 0\" or a comment, found %q", clip(tok))
	}
	var c Cube
	for {
		tok, col = next()
		if len(tok) == 0 {
			return nil, at(len(bytes.TrimRight(text, "\r\n"))+1, "expected a literal or the closing 0 of the cube, found the end of the line")
		}
		n, err := strconv.ParseInt(string(tok), 10, 32)
		if err != nil || n == math.MinInt32 {
			return nil, at(col, "expected a literal (a non-zero integer) or 0, found %q", clip(tok))
		}
		if n == 0 {
			break
		}
		l := int32(n)
		v := abs(l)
		if opt.Vars > 0 && int(v) > opt.Vars {
			return nil, at(col, "literal %d: the formula has %d variables", l, opt.Vars)
		}
		if prev, ok := seen[v]; ok {
			if int32(prev) == l {
				return nil, at(col, "literal %d appears twice in the cube", l)
			}
			return nil, at(col, "literal %d and its negation are both in the cube: it can never hold", l)
		}
		if len(c) == MaxCubeLen {
			return nil, at(col, "more than %d literals in one cube", MaxCubeLen)
		}
		seen[v] = int(l)
		c = append(c, l)
	}
	if tok, col = next(); len(tok) > 0 {
		return nil, at(col, "expected the end of the line after the closing 0, found %q", clip(tok))
	}
	return c, nil
}

func clip(b []byte) string {
	if len(b) > 24 {
		return string(b[:24]) + "…"
	}
	return string(b)
}
