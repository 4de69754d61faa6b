package dimacs

import (
	"fmt"
	"strings"

	"spinecert.dev/cert"
)

// EncoderVersion names the encoder's output. It changes whenever the CNF
// written for some graph and options changes, so a CNF file (whose header
// records it) can always be reproduced or rejected as foreign.
// spinecert-enc-2 added twin symmetry breaking (Options.NoTwins); without it
// the clauses are those of spinecert-enc-1, which EncodeVersion still writes.
const EncoderVersion = "spinecert-enc-2"

// legacyVersion is the encoder before twin symmetry breaking.
const legacyVersion = "spinecert-enc-1"

// EncoderVersions returns the encoder versions whose output Encode and
// EncodeVersion reproduce, oldest first; the last is EncoderVersion.
func EncoderVersions() []string { return []string{legacyVersion, EncoderVersion} }

// Options selects the claim and the encoding. The zero value of every
// reduction toggle means "on where sound", so Options{Kind: cert.Stack,
// Pages: 2} is the default encoding of "G has a 2-page stack layout".
type Options struct {
	Kind      cert.Kind   // Stack, Queue or Mixed
	Pages     int         // number of pages k
	PageKinds []cert.Kind // kind of each page, only for Mixed

	// Baseline selects the published formulation (see the package
	// documentation) and ignores every toggle below.
	Baseline bool

	NoRotation     bool // stack only: do not fix the first vertex on the spine
	NoReflection   bool // do not fix the relative order of one pair of vertices
	NoPageSymmetry bool // do not restrict edge i to the first i+1 pages of each kind
	NoBlocks       bool // stack only: do not encode biconnected components separately
	NoLeaves       bool // stack only: keep vertices of degree one (without blocks)
	NoIsolated     bool // keep isolated vertices in the encoding
	NoBetweenness  bool // expand conflicts over order variables instead of betweenness variables
	NoDirect       bool // always use same-page variables, even where direct clauses are fewer
	NoTwins        bool // do not put twin vertices in increasing order on the spine (since spinecert-enc-2)
}

// normalize checks the options and returns the page kinds.
func (o *Options) normalize() ([]cert.Kind, error) {
	if o.Pages < 0 {
		return nil, fmt.Errorf("dimacs: page count %d is negative", o.Pages)
	}
	kinds, err := cert.PageKinds(o.Kind, o.Pages, o.PageKinds)
	if err != nil {
		return nil, fmt.Errorf("dimacs: %w", err)
	}
	return kinds, nil
}

// allStack reports whether every page is a stack page.
func allStack(kinds []cert.Kind) bool {
	for _, k := range kinds {
		if k != cert.Stack {
			return false
		}
	}
	return true
}

// reductions returns the names of the reductions in effect for the page kinds.
func (o *Options) reductions(kinds []cert.Kind) []string {
	if o.Baseline {
		return nil
	}
	var r []string
	stack := o.Kind == cert.Stack || (len(kinds) > 0 && allStack(kinds))
	if stack && !o.NoBlocks {
		r = append(r, "blocks")
	}
	if stack && o.NoBlocks && !o.NoLeaves {
		r = append(r, "leaves")
	}
	if !(stack && !o.NoBlocks) && !o.NoIsolated {
		r = append(r, "isolated") // blocks drop isolated vertices anyway
	}
	if stack && !o.NoRotation {
		r = append(r, "rotation")
	}
	if !o.NoReflection {
		r = append(r, "reflection")
	}
	if !o.NoTwins {
		r = append(r, "twins")
	}
	if !o.NoPageSymmetry {
		r = append(r, "page-symmetry")
	}
	if !o.NoBetweenness {
		r = append(r, "betweenness")
	}
	if !o.NoDirect {
		r = append(r, "direct")
	}
	return r
}

// Describe returns the canonical one-line description of the options in
// effect, as written in the CNF header, e.g. "stack pages=2 default
// reductions=blocks,isolated,rotation,...".
func (o Options) Describe() (string, error) {
	kinds, err := o.normalize()
	if err != nil {
		return "", err
	}
	return o.describe(kinds), nil
}

func (o *Options) describe(kinds []cert.Kind) string {
	var b strings.Builder
	fmt.Fprintf(&b, "%s pages=%d", o.Kind, o.Pages)
	if o.Kind == cert.Mixed {
		names := make([]string, len(kinds))
		for i, k := range kinds {
			names[i] = k.String()
		}
		fmt.Fprintf(&b, " page-kinds=%s", strings.Join(names, ","))
	}
	if o.Baseline {
		b.WriteString(" formulation=baseline")
	} else {
		b.WriteString(" formulation=default")
		r := o.reductions(kinds)
		if len(r) == 0 {
			r = []string{"none"}
		}
		fmt.Fprintf(&b, " reductions=%s", strings.Join(r, ","))
	}
	return b.String()
}
