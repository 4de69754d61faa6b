package dimacs

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// Writer writes DIMACS CNF text: comment lines, the header, then clauses.
// It buffers its output; call Flush at the end. The first error is sticky.
type Writer struct {
	w       *bufio.Writer
	scratch []byte
	err     error
}

// NewWriter returns a Writer that writes to w.
func NewWriter(w io.Writer) *Writer {
	return &Writer{w: bufio.NewWriterSize(w, 256<<10), scratch: make([]byte, 0, 256)}
}

func (w *Writer) write(b []byte) error {
	if w.err != nil {
		return w.err
	}
	if _, err := w.w.Write(b); err != nil {
		w.err = fmt.Errorf("dimacs: write: %w", err)
	}
	return w.err
}

// Comment writes text as comment lines, one "c " line per line of text.
func (w *Writer) Comment(text string) error {
	for _, line := range strings.Split(text, "\n") {
		b := append(w.scratch[:0], 'c')
		if line != "" {
			b = append(b, ' ')
			b = append(b, line...)
		}
		b = append(b, '\n')
		if err := w.write(b); err != nil {
			return err
		}
	}
	return nil
}

// Header writes the "p cnf VARS CLAUSES" line.
func (w *Writer) Header(vars, clauses int) error {
	if vars < 0 || clauses < 0 || vars > MaxVars {
		return fmt.Errorf("dimacs: header counts %d, %d out of range", vars, clauses)
	}
	b := append(w.scratch[:0], "p cnf "...)
	b = strconv.AppendInt(b, int64(vars), 10)
	b = append(b, ' ')
	b = strconv.AppendInt(b, int64(clauses), 10)
	b = append(b, '\n')
	return w.write(b)
}

// Clause writes one clause ended by 0.
func (w *Writer) Clause(lits ...int32) error {
	if w.err != nil {
		return w.err
	}
	b := w.scratch[:0]
	for _, l := range lits {
		if l == 0 {
			return fmt.Errorf("dimacs: literal 0 inside a clause")
		}
		b = appendLit(b, l)
		b = append(b, ' ')
	}
	b = append(b, '0', '\n')
	w.scratch = b[:0]
	// Write straight into the buffer when it fits (the common case).
	if w.w.Available() >= len(b) {
		w.w.Write(b)
		return nil
	}
	return w.write(b)
}

// appendLit appends the decimal form of l.
func appendLit(b []byte, l int32) []byte {
	if l < 0 {
		b = append(b, '-')
		l = -l
	}
	if l < 10 {
		return append(b, byte('0'+l))
	}
	var d [10]byte
	i := len(d)
	for l > 0 {
		i--
		d[i] = byte('0' + l%10)
		l /= 10
	}
	return append(b, d[i:]...)
}

// Flush writes any buffered data to the underlying writer.
func (w *Writer) Flush() error {
	if w.err != nil {
		return w.err
	}
	if err := w.w.Flush(); err != nil {
		w.err = fmt.Errorf("dimacs: write: %w", err)
	}
	return w.err
}
