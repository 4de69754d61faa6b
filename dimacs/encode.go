package dimacs

import (
	"fmt"
	"io"
	"strings"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

// Encoding is the CNF for one layout claim about one graph, with what is
// needed to turn a model back into a layout of that graph.
type Encoding struct {
	g       *graph.Graph
	opt     Options
	version string
	kinds   []cert.Kind
	f       formula
	parts   []*part
	base    *baseMap

	// How the parts are put back together (default formulation).
	blocks   bool
	bridges  []int32 // edges in single-edge blocks (blocks mode)
	leaves   []int32 // peeled leaves in removal order (leaves mode)
	anchors  []int32 // neighbour of each peeled leaf at removal
	isolated []int32 // vertices dropped for having no edge (or no edge left)
}

// Encode builds the CNF that is satisfiable if and only if g has a layout
// of the kind and page count in opt (see the package documentation for the
// formulations and the argument for every reduction).
func Encode(g *graph.Graph, opt Options) (*Encoding, error) {
	kinds, err := opt.normalize()
	if err != nil {
		return nil, err
	}
	if !opt.Baseline && opt.Kind != cert.Mixed {
		opt.PageKinds = nil
	}
	e := &Encoding{g: g, opt: opt, kinds: kinds, version: EncoderVersion}
	if opt.Baseline {
		e.encodeBaseline()
	} else {
		e.encodeDefault()
	}
	if e.f.err != nil {
		return nil, e.f.err
	}
	return e, nil
}

// EncodeVersion is Encode as encoder version wrote it: EncoderVersion, or an
// earlier one listed by EncoderVersions, so that a CNF recorded with an older
// spinecert can be reproduced byte for byte. spinecert-enc-1 had no twin symmetry
// breaking: it is Encode with NoTwins set (the returned Options say so) and
// its own version in the header.
func EncodeVersion(g *graph.Graph, opt Options, version string) (*Encoding, error) {
	switch version {
	case EncoderVersion:
		return Encode(g, opt)
	case legacyVersion:
		opt.NoTwins = true
		e, err := Encode(g, opt)
		if err != nil {
			return nil, err
		}
		e.version = legacyVersion
		return e, nil
	}
	return nil, fmt.Errorf("%w %q (this encoder writes %s)", ErrUnknownVersion, version, strings.Join(EncoderVersions(), ", "))
}

// Version returns the encoder version the CNF is written as.
func (e *Encoding) Version() string { return e.version }

// Graph returns the graph the encoding is about.
func (e *Encoding) Graph() *graph.Graph { return e.g }

// Options returns the options the encoding was made with.
func (e *Encoding) Options() Options { return e.opt }

// PageKinds returns the kind of every page.
func (e *Encoding) PageKinds() []cert.Kind { return e.kinds }

// Vars returns the number of variables.
func (e *Encoding) Vars() int { return e.f.nvars }

// Stats returns the size of the encoding, split by constraint family.
func (e *Encoding) Stats() Stats {
	s := e.f.stats()
	s.Parts = len(e.parts)
	if e.base != nil {
		s.Parts = 1
	}
	return s
}

// Comments returns the comment lines written at the top of the CNF: the
// encoder version, the graph identity, the claim and the options.
func (e *Encoding) Comments() []string {
	desc := e.opt.describe(e.kinds)
	claim := fmt.Sprintf("the graph has a %s layout on %d pages", e.opt.Kind, e.opt.Pages)
	if e.opt.Kind == cert.Mixed {
		names := make([]string, len(e.kinds))
		for i, k := range e.kinds {
			names[i] = k.String()
		}
		claim += " of kinds " + strings.Join(names, ",")
	}
	return []string{
		"spinecert layout claim as CNF: satisfiable if and only if the claim holds",
		"encoder " + e.version,
		fmt.Sprintf("graph %s n=%d m=%d", e.g.ID(), e.g.N(), e.g.M()),
		"claim " + claim,
		"options " + desc,
		"variables numbered as documented in package spinecert/dimacs (Encoding)",
	}
}

// CNF returns the formula with its header comments. The clauses share the
// encoding's memory and must not be modified.
func (e *Encoding) CNF() *CNF {
	c := &CNF{Vars: e.f.nvars, Comments: e.Comments(), Clauses: make([][]int32, 0, e.f.clauses)}
	lits := e.f.lits
	start := 0
	for i, l := range lits {
		if l == 0 {
			c.Clauses = append(c.Clauses, lits[start:i:i])
			start = i + 1
		}
	}
	return c
}

// WriteTo writes the CNF as DIMACS text with its header comments.
func (e *Encoding) WriteTo(w io.Writer) (int64, error) {
	cw := &countingWriter{w: w}
	dw := NewWriter(cw)
	for _, c := range e.Comments() {
		dw.Comment(c)
	}
	dw.Header(e.f.nvars, e.f.clauses)
	lits := e.f.lits
	start := 0
	for i, l := range lits {
		if l == 0 {
			if err := dw.Clause(lits[start:i]...); err != nil {
				return cw.n, err
			}
			start = i + 1
		}
	}
	err := dw.Flush()
	return cw.n, err
}

// VisitClauses calls v with the header and every clause (v may be a
// solver or a checker); lits is reused after Clause returns.
func (e *Encoding) VisitClauses(v Visitor) error {
	if err := v.Header(e.f.nvars, e.f.clauses); err != nil {
		return err
	}
	lits := e.f.lits
	start := 0
	for i, l := range lits {
		if l == 0 {
			if err := v.Clause(lits[start:i]); err != nil {
				return err
			}
			start = i + 1
		}
	}
	return nil
}

// encodeDefault splits the graph into parts and encodes each one.
func (e *Encoding) encodeDefault() {
	g, o := e.g, &e.opt
	if len(e.kinds) == 0 {
		if g.M() > 0 {
			e.f.add(FamPage) // no page for the edges: the empty clause
		}
		e.isolated = make([]int32, g.N())
		for v := range e.isolated {
			e.isolated[v] = int32(v)
		}
		return
	}
	stack := allStack(e.kinds)
	if stack && !o.NoBlocks {
		e.blocks = true
		inBlock := make([]bool, g.N())
		for _, blk := range g.Blocks() {
			if len(blk) == 1 {
				e.bridges = append(e.bridges, blk[0])
				ed := g.Edges()[blk[0]]
				inBlock[ed.U], inBlock[ed.V] = true, true
				continue
			}
			vs := blockVertices(g, blk)
			for _, v := range vs {
				inBlock[v] = true
			}
			e.addPart(vs, blk)
		}
		for v := int32(0); int(v) < g.N(); v++ {
			if !inBlock[v] {
				e.isolated = append(e.isolated, v)
			}
		}
		return
	}
	removed := make([]bool, g.N())
	if stack && !o.NoLeaves {
		e.leaves, e.anchors, removed = peelLeaves(g)
	}
	var vs []int32
	for v := int32(0); int(v) < g.N(); v++ {
		if removed[v] {
			continue
		}
		if !o.NoIsolated && g.Degree(v) == 0 {
			e.isolated = append(e.isolated, v)
			continue
		}
		if !o.NoIsolated && !o.NoLeaves && stack && keptDegree(g, v, removed) == 0 {
			e.isolated = append(e.isolated, v)
			continue
		}
		vs = append(vs, v)
	}
	keep := make([]bool, g.N())
	for _, v := range vs {
		keep[v] = true
	}
	var es []int32
	for i, ed := range g.Edges() {
		if keep[ed.U] && keep[ed.V] {
			es = append(es, int32(i))
		}
	}
	e.addPart(vs, es)
}

// keptDegree counts the neighbours of v that were not removed.
func keptDegree(g *graph.Graph, v int32, removed []bool) int {
	d := 0
	for _, w := range g.Neighbors(v) {
		if !removed[w] {
			d++
		}
	}
	return d
}
