package dimacs

import (
	"fmt"
	"io"
	"os"
)

// CNF is a formula in conjunctive normal form held in memory.
// Variables are 1..Vars; a clause is a list of non-zero literals.
type CNF struct {
	Vars     int
	Clauses  [][]int32
	Comments []string
}

// cnfBuilder collects a parsed CNF, storing literals in large shared blocks.
type cnfBuilder struct {
	c     *CNF
	block []int32
	vars  int
}

func (b *cnfBuilder) Header(vars, clauses int) error {
	b.c.Vars = vars
	b.vars = vars
	b.c.Clauses = make([][]int32, 0, min(clauses, 1<<16))
	return nil
}

func (b *cnfBuilder) Clause(lits []int32) error {
	if len(b.block)+len(lits) > cap(b.block) {
		b.block = make([]int32, 0, max(1<<16, len(lits)))
	}
	start := len(b.block)
	b.block = append(b.block, lits...)
	b.c.Clauses = append(b.c.Clauses, b.block[start:len(b.block):len(b.block)])
	for _, l := range lits {
		if int(max(l, -l)) > b.vars {
			b.vars = int(max(l, -l))
		}
	}
	return nil
}

func (b *cnfBuilder) Comment(text string) error {
	b.c.Comments = append(b.c.Comments, text)
	return nil
}

// ReadCNF reads a whole CNF into memory (see Parse for the accepted input).
// In lenient mode Vars is raised to the largest variable actually used.
func ReadCNF(r io.Reader, name string, opt ReadOptions) (*CNF, error) {
	b := &cnfBuilder{c: &CNF{}}
	if err := Parse(r, name, opt, b); err != nil {
		return nil, err
	}
	b.c.Vars = b.vars
	return b.c, nil
}

// ReadCNFFile reads the CNF in the named file (plain, gzip or zstd).
func ReadCNFFile(path string, opt ReadOptions) (*CNF, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("dimacs: %w", err)
	}
	defer f.Close()
	return ReadCNF(f, path, opt)
}

// countingWriter counts the bytes written through it.
type countingWriter struct {
	w io.Writer
	n int64
}

func (c *countingWriter) Write(p []byte) (int, error) {
	n, err := c.w.Write(p)
	c.n += int64(n)
	return n, err
}

// WriteTo writes the CNF as DIMACS text: comments, header, clauses.
func (c *CNF) WriteTo(w io.Writer) (int64, error) {
	cw := &countingWriter{w: w}
	dw := NewWriter(cw)
	for _, t := range c.Comments {
		if err := dw.Comment(t); err != nil {
			return cw.n, err
		}
	}
	if err := dw.Header(c.Vars, len(c.Clauses)); err != nil {
		return cw.n, err
	}
	for _, cl := range c.Clauses {
		if err := dw.Clause(cl...); err != nil {
			return cw.n, err
		}
	}
	err := dw.Flush()
	return cw.n, err
}

// Literals returns the total number of literals in all clauses.
func (c *CNF) Literals() int {
	n := 0
	for _, cl := range c.Clauses {
		n += len(cl)
	}
	return n
}
