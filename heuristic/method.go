package heuristic

import (
	"fmt"
	"math/rand/v2"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
	"spinecert.dev/planar"
)

// Method names a way of finding a layout.
type Method string

// Methods. MethodAuto picks the first construction that applies (in the
// order below) and otherwise the sweep; the others force one method.
const (
	MethodAuto = Method("auto")
	// MethodComplete: the ⌈n/2⌉-page layout of K_n (Bernhart and Kainen 1979).
	MethodComplete = Method("complete")
	// MethodStacked: the 3-page construction for planar 3-trees (see
	// [StackedThreePage]).
	MethodStacked = Method("planar-3-tree")
	// MethodFourConnected: a Hamiltonian cycle of a triangulation without
	// separating triangles, grown face by face or found by rotation and
	// extension (see [FourConnectedTwoPage]), as the spine of a 2-page
	// layout.
	MethodFourConnected = Method("4-connected")
	// MethodHamiltonSearch: a bounded backtracking search for a
	// Hamiltonian cycle of a planar graph (see [HamiltonianTwoPage]).
	MethodHamiltonSearch = Method("hamiltonian-search")
	// MethodSweep: spine candidates and the page sweep (the package doc).
	MethodSweep = Method("sweep")
)

// Methods lists the methods. Auto takes the complete-graph layout when it
// applies; otherwise the 4-connected or else the planar 3-tree
// construction, and on graphs of at most hamiltonMaxEdges edges, when that
// gives more than 2 pages or none applies, also the sweep and then the
// Hamiltonian search, keeping the layout with the fewest pages.
var Methods = []Method{MethodAuto, MethodComplete, MethodStacked, MethodFourConnected, MethodHamiltonSearch, MethodSweep}

// ParseMethod returns the method named s.
func ParseMethod(s string) (Method, error) {
	for _, m := range Methods {
		if string(m) == s {
			return m, nil
		}
	}
	return "", fmt.Errorf("%w: %q", ErrMethod, s)
}

// Report says how a layout was found: the method, the class bound it
// guarantees when it applies (0 when there is none) and the theorem behind
// that bound, for people.
type Report struct {
	Method  Method `json:"method"`
	Bound   int    `json:"class_bound,omitempty"`
	Theorem string `json:"theorem,omitempty"`
	// OnHost: the method ran on a given supergraph and the layout is its
	// restriction (FindReportHost); the class bound is the host's.
	OnHost bool `json:"on_host,omitempty"`
}

// Theorems behind the constructions' bounds.
const (
	theoremComplete = "book thickness of K_n is ceil(n/2) (Bernhart and Kainen, JCTB 27, 1979)"
	theoremStacked  = "planar 3-trees have book thickness at most 3 (Heath, FOCS 1984)"
	theoremFour     = "4-connected planar graphs are Hamiltonian (Tutte 1956) and Hamiltonian planar graphs have 2-page layouts (Bernhart and Kainen 1979)"
	theoremHamilton = "Hamiltonian planar graphs have 2-page layouts (Bernhart and Kainen 1979)"
)

