// Package dimacs reads and writes DIMACS CNF and encodes layout claims about
// graphs as [CNF] formulas.
//
// # CNF input and output
//
// The format is the one of the DIMACS Challenge ("Satisfiability Suggested
// Format", 1993) as used by the SAT competitions: optional comment lines
// starting with "c", one header line "p cnf VARS CLAUSES", then clauses as
// signed decimal integers, each clause ended by 0 and free to span lines.
// [Parse] streams a formula to a [Visitor]; input compressed with gzip (RFC 1952)
// or zstd (RFC 8878) is recognised by its magic bytes and decompressed on the
// fly. Strict mode, the default, enforces the header counts and the variable
// range; lenient mode accepts what solvers commonly accept and reports every
// thing it forgave through [ReadOptions.Warn]. Errors in the input are
// *textpos.Error values carrying file, line and column. Numbers that do not
// fit in an int32 are rejected in both modes. The parser trusts nothing in its
// input and never allocates more than the input justifies.
//
// [Writer] writes the same format; [CNF.WriteTo] writes a whole formula.
//
// # The claim and the two formulations
//
// Encode(g, opt) builds a CNF that is satisfiable if and only if g has a
// layout of kind opt.Kind on opt.Pages pages: a linear order of the
// vertices (the spine) and a page for every edge such that no two edges of
// a stack page cross (a < c < b < d in spine positions) and no two edges of
// a queue page nest (a < c < d < b). Edges with a common end never cross
// or nest, so only pairs of disjoint edges are constrained.
//
// The baseline ([Options.Baseline]) is the formulation of M. A. Bekos,
// M. Kaufmann, C. Zielke, "The book embedding problem from a SAT-solving
// perspective", GD 2015, LNCS 9411, as we recall it (from memory): a
// variable σ(u,v) for every ordered pair of distinct vertices with
// asymmetry/totality (σ(u,v) xor σ(v,u)) and transitivity for every
// ordered triple; page variables φ(e,p) with "every edge on at least one
// page"; a same-page variable χ(e,f) for every pair of edges (one per page
// kind present) with φ(e,p) ∧ φ(f,p) → χ(e,f); and for every pair of
// disjoint edges, for each of the 8 orders of their four ends in which
// they cross (stack) or nest (queue), the clause ¬χ ∨ ¬σ(x1,x2) ∨
// ¬σ(x2,x3) ∨ ¬σ(x3,x4). Numbering: σ(u,v) = u(n-1) + v' + 1 with v' = v
// if v < u else v-1; then φ(e,p) = n(n-1) + e·k + p (p = 1..k); then χ in
// the order of the pairs (e < f), one per kind (stack first).
//
// The default formulation works on "parts" (see the reductions) and, for
// each part with local vertices 0..n-1 (in graph order) and local edges in
// graph order, uses:
//
//   - one order variable o(u,v) for each pair u < v ("u before v"; v before
//     u is ¬o(u,v)), and for each triple u < v < w the two clauses that
//     forbid the two cyclic orientations; one variable per unordered pair
//     needs no asymmetry clauses, and the six ordered transitivity clauses
//     of a triple collapse to two distinct ones;
//   - page variables φ(e,p) for the pages edge e may use, and one clause
//     "e on some allowed page";
//   - betweenness variables B(c,e) ↔ o(a,c) xor o(b,c) for e = (a,b), true
//     when c lies strictly between a and b; only the direction(s) of the
//     equivalence that some clause relies on are written (a negative
//     occurrence needs "between → B", a positive one "B → between");
//     stack: e and f = (c,d) cross iff B(c,e) xor B(d,e), which is two
//     clauses instead of eight; queue: they nest iff B(c,e) ∧ B(d,e) or
//     B(a,f) ∧ B(b,f). With NoBetweenness the xor is expanded over order
//     literals instead;
//   - for each pair and each kind, with P the pages of that kind both may
//     use and L the conflict clauses: either the |P|·|L| clauses
//     ¬φ(e,p) ∨ ¬φ(f,p) ∨ C directly, or a same-page variable s with |P|
//     clauses φ(e,p) ∧ φ(f,p) → s and |L| clauses ¬s ∨ C, whichever is
//     fewer (NoDirect: always s).
//
// Variables are numbered part by part (parts in the order of their first
// edge): the order variables of the pairs not fixed by symmetry breaking in
// lexicographic order, then the page variables edge by edge and page by
// page (pages an edge may not use, or a single allowed page, take no
// variable), then same-page and betweenness variables in the order the
// pairs of edges (e < f, lexicographic) first need them. Literals fixed by
// symmetry breaking are substituted, not asserted, so clauses they satisfy
// disappear. Decode relies on this numbering only through [Encode] itself:
// decoding re-encodes the graph with the same options.
//
// # Reductions and why they are sound
//
// Each reduction maps every layout of the whole graph to one that the
// reduced CNF admits (so "unsatisfiable" still means "no layout"), and
// Decode maps every model back to a layout of the whole graph, which is
// then checked with cert.Validate (so "satisfiable" yields a checked layout).
//
//   - rotation (stack only): rotating a stack layout cyclically (moving the
//     first vertex to the end) keeps it valid, since crossing of chords on a
//     circle does not depend on where the circle is cut (Bernhart & Kainen
//     1979); so local vertex 0 may be fixed first. Not valid for queues (the
//     rotation of a valid queue layout may contain a nesting), and not used
//     when any page is a queue page.
//   - reflection: reversing the spine maps crossings to crossings and
//     nestings to nestings; so one pair may be fixed (vertices 0 < 1, or
//     with rotation 1 < 2: reverse, then rotate vertex 0 back to the front,
//     which reverses the order of the others). With twins on, the pair is
//     chosen differently (see below).
//   - twins (since spinecert-enc-2): u and v are twins when N(u)∖{v} =
//     N(v)∖{u} in the part's graph (false twins: same open neighbourhood,
//     not adjacent; true twins: same closed neighbourhood, adjacent). The
//     exchange (u v) is then an automorphism, and an automorphism σ maps a
//     valid layout (order π, pages p) to a valid one (order σ∘π, edge σ(e)
//     on page p(e)): crossing and nesting depend only on the positions of
//     the ends, which σ keeps. Being a twin is an equivalence relation (no
//     vertex has both a false and a true twin: w ∈ N(v) = N(u) would put u
//     in N[w] = N[v]), so the twin classes are disjoint and every
//     permutation of each class, all at once, is an automorphism. So each
//     class may be sorted: its members appear on the spine in increasing
//     order. Twins are those of the part's graph (a block, or the graph
//     less the dropped vertices), whose CNF stands on its own for "this
//     graph has a layout". In K_n all vertices are one class and no order
//     variable is left; K_9 on 4 pages becomes a small colouring problem.
//
// The symmetry breakers fix order literals together, and they are sound
// together, not only one by one. Let L be a valid layout of a part, stack
// with rotation (the other cases below); we find a valid layout that
// satisfies every fixed literal, by operations that each keep validity:
//
//  1. rotate so that vertex 0 is first;
//  2. sort every twin class: the automorphism that gives the class's i-th
//     position (left to right) its i-th smallest member. Vertex 0 is the
//     smallest vertex, so the smallest of its class, and the first position
//     of its class is position 0: vertex 0 stays first;
//  3. reflection: call x self-mirrored when it is the middle member of its
//     effective class (its class less vertex 0; a vertex without twins is
//     its own class and self-mirrored), and let rx < ry be the two smallest
//     self-mirrored vertices other than 0 (none if there are fewer than
//     two; a class has one middle, so rx and ry are in different classes).
//     If ry precedes rx, apply ρ: reverse the positions 1..n-1
//     (reverse, then rotate 0 back to the front), then sort the classes as
//     in step 2. ρ keeps 0 first and the classes sorted. The members of an
//     effective class occupy the mirrored positions in reverse order before
//     the sort, so the sort puts the member of rank r at the mirror image of
//     the old position of rank size-1-r; for a self-mirrored vertex r =
//     size-1-r, so rx and ry each move to the mirror image of their own old
//     position, and mirroring turns "ry before rx" into "rx before ry";
//  4. relabel the pages (page symmetry below), which leaves the order alone.
//
// Every fixed literal follows from "0 first", "classes sorted" and "rx
// before ry" by transitivity, so the result satisfies them all. (With
// twins off, rx, ry are the two smallest vertices other than 0, as before
// spinecert-enc-2; every vertex is then its own class, so this is the same
// argument.) Without rotation (queues, mixed layouts, NoRotation) skip
// step 1, take effective classes to be the classes and rx < ry the two
// smallest self-mirrored vertices, and let ρ reverse the whole spine. The
// reason the pair needs care: reversal turns a sorted class into a reversed
// one, and re-sorting moves members, so "1 before 2" for members of
// different classes cannot always be had together with sorted classes (a
// class pattern B A A B, with 1 ∈ A and 2 ∈ B, sorts to 2 1 3 4 and is its
// own reverse).
// The encoder substitutes the transitive closure of the fixed relations:
// 0 before every vertex, each class member before the later ones, and
// every member of rx's class up to rx before every member of ry's class
// from ry on. A test walks all spine orders of every graph on up to 7
// vertices and checks that the orbit of each under rotations, reversal and
// exchanges of twins holds an order the encoder admits.
//
// The other reductions:
//
//   - page symmetry: pages of the same kind are interchangeable; renumber
//     them within each kind in the order in which edges 0, 1, 2, ... first
//     use them, then edge i uses one of the first i+1 pages of its kind.
//   - blocks (stack only): a graph has a k-page stack layout iff each
//     biconnected component has one (Bernhart & Kainen 1979). Each block
//     with at least three vertices is its own part; bridges and isolated
//     vertices are not encoded. Decode puts the blocks together breadth
//     first from the smallest vertex: a block reached at a vertex v is
//     rotated so that v comes first and its other vertices are inserted
//     right after v. An edge already placed has no end strictly inside the
//     inserted interval, and every new edge lies within [v, end of the
//     interval], so no new crossing arises; bridges go on page 1.
//     For a lower bound ("no k-page layout") an unsatisfiable part alone
//     suffices; the parts are independent (disjoint variables).
//   - leaves (stack, without blocks): vertices of degree one are removed
//     repeatedly; Decode puts each back right after its neighbour, so its
//     edge spans no vertex and crosses nothing (page 1). Not used for
//     queues: an edge between neighbours on the spine nests inside any
//     edge around it.
//   - isolated: vertices without edges constrain nothing; Decode appends
//     them to the spine.
//
// The exhaustive test checks all of this against a brute force over all
// spine orders for every graph on up to 7 vertices, with the reductions
// on and off; the CNFs are solved by Debian's cadical.
//
// # The on-demand formulation
//
// [NewOnDemand] gives the formula F of a claim (version [OnDemandVersion])
// in a form whose clauses can be produced one group at a time, so that a
// solver loop can work on a sub-formula F′ ⊆ F (see verify.Refine) and a
// checker can confirm F′ ⊆ F without building F. Its variables are named
// by what they mean ([VarName]): o(u,v) for u < v, "u before v", and
// φ(e,p), "edge e on page p". Its clauses come in groups:
//
//   - [OnDemand.TripleClauses] for vertices u < v < w: the two clauses
//     forbidding the cyclic orientations, (¬o(u,v) ∨ ¬o(v,w) ∨ o(u,w)) and
//     (o(u,v) ∨ o(v,w) ∨ ¬o(u,w));
//   - [OnDemand.PageClause] for edge e: e is on some page;
//   - [OnDemand.ConflictClauses] for disjoint edges e < f and page p: for each
//     of the eight orders x1 x2 x3 x4 of their ends in which they cross (a
//     stack page) or nest (a queue page), ¬φ(e,p) ∨ ¬φ(f,p) ∨ ¬[x1<x2] ∨
//     ¬[x2<x3] ∨ ¬[x3<x4], where [x<y] is o(x,y) for x < y and ¬o(y,x) else.
//
// Symmetry breaking fixes variables and substitutes them (a clause a fixed
// literal satisfies disappears, a fixed false literal is dropped): rotation
// (all pages stack) fixes o(0,v) true for every v; reflection fixes o(1,2)
// with rotation, else o(0,1); page symmetry fixes φ(e,p) false when p's rank
// among the pages of its kind exceeds e. Their soundness is the argument of
// the default formulation above with twins off.
//
// F is satisfiable if and only if the graph has the layout: a layout gives
// the spine order and pages, which satisfy every clause (the order is
// transitive, no two edges of a page cross or nest); conversely the order
// variables of a model form a tournament without 3-cycles, which is a
// linear order, and an edge placed on a page of its true page variable
// meets no edge of that page in a crossing (nesting) order, since the
// clause of that order would be false. The test TestOnDemandExhaustive
// checks F against brute force for every graph on up to 7 vertices with
// every combination of the symmetry breakers.
//
// Membership ([CheckMembership]). A sub-formula is stored as a CNF with a
// name for every variable ([WriteVars], [ReadVars]). The check maps each
// clause back to named literals and recognises its group from them alone:
// no page literal means a transitivity clause, whose three vertices are
// those of its order literals; only positive page literals of one edge mean
// that edge's page clause; two negative page literals of one page and two
// edges mean that pair's conflict clauses. It then generates that one group
// with the functions above and requires the clause, as a set of literals,
// to be one of them. Soundness: if every clause of F′ is a clause of F (a
// name map that is one to one, so a variable of F′ is a variable of F),
// any model of F satisfies F′; so F′ unsatisfiable implies F unsatisfiable,
// and then the claim has no layout. A mistake in recognising a group can
// only reject a clause of F, never accept one outside it, because what is
// accepted is always compared with a generated clause of F. The tests
// compare the checker with F built in full on random graphs, accept every
// clause of F in any numbering, and reject mutated clauses (fuzzed too).
//
// # Versions
// # Versions
//
// [EncoderVersion] is written in every CNF header. [EncodeVersion] reproduces
// the output of the earlier versions listed by [EncoderVersions], so that a
// CNF recorded by an older spinecert (in an evidence bundle, say) can still be
// re-derived from its claim: spinecert-enc-1 is the current encoder with
// NoTwins set and its own name in the header.
package dimacs