// FindReport is Find with the method chosen by opts.Method (MethodAuto by
// default) and a report of the one used. A forced method that does not
// apply to g is an error wrapping ErrMethodNotApplicable; queue layouts
// have the sweep only. The layout is not checked here: callers validate it
// (cert.Validate) before reporting it, so that a bug in a construction
// shows as a rejected layout.
func FindReport(g *graph.Graph, kind cert.Kind, opts Options) (*cert.Layout, Report, error) {
	m := opts.Method
	if m == "" {
		m = MethodAuto
	}
	if _, err := ParseMethod(string(m)); err != nil {
		return nil, Report{}, err
	}
	switch kind {
	case cert.Queue:
		if m != MethodAuto && m != MethodSweep {
			return nil, Report{}, fmt.Errorf("%w: %s builds stack layouts only", ErrMethodNotApplicable, m)
		}
		return Queue(g, opts), Report{Method: MethodSweep}, nil
	case cert.Stack:
	default:
		return nil, Report{}, fmt.Errorf("%w: %s (expected stack or queue)", ErrKind, kind)
	}
	if m != MethodAuto {
		l, rep, why := construct(g, m, opts)
		if l == nil {
			return nil, Report{}, fmt.Errorf("%w: %s: %s", ErrMethodNotApplicable, m, why)
		}
		return l, rep, nil
	}
	if l, rep, _ := construct(g, MethodComplete, opts); l != nil {
		return l, rep, nil // optimal (Bernhart and Kainen 1979)
	}
	// The constructions get half of the time limit, so that when the
	// Hamiltonian search runs out of time the sweep still has the other
	// half for its improvement passes.
	start := time.Now()
	half := opts
	half.TimeLimit = opts.TimeLimit / 2
	var best *cert.Layout
	var bestRep Report
	for _, m := range []Method{MethodFourConnected, MethodStacked} {
		if l, rep, _ := construct(g, m, half); l != nil {
			best, bestRep = l, rep
			break
		}
	}
	if best != nil && (best.Pages() <= 2 || g.M() > hamiltonMaxEdges) {
		return best, bestRep, nil
	}
	// On graphs of moderate size, the sweep and the Hamiltonian search may
	// beat a 3-page construction (K4 is a planar 3-tree with 2 pages).
	rest := opts
	if opts.TimeLimit > 0 {
		rest.TimeLimit = max(opts.TimeLimit-time.Since(start), opts.TimeLimit/2)
	}
	l := search(g, cert.Stack, rest)
	if best == nil || l.Pages() < best.Pages() {
		best, bestRep = l, Report{Method: MethodSweep}
	}
	if best.Pages() <= 2 {
		return best, bestRep, nil
	}
	if h, rep, _ := construct(g, MethodHamiltonSearch, opts); h != nil {
		return h, rep, nil
	}
	return best, bestRep, nil
}

// construct runs one stack method; nil and the reason when it does not apply.
func construct(g *graph.Graph, m Method, opts Options) (*cert.Layout, Report, string) {
	switch m {
	case MethodComplete:
		if l := completeStack(g); l != nil {
			return l, Report{Method: m, Bound: (g.N() + 1) / 2, Theorem: theoremComplete}, ""
		}
		return nil, Report{}, "not a complete graph on at least 4 vertices"
	case MethodStacked:
		st, ok := RecognizeStacked(g)
		if !ok {
			return nil, Report{}, "not a planar 3-tree"
		}
		if l := StackedThreePage(g, st); l != nil {
			return l, Report{Method: m, Bound: 3, Theorem: theoremStacked}, ""
		}
		return nil, Report{}, "the stacking does not cover the graph"
	case MethodFourConnected:
		l, why := FourConnectedTwoPage(g, opts)
		if l == nil {
			return nil, Report{}, why
		}
		return l, Report{Method: m, Bound: 2, Theorem: theoremFour}, ""
	case MethodHamiltonSearch:
		deadline := opts.deadline(time.Now())
		if g.N() >= 3 && g.M() <= 3*g.N()-6 && g.M() <= hamiltonMaxEdges {
			if emb, ok := planar.Embed(g); ok {
				if h, ok := HamiltonianTwoPage(g, emb, hamiltonBudget(g)); ok {
					return h, Report{Method: m, Bound: 2, Theorem: theoremHamilton}, ""
				}
				// A triangulation with separating triangles may still be
				// Hamiltonian: try rotation and extension from a few starts.
				if g.M() == 3*g.N()-6 {
					rng := rand.New(rand.NewPCG(uint64(opts.Seed), uint64(g.N())))
					for try := 0; try < fourConnectedTries; try++ {
						if cyc, ok := posaCycle(g, int32(rng.IntN(g.N())), rng, posaRotationsPerVertex*g.N(), deadline); ok {
							if h, ok := cycleTwoPage(g, emb, cyc); ok {
								return h, Report{Method: m, Bound: 2, Theorem: theoremHamilton}, ""
							}
						}
					}
				}
			}
		}
		return nil, Report{}, "no Hamiltonian cycle found within the budget (or not planar, or too large)"
	case MethodSweep:
		return search(g, cert.Stack, opts), Report{Method: MethodSweep}, ""
	}
	return nil, Report{}, "unknown method"
}
